//! Finding every mode of a degree up to a given order: scan, bracket, converge, classify, and
//! check that the orders found are complete.
//!
//! The scan steps through sigma with a step that is a fraction (1/`scan_density`) of the
//! expected local mode spacing: 2 pi Delta nu for p modes and sigma^2 Pi_0/(2 pi sqrt(l(l+1)))
//! for g modes (from the asymptotic relations, module `asymptotic`). Each sign change of the
//! discriminant (module `shooting`) brackets an eigenvalue, which Brent's method converges to
//! rounding. Each mode is then classified (module `eigenfunction`). Sorted by frequency, the
//! orders must increase by exactly one from one mode to the next (by two from g1 to p1 for
//! dipole modes of the full problem, which have no f mode): a larger jump means two modes fell
//! between two scan points, and that stretch is scanned again more finely; a repeated or
//! decreasing order is reported as an error, never hidden. The frequency range is widened until
//! it holds the lowest order wanted (order -K for degrees with g modes, the f mode, p1 or the
//! radial fundamental otherwise) and order K.

use super::asymptotic::asymptotic_values;
use super::eigenfunction::{analyse, Context};
use super::equations::{
    cowling_centre, cowling_node, full_centre, full_node, full_surface, radial_centre, radial_node,
    second_order_surface, Formulation, NodeMatrix,
};
use super::equilibrium::{Equilibrium, StructurePoint};
use super::mesh::{plan, Grid, StepLimits};
use super::shooting::Discretized;
use super::spectrum::{Mode, ModeKind};
use crate::error::{Error, Result};
use crate::numerics::brent::{brent, BrentError};
use std::f64::consts::PI;

/// Default largest phase of the oscillatory solutions across one collocation step, radians.
pub const DEFAULT_PHASE_PER_STEP: f64 = 0.3;
/// Largest growth (e-folds) of the non-oscillatory solutions across one step, per radian of
/// the phase limit: 5, i.e. 1.5 e-folds per step at the default phase of 0.3 rad, so that
/// halving the phase per step halves both limits.
const GROWTH_PER_PHASE: f64 = 5.0;
/// Default fitting point x = r/R.
pub const DEFAULT_FITTING_POINT: f64 = 0.5;
/// Default scan points per expected mode spacing.
pub const DEFAULT_SCAN_DENSITY: f64 = 4.0;
/// Largest degree accepted.
pub const MAX_DEGREE: u32 = 1000;
/// Largest |order| accepted.
pub const MAX_ORDER: u32 = 1000;
/// Times the frequency range may be widened to hold the orders wanted.
const MAX_WIDENINGS: usize = 8;
/// The mesh resolves frequencies down to this fraction of the lowest scanned...
const MESH_MARGIN_LOW: f64 = 0.85;
/// ... and up to this multiple of the highest, so that a first widening of the scan reuses it.
const MESH_MARGIN_HIGH: f64 = 1.3;
/// Times a gap in the orders may be rescanned, each time eight times more finely.
const MAX_RESCANS: u32 = 4;
/// Brent iterations allowed per root.
const MAX_ROOT_ITERATIONS: usize = 200;
/// Relative accuracy of each root in sigma: a few units of rounding, far below the
/// discretisation error, so the reported value is the discrete problem's eigenvalue.
const ROOT_TOLERANCE: f64 = 1e-14;

/// How modes are computed. Defaults: full problem (not Cowling), phase per step
/// [`DEFAULT_PHASE_PER_STEP`], fitting point [`DEFAULT_FITTING_POINT`], scan density
/// [`DEFAULT_SCAN_DENSITY`], no eigenfunctions kept.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OscillationSettings {
    cowling: bool,
    phase_per_step: f64,
    fitting_point: f64,
    scan_density: f64,
    eigenfunctions: bool,
}

impl Default for OscillationSettings {
    fn default() -> Self {
        Self {
            cowling: false,
            phase_per_step: DEFAULT_PHASE_PER_STEP,
            fitting_point: DEFAULT_FITTING_POINT,
            scan_density: DEFAULT_SCAN_DENSITY,
            eigenfunctions: false,
        }
    }
}

impl OscillationSettings {
    /// Neglect the potential perturbation for l >= 1 (Cowling approximation).
    pub fn with_cowling(mut self, cowling: bool) -> Self {
        self.cowling = cowling;
        self
    }

