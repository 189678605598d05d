//! Finding every mode of a degree up to a given order: scan, bracket, converge, classify, and
//! check that the orders found are complete.
//!
//! # Bands and two resolutions
//!
//! The frequency range is cut into bands a factor [`BAND_RATIO`] wide in sigma, and each band
//! gets its own two meshes (module `mesh`), built for the rates at its own ends: a coarse one
//! (phase per step [`COARSE_PHASE_FACTOR`] times the requested one, growth at most
//! [`COARSE_MAX_GROWTH`] e-folds) to find the modes, and the requested (fine) one to converge
//! them. Both end a step at the fitting point, so that their discriminants approximate the same
//! function of w (module `shooting`) and the coarse one predicts the fine one's root and slope.
//! Bands are searched in parallel (rayon).
//!
//! In each band the coarse discriminant is scanned with a step that is a fraction
//! (1/`scan_density`) of the expected local mode spacing: 2 pi Delta nu for p modes and
//! sigma^2 Pi_0/(2 pi sqrt(l(l+1))) for g modes (from the asymptotic relations, module
//! `asymptotic`). Each sign change brackets an eigenvalue, which Brent's method converges on
//! the coarse mesh to [`COARSE_TOLERANCE`]; the secant method on the fine mesh then starts
//! from that root with the coarse slope (a Newton step) and stops when its step falls below
//! [`FINAL_STEP`], the last evaluation keeping the solution for the eigenfunction; should the
//! secant leave the bracket, Brent's method on the fine mesh takes over. Each mode is then
//! classified (module `eigenfunction`).
//!
//! Sorted by frequency, the orders must increase by exactly one from one mode to the next (by
//! two from g1 to p1 for dipole modes of the full problem, which have no f mode): a larger jump
//! means two modes fell between two scan points, and that stretch is scanned again more finely;
//! a repeated or decreasing order is reported as an error, never hidden. The frequency range is
//! widened until it holds the lowest order wanted (order -K for degrees with g modes, the f
//! mode, p1 or the radial fundamental otherwise) and order K.

use super::asymptotic::{asymptotic_values, AsymptoticValues};
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
use rayon::prelude::*;
use std::f64::consts::PI;

