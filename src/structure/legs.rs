//! The two integration legs of the shooting method, on the project's own DOP853
//! ([`crate::numerics::ode`]).
//!
//! Independent variables:
//! - outward: x = ln(m / M), from the series start near the centre to the fitting mass;
//! - inward: x = ln(1 - m / M), from the photosphere to the fitting mass.
//!
//! Why ln(1 - m/M) for the envelope: the outer layers hold a tiny mass, so in m the pressure
//! drops by ten orders of magnitude over a last 1e-10 of M and the integration in m is
//! ill-conditioned (m itself cannot resolve M - m near 1e-12 M). With D = 1 - m/M the hydrostatic
//! column above a point is M D / (4 pi r^2), so near the surface P ~ g M D / (4 pi R^2) and
//! dln P / dln D ~ 1: the variable spreads the envelope evenly and keeps every step well scaled.
//!
//! Convective boundaries (nabla_rad = nabla_ad) put a kink in nabla. The integrator watches
//! g = nabla_rad - nabla_ad as an event: a sign change is located on the dense output and the
//! integration restarts there, so that no step straddles a kink. The located boundaries give the
//! convective zones.

use super::equations::{
    derivatives_in_mass, LuminosityForm, Scales, State, INT_CNO, INT_EPS, INT_GRAVITY, INT_THERMAL,
    STATE_LEN,
};
use crate::error::PhysicsError;
use crate::error::{LegCause, LegError, LegName};
use crate::numerics::exponential::FastExp;
use crate::numerics::ode::{
    AcceptedStep, Control, DenseOutput, Dop853, Dop853Settings, Observer, OdeError, OdeSystem,
    RhsFailure, Stop,
};
use crate::physics::{Composition, EosState, PhysicsSet};
use std::cell::Cell;

/// Result of a leg: the value, or where and why the leg failed.
pub type LegResult<T> = Result<T, LegError>;

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
        let e = x.fast_exp();
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

/// At most this many convective boundaries are located on one leg; past them (a noisy,
/// marginally convective layer) the integrator carries on through.
pub const MAX_BOUNDARIES_PER_LEG: usize = 16;

/// What one integration of a leg found.
#[derive(Debug, Clone, PartialEq)]
pub struct LegEnd {
    /// The state at the end of the leg.
    pub y: State,
    /// Mass fractions m/M of the convective boundaries located, in the order met.
    pub boundaries: Vec<f64>,
    /// Whether the leg met more boundaries than it locates (the list is then incomplete).
    pub boundary_limit_reached: bool,
    /// The laws' cautions met at the leg's accepted steps.
    pub cautions: Cautions,
}

/// One law's caution met along a model, with where it applied.
#[derive(Debug, Clone, PartialEq)]
pub struct CautionEntry {
    /// The kind of law (`eos`, `opacity`).
    pub kind: &'static str,
    /// The caution.
    pub text: &'static str,
    /// Points (accepted integration steps, atmosphere ends) where it applied.
    pub points: usize,
    /// Lowest and highest temperature of those points, K.
    pub temperature_k: (f64, f64),
    /// Lowest and highest density of those points, g cm^-3.
    pub density_g_cm3: (f64, f64),
}

/// The laws' cautions met along a model ([`crate::physics::EquationOfState::caution`],
/// [`crate::physics::Opacity::caution`]).
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Cautions {
    /// One entry per distinct caution, in the order first met.
    pub entries: Vec<CautionEntry>,
}

impl Cautions {
    /// Ask every law of `ctx` about the point (`rho`, `t`) and note its cautions.
    pub fn check(&mut self, ctx: &LegContext, rho: f64, t: f64) {
        let comp = ctx.composition;
        let eos = ctx.physics.eos().caution(rho, t, comp).map(|c| ("eos", c));
        let opacity = ctx
            .physics
            .opacity()
            .caution(rho, t, comp)
            .map(|c| ("opacity", c));
        for (kind, text) in eos.into_iter().chain(opacity) {
            self.note(kind, text, rho, t);
        }
    }

