//! The homogeneous compressible sphere: every frequency against its closed form.
//!
//! Source: Pekeris (1938, ApJ 88, 189) for non-radial modes and Sterne (1937, MNRAS 97, 582) for
//! radial modes, as recorded in `docs/references.md` §8.6:
//! radial w = Gamma_1 (k+1)(2k+3) - 4; l >= 1: w = D +- sqrt(D^2 + l(l+1)) with
//! D = (Gamma_1/2)[2k^2 + (2l+5)k + 2l + 3] - 2 (+ p modes, - the convectively unstable g modes),
//! and Kelvin's f mode w = 2l(l-1)/(2l+1) (w = sigma^2 = omega^2 R^3/(G M)).

mod common;

use common::assert_digits;
use starpoise::oscillation::{
    find_eigenvalues, find_modes, HomogeneousSphere, Mode, OscillationSettings,
};
use std::f64::consts::PI;

/// Accuracy asked of the solver for eigenfrequencies (the task's target, 1e-8 relative); the
/// mesh of 200 intervals reaches about 1e-10 for these orders (tests/oscillation_polytropes.rs
/// checks convergence).
const FREQUENCY_TOLERANCE: f64 = 1e-8;
/// Mesh intervals of the sphere.
const INTERVALS: usize = 200;

fn radial(gamma1: f64, k: f64) -> f64 {
    gamma1 * (k + 1.0) * (2.0 * k + 3.0) - 4.0
}

fn pekeris(gamma1: f64, l: f64, k: f64, sign: f64) -> f64 {
    let d = 0.5 * gamma1 * (2.0 * k * k + (2.0 * l + 5.0) * k + 2.0 * l + 3.0) - 2.0;
    d + sign * (d * d + l * (l + 1.0)).sqrt()
}

fn kelvin(l: f64) -> f64 {
    2.0 * l * (l - 1.0) / (2.0 * l + 1.0)
}

fn modes(gamma1: f64, degree: u32, max_order: u32) -> Vec<Mode> {
    let sphere = HomogeneousSphere::new(gamma1, INTERVALS).unwrap();
    find_modes(&sphere, degree, max_order, &OscillationSettings::default()).unwrap()
}

fn assert_close(computed: f64, exact: f64, what: &str) {
    assert!(
        (computed / exact - 1.0).abs() < FREQUENCY_TOLERANCE,
        "{what}: computed {computed:.12e}, closed form {exact:.12e}"
    );
}

#[test]
fn radial_modes_match_sterne() {
    for gamma1 in [1.4, 5.0 / 3.0, 2.0] {
        let found = modes(gamma1, 0, 6);
        assert_eq!(found.len(), 6);
        for (k, m) in found.iter().enumerate() {
            assert_eq!(m.order, k as i32 + 1, "radial orders start at 1");
            assert_close(
                m.sigma_squared,
                radial(gamma1, k as f64),
                &format!("Gamma1 {gamma1} radial k = {k}"),
            );
        }
    }
}

#[test]
fn p_and_f_modes_match_pekeris_and_kelvin() {
    for gamma1 in [4.0 / 3.0, 5.0 / 3.0, 2.0] {
        for l in 1..=3u32 {
            let found = modes(gamma1, l, 5);
            let lf = f64::from(l);
            for m in &found {
                let exact = match m.order {
                    0 => kelvin(lf),
                    n => pekeris(gamma1, lf, f64::from(n - 1), 1.0),
                };
                assert_close(
                    m.sigma_squared,
                    exact,
                    &format!("Gamma1 {gamma1} l {l} order {}", m.order),
                );
            }
            // Dipole modes have no f mode (its frequency is zero: a translation); l >= 2 do.
            let orders: Vec<i32> = found.iter().map(|m| m.order).collect();
            let expected: Vec<i32> = if l == 1 {
                (1..=5).collect()
            } else {
                (0..=5).collect()
            };
            assert_eq!(orders, expected, "Gamma1 {gamma1} l {l}");
        }
    }
}

/// The minus branch: N^2 < 0 everywhere in this model, so its g modes are unstable
/// (sigma^2 < 0), found here by scanning negative sigma^2.
#[test]
fn unstable_g_modes_match_pekeris() {
    for gamma1 in [4.0 / 3.0, 5.0 / 3.0, 2.0] {
        for l in 1..=2u32 {
            let sphere = HomogeneousSphere::new(gamma1, INTERVALS).unwrap();
            let lf = f64::from(l);
            let deepest = pekeris(gamma1, lf, 0.0, -1.0);
            let shallowest = pekeris(gamma1, lf, 2.0, -1.0);
            let roots = find_eigenvalues(
                &sphere,
                l,
                1.2 * deepest,
                0.8 * shallowest,
                400,
                &OscillationSettings::default(),
            )
            .unwrap();
            assert_eq!(roots.len(), 3, "Gamma1 {gamma1} l {l}: {roots:?}");
            for (k, w) in roots.iter().enumerate() {
                assert_close(
                    *w,
                    pekeris(gamma1, lf, k as f64, -1.0),
                    &format!("Gamma1 {gamma1} l {l} g- k = {k}"),
                );
            }
        }
    }
}

