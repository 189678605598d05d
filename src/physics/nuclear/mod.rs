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

/// 3He in equilibrium in the pp chain at one (rho, T), and how fast it gets there.
///
/// 3He is made by each pp reaction (deuterium burns at once) at r_pp reactions cm^-3 s^-1 and
/// destroyed by 3He + 3He (two nuclei per reaction, at n_3^2 `<sigma v>`_33 / 2 reactions
/// cm^-3 s^-1: identical particles) and 3He + 4He (one per reaction):
///
/// dn_3/dt = r_pp - D(n_3),  D(n_3) = lambda_33 n_3^2 + lambda_34 n_3,
///
/// with lambda_33 = `<sigma v>`_33 and lambda_34 = n_4 `<sigma v>`_34 (screened). The pp chain is
/// written this way in Clayton 1968, *Principles of Stellar Evolution and Nucleosynthesis*,
/// ch. 5 (memory), with the same factor 1/2 for identical particles. The equilibrium n_3,eq solves D(n_3) = r_pp; a departure delta n_3 from it obeys
/// d delta n_3 / dt = -D'(n_3,eq) delta n_3, so it decays as exp(-t / tau_eq) with the
/// relaxation time
///
/// tau_eq = 1 / D'(n_3,eq) = 1 / (2 lambda_33 n_3,eq + lambda_34).
///
/// Without 3He + 4He (lambda_34 -> 0) this is tau_eq = 1 / (2 sqrt(lambda_33 r_pp)), half the
/// lifetime 1 / (lambda_33 n_3,eq) of a 3He nucleus against 3He + 3He, and half the time scale
/// of the tanh approach from n_3 = 0 (docs/references.md §4).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct He3Equilibrium {
    /// Number density of 3He at equilibrium n_3,eq, cm^-3.
    pub number_density_cm3: f64,
    /// Mass fraction of 3He at equilibrium, n_3,eq m(3He) / rho.
    pub mass_fraction: f64,
    /// Relaxation time tau_eq = 1 / (2 lambda_33 n_3,eq + lambda_34), s.
    pub relaxation_time_s: f64,
    /// Production r_pp (pp reactions, each making one 3He), cm^-3 s^-1.
    pub production_cm3_s: f64,
    /// lambda_33 = screened `<sigma v>` of 3He + 3He, cm^3 s^-1 (3He destroyed at
    /// lambda_33 n_3^2).
    pub he3_he3_cm3_s: f64,
    /// lambda_34 = n_4 times the screened `<sigma v>` of 3He + 4He, s^-1 (3He destroyed at
    /// lambda_34 n_3).
    pub he3_he4_per_s: f64,
}

impl He3Equilibrium {
    /// Destruction D(n_3) = lambda_33 n_3^2 + lambda_34 n_3 of 3He at number density `n_3`,
    /// cm^-3 s^-1.
    pub fn destruction_cm3_s(&self, n_3: f64) -> f64 {
        self.he3_he3_cm3_s * n_3 * n_3 + self.he3_he4_per_s * n_3
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

    /// 3He in equilibrium at density `rho_g_cm3` and temperature `temperature_k`, from the
    /// law's own 3He + 3He and 3He + 4He rates; `Ok(None)` for a law without them (the
    /// default). Errors outside the domain.
    fn he3_equilibrium(
        &self,
        rho_g_cm3: f64,
        temperature_k: f64,
        comp: &Composition,
    ) -> Result<Option<He3Equilibrium>, PhysicsError> {
        let _ = (rho_g_cm3, temperature_k, comp);
        Ok(None)
    }

    /// Whether this law's energy generation at (`rho_g_cm3`, `temperature_k`) is negligible in
    /// every star (below 1e-30 of the central rate of the coolest hydrogen-burning star): the
    /// structure equations take eps = 0 there without evaluating the law. False (the
    /// default): everywhere evaluated.
    fn negligible_at(&self, rho_g_cm3: f64, temperature_k: f64) -> bool {
        let _ = (rho_g_cm3, temperature_k);
        false
    }
}
