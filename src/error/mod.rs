//! Errors, layered by module and joined upward, each carrying the numbers needed to diagnose it.
//!
//! - [`PhysicsError`]: a law asked at a point it cannot describe (law, rho, T, what failed);
//! - [`LegError`]: an integration leg that failed (which leg, where in x and in
//!   mass, the physics error or the integrator's reason);
//! - [`NotConverged`]: the shooting iteration stopped without converging (the
//!   termination reason, iterations, mismatch, history);
//! - [`enum@Error`]: what the library returns, with its process exit code ([`ExitCode`]).
//!
//! Library errors name model-file keys (`mass_msun`, `opacity`), never command-line flags: the
//! command line maps keys to its flags.

use thiserror::Error;

mod solve;
pub use solve::{LegCause, LegError, LegName, NotConverged};

/// A microphysics law was asked about a point it cannot describe, or failed internally.
#[derive(Debug, Clone, PartialEq, Error)]
#[error("{law}: {reason} (at density {rho_g_cm3:.6e} g/cm^3, temperature {temperature_k:.6e} K)")]
pub struct PhysicsError {
    /// Name of the law, as a user selects it.
    pub law: String,
    /// What went wrong, in words.
    pub reason: String,
    /// Density at which the law was evaluated, g cm^-3 (NaN where not yet known, e.g. during
    /// the inversion rho(P, T)).
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

impl From<crate::numerics::invalid::InvalidSetting> for Error {
    fn from(e: crate::numerics::invalid::InvalidSetting) -> Self {
        Error::invalid(&e.name, e.value, &e.allowed)
    }
}

/// Process exit codes of the command line, one per class of outcome.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[repr(i32)]
pub enum ExitCode {
    /// Success.
    Success = 0,
    /// Any other failure (including a failed `verify`).
    Failure = 1,
    /// Bad input: the message names the value and what is allowed; no file is written.
    BadInput = 2,
    /// A model did not converge (or some models of a grid did not).
    NotConverged = 3,
}

/// Every failure the library reports.
#[derive(Debug, Clone, Error)]
#[non_exhaustive]
pub enum Error {
    /// A value given by the user is not allowed. `name` is the model-file key (or the name of the
    /// argument), `allowed` says what is.
    #[error("invalid {name} = {value}: {allowed}")]
    InvalidInput {
        /// The key, e.g. `mass_msun`.
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
    /// An integration leg of the structure solver failed.
    #[error(transparent)]
    Leg(#[from] LegError),
    /// Another integration failed (Lane–Emden).
    #[error("integration failed ({what}) at {variable} = {at:.6e}: {reason}")]
    Integration {
        /// Which integration.
        what: &'static str,
        /// Name of the independent variable.
        variable: &'static str,
        /// Its value where the integration failed.
        at: f64,
        /// The cause.
        reason: String,
    },
    /// The shooting iteration for a model did not converge.
    #[error(transparent)]
    NoConvergence(#[from] Box<NotConverged>),
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
    /// The reader of standard output (or of a FIFO) went away before everything was written
    /// (e.g. `starpoise zams | head -c 5`). The command line ends quietly, as a filter ended by
    /// SIGPIPE does.
    #[error("{path}: the reader closed it")]
    OutputClosed {
        /// The output.
        path: String,
    },
    /// Writing an output failed.
    #[error("cannot write {path}: {reason}")]
    Io {
        /// The file.
        path: String,
        /// The operating system's message.
        reason: String,
    },
}

impl Error {
    /// Shorthand for [`Error::InvalidInput`]. A number is shown in the shorter of its plain
    /// and exponent forms (`1e-10`, not `0.0000000001`), so that the message shows the value
    /// as a user would write it.
    pub fn invalid(name: &str, value: impl std::fmt::Display, allowed: &str) -> Self {
        Error::InvalidInput {
            name: name.to_string(),
            value: compact_number(value.to_string()),
            allowed: allowed.to_string(),
        }
    }

    /// The process exit code for this error.
    pub fn exit_code(&self) -> ExitCode {
        match self {
            Error::InvalidInput { .. } | Error::BadFile { .. } => ExitCode::BadInput,
            Error::NoConvergence(_) | Error::Incomplete { .. } | Error::ModeSearch { .. } => {
                ExitCode::NotConverged
            }
            _ => ExitCode::Failure,
        }
    }
}

/// `text` in exponent form if it is a number with a fraction or more than 15 digits whose
/// exponent form is at least two characters shorter (`1e300` for a 301-digit integer,
/// `-1e-10` for `-0.0000000001`), else unchanged (a count such as `1000000` stays as typed).
fn compact_number(text: String) -> String {
    let long = text.contains('.') || text.len() > 15;
    match text.parse::<f64>() {
        Ok(v) if v.is_finite() && long => {
            let exponent = format!("{v:e}");
            if exponent.len() + 2 <= text.len() {
                exponent
            } else {
                text
            }
        }
        _ => text,
    }
}

/// Result with the library's error.
pub type Result<T, E = Error> = std::result::Result<T, E>;

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_in_messages_are_compact() {
        let shown = |v: f64| match Error::invalid("k", v, "") {
            Error::InvalidInput { value, .. } => value,
            _ => unreachable!(),
        };
        assert_eq!(shown(-1e-10), "-1e-10");
        assert_eq!(shown(1e300), "1e300");
        assert_eq!(shown(0.02), "0.02");
        assert_eq!(shown(150.0), "150");
        assert_eq!(shown(0.001), "0.001");
        assert_eq!(shown(1.5e-7), "1.5e-7");
        assert_eq!(shown(1e6), "1000000");
    }
}
