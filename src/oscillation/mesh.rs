//! The solver's mesh: steps placed so that none spans more than a set phase of the oscillatory
//! solutions, nor more than a set growth of the non-oscillatory ones, in the frequency band being
//! searched, nor too much of the star's structure; and the structure coefficients at every
//! collocation node.
//!
//! Rates come from the leading 2 x 2 block of the equations (module `equations`): the phase rate is
//! the imaginary part of its eigenvalues, the growth rate their largest modulus. The structure rate
//! is that of ln c1 = ln(x^3 M/m), |3 - U|/x ([`structure_rate`]), which follows the mass
//! concentration of a condensed core; a longest step bounds the rest. Across each step, the changes
//! of ln Gamma_1 and of A*/V (= delta (nabla_ad - nabla) in a chemically homogeneous star: the
//! thermal stratification) are bounded like that of ln c1, and the change of ln(1 + V) (V = r over
//! the pressure scale height) more loosely; these resolve the ionisation zones and the
//! superadiabatic layer under a photosphere (without them a 1 M_sun ZAMS model had errors of 1e-5
//! in p modes of order 20), while a polytrope, whose Gamma_1 and A*/V are constant, pays nothing
//! for them. In the envelope, where V >> 1, ln(1 + V) is ln V; in the core, where V grows like x^2
//! from the centre and the scale height is larger than r, it changes little (a bound on ln V itself
//! made the steps there grow geometrically from the first profile row: 150 of the 280 steps of a
//! low-frequency quadrupole mesh of the 1 M_sun ZAMS model lay below x = 0.1, against 40 now, for
//! no accuracy: the worst frequency error of that model, modes l = 0-3 up to order 25 on 2000 rows,
//! went from 8.25e-9 to 8.46e-9 against 16000 rows at a quarter of the phase per step). The steps
//! follow these limits, not the model's mesh: a step may straddle any breakpoint where the model
//! says its coefficients are smooth ([`Equilibrium::smooth_at`]), and ends at every other
//! breakpoint, at the points the caller forces (the fitting point, so that meshes for different
//! bands share it) and at x = 0 and 1. Steps are marched outward through each segment between such
//! points, each as long as the rates sampled at its middle and near its end allow (after a first
//! sample at the middle of the longest step allowed), at most twice the one before, then shortened
//! (up to `MAX_SHORTENINGS` times) until the changes across it are within bounds, and the last
//! two of a segment share what is left rather than leave a sliver. Near the regular centre (below
//! the model's first breakpoint) the growth rate does not limit a step: the solutions there are
//! regular power series, whatever the rate of the singular ones. (Above it the growth limit stays,
//! and in both directions: lifting it up to x = 0.05, or bounding only the growth of the solution
//! that dominates in the direction of integration, made the g25 modes of the 1 M_sun ZAMS model
//! wrong by 6e-7 and those of the n = 3 polytrope by 6e-6.) The segment that ends at the surface is
//! graded geometrically toward x = 1 (no step longer than a set fraction of the remaining depth):
//! where the pressure vanishes V grows like 1/(1 - x) and the solution that is singular at the
//! surface varies like a power (1 - x)^(-k) of exponent up to (n + 1)(1 - 1/Gamma_1) + ... for a
//! polytrope of index n; equal steps there lose the method's order and left errors of a few 1e-8 in
//! high-order p modes of the n = 3 polytrope.

use super::collocation::NODES;
use super::equilibrium::{point_at, Equilibrium, StructurePoint};
use crate::error::{Error, Result};

/// Most steps in a whole mesh.
pub const MAX_STEPS: usize = 2_000_000;
/// The graded steps of the surface segment stop this close to the surface (in x); one last
/// step covers the rest. Graded steps are alike in the variable ln(1 - x), so each adds about
/// the same error: stopping deeper adds steps without adding accuracy (checked on the n = 1.5,
/// 3 and 4.5 polytropes: no change at 1e-9 from 2e-9 to 2e-6).
const SURFACE_DEPTH: f64 = 1e-6;
/// A step is at most this many times as long as the one before it.
const MAX_STEP_RATIO: f64 = 2.0;
/// Where in a tentative step (fractions of its length) the rates are sampled.
const RATE_SAMPLES: [f64; 2] = [0.5, 0.95];

