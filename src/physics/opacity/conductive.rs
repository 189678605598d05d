//! `conductive`: heat transport by electron conduction, expressed as an opacity.

use super::{check_point, Opacity};
use crate::constants::{A_RAD_CGS, C_CM_S, E_ESU, HBAR_ERG_S, K_B_ERG_K, M_E_G, M_U_G};
use crate::error::PhysicsError;
use crate::numerics::cube_root::cbrt;
use crate::physics::composition::{Composition, METAL_MEAN_MASS_NUMBER};

/// Conductive opacity kappa_cd = 4 a c T^3 / (3 rho lambda_cd) cm^2 g^-1 (Kippenhahn & Weigert
/// 1990, ch. 17: conduction written as a diffusion of radiation), from the electron thermal
/// conductivity of a Lorentz plasma
/// lambda_cd = pi^2 k^2 T n_e / (3 m_e nu_ei), nu_ei = 4 pi e^4 Lambda sum_i(n_i Z_i^2) / (m_e^2 v^3)
/// (the degenerate-electron result, e.g. Hubbard & Lampe 1969, ApJS 18, 297; Yakovlev & Urpin
/// 1980, Sov. Astron. 24, 303), with v^2 = v_F^2 + 3 k T / m_e, v_F = hbar (3 pi^2 n_e)^(1/3) / m_e,
/// so that the law is the degenerate one where it matters and stays finite (and negligible)
/// for non-degenerate electrons, where it is an order-of-magnitude interpolation only.
/// Coulomb logarithm Lambda = max(1, ln(a_i / b_min)), a_i the ion-sphere radius and
/// b_min = hbar / (2 m_e v). Fully ionised matter (n_e = rho / (mu_e m_u)); metals as Z_i = 8,
/// A_i = 16; electron–electron collisions neglected. Any rho, T > 0.
///
/// Combine with a radiative opacity as 1/kappa = 1/kappa_rad + 1/kappa_cd ([`combine`]).
#[derive(Debug, Clone, Copy, Default)]
pub struct Conductive;

/// Charge of the representative metal ion (mass number 16: oxygen).
const METAL_CHARGE: f64 = 8.0;

impl Conductive {
    /// kappa_cd without checks (callers check the point).
    pub fn formula(rho: f64, t: f64, comp: &Composition) -> f64 {
        let per_mu = rho / M_U_G;
        let n_e = per_mu * 0.5 * (1.0 + comp.x());
        let z2_sum = per_mu
            * (comp.x()
                + comp.y()
                + METAL_CHARGE * METAL_CHARGE * comp.z() / METAL_MEAN_MASS_NUMBER);
        let n_ion = per_mu * (comp.x() + 0.25 * comp.y() + comp.z() / METAL_MEAN_MASS_NUMBER);
        let pi = std::f64::consts::PI;
        let v_f = HBAR_ERG_S * cbrt(3.0 * pi * pi * n_e) / M_E_G;
        let v2 = v_f * v_f + 3.0 * K_B_ERG_K * t / M_E_G;
        let v = v2.sqrt();
        // ln(a_i / b_min) with a_i = (3 / (4 pi n_ion))^(1/3), b_min = hbar / (2 m_e v),
        // written as one logarithm.
        let k = 2.0 * M_E_G * v / HBAR_ERG_S;
        let coulomb_log = ((k * k * k * 3.0 / (4.0 * pi * n_ion)).ln() / 3.0).max(1.0);
        let e4 = E_ESU.powi(4);
        let nu = 4.0 * pi * e4 * coulomb_log * z2_sum / (M_E_G * M_E_G * v2 * v);
        let lambda = pi * pi * K_B_ERG_K * K_B_ERG_K * t * n_e / (3.0 * M_E_G * nu);
        4.0 * A_RAD_CGS * C_CM_S * t.powi(3) / (3.0 * rho * lambda)
    }
}

/// Radiation and conduction in parallel: 1/kappa = 1/kappa_rad + 1/kappa_cd, written as
/// kappa_rad kappa_cd / (kappa_rad + kappa_cd) so that a zero term gives zero.
pub fn combine(kappa_rad: f64, kappa_cd: f64) -> f64 {
    kappa_rad * kappa_cd / (kappa_rad + kappa_cd)
}

impl Opacity for Conductive {
    fn name(&self) -> String {
        "conductive".to_string()
    }

    fn kappa(&self, rho: f64, t: f64, comp: &Composition) -> Result<f64, PhysicsError> {
        check_point("conductive", rho, t)?;
        Ok(Self::formula(rho, t, comp))
    }
}
