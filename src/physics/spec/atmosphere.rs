//! Outer-boundary choices.

use super::catalogue::{LawEntry, LawKind};
use super::grammar::{law_spec_text, Arguments, LawSpec};
use crate::physics::atmosphere::{Eddington, Hopf, KrishnaSwamy, TauRelation};

/// How the outer boundary of a model is set: the one-point closure, or a T(tau) relation
/// ([`crate::physics::atmosphere`]) integrated in optical depth from tau ~ 0 down to the
/// photosphere (T = T_eff), where the interior begins.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub enum AtmosphereSpec {
    /// `photosphere`: T = T_eff and P = (2/3) G M / (R^2 kappa) at the photosphere (one-point
    /// Eddington closure).
    Photosphere,
    /// `eddington`: the grey Eddington relation T^4 = (3/4) T_eff^4 (tau + 2/3).
    Eddington,
    /// `hopf`: the exact grey relation, Hopf's q(tau).
    Hopf,
    /// `krishna-swamy`: the empirical solar relation of Krishna Swamy 1966.
    KrishnaSwamy,
}

/// The atmosphere rows of the catalogue.
pub const CATALOGUE: &[LawEntry; 4] = &[
    LawEntry {
        name: "photosphere",
        params: &[],
        reads_file: false,
        help: "T = T_eff, P = 2 G M / (3 R^2 kappa) at the photosphere",
        source: "Kippenhahn & Weigert 1990, §11.2",
    },
    LawEntry {
        name: "eddington",
        params: &[],
        reads_file: false,
        help: "grey Eddington T(tau), q = 2/3, integrated down to T = T_eff",
        source: "Eddington approximation; Kippenhahn & Weigert 1990, §11.2",
    },
    LawEntry {
        name: "hopf",
        params: &[],
        reads_file: false,
        help: "exact grey T(tau) (Hopf function), integrated down to T = T_eff",
        source: "Hopf 1934; Chandrasekhar 1950, Radiative Transfer, ch. V",
    },
    LawEntry {
        name: "krishna-swamy",
        params: &[],
        reads_file: false,
        help: "empirical solar T(tau), integrated down to T = T_eff",
        source: "Krishna Swamy 1966, ApJ 145, 174",
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
            AtmosphereSpec::Eddington => 1,
            AtmosphereSpec::Hopf => 2,
            AtmosphereSpec::KrishnaSwamy => 3,
        };
        Ok((&CATALOGUE[row], Arguments::Numbers(Vec::new())))
    }
    fn from_parts(entry: &'static LawEntry, _arguments: Arguments) -> Self {
        match entry.name {
            "eddington" => AtmosphereSpec::Eddington,
            "hopf" => AtmosphereSpec::Hopf,
            "krishna-swamy" => AtmosphereSpec::KrishnaSwamy,
            _ => AtmosphereSpec::Photosphere,
        }
    }
}

law_spec_text!(AtmosphereSpec);

impl AtmosphereSpec {
    /// The T(tau) relation integrated for this boundary (none for the one-point closure).
    pub fn relation(&self) -> Option<&'static dyn TauRelation> {
        match self {
            AtmosphereSpec::Photosphere => None,
            AtmosphereSpec::Eddington => Some(&Eddington),
            AtmosphereSpec::Hopf => Some(&Hopf),
            AtmosphereSpec::KrishnaSwamy => Some(&KrishnaSwamy),
        }
    }
}
