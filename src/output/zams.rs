//! Output of one ZAMS model: the summary (JSON object or aligned text) and the profile (CSV,
//! ECSV or JSON, see [`crate::output::tabular`]). Keys carry their units; the summary quantities
//! and their documentation come from [`ModelSummary::FIELDS`], the profile columns from
//! [`ProfileRow`] and their units from [`profile_columns`].
//!
//! JSON summary keys: `mass_msun`, `x`, `y`, `z`, `physics` (a model-file fragment: the keys of
//! [`crate::physics::PhysicsSpec`]), `converged`, `iterations`, `fit_mismatch`,
//! `fit_mass_fraction`, every key of [`ModelSummary::FIELDS`], `rhs_evaluations`, `warnings`
//! (an array of sentences: where the model leaves what its laws describe well). A model that
//! did not converge has `converged: false`, `status` and `reason`, and every summary quantity
//! `null`. The command line adds `meta` (the provenance, [`crate::output::meta`]).

use super::columns::profile_columns;
use super::format::{laws_text, num};
use super::meta::{Meta, Provenance};
use super::tabular::{write_table_file, Cell, TableFormat, Tabular};
use crate::error::{Error, Result};
use crate::structure::{ModelSummary, NotConverged, ProfileRow, ZamsModel, ZamsSettings};
use serde_json::{json, Map, Value};
use std::path::Path;

/// Identification keys shared by converged and failed summaries.
fn identification(settings: &ZamsSettings) -> Map<String, Value> {
    let c = settings.composition();
    let mut m = Map::new();
    m.insert("mass_msun".into(), json!(settings.mass_msun()));
    m.insert("x".into(), json!(c.x()));
    m.insert("y".into(), json!(c.y()));
    m.insert("z".into(), json!(c.z()));
    m.insert("physics".into(), json!(settings.physics().spec()));
    m
}

fn finite(v: f64) -> Value {
    if v.is_finite() {
        json!(v)
    } else {
        Value::Null
    }
}

/// The JSON summary of a converged model.
pub fn summary_json(model: &ZamsModel) -> Value {
    let mut m = identification(model.settings());
    m.insert("converged".into(), Value::Bool(true));
    m.insert("iterations".into(), json!(model.stats.iterations));
    m.insert("fit_mismatch".into(), json!(model.stats.fit_mismatch));
    m.insert("fit_mass_fraction".into(), json!(model.fit_mass_fraction()));
    for (f, v) in ModelSummary::FIELDS.iter().zip(model.summary.values()) {
        m.insert(f.key.into(), finite(v));
    }
    m.insert("rhs_evaluations".into(), json!(model.stats.rhs_evaluations));
    m.insert("warnings".into(), json!(model.warnings));
    Value::Object(m)
}

/// The JSON summary of a model that did not converge: identification, `converged: false`, the
/// status code and reason, and every summary quantity `null`.
pub fn failure_json(settings: &ZamsSettings, failure: &NotConverged) -> Value {
    let mut m = identification(settings);
    m.insert("converged".into(), Value::Bool(false));
    m.insert("status".into(), json!(failure.code()));
    m.insert("reason".into(), json!(failure.reason()));
    m.insert("iterations".into(), json!(failure.iterations));
    m.insert("fit_mismatch".into(), finite(failure.mismatch));
    m.insert(
        "fit_mass_fraction".into(),
        json!(settings.fit_mass_fraction()),
    );
    for f in ModelSummary::FIELDS {
        m.insert(f.key.into(), Value::Null);
    }
    m.insert("rhs_evaluations".into(), json!(failure.rhs_evaluations));
    Value::Object(m)
}

/// Pretty JSON text of `value`.
pub fn to_json_text(value: &Value) -> Result<String> {
    serde_json::to_string_pretty(value).map_err(|e| Error::Io {
        path: "stdout".to_string(),
        reason: e.to_string(),
    })
}

