//! Files of a grid run (`sequence`) and of merged shards: one row per grid point, columns from
//! [`GridRow::columns`] (identification, physics, iterations, the summary quantities).
//!
//! - CSV: leading `# key: value` metadata lines (`grid_fingerprint`, `shard`, `fit_ranges`),
//!   then a plain header row and one row per point (read it with `pandas.read_csv(path,
//!   comment="#")`). Numbers are written in the shortest form that reads back to the same
//!   double; an empty cell means "no value" (a model that did not converge has only its
//!   identification, status, reason and iteration count).
//! - JSON: one object `{grid_fingerprint, shard, fit_ranges, fits, rows}`, `rows` an array of
//!   objects with the same keys as the CSV columns (`null` for no value).

use crate::error::{Error, Result};
use crate::grid::fits::{format_ranges, parse_ranges, FitGroup};
use crate::grid::{GridRow, GridTable, RowStatus};
use crate::physics::PhysicsSpec;
use crate::structure::ModelSummary;
use serde_json::{json, Map, Value};
use std::path::Path;

/// One cell of a row.
#[derive(Debug, Clone, PartialEq)]
enum Cell {
    Text(String),
    Number(f64),
    Count(usize),
    Flag(bool),
    Empty,
}

impl Cell {
    fn number(v: f64) -> Self {
        if v.is_finite() {
            Cell::Number(v)
        } else {
            Cell::Empty
        }
    }

    fn csv(&self) -> String {
        match self {
            Cell::Text(s) => s.clone(),
            Cell::Number(v) => format!("{v}"),
            Cell::Count(n) => n.to_string(),
            Cell::Flag(b) => b.to_string(),
            Cell::Empty => String::new(),
        }
    }

    fn json(&self) -> Value {
        match self {
            Cell::Text(s) => Value::String(s.clone()),
            Cell::Number(v) => json!(v),
            Cell::Count(n) => json!(n),
            Cell::Flag(b) => Value::Bool(*b),
            Cell::Empty => Value::Null,
        }
    }
}

/// The cells of `row`, in the order of [`GridRow::columns`].
fn cells(row: &GridRow) -> Vec<Cell> {
    let p = &row.physics;
    let mut out = vec![
        Cell::Text(row.grid_fingerprint.clone()),
        Cell::Count(row.grid_index),
        Cell::Count(row.grid_size),
        Cell::Text(row.variant.clone()),
        Cell::Flag(row.converged()),
        Cell::Text(row.status.code().to_string()),
        Cell::Text(row.reason.clone()),
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
        row.iterations.map_or(Cell::Empty, Cell::Count),
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
        mass_msun: number("mass_msun")?,
        x: number("x")?,
        z: number("z")?,
        physics,
        iterations: count("iterations")?,
        summary,
    })
}

/// Whether a path names a JSON file (by extension), else CSV.
pub fn is_json(path: &Path) -> bool {
    path.extension()
        .is_some_and(|e| e.eq_ignore_ascii_case("json"))
}

/// The whole table as one JSON value.
pub fn table_json(table: &GridTable) -> Value {
    json!({
        "grid_fingerprint": table.grid_fingerprint,
        "shard": table.shard,
        "fit_ranges": table.fit_ranges,
        "fits": table.fits,
        "rows": table.rows.iter().map(row_json).collect::<Vec<_>>(),
    })
}

/// Write the table to `path` (CSV, or JSON if it ends in `.json`), atomically.
pub fn write_table(path: &Path, table: &GridTable) -> Result<()> {
    crate::output::write_output(path, |w| {
        if is_json(path) {
            serde_json::to_writer_pretty(&mut *w, &table_json(table))
                .map_err(std::io::Error::other)?;
            w.write_all(b"\n")
        } else {
            writeln!(w, "# starpoise sequence table")?;
            writeln!(w, "# grid_fingerprint: {}", table.grid_fingerprint)?;
            if let Some(s) = &table.shard {
                writeln!(w, "# shard: {s}")?;
            }
            writeln!(w, "# fit_ranges: {}", format_ranges(&table.fit_ranges))?;
            let mut csv = csv::Writer::from_writer(w);
            csv.write_record(GridRow::columns())
                .map_err(std::io::Error::other)?;
            for r in &table.rows {
                csv.write_record(cells(r).iter().map(Cell::csv))
                    .map_err(std::io::Error::other)?;
            }
            csv.flush()
        }
    })
}

/// Read a table written by [`write_table`] (CSV or JSON by extension). For CSV the fits are not
/// stored (they are recomputed by whoever merges); `fit_ranges` comes from the metadata line.
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
    } else {
        let mut meta = std::collections::HashMap::new();
        for line in text.lines().take_while(|l| l.starts_with('#')) {
            if let Some((k, v)) = line.trim_start_matches('#').split_once(':') {
                meta.insert(k.trim().to_string(), v.trim().to_string());
            }
        }
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
                let line = meta.len() + i + 2;
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
