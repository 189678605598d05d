//! `starpoise.sequence` and `starpoise.compare`: many models in parallel (the grid module's
//! runner), with the GIL released and Ctrl-C honoured between models.

use crate::args::{count, law_args, meta, value_list, variants, Call, LawArgs};
use crate::convert;
use crate::errors::{caught, Caller, Failure, OrRaise};
use pyo3::prelude::*;
use pyo3::types::PyDict;
use serde_json::{Map, Value};
use starpoise::grid::fits::{fit_groups, parse_ranges, DEFAULT_FIT_RANGES};
use starpoise::grid::run::{solve_points_until, PointResult, RunSettings};
use starpoise::grid::{Grid, GridPoint, GridRow, Variant};
use starpoise::output::compare::CompareTable;
use starpoise::output::sequence::row_json;
use starpoise::structure::DEFAULT_FIT_MASS_FRACTION;
use starpoise::Error;
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::mpsc;
use std::time::Duration;

/// How often a running grid looks for Ctrl-C (Python's signal handlers run only when asked).
const SIGNAL_POLL: Duration = Duration::from_millis(50);

/// Solve `points` of `grid` on the grid runner's threads with the GIL released. Every
/// [`SIGNAL_POLL`] the calling thread runs Python's signal handlers; if one raises (Ctrl-C's
/// `KeyboardInterrupt`), no further model is started, the models under way finish, and that
/// exception is raised.
fn run_interruptible(
    py: Python<'_>,
    caller: Caller,
    grid: &Grid,
    points: &[GridPoint],
    run: RunSettings,
) -> PyResult<Vec<PointResult>> {
    let stop = AtomicBool::new(false);
    let mut interrupt: Option<PyErr> = None;
    let outcome = py.detach(|| {
        std::thread::scope(|scope| {
            let (tx, rx) = mpsc::channel();
            let stop = &stop;
            scope.spawn(move || {
                let r = caught(|| {
                    solve_points_until(grid, points, &run, &|| {}, &|| stop.load(Ordering::Relaxed))
                });
                // The receiver waits until this arrives or the sender is dropped.
                let _ = tx.send(r);
            });
            loop {
                match rx.recv_timeout(SIGNAL_POLL) {
                    Ok(r) => return r,
                    Err(mpsc::RecvTimeoutError::Timeout) => {
                        if interrupt.is_none() {
                            if let Err(e) = Python::attach(|py| py.check_signals()) {
                                interrupt = Some(e);
                                stop.store(true, Ordering::Relaxed);
                            }
                        }
                    }
                    Err(mpsc::RecvTimeoutError::Disconnected) => {
                        return Err(Failure::Panic(
                            "the grid's thread ended without a result".into(),
                        ))
                    }
                }
            }
        })
    });
    if let Some(e) = interrupt {
        return Err(e);
    }
    match outcome.or_raise(py, caller)? {
        Some(results) => Ok(results),
        None => Err(Failure::Panic(
            "the grid stopped without being interrupted".into(),
        ))
        .or_raise(py, caller),
    }
}

/// The variants as a dict `{name: spec}` (for the metadata).
fn variants_dict<'py>(py: Python<'py>, variants: &[Variant]) -> PyResult<Bound<'py, PyDict>> {
    let d = PyDict::new(py);
    for v in variants {
        d.set_item(&v.name, &v.spec)?;
    }
    Ok(d)
}

/// A grid to solve: the product of the lists, under each variant of the base laws.
struct GridRequest<'a> {
    laws: &'a LawArgs,
    variants: Vec<Variant>,
    masses: &'a [f64],
    xs: &'a [f64],
    zs: &'a [f64],
    fit_mass_fraction: f64,
    threads: i64,
    tolerance: Option<f64>,
}

/// Build and solve the grid of `request` (see [`run_interruptible`]).
fn solve_grid(
    py: Python<'_>,
    caller: Caller,
    request: GridRequest<'_>,
) -> PyResult<(Grid, Vec<PointResult>)> {
    let threads = count(
        "threads",
        request.threads,
        "the number of worker threads must be 0 (one per core) or more",
        Ok,
    )
    .or_raise(py, caller)?;
    let grid = Grid::product(
        &request.laws.overrides().or_raise(py, caller)?,
        request.variants,
        request.masses,
        request.xs,
        request.zs,
        request.fit_mass_fraction,
    )
    .or_raise(py, caller)?;
    let points = grid.select(None);
    let run = RunSettings {
        threads,
        tolerance: request.tolerance,
    };
    let results = run_interruptible(py, caller, &grid, &points, run)?;
    Ok((grid, results))
}

