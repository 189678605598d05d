//! The Sun as an n = 3 polytrope with mu = 0.61.
//!
//! Two checks. (1) The scaled central values follow the formulas of Chandrasekhar 1939
//! (*An Introduction to the Study of Stellar Structure*, ch. IV) evaluated here with CODATA 2018
//! and IAU 2015 B3 constants and the n = 3 constants of docs/references.md §1 (computed):
//! rho_c = 54.18248111 * 3 M/(4 pi R^3), P_c = 11.05068 G M^2/R^4,
//! T_c = 0.854316 mu m_u G M/(k R). Tolerance 1e-6 relative: the seven figures of W_3 and
//! Theta_3. (2) The common textbook estimate rho_c ~ 76 g/cm^3, P_c ~ 1.25e17 dyn/cm^2,
//! T_c ~ 1.2e7 K (a textbook sanity figure; common practice, no source), within 2 per cent.

mod common;

use common::relative;
use starpoise::constants::{G_CGS, K_B_ERG_K, M_SUN_G, M_U_G, R_SUN_CM};
use starpoise::polytrope::{scale_to_star, solve_lane_emden, LaneEmdenSettings, StarParameters};
use std::f64::consts::PI;

fn sun() -> (
    starpoise::polytrope::LaneEmdenSolution,
    starpoise::polytrope::ScaledPolytrope,
) {
    let solution = solve_lane_emden(3.0, &LaneEmdenSettings::default()).unwrap();
    let star = StarParameters::new(1.0, 1.0, 0.61).unwrap();
    let scaled = scale_to_star(&solution, &star, false).unwrap();
    (solution, scaled)
}

#[test]
fn central_values_follow_the_formulas() {
    let (_, s) = sun();
    let (m, r) = (M_SUN_G, R_SUN_CM);
    let rho_c = 54.182_481_11 * 3.0 * m / (4.0 * PI * r.powi(3));
    let p_c = 11.050_68 * G_CGS * m * m / r.powi(4);
    let t_c = 0.854_316 * 0.61 * M_U_G * G_CGS * m / (K_B_ERG_K * r);
    assert!(relative(s.central_density_g_cm3, rho_c) < 1e-9);
    assert!(relative(s.central_pressure_dyn_cm2, p_c) < 1e-6);
    assert!(relative(s.central_temperature_k, t_c) < 1e-6);
    // Omega = -(3/(5-n)) G M^2/R = -1.5 G M^2/R for n = 3.
    assert!(relative(s.potential_energy_erg, -1.5 * G_CGS * m * m / r) < 1e-15);
    assert_eq!(s.beta, None);
}

#[test]
fn textbook_sanity_figures() {
    let (_, s) = sun();
    assert!(
        relative(s.central_density_g_cm3, 76.0) < 0.02,
        "{}",
        s.central_density_g_cm3
    );
    assert!(
        relative(s.central_pressure_dyn_cm2, 1.25e17) < 0.02,
        "{}",
        s.central_pressure_dyn_cm2
    );
    assert!(
        relative(s.central_temperature_k, 1.2e7) < 0.02,
        "{}",
        s.central_temperature_k
    );
}

/// The physical profile: centre and surface values, the ideal-gas law at every point, and the
/// total mass, from the definitions in Chandrasekhar 1939, ch. IV.
#[test]
fn physical_profile_is_consistent() {
    let (solution, s) = sun();
    assert_eq!(s.profile.len(), solution.profile.len());
    let centre = s.profile[0];
    assert_eq!(centre.radius_cm, 0.0);
    assert_eq!(centre.mass_g, 0.0);
    assert_eq!(centre.density_g_cm3, s.central_density_g_cm3);
    assert_eq!(centre.pressure_dyn_cm2, s.central_pressure_dyn_cm2);
    assert_eq!(centre.temperature_k, s.central_temperature_k);
    let surface = s.profile.last().unwrap();
    assert!(relative(surface.radius_cm, R_SUN_CM) < 1e-15);
    assert!(relative(surface.mass_g, M_SUN_G) < 1e-15);
    assert_eq!(surface.density_g_cm3, 0.0);
    for w in s.profile.windows(2) {
        assert!(w[1].mass_g > w[0].mass_g, "mass must grow outward");
        assert!(
            w[1].density_g_cm3 < w[0].density_g_cm3,
            "density must fall outward"
        );
    }
    for p in &s.profile[..s.profile.len() - 1] {
        // P = rho k T / (mu m_u) at every point (ideal gas, constant mu); rounding only.
        let ideal = p.density_g_cm3 * K_B_ERG_K * p.temperature_k / (0.61 * M_U_G);
        assert!(
            relative(p.pressure_dyn_cm2, ideal) < 1e-12,
            "at r = {}",
            p.radius_cm
        );
    }
    // The mass integral: m(r) = int 4 pi r^2 rho dr, by the trapezoidal rule on the 200 points
    // against the closed form used for mass_g; the rule is second order, 1e-3 is loose.
    let mut integral = 0.0;
    for w in s.profile.windows(2) {
        let f = |p: &starpoise::polytrope::PhysicalPoint| {
            4.0 * PI * p.radius_cm.powi(2) * p.density_g_cm3
        };
        integral += 0.5 * (f(&w[0]) + f(&w[1])) * (w[1].radius_cm - w[0].radius_cm);
    }
    assert!(relative(integral, M_SUN_G) < 1e-3, "integral {integral:e}");
}
