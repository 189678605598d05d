//! `starpoise._native`: the compiled part of the `starpoise` Python package (PyO3 and numpy).
//!
//! Every computation is the library's own (`starpoise`); this crate turns Python arguments
//! into library inputs with the library's checks, results into Python objects under the
//! names of the JSON keys and CSV columns, and library errors into Python exceptions. The
//! pure-Python part of the package (`python/starpoise/`) holds the exception classes and the
//! containers (`Table`, `Record`) with their pandas and astropy conversions.

mod args;
mod convert;
mod errors;
mod grid;
mod limits;
mod polytrope;
mod probe;
mod star;

use pyo3::prelude::*;
use pyo3::types::PyList;
use starpoise::grid::GridRow;
use starpoise::output::meta::Provenance;
use starpoise::structure::{ModelSummary, PROFILE_COLUMNS};

#[pymodule]
fn _native(m: &Bound<'_, PyModule>) -> PyResult<()> {
    let py = m.py();
    m.add("__version__", Provenance::new("").version)?;
    let fields = PyList::empty(py);
    for f in ModelSummary::FIELDS {
        fields.append((f.key, f.doc, starpoise::units::unit_of(f.key)))?;
    }
    m.add("SUMMARY_FIELDS", fields)?;
    m.add("PROFILE_COLUMNS", PyList::new(py, PROFILE_COLUMNS)?)?;
    m.add("SEQUENCE_COLUMNS", PyList::new(py, GridRow::columns())?)?;
    m.add_function(wrap_pyfunction!(star::zams, m)?)?;
    m.add_function(wrap_pyfunction!(grid::sequence, m)?)?;
    m.add_function(wrap_pyfunction!(grid::compare, m)?)?;
    m.add_function(wrap_pyfunction!(polytrope::polytrope, m)?)?;
    m.add_function(wrap_pyfunction!(probe::probe, m)?)?;
    m.add_function(wrap_pyfunction!(limits::limits, m)?)?;
    m.add_class::<star::Star>()?;
    m.getattr("Star")?
        .setattr("__doc__", star::Star::documentation())?;
    m.add_function(wrap_pyfunction!(errors::_check_boundary, m)?)?;
    Ok(())
}
