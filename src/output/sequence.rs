//! Files of a grid run (`sequence`) and of merged shards: one row per grid point, columns from
//! [`GridRow::columns`] (identification, physics, iterations, the summary quantities), units and
//! descriptions from [`sequence_columns`].
//!
//! The metadata ([`Meta`]) holds the provenance, `content: ZAMS sequence table`,
//! `grid_fingerprint`, `shard` (`K/N`, only in a shard's file) and `fit_ranges` (`0.1-0.5,...`,
//! the ranges of the power-law fits, which `merge` uses).
//!
//! - CSV: leading `# key: value` metadata lines, `# units: {...}`, then a plain header row and
//!   one row per point (read it with `pandas.read_csv(path, comment="#")`). Numbers are written
//!   in the shortest form that reads back to the same double; an empty cell means "no value" (a
//!   model that did not converge has only its identification, status, reason and iteration
//!   count). `warnings` holds a converged model's warnings (laws used outside their validity, and cautions),
//!   separated by ` | `, empty if there are none.
//! - ECSV (`.ecsv`): the same columns and metadata with units in the YAML header
//!   ([`crate::output::tabular`]).
//! - JSON (`.json`): one object `{meta, grid_fingerprint, shard, fit_ranges, fits, units,
//!   rows}`, `rows` an array of objects with the same keys as the CSV columns (`null` for no
//!   value), `fits` the power-law fits of a whole grid.

use super::columns::{sequence_columns, units_json};
use super::meta::Meta;
use super::tabular::{is_ecsv_text, read_ecsv, write_table_file, Cell, TableFormat, Tabular};
use crate::error::{Error, Result};
use crate::grid::fits::{format_ranges, parse_ranges, FitGroup};
use crate::grid::{GridRow, GridTable, RowStatus};
use crate::physics::PhysicsSpec;
use crate::structure::ModelSummary;
use serde_json::{json, Map, Value};
use std::path::Path;

/// The cells of `row`, in the order of [`GridRow::columns`].
fn cells(row: &GridRow) -> Vec<Cell> {
    let p = &row.physics;
    let mut out = vec![
        Cell::Text(row.grid_fingerprint.clone()),
        Cell::Count(row.grid_index as u64),
        Cell::Count(row.grid_size as u64),
        Cell::Text(row.variant.clone()),
        Cell::Flag(row.converged()),
        Cell::Text(row.status.code().to_string()),
        Cell::Text(row.reason.clone()),
        Cell::Text(row.warnings.join(GridRow::WARNING_SEPARATOR)),
        Cell::number(row.mass_msun),
        Cell::number(row.x),
        Cell::number(1.0 - row.x - row.z),
        Cell::number(row.z),
        Cell::Text(p.preset.to_string()),
        Cell::Text(p.eos.to_string()),
        Cell::Text(p.opacity.to_string()),
        Cell::number(p.opacity_factor),
        Cell::Text(p.rates.to_string()),
        Cell::number(p.rates_factor),
        Cell::Text(p.convection.to_string()),
        Cell::Text(p.atmosphere.to_string()),
        row.iterations
            .map_or(Cell::Empty, |n| Cell::Count(n as u64)),
    ];
    match &row.summary {
        Some(s) => out.extend(s.values().into_iter().map(Cell::number)),
        None => out.extend(ModelSummary::FIELDS.iter().map(|_| Cell::Empty)),
    }
    out
}

/// A row as a JSON object with the CSV column names as keys.
pub fn row_json(row: &GridRow) -> Value {
    let map: Map<String, Value> = GridRow::columns()
        .into_iter()
        .zip(cells(row))
        .map(|(k, c)| (k.to_string(), c.json()))
        .collect();
    Value::Object(map)
}

