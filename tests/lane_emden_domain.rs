//! The whole domain 0 <= n <= 5, including fractional indices near the zero and indices close
//! to the limits, and the refusals outside it.
//!
//! Facts used (common practice, no source): theta decreases monotonically from 1 to its first
//! zero; xi_1 grows with n and diverges as n -> 5. omega_n falls with n over 0 <= n <= 4.5, as
//! the table of docs/references.md §1 shows (computed); it is not checked beyond, because close
//! to n = 5 it dips below its n = 5 limit sqrt 3 (xi^2 |theta'| of the n = 5 solution approaches
//! sqrt 3 from below; an independent fixed-step check gives omega = 1.73077 at n = 4.99).

use starpoise::polytrope::{solve_lane_emden, LaneEmdenSettings};

fn grid() -> Vec<f64> {
    let mut n: Vec<f64> = (0..100).map(|i| 0.05 * f64::from(i)).collect();
    n.extend([0.001, 0.01, 4.99, 4.999, 4.9999]);
    n.sort_by(f64::total_cmp);
    n
}

#[test]
fn every_index_gives_a_finite_monotone_profile() {
    let settings = LaneEmdenSettings::default();
    let mut previous: Option<(f64, f64)> = None;
    for n in grid() {
        let s = solve_lane_emden(n, &settings).unwrap();
        let xi1 = s.xi1.unwrap_or_else(|| panic!("n = {n} has a zero"));
        assert!(s
            .profile
            .iter()
            .all(|p| p.xi.is_finite() && p.theta.is_finite() && p.dtheta_dxi.is_finite()));
        assert_eq!(s.profile[0].theta, 1.0);
        for w in s.profile.windows(2) {
            assert!(w[1].xi > w[0].xi, "n = {n}: xi must increase");
            assert!(w[1].theta < w[0].theta, "n = {n}: theta must decrease");
        }
        // Every point before the surface lies inside the zero.
        let before = &s.profile[s.profile.len() - 2];
        assert!(before.theta > 0.0 && before.xi < xi1, "n = {n}");
        let last = s.profile.last().unwrap();
        assert_eq!((last.xi, last.theta), (xi1, 0.0));
        for v in [
            s.omega_n,
            s.rho_c_over_rho_mean.unwrap(),
            s.w_n.unwrap(),
            s.theta_n.unwrap(),
        ] {
            assert!(v.is_finite() && v > 0.0, "n = {n}");
        }
        if let Some((xi_prev, omega_prev)) = previous {
            assert!(xi1 > xi_prev, "n = {n}: xi_1 must grow with n");
            if n <= 4.5 {
                assert!(s.omega_n < omega_prev, "n = {n}: omega_n must fall with n");
            }
        }
        previous = Some((xi1, s.omega_n));
    }
}

#[test]
fn indices_outside_the_domain_are_refused() {
    let settings = LaneEmdenSettings::default();
    for n in [
        -1.0,
        -1e-12,
        5.000_000_1,
        6.0,
        f64::NAN,
        f64::INFINITY,
        f64::NEG_INFINITY,
    ] {
        let err = solve_lane_emden(n, &settings).unwrap_err();
        assert_eq!(
            err.exit_code(),
            starpoise::error::ExitCode::BadInput,
            "n = {n}"
        );
        let message = err.to_string();
        assert!(
            message.contains("index") && message.contains("[0, 5]"),
            "{message}"
        );
    }
}

#[test]
fn point_counts_outside_the_bounds_are_refused() {
    for k in [0, 1, 1_000_001] {
        let err = LaneEmdenSettings::default().with_points(k).unwrap_err();
        assert_eq!(err.exit_code(), starpoise::error::ExitCode::BadInput);
        assert!(err.to_string().contains("points"));
    }
    for k in [2, 1_000_000] {
        assert_eq!(
            LaneEmdenSettings::default()
                .with_points(k)
                .unwrap()
                .points(),
            k
        );
    }
}