/// `value` (a JSON object) with the key `meta` set to `meta`.
pub fn with_meta(mut value: Value, meta: &Meta) -> Value {
    if let Value::Object(m) = &mut value {
        m.insert("meta".into(), meta.to_json());
    }
    value
}

/// The metadata of a profile file of `model`: the provenance, `content: ZAMS profile`, the
/// physics, `x`, `y`, `z`, `mass_msun`, `radius_rsun`, `luminosity_lsun`, `teff_k`, and
/// `rows_from` (what the first and last rows are).
pub fn profile_meta(provenance: &Provenance, model: &ZamsModel) -> Meta {
    Meta::new(provenance, "ZAMS profile")
        .physics(model.physics())
        .composition(model.composition())
        .with("mass_msun", model.mass_msun())
        .with("radius_rsun", model.summary.radius_rsun)
        .with("luminosity_lsun", model.summary.luminosity_lsun)
        .with("teff_k", model.summary.teff_k)
        .with(
            "rows_from",
            "the centre (first row: m = 1e-10 M, where the outward integration starts) to the photosphere (last row)",
        )
}

/// Write profile rows to `path` in `format` (see [`crate::output::tabular`] for the three
/// formats; columns and units from [`profile_columns`]): `-` is standard output, a file is
/// written atomically.
pub fn write_profile(
    path: &Path,
    rows: &[ProfileRow],
    format: TableFormat,
    meta: &Meta,
) -> Result<()> {
    let columns = profile_columns();
    let row = |i: usize| profile_cells(&rows[i]);
    let table = Tabular {
        columns: &columns,
        meta,
        len: rows.len(),
        row: &row,
    };
    write_table_file(path, format, &table, None::<&()>)
}

/// The cells of a profile row in the order of [`crate::structure::PROFILE_COLUMNS`], read
/// straight from its fields (the generic `tabular::cells_of` goes through a JSON map, about
/// 1 500 instructions a number, which made a 5 000-row profile cost several models; the test
/// below checks that both give the same cells).
pub fn profile_cells(r: &ProfileRow) -> Vec<Cell> {
    let before = [
        r.mass_g,
        r.m_over_m,
        r.radius_cm,
        r.r_over_r,
        r.pressure_dyn_cm2,
        r.temperature_k,
        r.density_g_cm3,
        r.luminosity_erg_s,
        r.eps_pp_erg_g_s,
        r.eps_cno_erg_g_s,
        r.opacity_cm2_g,
        r.nabla_rad,
        r.nabla_ad,
        r.nabla,
    ];
    let after = [
        r.mu,
        r.gamma1,
        r.brunt_n2_rad2_s2,
        r.lamb_l1_rad_s,
        r.lamb_l2_rad_s,
        r.sound_speed_cm_s,
        r.chi_rho,
        r.chi_t,
        r.specific_energy_erg_g,
        r.specific_entropy_erg_g_k,
        r.gravity_cm_s2,
        r.potential_erg_g,
        r.structure_v,
        r.structure_u,
        r.structure_c1,
        r.structure_a_star,
        r.x,
        r.y,
        r.z,
    ];
    let mut cells = Vec::with_capacity(before.len() + 1 + after.len());
    cells.extend(before.into_iter().map(Cell::number));
    cells.push(Cell::Count(u64::from(r.convective)));
    cells.extend(after.into_iter().map(Cell::number));
    cells
}

