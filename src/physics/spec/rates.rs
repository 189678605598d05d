//! Nuclear energy-generation choices.

use super::catalogue::{LawEntry, LawKind, Param, ParamDefault};
use super::grammar::{law_spec_text, Arguments, LawSpec};
use crate::error::Result;
use crate::physics::nuclear::{
    power_law, AnalyticRates, EnergyGeneration, PowerLawRates, SFactorRates,
};
use std::sync::Arc;

/// An energy-generation law, by name, with its parameters.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum RatesSpec {
    /// `analytic`: the textbook pp and CNO rates without screening.
    Analytic,
    /// `sfactor`: rates from S-factors at the Gamow peak, screened.
    SFactor,
    /// `power-law`: eps = eps0 rho X^2 (T/t0)^nu.
    PowerLaw {
        /// Coefficient eps0, erg cm^3 g^-2 s^-1.
        eps0: f64,
        /// Reference temperature t0, K.
        t0_k: f64,
        /// Temperature exponent nu.
        nu: f64,
    },
    /// A law supplied through the library (printed `external:NAME`; not selectable by name).
    External(String),
}

/// The energy-generation rows of the catalogue.
pub const CATALOGUE: &[LawEntry; 3] = &[
    LawEntry {
        name: "analytic",
        params: &[],
        reads_file: false,
        help: "textbook pp and CNO rates, unscreened",
        source: "Kippenhahn & Weigert 1990, §18.5",
    },
    LawEntry {
        name: "sfactor",
        params: &[],
        reads_file: false,
        help: "Gamow-peak rates from S-factors, screened, pp branching",
        source: "Clayton 1968, ch. 4; Adelberger et al. 2011; Salpeter 1954",
    },
    LawEntry {
        name: "power-law",
        params: &[
            Param {
                key: "eps0",
                default: ParamDefault::Computed(power_law::default_eps0),
                min: 1e-30,
                max: 1e30,
                unit: "erg cm^3 g^-2 s^-1",
                help: "coefficient (default: the analytic pp rate at t0)",
            },
            Param {
                key: "t0",
                default: ParamDefault::Value(power_law::DEFAULT_T0_K),
                min: 1e5,
                max: 1e10,
                unit: "K",
                help: "reference temperature",
            },
            Param {
                key: "nu",
                default: ParamDefault::Value(power_law::DEFAULT_NU),
                min: -10.0,
                max: 40.0,
                unit: "",
                help: "temperature exponent",
            },
        ],
        reads_file: false,
        help: "eps = eps0 rho X^2 (T/t0)^nu, for homology experiments",
        source: "Kippenhahn & Weigert 1990, §20",
    },
];

impl LawSpec for RatesSpec {
    const KIND: LawKind = LawKind::Rates;
    fn catalogue() -> &'static [LawEntry] {
        CATALOGUE
    }
    fn parts(&self) -> std::result::Result<(&'static LawEntry, Arguments), &str> {
        Ok(match self {
            RatesSpec::Analytic => (&CATALOGUE[0], Arguments::Numbers(Vec::new())),
            RatesSpec::SFactor => (&CATALOGUE[1], Arguments::Numbers(Vec::new())),
            RatesSpec::PowerLaw { eps0, t0_k, nu } => {
                (&CATALOGUE[2], Arguments::Numbers(vec![*eps0, *t0_k, *nu]))
            }
            RatesSpec::External(name) => return Err(name),
        })
    }
    fn from_parts(entry: &'static LawEntry, arguments: Arguments) -> Self {
        let v = |i| arguments.number(entry, i);
        match entry.name {
            "sfactor" => RatesSpec::SFactor,
            "power-law" => RatesSpec::PowerLaw {
                eps0: v(0),
                t0_k: v(1),
                nu: v(2),
            },
            _ => RatesSpec::Analytic,
        }
    }
}

law_spec_text!(RatesSpec);

impl RatesSpec {
    /// The law this spec names; `Ok(None)` for an external law.
    pub fn build(&self) -> Result<Option<Arc<dyn EnergyGeneration>>> {
        Ok(Some(match self {
            RatesSpec::Analytic => Arc::new(AnalyticRates::default()),
            RatesSpec::SFactor => Arc::new(SFactorRates::default()),
            RatesSpec::PowerLaw { eps0, t0_k, nu } => {
                Arc::new(PowerLawRates::new(*eps0, *t0_k, *nu)?)
            }
            RatesSpec::External(_) => return Ok(None),
        }))
    }
}