/// Default largest phase of the oscillatory solutions across one collocation step, radians.
pub const DEFAULT_PHASE_PER_STEP: f64 = 0.2;
/// Largest growth (e-folds) of the non-oscillatory solutions across one step, per radian of
/// the phase limit: 5, i.e. 1.5 e-folds per step at the default phase of 0.3 rad, so that
/// halving the phase per step halves both limits.
const GROWTH_PER_PHASE: f64 = 5.0;
/// Largest change of ln c1, ln Gamma_1 and A*/V across one step, per radian of the phase limit
/// (module `mesh`): 1/4, i.e. 0.05 at the default phase of 0.2 rad. This resolves the mass
/// concentration of a condensed core (the n = 4.5 polytrope's core spans x ~ 0.01) and the
/// ionisation zones and superadiabatic layer of a star's envelope, where neither the phase nor
/// the growth of the solutions limits the steps.
const STRUCTURE_PER_PHASE: f64 = 0.25;
/// Largest change of ln(1 + V) across one step, per radian of the phase limit: 1, i.e. 0.2 at
/// the default phase (module `mesh`). It resolves the pressure scale height in the outer
/// envelope of a star (a bound on ln V, measured before the core was exempted: a 1 M_sun ZAMS
/// model on 2000 rows had errors of 3e-7 in low-order modes (l = 2, p2) with 1 per step, 2e-7
/// with 0.5, and 7e-9 with 0.2, against 16000 rows at half the phase per step).
const PRESSURE_PER_PHASE: f64 = 1.0;
/// Longest step (in x) per radian of the phase limit: 0.075, i.e. 0.015 at the default phase,
/// so that low-frequency modes, whose solutions barely oscillate, still see the structure
/// resolved (without a longest step the dipole p1 of the n = 3 polytrope was wrong by 1e-4;
/// with these limits the worst error of the 1 M_sun ZAMS model on 2000 rows, modes l = 0-3 up
/// to order 25, is 8e-9, against 1.2e-8 with 0.1 and 1/3 above).
const LONGEST_PER_PHASE: f64 = 0.075;
/// Longest step near the surface, as a fraction of the depth below it, per radian of the phase
/// limit: 2.5, i.e. 0.5 at the default phase, the grading that keeps the method's order where
/// V grows like 1/(1 - x) (module `mesh`).
const GRADING_PER_PHASE: f64 = 2.5;
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
/// Times a gap in the orders may be rescanned, each time eight times more finely.
const MAX_RESCANS: u32 = 4;
/// Brent iterations allowed per root.
const MAX_ROOT_ITERATIONS: usize = 200;
/// Relative accuracy in sigma of a root converged by Brent's method on the fine mesh (the
/// fallback): a few units of rounding, far below the discretisation error, so the reported
/// value is the discrete problem's eigenvalue.
const ROOT_TOLERANCE: f64 = 1e-14;
/// Width of a band: its upper end in sigma over its lower end (1.6: fewest instructions for
/// the n = 3 polytrope and the 1 M_sun ZAMS model among 1.15, 1.25, 1.4, 1.6 and 2). Each band's meshes resolve the
/// rates at its ends, so a band over-resolves its modes by at most this factor.
pub const BAND_RATIO: f64 = 1.6;
/// The coarse mesh's phase per step (and its other limits, within the caps below), as a
/// multiple of the requested (fine) one: 1.2 rad at the default, where the method's phase error
/// is about 4e-5 rad per step (the error constant of the (3,3) Pade approximant, h^7/100800;
/// Hairer, Norsett & Wanner 1993, §II.7), so that the coarse roots lie within about 1e-4 of a
/// mode spacing of the fine ones (measured: 4e-6 of sigma typically, 2e-5 at most, on the
/// n = 3 polytrope).
pub const COARSE_PHASE_FACTOR: f64 = 6.0;
/// The coarse mesh's largest growth per step, e-folds: the method's stability function (the
/// (3,3) Pade approximant of exp) matches exp(mu) to 1 per cent up to mu = 2.5; its real pole
/// is at mu = 4.64.
pub const COARSE_MAX_GROWTH: f64 = 2.5;
/// The coarse mesh's largest step near the surface, as a fraction of the depth below it.
const COARSE_MAX_GRADING: f64 = 0.5;
/// Relative accuracy in sigma of the coarse roots: about the coarse mesh's own error (module
/// documentation of [`COARSE_PHASE_FACTOR`]); converging further would not bring the fine
/// secant's start closer.
pub const COARSE_TOLERANCE: f64 = 1e-5;
/// The fine secant stops when its step is below this, relative to sigma: its error is then of
/// the order of that step times the previous one over the mode spacing, far below rounding.
pub const FINAL_STEP: f64 = 1e-11;
/// The fine secant keeps the solution (for the eigenfunction) at an evaluation whose step from
/// the one before is below this, relative to sigma: the next step is then expected to be below
/// [`FINAL_STEP`] (the first fine step, a Newton step with the coarse slope, leaves errors of
/// 3e-10 typically and 5e-8 at most on the n = 3 polytrope, as the coarse slope is off by 6e-5
/// typically).
const RECORD_STEP: f64 = 1e-8;
/// Secant iterations on the fine mesh before Brent's method takes over.
const MAX_SECANT_ITERATIONS: usize = 12;
/// Two modes of the same order whose sigma^2 agree to this are one mode found from two bands
/// (on different meshes, so their values differ by the discretisation error, about 1e-9).
const DUPLICATE_TOLERANCE: f64 = 1e-6;

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

/// The step limits of the requested (fine) resolution.
fn fine_limits(settings: &OscillationSettings) -> StepLimits {
    StepLimits {
        phase: settings.phase_per_step,
        growth: GROWTH_PER_PHASE * settings.phase_per_step,
        structure: STRUCTURE_PER_PHASE * settings.phase_per_step,
        pressure: PRESSURE_PER_PHASE * settings.phase_per_step,
        longest: LONGEST_PER_PHASE * settings.phase_per_step,
        grading: GRADING_PER_PHASE * settings.phase_per_step,
    }
}

/// The step limits of the coarse resolution (module documentation).
fn coarse_limits(settings: &OscillationSettings) -> StepLimits {
    let fine = fine_limits(settings);
    StepLimits {
        phase: COARSE_PHASE_FACTOR * fine.phase,
        growth: (COARSE_PHASE_FACTOR * fine.growth).min(COARSE_MAX_GROWTH.max(fine.growth)),
        structure: COARSE_PHASE_FACTOR * fine.structure,
        pressure: COARSE_PHASE_FACTOR * fine.pressure,
        longest: COARSE_PHASE_FACTOR * fine.longest,
        grading: (COARSE_PHASE_FACTOR * fine.grading).min(COARSE_MAX_GRADING),
    }
}