/// One collocation step.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Step {
    /// Its inner end.
    pub start: f64,
    /// Its outer end.
    pub end: f64,
}

/// Limits on one step (module documentation).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StepLimits {
    /// Largest phase of the oscillatory solutions, radians.
    pub phase: f64,
    /// Largest growth (rate times length) of the non-oscillatory solutions, e-folds.
    pub growth: f64,
    /// Largest change of ln c1, ln Gamma_1 and A*/V.
    pub structure: f64,
    /// Largest change of ln(1 + V).
    pub pressure: f64,
    /// Longest step.
    pub longest: f64,
    /// Longest step near the surface, as a fraction of the depth below it.
    pub grading: f64,
}

/// The rate of change of ln c1 per unit x: |dln c1/dln x|/x = |3 - U|/x (from c1 = x^3 M/m and
/// U = dln m/dln r). It vanishes at the centre and is 3/x at a surface of zero density. (The
/// rates of ln(V/x^2) and ln U grow like 1/(1 - x) where the surface pressure vanishes, while
/// the regular solution stays smooth there, so they would over-resolve the surface layers.)
pub fn structure_rate(x: f64, p: &StructurePoint) -> f64 {
    (3.0 - p.u).abs() / x
}

/// Times a step is shortened for the variation of the coefficients across it.
const MAX_SHORTENINGS: usize = 4;

/// The variation of the coefficients from x = `xa` to `xb` (module documentation) as a
/// multiple of what `limits` allow: the largest of |Delta ln Gamma_1| and |Delta (A*/V)| over
/// `limits.structure` and |Delta ln(1 + V)| over `limits.pressure`.
fn variation(model: &dyn Equilibrium, xa: f64, xb: f64, limits: &StepLimits) -> f64 {
    let (a, b) = (point_at(model, xa), point_at(model, xb));
    let (va, vb) = (a.v_over_x2 * xa * xa, b.v_over_x2 * xb * xb);
    // A*/V = delta (nabla_ad - nabla) for a chemically homogeneous star.
    let gamma = (b.gamma1 / a.gamma1).ln().abs();
    let buoyancy = (b.a_star / vb - a.a_star / va).abs();
    let pressure = ((1.0 + vb) / (1.0 + va)).ln().abs();
    (gamma.max(buoyancy) / limits.structure).max(pressure / limits.pressure)
}

