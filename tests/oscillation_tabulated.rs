//! The tabulated-model path (arrays on a mesh in cgs units, as a ZAMS model will be given)
//! against the same star described analytically: a polytrope of index 3 truncated inside its
//! first zero, so that the surface has a finite pressure and density like a photosphere.
//!
//! The arrays are built from the Lane–Emden solution (Chandrasekhar 1939, ch. IV):
//! rho = rho_c theta^n, P = P_c theta^(n+1), r = alpha xi with alpha^2 = (n+1) P_c/(4 pi G rho_c^2),
//! m = 4 pi alpha^3 rho_c (-xi^2 theta'), g = G m/r^2 and, for constant Gamma_1,
//! N^2 = g (theta'/(alpha theta)) ((n+1)/Gamma_1 - n).

use starpoise::constants::G_CGS;
use starpoise::oscillation::{
    find_modes, Equilibrium, OscillationSettings, PhysicalArrays, PolytropicModel, TabulatedModel,
};
use starpoise::polytrope::{solve_lane_emden, LaneEmdenSettings};
use std::f64::consts::PI;

const N: f64 = 3.0;
const GAMMA1: f64 = 5.0 / 3.0;
/// Profile points up to the first zero; the model keeps the first 90 per cent of them.
const POINTS: usize = 1001;
const KEPT: usize = 901;

fn arrays() -> (PolytropicModel, TabulatedModel) {
    let solution = solve_lane_emden(
        N,
        &LaneEmdenSettings::default().with_points(POINTS).unwrap(),
    )
    .unwrap();
    let analytic = PolytropicModel::truncated(&solution, GAMMA1, KEPT).unwrap();
    let (rho_c, p_c) = (150.0, 2.3e17);
    let alpha = ((N + 1.0) * p_c / (4.0 * PI * G_CGS * rho_c * rho_c)).sqrt();
    let mut a: [Vec<f64>; 6] = Default::default();
    for p in &solution.profile[..KEPT] {
        let r = alpha * p.xi;
        let m = 4.0 * PI * alpha.powi(3) * rho_c * (-p.xi * p.xi * p.dtheta_dxi);
        let n2 = if p.xi == 0.0 {
            0.0
        } else {
            G_CGS * m / (r * r) * p.dtheta_dxi / (alpha * p.theta) * ((N + 1.0) / GAMMA1 - N)
        };
        for (column, value) in a.iter_mut().zip([
            r,
            m,
            p_c * p.theta.powf(N + 1.0),
            rho_c * p.theta.powf(N),
            GAMMA1,
            n2,
        ]) {
            column.push(value);
        }
    }
    let tabulated = TabulatedModel::from_physical(PhysicalArrays {
        radius_cm: &a[0],
        mass_g: &a[1],
        pressure_dyn_cm2: &a[2],
        density_g_cm3: &a[3],
        gamma1: &a[4],
        brunt_n2_s2: &a[5],
    })
    .unwrap();
    (analytic, tabulated)
}

/// Cubic Hermite interpolation of the tabulated coefficients (O(h^4)) against quintic Hermite
/// interpolation of theta: on 900 intervals both are converged far below the task's 1e-8.
const AGREEMENT: f64 = 1e-8;

#[test]
fn tabulated_arrays_reproduce_the_analytic_model() {
    let (analytic, tabulated) = arrays();
    // The surface density is finite: U_s > 0 enters the potential boundary condition.
    assert!(tabulated.surface_u() > 1e-3);
    assert!((tabulated.surface_u() / analytic.surface_u() - 1.0).abs() < 1e-12);
    let settings = OscillationSettings::default();
    for l in 0..=3u32 {
        let a = find_modes(&analytic, l, 10, &settings).unwrap();
        let t = find_modes(&tabulated, l, 10, &settings).unwrap();
        assert_eq!(a.len(), t.len(), "l = {l}");
        for (x, y) in a.iter().zip(&t) {
            assert_eq!(x.order, y.order);
            let difference = (x.sigma_squared / y.sigma_squared - 1.0).abs();
            assert!(
                difference < AGREEMENT,
                "l = {l} order {}: {} vs {}",
                x.order,
                x.sigma_squared,
                y.sigma_squared
            );
        }
    }
}

#[test]
fn bad_arrays_are_refused_with_the_row_named() {
    let r = [0.0, 1.0, 2.0];
    let m = [0.0, 1.0, 2.0];
    let ok = [1.0, 0.5, 0.2];
    let g = [5.0 / 3.0; 3];
    let n2 = [0.0; 3];
    let short = [1.0, 0.5];
    let bad = |a: PhysicalArrays<'_>| match TabulatedModel::from_physical(a) {
        Err(starpoise::Error::InvalidInput { name, .. }) => name,
        other => panic!("expected InvalidInput, got {other:?}"),
    };
    let base = PhysicalArrays {
        radius_cm: &r,
        mass_g: &m,
        pressure_dyn_cm2: &ok,
        density_g_cm3: &ok,
        gamma1: &g,
        brunt_n2_s2: &n2,
    };
    assert_eq!(
        bad(PhysicalArrays {
            gamma1: &short,
            ..base
        }),
        "model arrays"
    );
    let off_centre = [0.5, 1.0, 2.0];
    assert!(bad(PhysicalArrays {
        radius_cm: &off_centre,
        ..base
    })
    .contains("radius_cm[0]"));
    let zero_pressure = [1.0, 0.5, 0.0];
    assert_eq!(
        bad(PhysicalArrays {
            pressure_dyn_cm2: &zero_pressure,
            ..base
        }),
        "row 2"
    );
}