impl<'a> Prepared<'a> {
    /// Mesh and matrices for `degree` with step `limits`, resolving the band of w from `w_lo`
    /// to `w_hi`.
    fn new(
        model: &'a dyn Equilibrium,
        degree: u32,
        settings: &OscillationSettings,
        limits: StepLimits,
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
        let grid = Grid::new(
            model,
            &plan(model, limits, &[settings.fitting_point], rates)?,
        )?;
        let fit = grid.boundary_at(settings.fitting_point).ok_or_else(|| {
            Error::invalid(
                "fitting_point",
                settings.fitting_point,
                "the fitting point must be a boundary of the oscillation mesh",
            )
        })?;
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

    /// The discriminant at w and the classified mode whose eigenfunction is the solution there
    /// (w should be an eigenvalue, to the accuracy wanted of the eigenfunction).
    fn solution(&self, w: f64) -> Result<(f64, Mode)> {
        let ctx = Context {
            model: self.model,
            grid: &self.grid,
            formulation: self.formulation,
            degree: self.degree,
            w,
        };
        let analysed = match &self.shooter {
            Shooter::Second(p) => p
                .eigenfunction::<6>(w)
                .and_then(|(d, s)| Some((d, analyse(&ctx, &s, self.keep)?))),
            Shooter::Fourth(p) => p
                .eigenfunction::<12>(w)
                .and_then(|(d, s)| Some((d, analyse(&ctx, &s, self.keep)?))),
        };
        let (det, analysis) =
            analysed.ok_or_else(|| self.failure(w, "the eigenfunction could not be built"))?;
        let mode = Mode {
            degree: self.degree,
            order: analysis.order,
            kind: ModeKind::of_order(analysis.order),
            sigma_squared: w,
            nodes_p: analysis.nodes_p,
            nodes_g: analysis.nodes_g,
            inertia: analysis.inertia,
            eigenfunction: analysis.eigenfunction,
        };
        Ok((det, mode))
    }

    /// Brackets [a, b] (with the discriminant's values there) of the sign changes of the
    /// discriminant as a function of `s` (w = `to_w(s)`) between `from` and `to`, stepping by
    /// `step(s)`. A zero at a scan point closes the bracket that ends there.
    fn brackets(
        &self,
        from: f64,
        to: f64,
        step: &dyn Fn(f64) -> f64,
        to_w: &dyn Fn(f64) -> f64,
    ) -> Result<Vec<[f64; 4]>> {
        let f = |s: f64| self.discriminant(to_w(s));
        let mut found = Vec::new();
        let (mut a, mut fa) = (from, f(from)?);
        if fa == 0.0 {
            found.push([a, a, fa, fa]);
        }
        while a < to {
            let b = (a + step(a)).min(to);
            if b <= a {
                break;
            }
            let fb = f(b)?;
            if fa * fb < 0.0 || (fb == 0.0 && fa != 0.0) {
                found.push([a, b, fa, fb]);
            }
            (a, fa) = (b, fb);
        }
        Ok(found)
    }

    /// The root of the discriminant (in s, with w = `to_w(s)`) in `bracket`, converged by
    /// Brent's method to the relative accuracy `tolerance`, with the slope dD/ds there from
    /// the two evaluations nearest the root.
    fn root(
        &self,
        bracket: [f64; 4],
        tolerance: f64,
        to_w: &dyn Fn(f64) -> f64,
    ) -> Result<(f64, f64)> {
        let [a, b, fa, fb] = bracket;
        let mut seen = vec![(a, fa), (b, fb)];
        let root = if fa == 0.0 || a == b {
            a
        } else {
            brent(
                |s: f64| {
                    let v = self.discriminant(to_w(s))?;
                    seen.push((s, v));
                    Ok(v)
                },
                a,
                b,
                fa,
                fb,
                tolerance * b.abs().max(f64::MIN_POSITIVE),
                MAX_ROOT_ITERATIONS,
            )
            .map_err(|e| match e {
                BrentError::Evaluation(e) => e,
                _ => self.failure(to_w(a), "a bracketed root did not converge"),
            })?
        };
        seen.sort_by(|p, q| (p.0 - root).abs().total_cmp(&(q.0 - root).abs()));
        seen.dedup_by(|p, q| p.0 == q.0);
        let slope = match seen.as_slice() {
            [p, q, ..] => (p.1 - q.1) / (p.0 - q.0),
            _ => (fb - fa) / (b - a),
        };
        Ok((root, slope))
    }
}

/// The eigenvalues w = sigma^2 of degree `degree` in [w_lo, w_hi], found by scanning `points`
/// equal steps in w (negative w allowed: unstable modes) on one mesh at the requested
/// resolution. For degree >= 1 the interval must not contain 0, where the equations are
/// singular. No classification and no completeness check: for the search of stable modes by
/// order use [`find_modes`].
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
    let prepared = Prepared::new(model, degree, settings, fine_limits(settings), w_lo, w_hi)?;
    let step = (w_hi - w_lo) / points as f64;
    let identity = |w: f64| w;
    prepared
        .brackets(w_lo, w_hi, &|_| step, &identity)?
        .into_iter()
        .map(|bracket| Ok(prepared.root(bracket, ROOT_TOLERANCE, &identity)?.0))
        .collect()
}

