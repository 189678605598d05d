//! The DOP853 driver: stages, error estimate, step-size control, dense output, events, output
//! points (Hairer, Nørsett & Wanner 1993, §II.4 for the step-size control and starting step,
//! §II.5 for the method, §II.10 for the dense output; Hairer & Wanner 1996, §IV.2 for the PI
//! controller and the stiffness test). Written for this crate from the published method.

use super::dense::{AcceptedStep, DenseOutput};
use super::error::OdeError;
use super::settings::{check_tolerances, Dop853Settings, RhsFailure};
use super::tableau::{A, B, BHH, C, D, ER, STAGES};
use super::{Control, Crossing, Observer, OdeSystem};
use crate::numerics::invalid::InvalidSetting;
use crate::numerics::scalar::illinois;
use nalgebra::SVector;

/// Weight of the 3rd-order estimate in the denominator of Hairer's error norm
/// err = |h| err5^2 / sqrt(n (err5^2 + 0.01 err3^2)) (§II.10, the estimate of DOP853).
const ERR3_WEIGHT: f64 = 0.01;
/// Floor of the previous error in the PI controller (Hairer's 1e-4).
const MIN_OLD_ERROR: f64 = 1e-4;
/// Hairer's stiffness test: h |lambda| above this (near the border of DOP853's stability
/// region on the negative real axis) is a positive test.
const STIFF_H_LAMBDA: f64 = 6.1;
/// Positive stiffness tests in a row that stop the integration (Hairer's 15).
const STIFF_POSITIVE_TESTS: usize = 15;
/// Negative tests that reset the count of positive ones (Hairer's 6).
const STIFF_NEGATIVE_RESET: usize = 6;
/// Attempts of the starting-step probe after right-hand-side failures (with `RejectStep`).
const PROBE_ATTEMPTS: usize = 30;

/// Work counts of one integration (in [`Outcome::stats`]) or of an integrator's life
/// ([`Dop853::total_stats`]).
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq)]
pub struct Stats {
    /// Calls of the right-hand side, failed ones included.
    pub rhs_evaluations: usize,
    /// Accepted steps.
    pub accepted_steps: usize,
    /// Rejected steps (error too large, or a failed trial with `RejectStep`).
    pub rejected_steps: usize,
    /// Steps whose dense output was prepared (three right-hand sides each, counted above).
    pub dense_outputs: usize,
}

impl Stats {
    fn add(&mut self, other: &Stats) {
        self.rhs_evaluations += other.rhs_evaluations;
        self.accepted_steps += other.accepted_steps;
        self.rejected_steps += other.rejected_steps;
        self.dense_outputs += other.dense_outputs;
    }
}

/// Why an integration returned normally.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Stop {
    /// It reached x_end.
    End,
    /// An event whose [`Observer::on_event`] said stop.
    Event {
        /// Which event function.
        index: usize,
    },
    /// [`Observer::on_step`] said stop (at the end of a step).
    Observer,
}

/// Where and why an integration stopped.
#[derive(Debug, Clone, PartialEq)]
pub struct Outcome<const N: usize> {
    /// Final x (exactly x_end at the end).
    pub x: f64,
    /// State at `x`.
    pub y: SVector<f64, N>,
    /// Why it stopped.
    pub stop: Stop,
    /// Output points used up (emitted or skipped); continue with `points[outputs_done..]`.
    pub outputs_done: usize,
    /// The step size the controller proposes next (a good `initial_step` for a restart).
    pub next_step: f64,
    /// Work done by this integration.
    pub stats: Stats,
}

/// A failed trial: a right-hand-side error or a non-finite value.
enum Failure<E> {
    Rhs { x: f64, source: E },
    NonFinite,
}

/// The DOP853 integrator for states of size `N`. It owns its stage vectors, so one integrator
/// can run many integrations without allocating (its event buffers grow to the largest event
/// count seen, once).
#[derive(Debug, Clone)]
pub struct Dop853<const N: usize> {
    settings: Dop853Settings,
    rtol: [f64; N],
    atol: [f64; N],
    controlled: [bool; N],
    k: [SVector<f64, N>; STAGES],
    y_new: SVector<f64, N>,
    y_stage11: SVector<f64, N>,
    dense: DenseOutput<N>,
    g_old: Vec<f64>,
    g_new: Vec<f64>,
    roots: Vec<Option<f64>>,
    plan: Vec<f64>,
    record: Vec<f64>,
    recording: bool,
    run: Stats,
    totals: Stats,
}