    /// Keep the eigenfunctions of every mode.
    pub fn with_eigenfunctions(mut self, keep: bool) -> Self {
        self.eigenfunctions = keep;
        self
    }

    /// Largest phase (radians) of the oscillatory solutions across one step, in (0, 2]: halving
    /// it doubles the mesh wherever the solutions oscillate.
    pub fn with_phase_per_step(mut self, phase: f64) -> Result<Self> {
        if !(phase > 0.0 && phase <= 2.0) {
            return Err(Error::invalid(
                "phase_per_step",
                phase,
                "a number in (0, 2] radians, e.g. 0.2",
            ));
        }
        self.phase_per_step = phase;
        Ok(self)
    }

    /// Fitting point x = r/R, in [0.05, 0.95].
    pub fn with_fitting_point(mut self, x: f64) -> Result<Self> {
        if !(0.05..=0.95).contains(&x) {
            return Err(Error::invalid(
                "fitting_point",
                x,
                "a fractional radius in [0.05, 0.95], e.g. 0.5",
            ));
        }
        self.fitting_point = x;
        Ok(self)
    }

    /// Scan points per expected mode spacing, in [1, 100].
    pub fn with_scan_density(mut self, density: f64) -> Result<Self> {
        if !(1.0..=100.0).contains(&density) {
            return Err(Error::invalid(
                "scan_density",
                density,
                "a number of scan points per mode spacing in [1, 100], e.g. 4",
            ));
        }
        self.scan_density = density;
        Ok(self)
    }

    /// Whether the Cowling approximation is used.
    pub fn cowling(&self) -> bool {
        self.cowling
    }

    /// Phase per step, radians.
    pub fn phase_per_step(&self) -> f64 {
        self.phase_per_step
    }

    /// Fitting point.
    pub fn fitting_point(&self) -> f64 {
        self.fitting_point
    }

    /// Whether eigenfunctions are kept.
    pub fn eigenfunctions(&self) -> bool {
        self.eigenfunctions
    }
}

/// The discretised problem in its order.
enum Shooter {
    Second(Discretized<2, 1>),
    Fourth(Discretized<4, 2>),
}

/// The mesh and discretised problem for one degree and frequency band.
struct Prepared<'a> {
    model: &'a dyn Equilibrium,
    degree: u32,
    formulation: Formulation,
    grid: Grid,
    shooter: Shooter,
    keep: bool,
}

fn node_matrices<const D: usize>(
    grid: &Grid,
    node: impl Fn(f64, &StructurePoint) -> NodeMatrix<D>,
) -> Vec<[NodeMatrix<D>; 3]> {
    (0..grid.steps())
        .map(|s| {
            let h = grid.x[s + 1] - grid.x[s];
            let p = &grid.points[s];
            let at = |j: usize| node(grid.x[s] + super::collocation::NODES[j] * h, &p[j]);
            [at(0), at(1), at(2)]
        })
        .collect()
}

impl<'a> Prepared<'a> {
    /// Mesh and matrices for `degree`, resolving the band of w from `w_lo` to `w_hi`.
    fn new(
        model: &'a dyn Equilibrium,
        degree: u32,
        settings: &OscillationSettings,
        w_lo: f64,
        w_hi: f64,
    ) -> Result<Self> {
        let formulation = Formulation::for_degree(degree, settings.cowling);
        let rates = |x: f64, p: &StructurePoint| {
            let node = match formulation {
                Formulation::Radial => radial_node(x, p),
                _ => cowling_node(degree, x, p),
            };
            let (phase_lo, growth_lo) = node.rates(w_lo);
            let (phase_hi, growth_hi) = node.rates(w_hi);
            (phase_lo.max(phase_hi), growth_lo.max(growth_hi))
        };
        let limits = StepLimits {
            phase: settings.phase_per_step,
            growth: GROWTH_PER_PHASE * settings.phase_per_step,
        };
        let grid = Grid::new(model, &plan(model, limits, rates)?)?;
        if grid.steps() < 2 {
            return Err(Error::invalid(
                "model",
                "one mesh interval",
                "the oscillation mesh needs at least two steps",
            ));
        }
        let fit = grid.boundary_near(settings.fitting_point);
        let centre = model.centre();
        let shooter = match formulation {
            Formulation::Radial => Shooter::Second(Discretized {
                nodes: node_matrices(&grid, radial_node),
                x: grid.x.clone(),
                centre: radial_centre(&centre),
                surface: second_order_surface(),
                fit,
            }),
            Formulation::Cowling => Shooter::Second(Discretized {
                nodes: node_matrices(&grid, |x, p| cowling_node(degree, x, p)),
                x: grid.x.clone(),
                centre: cowling_centre(degree, &centre),
                surface: second_order_surface(),
                fit,
            }),
            Formulation::Full => Shooter::Fourth(Discretized {
                nodes: node_matrices(&grid, |x, p| full_node(degree, x, p)),
                x: grid.x.clone(),
                centre: full_centre(degree, &centre),
                surface: full_surface(degree, model.surface_u()),
                fit,
            }),
        };
        Ok(Self {
            model,
            degree,
            formulation,
            grid,
            shooter,
            keep: settings.eigenfunctions,
        })
    }

