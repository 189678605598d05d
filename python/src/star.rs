//! `starpoise.zams` and the `Star` it returns.

use crate::args::{count, law_args, meta, Call, LawArgs};
use crate::convert::{self, float_column};
use crate::errors::{detached, history, Caller, Failure, OrRaise};
use pyo3::exceptions::PyAttributeError;
use pyo3::prelude::*;
use pyo3::types::{PyDict, PyList};
use starpoise::oscillation::{checked_degrees, star_modes, OscillationSettings};
use starpoise::output::meta::Provenance;
use starpoise::output::modes::{zams_modes_report, ModesReport, ModesRequestMeta, MODE_COLUMNS};
use starpoise::output::zams::{failure_json, summary_json};
use starpoise::physics::{Composition, PhysicsSet};
use starpoise::structure::{
    profile::check_profile_points, solve, ModelSummary, ZamsModel, ZamsSettings,
    DEFAULT_PROFILE_POINTS, PROFILE_COLUMNS,
};
use starpoise::{Error, Result};

/// The report of `starpoise modes --mass` for `model`, with the arguments of `Star.modes`
/// checked in their names.
fn modes_report(
    model: &ZamsModel,
    degrees: &[i64],
    max_order: i64,
    points: i64,
    cowling: bool,
    command: String,
) -> Result<ModesReport> {
    let (degrees, max_order) = checked_degrees(degrees, max_order)?;
    let points = count("points", points, "", check_profile_points)?;
    let settings = OscillationSettings::default().with_cowling(cowling);
    let spectrum = star_modes(model, points, &degrees, max_order, &settings)?;
    Ok(zams_modes_report(
        model,
        &spectrum,
        ModesRequestMeta {
            provenance: Provenance::new(command),
            degrees,
            max_order,
            cowling,
            profile_points: points,
            phase_per_step: settings.phase_per_step(),
        },
    ))
}

/// The first part of `Star.__doc__` (the rest lists the summary quantities).
const STAR_DOC: &str = "A converged zero-age main-sequence model (made by starpoise.zams).

Every key of `starpoise zams --format json` is an attribute, named as in the JSON (units in
the names, see .units): mass_msun, x, y, z, physics (dict), converged, iterations,
fit_mismatch, fit_mass_fraction, the summary quantities below (floats; central_degeneracy is
NaN for a law without electron degeneracy, he3_equilibrium_time_yr for a rates law without 3He
reactions) and rhs_evaluations. summary() gives them as the
JSON's dict, profile(points=400) the profile as a Table, meta what made the model, history
the Newton iterations.";