impl<const N: usize> Dop853<N> {
    /// An integrator with `settings` (validated), every component under the same tolerances.
    pub fn new(settings: Dop853Settings) -> Result<Self, InvalidSetting> {
        settings.validate()?;
        if N == 0 {
            return Err(InvalidSetting::new("state size", N, ">= 1"));
        }
        Ok(Self {
            settings,
            rtol: [settings.rtol; N],
            atol: [settings.atol; N],
            controlled: [true; N],
            k: [SVector::zeros(); STAGES],
            y_new: SVector::zeros(),
            y_stage11: SVector::zeros(),
            dense: DenseOutput::empty(),
            g_old: Vec::new(),
            g_new: Vec::new(),
            roots: Vec::new(),
            plan: Vec::new(),
            record: Vec::new(),
            recording: false,
            run: Stats::default(),
            totals: Stats::default(),
        })
    }

    /// The settings (the scalar tolerances in them are those of the last
    /// [`Dop853::set_tolerances`]).
    pub fn settings(&self) -> &Dop853Settings {
        &self.settings
    }

    /// The same `rtol` and `atol` for every component (components taken out of the error
    /// control stay out).
    pub fn set_tolerances(&mut self, rtol: f64, atol: f64) -> Result<(), InvalidSetting> {
        check_tolerances(rtol, atol)?;
        self.settings.rtol = rtol;
        self.settings.atol = atol;
        self.rtol = [rtol; N];
        self.atol = [atol; N];
        Ok(())
    }

    /// Tolerances of one component.
    pub fn set_component_tolerances(
        &mut self,
        index: usize,
        rtol: f64,
        atol: f64,
    ) -> Result<(), InvalidSetting> {
        check_tolerances(rtol, atol)?;
        if index >= N {
            return Err(InvalidSetting::new(
                "component",
                index,
                "below the state size",
            ));
        }
        self.rtol[index] = rtol;
        self.atol[index] = atol;
        Ok(())
    }

    /// Leave component `index` out of the error estimate (a running integral that feeds back
    /// into nothing, say), or put it back. At least one component must stay in.
    pub fn set_error_control(
        &mut self,
        index: usize,
        controlled: bool,
    ) -> Result<(), InvalidSetting> {
        if index >= N {
            return Err(InvalidSetting::new(
                "component",
                index,
                "below the state size",
            ));
        }
        let others = (0..N).filter(|&i| i != index && self.controlled[i]).count();
        if !controlled && others == 0 {
            return Err(InvalidSetting::new(
                "component",
                index,
                "a component other than the last one under error control",
            ));
        }
        self.controlled[index] = controlled;
        Ok(())
    }

    /// The first step of the next integrations (`None`: estimate it).
    pub fn set_initial_step(&mut self, h: Option<f64>) -> Result<(), InvalidSetting> {
        let mut s = self.settings;
        s.initial_step = h;
        s.validate()?;
        self.settings = s;
        Ok(())
    }

    /// Steps to follow in the next integrations: the step ends `plan` (in the direction of
    /// integration) of an earlier integration of a nearby problem at the same tolerances, as
    /// [`Dop853::take_record`] gave them. From x, a step is proposed to the first plan point
    /// more than [`PLAN_MIN_FRACTION`] of its planned step ahead; it is accepted or rejected
    /// by the error estimate as any step is, and after a rejection the controller chooses the
    /// steps until one is accepted. Beyond the plan's last point the controller goes on alone.
    /// The steps then repeat from one integration to the next, so that the ends of nearby
    /// integrations differ smoothly (not by a changed step sequence), and the rejected steps of
    /// the first are not taken again. An empty plan (the default) leaves the controller alone.
    pub fn set_step_plan(&mut self, plan: Vec<f64>) {
        self.plan = plan;
    }

    /// Record the ends of the accepted steps for [`Dop853::take_record`] (off by default: an
    /// integrator used without plans keeps no record, which would grow with every integration).
    pub fn record_steps(&mut self, on: bool) {
        self.recording = on;
    }

    /// The ends of the steps accepted since the last call while recording
    /// ([`Dop853::record_steps`]; the restart points of integrations that began inside an
    /// earlier one's range drop the points at and beyond them), to be the plan of a later
    /// integration ([`Dop853::set_step_plan`]); the record starts afresh.
    pub fn take_record(&mut self) -> Vec<f64> {
        std::mem::take(&mut self.record)
    }

    /// The plan's step from `x`, if the plan reaches beyond it; `cursor` is the index of the
    /// first plan point not yet passed.
    fn planned_step(&self, cursor: &mut usize, x: f64, direction: f64) -> Option<f64> {
        while let Some(&p) = self.plan.get(*cursor) {
            let previous = if *cursor > 0 {
                self.plan[*cursor - 1]
            } else {
                x
            };
            if (p - x) * direction > PLAN_MIN_FRACTION * (p - previous) * direction {
                return Some(p - x);
            }
            *cursor += 1;
        }
        None
    }

    /// Work done by every integration since this integrator was built (failed ones included).
    pub fn total_stats(&self) -> Stats {
        self.totals
    }

