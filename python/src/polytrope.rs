//! `starpoise.polytrope`: a Lane–Emden polytrope, optionally scaled to a star.

use crate::args::{count, meta, Call};
use crate::convert::{self, repr_f64};
use crate::errors::{detached, Caller, OrRaise};
use numpy::PyArray1;
use pyo3::prelude::*;
use pyo3::types::PyDict;
use starpoise::output::polytrope::PolytropeSummary;
use starpoise::polytrope::{
    scale_to_star, solve_lane_emden, validate_index, validate_scaling, LaneEmdenSettings,
    LaneEmdenSolution, ScaledPolytrope, StarParameters, DEFAULT_MU,
};
use starpoise::{Error, Result};

/// Solve the Lane–Emden equation of index ``n``, optionally scaled to a star.
///
/// Parameters
/// ----------
/// n : float
///     Polytropic index, 0 <= n <= 5.
/// mass, radius : float, optional
///     Scale to a star of this mass (M_sun) and radius (R_sun); give both or neither.
/// mu : float, optional
///     Mean molecular weight for the central temperature (default 0.61; needs mass and radius).
/// radiation : bool
///     Eddington's standard model: radiation pressure with constant beta = P_gas/P (n = 3 only;
///     needs mass and radius).
/// points : int
///     Profile points from the centre to the surface inclusive (2 to 1000000).
///
/// Returns
/// -------
/// Polytrope
///     A Record of the keys of ``starpoise polytrope --format json``, as attributes and items: ``xi1``,
///     ``dtheta_dxi_at_xi1``, ``omega_n``, ``rho_c_over_rho_mean``, ``w_n``,
///     ``potential_energy_coefficient``, ``theta_n`` (dimensionless; None where infinite or
///     undefined, for n = 5), ``points``, and for a star ``mass_msun``, ``radius_rsun``, ``mu``,
///     ``mass_g``, ``radius_cm``, ``central_density_g_cm3``, ``central_pressure_dyn_cm2``,
///     ``central_temperature_k``, ``potential_energy_erg`` and (with radiation) ``beta``.
///     ``.profile`` is a Table of ``xi``, ``theta``, ``dtheta_dxi`` and, for a star, the
///     columns of the profile CSV (``radius_cm``, ``r_over_R``, ``mass_g``, ``m_over_M``,
///     ``density_g_cm3``, ``pressure_dyn_cm2``, ``temperature_k``).
#[pyfunction]
#[pyo3(signature = (n, *, mass=None, radius=None, mu=None, radiation=false, points=200))]
pub fn polytrope<'py>(
    py: Python<'py>,
    n: f64,
    mass: Option<f64>,
    radius: Option<f64>,
    mu: Option<f64>,
    radiation: bool,
    points: i64,
) -> PyResult<Bound<'py, PyAny>> {
    let caller = Caller::Polytrope;
    let mut call = Call::new(py, "polytrope");
    call.positional(repr_f64(py, n))
        .float("mass", mass)
        .float("radius", radius)
        .float("mu", mu);
    if radiation {
        call.keyword("radiation", "True".into());
    }
    if points != 200 {
        call.keyword("points", points.to_string());
    }
    let (index, settings, star) =
        request(n, mass, radius, mu, radiation, points).or_raise(py, caller)?;
    let (solution, scaled) = detached(py, || {
        let solution = solve_lane_emden(index, &settings)?;
        let scaled = match &star {
            Some(s) => Some(scale_to_star(&solution, s, radiation)?),
            None => None,
        };
        Ok((solution, scaled))
    })
    .or_raise(py, caller)?;
    let summary = PolytropeSummary::new(&solution, scaled.as_ref());
    let values = convert::serialized(py, &summary)?.cast_into::<PyDict>()?;
    let keys: Vec<String> = values.keys().extract()?;
    let units = convert::units(py, keys.iter().map(String::as_str))?;
    let meta = meta(py, &call.text_of())?;
    let (columns, column_units) = profile_columns(py, &solution, scaled.as_ref())?;
    let profile = convert::table(py, "Table", columns, column_units, meta.copy()?)?;
    convert::container(py, "Polytrope")?.call1((values, units, meta, profile))
}

/// The checked request, with the command line's rules (`cli/polytrope.rs`) in the Python
/// arguments' names.
fn request(
    n: f64,
    mass: Option<f64>,
    radius: Option<f64>,
    mu: Option<f64>,
    radiation: bool,
    points: i64,
) -> Result<(f64, LaneEmdenSettings, Option<StarParameters>)> {
    let index = validate_index(n)?;
    let settings = count("points", points, "", |p| {
        LaneEmdenSettings::default().with_points(p)
    })?;
    let star = match (mass, radius) {
        (Some(m), Some(r)) => Some(StarParameters::new(m, r, mu.unwrap_or(DEFAULT_MU))?),
        (None, None) => None,
        (Some(_), None) => {
            return Err(Error::invalid(
                "radius",
                "(missing)",
                "mass needs radius, e.g. mass=1, radius=1",
            ))
        }
        (None, Some(_)) => {
            return Err(Error::invalid(
                "mass",
                "(missing)",
                "radius needs mass, e.g. mass=1, radius=1",
            ))
        }
    };
    if star.is_none() && mu.is_some() {
        return Err(Error::invalid(
            "mu",
            mu.unwrap_or_default(),
            "the mean molecular weight sets the central temperature of a star: add mass and radius",
        ));
    }
    if star.is_some() || radiation {
        validate_scaling(index, radiation)?;
    }
    if radiation && star.is_none() {
        return Err(Error::invalid(
            "radiation",
            "without mass and radius",
            "Eddington's standard model needs the star: add mass and radius",
        ));
    }
    Ok((index, settings, star))
}

/// The profile's columns and their units: dimensionless, then the star's if scaled.
fn profile_columns<'py>(
    py: Python<'py>,
    solution: &LaneEmdenSolution,
    scaled: Option<&ScaledPolytrope>,
) -> PyResult<(Bound<'py, PyDict>, Bound<'py, PyDict>)> {
    let columns = PyDict::new(py);
    let put = |key: &str, values: Vec<f64>| columns.set_item(key, PyArray1::from_vec(py, values));
    let p = &solution.profile;
    put("xi", p.iter().map(|q| q.xi).collect())?;
    put("theta", p.iter().map(|q| q.theta).collect())?;
    put("dtheta_dxi", p.iter().map(|q| q.dtheta_dxi).collect())?;
    if let Some(s) = scaled {
        let q = &s.profile;
        put("radius_cm", q.iter().map(|q| q.radius_cm).collect())?;
        put("r_over_R", q.iter().map(|q| q.r_over_r).collect())?;
        put("mass_g", q.iter().map(|q| q.mass_g).collect())?;
        put("m_over_M", q.iter().map(|q| q.m_over_m).collect())?;
        put("density_g_cm3", q.iter().map(|q| q.density_g_cm3).collect())?;
        put(
            "pressure_dyn_cm2",
            q.iter().map(|q| q.pressure_dyn_cm2).collect(),
        )?;
        put("temperature_k", q.iter().map(|q| q.temperature_k).collect())?;
    }
    let keys: Vec<String> = columns.keys().extract()?;
    let units = convert::units(py, keys.iter().map(String::as_str))?;
    Ok((columns, units))
}
