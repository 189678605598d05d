//! One grid point's result as a flat record (the rows of `sequence` and `merge`). Output code
//! writes and reads these; the columns come from [`GridRow::columns`].

use super::run::PointResult;
use super::Grid;
use crate::error::Error;
use crate::physics::PhysicsSpec;
use crate::structure::ModelSummary;

/// How a grid point ended.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum RowStatus {
    /// Converged from the built-in guess.
    Converged,
    /// Converged from a neighbouring model's solution (continuation).
    Continued,
    /// Did not converge; the code names the reason (see
    /// [`crate::structure::NotConverged::code`]).
    NotConverged(&'static str),
    /// Could not be attempted or failed otherwise (e.g. a law failed at the start).
    Failed,
}

impl RowStatus {
    /// The short code written in the `status` column.
    pub fn code(&self) -> &'static str {
        match self {
            RowStatus::Converged => "converged",
            RowStatus::Continued => "continued",
            RowStatus::NotConverged(code) => code,
            RowStatus::Failed => "failed",
        }
    }

    /// Whether the model converged (from the guess or by continuation).
    pub fn converged(&self) -> bool {
        matches!(self, RowStatus::Converged | RowStatus::Continued)
    }

    /// The status for the code `code` as written by [`RowStatus::code`].
    pub fn from_code(code: &str) -> Option<Self> {
        const NOT_CONVERGED: [&str; 6] = [
            "start-not-integrable",
            "stalled",
            "singular-jacobian",
            "jacobian-failed",
            "reevaluation-failed",
            "iteration-limit",
        ];
        match code {
            "converged" => Some(RowStatus::Converged),
            "continued" => Some(RowStatus::Continued),
            "failed" => Some(RowStatus::Failed),
            other => NOT_CONVERGED
                .iter()
                .find(|c| **c == other)
                .map(|c| RowStatus::NotConverged(c)),
        }
    }
}

/// One grid point's result.
#[derive(Debug, Clone, PartialEq)]
pub struct GridRow {
    /// Fingerprint of the whole grid's definition (the same in every shard of one grid).
    pub grid_fingerprint: String,
    /// Position in the whole grid (0-based, canonical order variant, Z, X, mass).
    pub grid_index: usize,
    /// Number of points in the whole grid.
    pub grid_size: usize,
    /// Physics variant name.
    pub variant: String,
    /// How it ended.
    pub status: RowStatus,
    /// Why it did not converge (empty when it did).
    pub reason: String,
    /// Warnings of a converged model whose laws were used outside their validity
    /// ([`crate::structure::ZamsModel::warnings`]; empty otherwise).
    pub warnings: Vec<String>,
    /// Mass, M_sun.
    pub mass_msun: f64,
    /// Hydrogen mass fraction X.
    pub x: f64,
    /// Metal mass fraction Z.
    pub z: f64,
    /// The laws of the variant.
    pub physics: PhysicsSpec,
    /// Newton iterations (also for a model that did not converge; `None` if none were run).
    pub iterations: Option<usize>,
    /// The summary quantities of a converged model.
    pub summary: Option<ModelSummary>,
}

impl GridRow {
    /// The identification columns, before the physics keys and the summary quantities.
    pub const ID_COLUMNS: [&'static str; 12] = [
        "grid_fingerprint",
        "grid_index",
        "grid_size",
        "variant",
        "converged",
        "status",
        "reason",
        "warnings",
        "mass_msun",
        "x",
        "y",
        "z",
    ];

    /// The physics columns (the keys of [`PhysicsSpec`]).
    pub const PHYSICS_COLUMNS: [&'static str; 8] = [
        "preset",
        "eos",
        "opacity",
        "opacity_factor",
        "rates",
        "rates_factor",
        "convection",
        "atmosphere",
    ];

    /// Every column in order: identification, physics, `iterations`, then the summary
    /// quantities of [`ModelSummary::FIELDS`].
    pub fn columns() -> Vec<&'static str> {
        Self::ID_COLUMNS
            .iter()
            .chain(&Self::PHYSICS_COLUMNS)
            .copied()
            .chain(std::iter::once("iterations"))
            .chain(ModelSummary::FIELDS.iter().map(|f| f.key))
            .collect()
    }

    /// Separator of the warnings in the `warnings` column.
    pub const WARNING_SEPARATOR: &'static str = " | ";

    /// The row for one result of `grid`.
    pub fn new(grid: &Grid, fingerprint: &str, r: &PointResult) -> Self {
        let p = &r.point;
        let warnings = r
            .outcome
            .as_ref()
            .map_or_else(|_| Vec::new(), |m| m.warnings.clone());
        let (status, reason, iterations, summary) = match &r.outcome {
            Ok(m) => (
                if r.continued {
                    RowStatus::Continued
                } else {
                    RowStatus::Converged
                },
                String::new(),
                Some(m.stats.iterations),
                Some(m.summary),
            ),
            Err(Error::NoConvergence(nc)) => (
                RowStatus::NotConverged(nc.code()),
                nc.reason(),
                Some(nc.iterations),
                None,
            ),
            Err(e) => (RowStatus::Failed, e.to_string(), None, None),
        };
        Self {
            grid_fingerprint: fingerprint.to_string(),
            grid_index: p.index,
            grid_size: grid.points.len(),
            variant: grid.variants[p.variant].name.clone(),
            status,
            reason,
            warnings,
            mass_msun: p.mass_msun,
            x: p.composition.x(),
            z: p.composition.z(),
            physics: grid.physics[p.variant].spec().clone(),
            iterations,
            summary,
        }
    }

    /// Whether the model converged.
    pub fn converged(&self) -> bool {
        self.status.converged()
    }
}