    /// Integrate dy/dx = f(x, y) from (`x0`, `y0`) towards `x_end` (above or below x0), watched
    /// by `observer`. Returns the end state, or the state at an event or observer stop; or why
    /// it could not go on, with the x where that happened.
    pub fn integrate<S, O>(
        &mut self,
        system: &mut S,
        x0: f64,
        y0: &SVector<f64, N>,
        x_end: f64,
        observer: &mut O,
    ) -> Result<Outcome<N>, OdeError<S::Error>>
    where
        S: OdeSystem<N>,
        O: Observer<N, S::Error>,
    {
        self.run = Stats::default();
        let result = self.run_integration(system, x0, y0, x_end, observer);
        self.totals.add(&self.run);
        result.map(|mut outcome| {
            outcome.stats = self.run;
            outcome
        })
    }

    fn run_integration<S, O>(
        &mut self,
        system: &mut S,
        x0: f64,
        y0: &SVector<f64, N>,
        x_end: f64,
        observer: &mut O,
    ) -> Result<Outcome<N>, OdeError<S::Error>>
    where
        S: OdeSystem<N>,
        O: Observer<N, S::Error>,
    {
        if !x0.is_finite() {
            return Err(OdeError::InvalidStart { what: "x0" });
        }
        if !x_end.is_finite() {
            return Err(OdeError::InvalidStart { what: "x_end" });
        }
        if !y0.iter().all(|v| v.is_finite()) {
            return Err(OdeError::InvalidStart { what: "y0" });
        }
        let direction = if x_end >= x0 { 1.0 } else { -1.0 };
        let mut outputs_done = start_outputs(observer, x0, y0, direction);
        let n_events = observer.event_count();
        self.g_old.clear();
        self.g_old.resize(n_events, 0.0);
        self.g_new.clear();
        self.g_new.resize(n_events, 0.0);
        self.roots.clear();
        self.roots.resize(n_events, None);
        for i in 0..n_events {
            self.g_old[i] = event_value(observer, i, x0, y0)?;
        }
        let stop_outcome = |x: f64, y: SVector<f64, N>, stop: Stop, done: usize, h: f64| {
            Ok(Outcome {
                x,
                y,
                stop,
                outputs_done: done,
                next_step: h,
                stats: Stats::default(),
            })
        };
        if x_end == x0 {
            return stop_outcome(x0, *y0, Stop::End, outputs_done, 0.0);
        }
        self.run.rhs_evaluations += 1;
        system
            .rhs(x0, y0, &mut self.k[0])
            .map_err(|source| OdeError::Rhs { x: x0, source })?;
        if !self.k[0].iter().all(|v| v.is_finite()) {
            return Err(OdeError::NonFinite { x: x0 });
        }
        let s = self.settings;
        let fixed = s.fixed_step.is_some();
        // The record keeps the steps before x0 (a restart inside an earlier integration's
        // range replaces what followed it); the plan is followed from its first point beyond.
        while self
            .record
            .last()
            .is_some_and(|&p| (p - x0) * direction >= 0.0)
        {
            self.record.pop();
        }
        let mut plan_cursor = self.plan.partition_point(|&p| (p - x0) * direction <= 0.0);
        let first_planned = if fixed {
            None
        } else {
            self.planned_step(&mut plan_cursor, x0, direction)
        };
        let mut h = match (s.fixed_step, first_planned, s.initial_step) {
            (Some(hf), _, _) => direction * hf.abs(),
            (None, Some(hp), _) => hp,
            (None, None, Some(h0)) => direction * h0.abs().min(s.max_step),
            (None, None, None) => self.starting_step(system, x0, y0, x_end, direction)?,
        };
        // Hairer's DOP853: the current error's exponent 1/8 - 0.2 beta.
        let expo = 0.125 - 0.2 * s.beta;
        let mut x = x0;
        let mut y = *y0;
        let mut reject = false;
        let mut err_old = MIN_OLD_ERROR;
        let mut last_failure: Option<(f64, S::Error)> = None;
        let (mut stiff_positive, mut stiff_negative) = (0usize, 0usize);
        let mut kink: Option<Kink> = None;
        let mut kink_rejections = 0usize;
        loop {
            if self.run.accepted_steps + self.run.rejected_steps >= s.max_steps {
                return Err(OdeError::TooManySteps {
                    x,
                    max_steps: s.max_steps,
                });
            }
            if h == 0.0 || 0.1 * h.abs() <= x.abs() * f64::EPSILON {
                return Err(match last_failure {
                    Some((x, source)) => OdeError::Rhs { x, source },
                    None => OdeError::StepSizeUnderflow { x, h },
                });
            }
            // The plan's step, unless the last trial was rejected.
            if !fixed && !reject {
                if let Some(hp) = self.planned_step(&mut plan_cursor, x, direction) {
                    h = hp;
                }
            }
            // A known kink ahead: end the step just past its estimated position. The step the
            // controller wanted is kept for after it (a step shortened to reach a point says
            // nothing about the solution's smoothness).
            let h_free = h;
            let aimed = match &kink {
                Some(k) => {
                    let aim = k.aim(x, self.g_old[k.index]);
                    let aimed = (x + h - aim) * direction > 0.0 && (aim - x) * direction > 0.0;
                    if aimed {
                        h = aim - x;
                    }
                    aimed
                }
                None => false,
            };
            let mut last = false;
            if (x + 1.01 * h - x_end) * direction > 0.0 {
                h = x_end - x;
                last = true;
            }
            let x_new = if last { x_end } else { x + h };

            // The trial step, its error and (if it passes) the right-hand side at its end.
            let err = match self.attempt(system, x, &y, h, x_new) {
                Ok(err) => err,
                Err(failure) => {
                    h = self.after_failure(failure, x, h, &mut last_failure)?;
                    reject = true;
                    continue;
                }
            };
            if err > 1.0 {
                reject = true;
                self.run.rejected_steps += 1;
                // A step rejected for crossing a kink keeps its length, as the next one is
                // aimed at the kink instead; but not for long: after a few such rejections in a
                // row (the step may be too long for the solution short of the kink too), the
                // controller shortens it as usual.
                kink_rejections += 1;
                if !(n_events > 0
                    && kink_rejections <= MAX_KINK_REJECTIONS
                    && self.note_kink(observer, &mut kink, x_new))
                {
                    h /= (1.0 / s.min_factor).min(err.powf(expo) / s.safety);
                }
                continue;
            }

            // Events and output points decide whether the dense output is needed.
            let y_new = self.y_new;
            let mut crossing = false;
            for i in 0..n_events {
                let g = event_value(observer, i, x_new, &y_new)?;
                self.g_new[i] = g;
                crossing |= crosses(self.g_old[i], g, observer.event_direction(i));
            }
            let output_inside = observer
                .output_points()
                .get(outputs_done)
                .is_some_and(|&p| (p - x_new) * direction <= 0.0);
            kink = kink.and_then(|k| k.after_accepted(x_new, crossing, direction));
            kink_rejections = 0;
            let need_dense = crossing || output_inside || observer.dense_every_step();
            if need_dense {
                if let Err(failure) = self.prepare_dense(system, x, &y, h) {
                    h = self.after_failure(failure, x, h, &mut last_failure)?;
                    reject = true;
                    continue;
                }
            }

            // The step is accepted.
            self.run.accepted_steps += 1;
            last_failure = None;
            let h_next = if fixed {
                h.signum() * s.fixed_step.map_or(h.abs(), f64::abs)
            } else {
                let fac = (err.powf(expo) / err_old.powf(s.beta) / s.safety)
                    .clamp(1.0 / s.max_factor, 1.0 / s.min_factor);
                err_old = err.max(MIN_OLD_ERROR);
                let mut h_new = h / fac;
                if h_new.abs() > s.max_step {
                    h_new = direction * s.max_step;
                }
                if reject {
                    h_new = direction * h_new.abs().min(h.abs());
                }
                if aimed {
                    h_new = direction * h_new.abs().max(h_free.abs());
                }
                h_new
            };
            reject = false;
            if let Some(every) = s.stiffness_check {
                if self.run.accepted_steps.is_multiple_of(every) || stiff_positive > 0 {
                    if self.stiffness_test(h) {
                        stiff_negative = 0;
                        stiff_positive += 1;
                        if stiff_positive == STIFF_POSITIVE_TESTS {
                            return Err(OdeError::Stiff { x });
                        }
                    } else {
                        stiff_negative += 1;
                        if stiff_negative == STIFF_NEGATIVE_RESET {
                            stiff_positive = 0;
                        }
                    }
                }
            }

            let stop_event = if crossing {
                self.locate_events(observer, x, x_new, &y_new, direction)?
            } else {
                None
            };
            let (x_stop, y_stop) = match &stop_event {
                Some((_, xe, ye)) => (*xe, *ye),
                None => (x_new, y_new),
            };
            outputs_done =
                self.step_outputs(observer, outputs_done, x, (x_stop, &y_stop), direction);
            let view = AcceptedStep {
                x_old: x,
                y_old: &y,
                x: x_stop,
                y: &y_stop,
                dense: need_dense.then_some(&self.dense),
            };
            let control = observer.on_step(&view);
            if self.recording {
                self.record.push(x_stop);
            }
            if let Some((index, xe, ye)) = stop_event {
                return stop_outcome(xe, ye, Stop::Event { index }, outputs_done, h_next);
            }
            x = x_new;
            y = y_new;
            self.k[0] = self.k[12];
            std::mem::swap(&mut self.g_old, &mut self.g_new);
            if control == Control::Stop {
                return stop_outcome(x, y, Stop::Observer, outputs_done, h_next);
            }
            if last {
                return stop_outcome(x, y, Stop::End, outputs_done, h_next);
            }
            h = h_next;
        }
    }

