//! Oscillations of ZAMS models built by the library: completeness of the orders, convergence
//! when the profile's and the solver's resolutions are doubled, and the large separation of the
//! ZAMS Sun against the solar-scaled relation.

use starpoise::oscillation::{
    asymptotic_values, dynamical_frequency_hz, find_modes_of_degrees, large_separation_near,
    tabulated_from_profile, Mode, OscillationSettings,
};
use starpoise::physics::{Composition, PhysicsSet};
use starpoise::reference::{kjeldsen_bedding_large_separation_uhz, kjeldsen_bedding_nu_max_uhz};
use starpoise::structure::{solve, ZamsModel, ZamsSettings};

/// Profile rows of the coarser model (the default of `modes --mass`).
const ROWS: usize = 2000;
/// Highest order checked (the requirement).
const MAX_ORDER: u32 = 25;

fn sun() -> ZamsModel {
    let settings = ZamsSettings::new(
        1.0,
        Composition::new(0.70, 0.02).unwrap(),
        PhysicsSet::refined(),
    )
    .unwrap();
    solve(&settings).unwrap()
}

fn modes(model: &ZamsModel, rows: usize, settings: &OscillationSettings) -> Vec<Mode> {
    let profile = model.profile(rows).unwrap();
    let oscillation = tabulated_from_profile(&profile).unwrap();
    find_modes_of_degrees(&oscillation, &[0, 1, 2, 3], MAX_ORDER, settings).unwrap()
}

/// Every order from the lowest (radial fundamental, g25 for l >= 1) to 25, once each, for the
/// 1 M_sun ZAMS model; and frequencies that change by less than 1e-8 (the requirement)
/// when both the profile rows and the solver's resolution (phase per step) are doubled.
/// Measured: 8.4e-9 at most (against 16000 rows at a quarter of the phase: 8.5e-9).
#[test]
fn complete_and_converged_under_resolution_doubling() {
    const CONVERGENCE: f64 = 1e-8;
    let model = sun();
    let coarse_settings = OscillationSettings::default();
    let fine_settings = OscillationSettings::default()
        .with_phase_per_step(0.5 * coarse_settings.phase_per_step())
        .unwrap();
    let coarse = modes(&model, ROWS, &coarse_settings);
    let fine = modes(&model, 2 * ROWS, &fine_settings);
    for l in 0..=3u32 {
        let orders: Vec<i32> = coarse
            .iter()
            .filter(|m| m.degree == l)
            .map(|m| m.order)
            .collect();
        let k = MAX_ORDER as i32;
        let expected: Vec<i32> = match l {
            0 => (1..=k).collect(),
            1 => (-k..=k).filter(|&n| n != 0).collect(),
            _ => (-k..=k).collect(),
        };
        assert_eq!(orders, expected, "l = {l}");
    }
    assert_eq!(coarse.len(), fine.len());
    for (a, b) in coarse.iter().zip(&fine) {
        assert_eq!((a.degree, a.order), (b.degree, b.order));
        let change = (a.sigma_squared / b.sigma_squared - 1.0).abs();
        assert!(
            change < CONVERGENCE,
            "l = {} n = {}: {} -> {} ({change:e})",
            a.degree,
            a.order,
            a.sigma_squared,
            b.sigma_squared
        );
    }
}

/// The large separation of the ZAMS Sun from its radial modes near nu_max agrees with the
/// solar-scaled relation of Kjeldsen & Bedding (1995, A&A 293, 87; docs/references.md §8.6)
/// taken at the model's own M and R (the ZAMS Sun is 11 per cent smaller than today's Sun, so
/// its Delta nu is about 19 per cent larger than the Sun's 135 uHz) to within 3 per cent ("a few
/// per cent", the issue's requirement; the corrections to the relation reviewed by Hekker 2020
/// are of that size). Measured: 161.8 uHz against 160.6 uHz. The asymptotic
/// (2 int dr/c)^-1 of the same model (Tassoul 1980, docs/references.md §8.6) is checked for
/// consistency only, not against a published value: it exceeds the separation of the radial
/// modes near nu_max (166.6 uHz, 3.0 per cent more), by less than 5 per cent.
#[test]
fn zams_sun_large_separation_follows_the_scaling_relation() {
    const SCALING_TOLERANCE: f64 = 0.03;
    const ASYMPTOTIC_EXCESS: f64 = 0.05;
    let model = sun();
    let s = model.summary;
    let profile = model.profile(ROWS).unwrap();
    let oscillation = tabulated_from_profile(&profile).unwrap();
    let radial = starpoise::oscillation::find_modes(
        &oscillation,
        0,
        MAX_ORDER,
        &OscillationSettings::default(),
    )
    .unwrap();
    let uhz = dynamical_frequency_hz(1.0, s.radius_rsun) * 1e6;
    let nu_max = kjeldsen_bedding_nu_max_uhz(1.0, s.radius_rsun, s.teff_k);
    // nu_max lies within the computed orders (about order 23).
    assert!(nu_max < radial.last().unwrap().cyclic_frequency() * uhz);
    let dnu = large_separation_near(&radial, nu_max / uhz, 3).unwrap() * uhz;
    let scaling = kjeldsen_bedding_large_separation_uhz(1.0, s.radius_rsun);
    assert!(
        (dnu / scaling - 1.0).abs() < SCALING_TOLERANCE,
        "{dnu} uHz vs {scaling} uHz"
    );
    let asymptotic = asymptotic_values(&oscillation).large_separation * uhz;
    assert!(
        asymptotic > dnu && asymptotic / dnu - 1.0 < ASYMPTOTIC_EXCESS,
        "{asymptotic} vs {dnu}"
    );
}