    fn note(&mut self, kind: &'static str, text: &'static str, rho: f64, t: f64) {
        match self.entries.iter_mut().find(|e| e.text == text) {
            Some(e) => {
                e.points += 1;
                e.temperature_k = (e.temperature_k.0.min(t), e.temperature_k.1.max(t));
                e.density_g_cm3 = (e.density_g_cm3.0.min(rho), e.density_g_cm3.1.max(rho));
            }
            None => self.entries.push(CautionEntry {
                kind,
                text,
                points: 1,
                temperature_k: (t, t),
                density_g_cm3: (rho, rho),
            }),
        }
    }

    /// The cautions of `other` added to these.
    pub fn merge(&mut self, other: &Cautions) {
        for e in &other.entries {
            match self.entries.iter_mut().find(|f| f.text == e.text) {
                Some(f) => {
                    f.points += e.points;
                    f.temperature_k = (
                        f.temperature_k.0.min(e.temperature_k.0),
                        f.temperature_k.1.max(e.temperature_k.1),
                    );
                    f.density_g_cm3 = (
                        f.density_g_cm3.0.min(e.density_g_cm3.0),
                        f.density_g_cm3.1.max(e.density_g_cm3.1),
                    );
                }
                None => self.entries.push(e.clone()),
            }
        }
    }
}

/// The last point at which the local physics was evaluated: its (x, y), the equation-of-state
/// result there and at the evaluation before (to warm-start the next inversion to second
/// order) and nabla_rad - nabla_ad there (so that the event function at the end of an accepted
/// step, where the integrator has just evaluated the right-hand side, costs nothing).
#[derive(Debug, Clone, Copy)]
struct LastPoint {
    x: f64,
    y: State,
    eos: EosState,
    before: Option<EosState>,
    excess: f64,
}

/// The right-hand side of one leg: dy/dx = (dy/dm)(dm/dx).
struct LegSystem<'a, 'c> {
    ctx: &'c LegContext<'a>,
    leg: Leg,
    last: &'c Cell<Option<LastPoint>>,
}

impl LegSystem<'_, '_> {
    /// dy/dm and nabla_rad - nabla_ad at (x, y), recording the point.
    fn evaluate(&self, x: f64, y: &State) -> Result<(State, f64), PhysicsError> {
        let (m, dm_dx) = self.leg.mass_and_jacobian(x, self.ctx.total_mass_g);
        let last = self.last.get();
        let near = last.map(|p| p.eos);
        let before = last.and_then(|p| p.before);
        let (d, local) = derivatives_in_mass(
            self.ctx.physics,
            self.ctx.composition,
            &self.ctx.scales,
            m,
            y,
            self.leg.luminosity_form(self.ctx),
            (near.as_ref(), before.as_ref()),
        )?;
        let excess = local.nabla_rad - local.eos.nabla_ad;
        self.last.set(Some(LastPoint {
            x,
            y: *y,
            eos: local.eos,
            before: near,
            excess,
        }));
        Ok((d * dm_dx, excess))
    }

    /// nabla_rad - nabla_ad at (x, y): from the last evaluation if it was at this point.
    fn excess(&self, x: f64, y: &State) -> Result<f64, PhysicsError> {
        match self.last.get() {
            Some(p) if p.x == x && p.y == *y => Ok(p.excess),
            _ => self.evaluate(x, y).map(|(_, e)| e),
        }
    }
}

impl OdeSystem<STATE_LEN> for LegSystem<'_, '_> {
    type Error = PhysicsError;

    fn rhs(&mut self, x: f64, y: &State, dy: &mut State) -> Result<(), PhysicsError> {
        let (d, _) = self.evaluate(x, y)?;
        *dy = d;
        if dy.iter().all(|v| v.is_finite()) {
            Ok(())
        } else {
            Err(PhysicsError::new(
                "structure",
                "non-finite derivative",
                self.last.get().map_or(f64::NAN, |p| p.eos.density_g_cm3),
                y[super::equations::LN_T].fast_exp(),
            ))
        }
    }
}

