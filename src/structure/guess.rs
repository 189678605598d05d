//! Starting guesses for the shooting unknowns.
//!
//! Radius and luminosity come from the published ZAMS fits of Tout et al. (1996) (at Z = 0.02;
//! the Newton iteration absorbs the composition dependence). Central pressure and temperature
//! come from the polytrope that best describes the star's interior at that mass: n = 3
//! (radiative core, Eddington's standard model) above about 0.6 M_sun, n = 1.5 (fully
//! convective) below about 0.3 M_sun, blended in log M between:
//! P_c = W_n G M^2 / R^4 and T_c = Theta_n mu m_u G M / (k R)
//! (Chandrasekhar 1939, ch. IV; W_3 = 11.05, Theta_3 = 0.854, W_1.5 = 0.770, Theta_1.5 = 0.538).

use super::shooting::Unknowns;
use crate::constants::{G_CGS, K_B_ERG_K, L_SUN_ERG_S, M_SUN_G, M_U_G, R_SUN_CM};
use crate::physics::Composition;
use crate::reference::{tout1996_luminosity_lsun, tout1996_radius_rsun};

/// Built-in starting guess (ln P_c, ln T_c, ln R, ln L) for mass `mass_msun`.
pub fn initial_guess(mass_msun: f64, comp: &Composition) -> Unknowns {
    let r_cm = tout1996_radius_rsun(mass_msun) * R_SUN_CM;
    let l_erg_s = tout1996_luminosity_lsun(mass_msun) * L_SUN_ERG_S;
    let m_g = mass_msun * M_SUN_G;
    // Weight of the n = 3 polytrope, 0 below 0.3 M_sun and 1 above 0.6 M_sun.
    let w = ((mass_msun.ln() - 0.3f64.ln()) / (0.6f64.ln() - 0.3f64.ln())).clamp(0.0, 1.0);
    let ln_w_n = (1.0 - w) * 0.770_140f64.ln() + w * 11.050_68f64.ln();
    let ln_theta_n = (1.0 - w) * 0.538_494f64.ln() + w * 0.854_316f64.ln();
    let ln_pc = ln_w_n + (G_CGS * m_g * m_g / r_cm.powi(4)).ln();
    // Radiation pressure lowers T_c at given P_c by the gas fraction beta of Eddington's
    // standard model, (1 - beta) / beta^4 = 0.003 mu^4 M^2 (Kippenhahn & Weigert 1990, §19.10).
    let beta = eddington_beta(0.003 * comp.mu().powi(4) * mass_msun * mass_msun);
    let ln_tc =
        ln_theta_n + beta.ln() + (comp.mu() * M_U_G * G_CGS * m_g / (K_B_ERG_K * r_cm)).ln();
    Unknowns::new(ln_pc, ln_tc, r_cm.ln(), l_erg_s.ln())
}

/// Root in (0, 1] of (1 - beta) / beta^4 = c, by bisection (the left side falls monotonically
/// from infinity to 0 on (0, 1]).
fn eddington_beta(c: f64) -> f64 {
    let (mut lo, mut hi) = (1e-6f64, 1.0f64);
    for _ in 0..60 {
        let mid = 0.5 * (lo + hi);
        if (1.0 - mid) / mid.powi(4) > c {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    0.5 * (lo + hi)
}
