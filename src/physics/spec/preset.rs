//! Presets: complete sets of laws to start from.

use super::catalogue::{LawEntry, LawKind};
use super::grammar::{law_spec_text, Arguments, LawSpec};

/// A preset: one law of each kind, chosen together.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub enum Preset {
    /// `refined` (the default): the most complete laws.
    Refined,
    /// `analytic`: laws simple enough to reproduce by hand.
    Analytic,
}

/// The preset rows of the catalogue.
pub const CATALOGUE: &[LawEntry; 2] = &[
    LawEntry {
        name: "refined",
        params: &[],
        reads_file: false,
        help: "the default: eos molecular, opacity refined, rates sfactor, mlt, krishna-swamy",
        source: "the laws' own sources",
    },
    LawEntry {
        name: "analytic",
        params: &[],
        reads_file: false,
        help: "ideal gas, electron scattering + Kramers, textbook rates, adiabatic, photosphere",
        source: "Kippenhahn & Weigert 1990",
    },
];

impl LawSpec for Preset {
    const KIND: LawKind = LawKind::Preset;
    fn catalogue() -> &'static [LawEntry] {
        CATALOGUE
    }
    fn parts(&self) -> Result<(&'static LawEntry, Arguments), &str> {
        let row = match self {
            Preset::Refined => 0,
            Preset::Analytic => 1,
        };
        Ok((&CATALOGUE[row], Arguments::Numbers(Vec::new())))
    }
    fn from_parts(entry: &'static LawEntry, _arguments: Arguments) -> Self {
        match entry.name {
            "analytic" => Preset::Analytic,
            _ => Preset::Refined,
        }
    }
}

law_spec_text!(Preset);