/// The summary as aligned text with units.
pub fn text_summary(model: &ZamsModel) -> String {
    let s = &model.summary;
    let st = &model.stats;
    let c = model.composition();
    let mut out = String::new();
    let mut line = |label: &str, value: String, unit: &str| {
        out.push_str(&format!("{label:<32} {value:>13}  {unit}\n"));
    };
    let p = model.physics();
    line("mass", num(model.mass_msun()), "M_sun");
    line(
        "X, Y, Z",
        format!("{:.4}, {:.4}, {:.4}", c.x(), c.y(), c.z()),
        "mass fractions",
    );
    let laws = laws_text(p);
    let (first, second) = laws.split_at(laws.find(", convection").unwrap_or(laws.len()));
    line("physics", p.preset.to_string(), &format!("{first},"));
    line("", String::new(), second.trim_start_matches(", "));
    line(
        "converged",
        "true".to_string(),
        &format!(
            "{} Newton iterations, mismatch {:.1e} at m/M = {}",
            st.iterations,
            st.fit_mismatch,
            model.fit_mass_fraction()
        ),
    );
    line("radius", num(s.radius_rsun), "R_sun");
    line("luminosity", num(s.luminosity_lsun), "L_sun");
    line("effective temperature", num(s.teff_k), "K");
    line("log g", num(s.log_g_cgs), "(g in cm/s^2)");
    line("central temperature", num(s.central_temperature_k), "K");
    line("central density", num(s.central_density_g_cm3), "g/cm^3");
    line(
        "central pressure",
        num(s.central_pressure_dyn_cm2),
        "dyn/cm^2",
    );
    line(
        "central degeneracy psi",
        num(s.central_degeneracy),
        "(electron chemical potential / kT; < 0: not degenerate)",
    );
    line(
        "convective core",
        num(s.convective_core_mass_fraction),
        "of M",
    );
    line(
        "convective envelope",
        num(s.convective_envelope_mass_fraction),
        "of M",
    );
    line("CNO share of L", num(s.cno_luminosity_fraction), "");
    line("L / L_Edd", num(s.eddington_ratio), "(electron scattering)");
    line(
        "Kelvin-Helmholtz time",
        num(s.kelvin_helmholtz_time_yr),
        "yr (G M^2 / R L)",
    );
    line(
        "dynamical time",
        num(s.dynamical_time_s),
        "s (sqrt(R^3 / G M))",
    );
    line(
        "main-sequence lifetime",
        num(s.nuclear_time_yr),
        "yr (10% of H burnt at this L)",
    );
    line(
        "3He equilibrium time",
        num(s.he3_equilibrium_time_yr),
        "yr (relaxation to it at the centre)",
    );
    line(
        "virial residual",
        format!("{:.1e}", s.virial_residual),
        "(|3 int P/rho dm / int Gm/r dm - 1|)",
    );
    line(
        "luminosity residual",
        format!("{:.1e}", s.luminosity_residual),
        "(|int eps dm / L - 1|)",
    );
    out
}

/// The iteration history and last guesses of a model that did not converge, for stderr (the
/// error itself is reported separately).
pub fn failure_text(failure: &NotConverged) -> String {
    let mut out = String::new();
    if !failure.history.is_empty() {
        out.push_str("  iteration  mismatch      step\n");
    }
    for (i, h) in failure.history.iter().enumerate() {
        out.push_str(&format!(
            "  {:>9}  {:<12.4e}  {:.4}\n",
            i + 1,
            h.residual_norm,
            h.step_length
        ));
    }
    let [pc, tc, r, l] = failure.last_guesses();
    out.push_str(&format!(
        "  last guesses: P_c = {pc:.6e} dyn/cm^2, T_c = {tc:.6e} K, R = {r:.6} R_sun, L = {l:.6e} L_sun\n"
    ));
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::output::tabular::cells_of;
    use crate::physics::{Composition, PhysicsSet};
    use crate::structure::solve;

    /// The fast cells of a profile row are the generic ones (the serialised row read by column
    /// name), for every row of a real profile, the centre's empty Lamb frequencies included.
    #[test]
    fn profile_cells_are_the_serialised_row() {
        let settings = ZamsSettings::new(
            1.0,
            Composition::new(0.70, 0.02).unwrap(),
            PhysicsSet::analytic(),
        )
        .unwrap();
        let rows = solve(&settings).unwrap().profile(40).unwrap();
        let columns = profile_columns();
        assert_eq!(columns.len(), crate::structure::PROFILE_COLUMNS.len());
        for row in &rows {
            assert_eq!(profile_cells(row), cells_of(row, &columns));
        }
        assert_eq!(profile_cells(&rows[0])[18], Cell::Empty);
    }
}
