//! Settings of the DOP853 integrator, validated once when the integrator is built.

use crate::numerics::invalid::InvalidSetting;

/// Largest PI weight accepted (see [`Dop853Settings::beta`]).
const MAX_BETA: f64 = 0.1;

/// What a failed right-hand side (an `Err` from [`super::OdeSystem::rhs`]) or a non-finite trial
/// point does to the integration.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum RhsFailure {
    /// Stop: the error comes out as [`super::OdeError::Rhs`] with the x where it happened.
    Stop,
    /// Treat the step as rejected and retry it with the step size times `shrink` (0 < shrink <
    /// 1): a trial stage can leave a law's domain while the true solution does not. If the step
    /// size then underflows, the last right-hand-side error is reported (with its x). An error
    /// at the starting point always stops.
    RejectStep {
        /// Factor applied to the step size after a failure.
        shrink: f64,
    },
}

/// Settings of [`super::Dop853`]. Every field has a default ([`Dop853Settings::default`]):
///
/// | field | default | meaning |
/// |---|---|---|
/// | `rtol`, `atol` | 1e-9, 1e-12 | error weight of component i: atol + rtol max(abs y_i, abs y_new,i) |
/// | `initial_step` | `None` | first step; `None`: Hairer's starting-step algorithm (§II.4) |
/// | `max_step` | infinity | largest abs(h) |
/// | `max_steps` | 100 000 | attempted steps (accepted + rejected) per integration |
/// | `safety` | 0.9 | safety factor of the step-size controller |
/// | `min_factor`, `max_factor` | 0.333, 6 | bounds on h_new / h |
/// | `beta` | 0 | PI (Gustafsson) controller's weight of the previous error; 0: the plain controller |
/// | `stiffness_check` | `None` | `Some(n)`: Hairer's stiffness test every n accepted steps |
/// | `on_rhs_failure` | `Stop` | see [`RhsFailure`] |
/// | `event_tolerance` | 1e-12 | width in x within which an event is located |
/// | `fixed_step` | `None` | `Some(h)`: steps of exactly h (the last one shortened), no error control |
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Dop853Settings {
    /// Relative tolerance of the local error (per step), > 0 (or 0 with `atol` > 0).
    pub rtol: f64,
    /// Absolute tolerance of the local error, >= 0.
    pub atol: f64,
    /// First step size (its sign is ignored: the direction is that of x_end - x0).
    pub initial_step: Option<f64>,
    /// Largest step size.
    pub max_step: f64,
    /// Maximum number of attempted steps in one integration.
    pub max_steps: usize,
    /// Safety factor of the controller, in (0, 1).
    pub safety: f64,
    /// Smallest h_new / h, in (0, 1).
    pub min_factor: f64,
    /// Largest h_new / h, > 1.
    pub max_factor: f64,
    /// Exponent of the previous step's error in the PI controller (Gustafsson 1991, ACM TOMS
    /// 17, 533), in the form of Hairer's DOP853 code: h_new = h safety err^-(1/8 - 0.2 beta)
    /// err_old^beta (Hairer & Wanner 1996, *Solving ODEs II*, §IV.2). In [0, 0.1]: the
    /// controller needs 1/8 - 0.2 beta > beta (else small errors shrink the step). 0 (the plain
    /// controller, Hairer's default for DOP853) took the fewest evaluations on the smooth test
    /// problems of `benches/ode.rs`; 0.04 cuts rejected steps where the error estimate is
    /// erratic (Arenstorf: 61 -> 36 at 1e-10). Measure per use.
    pub beta: f64,
    /// Test for stiffness every this many accepted steps (and after each positive test); 15
    /// positive tests in a row stop with [`super::OdeError::Stiff`].
    pub stiffness_check: Option<usize>,
    /// What a failed right-hand side does.
    pub on_rhs_failure: RhsFailure,
    /// Events are located to a bracket of this width in x (or 4 ulp of x if larger), > 0.
    pub event_tolerance: f64,
    /// Fixed step size instead of error control.
    pub fixed_step: Option<f64>,
}

