//! Output of `limits`: the mass limits of the main sequence for one composition and set of
//! laws.
//!
//! JSON keys: `meta` (provenance), `x`, `y`, `z`, `physics` (a model-file fragment),
//! `hydrogen_burning_minimum_mass_msun` (the turning point of the ZAMS branch, or the lowest mass
//! the laws reach when they fail before it), `turning_point_estimate_msun` and `stopped_by`
//! (`null` when the turning point was reached; else the turning point extrapolated beyond the
//! laws' domain, an estimate, and why the laws failed), and `limiting_model`: every summary
//! quantity of the model at `hydrogen_burning_minimum_mass_msun` (the keys of the `zams` JSON
//! summary, with `mass_msun`);
//! `pulsational_instability_mass_msun`: the mass above which the radial fundamental mode of the
//! ZAMS models is vibrationally unstable in the quasi-adiabatic approximation (the epsilon
//! mechanism against radiative damping; `oscillation::stability`), `null` if it is stable up to
//! 150 M_sun; `pulsational_search`: the models evaluated, each `{"mass_msun",
//! "fundamental_growth_per_radian"}` (eta/omega of the fundamental, dimensionless).

use super::format::{laws_text, num};
use super::meta::Provenance;
use crate::oscillation::PulsationalLimit;
use crate::structure::limits::HydrogenBurningLimit;
use crate::structure::ModelSummary;
use serde_json::{json, Map, Value};

/// The limits as one JSON object.
pub fn limits_json(
    limit: &HydrogenBurningLimit,
    pulsation: &PulsationalLimit,
    meta: &Provenance,
) -> Value {
    let model = &limit.model;
    let c = model.composition();
    let mut m = Map::new();
    m.insert("mass_msun".into(), json!(model.mass_msun()));
    for (f, v) in ModelSummary::FIELDS.iter().zip(model.summary.values()) {
        m.insert(
            f.key.into(),
            if v.is_finite() { json!(v) } else { Value::Null },
        );
    }
    json!({
        "meta": meta,
        "x": c.x(),
        "y": c.y(),
        "z": c.z(),
        "physics": model.physics(),
        "hydrogen_burning_minimum_mass_msun": limit.mass_msun,
        "turning_point_estimate_msun": limit.turning_point_estimate_msun,
        "stopped_by": limit.stopped_by,
        "limiting_model": Value::Object(m),
        "pulsational_instability_mass_msun": pulsation.mass_msun,
        "pulsational_search": pulsation
            .evaluations
            .iter()
            .map(|&(m, g)| json!({"mass_msun": m, "fundamental_growth_per_radian": g}))
            .collect::<Vec<_>>(),
    })
}

/// The limits as aligned text with units.
pub fn limits_text(limit: &HydrogenBurningLimit, pulsation: &PulsationalLimit) -> String {
    let model = &limit.model;
    let s = &model.summary;
    let c = model.composition();
    let mut out = String::new();
    let mut line = |label: &str, value: String, unit: &str| {
        out.push_str(&format!("{label:<36} {value:>13}  {unit}\n"));
    };
    line(
        "X, Y, Z",
        format!("{:.4}, {:.4}, {:.4}", c.x(), c.y(), c.z()),
        "mass fractions",
    );
    line(
        "physics",
        model.physics().preset.to_string(),
        &laws_text(model.physics()),
    );
    match &limit.stopped_by {
        Some(why) => {
            line(
                "hydrogen-burning minimum mass",
                num(limit.mass_msun),
                "M_sun (lowest mass the laws reach; they fail just below)",
            );
            line("", String::new(), &format!("stopped by: {why}"));
            if let Some(estimate) = limit.turning_point_estimate_msun {
                line(
                    "turning point (extrapolated)",
                    num(estimate),
                    "M_sun (estimate beyond the laws' domain)",
                );
            }
        }
        None => line(
            "hydrogen-burning minimum mass",
            num(limit.mass_msun),
            "M_sun (turning point of the ZAMS branch)",
        ),
    }
    line("", String::new(), "the model at the limit:");
    line("  radius", num(s.radius_rsun), "R_sun");
    line("  effective temperature", num(s.teff_k), "K");
    line("  luminosity", num(s.luminosity_lsun), "L_sun");
    line("  central temperature", num(s.central_temperature_k), "K");
    line("  central density", num(s.central_density_g_cm3), "g/cm^3");
    line(
        "  central degeneracy psi",
        num(s.central_degeneracy),
        "(electron chemical potential / kT)",
    );
    match pulsation.mass_msun {
        Some(m) => line(
            "pulsational instability mass",
            num(m),
            "M_sun (radial fundamental unstable above; epsilon mechanism, quasi-adiabatic)",
        ),
        None => line(
            "pulsational instability mass",
            "none".to_string(),
            "(radial fundamental stable up to 150 M_sun; quasi-adiabatic)",
        ),
    }
    out
}
