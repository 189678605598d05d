//! The solver's mesh: the model's breakpoints, each interval cut into collocation steps so
//! that no step spans more than a set phase of the oscillatory solutions, nor more than a set
//! growth of the non-oscillatory ones, in the frequency band being searched; and the structure
//! coefficients at every collocation node.
//!
//! Rates come from the leading 2 x 2 block of the equations (module `equations`): the phase
//! rate is the imaginary part of its eigenvalues, the growth rate their largest modulus. Inside
//! the star each model interval is cut into equal steps. The first interval, which starts at the
//! regular centre, is cut by the phase rate only (the regular solution is smooth there). The
//! last interval, which ends at the surface, is cut into steps that shrink geometrically toward
//! x = 1 wherever the growth rate demands it: where the pressure vanishes V grows like 1/(1 - x)
//! and the solution that is singular at the surface varies like a power (1 - x)^(-k) of
//! exponent up to (n + 1)(1 - 1/Gamma_1) + ... for a polytrope of index n; equal steps there
//! lose the method's order and left errors of a few 1e-8 in high-order p modes of the n = 3
//! polytrope.

use super::collocation::NODES;
use super::equilibrium::{Equilibrium, StructurePoint};
use crate::error::{Error, Result};

/// Most steps one model interval may be cut into.
pub const MAX_SUBDIVISIONS: usize = 100_000;
/// Most steps in a whole mesh.
pub const MAX_STEPS: usize = 2_000_000;
/// Where in a model interval (fractions of its length) the rates are sampled.
const RATE_SAMPLES: [f64; 5] = [0.1, 0.3, 0.5, 0.7, 0.9];
/// The graded steps of the last interval stop this close to the surface (as a fraction of the
/// interval's length); one last step covers the rest.
const SURFACE_DEPTH: f64 = 1e-6;

/// One collocation step.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Step {
    /// The model interval it lies in.
    pub interval: usize,
    /// Its inner end.
    pub start: f64,
    /// Its outer end.
    pub end: f64,
}

/// Limits on one step: largest phase (radians) and largest growth (e-folds) across it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StepLimits {
    /// Largest phase of the oscillatory solutions.
    pub phase: f64,
    /// Largest growth (rate times length) of the non-oscillatory solutions.
    pub growth: f64,
}

/// Cut the model's intervals into steps (module documentation). `rates(x, point)` gives the
/// phase and growth rates at x, each already the largest over the frequency band.
pub fn plan<F>(model: &dyn Equilibrium, limits: StepLimits, rates: F) -> Result<Vec<Step>>
where
    F: Fn(f64, &StructurePoint) -> (f64, f64),
{
    let b = model.breakpoints();
    let last = b.len() - 2;
    let mut steps = Vec::new();
    let finite = |r: (f64, f64), x: f64| {
        if r.0.is_finite() && r.1.is_finite() {
            Ok(r)
        } else {
            Err(Error::invalid(
                "model",
                format!("rates {r:?} at x = {x}"),
                "the structure coefficients must be finite inside the star",
            ))
        }
    };
    for i in 0..=last {
        let (xa, xb) = (b[i], b[i + 1]);
        let h = xb - xa;
        if i == last && i > 0 {
            // Graded toward the surface.
            let mut start = xa;
            while 1.0 - start > SURFACE_DEPTH * h {
                let depth = 1.0 - start;
                let x = start + 0.25 * depth;
                let (phase, growth) = finite(rates(x, &model.point(i, x)), x)?;
                let length = (0.5 * depth)
                    .min(limits.phase / phase)
                    .min(limits.growth / growth);
                steps.push(Step {
                    interval: i,
                    start,
                    end: start + length,
                });
                start += length;
                if steps.len() > MAX_STEPS {
                    break;
                }
            }
            steps.push(Step {
                interval: i,
                start,
                end: 1.0,
            });
        } else {
            let mut wanted: f64 = 1.0;
            for t in RATE_SAMPLES {
                let x = xa + t * h;
                let (phase, growth) = finite(rates(x, &model.point(i, x)), x)?;
                wanted = wanted.max(phase * h / limits.phase);
                if i > 0 {
                    wanted = wanted.max(growth * h / limits.growth);
                }
            }
            let m = (wanted.ceil() as usize).clamp(1, MAX_SUBDIVISIONS);
            let length = h / m as f64;
            for k in 0..m {
                steps.push(Step {
                    interval: i,
                    start: xa + k as f64 * length,
                    end: if k + 1 == m {
                        xb
                    } else {
                        xa + (k + 1) as f64 * length
                    },
                });
            }
        }
        if steps.len() > MAX_STEPS {
            return Err(Error::invalid(
                "resolution",
                steps.len(),
                "the oscillation mesh would exceed 2000000 steps; ask for fewer modes or a \
                 coarser phase per step",
            ));
        }
    }
    Ok(steps)
}

/// The collocation mesh of one model.
#[derive(Debug, Clone, PartialEq)]
pub struct Grid {
    /// Step boundaries, from 0 to 1.
    pub x: Vec<f64>,
    /// The model interval each step lies in.
    pub interval: Vec<usize>,
    /// Structure coefficients at the three collocation nodes of each step.
    pub points: Vec<[StructurePoint; 3]>,
}

impl Grid {
    /// Evaluate the model at the collocation nodes of `steps` (consecutive, from 0 to 1).
    /// Errors if a node's coefficients are not physical (module `equilibrium`).
    pub fn new(model: &dyn Equilibrium, steps: &[Step]) -> Result<Self> {
        let mut x = Vec::with_capacity(steps.len() + 1);
        let mut interval = Vec::with_capacity(steps.len());
        let mut points = Vec::with_capacity(steps.len());
        x.push(0.0);
        for step in steps {
            let h = step.end - step.start;
            let mut nodes = [StructurePoint {
                v_over_x2: 0.0,
                u: 0.0,
                c1: 0.0,
                a_star: 0.0,
                gamma1: 0.0,
            }; 3];
            for (node, c) in nodes.iter_mut().zip(NODES) {
                let xn = step.start + c * h;
                *node = model.point(step.interval, xn);
                if !node.is_physical() {
                    return Err(Error::invalid(
                        "model",
                        format!("coefficients {node:?} at x = {xn}"),
                        "V/x^2, c1 and Gamma_1 must be finite and positive, U >= 0 and A* \
                         finite inside the star",
                    ));
                }
            }
            interval.push(step.interval);
            points.push(nodes);
            x.push(step.end);
        }
        Ok(Self {
            x,
            interval,
            points,
        })
    }

    /// Number of steps.
    pub fn steps(&self) -> usize {
        self.points.len()
    }

    /// The step boundary nearest to `x`, kept away from the centre and the surface.
    pub fn boundary_near(&self, x: f64) -> usize {
        let last = self.x.len() - 1;
        let k = self.x.partition_point(|&b| b < x);
        let k = if k > 0 && k <= last && (x - self.x[k - 1]) < (self.x[k] - x) {
            k - 1
        } else {
            k
        };
        k.clamp(1.min(last), last.saturating_sub(1).max(1))
    }
}
