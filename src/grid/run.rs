//! Solving the points of a grid in parallel, with continuation for the points that do not
//! converge from the built-in guess, by a rule defined on the whole grid so that a point's
//! answer depends only on the point and the grid: never on the shard, the thread count or the
//! order of the lists.
//!
//! The rule. The points of one variant and composition, sorted by mass, form a *chain*. Every
//! point is first solved from the built-in guess. A point that fails is an interior point of a
//! stretch of failed points of its chain; its *anchors* are the nearest points below and above
//! it in the chain that converged from the guess (either may be missing at an end of the
//! chain). From the nearer anchor in ln M (the lower one when both are equally near) the
//! solver *marches* along the chain to the point: each point in between is solved from the
//! last converged solution of the march (shifted by the difference of the built-in guesses),
//! and so is the point itself. If that fails, it marches from the other anchor. A point
//! converged by a march is `continued`; one that fails both keeps its failure from the guess.
//!
//! Everything in the rule is a function of the chain, so a shard that owns a failed point but
//! not its anchors or the points between computes them (and discards them), and gets exactly
//! the answer of the single run.

use super::{Grid, GridPoint};
use crate::error::{Error, Result};
use crate::structure::{guess, solve, Unknowns, ZamsModel, ZamsSettings};
use rayon::prelude::*;
use std::collections::HashMap;

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
    /// The converged unknowns.
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

/// One attempt at a point.
type Outcome = std::result::Result<Box<ZamsModel>, Error>;

fn settings_for(grid: &Grid, p: &GridPoint, run: &RunSettings) -> Result<ZamsSettings> {
    let mut s = ZamsSettings::new(p.mass_msun, p.composition, grid.physics[p.variant].clone())?
        .with_fit_mass_fraction(grid.fit_mass_fraction)?;
    if let Some(t) = run.tolerance {
        s = s.with_tolerance(t)?;
    }
    Ok(s)
}

/// The chains of a grid: for each (variant, composition) the indices of its points sorted by
/// mass, and for each point its chain and position in it.
struct Chains {
    chains: Vec<Vec<usize>>,
    place: Vec<(usize, usize)>,
}

impl Chains {
    fn of(grid: &Grid) -> Self {
        let mut ids: HashMap<(usize, u64, u64), usize> = HashMap::new();
        let mut chains: Vec<Vec<usize>> = Vec::new();
        for (i, p) in grid.points.iter().enumerate() {
            let key = (
                p.variant,
                p.composition.x().to_bits(),
                p.composition.z().to_bits(),
            );
            let id = *ids.entry(key).or_insert_with(|| {
                chains.push(Vec::new());
                chains.len() - 1
            });
            chains[id].push(i);
        }
        let mut place = vec![(0, 0); grid.points.len()];
        for (c, chain) in chains.iter_mut().enumerate() {
            chain.sort_by(|&a, &b| {
                grid.points[a]
                    .mass_msun
                    .total_cmp(&grid.points[b].mass_msun)
            });
            for (k, &i) in chain.iter().enumerate() {
                place[i] = (c, k);
            }
        }
        Self { chains, place }
    }
}

/// Which way along a chain.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
enum Way {
    Down,
    Up,
}

impl Way {
    /// The position `k` steps from `from` this way, if inside a chain of `len` points.
    fn step(self, from: usize, k: usize, len: usize) -> Option<usize> {
        match self {
            Way::Down => from.checked_sub(k),
            Way::Up => from.checked_add(k).filter(|&p| p < len),
        }
    }
}

/// Looking for the anchor of a failed point on one side.
enum Scan {
    /// The anchor's chain position.
    Anchor(usize),
    /// No anchor on this side (end of the chain).
    None,
    /// The point with this grid index must be solved from the guess first.
    Unknown(usize),
}

/// A march: from the anchor at `anchor` in chain `chain`, going `way`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
struct March {
    chain: usize,
    anchor: usize,
    way: Way,
}

