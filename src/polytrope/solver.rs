//! Integration of the Lane–Emden equation to its first zero, and the profile theta(xi).
//!
//! Method. theta and theta' start at xi_0 = [`SERIES_START_XI`] from the centre series
//! ([`LaneEmdenSeries`]) and are integrated outward in xi with the eighth-order Dormand–Prince
//! method (`ode_solvers::Dop853`, rtol = atol = 1e-13) until the first step that ends with
//! theta <= 0. That step is discarded: from its start (the last point with theta > 0) the
//! integration is redone with u = -theta as the independent variable, which increases to the
//! surface, and with (xi, theta') as the state:
//!
//! dxi/du = -1/theta',   dtheta'/du = (theta^n + 2 theta'/xi) / theta'.
//!
//! Ending that leg at u = 0 gives xi_1 and theta'(xi_1) to the integration tolerance, not to the
//! spacing of the steps; theta' is negative and bounded away from zero on the whole leg.
//!
//! Autonomous form. `ode_solvers` 0.6.2 evaluates the twelfth stage of `Dop853` at x instead of
//! x + h (its node c_12 is stored as 0 instead of 1), which breaks any right-hand side that
//! depends on the independent variable explicitly (the step size collapses until the stiffness
//! test aborts). Every leg here therefore carries its independent variable as a third state
//! component with derivative 1, and the right-hand sides never read the integrator's x. The
//! unit test `dop853_mishandles_explicit_x_dependence` pins this.
//!
//! Domain care. For integer n the right-hand side uses theta^n with its sign (the analytic
//! continuation); for fractional n it uses max(theta, 0)^n, so that stages evaluated just beyond
//! the zero stay finite. Both variables increase along every leg (integration toward decreasing
//! x is not supported by the integrator with dense output).

use super::series::LaneEmdenSeries;
use super::validate_index;
use crate::error::{Error, Result};
use ode_solvers::dop_shared::IntegrationError;
use ode_solvers::{Dop853, OutputType, System, Vector3};

/// Where the numerical integration starts, xi_0. The ten-term series is exact to rounding here:
/// the last kept term, a_9 xi_0^18, is below 1e-16 for every n in [0, 5] (tested in
/// `tests/lane_emden_series.rs`), and the omitted ones are smaller by xi_0^2 each.
pub const SERIES_START_XI: f64 = 0.1;
/// Relative tolerance of every integration leg.
pub const RELATIVE_TOLERANCE: f64 = 1e-13;
/// Absolute tolerance of every integration leg.
pub const ABSOLUTE_TOLERANCE: f64 = 1e-13;
/// Fewest profile points allowed (centre and surface).
pub const MIN_POINTS: usize = 2;
/// Most profile points allowed.
pub const MAX_POINTS: usize = 1_000_000;
/// Default number of profile points.
pub const DEFAULT_POINTS: usize = 200;
/// Default outer end of the profile for n = 5, which has no zero.
pub const DEFAULT_UNBOUNDED_XI_MAX: f64 = 20.0;
/// The search for the first zero gives up beyond this xi. Near n = 5 the solver finds
/// xi_1 ~ 17.6/(5 - n) (1758 at n = 4.99, 1.76e8 at n = 5 - 1e-7), so only indices within about
/// 2e-8 of 5 reach it; they get an [`Error::Integration`] saying so.
pub const XI_SEARCH_LIMIT: f64 = 1e9;
/// Step limit of one integration leg.
const MAX_STEPS: u32 = 1_000_000;

/// (theta, theta', xi) on the radial legs; (xi, theta', u) on the surface leg.
pub(super) type State = Vector3<f64>;

/// theta^n as used on the right-hand side: signed for integer n, max(theta, 0)^n otherwise.
fn theta_power(theta: f64, n: f64) -> f64 {
    if n == n.trunc() {
        // n is an integer in [0, 5] here, so the cast is exact.
        theta.powi(n as i32)
    } else {
        theta.max(0.0).powf(n)
    }
}

/// x > 0, false for NaN.
fn is_positive(x: f64) -> bool {
    x > 0.0
}

/// theta'' = -theta^n - 2 theta'/xi.
fn second_derivative(n: f64, xi: f64, theta: f64, dtheta: f64) -> f64 {
    -theta_power(theta, n) - 2.0 * dtheta / xi
}

/// The equation with xi as independent variable, state (theta, theta', xi). With `stop_at_zero`
/// it stops after the first step that ends with theta <= 0 (or non-finite).
pub(super) struct RadialLeg {
    pub(super) n: f64,
    pub(super) stop_at_zero: bool,
}

