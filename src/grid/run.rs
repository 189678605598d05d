//! Solving the points of a grid in parallel, with continuation for the points that do not
//! converge from the built-in guess.

use super::{Grid, GridPoint};
use crate::error::{Error, Result};
use crate::output::zams::ZamsSummary;
use crate::structure::{guess, solve_detailed, Unknowns, ZamsOutcome, ZamsSettings};
use rayon::prelude::*;

/// The result for one grid point.
#[derive(Debug, Clone)]
pub struct PointResult {
    /// The point.
    pub point: GridPoint,
    /// The summary, or why the model did not converge.
    pub outcome: std::result::Result<ZamsSummary, String>,
    /// The converged unknowns (for continuation).
    pub unknowns: Option<Unknowns>,
    /// Whether the model needed a neighbour's solution as its starting guess.
    pub continued: bool,
}

/// Knobs applied to every model of a run.
#[derive(Debug, Clone, Copy, Default)]
pub struct RunSettings {
    /// Worker threads (0: rayon's default, one per core).
    pub threads: usize,
    /// Finest integrator tolerance (default: the solver's).
    pub tolerance: Option<f64>,
}

fn settings_for(grid: &Grid, p: &GridPoint, run: &RunSettings) -> Result<ZamsSettings> {
    let mut s = ZamsSettings::new(p.mass_msun, p.composition, grid.physics[p.variant].clone())?
        .with_fit_mass_fraction(grid.fit_mass_fraction)?
        .with_profile(false);
    if let Some(t) = run.tolerance {
        s = s.with_tolerance(t)?;
    }
    Ok(s)
}

fn solve_one(settings: ZamsSettings, point: &GridPoint, continued: bool) -> PointResult {
    let (outcome, unknowns) = match solve_detailed(&settings) {
        Ok(ZamsOutcome::Converged(m)) => (Ok(m.summary), Some(m.unknowns)),
        Ok(ZamsOutcome::NotConverged { report, .. }) => (
            Err(format!(
                "not converged after {} iterations (mismatch {:.2e}): {}",
                report.iterations,
                report.residual_norm,
                report.failure.unwrap_or_default()
            )),
            None,
        ),
        Err(e) => (Err(e.to_string()), None),
    };
    PointResult {
        point: point.clone(),
        outcome,
        unknowns,
        continued,
    }
}

/// The nearest converged neighbour in log mass with the same variant and composition.
fn neighbour<'a>(results: &'a [PointResult], p: &GridPoint) -> Option<&'a PointResult> {
    results
        .iter()
        .filter(|r| {
            r.unknowns.is_some()
                && r.point.variant == p.variant
                && r.point.composition == p.composition
        })
        .min_by(|a, b| {
            let da = (a.point.mass_msun / p.mass_msun).ln().abs();
            let db = (b.point.mass_msun / p.mass_msun).ln().abs();
            da.total_cmp(&db)
        })
}

/// Solve `points` of `grid`: every point from the built-in guess in parallel; then, in passes
/// until nothing changes, every failed point from its nearest converged neighbour (the
/// neighbour's unknowns shifted by the difference of the built-in guesses). Each pass works from
/// a fixed snapshot of the results, so the outcome does not depend on the number of threads or
/// on the order of the points. `tick` is called once per model solved (for a progress bar).
pub fn solve_points(
    grid: &Grid,
    points: &[GridPoint],
    run: &RunSettings,
    tick: &(dyn Fn() + Sync),
) -> Result<Vec<PointResult>> {
    let settings: Vec<ZamsSettings> = points
        .iter()
        .map(|p| settings_for(grid, p, run))
        .collect::<Result<_>>()?;
    let pool = rayon::ThreadPoolBuilder::new()
        .num_threads(run.threads)
        .build()
        .map_err(|e| {
            Error::invalid(
                "--threads",
                run.threads,
                &format!("cannot start the worker threads: {e}"),
            )
        })?;
    pool.install(|| {
        let mut results: Vec<PointResult> = points
            .par_iter()
            .zip(settings.par_iter())
            .map(|(p, s)| {
                let r = solve_one(s.clone(), p, false);
                tick();
                r
            })
            .collect();
        loop {
            let snapshot = results.clone();
            let retries: Vec<(usize, PointResult)> = snapshot
                .par_iter()
                .enumerate()
                .filter(|(_, r)| r.unknowns.is_none())
                .filter_map(|(i, r)| {
                    let n = neighbour(&snapshot, &r.point)?;
                    let nu = n.unknowns?;
                    let p = &r.point;
                    let start = guess::shifted(
                        &guess::as_row(&nu),
                        n.point.mass_msun,
                        p.mass_msun,
                        &p.composition,
                    );
                    let s = settings[i].clone().with_unknowns_guess(start);
                    let retry = solve_one(s, p, true);
                    retry.unknowns.is_some().then_some((i, retry))
                })
                .collect();
            if retries.is_empty() {
                break;
            }
            for (i, r) in retries {
                results[i] = r;
            }
        }
        Ok(results)
    })
}
