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
use crate::error::{Error, PhysicsError, Result};
use crate::physics::{Composition, PhysicsSet};
use ode_solvers::dop853::Dop853;
use ode_solvers::dop_shared::OutputType;
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

impl Leg {
    /// Name used in error messages.
    pub fn name(&self) -> &'static str {
        match self {
            Leg::Outward => "outward",
            Leg::Inward => "inward",
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

/// Counts right-hand-side evaluations and keeps the last physics error, which `ode_solvers`
/// cannot carry out of `System::system` itself.
#[derive(Debug, Default)]
pub struct LegMonitor {
    /// Right-hand-side evaluations so far.
    pub evaluations: Cell<u64>,
    /// The last physics error met.
    pub last_error: RefCell<Option<PhysicsError>>,
}

/// Derivative returned where the physics failed: huge, so that the integrator rejects the step and
/// shrinks it; if the failure is real the step size underflows and the recorded error is reported.
const FAILED_DERIVATIVE: f64 = 1e30;

struct LegSystem<'a, 'b> {
    ctx: LegContext<'a>,
    leg: Leg,
    monitor: &'b LegMonitor,
}

impl System<f64, State> for LegSystem<'_, '_> {
    /// Reads the independent variable from the state's [`X_COPY`] component, never from `_x`.
    fn system(&self, _x: f64, y: &State, dy: &mut State) {
        self.monitor
            .evaluations
            .set(self.monitor.evaluations.get() + 1);
        let (m, dm_dx) = self.leg.mass_and_jacobian(y[X_COPY], self.ctx.total_mass_g);
        let form = self.leg.luminosity_form(&self.ctx);
        match derivatives_in_mass(
            self.ctx.physics,
            self.ctx.composition,
            &self.ctx.scales,
            m,
            y,
            form,
        ) {
            Ok((d, _)) if d.iter().all(|v| v.is_finite()) => {
                *dy = d * dm_dx;
                dy[X_COPY] = 1.0;
            }
            Ok(_) => {
                *self.monitor.last_error.borrow_mut() = Some(PhysicsError::new(
                    "structure",
                    "non-finite derivative",
                    f64::NAN,
                    y[super::equations::LN_T].exp(),
                ));
                *dy = State::repeat(FAILED_DERIVATIVE);
            }
            Err(e) => {
                *self.monitor.last_error.borrow_mut() = Some(e);
                *dy = State::repeat(FAILED_DERIVATIVE);
            }
        }
    }
}

/// Integrate `leg` from `x0` to `x1` starting at `y0`; return the end state.
pub fn integrate(
    ctx: &LegContext,
    leg: Leg,
    x0: f64,
    x1: f64,
    y0: State,
    monitor: &LegMonitor,
) -> Result<State> {
    if x1 <= x0 {
        return Ok(y0);
    }
    let mut y0 = y0;
    y0[X_COPY] = x0;
    let system = LegSystem {
        ctx: *ctx,
        leg,
        monitor,
    };
    let mut stepper = Dop853::new(system, x0, x1, x1 - x0, y0, ctx.tolerance, ctx.tolerance);
    // Sparse output: dense output of ode_solvers 0.6 compares |x|, which breaks for the negative
    // independent variables used here.
    stepper.set_output(OutputType::Sparse);
    let failure = |reason: String| {
        let (m, _) = leg.mass_and_jacobian(x0, ctx.total_mass_g);
        let reason = match monitor.last_error.borrow().as_ref() {
            Some(e) => format!("{reason}; last physics error: {e}"),
            None => reason,
        };
        Error::Integration {
            leg: leg.name(),
            mass_g: m,
            reason,
        }
    };
    stepper.integrate().map_err(|e| failure(e.to_string()))?;
    let end = stepper
        .y_out()
        .last()
        .copied()
        .ok_or_else(|| failure("integrator produced no output".to_string()))?;
    let x_end = stepper.x_out().last().copied().unwrap_or(x0);
    if (x_end - x1).abs() > 1e-9 * (1.0 + x1.abs()) || !end.iter().all(|v| v.is_finite()) {
        return Err(failure(format!(
            "stopped at x = {x_end} before reaching {x1}"
        )));
    }
    Ok(end)
}

/// Integrate `leg` through the increasing points `xs` (the first is the start `x0` with state
/// `y0`); return the state at every point.
pub fn integrate_through(
    ctx: &LegContext,
    leg: Leg,
    xs: &[f64],
    y0: State,
    monitor: &LegMonitor,
) -> Result<Vec<State>> {
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
) -> Result<Vec<f64>> {
    let mut y0 = y0;
    y0[X_COPY] = x0;
    let system = LegSystem {
        ctx: *ctx,
        leg,
        monitor,
    };
    let mut stepper = Dop853::new(system, x0, x1, x1 - x0, y0, ctx.tolerance, ctx.tolerance);
    stepper.set_output(OutputType::Sparse);
    stepper.integrate().map_err(|e| Error::Integration {
        leg: leg.name(),
        mass_g: f64::NAN,
        reason: e.to_string(),
    })?;
    Ok(stepper.x_out().clone())
}