/// Cut [0, 1] into steps (module documentation), ending steps at the model's non-smooth
/// breakpoints and at the points of `forced` (inside (0, 1)). `rates(x, point)` gives the phase
/// and growth rates at x, each already the largest over the frequency band. Errors if a rate is
/// not finite or the mesh would exceed [`MAX_STEPS`].
pub fn plan<F>(
    model: &dyn Equilibrium,
    limits: StepLimits,
    forced: &[f64],
    rates: F,
) -> Result<Vec<Step>>
where
    F: Fn(f64, &StructurePoint) -> (f64, f64),
{
    let b = model.breakpoints();
    let intervals = b.len() - 1;
    let mut ends: Vec<f64> = (1..intervals)
        .filter(|&i| !model.smooth_at(i))
        .map(|i| b[i])
        .chain(forced.iter().copied().filter(|&f| f > 0.0 && f < 1.0))
        .chain([0.0, 1.0])
        .collect();
    ends.sort_by(f64::total_cmp);
    ends.dedup();
    let centre_zone = b[1];
    // The longest step allowed by the rates at x.
    let longest = |x: f64| -> Result<f64> {
        let point = point_at(model, x);
        let r = rates(x, &point);
        let structure = structure_rate(x, &point);
        if !(r.0.is_finite() && r.1.is_finite() && structure.is_finite()) {
            return Err(Error::invalid(
                "model",
                format!("rates {r:?} at x = {x}"),
                "the structure coefficients must be finite inside the star",
            ));
        }
        let mut length = (limits.phase / r.0).min(limits.structure / structure);
        if x > centre_zone {
            length = length.min(limits.growth / r.1);
        }
        Ok(length)
    };
    let mut steps: Vec<Step> = Vec::new();
    for segment in ends.windows(2) {
        let (a, e) = (segment[0], segment[1]);
        let graded = e == 1.0;
        let mut x = a;
        let mut previous = f64::INFINITY;
        while x < e {
            if graded && 1.0 - x <= SURFACE_DEPTH {
                steps.push(Step { start: x, end: 1.0 });
                break;
            }
            let remaining = e - x;
            let mut cap = remaining.min(MAX_STEP_RATIO * previous).min(limits.longest);
            if graded {
                cap = cap.min(limits.grading * (1.0 - x));
            }
            let mut length = cap.min(longest(x + 0.5 * cap)?);
            for t in RATE_SAMPLES {
                length = length.min(longest(x + t * length)?);
            }
            // Thermodynamic structure and pressure scale height, by differences across the
            // step (module documentation).
            for _ in 0..MAX_SHORTENINGS {
                let (xa, xb) = (x + 0.05 * length, x + 0.95 * length);
                let excess = variation(model, xa, xb, &limits) / 0.9;
                if excess <= 1.0 {
                    break;
                }
                length *= (1.0 / excess).max(0.2);
            }
            // No sliver at the end of a segment: the last two steps share what is left.
            if length >= remaining || (graded && 1.0 - (x + length) <= SURFACE_DEPTH) {
                length = remaining;
            } else if remaining < 1.5 * length && !graded {
                length = 0.5 * remaining;
            }
            let end = if length >= remaining { e } else { x + length };
            steps.push(Step { start: x, end });
            previous = end - x;
            x = end;
            if steps.len() > MAX_STEPS {
                return Err(Error::invalid(
                    "resolution",
                    steps.len(),
                    "the oscillation mesh would exceed 2000000 steps; ask for fewer modes or a \
                     coarser phase per step",
                ));
            }
        }
    }
    Ok(steps)
}

/// The collocation mesh of one model.
#[derive(Debug, Clone, PartialEq)]
pub struct Grid {
    /// Step boundaries, from 0 to 1.
    pub x: Vec<f64>,
    /// Structure coefficients at the three collocation nodes of each step.
    pub points: Vec<[StructurePoint; 3]>,
}

