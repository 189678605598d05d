//! Eddington's standard model: the n = 3 polytrope with a constant ratio beta = P_gas / P.
//!
//! With P = P_gas + P_rad, P_gas = beta P = rho k T / (mu m_u) and P_rad = (1 - beta) P = a T^4 / 3,
//! eliminating T gives P = K rho^(4/3) with K^3 = (3/a) (k / (mu m_u))^4 (1 - beta) / beta^4.
//! The n = 3 mass-radius relation, M = 4 pi (K / (pi G))^(3/2) omega_3, gives
//! K^3 = pi G^3 M^2 / (16 omega_3^2). Equating the two:
//!
//! (1 - beta) / beta^4 = C mu^4 (M / M_sun)^2,   C = pi G^3 a m_u^4 M_sun^2 / (48 omega_3^2 k^4)
//!
//! (Eddington's quartic; Chandrasekhar 1939, *An Introduction to the Study of Stellar
//! Structure*, ch. VI). With CODATA 2018 constants C = 2.990e-3.

use super::{check_mass_msun, check_mu};
use crate::constants::{A_RAD_CGS, G_CGS, K_B_ERG_K, M_SUN_G, M_U_G};
use crate::error::{Error, Result};
use std::f64::consts::PI;

/// C = pi G^3 a m_u^4 M_sun^2 / (48 omega_3^2 k^4) of Eddington's quartic, dimensionless, for the
/// n = 3 mass constant `omega_3` (= 2.01823595...).
pub fn eddington_constant(omega_3: f64) -> f64 {
    PI * G_CGS.powi(3) * A_RAD_CGS * M_U_G.powi(4) * M_SUN_G * M_SUN_G
        / (48.0 * omega_3 * omega_3 * K_B_ERG_K.powi(4))
}

/// The gas-pressure fraction beta in (0, 1] of Eddington's standard model for a star of
/// `mass_msun` solar masses and mean molecular weight `mu`: the root of
/// (1 - beta) = C mu^4 (M/M_sun)^2 beta^4 with C from [`eddington_constant`]`(omega_3)`.
///
/// The left side minus the right is strictly decreasing in beta on [0, 1] (1 at beta = 0,
/// negative at beta = 1), so there is exactly one root; it is found by bisection in the
/// radiation fraction 1 - beta down to adjacent floating-point numbers.
///
/// Errors: mass, mu or omega_3 not positive and finite ([`Error::InvalidInput`] naming
/// `--mass`, `--mu` or `omega_3`).
pub fn eddington_beta(mass_msun: f64, mu: f64, omega_3: f64) -> Result<f64> {
    let mass_msun = check_mass_msun(mass_msun)?;
    let mu = check_mu(mu)?;
    if !(omega_3.is_finite() && omega_3 > 0.0) {
        return Err(Error::invalid(
            "omega_3",
            omega_3,
            "the n = 3 mass constant must be positive",
        ));
    }
    let a = eddington_constant(omega_3) * mu.powi(4) * mass_msun * mass_msun;
    if !a.is_finite() {
        return Err(Error::invalid(
            "mass_msun",
            mass_msun,
            "mass and mu too large for Eddington's quartic",
        ));
    }
    // g(x) = x - a (1 - x)^4 with x = 1 - beta: increasing, g(0) = -a < 0, g(1) = 1 > 0.
    let (mut lo, mut hi) = (0.0_f64, 1.0_f64);
    for _ in 0..2000 {
        let mid = 0.5 * (lo + hi);
        if mid <= lo || mid >= hi {
            break;
        }
        if mid - a * (1.0 - mid).powi(4) < 0.0 {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    Ok(1.0 - 0.5 * (lo + hi))
}