    fn failure(&self, w: f64, what: &str) -> Error {
        Error::ModeSearch {
            degree: self.degree,
            reason: format!("{what} at sigma^2 = {w:e}"),
        }
    }

    /// The discriminant at w = sigma^2.
    fn discriminant(&self, w: f64) -> Result<f64> {
        let d = match &self.shooter {
            Shooter::Second(p) => p.discriminant::<6>(w),
            Shooter::Fourth(p) => p.discriminant::<12>(w),
        };
        d.ok_or_else(|| self.failure(w, "the solutions could not be carried through the mesh"))
    }

    /// The classified mode at the eigenvalue w.
    fn mode(&self, w: f64) -> Result<Mode> {
        let ctx = Context {
            model: self.model,
            grid: &self.grid,
            formulation: self.formulation,
            degree: self.degree,
            w,
        };
        let analysis = match &self.shooter {
            Shooter::Second(p) => p
                .eigenfunction::<6>(w)
                .and_then(|s| analyse(&ctx, &s, self.keep)),
            Shooter::Fourth(p) => p
                .eigenfunction::<12>(w)
                .and_then(|s| analyse(&ctx, &s, self.keep)),
        }
        .ok_or_else(|| self.failure(w, "the eigenfunction could not be built"))?;
        Ok(Mode {
            degree: self.degree,
            order: analysis.order,
            kind: ModeKind::of_order(analysis.order),
            sigma_squared: w,
            nodes_p: analysis.nodes_p,
            nodes_g: analysis.nodes_g,
            inertia: analysis.inertia,
            eigenfunction: analysis.eigenfunction,
        })
    }

    /// Roots of the discriminant as a function of `s` (w = `to_w(s)`) between `from` and `to`,
    /// stepping by `step(s)`.
    fn scan(
        &self,
        from: f64,
        to: f64,
        step: &dyn Fn(f64) -> f64,
        to_w: &dyn Fn(f64) -> f64,
    ) -> Result<Vec<f64>> {
        let f = |s: f64| self.discriminant(to_w(s));
        let mut roots = Vec::new();
        let (mut a, mut fa) = (from, f(from)?);
        while a < to {
            let b = (a + step(a)).min(to);
            let fb = f(b)?;
            if fa == 0.0 {
                roots.push(a);
            } else if fa * fb < 0.0 {
                let tolerance = ROOT_TOLERANCE * b.abs().max(f64::MIN_POSITIVE);
                let root = brent(&f, a, b, fa, fb, tolerance, MAX_ROOT_ITERATIONS).map_err(
                    |e| match e {
                        BrentError::Evaluation(e) => e,
                        _ => self.failure(to_w(a), "a bracketed root did not converge"),
                    },
                )?;
                roots.push(root);
            }
            if b <= a {
                break;
            }
            (a, fa) = (b, fb);
        }
        if fa == 0.0 && roots.last() != Some(&a) {
            roots.push(a);
        }
        Ok(roots)
    }
}

