//! Output schema of `compare`: one record per (mass, variant) with the model's values, the
//! differences against the reference variant (the first) of the same mass, and the
//! logarithmic sensitivities to a scale factor where the variant changes exactly one. CSV
//! columns and JSON keys are the field names; empty CSV cells (JSON `null`) mean "not
//! applicable" (a model that did not converge, a reference that did not converge, or a variant
//! that does not change exactly one factor).

use super::columns::{compare_columns, units_json};
use super::meta::Meta;
use super::tabular::{cells_of, write_table_file, TableFormat, Tabular};
use crate::error::Result;
use crate::grid::compare::{differences, sensitivities, single_factor_change};
use crate::grid::run::PointResult;
use crate::grid::{Grid, GridRow};
use serde::Serialize;
use std::path::Path;

/// One model of a comparison.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct CompareRecord {
    /// Mass, M_sun.
    pub mass_msun: f64,
    /// Hydrogen mass fraction.
    pub x: f64,
    /// Helium mass fraction Y = 1 - X - Z.
    pub y: f64,
    /// Metal mass fraction.
    pub z: f64,
    /// Variant name.
    pub variant: String,
    /// The variant's SPEC as given (empty: the base set).
    pub spec: String,
    /// Whether this is the reference variant (the first).
    pub reference: bool,
    /// Status code: `converged`, `continued` (from a neighbour's solution), or why the model did
    /// not converge (`stalled`, `iteration-limit`, ... as in the sequence table).
    pub status: String,
    /// Why the model did not converge (empty when it did).
    pub reason: String,
    /// A converged model's warnings (laws used outside their validity, and cautions), separated by ` | `
    /// ([`GridRow::WARNING_SEPARATOR`]); empty if there are none.
    pub warnings: String,
    /// Luminosity, L_sun.
    pub luminosity_lsun: Option<f64>,
    /// Radius, R_sun.
    pub radius_rsun: Option<f64>,
    /// Effective temperature, K.
    pub teff_k: Option<f64>,
    /// Central temperature, K.
    pub central_temperature_k: Option<f64>,
    /// Central density, g cm^-3.
    pub central_density_g_cm3: Option<f64>,
    /// Convective-core mass fraction of M.
    pub convective_core_mass_fraction: Option<f64>,
    /// log10(L / L_reference), dex.
    pub dlog_luminosity_dex: Option<f64>,
    /// log10(R / R_reference), dex.
    pub dlog_radius_dex: Option<f64>,
    /// log10(T_c / T_c,reference), dex.
    pub dlog_central_temperature_dex: Option<f64>,
    /// log10(rho_c / rho_c,reference), dex.
    pub dlog_central_density_dex: Option<f64>,
    /// Convective-core mass fraction minus the reference's (fraction of M).
    pub delta_convective_core_mass_fraction: Option<f64>,
    /// The one scale factor changed against the reference (`opacity-factor` or
    /// `rates-factor`), if exactly one is and nothing else.
    pub varied_factor: Option<String>,
    /// That factor in the reference.
    pub factor_reference: Option<f64>,
    /// That factor in this variant.
    pub factor_variant: Option<f64>,
    /// dlog10 L / dlog10 factor.
    pub sensitivity_luminosity: Option<f64>,
    /// dlog10 R / dlog10 factor.
    pub sensitivity_radius: Option<f64>,
    /// dlog10 T_c / dlog10 factor.
    pub sensitivity_central_temperature: Option<f64>,
    /// dlog10 rho_c / dlog10 factor.
    pub sensitivity_central_density: Option<f64>,
}

impl CompareRecord {
    /// Whether the model converged.
    pub fn converged(&self) -> bool {
        self.status == "converged" || self.status == "continued"
    }
}

/// A whole comparison: its composition, the variants, the records mass by mass (variants in
/// the order given within each mass).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct CompareTable {
    /// Name of the reference variant.
    pub reference: String,
    /// Hydrogen mass fraction.
    pub x: f64,
    /// Metal mass fraction.
    pub z: f64,
    /// The records.
    pub records: Vec<CompareRecord>,
}