/// Watches a leg: the convective boundary as an event, output points, and (for profiles) every
/// accepted step's dense output.
struct LegObserver<'a, 'c, 'r> {
    system: LegSystem<'a, 'c>,
    watch_boundaries: bool,
    steps: Option<&'r mut Vec<DenseStep>>,
    /// The start of the last accepted step.
    step_start: Option<(f64, State)>,
    /// The laws' cautions at the accepted steps' ends.
    cautions: Cautions,
}

/// One accepted step of a recorded leg: from `x_start` to `x_end` (the event's x where the
/// integration stopped inside the step), with its dense output.
#[derive(Debug, Clone)]
pub struct DenseStep {
    x_start: f64,
    x_end: f64,
    dense: DenseOutput<STATE_LEN>,
}

impl Observer<STATE_LEN, PhysicsError> for LegObserver<'_, '_, '_> {
    fn event_count(&self) -> usize {
        usize::from(self.watch_boundaries)
    }
    fn event_value(&mut self, _index: usize, x: f64, y: &State) -> Result<f64, PhysicsError> {
        self.system.excess(x, y)
    }
    fn on_event(&mut self, _index: usize, _x: f64, _y: &State) -> Control {
        Control::Stop
    }
    fn dense_every_step(&self) -> bool {
        self.steps.is_some()
    }
    fn on_step(&mut self, step: &AcceptedStep<'_, STATE_LEN>) -> Control {
        self.step_start = Some((step.x_old, *step.y_old));
        // The right-hand side has just been evaluated at the step's end (unless the step
        // stopped at an event): ask the laws about that point.
        if let Some(p) = self
            .system
            .last
            .get()
            .filter(|p| p.x == step.x && p.y == *step.y)
        {
            self.cautions
                .check(self.system.ctx, p.eos.density_g_cm3, p.eos.temperature_k);
        }
        if let (Some(steps), Some(dense)) = (self.steps.as_deref_mut(), step.dense()) {
            steps.push(DenseStep {
                x_start: step.x_old,
                x_end: step.x,
                dense: dense.clone(),
            });
        }
        Control::Continue
    }
}

/// The steps an integration accepted and the tolerance it had: the next integration of the
/// same kind at that tolerance follows them ([`Dop853::set_step_plan`]).
#[derive(Debug, Clone, Default)]
pub(crate) struct KeptSteps(Option<(f64, Vec<f64>)>);

impl KeptSteps {
    /// The kept steps if they were taken at `tolerance`, else none; either way they are no
    /// longer kept.
    pub(crate) fn take_at(&mut self, tolerance: f64) -> Vec<f64> {
        match self.0.take() {
            Some((kept_tolerance, steps)) if kept_tolerance == tolerance => steps,
            _ => Vec::new(),
        }
    }

    /// Keep `steps`, taken at `tolerance`.
    pub(crate) fn keep(&mut self, tolerance: f64, steps: Vec<f64>) {
        self.0 = Some((tolerance, steps));
    }
}

/// Integrates legs: one integrator, reused for every leg of one model.
pub struct LegRunner<'a> {
    /// Physics, composition, mass and integrator tolerance.
    pub ctx: LegContext<'a>,
    solver: Dop853<STATE_LEN>,
    last: Cell<Option<LastPoint>>,
    /// The accepted steps of the last integration of each leg (outward, inward).
    plans: [KeptSteps; 2],
}

/// The integrator's settings for the legs: the context's tolerance (relative and absolute), a
/// failed right-hand side shrinks the step by 3 (a trial stage can leave a law's domain while
/// the solution does not), and the PI step-size controller (Gustafsson; weight
/// [`LEG_STEP_BETA`], safety factor [`LEG_STEP_SAFETY`]).
fn settings(tolerance: f64) -> Dop853Settings {
    Dop853Settings {
        rtol: tolerance,
        atol: tolerance,
        on_rhs_failure: RhsFailure::RejectStep { shrink: 1.0 / 3.0 },
        beta: LEG_STEP_BETA,
        safety: LEG_STEP_SAFETY,
        ..Dop853Settings::default()
    }
}