    /// y + h sum_j a_ij k_j for stage `i`.
    #[inline(always)]
    fn stage_input(&self, i: usize, y: &SVector<f64, N>, h: f64) -> SVector<f64, N> {
        let mut acc = SVector::<f64, N>::zeros();
        for &(j, a) in A[i] {
            acc.axpy(a, &self.k[j], 1.0);
        }
        y + acc * h
    }

    /// One trial step: its stages and error (0 with fixed steps), and, if the error is at most
    /// 1, the right-hand side at the new point (stage 12, the next step's stage 0).
    fn attempt<S: OdeSystem<N>>(
        &mut self,
        system: &mut S,
        x: f64,
        y: &SVector<f64, N>,
        h: f64,
        x_new: f64,
    ) -> Result<f64, Failure<S::Error>> {
        self.try_step(system, x, y, h, x_new)?;
        let err = if self.settings.fixed_step.is_some() {
            0.0
        } else {
            self.error_norm(y, h)
        };
        if !err.is_finite() {
            return Err(Failure::NonFinite);
        }
        if err <= 1.0 {
            self.run.rhs_evaluations += 1;
            system
                .rhs(x_new, &self.y_new, &mut self.k[12])
                .map_err(|source| Failure::Rhs { x: x_new, source })?;
            if !self.k[12].iter().all(|v| v.is_finite()) {
                return Err(Failure::NonFinite);
            }
        }
        Ok(err)
    }

