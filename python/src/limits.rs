//! `starpoise.limits`: the hydrogen-burning minimum mass and the pulsational instability mass
//! for a composition and set of laws.

use crate::args::{law_args, meta, Call, LawArgs};
use crate::convert;
use crate::errors::{detached, Caller, OrRaise};
use pyo3::prelude::*;
use pyo3::types::PyDict;
use starpoise::oscillation::{pulsational_instability_mass, PulsationalLimit};
use starpoise::output::limits::limits_json;
use starpoise::output::meta::Provenance;
use starpoise::physics::{Composition, PhysicsSet};
use starpoise::structure::limits::{hydrogen_burning_limit, HydrogenBurningLimit};
use starpoise::Result;

/// The mass limits of the main sequence for a composition and set of laws (as
/// ``starpoise limits``; takes several seconds).
///
/// Parameters
/// ----------
/// x, z : float
///     Hydrogen and metal mass fractions.
/// physics, eos, opacity, rates, convection, atmosphere, alpha, opacity_factor, rates_factor
///     The laws, as for ``starpoise.zams`` (the ``analytic`` set does not describe stars near
///     the hydrogen-burning limit and is refused).
///
/// Returns
/// -------
/// Record
///     The keys of ``starpoise limits --format json`` (units in the names, see ``.units``):
///     ``hydrogen_burning_minimum_mass_msun`` (the turning point of the ZAMS branch in mass, or
///     the lowest mass the laws reach when they fail just before it), ``turning_point_estimate_msun``
///     and ``stopped_by`` (None when the turning point was reached; else the turning point
///     extrapolated beyond the laws' domain, an estimate, and why the laws failed),
///     ``limiting_model`` (dict: the summary of the model at the limit),
///     ``pulsational_instability_mass_msun`` (above it the radial fundamental mode is
///     vibrationally unstable, quasi-adiabatic; None if stable up to 150 M_sun),
///     ``pulsational_search`` (the models evaluated), ``physics``, ``x``, ``y``, ``z``.
///
/// Raises InputError for a bad composition or law, RuntimeError if a limit cannot be found.
#[pyfunction]
#[pyo3(signature = (
    x=0.70, z=0.02, *, physics="refined", eos=None, opacity=None, rates=None,
    convection=None, atmosphere=None, alpha=None, opacity_factor=None, rates_factor=None
))]
#[allow(clippy::too_many_arguments)]
pub fn limits<'py>(
    py: Python<'py>,
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
    let mut call = Call::new(py, "limits");
    call.float("x", Some(x)).float("z", Some(z));
    laws.record(&mut call);
    let (limit, pulsation) = detached(py, || compute(x, z, &laws)).or_raise(py, Caller::Limits)?;
    let command = call.text_of();
    let json = limits_json(&limit, &pulsation, &Provenance::new(command.clone()));
    let values = convert::to_py(py, &json)?.cast_into::<PyDict>()?;
    values.del_item("meta")?;
    let keys: Vec<String> = values.keys().extract()?;
    let units = convert::units(py, keys.iter().map(String::as_str))?;
    let meta = meta(py, &command)?;
    convert::container(py, "Record")?.call1((values, units, meta))
}

/// Both limits, as `starpoise limits` computes them.
fn compute(x: f64, z: f64, laws: &LawArgs) -> Result<(HydrogenBurningLimit, PulsationalLimit)> {
    let comp = Composition::new(x, z)?;
    let set = PhysicsSet::from_spec(&laws.spec()?)?;
    let limit = hydrogen_burning_limit(&comp, &set)?;
    let pulsation = pulsational_instability_mass(&comp, &set)?;
    Ok((limit, pulsation))
}
