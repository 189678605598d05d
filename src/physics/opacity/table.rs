//! `table:PATH`: a user opacity table in this project's CSV format.
//!
//! Format: optional comment lines starting with `#` and blank lines anywhere; one header line
//! `log10_T,log10_R,log10_kappa`; then one grid point per line, with R = rho / T6^3
//! (rho in g cm^-3, T6 = T / 1e6 K) and kappa in cm^2 g^-1. The rows form a complete
//! rectangular grid sorted by log10_T and, within each log10_T, by log10_R, with the same
//! log10_R values for every log10_T; at least 2 values on each axis. A table describes one
//! composition: the X and Z passed to [`Opacity::kappa`] are ignored.
//!
//! Limits, checked when the table is read (an error names the file and the line): log10_T in
//! [`LOG10_T_RANGE`], log10_R in [`LOG10_R_RANGE`], log10_kappa in [`LOG10_KAPPA_RANGE`], and
//! neighbouring values on each axis at least [`MIN_AXIS_STEP`] apart. Within them no
//! intermediate of the interpolation can overflow, and since the Steffen interpolant stays
//! between the values of the nodes around it (it is monotone on each interval; Steffen 1990),
//! the interpolated log10 kappa stays in [`LOG10_KAPPA_RANGE`]: kappa is finite and positive
//! everywhere in and (clamped) around the table, even times the largest opacity factor.

use super::{check_point, Opacity};
use crate::error::{Error, PhysicsError, Result};
use crate::numerics::interpolation::{interval, steffen};
use crate::physics::composition::Composition;
use std::path::Path;

/// The header line the format requires.
pub const TABLE_HEADER: &str = "log10_T,log10_R,log10_kappa";

/// Allowed log10 T (T in K): 1 K to 1e12 K, beyond any star's interior or atmosphere.
pub const LOG10_T_RANGE: (f64, f64) = (0.0, 12.0);
/// Allowed log10 R (R = rho / T6^3 in g cm^-3), wider than any published table's.
pub const LOG10_R_RANGE: (f64, f64) = (-30.0, 30.0);
/// Allowed log10 kappa (kappa in cm^2 g^-1): 1e-30 to 1e30, so that kappa times any opacity
/// factor (at most 1e6) and the quantities built from it stay finite.
pub const LOG10_KAPPA_RANGE: (f64, f64) = (-30.0, 30.0);
/// Smallest step between neighbouring values of log10_T or log10_R (a smaller one would make
/// the interpolation's slopes overflow).
pub const MIN_AXIS_STEP: f64 = 1e-6;

/// An opacity table interpolated by a tensor product of Steffen (1990, A&A 239, 443)
/// monotone cubic Hermite splines in log10_R and log10_T on log10_kappa (C1, no overshoot
/// between grid points).
#[derive(Debug, Clone, PartialEq)]
pub struct TableOpacity {
    label: String,
    clamp: bool,
    log_t: Vec<f64>,
    log_r: Vec<f64>,
    /// log10 kappa, T-major: index it * n_r + ir.
    log_kappa: Vec<f64>,
}

fn bad(path: &str, line: usize, reason: impl std::fmt::Display) -> Error {
    Error::BadFile {
        path: path.to_string(),
        reason: format!("line {line}: {reason}"),
    }
}

impl TableOpacity {
    /// Read a table from `path`. With `clamp`, points outside the table use the nearest edge
    /// value instead of returning an error.
    pub fn from_file(path: &Path, clamp: bool) -> Result<Self> {
        let label = path.display().to_string();
        let text = std::fs::read_to_string(path).map_err(|e| Error::BadFile {
            path: label.clone(),
            reason: format!("cannot read the opacity table: {e}"),
        })?;
        Self::from_csv(&text, &label, clamp)
    }