/// Solve a grid of zero-age main-sequence models: masses x compositions x physics variants,
/// in parallel.
///
/// Parameters
/// ----------
/// masses : float, sequence of float or str
///     Masses in solar masses: numbers, or the command line's text (``"0.5,1,2"``, or a
///     range ``"0.1:100:40:log"``).
/// x, z : float, sequence of float or str, optional
///     Hydrogen and metal mass fractions, in the same forms (default 0.70 and 0.02).
/// variants : dict or list of str, optional
///     Physics variants ``{name: spec}`` (or ``["name=spec", ...]``), each overriding the base
///     laws with the command line's ``--variant`` grammar, e.g.
///     ``{"base": "", "hot": "opacity-factor:2", "soft": "rates:power-law:nu=4;alpha:1.5"}``.
///     Default: the base laws alone, named ``base``.
/// physics, eos, opacity, rates, convection, atmosphere, alpha, opacity_factor, rates_factor
///     The base laws, as for ``starpoise.zams``.
/// fit_mass : float, optional
///     Fitting mass as a fraction of M (default 0.4).
/// tolerance : float, optional
///     Finest integrator tolerance (default 1e-11).
/// threads : int
///     Worker threads (0: one per core).
/// fit_ranges : str, optional
///     Mass ranges of the power-law fits, e.g. ``"0.1-0.5,0.5-2"`` (default
///     ``"0.1-0.5,0.5-2,2-20,20-100"``).
///
/// Returns
/// -------
/// SequenceTable
///     One row per model in grid order (variant, Z, X, mass), a numpy array per column of the
///     sequence CSV (``starpoise.SEQUENCE_COLUMNS``): text columns as str arrays, ``converged``
///     as bool, whole-number columns as int64, the others float64. A model that did not
///     converge keeps its row: ``converged`` False, ``status`` and ``reason`` say why, its
///     summary quantities are NaN. ``.fits`` holds the power-law fits of L(M) and R(M);
///     ``.units``, ``.meta``, ``.to_pandas()``, ``.to_astropy()`` as for every table.
///
/// The computation releases the GIL and runs on ``threads`` threads; Ctrl-C stops it between
/// models (raising KeyboardInterrupt).
#[pyfunction]
#[pyo3(signature = (
    masses, x=None, z=None, *, variants=None, physics="refined", eos=None, opacity=None,
    rates=None, convection=None, atmosphere=None, alpha=None, opacity_factor=None,
    rates_factor=None, fit_mass=None, tolerance=None, threads=0, fit_ranges=None
))]
#[allow(clippy::too_many_arguments)]
pub fn sequence<'py>(
    py: Python<'py>,
    masses: &Bound<'py, PyAny>,
    x: Option<&Bound<'py, PyAny>>,
    z: Option<&Bound<'py, PyAny>>,
    variants: Option<&Bound<'py, PyAny>>,
    physics: &str,
    eos: Option<String>,
    opacity: Option<String>,
    rates: Option<String>,
    convection: Option<String>,
    atmosphere: Option<String>,
    alpha: Option<f64>,
    opacity_factor: Option<f64>,
    rates_factor: Option<f64>,
    fit_mass: Option<f64>,
    tolerance: Option<f64>,
    threads: i64,
    fit_ranges: Option<&str>,
) -> PyResult<Bound<'py, PyAny>> {
    let caller = Caller::Sequence;
    let laws = law_args!(
        physics,
        eos,
        opacity,
        rates,
        convection,
        atmosphere,
        alpha,
        opacity_factor,
        rates_factor
    );
    let mut call = Call::new(py, "sequence");
    call.positional(masses.repr()?.to_string())
        .object("x", x)
        .object("z", z)
        .object("variants", variants);
    laws.record(&mut call);
    call.float("fit_mass", fit_mass)
        .float("tolerance", tolerance);
    if threads != 0 {
        call.keyword("threads", threads.to_string());
    }
    call.text("fit_ranges", fit_ranges);

    let masses = value_list(caller, "masses", masses)?;
    let xs = match x {
        Some(x) => value_list(caller, "x", x)?,
        None => vec![0.70],
    };
    let zs = match z {
        Some(z) => value_list(caller, "z", z)?,
        None => vec![0.02],
    };
    let mut variants = self::variants(caller, variants)?;
    if variants.is_empty() {
        variants.push(Variant::base());
    }
    let ranges = match fit_ranges {
        Some(t) => parse_ranges(t).or_raise(py, caller)?,
        None => DEFAULT_FIT_RANGES.to_vec(),
    };
    let (grid, results) = solve_grid(
        py,
        caller,
        GridRequest {
            laws: &laws,
            variants,
            masses: &masses,
            xs: &xs,
            zs: &zs,
            fit_mass_fraction: fit_mass.unwrap_or(DEFAULT_FIT_MASS_FRACTION),
            threads,
            tolerance,
        },
    )?;

    let fingerprint = grid.fingerprint();
    let rows: Vec<GridRow> = results
        .iter()
        .map(|r| GridRow::new(&grid, &fingerprint, r))
        .collect();
    let fits = fit_groups(&rows, &ranges);
    let maps: Vec<Map<String, Value>> = rows
        .iter()
        .filter_map(|r| match row_json(r) {
            Value::Object(m) => Some(m),
            _ => None,
        })
        .collect();
    let meta = meta(py, &call.text_of())?;
    meta.set_item("grid_fingerprint", &fingerprint)?;
    meta.set_item("fit_ranges", convert::serialized(py, &ranges)?)?;
    meta.set_item("variants", variants_dict(py, &grid.variants)?)?;
    let table = convert::records_table(py, "SequenceTable", &GridRow::columns(), &maps, meta)?;
    table.setattr("fits", convert::serialized(py, &fits)?)?;
    Ok(table)
}

