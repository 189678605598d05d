//! The `refined` set above 2 M_sun against components of young detached eclipsing binaries
//! (docs/references.md §8.8), each model from the built-in starting guess at X = 0.70, Z = 0.02.
//! None of these stars was used for any calibration.

use starpoise::physics::{Composition, PhysicsSet};
use starpoise::structure::ModelSummary;
use starpoise::structure::{solve, ZamsSettings};

fn model(mass: f64) -> ModelSummary {
    let physics = PhysicsSet::refined();
    let s = ZamsSettings::new(mass, Composition::new(0.70, 0.02).unwrap(), physics).unwrap();
    solve(&s)
        .unwrap_or_else(|e| panic!("{mass} M_sun: {e}"))
        .summary
}

/// A measured component: mass (M_sun), radius and its error (R_sun), T_eff and its error (K)
/// where published and checked.
struct Component {
    name: &'static str,
    mass_msun: f64,
    radius_rsun: (f64, f64),
    teff_k: Option<(f64, f64)>,
}

/// docs/references.md §8.8 [CONFIRMED, abstracts]: V578 Mon in NGC 2244 (Garcia et al. 2014),
/// V615 Per and V618 Per in h Persei (Southworth, Maxted & Smalley 2004).
const YOUNG: [Component; 5] = [
    Component {
        name: "V578 Mon A",
        mass_msun: 14.54,
        radius_rsun: (5.41, 0.04),
        teff_k: Some((30000.0, 500.0)),
    },
    Component {
        name: "V578 Mon B",
        mass_msun: 10.29,
        radius_rsun: (4.29, 0.05),
        teff_k: Some((25750.0, 435.0)),
    },
    Component {
        name: "V615 Per A",
        mass_msun: 4.08,
        radius_rsun: (2.29, 0.14),
        teff_k: Some((15000.0, 500.0)),
    },
    // Its published T_eff, 11 000 +- 500 K, is not checked: with its radius it gives
    // L = 48 L_sun, half the 100 L_sun of a 3.18 M_sun star on the ZAMS in the fits of Tout et al.
    // (1996, computed), and a star only brightens on the main sequence; the model is 0.098 dex
    // hotter (README, Accuracy).
    Component {
        name: "V615 Per B",
        mass_msun: 3.18,
        radius_rsun: (1.90, 0.09),
        teff_k: None,
    },
    Component {
        name: "V618 Per A",
        mass_msun: 2.33,
        radius_rsun: (1.64, 0.07),
        teff_k: None,
    },
];

/// A star's radius only grows on the main sequence, so the ZAMS model of a young star's mass is
/// not larger than the star beyond two standard deviations (docs/references.md §8.8, fact of
/// the trade); how much smaller it is (2-15 per cent here) is reported in the README, not
/// bounded here. T_eff: the M-dwarf issue's model window of 0.03 dex widened by the
/// measurement's two standard deviations (in dex). At solar composition: V615 Per A's model at
/// X = 0.72, Z = 0.01 (h Persei is metal-poor) is 0.069 dex hotter than the star, outside its
/// 0.059 dex (README).
#[test]
fn young_eclipsing_binaries() {
    for c in &YOUNG {
        let s = model(c.mass_msun);
        let (r_obs, r_err) = c.radius_rsun;
        let ratio = s.radius_rsun / r_obs;
        assert!(
            ratio <= 1.0 + 2.0 * r_err / r_obs,
            "{}: R model / measured = {ratio}",
            c.name
        );
        if let Some((t_obs, t_err)) = c.teff_k {
            let excess_dex = (s.teff_k / t_obs).log10();
            let window_dex = 0.03 + 2.0 * (1.0 + t_err / t_obs).log10();
            assert!(
                excess_dex.abs() <= window_dex,
                "{}: T_eff {} K against {t_obs} K ({excess_dex:+.4} dex)",
                c.name,
                s.teff_k
            );
        }
    }
}