    /// Parse a table from CSV `text`; `label` names it in errors (normally the path).
    ///
    /// Errors ([`Error::BadFile`] with the line number) for a missing or wrong header, a row
    /// without exactly three values, a value that is not a finite number, rows out of order, a
    /// repeated grid point, or a grid that is not complete and rectangular.
    pub fn from_csv(text: &str, label: &str, clamp: bool) -> Result<Self> {
        let mut header_seen = false;
        let mut log_t: Vec<f64> = Vec::new();
        let mut log_r: Vec<f64> = Vec::new();
        let mut log_kappa: Vec<f64> = Vec::new();
        // Position inside the current log10_T block.
        let mut in_block = 0usize;
        let mut prev_line = 0usize;
        let mut last_line = 0usize;
        for (index, raw) in text.lines().enumerate() {
            let line = index + 1;
            last_line = line;
            let trimmed = raw.trim();
            if trimmed.is_empty() || trimmed.starts_with('#') {
                continue;
            }
            if !header_seen {
                let compact: String = trimmed.chars().filter(|c| !c.is_whitespace()).collect();
                if compact != TABLE_HEADER {
                    return Err(bad(
                        label,
                        line,
                        format!("expected the header `{TABLE_HEADER}`, found `{trimmed}`"),
                    ));
                }
                header_seen = true;
                continue;
            }
            let fields: Vec<&str> = trimmed.split(',').map(str::trim).collect();
            if fields.len() != 3 {
                return Err(bad(
                    label,
                    line,
                    format!(
                        "expected 3 comma-separated values (log10_T,log10_R,log10_kappa), found {}",
                        fields.len()
                    ),
                ));
            }
            let mut values = [0.0; 3];
            for (k, (field, name)) in fields
                .iter()
                .zip(["log10_T", "log10_R", "log10_kappa"])
                .enumerate()
            {
                values[k] = match field.parse::<f64>() {
                    Ok(v) if v.is_finite() => v,
                    _ => {
                        return Err(bad(
                            label,
                            line,
                            format!("{name} value `{field}` is not a finite number"),
                        ))
                    }
                };
            }
            for (value, name, (lo, hi)) in [
                (values[0], "log10_T", LOG10_T_RANGE),
                (values[1], "log10_R", LOG10_R_RANGE),
                (values[2], "log10_kappa", LOG10_KAPPA_RANGE),
            ] {
                if !(lo..=hi).contains(&value) {
                    return Err(bad(
                        label,
                        line,
                        format!("{name} = {value} is outside the allowed [{lo}, {hi}]"),
                    ));
                }
            }
            let [t, r, k] = values;
            let too_close = |a: f64, b: f64| (a - b).abs() < MIN_AXIS_STEP;
            match log_t.last().copied() {
                None => {
                    log_t.push(t);
                    log_r.push(r);
                    in_block = 1;
                }
                Some(current) if t == current => {
                    let prev_r = log_r[in_block - 1];
                    if r == prev_r {
                        return Err(bad(
                            label,
                            line,
                            format!("duplicates the grid point (log10_T {t}, log10_R {r}) of line {prev_line}"),
                        ));
                    }
                    if r < prev_r {
                        return Err(bad(
                            label,
                            line,
                            format!("log10_R {r} is smaller than {prev_r} on line {prev_line}: rows must be sorted by log10_R within each log10_T"),
                        ));
                    }
                    if too_close(r, prev_r) {
                        return Err(bad(
                            label,
                            line,
                            format!("log10_R {r} is closer than {MIN_AXIS_STEP} to {prev_r} on line {prev_line}"),
                        ));
                    }
                    if log_t.len() == 1 {
                        log_r.push(r);
                    } else if in_block >= log_r.len() || r != log_r[in_block] {
                        return Err(bad(
                            label,
                            line,
                            format!("log10_R {r} is not on the grid of the first log10_T block (the grid must be complete and rectangular)"),
                        ));
                    }
                    in_block += 1;
                }
                Some(current) if t > current => {
                    if in_block != log_r.len() {
                        return Err(bad(
                            label,
                            line,
                            format!("the block log10_T = {current} has {in_block} rows but the first block has {} (the grid must be complete and rectangular)", log_r.len()),
                        ));
                    }
                    if r != log_r[0] {
                        return Err(bad(
                            label,
                            line,
                            format!("log10_R {r} is not the first grid value {} (the grid must be complete and rectangular)", log_r[0]),
                        ));
                    }
                    if too_close(t, current) {
                        return Err(bad(
                            label,
                            line,
                            format!("log10_T {t} is closer than {MIN_AXIS_STEP} to {current} on line {prev_line}"),
                        ));
                    }
                    log_t.push(t);
                    in_block = 1;
                }
                Some(current) => {
                    return Err(bad(
                        label,
                        line,
                        format!("log10_T {t} is smaller than {current} on line {prev_line}: rows must be sorted by log10_T"),
                    ));
                }
            }
            log_kappa.push(k);
            prev_line = line;
        }
        if !header_seen {
            return Err(bad(
                label,
                last_line.max(1),
                format!("no header `{TABLE_HEADER}`"),
            ));
        }
        if in_block != log_r.len() {
            return Err(bad(
                label,
                last_line,
                format!("the last block has {in_block} rows but the first block has {} (the grid must be complete and rectangular)", log_r.len()),
            ));
        }
        if log_t.len() < 2 || log_r.len() < 2 {
            return Err(bad(
                label,
                last_line,
                format!(
                    "the grid has {} log10_T and {} log10_R values; at least 2 of each are needed",
                    log_t.len(),
                    log_r.len()
                ),
            ));
        }
        Ok(Self {
            label: label.to_string(),
            clamp,
            log_t,
            log_r,
            log_kappa,
        })
    }

