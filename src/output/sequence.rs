//! Output schema of a grid run (`sequence`) and of merged shards: one row per grid point.
//! CSV columns and JSON keys are the field names; empty CSV cells (JSON `null`) mean "no value"
//! (a model that did not converge has only its identification and `status`).

use crate::error::{Error, Result};
use crate::grid::fits::PowerLawFit;
use crate::grid::run::PointResult;
use crate::grid::Grid;
use serde::{Deserialize, Serialize};
use std::path::Path;

/// One grid point's result.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SequenceRow {
    /// Fingerprint of the whole grid's definition (the same in every shard of one grid).
    pub grid_fingerprint: String,
    /// Position in the whole grid (0-based, canonical order variant, Z, X, mass).
    pub grid_index: usize,
    /// Number of points in the whole grid.
    pub grid_size: usize,
    /// Physics variant name.
    pub variant: String,
    /// `converged`, `converged (continuation)` when a neighbour's solution was the starting
    /// guess, or the reason it failed.
    pub status: String,
    /// Mass, M_sun.
    pub mass_msun: f64,
    /// Hydrogen mass fraction.
    pub x: f64,
    /// Metal mass fraction.
    pub z: f64,
    /// Preset of the variant's laws.
    pub physics_preset: String,
    /// Equation of state.
    pub eos: String,
    /// Opacity law.
    pub opacity: String,
    /// Energy generation law.
    pub rates: String,
    /// Convection law.
    pub convection: String,
    /// Outer boundary.
    pub atmosphere: String,
    /// Newton iterations.
    pub iterations: Option<usize>,
    /// Radius, R_sun.
    pub radius_rsun: Option<f64>,
    /// Luminosity, L_sun.
    pub luminosity_lsun: Option<f64>,
    /// Effective temperature, K.
    pub teff_k: Option<f64>,
    /// log10 surface gravity, cgs.
    pub log_g_cgs: Option<f64>,
    /// Central temperature, K.
    pub central_temperature_k: Option<f64>,
    /// Central density, g cm^-3.
    pub central_density_g_cm3: Option<f64>,
    /// Central pressure, dyn cm^-2.
    pub central_pressure_dyn_cm2: Option<f64>,
    /// Central electron degeneracy psi.
    pub central_degeneracy: Option<f64>,
    /// Convective core mass fraction.
    pub convective_core_mass_fraction: Option<f64>,
    /// Convective envelope mass fraction.
    pub convective_envelope_mass_fraction: Option<f64>,
    /// CNO share of L.
    pub cno_luminosity_fraction: Option<f64>,
    /// L / L_Edd (electron scattering).
    pub eddington_ratio: Option<f64>,
    /// Kelvin–Helmholtz time, yr.
    pub kelvin_helmholtz_time_yr: Option<f64>,
    /// Dynamical time, s.
    pub dynamical_time_s: Option<f64>,
    /// Main-sequence lifetime estimate, yr.
    pub nuclear_time_yr: Option<f64>,
    /// Virial-theorem residual.
    pub virial_residual: Option<f64>,
    /// Energy-conservation residual.
    pub luminosity_residual: Option<f64>,
}

impl SequenceRow {
    /// The row for one result of `grid`.
    pub fn new(grid: &Grid, fingerprint: &str, r: &PointResult) -> Self {
        let p = &r.point;
        let d = grid.physics[p.variant].describe();
        let s = r.outcome.as_ref().ok();
        let status = match &r.outcome {
            Ok(_) if r.continued => "converged (continuation)".to_string(),
            Ok(_) => "converged".to_string(),
            Err(why) => why.clone(),
        };
        Self {
            grid_fingerprint: fingerprint.to_string(),
            grid_index: p.index,
            grid_size: grid.points.len(),
            variant: grid.variants[p.variant].name.clone(),
            status,
            mass_msun: p.mass_msun,
            x: p.composition.x(),
            z: p.composition.z(),
            physics_preset: d.preset,
            eos: d.eos,
            opacity: d.opacity,
            rates: d.rates,
            convection: d.convection,
            atmosphere: d.atmosphere,
            iterations: s.map(|s| s.iterations),
            radius_rsun: s.and_then(|s| s.radius_rsun),
            luminosity_lsun: s.and_then(|s| s.luminosity_lsun),
            teff_k: s.and_then(|s| s.teff_k),
            log_g_cgs: s.and_then(|s| s.log_g_cgs),
            central_temperature_k: s.and_then(|s| s.central_temperature_k),
            central_density_g_cm3: s.and_then(|s| s.central_density_g_cm3),
            central_pressure_dyn_cm2: s.and_then(|s| s.central_pressure_dyn_cm2),
            central_degeneracy: s.and_then(|s| s.central_degeneracy),
            convective_core_mass_fraction: s.and_then(|s| s.convective_core_mass_fraction),
            convective_envelope_mass_fraction: s.and_then(|s| s.convective_envelope_mass_fraction),
            cno_luminosity_fraction: s.and_then(|s| s.cno_luminosity_fraction),
            eddington_ratio: s.and_then(|s| s.eddington_ratio),
            kelvin_helmholtz_time_yr: s.and_then(|s| s.kelvin_helmholtz_time_yr),
            dynamical_time_s: s.and_then(|s| s.dynamical_time_s),
            nuclear_time_yr: s.and_then(|s| s.nuclear_time_yr),
            virial_residual: s.and_then(|s| s.virial_residual),
            luminosity_residual: s.and_then(|s| s.luminosity_residual),
        }
    }

