//! `starpoise.probe`: every law of a set at one density and temperature.

use crate::args::{law_args, meta, Call, LawArgs};
use crate::convert::{self, repr_f64};
use crate::errors::{detached, Caller, OrRaise};
use pyo3::prelude::*;
use pyo3::types::PyDict;
use starpoise::output::ProbeReport;
use starpoise::physics::{Composition, PhysicsSet};
use starpoise::{Error, Result};

/// Evaluate every law of a physics set at one density and temperature.
///
/// Parameters
/// ----------
/// density_g_cm3 : float
///     Density, g/cm^3 (positive).
/// temperature_k : float
///     Temperature, K (positive).
/// x, z : float
///     Hydrogen and metal mass fractions.
/// physics, eos, opacity, rates, convection, atmosphere, alpha, opacity_factor, rates_factor
///     The laws, as for ``starpoise.zams``.
///
/// Returns
/// -------
/// Record
///     The keys of ``starpoise probe --format json`` as attributes and items (units in the
///     names, see ``.units``): the pressures (``pressure_dyn_cm2``, ``gas_pressure_dyn_cm2``,
///     ``radiation_pressure_dyn_cm2``), ``beta``, ``mu``, ``chi_rho``, ``chi_t``,
///     ``nabla_ad``, ``gamma1``, ``cp_erg_g_k``, ``delta``, ``degeneracy_psi`` (None for a
///     law without electron degeneracy), the ionisation fractions, ``opacity_cm2_g``,
///     ``opacity_laws`` (every opacity law of the catalogue that needs no file, as dicts
///     ``{law, opacity_cm2_g, error}``), ``eps_pp_erg_g_s``, ``eps_cno_erg_g_s``,
///     ``eps_total_erg_g_s``, ``nu_pp``, ``nu_cno``, and ``physics``, ``x``, ``y``, ``z``,
///     ``x_cno``.
///
/// Raises InputError for a point outside the domain of the chosen laws.
#[pyfunction]
#[pyo3(signature = (
    density_g_cm3, temperature_k, x=0.70, z=0.02, *, physics="refined", eos=None,
    opacity=None, rates=None, convection=None, atmosphere=None, alpha=None,
    opacity_factor=None, rates_factor=None
))]
#[allow(clippy::too_many_arguments)]
pub fn probe<'py>(
    py: Python<'py>,
    density_g_cm3: f64,
    temperature_k: f64,
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
) -> PyResult<Bound<'py, PyAny>> {
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
    let mut call = Call::new(py, "probe");
    call.keyword("density_g_cm3", repr_f64(py, density_g_cm3))
        .keyword("temperature_k", repr_f64(py, temperature_k))
        .float("x", Some(x))
        .float("z", Some(z));
    laws.record(&mut call);
    let report = detached(py, || evaluate(density_g_cm3, temperature_k, x, z, &laws))
        .or_raise(py, Caller::Probe)?;
    let values = convert::serialized(py, &report)?.cast_into::<PyDict>()?;
    let keys: Vec<String> = values.keys().extract()?;
    let units = convert::units(py, keys.iter().map(String::as_str))?;
    let meta = meta(py, &call.text_of())?;
    convert::container(py, "Record")?.call1((values, units, meta))
}

/// The report, with the command line's checks (`cli/probe.rs`) in the Python arguments'
/// names: a point outside a law's domain is bad input.
fn evaluate(rho: f64, t: f64, x: f64, z: f64, laws: &LawArgs) -> Result<ProbeReport> {
    if !(rho.is_finite() && rho > 0.0) {
        return Err(Error::invalid(
            "density_g_cm3",
            rho,
            "the density must be a positive number of g/cm^3, e.g. density_g_cm3=150",
        ));
    }
    if !(t.is_finite() && t > 0.0) {
        return Err(Error::invalid(
            "temperature_k",
            t,
            "the temperature must be a positive number of K, e.g. temperature_k=1.57e7",
        ));
    }
    let comp = Composition::new(x, z)?;
    let set = PhysicsSet::from_spec(&laws.spec()?)?;
    ProbeReport::evaluate(rho, t, &comp, &set).map_err(|e| match e {
        Error::Physics(p) => Error::invalid(
            "density_g_cm3/temperature_k",
            format!("{rho:e} g/cm^3, {t:e} K"),
            &format!("outside the domain of the chosen physics: {p}"),
        ),
        other => other,
    })
}
