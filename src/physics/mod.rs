//! Local microphysics: composition, equation of state, opacity, nuclear energy generation and
//! convection. One trait per kind of law, one type per law; a [`PhysicsSet`] bundles one law of
//! each kind and is what the structure equations evaluate.

pub mod atmosphere;
pub mod composition;
pub mod convection;
pub mod eos;
pub mod nuclear;
pub mod opacity;
pub mod scaled;
pub mod spec;

use std::sync::Arc;

pub use composition::Composition;
pub use convection::{Convection, ConvectionPoint};
pub use eos::{EosState, EquationOfState};
pub use nuclear::{EnergyGeneration, EnergyRate};
pub use opacity::Opacity;
pub use scaled::Scaled;
pub use spec::PhysicsOptions;

use serde::Serialize;

/// How the outer boundary of a model is set: the one-point closure, or a T(tau) relation
/// ([`atmosphere`]) integrated in optical depth from tau ~ 0 to the photosphere (T = T_eff).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Atmosphere {
    /// T = T_eff and P = (2/3) G M / (R^2 kappa) at the photosphere (one-point Eddington closure).
    Photosphere,
    /// Grey Eddington atmosphere T^4 = (3/4) T_eff^4 (tau + 2/3) ([`atmosphere::Eddington`]).
    Grey,
    /// Exact grey atmosphere, Hopf's q(tau) ([`atmosphere::Hopf`]).
    Hopf,
    /// Empirical solar T(tau) of Krishna Swamy 1966 ([`atmosphere::KrishnaSwamy`]).
    KrishnaSwamy,
}

/// Allowed atmosphere names (`grey` is accepted for `eddington`).
pub const ATMOSPHERE_NAMES: &str = "allowed: photosphere, eddington (or grey), hopf, krishna-swamy";

impl Atmosphere {
    /// Name as a user selects it.
    pub fn name(&self) -> &'static str {
        match self {
            Atmosphere::Photosphere => "photosphere",
            Atmosphere::Grey => "eddington",
            Atmosphere::Hopf => "hopf",
            Atmosphere::KrishnaSwamy => "krishna-swamy",
        }
    }

    /// The atmosphere called `name`, if any.
    pub fn from_name(name: &str) -> Option<Self> {
        Some(match name {
            "photosphere" => Atmosphere::Photosphere,
            "eddington" | "grey" => Atmosphere::Grey,
            "hopf" => Atmosphere::Hopf,
            "krishna-swamy" => Atmosphere::KrishnaSwamy,
            _ => return None,
        })
    }

    /// The T(tau) relation integrated for this boundary (none for the one-point closure).
    pub fn relation(&self) -> Option<&'static dyn atmosphere::TauRelation> {
        match self {
            Atmosphere::Photosphere => None,
            Atmosphere::Grey => Some(&atmosphere::Eddington),
            Atmosphere::Hopf => Some(&atmosphere::Hopf),
            Atmosphere::KrishnaSwamy => Some(&atmosphere::KrishnaSwamy),
        }
    }
}

/// One law of each kind: everything local that a stellar model needs.
#[derive(Debug, Clone)]
pub struct PhysicsSet {
    /// Name of the preset the set started from (`analytic` or `refined`).
    pub preset: String,
    /// Equation of state.
    pub eos: Arc<dyn EquationOfState>,
    /// Rosseland-mean opacity.
    pub opacity: Arc<dyn Opacity>,
    /// Nuclear energy generation.
    pub rates: Arc<dyn EnergyGeneration>,
    /// Convection law.
    pub convection: Arc<dyn Convection>,
    /// Outer boundary condition.
    pub atmosphere: Atmosphere,
}

/// The laws of a [`PhysicsSet`] by name, for output (JSON `physics` object).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PhysicsDescription {
    /// Preset the set started from.
    pub preset: String,
    /// Equation of state, with parameters.
    pub eos: String,
    /// Opacity law, with parameters.
    pub opacity: String,
    /// Energy generation law, with parameters.
    pub rates: String,
    /// Convection law, with parameters.
    pub convection: String,
    /// Outer boundary condition.
    pub atmosphere: String,
}

impl PhysicsSet {
    /// The `analytic` set, exactly: ideal gas + radiation, kappa = 0.2(1+X) + Kramers
    /// (4.34e25 Z + 3.68e22 (1-Z))(1+X) rho T^-3.5, the textbook pp and CNO rates without
    /// screening, adiabatic convection, and the one-point photosphere.
    pub fn analytic() -> Self {
        Self {
            preset: "analytic".to_string(),
            eos: Arc::new(eos::IdealGas),
            opacity: Arc::new(opacity::AnalyticOpacity::default()),
            rates: Arc::new(nuclear::AnalyticRates::default()),
            convection: Arc::new(convection::Adiabatic),
            atmosphere: Atmosphere::Photosphere,
        }
    }

    /// The `refined` set (the default): H2 dissociation, Saha ionisation, degenerate electrons
    /// and the ions' Coulomb term ([`eos::MolecularEos`]), the combined opacity with H-minus and conduction
    /// ([`opacity::RefinedOpacity`]), S-factor rates with screening ([`nuclear::SFactorRates`]),
    /// mixing-length convection with alpha = 2.4 ([`convection::MixingLength`]) and the
    /// empirical T(tau) atmosphere of Krishna Swamy 1966 ([`atmosphere::KrishnaSwamy`]).
    pub fn refined() -> Self {
        Self {
            preset: "refined".to_string(),
            eos: Arc::new(eos::MolecularEos),
            opacity: Arc::new(opacity::RefinedOpacity::default()),
            rates: Arc::new(nuclear::SFactorRates::default()),
            convection: Arc::new(convection::MixingLength::default()),
            atmosphere: Atmosphere::KrishnaSwamy,
        }
    }

    /// Every law by name with its parameters.
    pub fn describe(&self) -> PhysicsDescription {
        PhysicsDescription {
            preset: self.preset.clone(),
            eos: self.eos.name().to_string(),
            opacity: self.opacity.name(),
            rates: self.rates.name(),
            convection: self.convection.name(),
            atmosphere: self.atmosphere.name().to_string(),
        }
    }
}
