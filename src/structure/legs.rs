//! The two integration legs of the shooting method, as `ode_solvers` systems.
//!
//! Independent variables (both increase along their leg, as `ode_solvers` requires):
//! - outward: x = ln(m / M), from the series start near the centre to the fitting mass;
//! - inward: x = ln(1 - m / M), from the photosphere to the fitting mass.
//!
//! Why ln(1 - m/M) for the envelope: the outer layers hold a tiny mass, so in m the pressure
//! drops by ten orders of magnitude over a last 1e-10 of M and the integration in m is
//! ill-conditioned (m itself cannot resolve M - m near 1e-12 M). With D = 1 - m/M the hydrostatic
//! column above a point is M D / (4 pi r^2), so near the surface P ~ g M D / (4 pi R^2) and
//! dln P / dln D ~ 1: the variable spreads the envelope evenly and keeps every step well scaled.

use super::equations::{derivatives_in_mass, LuminosityForm, Scales, State, X_COPY};
use super::error::{LegCause, LegError, LegName};
use crate::error::PhysicsError;
use crate::physics::{Composition, EosState, PhysicsSet};
use ode_solvers::dop853::Dop853;
use ode_solvers::dop_shared::{IntegrationError, OutputType};
use ode_solvers::System;
use std::cell::{Cell, RefCell};

/// Which leg.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Leg {
    /// From the centre outward, x = ln(m/M).
    Outward,
    /// From the surface inward, x = ln(1 - m/M).
    Inward,
}

/// Result of a leg: the value, or where and why the leg failed.
pub type LegResult<T> = Result<T, LegError>;

impl Leg {
    /// Name used in error messages.
    pub fn name(&self) -> LegName {
        match self {
            Leg::Outward => LegName::Outward,
            Leg::Inward => LegName::Inward,
        }
    }

    /// The name of the independent variable.
    pub fn variable(&self) -> &'static str {
        match self {
            Leg::Outward => "ln(m/M)",
            Leg::Inward => "ln(1-m/M)",
        }
    }

    /// An error of this leg at its independent variable `x`.
    pub fn error(&self, x: f64, total_mass_g: f64, cause: LegCause) -> LegError {
        LegError {
            leg: self.name(),
            variable: self.variable(),
            x,
            mass_g: self.mass_and_jacobian(x, total_mass_g).0,
            cause,
        }
    }

    /// How this leg holds the luminosity: ln L outward, L / L_scale inward.
    pub fn luminosity_form(&self, ctx: &LegContext) -> LuminosityForm {
        match self {
            Leg::Outward => LuminosityForm::Log,
            Leg::Inward => LuminosityForm::Linear {
                scale_erg_s: ctx.scales.luminosity_erg_s,
            },
        }
    }

    /// Mass coordinate m (g) and dm/dx at the leg's independent variable `x`.
    pub fn mass_and_jacobian(&self, x: f64, total_mass_g: f64) -> (f64, f64) {
        let e = x.exp();
        match self {
            Leg::Outward => (total_mass_g * e, total_mass_g * e),
            Leg::Inward => (total_mass_g * (1.0 - e), -total_mass_g * e),
        }
    }
}

/// What a leg needs to evaluate its right-hand side.
#[derive(Debug, Clone, Copy)]
pub struct LegContext<'a> {
    /// The laws.
    pub physics: &'a PhysicsSet,
    /// The composition.
    pub composition: &'a Composition,
    /// Total mass M, g.
    pub total_mass_g: f64,
    /// Scales of the running integrals.
    pub scales: Scales,
    /// Relative and absolute tolerance of the integrator (on logarithms and scaled integrals).
    pub tolerance: f64,
}

/// Counts right-hand-side evaluations and keeps the last physics error of the current
/// integration, which `ode_solvers` cannot carry out of `System::system` itself.
#[derive(Debug, Default)]
pub struct LegMonitor {
    /// Right-hand-side evaluations so far.
    pub evaluations: Cell<u64>,
    /// The last physics error met in the current integration, with the leg variable x where it
    /// happened (cleared when an integration starts, so an error from which an earlier
    /// integration recovered is never reported with a later failure).
    pub last_error: RefCell<Option<(f64, PhysicsError)>>,
    /// Mass fractions m/M of the convective boundaries located, in the order met.
    pub boundaries: RefCell<Vec<f64>>,
    /// Set when a leg met more boundaries than [`MAX_BOUNDARIES_PER_LEG`] (the list is then
    /// incomplete).
    pub boundary_limit_reached: Cell<bool>,
}

