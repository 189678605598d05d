//! Fermi–Dirac integrals F_j(psi) = int_0^inf x^j / (exp(x - psi) + 1) dx against exact values
//! and their two limits.

use starpoise::physics::eos::fermi_dirac::{
    fermi_dirac, fermi_dirac_by_quadrature, inverse_fermi_dirac_half,
};

const SQRT_PI: f64 = 1.772_453_850_905_516;

fn rel(a: f64, b: f64) -> f64 {
    (a / b - 1.0).abs()
}

/// F_j(0) = (1 - 2^-j) Gamma(j+1) zeta(j+1) (the alternating zeta function identity; e.g.
/// Abramowitz & Stegun 1964, eqs. 23.2.19 and Table 23.3 for zeta(1/2) = -1.4603545088,
/// zeta(3/2) = 2.6123753487, zeta(5/2) = 1.3414872573; memory, standard constants).
/// Tolerance 1e-8: the interpolation error of the table (module documentation).
#[test]
fn values_at_zero_match_the_zeta_identity() {
    let f = fermi_dirac(0.0);
    let f_m = (1.0 - 2f64.sqrt()) * SQRT_PI * -1.460_354_508_8;
    let f_h = (1.0 - 0.5f64.sqrt()) * 0.5 * SQRT_PI * 2.612_375_348_7;
    let f_3 = (1.0 - 0.5f64.powf(1.5)) * 0.75 * SQRT_PI * 1.341_487_257_3;
    assert!(
        rel(f.f_minus_half, f_m) < 1e-8,
        "{} {}",
        f.f_minus_half,
        f_m
    );
    assert!(rel(f.f_half, f_h) < 1e-8, "{} {}", f.f_half, f_h);
    assert!(
        rel(f.f_three_halves, f_3) < 1e-8,
        "{} {}",
        f.f_three_halves,
        f_3
    );
    // Same identity for the quadrature itself, which builds the table: near machine precision.
    let q = fermi_dirac_by_quadrature(0.0);
    assert!(rel(q[1], f_h) < 1e-10);
}

/// Off-node interpolation error against the direct quadrature, over the whole table range.
/// Tolerance 1e-8 relative (the documented accuracy).
#[test]
fn table_matches_quadrature_between_nodes() {
    let mut psi = -9.987;
    while psi < 49.9 {
        let f = fermi_dirac(psi);
        let q = fermi_dirac_by_quadrature(psi);
        assert!(rel(f.f_minus_half, q[0]) < 1e-8, "psi {psi}");
        assert!(rel(f.f_half, q[1]) < 1e-8, "psi {psi}");
        assert!(rel(f.f_three_halves, q[2]) < 1e-8, "psi {psi}");
        psi += 0.3127;
    }
}

/// Non-degenerate limit F_j -> Gamma(j+1) e^psi (1 - e^psi / 2^(j+1)) (first two series terms,
/// textbook), and continuity at the series/table boundary psi = -10.
#[test]
fn non_degenerate_limit() {
    for psi in [-40.0, -20.0, -10.5, -9.9] {
        let f = fermi_dirac(psi);
        let e: f64 = f64::exp(psi);
        let g = |gamma: f64, jp1: f64| gamma * e * (1.0 - e / 2f64.powf(jp1));
        // Third series term is e^(2 psi) / 3^(j+1) ~ 2e-9 relative at psi = -9.9.
        assert!(rel(f.f_half, g(0.5 * SQRT_PI, 1.5)) < 1e-8, "psi {psi}");
        assert!(rel(f.f_three_halves, g(0.75 * SQRT_PI, 2.5)) < 1e-8);
    }
}

/// Degenerate limit F_j -> psi^(j+1)/(j+1) (1 + (pi^2/6)(j+1) j / psi^2) (Sommerfeld;
/// e.g. Cox & Giuli 1968 ch. 24) at psi = 45 (inside the table) and 300 (expansion);
/// the neglected psi^-4 term is 7e-7 (psi = 45) times a number of order 1.
#[test]
fn degenerate_limit() {
    let pi2 = std::f64::consts::PI.powi(2);
    for (psi, tol) in [(45.0f64, 2e-6), (300.0, 1e-9)] {
        let f = fermi_dirac(psi);
        let s = |j: f64| {
            psi.powf(j + 1.0) / (j + 1.0) * (1.0 + pi2 / 6.0 * (j + 1.0) * j / (psi * psi))
        };
        assert!(rel(f.f_half, s(0.5)) < tol, "psi {psi}");
        assert!(rel(f.f_three_halves, s(1.5)) < tol, "psi {psi}");
        assert!(rel(f.f_minus_half, s(-0.5)) < tol, "psi {psi}");
    }
}

/// The inverse recovers psi over 80 units of psi (round trip to 1e-9 absolute or relative).
#[test]
fn inverse_round_trip() {
    let mut psi = -60.0;
    while psi < 400.0 {
        let back = inverse_fermi_dirac_half(fermi_dirac(psi).f_half).unwrap();
        assert!(
            (back - psi).abs() < 1e-9 * psi.abs().max(1.0),
            "{psi} -> {back}"
        );
        psi += 1.37;
    }
    assert!(inverse_fermi_dirac_half(0.0).is_none());
    assert!(inverse_fermi_dirac_half(f64::NAN).is_none());
}
