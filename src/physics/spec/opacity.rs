//! Opacity choices.

use super::catalogue::{LawEntry, LawKind, Param, ParamDefault};
use super::grammar::{law_spec_text, Arguments, LawSpec};
use crate::error::Result;
use crate::physics::opacity::{
    refined, AnalyticOpacity, BellLin, Conductive, ElectronScattering, HMinus, Kramers, Opacity,
    RefinedOpacity, TableOpacity,
};
use std::path::Path;
use std::sync::Arc;

/// An opacity law, by name, with its parameters.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum OpacitySpec {
    /// `electron-scattering`: 0.2 (1 + X) cm^2/g.
    ElectronScattering,
    /// `kramers`: bound-free and free-free Kramers opacity with guillotine factor t.
    Kramers {
        /// Guillotine factor t.
        guillotine: f64,
    },
    /// `h-minus`: the H-minus opacity.
    HMinus,
    /// `bell-lin`: the piecewise power laws of Bell & Lin 1994 (grains, molecules, H-minus,
    /// Kramers, electron scattering).
    BellLin,
    /// `conductive`: electron conduction.
    Conductive,
    /// `analytic`: electron scattering plus unreduced Kramers.
    Analytic,
    /// `refined`: the combined opacity with a density-dependent guillotine factor.
    Refined {
        /// Guillotine factor t0 at 1 g/cm^3.
        guillotine: f64,
        /// Density exponent q of t = max(1, t0 rho^q).
        exponent: f64,
    },
    /// `table:PATH` / `table-clamped:PATH`: a user table.
    Table {
        /// The table file.
        path: String,
        /// Whether points outside the table take the nearest edge value.
        clamp: bool,
    },
    /// A law supplied through the library (printed `external:NAME`; not selectable by name).
    External(String),
}

const GUILLOTINE: Param = Param {
    key: "guillotine",
    default: ParamDefault::Value(1.0),
    min: 1e-3,
    max: 1e3,
    unit: "",
    help: "guillotine factor t dividing the bound-free term",
};

/// The opacity rows of the catalogue.
pub const CATALOGUE: &[LawEntry; 9] = &[
    LawEntry {
        name: "electron-scattering",
        params: &[],
        reads_file: false,
        help: "Thomson scattering, sigma_T (1 + X) / (2 m_u)",
        source: "Kippenhahn & Weigert 1990, eq. 17.2",
    },
    LawEntry {
        name: "kramers",
        params: &[GUILLOTINE],
        reads_file: false,
        help: "bound-free and free-free Kramers law",
        source: "Hansen & Kawaler 1994, §4.4; Schwarzschild 1958",
    },
    LawEntry {
        name: "h-minus",
        params: &[],
        reads_file: false,
        help: "H-minus, 2.5e-31 (Z/0.02) rho^1/2 T^9",
        source: "Hansen & Kawaler 1994, ch. 4",
    },
    LawEntry {
        name: "bell-lin",
        params: &[],
        reads_file: false,
        help: "piecewise power laws from grains to electron scattering, 300 K to 1e6 K",
        source: "Bell & Lin 1994, ApJ 427, 987",
    },
    LawEntry {
        name: "conductive",
        params: &[],
        reads_file: false,
        help: "electron conduction (degenerate and non-degenerate limits joined)",
        source: "Hubbard & Lampe 1969, ApJS 18, 297; Kippenhahn & Weigert 1990, ch. 17",
    },
    LawEntry {
        name: "analytic",
        params: &[],
        reads_file: false,
        help: "electron scattering plus unreduced Kramers",
        source: "Kippenhahn & Weigert 1990, ch. 17; Hansen & Kawaler 1994",
    },
    LawEntry {
        name: "refined",
        params: &[
            Param {
                key: "guillotine",
                default: ParamDefault::Value(refined::DEFAULT_GUILLOTINE),
                min: 1e-3,
                max: 1e3,
                unit: "",
                help: "guillotine factor t0 at 1 g/cm^3",
            },
            Param {
                key: "exponent",
                default: ParamDefault::Value(refined::DEFAULT_DENSITY_EXPONENT),
                min: 0.0,
                max: 1.0,
                unit: "",
                help: "density exponent q of t = max(1, t0 rho^q)",
            },
        ],
        reads_file: false,
        help: "electron scattering, H-minus, reduced Kramers, Bell & Lin molecules, conduction",
        source: "this project's combination; see src/physics/opacity/refined.rs",
    },
    LawEntry {
        name: "table",
        params: &[],
        reads_file: true,
        help: "user table (log10_T, log10_R, log10_kappa); error outside it",
        source: "the user's table; Steffen 1990 monotone interpolation",
    },
    LawEntry {
        name: "table-clamped",
        params: &[],
        reads_file: true,
        help: "user table, nearest edge value outside it",
        source: "the user's table; Steffen 1990 monotone interpolation",
    },
];

