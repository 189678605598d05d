//! Nuclear energy generation laws, split into pp-chain and CNO-cycle parts.

use super::composition::Composition;
use crate::error::PhysicsError;

pub mod analytic;
pub mod power_law;
pub mod sfactor;

pub use analytic::AnalyticRates;
pub use power_law::PowerLawRates;
pub use sfactor::SFactorRates;

/// Energy generation at one point, erg g^-1 s^-1, with the local temperature exponents.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct EnergyRate {
    /// pp-chain energy generation rate, erg g^-1 s^-1.
    pub eps_pp_erg_g_s: f64,
    /// CNO-cycle energy generation rate, erg g^-1 s^-1.
    pub eps_cno_erg_g_s: f64,
    /// nu_pp = dln eps_pp / dln T at fixed rho.
    pub nu_pp: f64,
    /// nu_CNO = dln eps_CNO / dln T at fixed rho.
    pub nu_cno: f64,
}

impl EnergyRate {
    /// Total rate eps_pp + eps_CNO, erg g^-1 s^-1.
    pub fn total_erg_g_s(&self) -> f64 {
        self.eps_pp_erg_g_s + self.eps_cno_erg_g_s
    }
}

/// A nuclear energy generation law.
pub trait EnergyGeneration: Send + Sync + std::fmt::Debug {
    /// The law's name as a user selects it, with its parameters.
    fn name(&self) -> String;

    /// Rates at density `rho_g_cm3` and temperature `temperature_k`. Errors outside the domain.
    fn rate(
        &self,
        rho_g_cm3: f64,
        temperature_k: f64,
        comp: &Composition,
    ) -> Result<EnergyRate, PhysicsError>;
}
