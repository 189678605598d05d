//! Failures come out typed, with the numbers that locate them (regressions of three defects of the
//! first error design, and a panic at coarse tolerances).

use starpoise::error::{Error, ExitCode};
use starpoise::numerics::newton::Termination;
use starpoise::physics::spec::PhysicsOverrides;
use starpoise::physics::{Composition, PhysicsSet};
use starpoise::structure::{solve, LegCause, LegName, ZamsSettings};

fn settings(mass: f64, overrides: &str) -> ZamsSettings {
    let mut o = PhysicsOverrides::default();
    for item in overrides.split(';').filter(|s| !s.is_empty()) {
        let (k, v) = item.split_once(':').unwrap();
        o.set(k, v).unwrap();
    }
    let physics = PhysicsSet::from_spec(&o.resolve().unwrap()).unwrap();
    ZamsSettings::new(mass, Composition::new(0.70, 0.02).unwrap(), physics).unwrap()
}

/// 150 M_sun with 30 times the opacity has no atmosphere for the starting guess (radiation
/// pressure beats gravity): the error says so, from the atmosphere, instead of "no convergence
/// after 0 iterations (mismatch inf)".
#[test]
fn a_failing_atmosphere_is_reported_as_such() {
    let e = solve(&settings(150.0, "opacity-factor:30")).unwrap_err();
    assert_eq!(e.exit_code(), ExitCode::NotConverged);
    let Error::NoConvergence(nc) = &e else {
        panic!("{e:?}")
    };
    let Termination::StartNotEvaluable(leg) = &nc.termination else {
        panic!("{:?}", nc.termination)
    };
    assert_eq!(leg.leg, LegName::Atmosphere);
    assert!(matches!(&leg.cause, LegCause::Physics(p) if p.reason.contains("radiative force")));
    assert_eq!(nc.code(), "start-not-integrable");
    let text = e.to_string();
    assert!(
        !text.contains("mismatch inf") && text.contains("atmosphere"),
        "{text}"
    );
}

/// A leg that fails reports the mass where it stopped, not where it started: 0.05 M_sun with the
/// fully ionised ideal gas fails well out on the outward leg, which starts at 1e-10 M (the
/// first design reported that start, 1e-10 M, whatever the point of failure).
#[test]
fn a_failing_leg_reports_where_it_stopped() {
    let e = solve(&settings(0.05, "eos:ideal")).unwrap_err();
    let Error::NoConvergence(nc) = &e else {
        panic!("{e:?}")
    };
    let Termination::StartNotEvaluable(leg) = &nc.termination else {
        panic!("{:?}", nc.termination)
    };
    assert_eq!(leg.leg, LegName::Outward);
    let m_total = 0.05 * starpoise::constants::M_SUN_G;
    let start = starpoise::structure::centre::CENTRE_START_MASS_FRACTION * m_total;
    assert!(
        leg.mass_g > 1e6 * start && leg.mass_g < m_total,
        "stopped at m = {:e} g of {m_total:e}",
        leg.mass_g
    );
    assert!((leg.x - (leg.mass_g / m_total).ln()).abs() < 1e-12);
}

/// Any tolerance in the documented range [1e-13, 1e-6] works (1e-6 once panicked: the coarsest
/// tolerance of the iteration was below the finest asked for), and gives the default-tolerance
/// star to within the integration error such a tolerance allows (1e-4).
#[test]
fn coarse_tolerances_in_the_documented_range_work() {
    let base = solve(&settings(1.0, "")).unwrap().summary;
    for tol in [1e-6, 5e-7, 1e-7] {
        let m = solve(&settings(1.0, "").with_tolerance(tol).unwrap()).unwrap();
        assert!(m.stats.fit_mismatch < 1e-8, "tolerance {tol}");
        let dl = (m.summary.luminosity_lsun / base.luminosity_lsun - 1.0).abs();
        assert!(dl < 1e-4, "tolerance {tol}: L moved by {dl:e}");
    }
}