/// Build a zero-age main-sequence model of the given mass.
///
/// Parameters
/// ----------
/// mass : float
///     Stellar mass in solar masses (0.05 to 150).
/// x, z : float
///     Hydrogen and metal mass fractions (Y = 1 - X - Z).
/// physics : str
///     The preset the laws start from: ``"refined"`` or ``"analytic"``.
/// eos, opacity, rates, convection, atmosphere : str, optional
///     One law of each kind, in the command line's grammar ``NAME[:KEY=VALUE,...]``, e.g.
///     ``opacity="kramers:guillotine=1"`` or ``opacity="table:models/demo-opacity.csv"``.
/// alpha : float, optional
///     Mixing-length parameter of the ``mlt`` convection law (default 1.8).
/// opacity_factor, rates_factor : float, optional
///     Factors multiplying the opacity and the nuclear energy generation (default 1).
/// fit_mass : float, optional
///     Fitting mass as a fraction of M (default 0.4).
/// tolerance : float, optional
///     Finest integrator tolerance (default 1e-11).
/// max_iterations : int, optional
///     Newton iteration limit (default 60).
/// guess : sequence of 4 floats, optional
///     Starting guesses: central pressure (dyn/cm^2), central temperature (K), radius (R_sun),
///     luminosity (L_sun).
///
/// Returns
/// -------
/// Star
///     The converged model: every key of ``starpoise zams --format json`` is an attribute
///     (``star.luminosity_lsun``, ``star.teff_k``, ...; units in the names, see
///     ``star.units``), ``star.summary()`` is that JSON object as a dict and
///     ``star.profile(points=400)`` the profile as a table of numpy arrays.
///
/// Raises
/// ------
/// InputError
///     A value is not allowed (the message names the argument and what is allowed).
/// ConvergenceError
///     The model did not converge (``.status``, ``.reason``, ``.history``, ``.summary``).
/// ComputationError
///     A law or an integration failed.
///
/// The computation releases the GIL.
#[pyfunction]
#[pyo3(signature = (
    mass, x=0.70, z=0.02, *, physics="refined", eos=None, opacity=None, rates=None,
    convection=None, atmosphere=None, alpha=None, opacity_factor=None, rates_factor=None,
    fit_mass=None, tolerance=None, max_iterations=None, guess=None
))]
#[allow(clippy::too_many_arguments)]
pub fn zams(
    py: Python<'_>,
    mass: f64,
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
    fit_mass: Option<f64>,
    tolerance: Option<f64>,
    max_iterations: Option<i64>,
    guess: Option<Vec<f64>>,
) -> PyResult<Star> {
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
    let mut call = Call::new(py, "zams");
    call.positional(convert::repr_f64(py, mass))
        .float("x", Some(x))
        .float("z", Some(z));
    laws.record(&mut call);
    call.float("fit_mass", fit_mass)
        .float("tolerance", tolerance);
    if let Some(n) = max_iterations {
        call.keyword("max_iterations", n.to_string());
    }
    if let Some(g) = &guess {
        let items: Vec<String> = g.iter().map(|v| convert::repr_f64(py, *v)).collect();
        call.keyword("guess", format!("({})", items.join(", ")));
    }
    let settings = settings(
        mass,
        x,
        z,
        &laws,
        fit_mass,
        tolerance,
        max_iterations,
        guess,
    )
    .or_raise(py, Caller::Zams)?;
    match detached(py, || solve(&settings)) {
        Ok(model) => Star::new(py, model, call.text_of()),
        Err(Failure::Library(Error::NoConvergence(nc))) => {
            let summary = convert::to_py(py, &failure_json(&settings, &nc))?;
            let err = Err::<(), _>(Error::NoConvergence(nc))
                .or_raise(py, Caller::Zams)
                .unwrap_err();
            err.value(py).setattr("summary", summary)?;
            Err(err)
        }
        Err(f) => Err(f).or_raise(py, Caller::Zams),
    }
}

// The default of `Star.profile(points=400)` (written out so that help() shows it).
const _: () = assert!(DEFAULT_PROFILE_POINTS == 400);

/// The settings of one model, checked by the library (errors name its keys).
#[allow(clippy::too_many_arguments)]
fn settings(
    mass: f64,
    x: f64,
    z: f64,
    laws: &LawArgs,
    fit_mass: Option<f64>,
    tolerance: Option<f64>,
    max_iterations: Option<i64>,
    guess: Option<Vec<f64>>,
) -> Result<ZamsSettings> {
    let composition = Composition::new(x, z)?;
    let physics = PhysicsSet::from_spec(&laws.spec()?)?;
    let mut s = ZamsSettings::new(mass, composition, physics)?;
    if let Some(q) = fit_mass {
        s = s.with_fit_mass_fraction(q)?;
    }
    if let Some(t) = tolerance {
        s = s.with_tolerance(t)?;
    }
    if let Some(n) = max_iterations {
        s = count("max_iterations", n, "", |n| {
            s.clone().with_max_iterations(n)
        })?;
    }
    if let Some(g) = guess {
        let [pc, tc, r, l] = <[f64; 4]>::try_from(g.as_slice()).map_err(|_| {
            Error::invalid(
                "guess",
                format!("{g:?}"),
                "give four starting guesses: central pressure (dyn/cm^2), central temperature (K), radius (R_sun), luminosity (L_sun), e.g. (1.5e17, 1.3e7, 0.9, 0.7)",
            )
        })?;
        s = s.with_guess(pc, tc, r, l)?;
    }
    Ok(s)
}

/// A converged zero-age main-sequence model (made by ``starpoise.zams``).
#[pyclass(frozen, module = "starpoise", name = "Star")]
pub struct Star {
    model: ZamsModel,
    summary: Py<PyDict>,
    call: String,
}

impl Star {
    /// The class documentation with every summary quantity listed from
    /// `ModelSummary::FIELDS` (set on the class when the module is loaded).
    pub fn documentation() -> String {
        let mut doc = String::from(STAR_DOC);
        doc.push_str("\n\nSummary quantities (floats, from the library's one list)\n");
        doc.push_str("--------------------------------------------------------\n");
        for f in ModelSummary::FIELDS {
            let unit = starpoise::units::unit_of(f.key);
            let unit = if unit.is_empty() {
                String::new()
            } else {
                format!(" [{unit}]")
            };
            doc.push_str(&format!("{}{unit}\n    {}\n", f.key, f.doc));
        }
        doc
    }

