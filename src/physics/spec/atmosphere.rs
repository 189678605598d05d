//! Outer-boundary choices.

use super::catalogue::{LawEntry, LawKind};
use super::grammar::{law_spec_text, Arguments, LawSpec};

/// How the outer boundary of a model is set.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub enum AtmosphereSpec {
    /// `photosphere`: T = T_eff and P = (2/3) G M / (R^2 kappa) at the photosphere (one-point
    /// Eddington closure).
    Photosphere,
    /// `grey`: the grey Eddington atmosphere T^4 = (3/4) T_eff^4 (tau + 2/3), integrated in
    /// optical depth from tau ~ 0 to tau = 2/3 for the photospheric pressure.
    Grey,
}

/// The atmosphere rows of the catalogue.
pub const CATALOGUE: &[LawEntry; 2] = &[
    LawEntry {
        name: "photosphere",
        params: &[],
        reads_file: false,
        help: "T = T_eff, P = 2 G M / (3 R^2 kappa) at the photosphere",
        source: "Kippenhahn & Weigert 1990, §11.2",
    },
    LawEntry {
        name: "grey",
        params: &[],
        reads_file: false,
        help: "grey Eddington T(tau) integrated down to tau = 2/3",
        source: "Eddington approximation; Kippenhahn & Weigert 1990, §11.2",
    },
];

impl LawSpec for AtmosphereSpec {
    const KIND: LawKind = LawKind::Atmosphere;
    fn catalogue() -> &'static [LawEntry] {
        CATALOGUE
    }
    fn parts(&self) -> Result<(&'static LawEntry, Arguments), &str> {
        let row = match self {
            AtmosphereSpec::Photosphere => 0,
            AtmosphereSpec::Grey => 1,
        };
        Ok((&CATALOGUE[row], Arguments::Numbers(Vec::new())))
    }
    fn from_parts(entry: &'static LawEntry, _arguments: Arguments) -> Self {
        match entry.name {
            "grey" => AtmosphereSpec::Grey,
            _ => AtmosphereSpec::Photosphere,
        }
    }
}

law_spec_text!(AtmosphereSpec);
