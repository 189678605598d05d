//! The `refined` set above 2 M_sun against components of young detached eclipsing binaries
//! (docs/references.md §8.8; the list is `starpoise::reference::YOUNG_ECLIPSING_COMPONENTS`,
//! shared with `verify`), each model from the built-in starting guess at X = 0.70, Z = 0.02.
//! None of these stars was used for any calibration.

use starpoise::physics::{Composition, PhysicsSet};
use starpoise::reference::YOUNG_ECLIPSING_COMPONENTS;
use starpoise::structure::ModelSummary;
use starpoise::structure::{solve, ZamsSettings};

fn model(mass: f64) -> ModelSummary {
    let physics = PhysicsSet::refined();
    let s = ZamsSettings::new(mass, Composition::new(0.70, 0.02).unwrap(), physics).unwrap();
    solve(&s)
        .unwrap_or_else(|e| panic!("{mass} M_sun: {e}"))
        .summary
}

/// A star's radius only grows on the main sequence, so the ZAMS model of a young star's mass is
/// not larger than the star beyond two standard deviations (docs/references.md §8.8, fact of
/// the trade); how much smaller it is (2-15 per cent here) is reported in the README, not
/// bounded here. T_eff: the M-dwarf issue's model window of 0.03 dex widened by the
/// measurement's two standard deviations (in dex). At solar composition: V615 Per A's model at
/// X = 0.72, Z = 0.01 (h Persei is metal-poor) is 0.069 dex hotter than the star, outside its
/// 0.059 dex (README). V615 Per B's published T_eff is not checked (see the list's doc).
#[test]
fn young_eclipsing_binaries() {
    for c in &YOUNG_ECLIPSING_COMPONENTS {
        let s = model(c.mass_msun);
        let ratio = s.radius_rsun / c.radius_rsun.0;
        assert!(
            ratio <= c.largest_radius_ratio(),
            "{}: R model / measured = {ratio}",
            c.name
        );
        if let (Some((t_obs, _)), Some(window_dex)) = (c.teff_k, c.teff_window_dex()) {
            let excess_dex = (s.teff_k / t_obs).log10();
            assert!(
                excess_dex.abs() <= window_dex,
                "{}: T_eff {} K against {t_obs} K ({excess_dex:+.4} dex)",
                c.name,
                s.teff_k
            );
        }
    }
}