impl Default for Dop853Settings {
    fn default() -> Self {
        Self {
            rtol: 1e-9,
            atol: 1e-12,
            initial_step: None,
            max_step: f64::INFINITY,
            max_steps: 100_000,
            safety: 0.9,
            min_factor: 0.333,
            max_factor: 6.0,
            beta: 0.0,
            stiffness_check: None,
            on_rhs_failure: RhsFailure::Stop,
            event_tolerance: 1e-12,
            fixed_step: None,
        }
    }
}

impl Dop853Settings {
    /// The defaults with tolerances `rtol` and `atol`.
    pub fn with_tolerances(rtol: f64, atol: f64) -> Result<Self, InvalidSetting> {
        let s = Self {
            rtol,
            atol,
            ..Self::default()
        };
        s.validate()?;
        Ok(s)
    }

    /// Check every field; the error names the field and what is allowed.
    pub fn validate(&self) -> Result<(), InvalidSetting> {
        check_tolerances(self.rtol, self.atol)?;
        let positive_finite = |v: f64| v.is_finite() && v > 0.0;
        if let Some(h) = self.initial_step {
            if !(positive_finite(h.abs())) {
                return Err(InvalidSetting::new(
                    "initial_step",
                    h,
                    "a finite nonzero step",
                ));
            }
        }
        if self.max_step.is_nan() || self.max_step <= 0.0 {
            return Err(InvalidSetting::new("max_step", self.max_step, "> 0"));
        }
        if self.max_steps == 0 {
            return Err(InvalidSetting::new("max_steps", 0, ">= 1"));
        }
        if !(self.safety > 0.0 && self.safety < 1.0) {
            return Err(InvalidSetting::new("safety", self.safety, "in (0, 1)"));
        }
        if !(self.min_factor > 0.0 && self.min_factor < 1.0) {
            return Err(InvalidSetting::new(
                "min_factor",
                self.min_factor,
                "in (0, 1)",
            ));
        }
        if !(self.max_factor > 1.0 && self.max_factor.is_finite()) {
            return Err(InvalidSetting::new(
                "max_factor",
                self.max_factor,
                "finite and > 1",
            ));
        }
        if !(0.0..=MAX_BETA).contains(&self.beta) {
            return Err(InvalidSetting::new("beta", self.beta, "in [0, 0.1]"));
        }
        if self.stiffness_check == Some(0) {
            return Err(InvalidSetting::new(
                "stiffness_check",
                0,
                "None or Some(n >= 1)",
            ));
        }
        if let RhsFailure::RejectStep { shrink } = self.on_rhs_failure {
            if !(shrink > 0.0 && shrink < 1.0) {
                return Err(InvalidSetting::new(
                    "on_rhs_failure shrink",
                    shrink,
                    "in (0, 1)",
                ));
            }
        }
        if !positive_finite(self.event_tolerance) {
            return Err(InvalidSetting::new(
                "event_tolerance",
                self.event_tolerance,
                "finite and > 0",
            ));
        }
        if let Some(h) = self.fixed_step {
            if !positive_finite(h.abs()) {
                return Err(InvalidSetting::new(
                    "fixed_step",
                    h,
                    "a finite nonzero step",
                ));
            }
        }
        Ok(())
    }
}

/// rtol and atol of one component: finite, rtol either 0 or at least 10 ulp (Hairer's bound:
/// a smaller rtol asks for more than f64 can give), atol >= 0, not both 0.
pub(crate) fn check_tolerances(rtol: f64, atol: f64) -> Result<(), InvalidSetting> {
    const SMALLEST_RTOL: f64 = 10.0 * f64::EPSILON;
    if !(rtol.is_finite() && (rtol == 0.0 || rtol >= SMALLEST_RTOL)) {
        return Err(InvalidSetting::new(
            "rtol",
            rtol,
            "0 or finite and >= 2.2e-15 (10 ulp)",
        ));
    }
    if !(atol.is_finite() && atol >= 0.0) || (rtol == 0.0 && atol == 0.0) {
        return Err(InvalidSetting::new(
            "atol",
            atol,
            "finite, >= 0, and > 0 if rtol is 0",
        ));
    }
    Ok(())
}
