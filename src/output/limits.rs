//! Output of `limits`: the mass limits of the main sequence for one composition and set of
//! laws.
//!
//! JSON keys: `meta` (provenance), `x`, `y`, `z`, `physics` (a model-file fragment),
//! `hydrogen_burning_minimum_mass_msun`, `extrapolated_by_msun` (`null` when the turning point
//! was reached; else how far below the last model reached it was extrapolated), and
//! `limiting_model`: every summary quantity of the model at the limit, or of the last model
//! reached (the keys of the `zams` JSON summary, with `mass_msun`).

use super::format::{laws_text, num};
use super::meta::Provenance;
use crate::structure::limits::HydrogenBurningLimit;
use crate::structure::ModelSummary;
use serde_json::{json, Map, Value};

/// The limits as one JSON object.
pub fn limits_json(limit: &HydrogenBurningLimit, meta: &Provenance) -> Value {
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
        "extrapolated_by_msun": limit.extrapolated_by_msun,
        "limiting_model": Value::Object(m),
    })
}

/// The limits as aligned text with units.
pub fn limits_text(limit: &HydrogenBurningLimit) -> String {
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
    line(
        "hydrogen-burning minimum mass",
        num(limit.mass_msun),
        "M_sun (turning point of the ZAMS branch)",
    );
    let at = match limit.extrapolated_by_msun {
        None => "the model at the limit".to_string(),
        Some(d) => format!(
            "extrapolated {d:.1e} M_sun below the last model (the laws fail beyond it); that model, at {} M_sun:",
            num(model.mass_msun())
        ),
    };
    line("", String::new(), &at);
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
    out
}