/// A row from its cells as text (`get` returns the cell of a column, `None` if absent, empty
/// for no value). Errors say which column is wrong.
fn row_from(get: &dyn Fn(&str) -> Option<String>) -> std::result::Result<GridRow, String> {
    let text = |k: &str| get(k).ok_or_else(|| format!("column {k} is missing"));
    let parse = |k: &str| -> std::result::Result<Option<f64>, String> {
        let t = text(k)?;
        if t.is_empty() {
            return Ok(None);
        }
        t.parse()
            .map(Some)
            .map_err(|_| format!("{k} = '{t}' is not a number"))
    };
    let number = |k: &str| parse(k)?.ok_or_else(|| format!("{k} is empty"));
    let count = |k: &str| -> std::result::Result<Option<usize>, String> {
        let t = text(k)?;
        if t.is_empty() {
            return Ok(None);
        }
        t.parse()
            .map(Some)
            .map_err(|_| format!("{k} = '{t}' is not a whole number"))
    };
    let law = |k: &str| -> std::result::Result<String, String> { text(k) };
    let spec_error = |e: crate::physics::spec::SpecError| format!("{}: {}", e.kind.key(), e);
    let physics = PhysicsSpec {
        preset: law("preset")?.parse().map_err(spec_error)?,
        eos: law("eos")?.parse().map_err(spec_error)?,
        opacity: law("opacity")?.parse().map_err(spec_error)?,
        opacity_factor: number("opacity_factor")?,
        rates: law("rates")?.parse().map_err(spec_error)?,
        rates_factor: number("rates_factor")?,
        convection: law("convection")?.parse().map_err(spec_error)?,
        atmosphere: law("atmosphere")?.parse().map_err(spec_error)?,
    };
    let status_text = text("status")?;
    let status = RowStatus::from_code(&status_text)
        .ok_or_else(|| format!("status '{status_text}' is not a status code"))?;
    let summary = if status.converged() {
        let values = ModelSummary::FIELDS
            .iter()
            .map(|f| Ok(parse(f.key)?.unwrap_or(f64::NAN)))
            .collect::<std::result::Result<Vec<f64>, String>>()?;
        ModelSummary::from_values(&values)
    } else {
        None
    };
    Ok(GridRow {
        grid_fingerprint: text("grid_fingerprint")?,
        grid_index: count("grid_index")?.ok_or("grid_index is empty")?,
        grid_size: count("grid_size")?.ok_or("grid_size is empty")?,
        variant: text("variant")?,
        status,
        reason: text("reason")?,
        warnings: {
            let t = text("warnings")?;
            if t.is_empty() {
                Vec::new()
            } else {
                t.split(GridRow::WARNING_SEPARATOR)
                    .map(str::to_string)
                    .collect()
            }
        },
        mass_msun: number("mass_msun")?,
        x: number("x")?,
        z: number("z")?,
        physics,
        iterations: count("iterations")?,
        summary,
    })
}

/// Whether a path names a JSON file (by extension), else CSV or ECSV.
pub fn is_json(path: &Path) -> bool {
    TableFormat::from_path(path) == TableFormat::Json
}

/// The content of a sequence table's metadata.
pub const SEQUENCE_CONTENT: &str = "ZAMS sequence table";

/// The metadata of a sequence table: `base` (provenance and content) with the grid keys.
pub fn table_meta(base: &Meta, table: &GridTable) -> Meta {
    let mut meta = base
        .clone()
        .with("grid_fingerprint", &table.grid_fingerprint);
    if let Some(s) = &table.shard {
        meta = meta.with("shard", s);
    }
    meta.with("fit_ranges", format_ranges(&table.fit_ranges))
}

/// The whole table as one JSON value, with `meta`.
pub fn table_json(table: &GridTable, meta: &Meta) -> Value {
    json!({
        "meta": table_meta(meta, table).to_json(),
        "grid_fingerprint": table.grid_fingerprint,
        "shard": table.shard,
        "fit_ranges": table.fit_ranges,
        "fits": table.fits,
        "units": units_json(&sequence_columns()),
        "rows": table.rows.iter().map(row_json).collect::<Vec<_>>(),
    })
}

/// Write the table to `path` (CSV; JSON if it ends in `.json`; ECSV if it ends in `.ecsv`):
/// `-` is standard output (CSV), a file is written atomically. `meta` holds the provenance and
/// content; the grid keys are added ([`table_meta`]).
pub fn write_table(path: &Path, table: &GridTable, meta: &Meta) -> Result<()> {
    let columns = sequence_columns();
    let meta_all = table_meta(meta, table);
    let row = |i: usize| cells(&table.rows[i]);
    let tabular = Tabular {
        columns: &columns,
        meta: &meta_all,
        len: table.rows.len(),
        row: &row,
    };
    let format = TableFormat::from_path(path);
    let json = (format == TableFormat::Json).then(|| table_json(table, meta));
    write_table_file(path, format, &tabular, json.as_ref())
}

