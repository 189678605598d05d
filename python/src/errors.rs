//! Library errors as Python exceptions, and the guard that keeps panics and the GIL on the
//! right side of the boundary.
//!
//! - [`Error::InvalidInput`] and [`Error::BadFile`] become `starpoise.InputError` (a
//!   `ValueError`) with the command line's message, the library key replaced by the Python
//!   argument name (as `cli::flag_of` replaces it by the flag);
//! - [`Error::NoConvergence`] becomes `starpoise.ConvergenceError` (a `RuntimeError`) carrying
//!   the status code, the reason, the iteration history and the last guesses;
//! - every other failure (a law or an integration that failed, a panic caught as a last
//!   resort) becomes `starpoise.ComputationError` (a `RuntimeError`).
//!
//! The exception classes are defined in Python (`starpoise/_errors.py`), so that they can
//! inherit from both `starpoise.StarpoiseError` and the built-in class.

use pyo3::prelude::*;
use pyo3::sync::PyOnceLock;
use pyo3::types::{PyDict, PyList, PyType};
use starpoise::structure::NotConverged;
use starpoise::Error;
use std::panic::{catch_unwind, AssertUnwindSafe};

/// Which Python function a call came from: the same library key can be a different argument
/// (`mass_msun` is `mass` in `zams`, `masses` in `sequence`).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Caller {
    /// `starpoise.zams` and the methods of `Star`.
    Zams,
    /// `starpoise.sequence`.
    Sequence,
    /// `starpoise.compare`.
    Compare,
    /// `starpoise.polytrope`.
    Polytrope,
    /// `starpoise.probe`.
    Probe,
    /// `starpoise.limits`.
    Limits,
}

/// The Python argument of a library key, for messages; `None` leaves the key as it is (it is
/// then already the argument's name, or a description such as `guess radius (R_sun)`).
fn argument_of(caller: Caller, key: &str) -> Option<&'static str> {
    Some(match key {
        "mass_msun" => match caller {
            Caller::Sequence | Caller::Compare => "masses",
            _ => "mass",
        },
        "index" => "n",
        "radius_rsun" => "radius",
        "fit_mass_fraction" => "fit_mass",
        "degrees" => "degrees",
        "max_order" => "max_order",
        "preset" => "physics",
        "variant" => "variants",
        _ => return None,
    })
}

/// An error outside the library's own: a panic caught at the boundary.
pub enum Failure {
    /// The library's error.
    Library(Error),
    /// A panic (a bug), with its message.
    Panic(String),
}

impl From<Error> for Failure {
    fn from(e: Error) -> Self {
        Failure::Library(e)
    }
}

/// Run `f` with the GIL released and any panic caught.
pub fn detached<T, F>(py: Python<'_>, f: F) -> Result<T, Failure>
where
    T: Send,
    F: FnOnce() -> starpoise::Result<T> + Send,
{
    py.detach(|| caught(f))
}

/// Run `f` with any panic caught.
pub fn caught<T>(f: impl FnOnce() -> starpoise::Result<T>) -> Result<T, Failure> {
    match catch_unwind(AssertUnwindSafe(f)) {
        Ok(r) => r.map_err(Failure::Library),
        Err(payload) => Err(Failure::Panic(panic_message(payload.as_ref()))),
    }
}

/// The text of a panic's payload.
pub fn panic_message(payload: &(dyn std::any::Any + Send)) -> String {
    payload
        .downcast_ref::<&str>()
        .map(|s| s.to_string())
        .or_else(|| payload.downcast_ref::<String>().cloned())
        .unwrap_or_else(|| "unknown panic".to_string())
}

static ERRORS: PyOnceLock<Py<PyAny>> = PyOnceLock::new();

/// The class `name` of `starpoise._errors`.
fn class<'py>(py: Python<'py>, name: &str) -> PyResult<Bound<'py, PyType>> {
    let module = ERRORS.get_or_try_init(py, || {
        Ok::<_, PyErr>(py.import("starpoise._errors")?.into_any().unbind())
    })?;
    Ok(module.bind(py).getattr(name)?.cast_into()?)
}

/// Raise `class(message, **kwargs)`.
fn raise(py: Python<'_>, name: &str, message: String, kwargs: &Bound<'_, PyDict>) -> PyErr {
    match class(py, name).and_then(|c| c.call((message,), Some(kwargs))) {
        Ok(instance) => PyErr::from_value(instance),
        Err(e) => e,
    }
}