    /// Stages 1-11 and the 8th-order solution y_new (stage 0 is f at the start).
    fn try_step<S: OdeSystem<N>>(
        &mut self,
        system: &mut S,
        x: f64,
        y: &SVector<f64, N>,
        h: f64,
        x_new: f64,
    ) -> Result<(), Failure<S::Error>> {
        // Written out stage by stage so that each row of A is a constant after inlining.
        self.stage(system, 1, x + C[1] * h, y, h)?;
        self.stage(system, 2, x + C[2] * h, y, h)?;
        self.stage(system, 3, x + C[3] * h, y, h)?;
        self.stage(system, 4, x + C[4] * h, y, h)?;
        self.stage(system, 5, x + C[5] * h, y, h)?;
        self.stage(system, 6, x + C[6] * h, y, h)?;
        self.stage(system, 7, x + C[7] * h, y, h)?;
        self.stage(system, 8, x + C[8] * h, y, h)?;
        self.stage(system, 9, x + C[9] * h, y, h)?;
        self.stage(system, 10, x + C[10] * h, y, h)?;
        // Stage 11 has c = 1: evaluate it exactly at the step's end.
        self.stage(system, 11, x_new, y, h)?;
        self.y_new = self.stage_input(12, y, h);
        if self.y_new.iter().all(|v| v.is_finite()) {
            Ok(())
        } else {
            Err(Failure::NonFinite)
        }
    }

    /// k_i = f(x_i, y + h sum_j a_ij k_j).
    #[inline(always)]
    fn stage<S: OdeSystem<N>>(
        &mut self,
        system: &mut S,
        i: usize,
        x_i: f64,
        y: &SVector<f64, N>,
        h: f64,
    ) -> Result<(), Failure<S::Error>> {
        let y_i = self.stage_input(i, y, h);
        if i == 11 {
            self.y_stage11 = y_i;
        }
        self.run.rhs_evaluations += 1;
        system
            .rhs(x_i, &y_i, &mut self.k[i])
            .map_err(|source| Failure::Rhs { x: x_i, source })
    }

    /// Hairer's error norm of DOP853: the 5th-order estimate, corrected by the 3rd-order one,
    /// err = |h| E5^2 / sqrt(n (E5^2 + 0.01 E3^2)) with E_p^2 = sum_i (e_p,i / sk_i)^2 and
    /// sk_i = atol_i + rtol_i max(|y_i|, |y_new,i|) over the controlled components.
    fn error_norm(&self, y: &SVector<f64, N>, h: f64) -> f64 {
        let (mut err5, mut err3, mut n) = (0.0, 0.0, 0usize);
        for i in 0..N {
            if !self.controlled[i] {
                continue;
            }
            n += 1;
            let sk = (self.atol[i] + self.rtol[i] * y[i].abs().max(self.y_new[i].abs()))
                .max(f64::MIN_POSITIVE);
            let mut e3 = 0.0;
            for &(j, b) in &B {
                e3 += b * self.k[j][i];
            }
            for &(j, b) in &BHH {
                e3 -= b * self.k[j][i];
            }
            let mut e5 = 0.0;
            for &(j, e) in &ER {
                e5 += e * self.k[j][i];
            }
            err3 += (e3 / sk) * (e3 / sk);
            err5 += (e5 / sk) * (e5 / sk);
        }
        let mut deno = err5 + ERR3_WEIGHT * err3;
        if deno <= 0.0 {
            deno = 1.0;
        }
        h.abs() * err5 / (n as f64 * deno).sqrt()
    }

