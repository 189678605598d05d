//! Equation-of-state choices.

use super::catalogue::{LawEntry, LawKind};
use super::grammar::{law_spec_text, Arguments, LawSpec};
use crate::physics::eos::{
    DegenerateGas, EquationOfState, IdealGas, MolecularEos, RefinedEos, SahaGas,
};
use std::sync::Arc;

/// An equation of state, by name.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum EosSpec {
    /// `ideal`: fully ionised ideal gas and radiation.
    Ideal,
    /// `saha`: Saha ionisation of H and He, classical electrons.
    Saha,
    /// `degenerate`: fully ionised, Fermi–Dirac electrons.
    Degenerate,
    /// `refined`: Saha ionisation with Fermi–Dirac electrons.
    Refined,
    /// `molecular`: `refined` with H2 dissociation, donor metals and the ions' Coulomb term.
    Molecular,
    /// A law supplied through the library (printed `external:NAME`; not selectable by name).
    External(String),
}

/// The equation-of-state rows of the catalogue.
pub const CATALOGUE: &[LawEntry; 5] = &[
    LawEntry {
        name: "ideal",
        params: &[],
        reads_file: false,
        help: "fully ionised ideal gas plus radiation",
        source: "Kippenhahn & Weigert 1990, §13.2–13.3",
    },
    LawEntry {
        name: "saha",
        params: &[],
        reads_file: false,
        help: "Saha ionisation of H and He, classical electrons",
        source: "Saha 1920; Kippenhahn & Weigert 1990, §14.1",
    },
    LawEntry {
        name: "degenerate",
        params: &[],
        reads_file: false,
        help: "fully ionised, Fermi–Dirac electrons of any degeneracy",
        source: "Cox & Giuli 1968, ch. 24",
    },
    LawEntry {
        name: "refined",
        params: &[],
        reads_file: false,
        help: "Saha ionisation of H and He with Fermi–Dirac electrons",
        source: "Cox & Giuli 1968, ch. 15 and 24; Hummer & Mihalas 1988",
    },
    LawEntry {
        name: "molecular",
        params: &[],
        reads_file: false,
        help: "refined plus H2 dissociation, a low-ionisation metal donor, ion Coulomb term",
        source: "Huber & Herzberg 1979 (H2); Potekhin & Chabrier 2000 (Coulomb)",
    },
];

impl LawSpec for EosSpec {
    const KIND: LawKind = LawKind::Eos;
    fn catalogue() -> &'static [LawEntry] {
        CATALOGUE
    }
    fn parts(&self) -> Result<(&'static LawEntry, Arguments), &str> {
        let row = match self {
            EosSpec::Ideal => 0,
            EosSpec::Saha => 1,
            EosSpec::Degenerate => 2,
            EosSpec::Refined => 3,
            EosSpec::Molecular => 4,
            EosSpec::External(name) => return Err(name),
        };
        Ok((&CATALOGUE[row], Arguments::Numbers(Vec::new())))
    }
    fn from_parts(entry: &'static LawEntry, _arguments: Arguments) -> Self {
        match entry.name {
            "ideal" => EosSpec::Ideal,
            "saha" => EosSpec::Saha,
            "degenerate" => EosSpec::Degenerate,
            "molecular" => EosSpec::Molecular,
            _ => EosSpec::Refined,
        }
    }
}

law_spec_text!(EosSpec);

impl EosSpec {
    /// The law this spec names; `None` for an external law (which only the library can supply).
    pub fn build(&self) -> Option<Arc<dyn EquationOfState>> {
        Some(match self {
            EosSpec::Ideal => Arc::new(IdealGas),
            EosSpec::Saha => Arc::new(SahaGas),
            EosSpec::Degenerate => Arc::new(DegenerateGas),
            EosSpec::Refined => Arc::new(RefinedEos),
            EosSpec::Molecular => Arc::new(MolecularEos),
            EosSpec::External(_) => return None,
        })
    }
}