/// The eigenvalues w = sigma^2 of degree `degree` in [w_lo, w_hi], found by scanning `points`
/// equal steps in w (negative w allowed: unstable modes). For degree >= 1 the interval must not
/// contain 0, where the equations are singular. No classification and no completeness check:
/// for the search of stable modes by order use [`find_modes`].
pub fn find_eigenvalues(
    model: &dyn Equilibrium,
    degree: u32,
    w_lo: f64,
    w_hi: f64,
    points: usize,
    settings: &OscillationSettings,
) -> Result<Vec<f64>> {
    if !(w_lo < w_hi && w_lo.is_finite() && w_hi.is_finite())
        || (degree > 0 && w_lo <= 0.0 && w_hi >= 0.0)
        || points == 0
    {
        return Err(Error::invalid(
            "sigma^2 range",
            format!("[{w_lo}, {w_hi}] in {points} steps"),
            "an increasing finite range, not containing 0 for l >= 1, and at least one step",
        ));
    }
    let prepared = Prepared::new(model, degree, settings, w_lo, w_hi)?;
    let step = (w_hi - w_lo) / points as f64;
    prepared.scan(w_lo, w_hi, &|_| step, &|w| w)
}

/// Orders expected for a degree: the lowest wanted and whether order 0 is skipped.
struct Expected {
    lowest: i32,
    skips_zero: bool,
}

/// Every mode of `degree` with order from the lowest that exists (radial fundamental, f mode
/// or p1, or g_K where there is a g-mode cavity) up to `max_order` = K, classified and checked
/// for completeness (module documentation), sorted by frequency.
///
/// Errors: degree above [`MAX_DEGREE`] or order above [`MAX_ORDER`]
/// ([`Error::InvalidInput`]); [`Error::ModeSearch`] if the orders found are not consecutive
/// even after rescanning, or the lowest or highest wanted cannot be reached (for example the
/// radial fundamental of a dynamically unstable model, which has sigma^2 < 0).
pub fn find_modes(
    model: &dyn Equilibrium,
    degree: u32,
    max_order: u32,
    settings: &OscillationSettings,
) -> Result<Vec<Mode>> {
    if degree > MAX_DEGREE {
        return Err(Error::invalid(
            "degree",
            degree,
            "degrees are integers from 0 to 1000, e.g. 2",
        ));
    }
    if max_order == 0 || max_order > MAX_ORDER {
        return Err(Error::invalid(
            "max_order",
            max_order,
            "the highest order must be an integer from 1 to 1000, e.g. 25",
        ));
    }
    let formulation = Formulation::for_degree(degree, settings.cowling);
    let asymptotic = asymptotic_values(model);
    let p_spacing = 2.0 * PI * asymptotic.large_separation;
    let lf = (f64::from(degree) * (f64::from(degree) + 1.0)).sqrt();
    let buoyancy = asymptotic.buoyancy_integral;
    let has_g = degree > 0 && buoyancy > 0.0;
    let k = max_order as i32;
    let expected = match formulation {
        Formulation::Radial => Expected {
            lowest: 1,
            skips_zero: true,
        },
        _ if has_g => Expected {
            lowest: -k,
            skips_zero: formulation == Formulation::Full && degree == 1,
        },
        Formulation::Full if degree == 1 => Expected {
            lowest: 1,
            skips_zero: true,
        },
        _ => Expected {
            lowest: 0,
            skips_zero: false,
        },
    };
    let density = settings.scan_density;
    // Expected spacing in sigma near sigma: p modes 2 pi Delta nu, g modes
    // sigma^2 Pi_0/(2 pi sqrt(l(l+1))) = pi sigma^2/(sqrt(l(l+1)) int N dr/r).
    let step = move |s: f64| {
        let g = if has_g {
            PI * s * s / (lf * buoyancy)
        } else {
            f64::INFINITY
        };
        p_spacing.min(g) / density
    };
    let mut s_lo: f64 = if has_g {
        lf * buoyancy / (PI * f64::from(max_order + 4))
    } else {
        0.02 * p_spacing
    };
    let mut s_hi: f64 = p_spacing * (f64::from(max_order) + 0.5 * f64::from(degree) + 3.0);
    // The mesh resolves a band wider than the first scan, so that widening the scan a little
    // reuses it (and the modes already found); a larger widening rebuilds it.
    let square = |s: f64| s * s;
    let build = |lo: f64, hi: f64| {
        Prepared::new(
            model,
            degree,
            settings,
            square(lo * MESH_MARGIN_LOW),
            square(hi * MESH_MARGIN_HIGH),
        )
    };
    let converge = |prepared: &Prepared<'_>, from: f64, to: f64| -> Result<Vec<Mode>> {
        prepared
            .scan(from, to, &step, &square)?
            .iter()
            .map(|&s| prepared.mode(s * s))
            .collect()
    };
    let mut mesh_band = (s_lo * MESH_MARGIN_LOW, s_hi * MESH_MARGIN_HIGH);
    let mut prepared = build(s_lo, s_hi)?;
    let mut modes = converge(&prepared, s_lo, s_hi)?;
    for _ in 0..MAX_WIDENINGS {
        fill_gaps(&prepared, &mut modes, &expected, &step)?;
        let lowest = modes.first().map_or(i32::MAX, |m| m.order);
        let highest = modes.last().map_or(i32::MIN, |m| m.order);
        // Widen by the asymptotic spacing of the orders missing, plus two.
        let lo = if lowest > expected.lowest {
            let missing = f64::from((lowest - expected.lowest).unsigned_abs() + 2);
            if has_g {
                1.0 / (1.0 / s_lo + missing * PI / (lf * buoyancy))
            } else {
                0.3 * s_lo
            }
        } else {
            s_lo
        };
        let hi = if highest < k {
            s_hi + f64::from((k - highest).unsigned_abs() + 2) * p_spacing
        } else {
            s_hi
        };
        if lo == s_lo && hi == s_hi {
            modes.retain(|m| m.order >= expected.lowest && m.order <= k);
            return Ok(modes);
        }
        if lo < mesh_band.0 || hi > mesh_band.1 {
            mesh_band = (lo * MESH_MARGIN_LOW, hi * MESH_MARGIN_HIGH);
            prepared = build(lo, hi)?;
            modes = converge(&prepared, lo, hi)?;
        } else {
            if lo < s_lo {
                modes.extend(converge(&prepared, lo, s_lo)?);
            }
            if hi > s_hi {
                modes.extend(converge(&prepared, s_hi, hi)?);
            }
        }
        (s_lo, s_hi) = (lo, hi);
    }
    Err(Error::ModeSearch {
        degree,
        reason: format!(
            "orders {} to {k} not all found between sigma = {s_lo:.6e} and {s_hi:.6e} (is the \
             model unstable, with sigma^2 < 0 for some of them?)",
            expected.lowest
        ),
    })
}

