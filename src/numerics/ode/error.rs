//! Why an integration stopped early. Every variant carries the x where it happened.

use thiserror::Error;

/// An integration that could not reach its end, an event, or a stop asked for by the observer.
/// `E` is the error type of the system's right-hand side (and of the event functions).
#[derive(Debug, Clone, PartialEq, Error)]
pub enum OdeError<E> {
    /// The right-hand side returned an error at (x, a state): at the starting point, or on a
    /// step with [`super::RhsFailure::Stop`], or as the last failure before the step size
    /// underflowed with [`super::RhsFailure::RejectStep`].
    #[error("the right-hand side failed at x = {x}: {source}")]
    Rhs {
        /// Independent variable at which it failed.
        x: f64,
        /// The system's error.
        source: E,
    },
    /// An event function returned an error.
    #[error("event function {index} failed at x = {x}: {source}")]
    Event {
        /// Which event function (as numbered by the observer).
        index: usize,
        /// Independent variable at which it failed.
        x: f64,
        /// The observer's error.
        source: E,
    },
    /// A trial step produced a non-finite value (a right-hand side that returned NaN or
    /// infinity without an error) and [`super::RhsFailure::Stop`] was set.
    #[error("non-finite solution on the step from x = {x}")]
    NonFinite {
        /// Start of the step.
        x: f64,
    },
    /// An event function returned a non-finite value.
    #[error("event function {index} is not finite at x = {x}")]
    EventNotFinite {
        /// Which event function.
        index: usize,
        /// Where.
        x: f64,
    },
    /// The step size fell below what x can resolve (0.1 abs(h) <= ulp-level of x).
    #[error("step size underflow at x = {x} (h = {h:e})")]
    StepSizeUnderflow {
        /// Where.
        x: f64,
        /// The step size that was too small.
        h: f64,
    },
    /// More than `max_steps` steps were attempted.
    #[error("more than {max_steps} steps, stopped at x = {x}")]
    TooManySteps {
        /// Where.
        x: f64,
        /// The limit.
        max_steps: usize,
    },
    /// Hairer's stiffness test was positive 15 times in a row.
    #[error("the problem looks stiff at x = {x}")]
    Stiff {
        /// Where.
        x: f64,
    },
    /// A starting value is not finite.
    #[error("invalid start: {what}")]
    InvalidStart {
        /// Which value.
        what: &'static str,
    },
}

impl<E> OdeError<E> {
    /// The x where the integration failed (`None` for an invalid start).
    pub fn x(&self) -> Option<f64> {
        match self {
            OdeError::Rhs { x, .. }
            | OdeError::Event { x, .. }
            | OdeError::NonFinite { x }
            | OdeError::EventNotFinite { x, .. }
            | OdeError::StepSizeUnderflow { x, .. }
            | OdeError::TooManySteps { x, .. }
            | OdeError::Stiff { x } => Some(*x),
            OdeError::InvalidStart { .. } => None,
        }
    }
}
