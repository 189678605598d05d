//! Library values to Python objects: JSON values (the library's own output schemas) to
//! dicts and lists, rows of records to columns of numpy arrays, and the Python-side
//! containers (`Table`, `Record`) that hold them.

use numpy::PyArray1;
use pyo3::prelude::*;
use pyo3::sync::PyOnceLock;
use pyo3::types::{PyDict, PyFloat, PyList, PyString};
use serde_json::{Map, Value};
use starpoise::units::unit_of;

/// A JSON value as a Python object: null -> None, numbers -> int or float, arrays -> list,
/// objects -> dict (keys in the order the library wrote them).
pub fn to_py<'py>(py: Python<'py>, v: &Value) -> PyResult<Bound<'py, PyAny>> {
    Ok(match v {
        Value::Null => py.None().into_bound(py),
        Value::Bool(b) => b.into_pyobject(py)?.to_owned().into_any(),
        Value::Number(n) => match (n.as_u64(), n.as_i64()) {
            (Some(u), _) => u.into_pyobject(py)?.into_any(),
            (None, Some(i)) => i.into_pyobject(py)?.into_any(),
            _ => PyFloat::new(py, n.as_f64().unwrap_or(f64::NAN)).into_any(),
        },
        Value::String(s) => PyString::new(py, s).into_any(),
        Value::Array(items) => {
            let list = PyList::empty(py);
            for item in items {
                list.append(to_py(py, item)?)?;
            }
            list.into_any()
        }
        Value::Object(map) => dict(py, map)?.into_any(),
    })
}

/// A JSON object as a dict.
pub fn dict<'py>(py: Python<'py>, map: &Map<String, Value>) -> PyResult<Bound<'py, PyDict>> {
    let d = PyDict::new(py);
    for (k, v) in map {
        d.set_item(k, to_py(py, v)?)?;
    }
    Ok(d)
}

/// A serialisable library value as a Python object, through its JSON form.
pub fn serialized<'py, T: serde::Serialize>(
    py: Python<'py>,
    value: &T,
) -> PyResult<Bound<'py, PyAny>> {
    let v = serde_json::to_value(value)
        .map_err(|e| pyo3::exceptions::PyRuntimeError::new_err(e.to_string()))?;
    to_py(py, &v)
}

/// The units of `keys` (see [`starpoise::units`]), as a dict.
pub fn units<'py, 'k>(
    py: Python<'py>,
    keys: impl IntoIterator<Item = &'k str>,
) -> PyResult<Bound<'py, PyDict>> {
    let d = PyDict::new(py);
    for k in keys {
        d.set_item(k, unit_of(k))?;
    }
    Ok(d)
}

/// The column `key` of `rows` as a float64 array (a missing value or null is NaN).
pub fn float_column<'py>(
    py: Python<'py>,
    rows: &[Map<String, Value>],
    key: &str,
) -> Bound<'py, PyArray1<f64>> {
    let values: Vec<f64> = rows
        .iter()
        .map(|r| r.get(key).and_then(Value::as_f64).unwrap_or(f64::NAN))
        .collect();
    PyArray1::from_vec(py, values)
}

/// The column `key` of `rows` as a numpy array of the kind its values have: text (any
/// string) as a list of str (the `Table` makes it a numpy str array), flags as bool, whole
/// numbers with none missing as int64, other numbers as float64 with NaN where missing (as
/// `pandas.read_csv` reads the same CSV column).
pub fn column<'py>(
    py: Python<'py>,
    rows: &[Map<String, Value>],
    key: &str,
) -> PyResult<Bound<'py, PyAny>> {
    let cells: Vec<&Value> = rows
        .iter()
        .map(|r| r.get(key).unwrap_or(&Value::Null))
        .collect();
    if cells.iter().any(|c| c.is_string()) {
        let texts: Vec<&str> = cells.iter().map(|c| c.as_str().unwrap_or("")).collect();
        return Ok(PyList::new(py, texts)?.into_any());
    }
    if !cells.is_empty() && cells.iter().all(|c| c.is_boolean()) {
        let flags: Vec<bool> = cells.iter().map(|c| c.as_bool() == Some(true)).collect();
        return Ok(PyArray1::from_vec(py, flags).into_any());
    }
    let whole: Option<Vec<i64>> = cells.iter().map(|c| c.as_i64()).collect();
    match whole {
        Some(values) if !values.is_empty() => Ok(PyArray1::from_vec(py, values).into_any()),
        _ => Ok(float_column(py, rows, key).into_any()),
    }
}

static TABLE_MODULE: PyOnceLock<Py<PyAny>> = PyOnceLock::new();

/// The class `name` of `starpoise._table` (`Table`, `SequenceTable`, `Record`).
pub fn container<'py>(py: Python<'py>, name: &str) -> PyResult<Bound<'py, PyAny>> {
    let module = TABLE_MODULE.get_or_try_init(py, || {
        Ok::<_, PyErr>(py.import("starpoise._table")?.into_any().unbind())
    })?;
    module.bind(py).getattr(name)
}

/// A `starpoise.Table` of `columns` (name -> array), with `units` and `meta`.
pub fn table<'py>(
    py: Python<'py>,
    class: &str,
    columns: Bound<'py, PyDict>,
    units: Bound<'py, PyDict>,
    meta: Bound<'py, PyDict>,
) -> PyResult<Bound<'py, PyAny>> {
    container(py, class)?.call1((columns, units, meta))
}

/// The Python repr of a float (for the call recorded in the metadata).
pub fn repr_f64(py: Python<'_>, v: f64) -> String {
    PyFloat::new(py, v)
        .repr()
        .map_or_else(|_| v.to_string(), |s| s.to_string())
}

/// The Python repr of a str.
pub fn repr_str(py: Python<'_>, s: &str) -> String {
    PyString::new(py, s)
        .repr()
        .map_or_else(|_| format!("'{s}'"), |r| r.to_string())
}

/// Columns `keys` of the JSON objects `rows`, each a numpy array (see [`column`]).
fn columns<'py>(
    py: Python<'py>,
    keys: &[&str],
    rows: &[Map<String, Value>],
) -> PyResult<Bound<'py, PyDict>> {
    let d = PyDict::new(py);
    for key in keys {
        d.set_item(*key, column(py, rows, key)?)?;
    }
    Ok(d)
}

/// A table (`class` of `starpoise._table`) of the JSON records `rows` under `keys`, with the
/// units read off the keys and `meta`.
pub fn records_table<'py>(
    py: Python<'py>,
    class: &str,
    keys: &[&str],
    rows: &[Map<String, Value>],
    meta: Bound<'py, PyDict>,
) -> PyResult<Bound<'py, PyAny>> {
    let columns = columns(py, keys, rows)?;
    let units = units(py, keys.iter().copied())?;
    table(py, class, columns, units, meta)
}
