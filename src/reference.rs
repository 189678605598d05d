//! Published relations used as starting guesses and as outside checks.

/// Zero-age main-sequence luminosity (L_sun) at Z = 0.02 for mass `m` (M_sun), from the analytic
/// fit of Tout, Pols, Eggleton & Han (1996, MNRAS 281, 257), eq. 1 with the Z = 0.02
/// coefficients (docs/references.md §6, from memory; they reproduce the quoted ZAMS Sun
/// L = 0.698). Valid 0.1–100 M_sun to a few per cent of the models it fits.
pub fn tout1996_luminosity_lsun(m: f64) -> f64 {
    let (a, b, g, d, e, z, h) = (
        0.397_041_70,
        8.527_626_00,
        0.000_255_46,
        5.432_889_00,
        5.563_579_00,
        0.788_660_60,
        0.005_866_85,
    );
    (a * m.powf(5.5) + b * m.powf(11.0))
        / (g + m.powi(3) + d * m.powi(5) + e * m.powi(7) + z * m.powi(8) + h * m.powf(9.5))
}

/// Zero-age main-sequence radius (R_sun) at Z = 0.02 for mass `m` (M_sun), from Tout et al.
/// (1996), eq. 2 with the Z = 0.02 coefficients (docs/references.md §6, from memory; they
/// reproduce the quoted ZAMS Sun R = 0.888).
pub fn tout1996_radius_rsun(m: f64) -> f64 {
    let (th, io, ka, la, mu) = (
        1.715_359_00,
        6.597_788_00,
        10.088_550_00,
        1.012_495_00,
        0.074_901_66,
    );
    let (nu, xi, om, pi) = (0.010_774_22, 3.082_234_00, 17.847_780_00, 0.000_225_82);
    (th * m.powf(2.5) + io * m.powf(6.5) + ka * m.powi(11) + la * m.powi(19) + mu * m.powf(19.5))
        / (nu + xi * m.powi(2) + om * m.powf(8.5) + m.powf(18.5) + pi * m.powf(19.5))
}

/// Large separation from the solar-scaled relation of Kjeldsen & Bedding (1995, A&A 293, 87):
/// Delta nu = 134.9 uHz (M/M_sun)^(1/2) (R/R_sun)^(-3/2), uHz (docs/references.md §8.6, memory).
/// It scales the Sun's observed large separation with the square root of the mean density.
pub fn kjeldsen_bedding_large_separation_uhz(mass_msun: f64, radius_rsun: f64) -> f64 {
    134.9 * mass_msun.sqrt() * radius_rsun.powf(-1.5)
}

/// Frequency of maximum oscillation power from the solar-scaled relation of Kjeldsen & Bedding
/// (1995; after Brown et al. 1991, ApJ 368, 599, who proposed nu_max proportional to the
/// acoustic cut-off frequency): nu_max = 3.05 mHz (M/M_sun) (R/R_sun)^-2 (T_eff/5777 K)^(-1/2),
/// uHz (docs/references.md §8.6, memory; 5777 K as in the paper, not the nominal 5772 K).
pub fn kjeldsen_bedding_nu_max_uhz(mass_msun: f64, radius_rsun: f64, teff_k: f64) -> f64 {
    3050.0 * mass_msun * radius_rsun.powi(-2) * (teff_k / 5777.0).powf(-0.5)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// At the Sun the relations return their solar values (docs/references.md §8.6).
    #[test]
    fn kjeldsen_bedding_at_the_sun() {
        assert!((kjeldsen_bedding_large_separation_uhz(1.0, 1.0) - 134.9).abs() < 1e-12);
        assert!((kjeldsen_bedding_nu_max_uhz(1.0, 1.0, 5777.0) - 3050.0).abs() < 1e-9);
        // Delta nu scales as the square root of the mean density: 8 times denser, sqrt(8).
        let ratio = kjeldsen_bedding_large_separation_uhz(1.0, 0.5) / 134.9;
        assert!((ratio - 8f64.sqrt()).abs() < 1e-12);
    }

    /// Sample values computed from the fit (docs/references.md §6, computed flag).
    #[test]
    fn reproduces_the_tabulated_samples() {
        let cases = [
            (1.0, 0.698, 0.888),
            (0.5, 0.0379, 0.459),
            (2.0, 15.9, 1.610),
            (5.0, 530.0, 2.636),
            (10.0, 5552.0, 3.942),
            (50.0, 3.58e5, 10.78),
        ];
        for (m, l, r) in cases {
            // The samples are quoted to three or four figures: 0.5 per cent covers the rounding.
            assert!(
                (tout1996_luminosity_lsun(m) / l - 1.0).abs() < 5e-3,
                "L({m})"
            );
            assert!((tout1996_radius_rsun(m) / r - 1.0).abs() < 5e-3, "R({m})");
        }
    }
}