/// Derivative returned where the physics failed: huge, so that the integrator rejects the step and
/// shrinks it; if the failure is real the step size underflows and the recorded error is reported.
const FAILED_DERIVATIVE: f64 = 1e30;

struct LegSystem<'a, 'b> {
    ctx: LegContext<'a>,
    leg: Leg,
    monitor: &'b LegMonitor,
    watch: Option<&'b BoundaryWatch>,
    /// The equation-of-state result of the previous evaluation, to warm-start the next.
    last_eos: Cell<Option<EosState>>,
}

/// Watches the Schwarzschild criterion at every accepted step and stops the integration at the
/// first step across which nabla_rad - nabla_ad changes sign.
#[derive(Debug, Default)]
struct BoundaryWatch {
    /// The last accepted step point and whether it was convective.
    previous: Cell<Option<(State, bool)>>,
    /// Set when a sign change was seen: the step point before it.
    crossed_after: Cell<Option<State>>,
}

/// At most this many convective boundaries are located on one leg; past them (a noisy,
/// marginally convective layer) the integrator carries on through.
pub const MAX_BOUNDARIES_PER_LEG: usize = 16;

impl LegSystem<'_, '_> {
    /// nabla_rad - nabla_ad at state `y` (positive: convective), if the physics can be evaluated.
    fn convective_excess(&self, y: &State) -> Option<f64> {
        let (m, _) = self.leg.mass_and_jacobian(y[X_COPY], self.ctx.total_mass_g);
        let form = self.leg.luminosity_form(&self.ctx);
        derivatives_in_mass(
            self.ctx.physics,
            self.ctx.composition,
            &self.ctx.scales,
            m,
            y,
            form,
            self.last_eos.get().as_ref(),
        )
        .ok()
        .map(|(_, local)| local.nabla_rad - local.eos.nabla_ad)
    }
}

impl System<f64, State> for LegSystem<'_, '_> {
    /// Reads the independent variable from the state's [`X_COPY`] component, never from `_x`.
    fn system(&self, _x: f64, y: &State, dy: &mut State) {
        self.monitor
            .evaluations
            .set(self.monitor.evaluations.get() + 1);
        let (m, dm_dx) = self.leg.mass_and_jacobian(y[X_COPY], self.ctx.total_mass_g);
        let form = self.leg.luminosity_form(&self.ctx);
        let near = self.last_eos.get();
        match derivatives_in_mass(
            self.ctx.physics,
            self.ctx.composition,
            &self.ctx.scales,
            m,
            y,
            form,
            near.as_ref(),
        ) {
            Ok((d, local)) if d.iter().all(|v| v.is_finite()) => {
                self.last_eos.set(Some(local.eos));
                *dy = d * dm_dx;
                dy[X_COPY] = 1.0;
            }
            Ok(_) => {
                *self.monitor.last_error.borrow_mut() = Some((
                    y[X_COPY],
                    PhysicsError::new(
                        "structure",
                        "non-finite derivative",
                        f64::NAN,
                        y[super::equations::LN_T].exp(),
                    ),
                ));
                *dy = State::repeat(FAILED_DERIVATIVE);
            }
            Err(e) => {
                *self.monitor.last_error.borrow_mut() = Some((y[X_COPY], e));
                *dy = State::repeat(FAILED_DERIVATIVE);
            }
        }
    }

    fn solout(&mut self, _x: f64, y: &State, _dy: &State) -> bool {
        let Some(watch) = self.watch else {
            return false;
        };
        let Some(excess) = self.convective_excess(y) else {
            return false;
        };
        let convective = excess > 0.0;
        let previous = watch.previous.replace(Some((*y, convective)));
        match previous {
            Some((before, was)) if was != convective => {
                watch.crossed_after.set(Some(before));
                true
            }
            _ => false,
        }
    }
}

/// One run of the integrator from `x0` to `x1`; with a `watch` it may stop early at a
/// convective boundary. Returns the last state reached.
fn run(
    ctx: &LegContext,
    leg: Leg,
    x0: f64,
    x1: f64,
    y0: State,
    monitor: &LegMonitor,
    watch: Option<&BoundaryWatch>,
) -> LegResult<State> {
    run_recording(ctx, leg, (x0, x1), y0, monitor, watch, None)
}