struct Solver<'a> {
    grid: &'a Grid,
    run: &'a RunSettings,
    /// Asked before each model; once it answers true no further model is started.
    stop: &'a (dyn Fn() -> bool + Sync),
    chains: Chains,
    /// Outcomes from the built-in guess, by grid index.
    from_guess: HashMap<usize, Outcome>,
    /// March outcomes, position by position away from the anchor.
    marches: HashMap<March, Vec<Outcome>>,
}

impl Solver<'_> {
    fn point(&self, i: usize) -> &GridPoint {
        &self.grid.points[i]
    }

    /// The outcome at point `i` from `start` (the built-in guess if `None`); `None` if the run
    /// was stopped.
    fn solve_from(&self, i: usize, start: Option<(f64, Unknowns)>) -> Option<Outcome> {
        if (self.stop)() {
            return None;
        }
        Some(self.solve_model(i, start))
    }

    fn solve_model(&self, i: usize, start: Option<(f64, Unknowns)>) -> Outcome {
        let p = self.point(i);
        let mut s = settings_for(self.grid, p, self.run)?;
        if let Some((from_msun, u)) = start {
            s = s.with_unknowns_guess(guess::shifted(
                &guess::as_row(&u),
                from_msun,
                p.mass_msun,
                &p.composition,
            ));
        }
        solve(&s).map(Box::new)
    }

    fn scan(&self, i: usize, way: Way) -> Scan {
        let (c, k) = self.chains.place[i];
        let chain = &self.chains.chains[c];
        let mut step = 1;
        while let Some(pos) = way.step(k, step, chain.len()) {
            match self.from_guess.get(&chain[pos]) {
                Some(Ok(_)) => return Scan::Anchor(pos),
                Some(Err(_)) => step += 1,
                None => return Scan::Unknown(chain[pos]),
            }
        }
        Scan::None
    }

    /// Solve from the guess every point of `wanted` not yet solved, in parallel; false if the
    /// run was stopped.
    fn solve_from_guess(&mut self, wanted: &[usize], tick: &(dyn Fn() + Sync)) -> bool {
        let new: Option<Vec<(usize, Outcome)>> = wanted
            .par_iter()
            .filter(|i| !self.from_guess.contains_key(i))
            .map(|&i| {
                let o = self.solve_from(i, None)?;
                tick();
                Some((i, o))
            })
            .collect();
        match new {
            Some(new) => {
                self.from_guess.extend(new);
                true
            }
            None => false,
        }
    }

    /// The anchors (chain positions) below and above the failed point `i`, the nearer in ln M
    /// first; solves from the guess whatever points of the chain that needs. `None` if the run
    /// was stopped.
    fn anchors(&mut self, failed: &[usize]) -> Option<HashMap<usize, Vec<March>>> {
        loop {
            let mut wanted: Vec<usize> = Vec::new();
            for &i in failed {
                for way in [Way::Down, Way::Up] {
                    if let Scan::Unknown(j) = self.scan(i, way) {
                        wanted.push(j);
                    }
                }
            }
            wanted.sort_unstable();
            wanted.dedup();
            if wanted.is_empty() {
                break;
            }
            if !self.solve_from_guess(&wanted, &|| {}) {
                return None;
            }
        }
        let anchors = failed
            .iter()
            .map(|&i| {
                let (c, _) = self.chains.place[i];
                let ln_m = self.point(i).mass_msun.ln();
                let mut found: Vec<(f64, March)> = [Way::Down, Way::Up]
                    .into_iter()
                    .filter_map(|way| match self.scan(i, way) {
                        Scan::Anchor(pos) => {
                            let m = self.point(self.chains.chains[c][pos]).mass_msun;
                            // The march goes from the anchor towards the point: the other way.
                            let toward = if way == Way::Down { Way::Up } else { Way::Down };
                            Some((
                                (m.ln() - ln_m).abs(),
                                March {
                                    chain: c,
                                    anchor: pos,
                                    way: toward,
                                },
                            ))
                        }
                        _ => None,
                    })
                    .collect();
                // Stable sort: at equal distance the lower anchor (found first) comes first.
                found.sort_by(|a, b| a.0.total_cmp(&b.0));
                (i, found.into_iter().map(|(_, m)| m).collect())
            })
            .collect();
        Some(anchors)
    }

    /// Run every march of `needed` (march, steps) that is not yet long enough, in parallel;
    /// false if the run was stopped.
    fn march(&mut self, needed: HashMap<March, usize>) -> bool {
        let todo: Vec<(March, usize)> = needed
            .into_iter()
            .filter(|(m, steps)| self.marches.get(m).is_none_or(|done| done.len() < *steps))
            .collect();
        let done: Option<Vec<(March, Vec<Outcome>)>> = todo
            .par_iter()
            .map(|&(m, steps)| {
                let chain = &self.chains.chains[m.chain];
                let anchor = chain[m.anchor];
                let mut last = self
                    .from_guess
                    .get(&anchor)
                    .and_then(|o| o.as_ref().ok())
                    .map(|model| (self.point(anchor).mass_msun, model.unknowns));
                let mut outcomes = Vec::with_capacity(steps);
                for k in 1..=steps {
                    let Some(pos) = m.way.step(m.anchor, k, chain.len()) else {
                        break;
                    };
                    let i = chain[pos];
                    let o = self.solve_from(i, last)?;
                    if let Ok(model) = &o {
                        last = Some((self.point(i).mass_msun, model.unknowns));
                    }
                    outcomes.push(o);
                }
                Some((m, outcomes))
            })
            .collect();
        match done {
            Some(done) => {
                self.marches.extend(done);
                true
            }
            None => false,
        }
    }

    /// The outcome at the failed point `i` of the march `m`.
    fn marched(&self, m: &March, i: usize) -> Option<&Outcome> {
        let (_, k) = self.chains.place[i];
        self.marches.get(m)?.get(k.abs_diff(m.anchor) - 1)
    }
}