/// Orders expected for a degree: the lowest wanted and whether order 0 is skipped.
struct Expected {
    lowest: i32,
    skips_zero: bool,
}

/// The search for the modes of one degree (module documentation).
struct Search<'a, F> {
    model: &'a dyn Equilibrium,
    degree: u32,
    settings: OscillationSettings,
    /// The scan step in sigma at sigma.
    step: F,
}

fn square(s: f64) -> f64 {
    s * s
}

impl<F: Fn(f64) -> f64 + Sync> Search<'_, F> {
    /// Every mode in [lo, hi] (sigma), scanning with `step / refinement`, band by band in
    /// parallel.
    fn modes(&self, lo: f64, hi: f64, refinement: f64) -> Result<Vec<Mode>> {
        let mut bands = Vec::new();
        let mut a = lo;
        while a < hi {
            let b = if a * BAND_RATIO * BAND_RATIO.sqrt() >= hi {
                hi
            } else {
                a * BAND_RATIO
            };
            bands.push((a, b));
            a = b;
        }
        let found = bands
            .par_iter()
            .map(|&(a, b)| self.band(a, b, refinement))
            .collect::<Result<Vec<_>>>()?;
        Ok(found.into_iter().flatten().collect())
    }

    /// The modes of one band (module documentation).
    fn band(&self, lo: f64, hi: f64, refinement: f64) -> Result<Vec<Mode>> {
        let (w_lo, w_hi) = (square(lo), square(hi));
        let coarse = Prepared::new(
            self.model,
            self.degree,
            &self.settings,
            coarse_limits(&self.settings),
            w_lo,
            w_hi,
        )?;
        let step = |s: f64| (self.step)(s) / refinement;
        let brackets = coarse.brackets(lo, hi, &step, &square)?;
        if brackets.is_empty() {
            return Ok(Vec::new());
        }
        let fine = Prepared::new(
            self.model,
            self.degree,
            &self.settings,
            fine_limits(&self.settings),
            w_lo,
            w_hi,
        )?;
        let mut modes = Vec::with_capacity(brackets.len());
        for bracket in brackets {
            let (guess, slope) = coarse.root(bracket, COARSE_TOLERANCE, &square)?;
            modes.extend(refine(&fine, guess, slope, bracket)?);
        }
        Ok(modes)
    }
}

/// The mode of the fine discretisation `fine` near the coarse root `guess` with the coarse
/// slope dD/dsigma `slope`, both from the coarse scan's `bracket` (module documentation).
/// `None` if the fine discriminant has no root in the bracket that the secant or Brent's method
/// can reach (the coarse root lay within the coarse error of the bracket's end): the gap in the
/// orders is then rescanned (`fill_gaps`).
fn refine(fine: &Prepared<'_>, guess: f64, slope: f64, bracket: [f64; 4]) -> Result<Option<Mode>> {
    let f = |s: f64| fine.discriminant(square(s));
    let (a, b) = (bracket[0], bracket[1]);
    let inside = |s: f64| s.is_finite() && s >= a && s <= b;
    let (mut s0, mut f0) = (guess, f(guess)?);
    if f0 == 0.0 {
        return Ok(Some(fine.solution(square(s0))?.1));
    }
    let mut s1 = s0 - f0 / slope;
    for _ in 0..MAX_SECANT_ITERATIONS {
        if !inside(s1) || s1 == s0 {
            break;
        }
        if (s1 - s0).abs() <= RECORD_STEP * s1 {
            let (f1, mut mode) = fine.solution(square(s1))?;
            let s2 = if f1 == 0.0 {
                s1
            } else {
                s1 - f1 * (s1 - s0) / (f1 - f0)
            };
            if (s2 - s1).abs() <= FINAL_STEP * s1 && inside(s2) {
                mode.sigma_squared = square(s2);
                return Ok(Some(mode));
            }
            (s0, f0, s1) = (s1, f1, s2);
        } else {
            let f1 = f(s1)?;
            if f1 == 0.0 {
                return Ok(Some(fine.solution(square(s1))?.1));
            }
            (s0, f0, s1) = (s1, f1, s1 - f1 * (s1 - s0) / (f1 - f0));
        }
    }
    // The secant left the bracket or did not settle: Brent's method on the fine mesh, if the
    // bracket holds a sign change there.
    let (fa, fb) = (f(a)?, f(b)?);
    if fa * fb > 0.0 {
        return Ok(None);
    }
    let (root, _) = fine.root([a, b, fa, fb], ROOT_TOLERANCE, &square)?;
    Ok(Some(fine.solution(square(root))?.1))
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
    modes_of_degree(
        model,
        &asymptotic_values(model),
        degree,
        max_order,
        settings,
    )
}

