//! Reading a saved CSV table back for plotting: a model profile or a mass-sequence table,
//! told apart by the header.

use super::hr::{HrPoint, HrSeries};
use crate::error::{Error, Result};
use crate::structure::{ProfileRow, PROFILE_COLUMNS};
use std::path::Path;

/// What a saved table holds.
#[derive(Debug, Clone, PartialEq)]
pub enum PlotInput {
    /// A model profile, centre first (header exactly [`PROFILE_COLUMNS`]).
    Profile(Vec<ProfileRow>),
    /// Mass sequences for an HR diagram: one series per `variant`, or a single one named after
    /// the file.
    Sequence(Vec<HrSeries>),
}

/// Columns a sequence table must have.
const SEQUENCE_COLUMNS: [&str; 3] = ["mass_msun", "teff_k", "luminosity_lsun"];

fn bad(path: &Path, reason: impl Into<String>) -> Error {
    Error::BadFile {
        path: path.display().to_string(),
        reason: reason.into(),
    }
}

fn csv_error(path: &Path, e: &csv::Error) -> Error {
    match e.position() {
        Some(p) => bad(path, format!("line {}: {e}", p.line())),
        None => bad(path, e.to_string()),
    }
}

/// Read a CSV table written by the `zams` profile output or by a mass sequence.
///
/// - Header exactly [`PROFILE_COLUMNS`]: a profile; every row must parse.
/// - Header with `mass_msun`, `teff_k` and `luminosity_lsun` (other columns ignored; leading
///   `#` lines skipped): a sequence. Rows whose optional `status` column is neither `converged`
///   nor `continued`, or with an empty value
///   in one of the three columns, are skipped. With a `variant` column, rows are grouped into
///   one series per variant in order of first appearance; otherwise one series is labelled
///   with the file name without extension.
///
/// Errors: [`Error::BadFile`] naming the file (and the line where one applies) if it cannot be
/// read, the header is neither kind, a value does not parse or is not finite and positive, or
/// no usable row remains.
pub fn read_table(path: &Path) -> Result<PlotInput> {
    let mut reader = csv::ReaderBuilder::new()
        .has_headers(true)
        .comment(Some(b'#'))
        .trim(csv::Trim::All)
        .from_path(path)
        .map_err(|e| csv_error(path, &e))?;
    let header: Vec<String> = reader
        .headers()
        .map_err(|e| csv_error(path, &e))?
        .iter()
        .map(str::to_string)
        .collect();
    if header.iter().map(String::as_str).eq(PROFILE_COLUMNS) {
        return read_profile(path, reader);
    }
    let has = |c: &str| header.iter().any(|h| h == c);
    if SEQUENCE_COLUMNS.iter().all(|c| has(c)) {
        return read_sequence(path, reader, &header);
    }
    if has("r_over_R") {
        return Err(bad(
            path,
            format!(
                "line 1: a profile header must be exactly {}",
                PROFILE_COLUMNS.join(",")
            ),
        ));
    }
    Err(bad(
        path,
        format!(
            "line 1: neither a profile (header {}) nor a sequence table (columns {}, optional status, variant)",
            PROFILE_COLUMNS.join(","),
            SEQUENCE_COLUMNS.join(", ")
        ),
    ))
}

fn read_profile(path: &Path, mut reader: csv::Reader<std::fs::File>) -> Result<PlotInput> {
    let header = reader.headers().map_err(|e| csv_error(path, &e))?.clone();
    let mut rows = Vec::new();
    for record in reader.records() {
        let record = record.map_err(|e| csv_error(path, &e))?;
        // An empty field is a value that does not exist (the centre's Lamb frequencies).
        let mut filled: csv::StringRecord = record
            .iter()
            .map(|f| if f.is_empty() { "NaN" } else { f })
            .collect();
        filled.set_position(record.position().cloned());
        rows.push(
            filled
                .deserialize::<ProfileRow>(Some(&header))
                .map_err(|e| csv_error(path, &e))?,
        );
    }
    if rows.is_empty() {
        return Err(bad(path, "a profile header but no rows"));
    }
    Ok(PlotInput::Profile(rows))
}

fn read_sequence(
    path: &Path,
    mut reader: csv::Reader<std::fs::File>,
    header: &[String],
) -> Result<PlotInput> {
    let index = |c: &str| header.iter().position(|h| h == c);
    let (Some(i_mass), Some(i_teff), Some(i_lum)) = (
        index("mass_msun"),
        index("teff_k"),
        index("luminosity_lsun"),
    ) else {
        return Err(bad(path, "line 1: sequence columns missing"));
    };
    let i_status = index("status");
    let i_variant = index("variant");
    let default_label = path
        .file_stem()
        .map(|s| s.to_string_lossy().into_owned())
        .unwrap_or_else(|| path.display().to_string());
    let mut series: Vec<HrSeries> = Vec::new();
    for record in reader.records() {
        let record = record.map_err(|e| csv_error(path, &e))?;
        let line = record.position().map_or(0, |p| p.line());
        let field = |i: usize| record.get(i).unwrap_or("");
        if let Some(i) = i_status {
            if !matches!(field(i), "converged" | "continued") {
                continue;
            }
        }
        let texts = [field(i_mass), field(i_teff), field(i_lum)];
        if texts.iter().any(|t| t.is_empty()) {
            continue;
        }
        let mut values = [0.0; 3];
        for (k, text) in texts.iter().enumerate() {
            let v: f64 = text.parse().map_err(|_| {
                bad(
                    path,
                    format!(
                        "line {line}: {} = '{text}' is not a number",
                        SEQUENCE_COLUMNS[k]
                    ),
                )
            })?;
            if !(v.is_finite() && v > 0.0) {
                return Err(bad(
                    path,
                    format!(
                        "line {line}: {} = {text} must be finite and positive",
                        SEQUENCE_COLUMNS[k]
                    ),
                ));
            }
            values[k] = v;
        }
        let point = HrPoint {
            mass_msun: values[0],
            teff_k: values[1],
            luminosity_lsun: values[2],
        };
        let label = match i_variant {
            Some(i) => field(i).to_string(),
            None => default_label.clone(),
        };
        match series.iter_mut().find(|s| s.label == label) {
            Some(s) => s.points.push(point),
            None => series.push(HrSeries {
                label,
                points: vec![point],
            }),
        }
    }
    if series.is_empty() {
        return Err(bad(
            path,
            "no row with status converged and values for mass_msun, teff_k, luminosity_lsun",
        ));
    }
    Ok(PlotInput::Sequence(series))
}