impl System<f64, State> for RadialLeg {
    fn system(&self, _xi: f64, y: &State, dy: &mut State) {
        dy[0] = y[1];
        dy[1] = second_derivative(self.n, y[2], y[0], y[1]);
        dy[2] = 1.0;
    }

    fn solout(&mut self, _xi: f64, y: &State, _dy: &State) -> bool {
        self.stop_at_zero && !(y[0] > 0.0 && y[1].is_finite())
    }
}

/// The equation with u = -theta as independent variable, state (xi, theta', u).
struct SurfaceLeg {
    n: f64,
}

impl System<f64, State> for SurfaceLeg {
    fn system(&self, _u: f64, y: &State, dy: &mut State) {
        let (xi, dtheta, u) = (y[0], y[1], y[2]);
        dy[0] = -1.0 / dtheta;
        dy[1] = -second_derivative(self.n, xi, -u, dtheta) / dtheta;
        dy[2] = 1.0;
    }
}

fn integration_error(stage: &str, e: IntegrationError) -> Error {
    let x = match e {
        IntegrationError::MaxNumStepReached { x, .. }
        | IntegrationError::StepSizeUnderflow { x }
        | IntegrationError::StiffnessDetected { x } => x,
    };
    Error::Integration {
        what: "lane-emden",
        variable: "xi",
        at: x,
        reason: format!("{stage}: {e}"),
    }
}

pub(super) fn integration_failure(stage: &str, x: f64, what: &str) -> Error {
    Error::Integration {
        what: "lane-emden",
        variable: "the leg's independent variable",
        at: x,
        reason: format!("{stage}: {what}"),
    }
}

/// The accepted steps of one leg and its count of right-hand-side evaluations.
pub(super) struct LegOutput {
    pub(super) x: Vec<f64>,
    pub(super) y: Vec<State>,
    pub(super) evaluations: u64,
}

impl LegOutput {
    /// Last stored point; the start if the leg stored nothing else.
    pub(super) fn end(&self) -> Option<(f64, State)> {
        Some((*self.x.last()?, *self.y.last()?))
    }
}

/// One sparse-output Dop853 leg from `x0` to `x1 > x0` (both variables of this module increase
/// along every leg).
pub(super) fn run_leg<F: System<f64, State>>(
    system: F,
    x0: f64,
    x1: f64,
    y0: State,
    stage: &str,
) -> Result<LegOutput> {
    if !is_positive(x1 - x0) {
        return Err(integration_failure(stage, x0, "leg does not increase"));
    }
    let mut stepper = Dop853::from_param(
        system,
        x0,
        x1,
        x1 - x0,
        y0,
        RELATIVE_TOLERANCE,
        ABSOLUTE_TOLERANCE,
        0.9,
        0.0,
        0.333,
        6.0,
        x1 - x0,
        0.0,
        MAX_STEPS,
        1000,
        OutputType::Sparse,
    );
    let stats = stepper
        .integrate()
        .map_err(|e| integration_error(stage, e))?;
    let (x, y) = stepper.results().get();
    Ok(LegOutput {
        x: x.clone(),
        y: y.clone(),
        evaluations: u64::from(stats.num_eval),
    })
}

/// The first zero of theta_n: xi_1 and theta'(xi_1).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FirstZero {
    /// The polytropic index n.
    pub index: f64,
    /// The first zero xi_1 of theta (dimensionless radius of the surface).
    pub xi1: f64,
    /// theta'(xi_1), negative.
    pub dtheta_dxi: f64,
    /// Right-hand-side evaluations used.
    pub evaluations: u64,
}

