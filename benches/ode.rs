//! Our DOP853 (`numerics::ode`) against ode_solvers 0.6.2's `Dop853` on the same problems and
//! tolerances: Arenstorf's orbit over one period and the n = 3 Lane–Emden equation to xi = 6.8
//! (problems shared with `tests/ode_dop853.rs`). Before timing, each variant's work counts and
//! error are printed once, so the comparison is of equal accuracy.

#[path = "../tests/common/ode_problems.rs"]
mod ode_problems;

use criterion::{black_box, criterion_group, criterion_main, Criterion};
use nalgebra::{SVector, Vector3, Vector4};
use ode_problems::{arenstorf, lane_emden_n3};
use starpoise::numerics::ode::{Dop853, Dop853Settings, FnSystem, NoObserver, Outcome};
use std::convert::Infallible;

const TOL: f64 = 1e-10;
const XI_END: f64 = 6.8;

struct ArenstorfOdeSolvers;
impl ode_solvers::System<f64, Vector4<f64>> for ArenstorfOdeSolvers {
    fn system(&self, _x: f64, y: &Vector4<f64>, dy: &mut Vector4<f64>) {
        arenstorf::rhs(y, dy);
    }
}

/// ode_solvers' Dop853 needs x carried as a state (its c_12 = 0): (theta, theta', xi).
struct LaneEmdenOdeSolvers;
impl ode_solvers::System<f64, Vector3<f64>> for LaneEmdenOdeSolvers {
    fn system(&self, _x: f64, y: &Vector3<f64>, dy: &mut Vector3<f64>) {
        let mut d = SVector::<f64, 2>::zeros();
        lane_emden_n3::rhs(y[2], &SVector::from([y[0], y[1]]), &mut d);
        *dy = Vector3::new(d[0], d[1], 1.0);
    }
}

/// Sparse output (only the end kept), Hairer's controller constants, no PI (beta = 0).
fn ode_solvers_run<const N: usize, S: ode_solvers::System<f64, SVector<f64, N>>>(
    system: S,
    x0: f64,
    x1: f64,
    y0: SVector<f64, N>,
) -> (SVector<f64, N>, ode_solvers::dop_shared::Stats) {
    let mut stepper = ode_solvers::Dop853::from_param(
        system,
        x0,
        x1,
        x1 - x0,
        y0,
        TOL,
        TOL,
        0.9,
        0.0,
        0.333,
        6.0,
        x1 - x0,
        0.0,
        100_000,
        1000,
        ode_solvers::dop_shared::OutputType::Sparse,
    );
    let stats = stepper.integrate().expect("ode_solvers integrates");
    let y = *stepper.results().get().1.last().expect("an end state");
    (y, stats)
}

/// Our integrator at the same tolerances, with the PI weight `beta`.
fn ours_solver<const N: usize>(beta: f64) -> Dop853<N> {
    let settings = Dop853Settings {
        beta,
        ..Dop853Settings::with_tolerances(TOL, TOL).expect("valid")
    };
    Dop853::new(settings).expect("valid")
}

fn ours_arenstorf(beta: f64) -> Outcome<4> {
    let mut system = FnSystem(|_x: f64, y: &SVector<f64, 4>, dy: &mut SVector<f64, 4>| {
        arenstorf::rhs(y, dy);
        Ok::<(), Infallible>(())
    });
    ours_solver(beta)
        .integrate(
            &mut system,
            0.0,
            &SVector::from(arenstorf::Y0),
            arenstorf::PERIOD,
            &mut NoObserver,
        )
        .expect("integrates")
}

fn ours_lane_emden(beta: f64) -> Outcome<2> {
    let mut system = FnSystem(|xi: f64, y: &SVector<f64, 2>, dy: &mut SVector<f64, 2>| {
        lane_emden_n3::rhs(xi, y, dy);
        Ok::<(), Infallible>(())
    });
    ours_solver(beta)
        .integrate(
            &mut system,
            lane_emden_n3::XI_START,
            &lane_emden_n3::start(),
            XI_END,
            &mut NoObserver,
        )
        .expect("integrates")
}

fn report() {
    let y0 = SVector::from(arenstorf::Y0);
    let (y, st) = ode_solvers_run(ArenstorfOdeSolvers, 0.0, arenstorf::PERIOD, y0);
    eprintln!(
        "arenstorf ode_solvers: rhs {} accepted {} rejected {} closure {:.2e}",
        st.num_eval,
        st.accepted_steps,
        st.rejected_steps,
        (y - y0).amax()
    );
    for beta in [0.0, 0.04] {
        let o = ours_arenstorf(beta);
        eprintln!(
            "arenstorf ours beta {beta}: rhs {} accepted {} rejected {} closure {:.2e}",
            o.stats.rhs_evaluations,
            o.stats.accepted_steps,
            o.stats.rejected_steps,
            (o.y - y0).amax()
        );
    }
    let start = lane_emden_n3::start();
    let y0 = SVector::from([start[0], start[1], lane_emden_n3::XI_START]);
    let (y, st) = ode_solvers_run(LaneEmdenOdeSolvers, y0[2], XI_END, y0);
    eprintln!(
        "lane-emden ode_solvers (xi as a state): rhs {} accepted {} rejected {} theta {:.12}",
        st.num_eval, st.accepted_steps, st.rejected_steps, y[0]
    );
    for beta in [0.0, 0.04] {
        let o = ours_lane_emden(beta);
        eprintln!(
            "lane-emden ours beta {beta}: rhs {} accepted {} rejected {} theta {:.12}",
            o.stats.rhs_evaluations, o.stats.accepted_steps, o.stats.rejected_steps, o.y[0]
        );
    }
}

fn compare(c: &mut Criterion) {
    report();
    let y0 = SVector::from(arenstorf::Y0);
    c.bench_function("arenstorf_ode_solvers", |b| {
        b.iter(|| ode_solvers_run(ArenstorfOdeSolvers, 0.0, black_box(arenstorf::PERIOD), y0))
    });
    c.bench_function("arenstorf_ours", |b| {
        b.iter(|| ours_arenstorf(black_box(Dop853Settings::default().beta)))
    });
    let start = lane_emden_n3::start();
    let y0 = SVector::from([start[0], start[1], lane_emden_n3::XI_START]);
    c.bench_function("lane_emden_n3_ode_solvers", |b| {
        b.iter(|| ode_solvers_run(LaneEmdenOdeSolvers, y0[2], black_box(XI_END), y0))
    });
    c.bench_function("lane_emden_n3_ours", |b| {
        b.iter(|| ours_lane_emden(black_box(Dop853Settings::default().beta)))
    });
}

criterion_group!(benches, compare);
criterion_main!(benches);
