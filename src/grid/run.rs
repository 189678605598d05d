//! Solving the points of a grid in parallel, with continuation for the points that do not
//! converge from the built-in guess.

use super::{Grid, GridPoint};
use crate::error::{Error, Result};
use crate::structure::{guess, solve, Unknowns, ZamsModel, ZamsSettings};
use rayon::prelude::*;

/// The result for one grid point.
#[derive(Debug, Clone)]
pub struct PointResult {
    /// The point.
    pub point: GridPoint,
    /// The converged model, or why there is none.
    pub outcome: std::result::Result<Box<ZamsModel>, Error>,
    /// Whether the model needed a neighbour's solution as its starting guess.
    pub continued: bool,
}

impl PointResult {
    /// The converged unknowns (for continuation).
    pub fn unknowns(&self) -> Option<Unknowns> {
        self.outcome.as_ref().ok().map(|m| m.unknowns)
    }
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
        .with_fit_mass_fraction(grid.fit_mass_fraction)?;
    if let Some(t) = run.tolerance {
        s = s.with_tolerance(t)?;
    }
    Ok(s)
}

fn solve_one(settings: ZamsSettings, point: &GridPoint, continued: bool) -> PointResult {
    PointResult {
        point: point.clone(),
        outcome: solve(&settings).map(Box::new),
        continued,
    }
}

/// The nearest converged neighbour in log mass with the same variant and composition.
fn neighbour<'a>(results: &'a [PointResult], p: &GridPoint) -> Option<&'a PointResult> {
    results
        .iter()
        .filter(|r| {
            r.outcome.is_ok()
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
                "threads",
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
                .filter(|(_, r)| r.outcome.is_err())
                .filter_map(|(i, r)| {
                    let n = neighbour(&snapshot, &r.point)?;
                    let nu = n.unknowns()?;
                    let p = &r.point;
                    let start = guess::shifted(
                        &guess::as_row(&nu),
                        n.point.mass_msun,
                        p.mass_msun,
                        &p.composition,
                    );
                    let s = settings[i].clone().with_unknowns_guess(start);
                    let retry = solve_one(s, p, true);
                    retry.outcome.is_ok().then_some((i, retry))
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
