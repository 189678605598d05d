//! Errors, layered by module and joined upward.
//!
//! A law that is asked outside its domain returns a [`PhysicsError`] carrying the point it was
//! asked at; the structure integrator wraps it with where along a leg it happened; the shooting
//! driver reports a non-converged model with its history. The command line maps every variant to
//! an exit code through [`Error::exit_code`].

use thiserror::Error;

/// A microphysics law was asked about a point it cannot describe, or failed internally.
#[derive(Debug, Clone, PartialEq, Error)]
#[error("{law}: {reason} (at density {rho_g_cm3:.6e} g/cm^3, temperature {temperature_k:.6e} K)")]
pub struct PhysicsError {
    /// Name of the law, as a user selects it.
    pub law: String,
    /// What went wrong, in words.
    pub reason: String,
    /// Density at which the law was evaluated, g cm^-3.
    pub rho_g_cm3: f64,
    /// Temperature at which the law was evaluated, K.
    pub temperature_k: f64,
}

impl PhysicsError {
    /// Build an error for `law` at the point (`rho_g_cm3`, `temperature_k`).
    pub fn new(law: &str, reason: impl Into<String>, rho_g_cm3: f64, temperature_k: f64) -> Self {
        Self {
            law: law.to_string(),
            reason: reason.into(),
            rho_g_cm3,
            temperature_k,
        }
    }
}

/// Every failure the library reports.
#[derive(Debug, Error)]
pub enum Error {
    /// A value given by the user is not allowed. `name` is the flag or key, `allowed` says what is.
    #[error("invalid {name} = {value}: {allowed}")]
    InvalidInput {
        /// The flag or field, e.g. `--index`.
        name: String,
        /// The value as given.
        value: String,
        /// What is allowed, ideally with an example.
        allowed: String,
    },
    /// A file given by the user could not be read or parsed (the message names file and line).
    #[error("{path}: {reason}")]
    BadFile {
        /// The file.
        path: String,
        /// What is wrong, with a line number where one applies.
        reason: String,
    },
    /// A law failed at a point.
    #[error(transparent)]
    Physics(#[from] PhysicsError),
    /// The ODE integrator failed along a leg.
    #[error("integration failed on the {leg} leg at m = {mass_g:.6e} g: {reason}")]
    Integration {
        /// Which leg: "outward", "inward", "atmosphere", "lane-emden".
        leg: &'static str,
        /// Mass coordinate (or independent variable) where it failed.
        mass_g: f64,
        /// The cause.
        reason: String,
    },
    /// The Newton iteration on the fitting-point mismatch did not converge.
    #[error(
        "no convergence after {iterations} iterations (mismatch norm {residual:.3e}): {reason}"
    )]
    NoConvergence {
        /// Iterations done.
        iterations: usize,
        /// Final mismatch norm.
        residual: f64,
        /// Why it stopped.
        reason: String,
    },
    /// The search for oscillation modes of one degree failed: a mode could not be converged,
    /// classified, or the orders asked for could not all be found.
    #[error("mode search for degree {degree}: {reason}")]
    ModeSearch {
        /// Spherical degree l.
        degree: u32,
        /// What went wrong, with the frequency or orders concerned.
        reason: String,
    },
    /// Some models of a grid or comparison did not converge (the others were written).
    #[error("{failed} of {total} models did not converge (see their status)")]
    Incomplete {
        /// Models that did not converge.
        failed: usize,
        /// Models in the run.
        total: usize,
    },
    /// Some of the built-in published checks of `verify` failed.
    #[error("{failed} of the built-in checks failed")]
    VerificationFailed {
        /// How many checks failed.
        failed: usize,
    },
    /// Writing an output file failed.
    #[error("cannot write {path}: {reason}")]
    Io {
        /// The file.
        path: String,
        /// The operating system's message.
        reason: String,
    },
}

impl Error {
    /// Shorthand for [`Error::InvalidInput`].
    pub fn invalid(name: &str, value: impl std::fmt::Display, allowed: &str) -> Self {
        Error::InvalidInput {
            name: name.to_string(),
            value: value.to_string(),
            allowed: allowed.to_string(),
        }
    }

    /// The process exit code for this error: 2 for bad input, 3 for a model that did not
    /// converge or a mode search that failed, 1 for anything else.
    pub fn exit_code(&self) -> i32 {
        match self {
            Error::InvalidInput { .. } | Error::BadFile { .. } => 2,
            Error::NoConvergence { .. } | Error::Incomplete { .. } | Error::ModeSearch { .. } => 3,
            _ => 1,
        }
    }
}

/// Result with the library's error.
pub type Result<T, E = Error> = std::result::Result<T, E>;