    /// After a rejected step ending at `x_new`: if an event function changed sign between the
    /// step's start and the trial's end (judged from the trial's state, whose error does not
    /// matter for the sign), the step was probably rejected because it crossed a kink of the
    /// solution there (a switch of the right-hand side's form that the event watches): record
    /// the bracket, or narrow it, and return true. An event function that cannot be evaluated
    /// at the trial leaves the bracket as it was.
    fn note_kink<E, O: Observer<N, E>>(
        &self,
        observer: &mut O,
        kink: &mut Option<Kink>,
        x_new: f64,
    ) -> bool {
        // The first event to change sign, by the line through its two values.
        let mut first: Option<(f64, usize, f64)> = None;
        for (index, &g_old) in self.g_old.iter().enumerate() {
            let Ok(g) = observer.event_value(index, x_new, &self.y_new) else {
                continue;
            };
            if g.is_finite() && crosses(g_old, g, observer.event_direction(index)) {
                let theta = g_old / (g_old - g);
                if first.is_none_or(|(t, _, _)| theta < t) {
                    first = Some((theta, index, g));
                }
            }
        }
        let Some((_, index, g)) = first else {
            return false;
        };
        *kink = Some(match *kink {
            Some(k) if k.index == index => k.narrowed_far(x_new, g),
            _ => Kink::new(index, x_new, g),
        });
        true
    }

    /// What a failed trial does: with `RejectStep` (and adaptive steps) it counts as a rejected
    /// step and the next step size is returned, else the error.
    fn after_failure<E>(
        &mut self,
        failure: Failure<E>,
        x: f64,
        h: f64,
        last_failure: &mut Option<(f64, E)>,
    ) -> Result<f64, OdeError<E>> {
        match (self.settings.on_rhs_failure, self.settings.fixed_step) {
            (RhsFailure::RejectStep { shrink }, None) => {
                if let Failure::Rhs { x, source } = failure {
                    *last_failure = Some((x, source));
                }
                self.run.rejected_steps += 1;
                Ok(h * shrink)
            }
            _ => Err(match failure {
                Failure::Rhs { x, source } => OdeError::Rhs { x, source },
                Failure::NonFinite => OdeError::NonFinite { x },
            }),
        }
    }

    /// Hairer's starting step (§II.4): h0 from |y|/|f| (or 1e-6), an explicit Euler probe to
    /// estimate the second derivative, then h with h^8 max(|f|, |f'|) = 0.01, at most 100 h0.
    fn starting_step<S: OdeSystem<N>>(
        &mut self,
        system: &mut S,
        x: f64,
        y: &SVector<f64, N>,
        x_end: f64,
        direction: f64,
    ) -> Result<f64, OdeError<S::Error>> {
        let sk = |i: usize| (self.atol[i] + self.rtol[i] * y[i].abs()).max(f64::MIN_POSITIVE);
        let (mut dnf, mut dny) = (0.0, 0.0);
        for i in (0..N).filter(|&i| self.controlled[i]) {
            dnf += (self.k[0][i] / sk(i)).powi(2);
            dny += (y[i] / sk(i)).powi(2);
        }
        let mut h: f64 = if dnf <= 1e-10 || dny <= 1e-10 {
            1e-6
        } else {
            (dny / dnf).sqrt() * 0.01
        };
        let span = (x_end - x).abs();
        h = h.min(self.settings.max_step).min(span);
        let mut probe_ok = false;
        for _ in 0..PROBE_ATTEMPTS {
            let y1 = y + self.k[0] * (direction * h);
            self.run.rhs_evaluations += 1;
            let (k0, k1) = self.k.split_at_mut(1);
            match system.rhs(x + direction * h, &y1, &mut k1[0]) {
                Ok(())
                    if k1[0].iter().all(|v| v.is_finite())
                        && k0[0].iter().all(|v| v.is_finite()) =>
                {
                    probe_ok = true;
                    break;
                }
                Ok(()) => {}
                Err(source) => {
                    if self.settings.on_rhs_failure == RhsFailure::Stop {
                        return Err(OdeError::Rhs {
                            x: x + direction * h,
                            source,
                        });
                    }
                }
            }
            match self.settings.on_rhs_failure {
                RhsFailure::RejectStep { shrink } => h *= shrink,
                RhsFailure::Stop => return Err(OdeError::NonFinite { x }),
            }
        }
        if !probe_ok {
            // Every probe failed: start with the smallest probe and let the step control act.
            return Ok(direction * h);
        }
        let mut der2 = 0.0;
        for i in (0..N).filter(|&i| self.controlled[i]) {
            der2 += ((self.k[1][i] - self.k[0][i]) / sk(i)).powi(2);
        }
        let der2 = der2.sqrt() / h;
        let der12 = der2.max(dnf.sqrt());
        let h1 = if der12 <= 1e-15 {
            (h * 1e-3).max(1e-6)
        } else {
            (0.01 / der12).powf(1.0 / 8.0)
        };
        Ok(direction * (100.0 * h).min(h1).min(self.settings.max_step).min(span))
    }