    /// Whether the model converged.
    pub fn converged(&self) -> bool {
        self.status.starts_with("converged")
    }
}

/// A whole run as JSON: the grid fingerprint, the shard, the fits, and the rows.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SequenceTable {
    /// Fingerprint of the grid.
    pub grid_fingerprint: String,
    /// `K/N` when this is one shard, `null` for a whole grid.
    pub shard: Option<String>,
    /// Piecewise power-law fits of L(M) and R(M), per variant and composition (empty for a shard).
    #[serde(default)]
    pub fits: Vec<FitGroup>,
    /// The rows, in grid order.
    pub rows: Vec<SequenceRow>,
}

/// The fits of one variant and composition.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct FitGroup {
    /// Variant name.
    pub variant: String,
    /// Hydrogen mass fraction.
    pub x: f64,
    /// Metal mass fraction.
    pub z: f64,
    /// One fit per mass range.
    pub ranges: Vec<PowerLawFitRow>,
}

/// A fit as stored (mirror of [`PowerLawFit`] that also deserialises).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct PowerLawFitRow {
    /// Lower end, M_sun.
    pub from_msun: f64,
    /// Upper end, M_sun.
    pub to_msun: f64,
    /// Converged models in the range.
    pub models: usize,
    /// Exponent of L(M).
    pub luminosity_exponent: Option<f64>,
    /// Exponent of R(M).
    pub radius_exponent: Option<f64>,
}

impl From<PowerLawFit> for PowerLawFitRow {
    fn from(f: PowerLawFit) -> Self {
        Self {
            from_msun: f.from_msun,
            to_msun: f.to_msun,
            models: f.models,
            luminosity_exponent: f.luminosity_exponent,
            radius_exponent: f.radius_exponent,
        }
    }
}

/// The CSV columns of a sequence table, in order (the fields of [`SequenceRow`]).
pub const SEQUENCE_COLUMNS: [&str; 32] = [
    "grid_fingerprint",
    "grid_index",
    "grid_size",
    "variant",
    "status",
    "mass_msun",
    "x",
    "z",
    "physics_preset",
    "eos",
    "opacity",
    "rates",
    "convection",
    "atmosphere",
    "iterations",
    "radius_rsun",
    "luminosity_lsun",
    "teff_k",
    "log_g_cgs",
    "central_temperature_k",
    "central_density_g_cm3",
    "central_pressure_dyn_cm2",
    "central_degeneracy",
    "convective_core_mass_fraction",
    "convective_envelope_mass_fraction",
    "cno_luminosity_fraction",
    "eddington_ratio",
    "kelvin_helmholtz_time_yr",
    "dynamical_time_s",
    "nuclear_time_yr",
    "virial_residual",
    "luminosity_residual",
];

/// Whether a path names a JSON file (by extension), else CSV.
pub fn is_json(path: &Path) -> bool {
    path.extension()
        .is_some_and(|e| e.eq_ignore_ascii_case("json"))
}

/// Write rows to `path` (CSV, or JSON if it ends in `.json`), atomically.
pub fn write_table(path: &Path, table: &SequenceTable) -> Result<()> {
    crate::output::write_atomically(path, |w| {
        if is_json(path) {
            serde_json::to_writer_pretty(&mut *w, table).map_err(std::io::Error::other)?;
            w.write_all(b"\n")
        } else {
            let mut csv = csv::Writer::from_writer(w);
            if table.rows.is_empty() {
                // An empty shard still names its columns.
                csv.write_record(SEQUENCE_COLUMNS)
                    .map_err(std::io::Error::other)?;
            }
            for r in &table.rows {
                csv.serialize(r).map_err(std::io::Error::other)?;
            }
            csv.flush()
        }
    })
}

/// Read rows written by [`write_table`] (CSV or JSON by extension).
pub fn read_rows(path: &Path) -> Result<Vec<SequenceRow>> {
    let bad = |reason: String| Error::BadFile {
        path: path.display().to_string(),
        reason,
    };
    if is_json(path) {
        let text = std::fs::read_to_string(path).map_err(|e| bad(format!("cannot read: {e}")))?;
        let t: SequenceTable = serde_json::from_str(&text)
            .map_err(|e| bad(format!("not a starpoise sequence table: {e}")))?;
        Ok(t.rows)
    } else {
        let mut reader =
            csv::Reader::from_path(path).map_err(|e| bad(format!("cannot read: {e}")))?;
        reader
            .deserialize()
            .enumerate()
            .map(|(i, r)| {
                r.map_err(|e| bad(format!("line {}: not a starpoise sequence row: {e}", i + 2)))
            })
            .collect()
    }
}