/// [`run`], also appending the accepted step points to `steps` when given.
fn run_recording(
    ctx: &LegContext,
    leg: Leg,
    (x0, x1): (f64, f64),
    y0: State,
    monitor: &LegMonitor,
    watch: Option<&BoundaryWatch>,
    steps: Option<&mut Vec<f64>>,
) -> LegResult<State> {
    monitor.last_error.borrow_mut().take();
    let mut y0 = y0;
    y0[X_COPY] = x0;
    let system = LegSystem {
        ctx: *ctx,
        leg,
        monitor,
        watch,
        last_eos: Cell::new(None),
    };
    let mut stepper = Dop853::new(system, x0, x1, x1 - x0, y0, ctx.tolerance, ctx.tolerance);
    // Sparse output: dense output of ode_solvers 0.6 compares |x|, which breaks for the negative
    // independent variables used here.
    stepper.set_output(OutputType::Sparse);
    // Where the integrator stopped (the x it reports, else the start); a physics error recorded
    // in this integration is the real cause (its own x belongs to a rejected trial stage, which
    // can lie far beyond where the leg stood).
    let failure = |x: Option<f64>, cause: LegCause| {
        let cause = match monitor.last_error.borrow_mut().take() {
            Some((_, e)) => LegCause::Physics(e),
            None => cause,
        };
        leg.error(x.unwrap_or(x0), ctx.total_mass_g, cause)
    };
    if let Err(e) = stepper.integrate() {
        let x = match e {
            IntegrationError::MaxNumStepReached { x, .. }
            | IntegrationError::StepSizeUnderflow { x }
            | IntegrationError::StiffnessDetected { x } => x,
        };
        return Err(failure(Some(x), LegCause::Integrator(e.to_string())));
    }
    let last_x = stepper.x_out().last().copied();
    let Some(end) = stepper.y_out().last().copied() else {
        return Err(failure(
            last_x,
            LegCause::Integrator("the integrator produced no output".into()),
        ));
    };
    if !end.iter().all(|v| v.is_finite()) {
        return Err(failure(last_x, LegCause::NonFinite));
    }
    if let Some(steps) = steps {
        steps.extend_from_slice(stepper.x_out());
    }
    Ok(end)
}

/// Integrate `leg` from `x0` to `x1` starting at `y0`; return the end state.
///
/// Convective boundaries (nabla_rad = nabla_ad) put a kink in nabla. The integration stops at
/// the first step across one, locates the boundary by regula falsi (Illinois variant) on
/// nabla_rad - nabla_ad of short re-integrations from the last step point, and restarts there,
/// so that no step straddles a kink.
pub fn integrate(
    ctx: &LegContext,
    leg: Leg,
    x0: f64,
    x1: f64,
    y0: State,
    monitor: &LegMonitor,
) -> LegResult<State> {
    if x1 <= x0 {
        return Ok(y0);
    }
    let mut x = x0;
    let mut y = y0;
    for boundaries in 0..=MAX_BOUNDARIES_PER_LEG {
        let watch = BoundaryWatch::default();
        let watching = (boundaries < MAX_BOUNDARIES_PER_LEG).then_some(&watch);
        let end = run(ctx, leg, x, x1, y, monitor, watching)?;
        let Some(before) = watch.crossed_after.take() else {
            if (end[X_COPY] - x1).abs() > 1e-9 * (1.0 + x1.abs()) {
                return Err(leg.error(
                    end[X_COPY],
                    ctx.total_mass_g,
                    LegCause::Integrator(format!("stopped before reaching x = {x1}")),
                ));
            }
            return Ok(end);
        };
        y = locate_boundary(ctx, leg, &before, &end, monitor)?;
        x = y[X_COPY];
    }
    monitor.boundary_limit_reached.set(true);
    run(ctx, leg, x, x1, y, monitor, None)
}

