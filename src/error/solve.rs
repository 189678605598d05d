//! Errors of the structure solver: a leg that failed, and a shooting iteration that stopped
//! without converging. Plain data, kept here below the solver (which re-exports them as
//! `structure::{LegError, ...}`) so that the library's [`super::Error`] can join them without
//! the error module importing the solver.

use super::PhysicsError;
use crate::constants::{L_SUN_ERG_S, R_SUN_CM};
use crate::numerics::newton::{IterationRecord, Termination};
use std::fmt;

/// Which part of a model an integration belongs to.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LegName {
    /// The series start off the centre.
    Centre,
    /// From the centre outward, x = ln(m/M).
    Outward,
    /// From the photosphere inward, x = ln(1 - m/M).
    Inward,
    /// The atmosphere above the photosphere, x = ln tau.
    Atmosphere,
}

impl fmt::Display for LegName {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            LegName::Centre => "centre",
            LegName::Outward => "outward",
            LegName::Inward => "inward",
            LegName::Atmosphere => "atmosphere",
        })
    }
}

/// What stopped a leg.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum LegCause {
    /// A law failed at a point of the leg.
    Physics(PhysicsError),
    /// The integrator gave up (step size underflow, too many steps), with its reason.
    Integrator(String),
    /// The leg's state became non-finite.
    NonFinite,
    /// The start of the leg is not a valid state (e.g. no positive pressure at the centre).
    InvalidStart(String),
}

impl fmt::Display for LegCause {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            LegCause::Physics(e) => write!(f, "{e}"),
            LegCause::Integrator(why) => f.write_str(why),
            LegCause::NonFinite => f.write_str("the state became non-finite"),
            LegCause::InvalidStart(why) => f.write_str(why),
        }
    }
}

/// An integration leg that failed: which leg, where (its independent variable and the mass
/// coordinate at the point where it stopped), and why.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
#[error("the {leg} integration failed at m = {mass_g:.6e} g ({variable} = {x:.6e}): {cause}")]
pub struct LegError {
    /// Which leg.
    pub leg: LegName,
    /// The name of the leg's independent variable.
    pub variable: &'static str,
    /// The independent variable where the leg stopped.
    pub x: f64,
    /// The mass coordinate where the leg stopped, g.
    pub mass_g: f64,
    /// Why.
    pub cause: LegCause,
}

impl LegError {
    /// A physics error at the point (`x`, `mass_g`) of `leg`.
    pub fn physics(
        leg: LegName,
        variable: &'static str,
        x: f64,
        mass_g: f64,
        e: PhysicsError,
    ) -> Self {
        Self {
            leg,
            variable,
            x,
            mass_g,
            cause: LegCause::Physics(e),
        }
    }
}

/// A model whose shooting iteration stopped without converging: why, where it stood, and the
/// history of the iteration. A non-converged model is never shown as a result.
#[derive(Debug, Clone, PartialEq)]
pub struct NotConverged {
    /// The star's mass, M_sun.
    pub mass_msun: f64,
    /// Why the iteration stopped.
    pub termination: Termination<LegError>,
    /// Newton iterations done.
    pub iterations: usize,
    /// Max-norm of the relative mismatch at the last accepted point.
    pub mismatch: f64,
    /// Every iteration (mismatch, step length).
    pub history: Vec<IterationRecord>,
    /// The last accepted unknowns (ln P_c, ln T_c, ln R, ln L), cgs.
    pub last_unknowns: nalgebra::SVector<f64, 4>,
    /// Right-hand-side evaluations spent.
    pub rhs_evaluations: u64,
}

impl NotConverged {
    /// A short code for the reason: `start-not-integrable`, `stalled`, `singular-jacobian`,
    /// `jacobian-failed`, `reevaluation-failed`, `iteration-limit`.
    pub fn code(&self) -> &'static str {
        match &self.termination {
            Termination::Converged => "converged",
            Termination::StartNotEvaluable(_) => "start-not-integrable",
            Termination::Stalled => "stalled",
            Termination::SingularJacobian => "singular-jacobian",
            Termination::JacobianFailed(_) => "jacobian-failed",
            Termination::ReevaluationFailed(_) => "reevaluation-failed",
            Termination::IterationLimit => "iteration-limit",
        }
    }

    /// The reason in words.
    pub fn reason(&self) -> String {
        match &self.termination {
            Termination::StartNotEvaluable(e) => {
                format!("the starting guess cannot be integrated: {e}")
            }
            Termination::Stalled => format!(
                "stalled: no step along the Newton direction reduces the mismatch {:.3e}",
                self.mismatch
            ),
            Termination::SingularJacobian => "the Jacobian of the mismatch is singular".into(),
            Termination::JacobianFailed(e) => format!("the Jacobian could not be formed: {e}"),
            Termination::ReevaluationFailed(e) => {
                format!("re-evaluation at higher accuracy failed: {e}")
            }
            Termination::IterationLimit => {
                format!("reached the limit of {} iterations", self.iterations)
            }
            Termination::Converged => "converged".into(),
        }
    }

    /// The last guesses in physical units: P_c (dyn cm^-2), T_c (K), R (R_sun), L (L_sun).
    pub fn last_guesses(&self) -> [f64; 4] {
        let u = self.last_unknowns;
        [
            u[0].exp(),
            u[1].exp(),
            u[2].exp() / R_SUN_CM,
            u[3].exp() / L_SUN_ERG_S,
        ]
    }
}

impl fmt::Display for NotConverged {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "the {} M_sun model did not converge", self.mass_msun)?;
        if self.iterations > 0 {
            write!(
                f,
                " after {} iterations (mismatch {:.3e})",
                self.iterations, self.mismatch
            )?;
        }
        write!(f, ": {}", self.reason())
    }
}

impl std::error::Error for NotConverged {}
