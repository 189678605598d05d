//! The pulsational instability mass: where the radial fundamental mode of ZAMS models turns
//! vibrationally unstable in the quasi-adiabatic approximation (nuclear driving, the epsilon
//! mechanism, against radiative damping; `starpoise::oscillation::stability`).
//!
//! What the literature gives for roughly solar composition (docs/references.md §8.7): the onset
//! of epsilon-mechanism driving of the fundamental "near 100 M_sun" in linear studies (Ledoux
//! 1941; Schwarzschild & Härm 1959; Simon & Stothers 1970; Ziebarth 1970) [SECONDARY];
//! Schwarzschild & Härm's homogeneous models with CN burning and electron-scattering envelopes,
//! quasi-adiabatic, about 60 M_sun [MEMORY]; homogeneous models with the OPAL opacities of the
//! order of 100-150 M_sun (Stothers 1992) [MEMORY, low confidence]. The band tested, 50 to 150
//! M_sun, spans these values with the spread of their approximations; the mass found here is
//! 56.3 M_sun for X = 0.70, Z = 0.02 and the refined laws (whose opacity has no iron bump),
//! next to Schwarzschild & Härm's.

mod common;

use common::{json, starpoise, stderr};
use starpoise::oscillation::{fundamental_stability, pulsational_instability_mass};
use starpoise::physics::{Composition, PhysicsSet};

/// The literature band for the onset at roughly solar composition (module documentation).
const LITERATURE_BAND_MSUN: (f64, f64) = (50.0, 150.0);

#[test]
fn instability_mass_lies_in_the_literature_band() {
    let composition = Composition::new(0.70, 0.02).unwrap();
    let physics = PhysicsSet::refined();
    let limit = pulsational_instability_mass(&composition, &physics).unwrap();
    let mass = limit.mass_msun.expect("an onset below 150 M_sun");
    let (lo, hi) = LITERATURE_BAND_MSUN;
    assert!((lo..=hi).contains(&mass), "{mass} M_sun");
    // The search bracketed a sign change: stable below, unstable above.
    let below = limit
        .evaluations
        .iter()
        .filter(|e| e.0 < mass * 0.99)
        .all(|e| e.1 < 0.0);
    let above = limit
        .evaluations
        .iter()
        .filter(|e| e.0 > mass * 1.01)
        .all(|e| e.1 > 0.0);
    assert!(below && above, "{:?}", limit.evaluations);
}

/// Nuclear burning drives the fundamental (the epsilon mechanism: heat is released in phase
/// with compression, nu > 0) and the radiative flux damps it, at 20 and 100 M_sun; driving wins
/// only in the more massive star (fact of the trade: the instability of very massive stars,
/// docs/references.md §8.7).
#[test]
fn nuclear_driving_and_radiative_damping() {
    let composition = Composition::new(0.70, 0.02).unwrap();
    let physics = PhysicsSet::refined();
    let low = fundamental_stability(20.0, &composition, &physics, 2000).unwrap();
    let high = fundamental_stability(100.0, &composition, &physics, 2000).unwrap();
    for s in [&low, &high] {
        assert!(s.nuclear_part_per_s > 0.0, "{s:?}");
        assert!(s.radiative_part_per_s < 0.0, "{s:?}");
        assert!(
            (s.nuclear_part_per_s + s.radiative_part_per_s - s.growth_rate_per_s).abs()
                <= 1e-12 * s.nuclear_part_per_s.abs()
        );
    }
    assert!(low.growth_rate_per_s < 0.0 && high.growth_rate_per_s > 0.0);
}

/// `limits --format json` gives the key, and the text says it.
#[test]
fn limits_prints_the_pulsational_instability_mass() {
    let out = starpoise(&["limits", "--format", "json"]);
    assert!(out.status.success(), "{}", stderr(&out));
    let v = json(&out);
    let mass = v["pulsational_instability_mass_msun"].as_f64().unwrap();
    let (lo, hi) = LITERATURE_BAND_MSUN;
    assert!((lo..=hi).contains(&mass), "{mass}");
    let search = v["pulsational_search"].as_array().unwrap();
    assert!(search.len() >= 4);
    assert!(search[0]["fundamental_growth_per_radian"].as_f64().unwrap() < 0.0);
    // The hydrogen-burning limit is still there.
    assert!(v["hydrogen_burning_minimum_mass_msun"].as_f64().unwrap() < 0.08);
}

/// The work integral stops where the thermal time of the layers above equals the period,
/// located inside a profile cell: so the growth rate is a continuous function of the model. A
/// change of X by 1e-10 (which moves the ZAMS model by about 1e-10) moves the 10 M_sun
/// fundamental's growth rate by less than 1e-4 of itself (measured 1e-5; cut at a profile row,
/// as before, it jumped by 1e-3 as the rows moved across the crossing). A fact of calculus: a
/// quantity computed by a continuous procedure from a model changes little when the model does.
#[test]
fn growth_rate_is_continuous_in_the_model() {
    let physics = PhysicsSet::refined();
    let growth = |x: f64| {
        let composition = Composition::new(x, 0.02).unwrap();
        fundamental_stability(10.0, &composition, &physics, 2000)
            .unwrap()
            .growth_per_radian
    };
    let base = growth(0.70);
    for dx in [1e-10, 2e-10, 5e-10] {
        let moved = growth(0.70 + dx);
        assert!(
            (moved / base - 1.0).abs() < 1e-4,
            "{dx}: {moved} against {base}"
        );
    }
}