    /// (smallest, largest) log10_T of the grid.
    pub fn log10_t_range(&self) -> (f64, f64) {
        (self.log_t[0], self.log_t[self.log_t.len() - 1])
    }

    /// (smallest, largest) log10_R of the grid.
    pub fn log10_r_range(&self) -> (f64, f64) {
        (self.log_r[0], self.log_r[self.log_r.len() - 1])
    }

    /// Interpolated log10 kappa at (log10 T, log10 R) inside the grid (clamped onto it).
    pub fn log10_kappa_at(&self, log_t: f64, log_r: f64) -> f64 {
        let (t0, t1) = self.log10_t_range();
        let (r0, r1) = self.log10_r_range();
        let lt = log_t.clamp(t0, t1);
        let lr = log_r.clamp(r0, r1);
        let n_r = self.log_r.len();
        let i = interval(&self.log_t, lt);
        let j = interval(&self.log_r, lr);
        let lo = i.saturating_sub(1);
        let hi = (i + 2).min(self.log_t.len() - 1);
        let mut values = [0.0; 4];
        for (slot, it) in (lo..=hi).enumerate() {
            let row = &self.log_kappa[it * n_r..(it + 1) * n_r];
            values[slot] = steffen(&self.log_r, row, j, lr);
        }
        steffen(&self.log_t[lo..=hi], &values[..=hi - lo], i - lo, lt)
    }
}

impl Opacity for TableOpacity {
    fn caution(&self, rho: f64, t: f64, _comp: &Composition) -> Option<&'static str> {
        let log_t = t.log10();
        let log_r = rho.log10() - 3.0 * (log_t - 6.0);
        let (t0, t1) = self.log10_t_range();
        let (r0, r1) = self.log10_r_range();
        let inside = (t0..=t1).contains(&log_t) && (r0..=r1).contains(&log_r);
        (self.clamp && !inside)
            .then_some("outside the opacity table: its nearest edge value is used")
    }

    fn name(&self) -> String {
        if self.clamp {
            format!("table-clamped:{}", self.label)
        } else {
            format!("table:{}", self.label)
        }
    }

    /// kappa = 10^(interpolated log10 kappa) at log10 T and log10 R = log10 rho - 3 log10(T/1e6).
    /// Outside the grid: an error naming the point and the range, unless clamping. A value that
    /// is not finite and positive (impossible within the table's limits, see the module
    /// documentation) is an error, never returned.
    fn kappa(&self, rho: f64, t: f64, _comp: &Composition) -> Result<f64, PhysicsError> {
        check_point("table", rho, t)?;
        let log_t = t.log10();
        let log_r = rho.log10() - 3.0 * (log_t - 6.0);
        let (t0, t1) = self.log10_t_range();
        let (r0, r1) = self.log10_r_range();
        let inside = (t0..=t1).contains(&log_t) && (r0..=r1).contains(&log_r);
        if !inside && !self.clamp {
            return Err(PhysicsError::new(
                &self.name(),
                format!(
                    "point log10_T = {log_t:.4}, log10_R = {log_r:.4} is outside the table (log10_T {t0}..{t1}, log10_R {r0}..{r1}); use table-clamped:PATH to clamp"
                ),
                rho,
                t,
            ));
        }
        let kappa = 10f64.powf(self.log10_kappa_at(log_t, log_r));
        if kappa.is_finite() && kappa > 0.0 {
            Ok(kappa)
        } else {
            Err(PhysicsError::new(
                &self.name(),
                format!("the interpolated opacity {kappa} is not a finite positive number"),
                rho,
                t,
            ))
        }
    }
}

/// A table of `law` at composition `comp` on the grid `log10_t` x `log10_r`, in the format
/// above, with `comment` written as leading `#` lines. Used to make the demo table.
pub fn tabulate(
    law: &dyn Opacity,
    comp: &Composition,
    log10_t: &[f64],
    log10_r: &[f64],
    comment: &str,
) -> Result<String> {
    let mut out = String::new();
    for line in comment.lines() {
        out.push_str("# ");
        out.push_str(line);
        out.push('\n');
    }
    out.push_str(TABLE_HEADER);
    out.push('\n');
    for &lt in log10_t {
        for &lr in log10_r {
            let t = 10f64.powf(lt);
            let rho = 10f64.powf(lr + 3.0 * (lt - 6.0));
            let kappa = law.kappa(rho, t, comp)?;
            out.push_str(&format!("{lt},{lr},{:.10}\n", kappa.log10()));
        }
    }
    Ok(out)
}