    /// The three extra stages and the coefficients of the continuous extension for the step
    /// from (`x`, `y`) of size `h` (stages 0-12 and y_new must be those of the step).
    fn prepare_dense<S: OdeSystem<N>>(
        &mut self,
        system: &mut S,
        x: f64,
        y: &SVector<f64, N>,
        h: f64,
    ) -> Result<(), Failure<S::Error>> {
        for (i, &c) in C.iter().enumerate().skip(13) {
            self.stage(system, i, x + c * h, y, h)?;
            if !self.k[i].iter().all(|v| v.is_finite()) {
                return Err(Failure::NonFinite);
            }
        }
        let ydiff = self.y_new - y;
        let bspl = self.k[0] * h - ydiff;
        let c = &mut self.dense.coefficients;
        c[0] = *y;
        c[1] = ydiff;
        c[2] = bspl;
        c[3] = ydiff - self.k[12] * h - bspl;
        for (r, row) in D.iter().enumerate() {
            let mut acc = SVector::<f64, N>::zeros();
            for &(j, d) in *row {
                acc.axpy(d, &self.k[j], 1.0);
            }
            c[4 + r] = acc * h;
        }
        self.dense.x_old = x;
        self.dense.h = h;
        self.run.dense_outputs += 1;
        Ok(())
    }

    /// Hairer's stiffness test: h |lambda| estimated from stages 11 and 12, which are both at
    /// x + h, by |f(y_new) - f(y_11)| / |y_new - y_11|.
    fn stiffness_test(&self, h: f64) -> bool {
        let num = (self.k[12] - self.k[11]).norm_squared();
        let den = (self.y_new - self.y_stage11).norm_squared();
        den > 0.0 && h.abs() * (num / den).sqrt() > STIFF_H_LAMBDA
    }

    /// Locate every event that changed sign on the step and report them in order of x; the
    /// first whose observer says stop ends the search. Returns (index, x, y) of that one.
    #[allow(clippy::type_complexity)]
    fn locate_events<E, O: Observer<N, E>>(
        &mut self,
        observer: &mut O,
        x_old: f64,
        x_new: f64,
        y_new: &SVector<f64, N>,
        direction: f64,
    ) -> Result<Option<(usize, f64, SVector<f64, N>)>, OdeError<E>> {
        let ulp_floor = 4.0 * f64::EPSILON * x_old.abs().max(x_new.abs());
        let tolerance = self.settings.event_tolerance.max(ulp_floor);
        for i in 0..self.roots.len() {
            self.roots[i] = None;
            let (g0, g1) = (self.g_old[i], self.g_new[i]);
            if !crosses(g0, g1, observer.event_direction(i)) {
                continue;
            }
            let dense = &self.dense;
            let root = illinois(
                |x| event_value(observer, i, x, &dense.evaluate(x)),
                x_old,
                g0,
                x_new,
                g1,
                tolerance,
            )?;
            self.roots[i] = Some(root);
        }
        loop {
            let mut first: Option<(usize, f64)> = None;
            for (i, r) in self.roots.iter().enumerate() {
                if let Some(r) = *r {
                    if first.is_none_or(|(_, f)| (r - f) * direction < 0.0) {
                        first = Some((i, r));
                    }
                }
            }
            let Some((i, r)) = first else {
                return Ok(None);
            };
            self.roots[i] = None;
            let y_r = if r == x_new {
                *y_new
            } else {
                self.dense.evaluate(r)
            };
            if observer.on_event(i, r, &y_r) == Control::Stop {
                return Ok(Some((i, r, y_r)));
            }
        }
    }

    /// Emit the output points from the current one up to `stop.0` (the step's end or its
    /// event); returns how many points are used up. Points before the step are skipped.
    fn step_outputs<E, O: Observer<N, E>>(
        &self,
        observer: &mut O,
        mut done: usize,
        x_old: f64,
        stop: (f64, &SVector<f64, N>),
        direction: f64,
    ) -> usize {
        let (x_stop, y_stop) = stop;
        while let Some(&p) = observer.output_points().get(done) {
            if (p - x_stop) * direction > 0.0 {
                break;
            }
            if (p - x_old) * direction > 0.0 {
                let y_p = if p == x_stop {
                    *y_stop
                } else {
                    self.dense.evaluate(p)
                };
                observer.on_output(done, p, &y_p);
            }
            done += 1;
        }
        done
    }
}