/// Solve the same masses under several physics variants and compare each with the first.
///
/// Parameters
/// ----------
/// masses : float, sequence of float or str
///     Masses in solar masses (as for ``starpoise.sequence``).
/// variants : dict or list of str
///     At least two variants ``{name: spec}`` in the ``--variant`` grammar; the first is the
///     reference, e.g. ``{"base": "", "hot": "opacity-factor:2"}``.
/// x, z : float
///     Hydrogen and metal mass fractions.
/// physics, eos, opacity, rates, convection, atmosphere, alpha, opacity_factor, rates_factor
///     The base laws that every variant overrides, as for ``starpoise.zams``.
/// threads : int
///     Worker threads (0: one per core).
///
/// Returns
/// -------
/// Table
///     One row per (mass, variant), the columns of ``starpoise compare --out FILE.csv``: the
///     model's L (L_sun), R (R_sun), Teff (K), T_c (K), rho_c (g/cm^3) and convective-core
///     mass fraction; ``dlog_*_dex`` = log10(Q / Q_reference); the one scale factor varied
///     against the reference and the sensitivities dlog Q / dlog factor (NaN where not
///     applicable). ``.meta`` names the reference, the composition and the variants.
///
/// The computation releases the GIL; Ctrl-C stops it between models.
#[pyfunction]
#[pyo3(signature = (
    masses, variants, x=0.70, z=0.02, *, physics="refined", eos=None, opacity=None,
    rates=None, convection=None, atmosphere=None, alpha=None, opacity_factor=None,
    rates_factor=None, threads=0
))]
#[allow(clippy::too_many_arguments)]
pub fn compare<'py>(
    py: Python<'py>,
    masses: &Bound<'py, PyAny>,
    variants: &Bound<'py, PyAny>,
    x: f64,
    z: f64,
    physics: &str,
    eos: Option<String>,
    opacity: Option<String>,
    rates: Option<String>,
    convection: Option<String>,
    atmosphere: Option<String>,
    alpha: Option<f64>,
    opacity_factor: Option<f64>,
    rates_factor: Option<f64>,
    threads: i64,
) -> PyResult<Bound<'py, PyAny>> {
    let caller = Caller::Compare;
    let laws = law_args!(
        physics,
        eos,
        opacity,
        rates,
        convection,
        atmosphere,
        alpha,
        opacity_factor,
        rates_factor
    );
    let mut call = Call::new(py, "compare");
    call.positional(masses.repr()?.to_string())
        .positional(variants.repr()?.to_string())
        .float("x", Some(x))
        .float("z", Some(z));
    laws.record(&mut call);
    if threads != 0 {
        call.keyword("threads", threads.to_string());
    }

    let masses = value_list(caller, "masses", masses)?;
    let variants = self::variants(caller, Some(variants))?;
    if variants.len() < 2 {
        let names: Vec<String> = variants
            .iter()
            .map(|v| format!("{}={}", v.name, v.spec))
            .collect();
        return Err(Error::invalid(
            "variant",
            names.join(" "),
            "give at least two variants, the first being the reference; e.g. {\"base\": \"\", \"hot\": \"opacity-factor:2\"}",
        ))
        .or_raise(py, caller);
    }
    let composition = starpoise::physics::Composition::new(x, z).or_raise(py, caller)?;
    let (grid, results) = solve_grid(
        py,
        caller,
        GridRequest {
            laws: &laws,
            variants,
            masses: &masses,
            xs: &[composition.x()],
            zs: &[composition.z()],
            fit_mass_fraction: DEFAULT_FIT_MASS_FRACTION,
            threads,
            tolerance: None,
        },
    )?;
    let table = CompareTable::new(&grid, &masses, &results);
    let maps: Vec<Map<String, Value>> = table
        .records
        .iter()
        .filter_map(|r| match serde_json::to_value(r) {
            Ok(Value::Object(m)) => Some(m),
            _ => None,
        })
        .collect();
    let keys: Vec<String> = maps
        .first()
        .map(|m| m.keys().cloned().collect())
        .unwrap_or_default();
    let keys: Vec<&str> = keys.iter().map(String::as_str).collect();
    let meta = meta(py, &call.text_of())?;
    meta.set_item("reference", &table.reference)?;
    crate::args::add_model(py, &meta, &composition, grid.physics[0].spec())?;
    meta.set_item("variants", variants_dict(py, &grid.variants)?)?;
    convert::records_table(py, "Table", &keys, &maps, meta)
}
