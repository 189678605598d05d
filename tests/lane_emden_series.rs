//! The centre series that starts the integration.
//!
//! theta = 1 - xi^2/6 + n xi^4/120 - n(8n - 5) xi^6/15120 + ... (docs/references.md §1,
//! computed; Chandrasekhar 1939, *An Introduction to the Study of Stellar Structure*, ch. IV).

use approx::assert_relative_eq;
use starpoise::polytrope::series::SERIES_TERMS;
use starpoise::polytrope::solver::SERIES_START_XI;
use starpoise::polytrope::{first_zero, LaneEmdenSeries};

fn indices() -> impl Iterator<Item = f64> {
    (0..=20).map(|i| 0.25 * f64::from(i))
}

/// The first four coefficients against the published closed forms. Tolerance 1e-15 relative:
/// a few roundings in the recurrence.
#[test]
fn leading_coefficients() {
    for n in indices() {
        let a = LaneEmdenSeries::new(n).unwrap();
        let a = a.coefficients();
        assert_eq!(a[0], 1.0);
        assert_relative_eq!(a[1], -1.0 / 6.0, max_relative = 1e-15);
        assert_relative_eq!(a[2], n / 120.0, max_relative = 1e-15, epsilon = 1e-300);
        let a3 = -n * (8.0 * n - 5.0) / 15120.0;
        assert_relative_eq!(a[3], a3, max_relative = 1e-14, epsilon = 1e-18);
    }
}

/// Against the exact solutions n = 1 (sin xi/xi: a_k = (-1)^k/(2k+1)!) and n = 5
/// ((1 + xi^2/3)^(-1/2): binomial series), every kept coefficient; 1e-13 relative.
#[test]
fn coefficients_of_the_exact_solutions() {
    let one = LaneEmdenSeries::new(1.0).unwrap();
    let five = LaneEmdenSeries::new(5.0).unwrap();
    let mut factorial = 1.0;
    let mut binomial = 1.0;
    for k in 0..SERIES_TERMS {
        let kf = k as f64;
        if k > 0 {
            factorial *= (2.0 * kf) * (2.0 * kf + 1.0);
            binomial *= (-0.5 - (kf - 1.0)) / kf / 3.0;
        }
        let sign = if k % 2 == 0 { 1.0 } else { -1.0 };
        assert_relative_eq!(
            one.coefficients()[k],
            sign / factorial,
            max_relative = 1e-13
        );
        assert_relative_eq!(five.coefficients()[k], binomial, max_relative = 1e-13);
    }
}

/// At the start point the series is exact to rounding: the last kept term is below 1e-16 of
/// theta for every n, so the start adds no error at the 1e-12 level. Checked against the exact
/// n = 1 and n = 5 solutions too.
#[test]
fn start_point_is_exact_to_rounding() {
    for n in indices() {
        let s = LaneEmdenSeries::new(n).unwrap();
        let last = s.coefficients()[SERIES_TERMS - 1].abs()
            * SERIES_START_XI.powi(2 * (SERIES_TERMS as i32 - 1));
        assert!(last < 1e-16, "n = {n}: last kept term {last:e}");
    }
    let xi = SERIES_START_XI;
    let (theta, dtheta) = LaneEmdenSeries::new(1.0).unwrap().evaluate(xi);
    assert_relative_eq!(theta, xi.sin() / xi, max_relative = 2e-16);
    // The closed form of theta' cancels (xi cos xi - sin xi = -xi^3/3 + ...) and is itself only
    // good to about 3e-14 here; hence 1e-12.
    assert_relative_eq!(
        dtheta,
        (xi * xi.cos() - xi.sin()) / (xi * xi),
        max_relative = 1e-12
    );
    let (theta, dtheta) = LaneEmdenSeries::new(5.0).unwrap().evaluate(xi);
    let q = 1.0 + xi * xi / 3.0;
    assert_relative_eq!(theta, q.powf(-0.5), max_relative = 2e-16);
    assert_relative_eq!(dtheta, -(xi / 3.0) * q.powf(-1.5), max_relative = 1e-14);
}

/// The series is good well beyond the start (xi = 0.5): there the exact n = 1 solution is
/// matched to 1e-15, so a start anywhere up to 0.5 would give the same xi_1; the start at
/// 0.1 has a margin of many orders.
#[test]
fn series_holds_beyond_the_start() {
    let xi: f64 = 0.5;
    let (theta, _) = LaneEmdenSeries::new(1.0).unwrap().evaluate(xi);
    assert_relative_eq!(theta, xi.sin() / xi, max_relative = 1e-15);
    // And the solution does not depend on rounding of the start: xi_1 for n = 1 is pi to
    // 1e-12 (the test in lane_emden_exact.rs asks 1e-10).
    let z = first_zero(1.0).unwrap().unwrap();
    assert_relative_eq!(z.xi1, std::f64::consts::PI, max_relative = 1e-12);
}

#[test]
fn series_refuses_bad_index() {
    for n in [-0.1, 5.1, f64::NAN, f64::INFINITY] {
        assert!(LaneEmdenSeries::new(n).is_err());
    }
}
