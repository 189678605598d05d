//! Eddington's standard model: (1 - beta)/beta^4 = C mu^4 (M/M_sun)^2 with
//! C = pi G^3 a m_u^4 M_sun^2 / (48 omega_3^2 k^4).
//!
//! Reference values from docs/references.md §1 (computed with CODATA 2018 and m_u):
//! C = 2.990e-3; for mu = 0.61, 1 - beta = 0.00041 (1 M_sun), 0.0358 (10), 0.432 (100).
//! Textbook form 1 - beta = 0.003 mu^4 beta^4 M^2 (Kippenhahn & Weigert 1990; memory).

mod common;

use common::{assert_digits, relative};
use starpoise::polytrope::{
    eddington_beta, eddington_constant, first_zero, scale_to_star, solve_lane_emden,
    LaneEmdenSettings, StarParameters,
};

fn omega_3() -> f64 {
    let z = first_zero(3.0).unwrap().unwrap();
    -z.xi1 * z.xi1 * z.dtheta_dxi
}

#[test]
fn quartic_constant() {
    assert_digits(eddington_constant(omega_3()), "2.990e-3", "C");
    // The textbook 0.003 (memory) is the same to its one figure.
    assert!(relative(eddington_constant(omega_3()), 0.003) < 0.01);
}

#[test]
fn beta_for_mu_0_61() {
    for (mass, one_minus_beta) in [(1.0, "0.00041"), (10.0, "0.0358"), (100.0, "0.432")] {
        let beta = eddington_beta(mass, 0.61, omega_3()).unwrap();
        assert_digits(
            1.0 - beta,
            one_minus_beta,
            &format!("1 - beta at {mass} M_sun"),
        );
        // The root satisfies the quartic to rounding.
        let lhs = (1.0 - beta) / beta.powi(4);
        let rhs = eddington_constant(omega_3()) * 0.61_f64.powi(4) * mass * mass;
        assert!(
            relative(lhs, rhs) < 1e-9,
            "quartic residual at {mass} M_sun"
        );
    }
}

/// T_c = beta times the ideal-gas T_c; P_c (total) unchanged (gas carries beta P).
#[test]
fn radiation_lowers_the_central_temperature_by_beta() {
    let solution = solve_lane_emden(3.0, &LaneEmdenSettings::default()).unwrap();
    let star = StarParameters::new(10.0, 4.0, 0.61).unwrap();
    let gas = scale_to_star(&solution, &star, false).unwrap();
    let rad = scale_to_star(&solution, &star, true).unwrap();
    let beta = rad.beta.unwrap();
    assert!(relative(rad.central_temperature_k, beta * gas.central_temperature_k) < 1e-15);
    assert_eq!(rad.central_pressure_dyn_cm2, gas.central_pressure_dyn_cm2);
    assert_eq!(rad.central_density_g_cm3, gas.central_density_g_cm3);
    // Radiation pressure a T_c^4 / 3 is the fraction 1 - beta of the total at the centre: an
    // identity of the model (the quartic is this statement), so only rounding is allowed.
    let p_rad = starpoise::constants::A_RAD_CGS * rad.central_temperature_k.powi(4) / 3.0;
    assert!(relative(p_rad, (1.0 - beta) * rad.central_pressure_dyn_cm2) < 1e-12);
}

#[test]
fn radiation_needs_index_three() {
    let solution = solve_lane_emden(2.5, &LaneEmdenSettings::default()).unwrap();
    let star = StarParameters::new(1.0, 1.0, 0.61).unwrap();
    let err = scale_to_star(&solution, &star, true).unwrap_err();
    assert_eq!(err.exit_code(), starpoise::error::ExitCode::BadInput);
    assert!(err.to_string().contains("radiation"), "{err}");
}

#[test]
fn bad_mass_or_mu_is_refused() {
    let w = omega_3();
    for (m, mu, flag) in [
        (0.0, 0.61, "mass_msun"),
        (f64::NAN, 0.61, "mass_msun"),
        (1.0, -1.0, "mu"),
    ] {
        let err = eddington_beta(m, mu, w).unwrap_err();
        assert!(err.to_string().contains(flag), "{err}");
    }
}
