//! Published relations and measurements used as starting guesses and as outside checks.

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

/// A component of a young detached eclipsing binary: mass (M_sun), radius and its error (R_sun),
/// and T_eff and its error (K) where published and usable as a check.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct YoungComponent {
    /// The star's name.
    pub name: &'static str,
    /// Measured mass, M_sun.
    pub mass_msun: f64,
    /// Measured radius and its standard deviation, R_sun.
    pub radius_rsun: (f64, f64),
    /// Measured effective temperature and its standard deviation, K (`None`: not published, or
    /// not usable as a check).
    pub teff_k: Option<(f64, f64)>,
}

/// Components of detached eclipsing binaries in very young clusters, near the ZAMS, checked by
/// `verify` (zams.young.*)
/// (docs/references.md §8.8 [CONFIRMED, abstracts]): V578 Mon A/B in NGC 2244 (Garcia et al.
/// 2014), V615 Per A/B and V618 Per A in h Persei (Southworth, Maxted & Smalley 2004). V615 Per
/// B's published T_eff, 11 000 +- 500 K, is left out: with its radius it gives L = 48 L_sun, half
/// the 100 L_sun of a 3.18 M_sun star on the ZAMS in the fits of Tout et al. (1996, computed),
/// and a star only brightens on the main sequence.
pub const YOUNG_ECLIPSING_COMPONENTS: [YoungComponent; 5] = [
    YoungComponent {
        name: "V578 Mon A",
        mass_msun: 14.54,
        radius_rsun: (5.41, 0.04),
        teff_k: Some((30000.0, 500.0)),
    },
    YoungComponent {
        name: "V578 Mon B",
        mass_msun: 10.29,
        radius_rsun: (4.29, 0.05),
        teff_k: Some((25750.0, 435.0)),
    },
    YoungComponent {
        name: "V615 Per A",
        mass_msun: 4.08,
        radius_rsun: (2.29, 0.14),
        teff_k: Some((15000.0, 500.0)),
    },
    YoungComponent {
        name: "V615 Per B",
        mass_msun: 3.18,
        radius_rsun: (1.90, 0.09),
        teff_k: None,
    },
    YoungComponent {
        name: "V618 Per A",
        mass_msun: 2.33,
        radius_rsun: (1.64, 0.07),
        teff_k: None,
    },
];

impl YoungComponent {
    /// Largest ZAMS radius over the measured one a young star allows: 1 + 2 sigma / R (a star's
    /// radius only grows on the main sequence; fact of the trade, docs/references.md §8.8).
    pub fn largest_radius_ratio(&self) -> f64 {
        1.0 + 2.0 * self.radius_rsun.1 / self.radius_rsun.0
    }

    /// Window on |log10(T_eff,model / T_eff,measured)|: 0.03 dex (the M-dwarf issue's model
    /// window) plus the measurement's two standard deviations in dex; `None` without a T_eff.
    pub fn teff_window_dex(&self) -> Option<f64> {
        self.teff_k
            .map(|(t, sigma)| 0.03 + 2.0 * (1.0 + sigma / t).log10())
    }
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
