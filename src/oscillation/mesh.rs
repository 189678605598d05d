//! The solver's mesh: the model's breakpoints, each interval cut into equal collocation steps
//! so that no step spans more than a set phase of the oscillatory solutions in the frequency
//! band being searched, and the structure coefficients at every collocation node.

use super::collocation::NODES;
use super::equilibrium::{Equilibrium, StructurePoint};
use crate::error::{Error, Result};

/// Most steps one model interval may be cut into.
pub const MAX_SUBDIVISIONS: usize = 100_000;
/// Most steps in a whole mesh.
pub const MAX_STEPS: usize = 2_000_000;
/// Where in a model interval (fractions of its length) the phase rate is sampled.
const RATE_SAMPLES: [f64; 5] = [0.1, 0.3, 0.5, 0.7, 0.9];

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
    /// Cut model interval i into `subdivisions[i]` equal steps and evaluate the model at every
    /// node. Errors if a node's coefficients are not physical (module `equilibrium`) or the
    /// mesh would exceed [`MAX_STEPS`].
    pub fn new(model: &dyn Equilibrium, subdivisions: &[usize]) -> Result<Self> {
        let b = model.breakpoints();
        let steps: usize = subdivisions.iter().sum();
        if steps > MAX_STEPS {
            return Err(Error::invalid(
                "resolution",
                steps,
                "the oscillation mesh would exceed 2000000 steps; ask for fewer modes or a \
                 coarser phase per step",
            ));
        }
        let mut x = Vec::with_capacity(steps + 1);
        let mut interval = Vec::with_capacity(steps);
        let mut points = Vec::with_capacity(steps);
        x.push(0.0);
        for (i, &m) in subdivisions.iter().enumerate() {
            let (xa, xb) = (b[i], b[i + 1]);
            let h = (xb - xa) / m as f64;
            for k in 0..m {
                let start = xa + k as f64 * h;
                let mut nodes = [StructurePoint {
                    v_over_x2: 0.0,
                    u: 0.0,
                    c1: 0.0,
                    a_star: 0.0,
                    gamma1: 0.0,
                }; 3];
                for (node, c) in nodes.iter_mut().zip(NODES) {
                    let xn = start + c * h;
                    *node = model.point(i, xn);
                    if !node.is_physical() {
                        return Err(Error::invalid(
                            "model",
                            format!("coefficients {node:?} at x = {xn}"),
                            "V/x^2, c1 and Gamma_1 must be finite and positive, U >= 0 and A* \
                             finite inside the star",
                        ));
                    }
                }
                interval.push(i);
                points.push(nodes);
                x.push(if k + 1 == m { xb } else { start + h });
            }
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

/// Subdivisions of each model interval such that `rate(x, point)` (radians per unit x, the
/// largest over the frequency band) times the step length stays below `phase_per_step`, with at
/// least one step per interval.
pub fn subdivisions<F>(model: &dyn Equilibrium, phase_per_step: f64, rate: F) -> Result<Vec<usize>>
where
    F: Fn(f64, &StructurePoint) -> f64,
{
    let b = model.breakpoints();
    let mut out = Vec::with_capacity(b.len() - 1);
    for i in 0..b.len() - 1 {
        let h = b[i + 1] - b[i];
        let fastest = RATE_SAMPLES
            .iter()
            .map(|t| {
                let x = b[i] + t * h;
                rate(x, &model.point(i, x))
            })
            .fold(0.0, f64::max);
        let wanted = (fastest * h / phase_per_step).ceil();
        if !(wanted.is_finite()) {
            return Err(Error::invalid(
                "model",
                format!("phase rate {fastest} in [{}, {}]", b[i], b[i + 1]),
                "the structure coefficients must be finite inside the star",
            ));
        }
        out.push((wanted as usize).clamp(1, MAX_SUBDIVISIONS));
    }
    Ok(out)
}
