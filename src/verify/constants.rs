//! Checks of the physical constants and the solar values derived from them.

use super::{Check, Tolerance};
use crate::constants::{A_RAD_CGS, L_SUN_ERG_S, M_SUN_G, R_SUN_CM, SIGMA_SB_CGS};
use crate::error::Result;
use std::f64::consts::PI;

const GROUP: &str = "constants";

/// The checks of this group.
pub fn checks() -> Vec<Check> {
    vec![
        // Six figures given: half a unit in the sixth figure.
        Check::new(
            "constants.solar-mass",
            GROUP,
            "M_sun = GM_sun / G, g",
            "IAU 2015 B3 GM_sun (Prsa et al. 2016, AJ 152, 41) and CODATA 2018 G (confirmed); quotient computed",
            1.98841e33,
            Tolerance::Absolute(5e27),
            || Ok(M_SUN_G),
        ),
        // Seven figures given: half a unit in the seventh.
        Check::new(
            "constants.radiation-density",
            GROUP,
            "a = 4 sigma / c, erg cm^-3 K^-4",
            "CODATA 2018 sigma and c (confirmed); quotient computed",
            7.565733e-15,
            Tolerance::Absolute(5e-22),
            || Ok(A_RAD_CGS),
        ),
        // The IAU quotes T_eff,sun to the nearest kelvin.
        Check::new(
            "constants.solar-teff",
            GROUP,
            "T_eff,sun from L = 4 pi R^2 sigma T^4 with nominal L_sun, R_sun, K",
            "IAU 2015 B3 nominal values, T_eff,sun = 5772 K (Prsa et al. 2016, AJ 152, 41; confirmed)",
            5772.0,
            Tolerance::Absolute(0.5),
            solar_teff_k,
        ),
    ]
}

fn solar_teff_k() -> Result<f64> {
    Ok((L_SUN_ERG_S / (4.0 * PI * R_SUN_CM * R_SUN_CM * SIGMA_SB_CGS)).powf(0.25))
}