/// [`find_modes`] with the model's asymptotic values already computed.
fn modes_of_degree(
    model: &dyn Equilibrium,
    asymptotic: &AsymptoticValues,
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
    let search = Search {
        model,
        degree,
        settings: *settings,
        step,
    };
    let mut s_lo: f64 = if has_g {
        lf * buoyancy / (PI * f64::from(max_order + 4))
    } else {
        0.02 * p_spacing
    };
    let mut s_hi: f64 = p_spacing * (f64::from(max_order) + 0.5 * f64::from(degree) + 3.0);
    let mut modes = search.modes(s_lo, s_hi, 1.0)?;
    for _ in 0..MAX_WIDENINGS {
        fill_gaps(&search, &mut modes, &expected)?;
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
        if lo < s_lo {
            modes.extend(search.modes(lo, s_lo, 1.0)?);
        }
        if hi > s_hi {
            modes.extend(search.modes(s_hi, hi, 1.0)?);
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

/// Every mode of each degree of `degrees` up to `max_order` ([`find_modes`]), the degrees
/// searched in parallel; by degree in the order given, then by frequency. Errors as
/// [`find_modes`] (the first failing degree's).
pub fn find_modes_of_degrees(
    model: &dyn Equilibrium,
    degrees: &[u32],
    max_order: u32,
    settings: &OscillationSettings,
) -> Result<Vec<Mode>> {
    // The asymptotic integrals once for all degrees.
    let asymptotic = asymptotic_values(model);
    let found = degrees
        .par_iter()
        .map(|&l| modes_of_degree(model, &asymptotic, l, max_order, settings))
        .collect::<Result<Vec<_>>>()?;
    Ok(found.into_iter().flatten().collect())
}

/// The order that should follow `order`.
fn next_order(order: i32, expected: &Expected) -> i32 {
    if order == -1 && expected.skips_zero {
        1
    } else {
        order + 1
    }
}

/// Sort by frequency and drop the second copy of a mode found from two bands.
fn sort_and_merge(modes: &mut Vec<Mode>) {
    modes.sort_by(|a, b| a.sigma_squared.total_cmp(&b.sigma_squared));
    modes.dedup_by(|b, a| {
        a.order == b.order
            && (b.sigma_squared - a.sigma_squared).abs() <= DUPLICATE_TOLERANCE * a.sigma_squared
    });
}

/// Rescan between consecutive modes whose orders jump by more than one step, more finely each
/// time; error if orders repeat or decrease, or a gap remains.
fn fill_gaps<F: Fn(f64) -> f64 + Sync>(
    search: &Search<'_, F>,
    modes: &mut Vec<Mode>,
    expected: &Expected,
) -> Result<()> {
    for pass in 0..=MAX_RESCANS {
        sort_and_merge(modes);
        let mut gaps = Vec::new();
        for pair in modes.windows(2) {
            let (a, b) = (&pair[0], &pair[1]);
            let wanted = next_order(a.order, expected);
            if b.order < wanted {
                return Err(Error::ModeSearch {
                    degree: search.degree,
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
                degree: search.degree,
                reason: format!("no mode found between orders {a} and {b} after rescanning"),
            });
        }
        let factor = 8f64.powi(pass as i32 + 1);
        for (sa, sb, _, _) in gaps {
            let margin = 1e-6 * (sb - sa);
            modes.extend(search.modes(sa + margin, sb - margin, factor)?);
        }
    }
    Ok(())
}