/// Weight of the previous step's error in the legs' step-size controller. The plain controller
/// (0) lets the step grow after every accepted step and has the next one rejected where the
/// error rises along the leg (every other step of the deep envelope at 1 M_sun); with 0.04 and
/// [`LEG_STEP_SAFETY`] 0.8 the 40 masses 0.1-100 M_sun from the built-in guess need 12 per cent
/// fewer right-hand sides at Z = 0.02 (300 000 -> 264 000), 4.5 at Z = 0.002, 8 at
/// Z = 0.0005 and 1 at Z = 0.04 (measured with the Newton iterations unchanged to within
/// 3 per cent).
pub const LEG_STEP_BETA: f64 = 0.04;
/// Safety factor of the legs' step-size controller (see [`LEG_STEP_BETA`]).
pub const LEG_STEP_SAFETY: f64 = 0.8;

impl<'a> LegRunner<'a> {
    /// A runner for `ctx`.
    pub fn new(ctx: LegContext<'a>) -> LegResult<Self> {
        let setup_error = |e: crate::numerics::invalid::InvalidSetting| LegError {
            leg: LegName::Outward,
            variable: "ln(m/M)",
            x: f64::NAN,
            mass_g: f64::NAN,
            cause: LegCause::Integrator(e.to_string()),
        };
        let mut solver = Dop853::new(settings(ctx.tolerance)).map_err(setup_error)?;
        solver.record_steps(true);
        // The running integrals (energy and virial checks) ride along: they are quadratures of
        // smooth integrands on the steps the structure variables choose, and need not choose
        // the steps themselves.
        for i in [INT_EPS, INT_CNO, INT_THERMAL, INT_GRAVITY] {
            solver.set_error_control(i, false).map_err(setup_error)?;
        }
        Ok(Self {
            ctx,
            solver,
            last: Cell::new(None),
            plans: Default::default(),
        })
    }

    /// Set the integrator tolerance (relative and absolute).
    pub fn set_tolerance(&mut self, tolerance: f64) {
        self.ctx.tolerance = tolerance;
        // A tolerance the context accepted is one the integrator accepts (both finite, > 0).
        let _ = self.solver.set_tolerances(tolerance, tolerance);
    }

    /// Right-hand-side evaluations of every integration so far.
    pub fn rhs_evaluations(&self) -> u64 {
        self.solver.total_stats().rhs_evaluations as u64
    }

    /// Integrate `leg` from `x0` to `x1` starting at `y0`; the end state and the convective
    /// boundaries met. With `steps`, every accepted step's dense output is appended to it (for
    /// a profile).
    ///
    /// A leg integrated again at the same tolerance (the Jacobian's columns, the next Newton
    /// trial, the profile's fine solution) follows the steps its last integration accepted
    /// ([`Dop853::set_step_plan`]): the ends of legs at nearby unknowns then differ smoothly,
    /// so the Jacobian's differences see the change of the unknowns rather than a changed step
    /// sequence, and the first integration's rejected steps (some 10 per cent of them) are not
    /// repeated.
    pub fn integrate(
        &mut self,
        leg: Leg,
        x0: f64,
        x1: f64,
        y0: State,
        steps: Option<&mut Vec<DenseStep>>,
    ) -> LegResult<LegEnd> {
        let slot = leg as usize;
        let plan = self.plans[slot].take_at(self.ctx.tolerance);
        self.solver.set_step_plan(plan);
        let _ = self.solver.take_record();
        let result = self.integrate_leg(leg, x0, x1, y0, steps);
        let record = self.solver.take_record();
        self.solver.set_step_plan(Vec::new());
        if result.is_ok() {
            self.plans[slot].keep(self.ctx.tolerance, record);
        }
        result
    }