impl CompareTable {
    /// The table for the solved `results` of `grid` (a grid of one composition whose first
    /// variant is the reference), ordered by `masses` and then by variant. Points missing from
    /// `results` are skipped.
    pub fn new(grid: &Grid, masses: &[f64], results: &[PointResult]) -> Self {
        let find = |v: usize, m: f64| {
            results
                .iter()
                .find(|r| r.point.variant == v && r.point.mass_msun == m)
        };
        let mut records = Vec::new();
        let (mut x, mut z) = (f64::NAN, f64::NAN);
        for &m in masses {
            let reference = find(0, m).and_then(|r| r.outcome.as_ref().ok().map(|m| m.summary));
            for (v, variant) in grid.variants.iter().enumerate() {
                let Some(r) = find(v, m) else { continue };
                x = r.point.composition.x();
                z = r.point.composition.z();
                let own = r.outcome.as_ref().ok().map(|m| m.summary);
                let d = match (reference, own) {
                    (Some(a), Some(b)) => Some(differences(&a, &b)),
                    _ => None,
                };
                let change = single_factor_change(grid.physics[0].spec(), grid.physics[v].spec());
                let row = GridRow::new(grid, "", r);
                let s = match (d, change) {
                    (Some(d), Some(c)) => sensitivities(&d, c),
                    _ => None,
                };
                records.push(CompareRecord {
                    mass_msun: m,
                    x,
                    y: r.point.composition.y(),
                    z,
                    variant: variant.name.clone(),
                    spec: variant.spec.clone(),
                    reference: v == 0,
                    status: row.status.code().to_string(),
                    reason: row.reason,
                    warnings: row.warnings.join(GridRow::WARNING_SEPARATOR),
                    luminosity_lsun: own.map(|s| s.luminosity_lsun),
                    radius_rsun: own.map(|s| s.radius_rsun),
                    teff_k: own.map(|s| s.teff_k),
                    central_temperature_k: own.map(|s| s.central_temperature_k),
                    central_density_g_cm3: own.map(|s| s.central_density_g_cm3),
                    convective_core_mass_fraction: own.map(|s| s.convective_core_mass_fraction),
                    dlog_luminosity_dex: d.and_then(|d| d.dlog_luminosity),
                    dlog_radius_dex: d.and_then(|d| d.dlog_radius),
                    dlog_central_temperature_dex: d.and_then(|d| d.dlog_central_temperature),
                    dlog_central_density_dex: d.and_then(|d| d.dlog_central_density),
                    delta_convective_core_mass_fraction: d
                        .and_then(|d| d.delta_convective_core_mass_fraction),
                    varied_factor: change.map(|c| c.factor.key().to_string()),
                    factor_reference: change.map(|c| c.reference),
                    factor_variant: change.map(|c| c.variant),
                    sensitivity_luminosity: s.and_then(|s| s.luminosity),
                    sensitivity_radius: s.and_then(|s| s.radius),
                    sensitivity_central_temperature: s.and_then(|s| s.central_temperature),
                    sensitivity_central_density: s.and_then(|s| s.central_density),
                });
            }
        }
        Self {
            reference: grid
                .variants
                .first()
                .map(|v| v.name.clone())
                .unwrap_or_default(),
            x,
            z,
            records,
        }
    }
}

/// The content of a comparison's metadata.
pub const COMPARE_CONTENT: &str = "ZAMS physics comparison";

/// The metadata of a comparison: `base` (provenance and content), `x`, `y`, `z` and the
/// reference variant's name.
pub fn compare_meta(base: &Meta, table: &CompareTable) -> Meta {
    base.clone()
        .with("x", table.x)
        .with("y", 1.0 - table.x - table.z)
        .with("z", table.z)
        .with("reference", &table.reference)
}

/// The table as one JSON object: its fields in order, then `meta`, then `units`.
#[derive(Debug, serde::Serialize)]
pub struct CompareJson<'a> {
    /// The table's fields.
    #[serde(flatten)]
    pub table: &'a CompareTable,
    /// The metadata ([`compare_meta`]).
    pub meta: serde_json::Value,
    /// Column name to unit.
    pub units: serde_json::Value,
}

/// The table as one JSON object, with `meta` and `units`.
pub fn table_json<'a>(table: &'a CompareTable, meta: &Meta) -> CompareJson<'a> {
    CompareJson {
        table,
        meta: compare_meta(meta, table).to_json(),
        units: units_json(&compare_columns()),
    }
}

/// Write the table to `path`: the records as CSV (metadata lines, units line, header, rows;
/// ECSV if the name ends in `.ecsv`), or the whole table as JSON if it ends in `.json`; `-` is
/// standard output (CSV), a file is written atomically.
pub fn write_table(path: &Path, table: &CompareTable, meta: &Meta) -> Result<()> {
    let columns = compare_columns();
    let meta_all = compare_meta(meta, table);
    let row = |i: usize| cells_of(&table.records[i], &columns);
    let tabular = Tabular {
        columns: &columns,
        meta: &meta_all,
        len: table.records.len(),
        row: &row,
    };
    let format = TableFormat::from_path(path);
    let json = (format == TableFormat::Json).then(|| table_json(table, meta));
    write_table_file(path, format, &tabular, json.as_ref())
}