/// Locate the first zero xi_1 of theta_n and theta'(xi_1), as described in the module
/// documentation. `Ok(None)` for n = 5, whose theta = (1 + xi^2/3)^(-1/2) never vanishes.
///
/// Errors: an index outside [0, 5] or NaN ([`Error::InvalidInput`] naming `--index`);
/// [`Error::Integration`] if the integrator fails or no zero is found below
/// [`XI_SEARCH_LIMIT`] (n within about 1e-3 of 5).
pub fn first_zero(n: f64) -> Result<Option<FirstZero>> {
    let n = validate_index(n)?;
    if n == 5.0 {
        return Ok(None);
    }
    let series = LaneEmdenSeries::new(n)?;
    let (theta0, dtheta0) = series.evaluate(SERIES_START_XI);
    let radial = run_leg(
        RadialLeg {
            n,
            stop_at_zero: true,
        },
        SERIES_START_XI,
        XI_SEARCH_LIMIT,
        State::new(theta0, dtheta0, SERIES_START_XI),
        "search for the first zero",
    )?;
    let crossed = radial.end().is_some_and(|(_, y)| !is_positive(y[0]));
    if !crossed {
        let x = radial.end().map_or(SERIES_START_XI, |(x, _)| x);
        return Err(integration_failure(
            "search for the first zero",
            x,
            "theta has no zero below the search limit",
        ));
    }
    // Last accepted point with theta > 0: the start of the step that crossed the zero.
    let Some(k) = radial.y.iter().rposition(|y| y[0] > 0.0) else {
        return Err(integration_failure(
            "search for the first zero",
            SERIES_START_XI,
            "no point with theta > 0",
        ));
    };
    let (xi_a, theta_a, dtheta_a) = (radial.y[k][2], radial.y[k][0], radial.y[k][1]);
    if !is_positive(-dtheta_a) {
        return Err(integration_failure(
            "surface leg",
            xi_a,
            "theta' is not negative before the zero",
        ));
    }
    let surface = run_leg(
        SurfaceLeg { n },
        -theta_a,
        0.0,
        State::new(xi_a, dtheta_a, -theta_a),
        "surface leg",
    )?;
    let Some((u_end, y_end)) = surface.end() else {
        return Err(integration_failure("surface leg", -theta_a, "no output"));
    };
    if u_end != 0.0 || !(y_end[0].is_finite() && y_end[1].is_finite() && y_end[1] < 0.0) {
        return Err(integration_failure(
            "surface leg",
            u_end,
            "did not reach theta = 0 with a finite negative slope",
        ));
    }
    Ok(Some(FirstZero {
        index: n,
        xi1: y_end[0],
        dtheta_dxi: y_end[1],
        evaluations: radial.evaluations + surface.evaluations,
    }))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// y' = cos x on [1, 10] with x read from the integrator's independent variable.
    struct ExplicitX;
    impl System<f64, Vector3<f64>> for ExplicitX {
        fn system(&self, x: f64, _y: &Vector3<f64>, dy: &mut Vector3<f64>) {
            dy[0] = x.cos();
            dy[1] = 0.0;
            dy[2] = 0.0;
        }
    }

    /// Pins the reason for the autonomous form (module docs): ode_solvers 0.6.2 `Dop853` fails
    /// on a right-hand side that reads x. If this test starts failing, the integrator was fixed
    /// and the extra state component could go.
    #[test]
    fn dop853_mishandles_explicit_x_dependence() {
        let mut stepper = Dop853::new(
            ExplicitX,
            1.0,
            10.0,
            9.0,
            Vector3::new(1.0_f64.sin(), 0.0, 0.0),
            1e-10,
            1e-10,
        );
        stepper.set_output(OutputType::Sparse);
        let failed = match stepper.integrate() {
            Err(_) => true,
            Ok(_) => stepper
                .y_out()
                .last()
                .is_none_or(|y| (y[0] - 10.0_f64.sin()).abs() > 1e-8),
        };
        assert!(failed, "Dop853 now handles explicit x; see the module docs");
    }

    /// The same quadrature in the autonomous form used by every leg here is accurate.
    #[test]
    fn autonomous_form_integrates_a_quadrature() {
        struct Autonomous;
        impl System<f64, Vector3<f64>> for Autonomous {
            fn system(&self, _x: f64, y: &Vector3<f64>, dy: &mut Vector3<f64>) {
                dy[0] = y[2].cos();
                dy[1] = 0.0;
                dy[2] = 1.0;
            }
        }
        let leg = run_leg(
            Autonomous,
            1.0,
            10.0,
            Vector3::new(1.0_f64.sin(), 0.0, 1.0),
            "test",
        )
        .unwrap();
        let (x, y) = leg.end().unwrap();
        assert_eq!(x, 10.0);
        // Tolerance: 1e-13 per unit step, a few dozen steps.
        assert!((y[0] - 10.0_f64.sin()).abs() < 1e-11, "{}", y[0]);
    }

    /// Every leg must increase (integration toward decreasing x is unsupported).
    #[test]
    fn decreasing_leg_is_refused() {
        let r = run_leg(
            RadialLeg {
                n: 1.0,
                stop_at_zero: false,
            },
            2.0,
            1.0,
            Vector3::new(0.5, -0.3, 2.0),
            "test",
        );
        assert!(matches!(r, Err(Error::Integration { .. })));
    }

    /// Fractional n across the zero: max(theta, 0)^n keeps the stages finite.
    #[test]
    fn fractional_power_is_finite_past_the_zero() {
        assert_eq!(theta_power(-1e-3, 1.5), 0.0);
        assert_eq!(theta_power(-0.5, 3.0), -0.125);
        assert_eq!(theta_power(-0.5, 0.0), 1.0);
    }
}