    /// [`LegRunner::integrate`] with the plan set.
    fn integrate_leg(
        &mut self,
        leg: Leg,
        x0: f64,
        x1: f64,
        y0: State,
        mut steps: Option<&mut Vec<DenseStep>>,
    ) -> LegResult<LegEnd> {
        let mut y = y0;
        let mut end = LegEnd {
            y,
            boundaries: Vec::new(),
            boundary_limit_reached: false,
            cautions: Cautions::default(),
        };
        if x1 <= x0 {
            return Ok(end);
        }
        self.last.set(None);
        let total_mass_g = self.ctx.total_mass_g;
        let mut x = x0;
        let mut initial_step = None;
        loop {
            let watch_boundaries = end.boundaries.len() < MAX_BOUNDARIES_PER_LEG;
            let _ = self.solver.set_initial_step(initial_step);
            let mut observer = LegObserver {
                system: LegSystem {
                    ctx: &self.ctx,
                    leg,
                    last: &self.last,
                },
                watch_boundaries,
                steps: steps.as_deref_mut(),
                step_start: None,
                cautions: Cautions::default(),
            };
            let mut system = LegSystem {
                ctx: &self.ctx,
                leg,
                last: &self.last,
            };
            let outcome = self
                .solver
                .integrate(&mut system, x, &y, x1, &mut observer)
                .map_err(|e| leg_error(leg, total_mass_g, x, e))?;
            let step_start = observer.step_start;
            end.cautions.merge(&observer.cautions);
            y = outcome.y;
            x = outcome.x;
            match outcome.stop {
                Stop::Event { .. } => {
                    // The step that crossed the boundary straddles the kink in nabla, so its
                    // dense output (and the state it gives at the located boundary) is poor:
                    // integrate again from the step's start to just past the boundary, so that
                    // no step crosses the kink by more than a hair, and restart there.
                    if let Some((xs, ys)) = step_start.filter(|(xs, _)| *xs < x) {
                        if let Some(recorded) = steps.as_deref_mut() {
                            recorded.pop();
                        }
                        (x, y) = self.past_boundary(leg, (xs, ys), x, x1, steps.as_deref_mut())?;
                    }
                    let (m, _) = leg.mass_and_jacobian(x, total_mass_g);
                    end.boundaries.push(m / total_mass_g);
                    initial_step = Some(outcome.next_step);
                }
                Stop::End | Stop::Observer => {
                    end.y = y;
                    end.boundary_limit_reached = !watch_boundaries;
                    let _ = self.solver.set_initial_step(None);
                    return Ok(end);
                }
            }
        }
    }
}

impl LegRunner<'_> {
    /// Integrate `leg` from the start of the step that crossed a convective boundary,
    /// `(xs, ys)`, to just past the boundary located near `x_event` (where nabla_rad - nabla_ad
    /// has the sign it has beyond the boundary), without events; the state there. The step past
    /// the located root is [`BOUNDARY_STEP`] times (1 + |x|), doubled until the sign has changed.
    fn past_boundary(
        &mut self,
        leg: Leg,
        (xs, ys): (f64, State),
        x_event: f64,
        x1: f64,
        mut steps: Option<&mut Vec<DenseStep>>,
    ) -> LegResult<(f64, State)> {
        let total_mass_g = self.ctx.total_mass_g;
        let probe = LegSystem {
            ctx: &self.ctx,
            leg,
            last: &self.last,
        };
        let g_start = probe
            .excess(xs, &ys)
            .map_err(|e| leg.error(xs, total_mass_g, LegCause::Physics(e)))?;
        let mut delta = BOUNDARY_STEP * (1.0 + x_event.abs());
        loop {
            let target = (x_event + delta).min(x1);
            let mut recorded = Vec::new();
            let mut observer = LegObserver {
                system: LegSystem {
                    ctx: &self.ctx,
                    leg,
                    last: &self.last,
                },
                watch_boundaries: false,
                steps: steps.is_some().then_some(&mut recorded),
                step_start: None,
                cautions: Cautions::default(),
            };
            let mut system = LegSystem {
                ctx: &self.ctx,
                leg,
                last: &self.last,
            };
            let _ = self.solver.set_initial_step(None);
            let y = self
                .solver
                .integrate(&mut system, xs, &ys, target, &mut observer)
                .map_err(|e| leg_error(leg, total_mass_g, xs, e))?
                .y;
            let g = probe
                .excess(target, &y)
                .map_err(|e| leg.error(target, total_mass_g, LegCause::Physics(e)))?;
            if g.signum() != g_start.signum() || target >= x1 || delta > 1e-3 {
                if let Some(all) = steps.as_deref_mut() {
                    all.extend(recorded);
                }
                return Ok((target, y));
            }
            delta *= 2.0;
        }
    }
}