    fn new(py: Python<'_>, model: ZamsModel, call: String) -> PyResult<Self> {
        let summary = convert::to_py(py, &summary_json(&model))?
            .cast_into::<PyDict>()?
            .unbind();
        Ok(Self {
            model,
            summary,
            call,
        })
    }

    /// The metadata of an output of this model made by `command`.
    fn meta_of<'py>(&self, py: Python<'py>, command: &str) -> PyResult<Bound<'py, PyDict>> {
        let m = meta(py, command)?;
        m.set_item("mass_msun", self.model.mass_msun())?;
        crate::args::add_model(py, &m, self.model.composition(), self.model.physics())?;
        Ok(m)
    }
}

#[pymethods]
impl Star {
    fn __getattr__(&self, py: Python<'_>, name: &str) -> PyResult<Py<PyAny>> {
        if let Some(i) = ModelSummary::FIELDS.iter().position(|f| f.key == name) {
            let v = self.model.summary.values()[i];
            return Ok(v.into_pyobject(py)?.into_any().unbind());
        }
        match self.summary.bind(py).get_item(name)? {
            Some(v) => Ok(v.unbind()),
            None => Err(PyAttributeError::new_err(format!(
                "'Star' object has no attribute '{name}' (the attributes are the keys of summary())"
            ))),
        }
    }