impl LawSpec for OpacitySpec {
    const KIND: LawKind = LawKind::Opacity;
    fn catalogue() -> &'static [LawEntry] {
        CATALOGUE
    }
    fn parts(&self) -> std::result::Result<(&'static LawEntry, Arguments), &str> {
        let none = || Arguments::Numbers(Vec::new());
        Ok(match self {
            OpacitySpec::ElectronScattering => (&CATALOGUE[0], none()),
            OpacitySpec::Kramers { guillotine } => {
                (&CATALOGUE[1], Arguments::Numbers(vec![*guillotine]))
            }
            OpacitySpec::HMinus => (&CATALOGUE[2], none()),
            OpacitySpec::BellLin => (&CATALOGUE[3], none()),
            OpacitySpec::Conductive => (&CATALOGUE[4], none()),
            OpacitySpec::Analytic => (&CATALOGUE[5], none()),
            OpacitySpec::Refined {
                guillotine,
                exponent,
            } => (
                &CATALOGUE[6],
                Arguments::Numbers(vec![*guillotine, *exponent]),
            ),
            OpacitySpec::Table { path, clamp } => (
                &CATALOGUE[if *clamp { 8 } else { 7 }],
                Arguments::Path(path.clone()),
            ),
            OpacitySpec::External(name) => return Err(name),
        })
    }
    fn from_parts(entry: &'static LawEntry, arguments: Arguments) -> Self {
        let v = |i| arguments.number(entry, i);
        match (entry.name, &arguments) {
            ("kramers", _) => OpacitySpec::Kramers { guillotine: v(0) },
            ("h-minus", _) => OpacitySpec::HMinus,
            ("bell-lin", _) => OpacitySpec::BellLin,
            ("conductive", _) => OpacitySpec::Conductive,
            ("analytic", _) => OpacitySpec::Analytic,
            ("refined", _) => OpacitySpec::Refined {
                guillotine: v(0),
                exponent: v(1),
            },
            (name, Arguments::Path(path)) => OpacitySpec::Table {
                path: path.clone(),
                clamp: name == "table-clamped",
            },
            _ => OpacitySpec::ElectronScattering,
        }
    }
}

law_spec_text!(OpacitySpec);

impl OpacitySpec {
    /// The law this spec names (a table is read here); `Ok(None)` for an external law.
    pub fn build(&self) -> Result<Option<Arc<dyn Opacity>>> {
        Ok(Some(match self {
            OpacitySpec::ElectronScattering => Arc::new(ElectronScattering),
            OpacitySpec::Kramers { guillotine } => Arc::new(Kramers::new(*guillotine)?),
            OpacitySpec::HMinus => Arc::new(HMinus),
            OpacitySpec::BellLin => Arc::new(BellLin),
            OpacitySpec::Conductive => Arc::new(Conductive),
            OpacitySpec::Analytic => Arc::new(AnalyticOpacity::default()),
            OpacitySpec::Refined {
                guillotine,
                exponent,
            } => Arc::new(RefinedOpacity::new(*guillotine, *exponent)?),
            OpacitySpec::Table { path, clamp } => {
                Arc::new(TableOpacity::from_file(Path::new(path), *clamp)?)
            }
            OpacitySpec::External(_) => return Ok(None),
        }))
    }

    /// The file this law reads, if any.
    pub fn input_file(&self) -> Option<&Path> {
        match self {
            OpacitySpec::Table { path, .. } => Some(Path::new(path)),
            _ => None,
        }
    }
}