/// The Python exception for `failure` of a call from `caller`.
pub fn to_py(py: Python<'_>, caller: Caller, failure: Failure) -> PyErr {
    match failure {
        Failure::Library(e) => library_error(py, caller, e),
        Failure::Panic(message) => {
            let kwargs = PyDict::new(py);
            raise(
                py,
                "ComputationError",
                format!("internal error (please report it): {message}"),
                &kwargs,
            )
        }
    }
}

fn library_error(py: Python<'_>, caller: Caller, e: Error) -> PyErr {
    let kwargs = PyDict::new(py);
    let filled = (|| -> PyResult<PyErr> {
        Ok(match e {
            Error::InvalidInput {
                name,
                value,
                allowed,
            } => {
                let argument = argument_of(caller, &name).map_or(name, String::from);
                kwargs.set_item("argument", &argument)?;
                kwargs.set_item("value", &value)?;
                kwargs.set_item("allowed", &allowed)?;
                let message = Error::InvalidInput {
                    name: argument,
                    value,
                    allowed,
                }
                .to_string();
                raise(py, "InputError", message, &kwargs)
            }
            Error::BadFile { .. } => raise(py, "InputError", e.to_string(), &kwargs),
            Error::NoConvergence(nc) => {
                fill_convergence(py, &nc, &kwargs)?;
                raise(py, "ConvergenceError", nc.to_string(), &kwargs)
            }
            other => raise(py, "ComputationError", other.to_string(), &kwargs),
        })
    })();
    filled.unwrap_or_else(|err| err)
}

/// The attributes of a `ConvergenceError`.
fn fill_convergence(py: Python<'_>, nc: &NotConverged, kwargs: &Bound<'_, PyDict>) -> PyResult<()> {
    kwargs.set_item("mass_msun", nc.mass_msun)?;
    kwargs.set_item("status", nc.code())?;
    kwargs.set_item("reason", nc.reason())?;
    kwargs.set_item("iterations", nc.iterations)?;
    kwargs.set_item("mismatch", nc.mismatch)?;
    kwargs.set_item("rhs_evaluations", nc.rhs_evaluations)?;
    kwargs.set_item("history", history(py, &nc.history)?)?;
    let [pc, tc, r, l] = nc.last_guesses();
    let last = PyDict::new(py);
    last.set_item("central_pressure_dyn_cm2", pc)?;
    last.set_item("central_temperature_k", tc)?;
    last.set_item("radius_rsun", r)?;
    last.set_item("luminosity_lsun", l)?;
    kwargs.set_item("last_guesses", last)?;
    Ok(())
}

/// A Newton history as a list of `{iteration, mismatch, step_length}` dicts.
pub fn history<'py>(
    py: Python<'py>,
    records: &[starpoise::numerics::newton::IterationRecord],
) -> PyResult<Bound<'py, PyList>> {
    let list = PyList::empty(py);
    for (i, h) in records.iter().enumerate() {
        let d = PyDict::new(py);
        d.set_item("iteration", i + 1)?;
        d.set_item("mismatch", h.residual_norm)?;
        d.set_item("step_length", h.step_length)?;
        list.append(d)?;
    }
    Ok(list)
}

/// Library results as Python results: the error becomes its Python exception.
pub trait OrRaise<T> {
    /// The value, or the Python exception of the failure of a call from `caller`.
    fn or_raise(self, py: Python<'_>, caller: Caller) -> PyResult<T>;
}

impl<T> OrRaise<T> for starpoise::Result<T> {
    fn or_raise(self, py: Python<'_>, caller: Caller) -> PyResult<T> {
        self.map_err(|e| to_py(py, caller, Failure::Library(e)))
    }
}

impl<T> OrRaise<T> for Result<T, Failure> {
    fn or_raise(self, py: Python<'_>, caller: Caller) -> PyResult<T> {
        self.map_err(|f| to_py(py, caller, f))
    }
}

/// For the test suite: raise what the boundary makes of a failure that no argument can
/// provoke: `"physics"`, a law's error outside the shooting iteration, and `"panic"`, a
/// panic in the library (a bug), which is caught and raised as `ComputationError` instead of
/// crossing into Python.
#[pyfunction]
pub fn _check_boundary(py: Python<'_>, kind: &str) -> PyResult<()> {
    let kind = kind.to_string();
    detached(py, move || match kind.as_str() {
        "physics" => Err(Error::Physics(starpoise::error::PhysicsError::new(
            "demo-law",
            "a failure made for the test of the boundary",
            1.0,
            1.0e7,
        ))),
        "panic" => panic!("a panic made for the test of the boundary"),
        other => Err(Error::invalid("kind", other, "physics or panic")),
    })
    .or_raise(py, Caller::Zams)
}