/// The state just past the convective boundary between step points `a` and `b` (where
/// nabla_rad - nabla_ad has opposite signs), to 1e-10 in x.
fn locate_boundary(
    ctx: &LegContext,
    leg: Leg,
    a: &State,
    b: &State,
    monitor: &LegMonitor,
) -> LegResult<State> {
    let probe = LegSystem {
        ctx: *ctx,
        leg,
        monitor,
        watch: None,
        last_eos: Cell::new(None),
    };
    let excess = |y: &State| probe.convective_excess(y).unwrap_or(f64::NAN);
    let (xa, xb) = (a[X_COPY], b[X_COPY]);
    let (mut lo, mut f_lo) = (xa, excess(a));
    let (mut hi, mut y_hi, mut f_hi) = (xb, *b, excess(b));
    if !(f_lo.is_finite() && f_hi.is_finite()) || f_lo.signum() == f_hi.signum() {
        return Ok(*b);
    }
    let mut side = 0i8;
    for _ in 0..60 {
        if hi - lo <= 1e-10 * (1.0 + hi.abs()) {
            break;
        }
        let mut x = (lo * f_hi - hi * f_lo) / (f_hi - f_lo);
        if !(x > lo && x < hi) {
            x = 0.5 * (lo + hi);
        }
        let y = run(ctx, leg, xa, x, *a, monitor, None)?;
        let f = excess(&y);
        if !f.is_finite() {
            break;
        }
        if f.signum() == f_hi.signum() {
            hi = x;
            y_hi = y;
            f_hi = f;
            if side == 1 {
                f_lo *= 0.5;
            }
            side = 1;
        } else {
            lo = x;
            f_lo = f;
            if side == -1 {
                f_hi *= 0.5;
            }
            side = -1;
        }
    }
    let (m, _) = leg.mass_and_jacobian(y_hi[X_COPY], ctx.total_mass_g);
    monitor.boundaries.borrow_mut().push(m / ctx.total_mass_g);
    Ok(y_hi)
}

/// Integrate `leg` through the increasing points `xs` (the first is the start `x0` with state
/// `y0`); return the state at every point.
pub fn integrate_through(
    ctx: &LegContext,
    leg: Leg,
    xs: &[f64],
    y0: State,
    monitor: &LegMonitor,
) -> LegResult<Vec<State>> {
    let mut out = Vec::with_capacity(xs.len());
    let mut y = y0;
    let mut x_prev = match xs.first() {
        Some(&x) => x,
        None => return Ok(out),
    };
    out.push(y);
    for &x in &xs[1..] {
        y = integrate(ctx, leg, x_prev, x, y, monitor)?;
        out.push(y);
        x_prev = x;
    }
    Ok(out)
}

/// The accepted step points of one integration from `x0` to `x1`, for choosing a profile mesh
/// that is dense where the solution changes fast.
pub fn step_points(
    ctx: &LegContext,
    leg: Leg,
    x0: f64,
    x1: f64,
    y0: State,
    monitor: &LegMonitor,
) -> LegResult<Vec<f64>> {
    let mut steps = Vec::new();
    run_recording(ctx, leg, (x0, x1), y0, monitor, None, Some(&mut steps))?;
    Ok(steps)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::{Composition, PhysicsSet};

    /// An error recorded by an earlier integration is cleared when the next starts, so it is
    /// never reported with a later, unrelated failure.
    #[test]
    fn a_stale_physics_error_is_cleared() {
        let physics = PhysicsSet::refined();
        let comp = Composition::new(0.7, 0.02).expect("valid composition");
        let m = crate::constants::M_SUN_G;
        let ctx = LegContext {
            physics: &physics,
            composition: &comp,
            total_mass_g: m,
            scales: Scales {
                luminosity_erg_s: crate::constants::L_SUN_ERG_S,
                energy_erg: 1e48,
            },
            tolerance: 1e-8,
        };
        let start = super::super::centre::start(&ctx, 1.5e17f64.ln(), 1.32e7f64.ln())
            .expect("a solar centre");
        let monitor = LegMonitor::default();
        let stale = PhysicsError::new("stale", "from an earlier leg", 1.0, 1.0);
        *monitor.last_error.borrow_mut() = Some((0.0, stale));
        integrate(
            &ctx,
            Leg::Outward,
            start.x0,
            0.4f64.ln(),
            start.y0,
            &monitor,
        )
        .expect("the leg integrates");
        assert!(monitor
            .last_error
            .borrow()
            .as_ref()
            .is_none_or(|(_, e)| e.law != "stale"));
    }
}
