//! Output schema of a verification run: one JSON object per check, and the aligned text table.
//!
//! JSON keys (an array of objects, one per check, in the order of [`super::checks`]):
//! - `id`, `group`, `description`, `source`: as in [`super::Check`];
//! - `expected`: the expected value (for a range, the nominal value inside it), in the unit the
//!   description names;
//! - `tolerance`: `{"relative": r}`, `{"absolute": a}` or `{"range": [lo, hi]}`;
//! - `got`: the computed value, or `null` if it could not be computed;
//! - `error`: why it could not be computed, or `null`;
//! - `passed`: whether `got` lies within the tolerance.

use super::{Check, CheckResult, Tolerance};
use serde::Serialize;

/// One check and its outcome, as written to JSON.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct CheckReport {
    /// Stable identifier of the check.
    pub id: String,
    /// Topic of the check.
    pub group: String,
    /// What is checked, with units.
    pub description: String,
    /// The publication (with its flag) or "fact of the trade".
    pub source: String,
    /// The expected value.
    pub expected: f64,
    /// How close `got` must be.
    pub tolerance: Tolerance,
    /// The computed value (`None` if computing it failed).
    pub got: Option<f64>,
    /// Why the value could not be computed.
    pub error: Option<String>,
    /// Whether the check passed.
    pub passed: bool,
}

impl CheckReport {
    /// The report of `check` with outcome `result`.
    pub fn new(check: &Check, result: &CheckResult) -> Self {
        let (got, error) = match &result.got {
            Ok(v) => (Some(*v), None),
            Err(e) => (None, Some(e.clone())),
        };
        Self {
            id: check.id.to_string(),
            group: check.group.to_string(),
            description: check.description.to_string(),
            source: check.source.to_string(),
            expected: check.expected,
            tolerance: check.tolerance,
            got,
            error,
            passed: result.passed,
        }
    }
}

/// Counts of a run.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Summary {
    /// Checks that passed.
    pub passed: usize,
    /// Checks that failed (including those that could not be computed).
    pub failed: usize,
}

impl Summary {
    /// Count the outcomes in `reports`.
    pub fn of(reports: &[CheckReport]) -> Self {
        let passed = reports.iter().filter(|r| r.passed).count();
        Self {
            passed,
            failed: reports.len() - passed,
        }
    }

    /// The closing line: `N passed, M failed`.
    pub fn line(&self) -> String {
        format!("{} passed, {} failed", self.passed, self.failed)
    }
}

/// A number for a table cell: at most ten significant figures with trailing zeros dropped,
/// plain decimals between 1e-3 and 1e6, otherwise scientific.
pub fn format_number(v: f64) -> String {
    let text = format_got(v);
    match text.split_once('e') {
        Some((mantissa, exponent)) => format!("{}e{exponent}", trim_zeros(mantissa)),
        None => trim_zeros(&text).to_string(),
    }
}

fn trim_zeros(s: &str) -> &str {
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.')
    } else {
        s
    }
}

/// A computed value for a table cell: ten significant figures, plain decimals between 1e-3
/// and 1e6, otherwise scientific.
fn format_got(v: f64) -> String {
    if v == 0.0 {
        "0".to_string()
    } else if (1e-3..1e6).contains(&v.abs()) {
        let decimals = (9 - v.abs().log10().floor() as i32).max(0) as usize;
        format!("{v:.decimals$}")
    } else {
        format!("{v:.9e}")
    }
}

/// The aligned text table: check, expected, got, tolerance, result, source, one row per check,
/// then the failures' error messages and the summary line.
pub fn to_text(reports: &[CheckReport]) -> String {
    let header = ["check", "expected", "got", "tolerance", "result", "source"];
    let rows: Vec<[String; 6]> = reports
        .iter()
        .map(|r| {
            [
                r.id.clone(),
                format_number(r.expected),
                r.got.map_or_else(|| "error".to_string(), format_got),
                r.tolerance.describe(),
                if r.passed { "pass" } else { "FAIL" }.to_string(),
                r.source.clone(),
            ]
        })
        .collect();
    let mut width = header.map(str::len);
    for row in &rows {
        for (w, cell) in width.iter_mut().zip(row) {
            *w = (*w).max(cell.chars().count());
        }
    }
    let line = |cells: [&str; 6]| {
        let mut out = String::new();
        for (k, (cell, w)) in cells.iter().zip(width).enumerate() {
            if k + 1 == cells.len() {
                out.push_str(cell);
            } else if k == 1 || k == 2 {
                // Numbers right-aligned.
                out.push_str(&format!("{cell:>w$}  "));
            } else {
                out.push_str(&format!("{cell:<w$}  "));
            }
        }
        out.push('\n');
        out
    };
    let mut text = line(header);
    for row in &rows {
        text.push_str(&line([
            &row[0], &row[1], &row[2], &row[3], &row[4], &row[5],
        ]));
    }
    for r in reports {
        if let Some(e) = &r.error {
            text.push_str(&format!("{}: {e}\n", r.id));
        }
    }
    text.push_str(&Summary::of(reports).line());
    text.push('\n');
    text
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_are_formatted_for_reading() {
        assert_eq!(format_number(0.0), "0");
        assert_eq!(format_number(0.4), "0.4");
        assert_eq!(format_number(3.653753736), "3.653753736");
        assert_eq!(format_number(1.98841e33), "1.98841e33");
        assert_eq!(format_number(13.5e6), "1.35e7");
        assert_eq!(format_number(std::f64::consts::PI), "3.141592654");
        assert_eq!(format_number(0.20031 * 1.7), "0.340527");
        assert_eq!(format_number(0.15), "0.15");
        assert_eq!(format_number(-2.5e-4), "-2.5e-4");
        assert_eq!(format_got(0.694787635646), "0.6947876356");
        assert_eq!(format_got(622.40788231), "622.4078823");
        assert_eq!(format_got(2.4e-10), "2.400000000e-10");
    }
}