impl Grid {
    /// Evaluate the model at the collocation nodes of `steps` (consecutive, from 0 to 1).
    /// Errors if a node's coefficients are not physical (module `equilibrium`).
    pub fn new(model: &dyn Equilibrium, steps: &[Step]) -> Result<Self> {
        let mut x = Vec::with_capacity(steps.len() + 1);
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
                *node = point_at(model, xn);
                if !node.is_physical() {
                    return Err(Error::invalid(
                        "model",
                        format!("coefficients {node:?} at x = {xn}"),
                        "V/x^2, c1 and Gamma_1 must be finite and positive, U >= 0 and A* \
                         finite inside the star",
                    ));
                }
            }
            points.push(nodes);
            x.push(step.end);
        }
        Ok(Self { x, points })
    }

    /// Number of steps.
    pub fn steps(&self) -> usize {
        self.points.len()
    }

    /// The index of the step boundary at exactly `x`, if there is one.
    pub fn boundary_at(&self, x: f64) -> Option<usize> {
        let k = self.x.partition_point(|&b| b < x);
        (k < self.x.len() && self.x[k] == x).then_some(k)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::oscillation::equilibrium::CentreValues;
    use crate::oscillation::HomogeneousSphere;

    /// The homogeneous sphere on 50 intervals, smooth everywhere or with a kink declared at
    /// x = 0.3.
    struct Sphere {
        inner: HomogeneousSphere,
        kink: Option<usize>,
    }

    impl Equilibrium for Sphere {
        fn breakpoints(&self) -> &[f64] {
            self.inner.breakpoints()
        }
        fn point(&self, interval: usize, x: f64) -> StructurePoint {
            self.inner.point(interval, x)
        }
        fn smooth_at(&self, i: usize) -> bool {
            Some(i) != self.kink
        }
        fn centre(&self) -> CentreValues {
            self.inner.centre()
        }
        fn surface_u(&self) -> f64 {
            self.inner.surface_u()
        }
    }

    /// Limits under which only the phase (through the constant rates below), the longest step
    /// and the grading matter for the homogeneous sphere (c1, Gamma_1 and A*/V are constant;
    /// ln(1 + V) changes by at most 2 ln 2 over a step that at most doubles x away from the
    /// surface).
    const LIMITS: StepLimits = StepLimits {
        phase: 0.2,
        growth: 1.0,
        structure: 0.07,
        pressure: 10.0,
        longest: 0.1,
        grading: 0.5,
    };

    /// Steps cover [0, 1] without gaps, end at the forced point and at a declared kink, follow
    /// the rates rather than the 50 model intervals, and grade toward the surface.
    #[test]
    fn steps_follow_the_rates_and_end_where_they_must() {
        let inner = HomogeneousSphere::new(5.0 / 3.0, 50).unwrap();
        let rates = |_: f64, _: &StructurePoint| (1.0, 1.0);
        for kink in [None, Some(15)] {
            let model = Sphere {
                inner: inner.clone(),
                kink,
            };
            let steps = plan(&model, LIMITS, &[0.45], rates).unwrap();
            assert_eq!(steps[0].start, 0.0);
            assert_eq!(steps.last().unwrap().end, 1.0);
            assert!(steps.windows(2).all(|p| p[0].end == p[1].start));
            let ends: Vec<f64> = steps.iter().map(|s| s.end).collect();
            assert!(ends.contains(&0.45));
            assert_eq!(ends.contains(&0.3), kink.is_some());
            // Phase 0.2 at rate 1 allows 0.2, the longest step 0.1: about 10 steps below 0.9.
            let interior = steps.iter().filter(|s| s.end <= 0.9).count();
            assert!((9..=13).contains(&interior), "{interior}");
            // Graded: no step longer than half the depth below its start near the surface.
            assert!(steps
                .iter()
                .filter(|s| s.start > 0.9 && s.end < 1.0)
                .all(|s| s.end - s.start <= 0.5 * (1.0 - s.start) + 1e-15));
            // The last step starts within the surface depth (or the one step before it, which
            // would have left less than that depth).
            let depth = 1.0 - steps.last().unwrap().start;
            assert!(depth > 0.0 && depth <= 2.0 * SURFACE_DEPTH, "{depth}");
        }
    }

    /// The bound on ln(1 + V): across every step that does not start at the centre, 1 + V
    /// changes by at most the limit (measured, as the planner does, between 5 and 95 per cent of
    /// the step; the planner aims at 90 per cent of the limit, and sharing the end of a segment
    /// between two steps may lengthen one a little) where the other limits would allow longer
    /// steps.
    #[test]
    fn pressure_scale_height_is_resolved() {
        let model = Sphere {
            inner: HomogeneousSphere::new(5.0 / 3.0, 50).unwrap(),
            kink: None,
        };
        let limits = StepLimits {
            pressure: 0.2,
            ..LIMITS
        };
        let steps = plan(&model, limits, &[0.45], |_, _| (1.0, 1.0)).unwrap();
        let v = |x: f64| 2.0 * x * x / (1.0 - x * x);
        for s in steps.iter().filter(|s| s.start > 0.0 && s.end < 1.0) {
            let (a, b) = (
                s.start + 0.05 * (s.end - s.start),
                s.start + 0.95 * (s.end - s.start),
            );
            let change = ((1.0 + v(b)) / (1.0 + v(a))).ln();
            assert!(change <= 0.2, "{s:?}: {change}");
        }
    }
}