/// The order that should follow `order`.
fn next_order(order: i32, expected: &Expected) -> i32 {
    if order == -1 && expected.skips_zero {
        1
    } else {
        order + 1
    }
}

/// Rescan between consecutive modes whose orders jump by more than one step, more finely each
/// time; error if orders repeat or decrease, or a gap remains.
fn fill_gaps(
    prepared: &Prepared<'_>,
    modes: &mut Vec<Mode>,
    expected: &Expected,
    step: &dyn Fn(f64) -> f64,
) -> Result<()> {
    let square = |s: f64| s * s;
    for pass in 0..=MAX_RESCANS {
        modes.sort_by(|a, b| a.sigma_squared.total_cmp(&b.sigma_squared));
        // A root on the boundary of two scanned ranges is found by both.
        modes.dedup_by(|b, a| (b.sigma_squared - a.sigma_squared).abs() <= 1e-12 * a.sigma_squared);
        let mut gaps = Vec::new();
        for pair in modes.windows(2) {
            let (a, b) = (&pair[0], &pair[1]);
            let wanted = next_order(a.order, expected);
            if b.order < wanted {
                return Err(Error::ModeSearch {
                    degree: prepared.degree,
                    reason: format!(
                        "orders not increasing with frequency: {} at sigma^2 = {:.10e}, then {} \
                         at {:.10e}",
                        a.order, a.sigma_squared, b.order, b.sigma_squared
                    ),
                });
            }
            if b.order > wanted {
                gaps.push((a.sigma(), b.sigma(), a.order, b.order));
            }
        }
        if gaps.is_empty() {
            return Ok(());
        }
        if pass == MAX_RESCANS {
            let (_, _, a, b) = gaps[0];
            return Err(Error::ModeSearch {
                degree: prepared.degree,
                reason: format!("no mode found between orders {a} and {b} after rescanning"),
            });
        }
        let factor = 8f64.powi(pass as i32 + 1);
        for (sa, sb, _, _) in gaps {
            let margin = 1e-6 * (sb - sa);
            let finer = |s: f64| step(s) / factor;
            for root in prepared.scan(sa + margin, sb - margin, &finer, &square)? {
                modes.push(prepared.mode(root * root)?);
            }
        }
    }
    Ok(())
}
