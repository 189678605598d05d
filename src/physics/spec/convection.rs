//! Convection choices.

use super::catalogue::{LawEntry, LawKind, Param, ParamDefault};
use super::grammar::{law_spec_text, Arguments, LawSpec};
use crate::error::Result;
use crate::physics::convection::{mlt, Adiabatic, Convection, MixingLength};
use std::sync::Arc;

/// A convection law, by name, with its parameters.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum ConvectionSpec {
    /// `adiabatic`: nabla = nabla_ad wherever convective.
    Adiabatic,
    /// `mlt`: Böhm-Vitense mixing length.
    MixingLength {
        /// Mixing-length parameter alpha (l = alpha H_P).
        alpha: f64,
    },
    /// A law supplied through the library (printed `external:NAME`; not selectable by name).
    External(String),
}

/// The mixing-length parameter.
pub const ALPHA: Param = Param {
    key: "alpha",
    default: ParamDefault::Value(mlt::DEFAULT_ALPHA),
    min: 0.1,
    max: 10.0,
    unit: "",
    help: "mixing length in pressure scale heights",
};

/// The convection rows of the catalogue.
pub const CATALOGUE: &[LawEntry; 2] = &[
    LawEntry {
        name: "adiabatic",
        params: &[],
        reads_file: false,
        help: "nabla = nabla_ad where convective (Schwarzschild)",
        source: "Kippenhahn & Weigert 1990, §7.3",
    },
    LawEntry {
        name: "mlt",
        params: &[ALPHA],
        reads_file: false,
        help: "Böhm-Vitense mixing length",
        source: "Böhm-Vitense 1958; Kippenhahn & Weigert 1990, §7",
    },
];

impl LawSpec for ConvectionSpec {
    const KIND: LawKind = LawKind::Convection;
    fn catalogue() -> &'static [LawEntry] {
        CATALOGUE
    }
    fn parts(&self) -> std::result::Result<(&'static LawEntry, Arguments), &str> {
        Ok(match self {
            ConvectionSpec::Adiabatic => (&CATALOGUE[0], Arguments::Numbers(Vec::new())),
            ConvectionSpec::MixingLength { alpha } => {
                (&CATALOGUE[1], Arguments::Numbers(vec![*alpha]))
            }
            ConvectionSpec::External(name) => return Err(name),
        })
    }
    fn from_parts(entry: &'static LawEntry, arguments: Arguments) -> Self {
        match entry.name {
            "mlt" => ConvectionSpec::MixingLength {
                alpha: arguments.number(entry, 0),
            },
            _ => ConvectionSpec::Adiabatic,
        }
    }
}

law_spec_text!(ConvectionSpec);

impl ConvectionSpec {
    /// The law this spec names; `Ok(None)` for an external law.
    pub fn build(&self) -> Result<Option<Arc<dyn Convection>>> {
        Ok(Some(match self {
            ConvectionSpec::Adiabatic => Arc::new(Adiabatic),
            ConvectionSpec::MixingLength { alpha } => Arc::new(MixingLength::new(*alpha)?),
            ConvectionSpec::External(_) => return Ok(None),
        }))
    }

    /// The same law with mixing-length parameter `alpha`; `None` if the law has no such
    /// parameter.
    pub fn with_alpha(&self, alpha: f64) -> Option<Self> {
        match self {
            ConvectionSpec::MixingLength { .. } => Some(ConvectionSpec::MixingLength { alpha }),
            _ => None,
        }
    }
}