/// Read a table written by [`write_table`] (JSON by extension; ECSV by its first line; else
/// CSV). For CSV and ECSV the fits are not stored (they are recomputed by whoever merges);
/// `fit_ranges` comes from the metadata.
pub fn read_table(path: &Path) -> Result<GridTable> {
    let bad = |reason: String| Error::BadFile {
        path: path.display().to_string(),
        reason,
    };
    let text = std::fs::read_to_string(path).map_err(|e| bad(format!("cannot read: {e}")))?;
    if is_json(path) {
        let v: Value = serde_json::from_str(&text)
            .map_err(|e| bad(format!("not a starpoise sequence table: {e}")))?;
        let field = |k: &str| v.get(k).ok_or_else(|| bad(format!("no key {k}")));
        let rows = field("rows")?
            .as_array()
            .ok_or_else(|| bad("rows is not an array".into()))?
            .iter()
            .enumerate()
            .map(|(i, r)| {
                let get = |k: &str| {
                    r.get(k).map(|c| match c {
                        Value::String(s) => s.clone(),
                        Value::Null => String::new(),
                        other => other.to_string(),
                    })
                };
                row_from(&get).map_err(|e| bad(format!("row {i}: {e}")))
            })
            .collect::<Result<Vec<_>>>()?;
        let fit_ranges: Vec<(f64, f64)> = serde_json::from_value(field("fit_ranges")?.clone())
            .map_err(|e| bad(format!("fit_ranges: {e}")))?;
        Ok(GridTable {
            grid_fingerprint: field("grid_fingerprint")?
                .as_str()
                .unwrap_or_default()
                .to_string(),
            shard: v.get("shard").and_then(Value::as_str).map(String::from),
            fit_ranges,
            fits: serde_json::from_value::<Vec<FitGroup>>(field("fits")?.clone())
                .map_err(|e| bad(format!("fits: {e}")))?,
            rows,
        })
    } else if is_ecsv_text(&text) {
        let t = read_ecsv(&text).map_err(|e| bad(format!("not a valid ECSV table: {e}")))?;
        let names: Vec<&str> = t.columns.iter().map(|c| c.name.as_str()).collect();
        let rows = t
            .rows
            .iter()
            .enumerate()
            .map(|(i, cells)| {
                let get = |k: &str| {
                    names
                        .iter()
                        .position(|n| *n == k)
                        .map(|j| match cells[j].as_str() {
                            "True" => "true".to_string(),
                            "False" => "false".to_string(),
                            other => other.to_string(),
                        })
                };
                row_from(&get).map_err(|e| bad(format!("data row {}: {e}", i + 1)))
            })
            .collect::<Result<Vec<_>>>()?;
        let text_of = |k: &str| t.meta.get(k).and_then(Value::as_str).map(String::from);
        let fit_ranges = match text_of("fit_ranges") {
            Some(r) if !r.is_empty() => {
                parse_ranges(&r).map_err(|e| bad(format!("fit_ranges: {e}")))?
            }
            _ => Vec::new(),
        };
        Ok(GridTable {
            grid_fingerprint: text_of("grid_fingerprint").unwrap_or_default(),
            shard: text_of("shard"),
            fit_ranges,
            fits: Vec::new(),
            rows,
        })
    } else {
        let meta: std::collections::HashMap<String, String> =
            Meta::read_comment_lines(&text).into_iter().collect();
        let comment_lines = text.lines().take_while(|l| l.starts_with('#')).count();
        let mut reader = csv::ReaderBuilder::new()
            .comment(Some(b'#'))
            .from_reader(text.as_bytes());
        let header = reader
            .headers()
            .map_err(|e| bad(format!("no header row: {e}")))?
            .clone();
        let rows = reader
            .records()
            .enumerate()
            .map(|(i, record)| {
                let line = comment_lines + i + 2;
                let record = record.map_err(|e| bad(format!("line {line}: {e}")))?;
                let get = |k: &str| {
                    header
                        .iter()
                        .position(|h| h == k)
                        .and_then(|j| record.get(j))
                        .map(String::from)
                };
                row_from(&get).map_err(|e| bad(format!("line {line}: {e}")))
            })
            .collect::<Result<Vec<_>>>()?;
        let fit_ranges = match meta.get("fit_ranges") {
            Some(t) if !t.is_empty() => {
                parse_ranges(t).map_err(|e| bad(format!("fit_ranges: {e}")))?
            }
            _ => Vec::new(),
        };
        Ok(GridTable {
            grid_fingerprint: meta.get("grid_fingerprint").cloned().unwrap_or_default(),
            shard: meta.get("shard").cloned(),
            fit_ranges,
            fits: Vec::new(),
            rows,
        })
    }
}