    fn __dir__<'py>(slf: &Bound<'py, Self>) -> PyResult<Bound<'py, PyList>> {
        let py = slf.py();
        let names = py
            .import("builtins")?
            .getattr("object")?
            .getattr("__dir__")?
            .call1((slf,))?
            .cast_into::<PyList>()?;
        for key in slf.get().summary.bind(py).keys() {
            names.append(key)?;
        }
        Ok(names)
    }

    /// Every key of ``starpoise zams --format json`` with the same value, as a new dict
    /// (non-finite values are None, as null in the JSON).
    fn summary<'py>(&self, py: Python<'py>) -> PyResult<Bound<'py, PyDict>> {
        self.summary.bind(py).copy()
    }

    /// The profile on ``points`` rows (10 to 100000), centre first, photosphere last.
    ///
    /// Returns a ``starpoise.Table``: one numpy float64 array per column of the profile CSV
    /// (``starpoise.PROFILE_COLUMNS``: ``mass_g``, ``m_over_M``, ``radius_cm``, ``r_over_R``,
    /// ``pressure_dyn_cm2``, ``temperature_k``, ``density_g_cm3``, ``luminosity_erg_s``, ...),
    /// with ``.units`` and ``.meta``; ``.to_pandas()`` and ``.to_astropy()`` convert it.
    /// The computation releases the GIL.
    #[pyo3(signature = (points=400))]
    fn profile<'py>(&self, py: Python<'py>, points: i64) -> PyResult<Bound<'py, PyAny>> {
        let model = &self.model;
        let rows = detached(py, || {
            count("points", points, "", check_profile_points).and_then(|n| model.profile(n))
        })
        .or_raise(py, Caller::Zams)?;
        let maps = rows
            .iter()
            .map(|r| match serde_json::to_value(r) {
                Ok(serde_json::Value::Object(m)) => Ok(m),
                _ => Err(pyo3::exceptions::PyRuntimeError::new_err(
                    "a profile row is not an object",
                )),
            })
            .collect::<PyResult<Vec<_>>>()?;
        let columns = PyDict::new(py);
        for key in PROFILE_COLUMNS {
            columns.set_item(key, float_column(py, &maps, key))?;
        }
        let units = convert::units(py, PROFILE_COLUMNS)?;
        let meta = self.meta_of(py, &format!("{}.profile(points={points})", self.call))?;
        convert::table(py, "Table", columns, units, meta)
    }

    /// The oscillation modes of this model (as ``starpoise modes --mass``): linear adiabatic
    /// radial and non-radial p, f and g modes of the degrees asked up to order ``max_order``,
    /// from the full fourth-order problem (``cowling=True``: without the perturbation of the
    /// potential for l >= 1), read from the model's profile on ``points`` rows.
    ///
    /// Parameters
    /// ----------
    /// degrees : sequence of int
    ///     Spherical degrees l, each 0 to 1000.
    /// max_order : int
    ///     Highest order: radial and p modes up to n = max_order, g modes down to -max_order
    ///     (1 to 1000).
    /// points : int
    ///     Profile rows of the oscillation model (10 to 100000).
    /// cowling : bool
    ///     Neglect the potential perturbation for l >= 1.
    ///
    /// Returns
    /// -------
    /// ModesTable
    ///     One row per mode, columns as the objects of ``modes`` in ``starpoise modes --format
    ///     json``: ``degree``, ``order`` (Eckart-Scuflaire-Osaki: radial fundamental 1, f modes
    ///     0, g modes negative), ``kind`` (p, f, g), ``sigma`` = omega sqrt(R^3/(G M)),
    ///     ``sigma_squared``, ``cyclic_frequency`` = sigma/(2 pi), ``frequency_uhz``,
    ///     ``inertia`` (normalised at the photosphere), ``growth_rate_per_s`` and
    ///     ``growth_per_radian`` (quasi-adiabatic, radial modes; NaN for l > 0). ``.seismic``
    ///     holds the separations, asymptotic quantities and solar-scaled relations (the other
    ///     keys of the JSON report), ``.meta`` what was computed.
    #[pyo3(signature = (degrees=vec![0, 1, 2, 3], max_order=25, points=2000, cowling=false))]
    fn modes<'py>(
        &self,
        py: Python<'py>,
        degrees: Vec<i64>,
        max_order: i64,
        points: i64,
        cowling: bool,
    ) -> PyResult<Bound<'py, PyAny>> {
        let command = format!(
            "{}.modes(degrees={degrees:?}, max_order={max_order}, points={points}, cowling={})",
            self.call,
            if cowling { "True" } else { "False" }
        );
        let model = &self.model;
        let report = detached(py, || {
            modes_report(model, &degrees, max_order, points, cowling, command.clone())
        })
        .or_raise(py, Caller::Zams)?;
        let json = serde_json::to_value(&report)
            .map_err(|e| pyo3::exceptions::PyRuntimeError::new_err(format!("modes report: {e}")))?;
        let serde_json::Value::Object(mut top) = json else {
            return Err(pyo3::exceptions::PyRuntimeError::new_err(
                "the modes report is not an object",
            ));
        };
        let rows: Vec<serde_json::Map<String, serde_json::Value>> = match top.remove("modes") {
            Some(serde_json::Value::Array(items)) => items
                .into_iter()
                .filter_map(|v| match v {
                    serde_json::Value::Object(m) => Some(m),
                    _ => None,
                })
                .collect(),
            _ => Vec::new(),
        };
        let meta_value = top.remove("meta").unwrap_or(serde_json::Value::Null);
        let meta = match convert::to_py(py, &meta_value)?.cast_into::<PyDict>() {
            Ok(d) => d,
            Err(_) => PyDict::new(py),
        };
        let table = convert::records_table(py, "ModesTable", &MODE_COLUMNS, &rows, meta)?;
        table.setattr("seismic", convert::dict(py, &top)?)?;
        Ok(table)
    }

    /// What made this model: program, version, the Python call (``command``), the constants'
    /// sources, the mass, the composition (x, y, z) and the laws (``physics``, round-trippable:
    /// each value is accepted by the argument of the same name).
    #[getter]
    fn meta<'py>(&self, py: Python<'py>) -> PyResult<Bound<'py, PyDict>> {
        self.meta_of(py, &self.call)
    }

    /// The unit of every attribute (astropy's unit grammar; ``""`` for a pure number).
    #[getter]
    fn units<'py>(&self, py: Python<'py>) -> PyResult<Bound<'py, PyDict>> {
        let keys: Vec<String> = self
            .summary
            .bind(py)
            .keys()
            .iter()
            .map(|k| k.extract::<String>())
            .collect::<PyResult<_>>()?;
        convert::units(py, keys.iter().map(String::as_str))
    }

    /// The Newton iterations: a list of ``{iteration, mismatch, step_length}`` dicts.
    #[getter]
    fn history<'py>(&self, py: Python<'py>) -> PyResult<Bound<'py, PyList>> {
        history(py, &self.model.history)
    }

    fn __repr__(&self) -> String {
        let s = &self.model.summary;
        let c = self.model.composition();
        format!(
            "<Star {} M_sun, X = {}, Z = {}, {}: L = {:.6} L_sun, R = {:.6} R_sun, Teff = {:.1} K>",
            self.model.mass_msun(),
            c.x(),
            c.z(),
            self.model.physics().preset,
            s.luminosity_lsun,
            s.radius_rsun,
            s.teff_k
        )
    }
}
