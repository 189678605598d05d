//! Ideal gas of fully ionised matter plus radiation.

use super::{EosState, EquationOfState};
use crate::constants::{A_RAD_CGS, K_B_ERG_K, M_U_G};
use crate::error::PhysicsError;
use crate::physics::composition::Composition;

/// P = rho k T / (mu m_u) + a T^4 / 3 with mu of fully ionised matter.
///
/// Closed-form derivatives (Kippenhahn & Weigert 1990, *Stellar Structure and Evolution*,
/// §13.2–13.3): chi_rho = beta, chi_T = 4 - 3 beta, delta = chi_T / chi_rho,
/// c_V = (3/2 P_gas + 12 P_rad) / (rho T), c_P = c_V + (P / (rho T)) chi_T^2 / chi_rho,
/// nabla_ad = (8 - 6 beta) / (32 - 24 beta - 3 beta^2) and Gamma_1 = chi_rho / (1 - chi_T nabla_ad).
/// Specific energy u = (3/2) P_gas / rho + 3 P_rad / rho (zero: the ionised plasma at rest, as
/// for every law); entropy: Sackur–Tetrode for the bare nuclei (H, He and metals of mass
/// numbers 1.00782503, 4 and 16) and the electrons (weight 2), plus radiation
/// (`super::entropy`).
/// Valid for any rho > 0, T > 0 (full ionisation is assumed, not checked).
#[derive(Debug, Clone, Copy, Default)]
pub struct IdealGas;

impl IdealGas {
    fn from_parts(rho: f64, t: f64, p_gas: f64, p_rad: f64, mu: f64) -> EosState {
        let p = p_gas + p_rad;
        let beta = p_gas / p;
        let chi_rho = beta;
        let chi_t = 4.0 - 3.0 * beta;
        // Specific internal energy u = 3/2 P_gas/rho + 3 P_rad/rho; c_V = du/dT at fixed rho.
        let cv = (1.5 * p_gas + 12.0 * p_rad) / (rho * t);
        // c_P = c_V + (P / (rho T)) chi_T^2 / chi_rho  (Kippenhahn & Weigert eq. 13.7 generalised).
        let cp = cv + p / (rho * t) * chi_t * chi_t / chi_rho;
        let nabla_ad = (8.0 - 6.0 * beta) / (32.0 - 24.0 * beta - 3.0 * beta * beta);
        let gamma1 = chi_rho / (1.0 - chi_t * nabla_ad);
        EosState {
            density_g_cm3: rho,
            temperature_k: t,
            pressure_dyn_cm2: p,
            gas_pressure_dyn_cm2: p_gas,
            beta,
            chi_rho,
            chi_t,
            nabla_ad,
            gamma1,
            cp_erg_g_k: cp,
            delta: chi_t / chi_rho,
            mu,
            degeneracy_psi: f64::NEG_INFINITY,
            dpsi_dln_rho: 0.0,
            dpsi_dln_t: 0.0,
            hydrogen_ionised: 1.0,
            helium_single: 0.0,
            helium_double: 1.0,
            specific_energy_erg_g: (1.5 * p_gas + 3.0 * p_rad) / rho,
        }
    }
}

/// The entropy of fully ionised matter with classical electrons plus radiation, erg g^-1 K^-1,
/// at (`rho`, `t`) for composition `comp` (bare nuclei of mass numbers 1.00782503, 4 and 16,
/// electrons of weight 2).
fn ionised_entropy(rho: f64, t: f64, comp: &Composition) -> f64 {
    use super::entropy::{radiation, translational, K_PER_MU};
    use crate::constants::M_E_G;
    use crate::physics::composition::METAL_MEAN_MASS_NUMBER;
    let ln_n_mu = (rho / M_U_G).ln();
    let a_z = METAL_MEAN_MASS_NUMBER;
    let nuclei = translational(comp.x(), super::h2::H_ATOM_MASS_U, ln_n_mu, t)
        + translational(0.25 * comp.y(), 4.0, ln_n_mu, t)
        + translational(comp.z() / a_z, a_z, ln_n_mu, t);
    // Classical electrons: N_e [5/2 + ln(2 n_Q,e / n_e)].
    let n_e = comp.x() + 0.5 * comp.y() + comp.z() * (0.5 - 1.0 / a_z);
    let electrons = translational(n_e, M_E_G / M_U_G, ln_n_mu, t) + n_e * std::f64::consts::LN_2;
    K_PER_MU * (nuclei + electrons) + radiation(rho, t)
}

fn check_point(law: &str, rho: f64, t: f64) -> Result<(), PhysicsError> {
    if rho.is_finite() && t.is_finite() && rho > 0.0 && t > 0.0 {
        Ok(())
    } else {
        Err(PhysicsError::new(
            law,
            "density and temperature must be finite and positive",
            rho,
            t,
        ))
    }
}

/// Below this temperature hydrogen recombines (the Saha equation puts half of it ionised near
/// 1e4 K in stellar photospheres; fact of the trade), which the fully ionised ideal gas ignores.
pub const IDEAL_GAS_COOL_K: f64 = 1.0e4;

impl EquationOfState for IdealGas {
    fn name(&self) -> &str {
        "ideal"
    }

    fn caution(&self, _rho: f64, t: f64, _comp: &Composition) -> Option<&'static str> {
        (t < IDEAL_GAS_COOL_K).then_some(
            "below 1e4 K, where hydrogen recombines: the ideal gas assumes full ionisation",
        )
    }

    fn specific_entropy_erg_g_k(&self, state: &EosState, comp: &Composition) -> Option<f64> {
        Some(ionised_entropy(
            state.density_g_cm3,
            state.temperature_k,
            comp,
        ))
    }

    fn state(&self, rho: f64, t: f64, comp: &Composition) -> Result<EosState, PhysicsError> {
        check_point(self.name(), rho, t)?;
        let mu = comp.mu();
        let p_gas = rho * K_B_ERG_K * t / (mu * M_U_G);
        let p_rad = A_RAD_CGS * t.powi(4) / 3.0;
        Ok(Self::from_parts(rho, t, p_gas, p_rad, mu))
    }

    /// Closed form: rho = (P - a T^4/3) mu m_u / (k T).
    fn state_at_pressure(
        &self,
        p: f64,
        t: f64,
        comp: &Composition,
    ) -> Result<EosState, PhysicsError> {
        check_point(self.name(), p, t)?;
        let p_rad = A_RAD_CGS * t.powi(4) / 3.0;
        let p_gas = p - p_rad;
        if p_gas <= 0.0 {
            return Err(PhysicsError::new(
                self.name(),
                format!(
                    "pressure {p:.4e} dyn/cm^2 does not exceed the radiation pressure {p_rad:.4e}"
                ),
                f64::NAN,
                t,
            ));
        }
        let mu = comp.mu();
        let rho = p_gas * mu * M_U_G / (K_B_ERG_K * t);
        Ok(Self::from_parts(rho, t, p_gas, p_rad, mu))
    }
}