/// Emit the output points at x0, skip those before it; returns how many are used up.
fn start_outputs<const N: usize, E, O: Observer<N, E>>(
    observer: &mut O,
    x0: f64,
    y0: &SVector<f64, N>,
    direction: f64,
) -> usize {
    let mut done = 0;
    while let Some(&p) = observer.output_points().get(done) {
        if (p - x0) * direction > 0.0 {
            break;
        }
        if p == x0 {
            observer.on_output(done, x0, y0);
        }
        done += 1;
    }
    done
}

/// A kink of the solution bracketed by a rejected step: event `index` has the sign of `g_far`
/// at `x_far` (the rejected trial's end) and the other sign at the current point. The steps
/// after are aimed at its position estimated by the Illinois variant of regula falsi (Dowell &
/// Jarratt 1971, BIT 11, 168), just past it, so that the step across it crosses by little and
/// is accepted; without this, the step-size controller halves its way towards the kink,
/// alternating rejected steps across it with accepted ones short of it.
#[derive(Debug, Clone, Copy)]
struct Kink {
    index: usize,
    x_far: f64,
    g_far: f64,
    /// Factor on the near end's g in the estimate (the Illinois halving).
    near_weight: f64,
    /// Which end the last narrowing moved.
    moved_far: bool,
}

impl Kink {
    /// A kink between the current point and `x_far`, where event `index` is `g_far`.
    fn new(index: usize, x_far: f64, g_far: f64) -> Self {
        Self {
            index,
            x_far,
            g_far,
            near_weight: 1.0,
            moved_far: true,
        }
    }

    /// Where the next step should end: the root of the line through the current point
    /// (x, near_weight g) and the far end, moved past it towards the far end by
    /// [`KINK_MARGIN`] of the bracket.
    fn aim(&self, x: f64, g: f64) -> f64 {
        let g = self.near_weight * g;
        let root = x + g / (g - self.g_far) * (self.x_far - x);
        root + KINK_MARGIN * (self.x_far - x)
    }

    /// The bracket narrowed by a rejected trial ending at `x_far` with `g_far` of the far
    /// end's sign: the near end stays, and its weight is halved when it stayed last time too.
    fn narrowed_far(self, x_far: f64, g_far: f64) -> Self {
        Self {
            x_far,
            g_far,
            near_weight: if self.moved_far {
                0.5 * self.near_weight
            } else {
                1.0
            },
            moved_far: true,
            ..self
        }
    }

    /// The bracket after an accepted step to `x_new`: gone once an event crossed or the step
    /// reached the far end; else the near end moved (to the new point), and the far value is
    /// halved when it stayed last time too.
    fn after_accepted(self, x_new: f64, crossing: bool, direction: f64) -> Option<Self> {
        if crossing || (x_new - self.x_far) * direction >= 0.0 {
            return None;
        }
        Some(Self {
            g_far: if self.moved_far {
                self.g_far
            } else {
                0.5 * self.g_far
            },
            near_weight: 1.0,
            moved_far: false,
            ..self
        })
    }
}

/// How far past the estimated kink an aimed step ends, as a fraction of the bracket: small
/// against the estimate's error while the bracket is wide, and enough to cross the kink once the
/// estimate is good.
const KINK_MARGIN: f64 = 1e-3;

/// A plan point closer than this fraction of its planned step is passed over (see
/// [`Dop853::set_step_plan`]): the step goes to the next one, at most 1.2 planned steps long.
pub const PLAN_MIN_FRACTION: f64 = 0.2;

/// Rejected steps in a row that may keep their length for a kink (see `Kink`).
const MAX_KINK_REJECTIONS: usize = 8;

/// g_index(x, y), its error and non-finite values turned into [`OdeError`]s.
fn event_value<const N: usize, E, O: Observer<N, E>>(
    observer: &mut O,
    index: usize,
    x: f64,
    y: &SVector<f64, N>,
) -> Result<f64, OdeError<E>> {
    let g = observer
        .event_value(index, x, y)
        .map_err(|source| OdeError::Event { index, x, source })?;
    if g.is_finite() {
        Ok(g)
    } else {
        Err(OdeError::EventNotFinite { index, x })
    }
}

/// A sign change of g from `g0` (at a step's start) to `g1` (at its end) that counts: g0 must
/// be nonzero (a start exactly on a root is not an event), g1 may be zero.
fn crosses(g0: f64, g1: f64, direction: Crossing) -> bool {
    if g0 == 0.0 || (g1 != 0.0 && (g0 < 0.0) == (g1 < 0.0)) {
        return false;
    }
    match direction {
        Crossing::Either => true,
        Crossing::Rising => g0 < 0.0,
        Crossing::Falling => g0 > 0.0,
    }
}