/// How far past a located convective boundary a leg restarts, relative to 1 + |x|: well above
/// the event tolerance (1e-12) and far below any step, so the restart is on the boundary's far
/// side and the hair of kink crossed costs nothing measurable (an error of order the jump in
/// the slope of nabla times the square of this).
pub const BOUNDARY_STEP: f64 = 1e-9;

/// A leg's error from the integrator's: where it stopped (the integrator's x, else the start)
/// and why (a law's error where one is reported).
fn leg_error(leg: Leg, total_mass_g: f64, x_start: f64, e: OdeError<PhysicsError>) -> LegError {
    let x = e.x().unwrap_or(x_start);
    let cause = match e {
        OdeError::Rhs { source, .. } | OdeError::Event { source, .. } => LegCause::Physics(source),
        OdeError::NonFinite { .. } | OdeError::EventNotFinite { .. } => LegCause::NonFinite,
        other => LegCause::Integrator(other.to_string()),
    };
    leg.error(x, total_mass_g, cause)
}

/// The solution of one leg between its ends, from the dense output of its accepted steps.
#[derive(Debug, Clone)]
pub struct LegSolution {
    steps: Vec<DenseStep>,
}

impl LegSolution {
    /// The solution made of `steps` (in the order integrated, x increasing).
    pub fn new(steps: Vec<DenseStep>) -> Self {
        Self { steps }
    }

    /// The ends of the accepted steps, first start included.
    pub fn step_points(&self) -> Vec<f64> {
        let mut xs: Vec<f64> = self.steps.iter().map(|s| s.x_start).collect();
        if let Some(last) = self.steps.last() {
            xs.push(last.x_end);
        }
        xs
    }

    /// Number of accepted steps.
    pub fn step_count(&self) -> usize {
        self.steps.len()
    }

    /// The index of the step that holds `x` (the first or last step outside the integrated
    /// range); 0 for an empty solution.
    pub fn step_of(&self, x: f64) -> usize {
        self.steps
            .partition_point(|s| s.x_end < x)
            .min(self.steps.len().saturating_sub(1))
    }

    /// The interval (x_start, x_end) of step `i`.
    pub fn step_interval(&self, i: usize) -> Option<(f64, f64)> {
        self.steps.get(i).map(|s| (s.x_start, s.x_end))
    }

    /// The state at `x` by the dense output of step `i` (extrapolated outside its interval).
    pub fn at_step(&self, i: usize, x: f64) -> Option<State> {
        self.steps.get(i).map(|s| s.dense.evaluate(x))
    }

    /// Component `k` of the state at `x` by the dense output of step `i` (extrapolated outside
    /// its interval): [`LegSolution::at_step`]'s value of that component.
    pub fn component_at_step(&self, i: usize, x: f64, k: usize) -> Option<f64> {
        self.steps.get(i).map(|s| s.dense.evaluate_component(x, k))
    }

    /// The state at `x` by the dense output of the step that holds it (the first or last step
    /// for a point outside the integrated range, which is then extrapolated).
    pub fn at(&self, x: f64) -> Option<State> {
        let i = self.steps.partition_point(|s| s.x_end < x);
        let step = self.steps.get(i).or(self.steps.last())?;
        Some(step.dense.evaluate(x))
    }
}