/// Solve `points` of `grid` by the rule of the module documentation, in parallel. Every point
/// of the grid is checked first (a bad mass for a preset is refused whichever shard holds it).
/// `tick` is called once per requested point solved from the guess (for a progress bar).
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
    for p in &grid.points {
        settings_for(grid, p, run)?;
    }
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
        let mut solver = Solver {
            grid,
            run,
            stop,
            chains: Chains::of(grid),
            from_guess: HashMap::new(),
            marches: HashMap::new(),
        };
        let requested: Vec<usize> = points.iter().map(|p| p.index).collect();
        if !solver.solve_from_guess(&requested, tick) {
            return Ok(None);
        }
        let failed: Vec<usize> = requested
            .iter()
            .copied()
            .filter(|i| solver.from_guess.get(i).is_some_and(|o| o.is_err()))
            .collect();
        let Some(anchors) = solver.anchors(&failed) else {
            return Ok(None);
        };
        let mut continued: HashMap<usize, Outcome> = HashMap::new();
        // First every failed point's nearer anchor, then the other one for those still failing.
        for attempt in 0..2 {
            let mut needed: HashMap<March, usize> = HashMap::new();
            for &i in &failed {
                if continued.contains_key(&i) {
                    continue;
                }
                if let Some(m) = anchors.get(&i).and_then(|a| a.get(attempt)) {
                    let steps = solver.chains.place[i].1.abs_diff(m.anchor);
                    let e = needed.entry(*m).or_insert(0);
                    *e = (*e).max(steps);
                }
            }
            if !solver.march(needed) {
                return Ok(None);
            }
            for &i in &failed {
                if continued.contains_key(&i) {
                    continue;
                }
                let Some(m) = anchors.get(&i).and_then(|a| a.get(attempt)) else {
                    continue;
                };
                if let Some(Ok(model)) = solver.marched(m, i) {
                    continued.insert(i, Ok(model.clone()));
                }
            }
        }
        Ok(Some(
            points
                .iter()
                .map(|p| match continued.remove(&p.index) {
                    Some(outcome) => PointResult {
                        point: p.clone(),
                        outcome,
                        continued: true,
                    },
                    None => PointResult {
                        point: p.clone(),
                        outcome: solver.from_guess.remove(&p.index).unwrap_or_else(|| {
                            Err(Error::invalid("grid point", p.index, "not solved"))
                        }),
                        continued: false,
                    },
                })
                .collect(),
        ))
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
