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
    Ok(solve_points_until(grid, points, run, tick, &|| false)?.unwrap_or_default())
}

/// [`solve_points`] that can be stopped: `stop` is asked before each model (from the worker
/// threads); once it answers true, no further model is started and the run returns `Ok(None)`
/// after the models under way finish. A caller that handles interrupts (the Python module's
/// Ctrl-C) sets a flag that `stop` reads.
pub fn solve_points_until(
    grid: &Grid,
    points: &[GridPoint],
    run: &RunSettings,
    tick: &(dyn Fn() + Sync),
    stop: &(dyn Fn() -> bool + Sync),
) -> Result<Option<Vec<PointResult>>> {
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
        let first: Option<Vec<PointResult>> = points
            .par_iter()
            .zip(settings.par_iter())
            .map(|(p, s)| {
                if stop() {
                    return None;
                }
                let r = solve_one(s.clone(), p, false);
                tick();
                Some(r)
            })
            .collect();
        let Some(mut results) = first else {
            return Ok(None);
        };
        loop {
            let snapshot = results.clone();
            let retries: Option<Vec<(usize, PointResult)>> = snapshot
                .par_iter()
                .enumerate()
                .filter(|(_, r)| r.outcome.is_err())
                .filter_map(|(i, r)| {
                    let n = neighbour(&snapshot, &r.point)?;
                    let nu = n.unknowns()?;
                    if stop() {
                        return Some(None);
                    }
                    let p = &r.point;
                    let start = guess::shifted(
                        &guess::as_row(&nu),
                        n.point.mass_msun,
                        p.mass_msun,
                        &p.composition,
                    );
                    let s = settings[i].clone().with_unknowns_guess(start);
                    let retry = solve_one(s, p, true);
                    retry.outcome.is_ok().then_some(Some((i, retry)))
                })
                .collect();
            let Some(retries) = retries else {
                return Ok(None);
            };
            if retries.is_empty() {
                break;
            }
            for (i, r) in retries {
                results[i] = r;
            }
        }
        Ok(Some(results))
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::grid::Variant;
    use crate::physics::{PhysicsOverrides, Preset};
    use std::sync::atomic::{AtomicUsize, Ordering};

    fn analytic_grid(masses: &[f64]) -> Grid {
        let base = PhysicsOverrides {
            preset: Some(Preset::Analytic),
            ..PhysicsOverrides::default()
        };
        Grid::product(&base, vec![Variant::base()], masses, &[0.7], &[0.02], 0.4)
            .expect("valid grid")
    }

    #[test]
    fn a_stopped_run_starts_no_further_model() {
        let grid = analytic_grid(&[2.0, 3.0, 5.0]);
        let points = grid.select(None);
        let solved = AtomicUsize::new(0);
        let tick = || {
            solved.fetch_add(1, Ordering::SeqCst);
        };
        let run = RunSettings {
            threads: 1,
            tolerance: None,
        };
        // Stop before the first model: nothing is solved.
        let out = solve_points_until(&grid, &points, &run, &tick, &|| true).expect("runs");
        assert!(out.is_none());
        assert_eq!(solved.load(Ordering::SeqCst), 0);
        // Stop after the first model (one worker thread: models run one after another).
        let stop = || solved.load(Ordering::SeqCst) >= 1;
        let out = solve_points_until(&grid, &points, &run, &tick, &stop).expect("runs");
        assert!(out.is_none());
        assert_eq!(solved.load(Ordering::SeqCst), 1);
        // Never stopped: the same results as the plain runner.
        let all = solve_points_until(&grid, &points, &run, &|| {}, &|| false)
            .expect("runs")
            .expect("not stopped");
        let plain = solve_points(&grid, &points, &run, &|| {}).expect("runs");
        assert_eq!(all.len(), 3);
        for (a, b) in all.iter().zip(&plain) {
            let (a, b) = (a.outcome.as_ref().ok(), b.outcome.as_ref().ok());
            let bits = |m: Option<&Box<ZamsModel>>| {
                m.map(|m| {
                    m.summary
                        .values()
                        .iter()
                        .map(|v| v.to_bits())
                        .collect::<Vec<_>>()
                })
            };
            assert!(a.is_some());
            assert_eq!(bits(a), bits(b));
        }
    }
}