/// The test values of docs/references.md §8.6 (Gamma_1 = 5/3), to every digit printed there.
#[test]
fn reference_table_digits() {
    let g = 5.0 / 3.0;
    let radial = modes(g, 0, 4);
    for (m, text) in radial.iter().zip(["1", "12.66667", "31", "56"]) {
        assert_digits(m.sigma_squared, text, "radial");
    }
    let dipole = modes(g, 1, 2);
    assert_digits(dipole[0].sigma_squared, "4.754029", "l = 1 p1");
    assert_digits(dipole[1].sigma_squared, "19.436234", "l = 1 p2");
    let quadrupole = modes(g, 2, 2);
    assert_digits(quadrupole[0].sigma_squared, "0.8", "l = 2 f");
    assert_digits(quadrupole[1].sigma_squared, "8.382448", "l = 2 p1");
    assert_digits(quadrupole[2].sigma_squared, "26.228757", "l = 2 p2");
    let octupole = modes(g, 3, 1);
    assert_digits(octupole[0].sigma_squared, "1.714286", "l = 3 f");
    assert_digits(octupole[1].sigma_squared, "12", "l = 3 p1");
    let sphere = HomogeneousSphere::new(g, INTERVALS).unwrap();
    let settings = OscillationSettings::default();
    let g1 = find_eigenvalues(&sphere, 1, -0.5, -0.3, 50, &settings).unwrap();
    assert_digits(g1[0], "-0.420696", "l = 1 g-");
    let g2 = find_eigenvalues(&sphere, 2, -0.8, -0.6, 50, &settings).unwrap();
    assert_digits(g2[0], "-0.715781", "l = 2 g-");
}

/// Accuracy of an integral over collocation nodes of a polynomial eigenfunction: rounding only.
const INERTIA_TOLERANCE: f64 = 1e-10;

/// Inertia and eigenfunctions of the two modes known in closed form (derived from the
/// definitions in `starpoise::oscillation::eigenfunction`): the radial fundamental is
/// homologous, xi = r, with delta rho/rho = -3 and delta P/P = -3 Gamma_1, so E = 3/5,
/// p' = P_c [-3 Gamma_1 (1 - x^2) + 2 x^2] with P_c = (3/(8 pi)) G M^2/R^4 and
/// Phi' = (3/2)(1 - x^2) G M/R; Kelvin's mode is xi = grad(r^l Y)/l, so E = 3/l,
/// xi_h = x^(l-1)/l and Phi' = -(3/(2l+1)) x^l G M/R (the potential of the displaced surface).
#[test]
fn inertia_and_eigenfunctions_in_closed_form() {
    let g = 5.0 / 3.0;
    let sphere = HomogeneousSphere::new(g, INTERVALS).unwrap();
    let settings = OscillationSettings::default().with_eigenfunctions(true);
    let fundamental = &find_modes(&sphere, 0, 1, &settings).unwrap()[0];
    assert!((fundamental.inertia - 0.6).abs() < INERTIA_TOLERANCE);
    let ef = fundamental.eigenfunction.as_ref().unwrap();
    let pc = 3.0 / (8.0 * PI);
    for i in 0..ef.x.len() {
        let x = ef.x[i];
        assert!((ef.xi_r[i] - x).abs() < INERTIA_TOLERANCE, "xi_r at {x}");
        let p = pc * (-3.0 * g * (1.0 - x * x) + 2.0 * x * x);
        assert!((ef.p_prime[i] - p).abs() < INERTIA_TOLERANCE, "p' at {x}");
        let phi = 1.5 * (1.0 - x * x);
        assert!(
            (ef.phi_prime[i] - phi).abs() < INERTIA_TOLERANCE,
            "Phi' at {x}"
        );
    }
    for l in 2..=3u32 {
        let lf = f64::from(l);
        let f_mode = &find_modes(&sphere, l, 1, &settings).unwrap()[0];
        assert_eq!(f_mode.order, 0);
        assert!((f_mode.inertia - 3.0 / lf).abs() < INERTIA_TOLERANCE);
        let ef = f_mode.eigenfunction.as_ref().unwrap();
        for i in 0..ef.x.len() {
            let x = ef.x[i];
            let power = x.powi(l as i32 - 1);
            assert!(
                (ef.xi_r[i] - power).abs() < INERTIA_TOLERANCE,
                "xi_r at {x}"
            );
            assert!(
                (ef.xi_h[i] - power / lf).abs() < INERTIA_TOLERANCE,
                "xi_h at {x}"
            );
            let phi = -3.0 / (2.0 * lf + 1.0) * x.powi(l as i32);
            assert!(
                (ef.phi_prime[i] - phi).abs() < INERTIA_TOLERANCE,
                "Phi' at {x}"
            );
        }
    }
}
