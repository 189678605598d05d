//! The fitting-point shooting problem: trial unknowns u = (ln P_c, ln T_c, ln R, ln L) map to
//! the mismatch of (ln r, ln P, ln T, ln L) at the fitting mass between the outward and the
//! inward leg. The Newton driver in [`crate::numerics::newton`] solves it.

use super::centre;
use super::equations::{State, LUM};
use super::legs::{Cautions, KeptSteps, Leg, LegContext, LegEnd, LegResult, LegRunner};
use super::surface::{self, SurfaceStart};
use crate::error::LegError;
use crate::numerics::newton::NewtonProblem;
use nalgebra::{SMatrix, SVector};

/// What one residual evaluation found: both legs' end states (with their running integrals) and
/// the convective boundaries located on the way, at unknowns `u` and integrator `tolerance`.
#[derive(Debug, Clone, PartialEq)]
pub struct LegEnds {
    /// The unknowns.
    pub u: Unknowns,
    /// The integrator tolerance used.
    pub tolerance: f64,
    /// Outward leg at the fitting mass.
    pub out: State,
    /// Inward leg at the fitting mass.
    pub inn: State,
    /// Mass fractions of the convective boundaries located on both legs.
    pub boundaries: Vec<f64>,
    /// Whether a leg met more boundaries than it locates.
    pub boundary_limit_reached: bool,
    /// The laws' cautions met on both legs and in the atmosphere.
    pub cautions: Cautions,
    /// The photosphere the inward leg started from.
    pub top: SurfaceStart,
}

/// The finest integrator tolerance `sharpen` goes to.
const SHARPEST_TOLERANCE: f64 = 1e-13;

/// Smallest and largest difference step in (ln P_c, ln T_c) of the Jacobian (see
/// `ShootingProblem::difference_step`).
const OUTWARD_STEP_RANGE: (f64, f64) = (1e-7, 1e-5);

/// Difference step in (ln R, ln L) of the Jacobian: 1e-4 keeps the inward leg's integration
/// noise (up to about 3e-9 at tolerance 1e-11 and 1e-6 at 1e-8, 0.1 M_sun) near 1e-3 of the
/// difference and its truncation error near 1e-4 (see `ShootingProblem::difference_step`).
const INWARD_DIFFERENCE_STEP: f64 = 1e-4;

/// The integrator tolerance is tightened only to below this fraction of the current one (or to
/// the floor): see `ShootingProblem::adapt_to_residual`.
const MIN_TIGHTENING: f64 = 0.1;

/// The four unknowns (ln P_c, ln T_c, ln R, ln L), cgs.
pub type Unknowns = SVector<f64, 4>;

/// The shooting problem for one star.
pub struct ShootingProblem<'a> {
    /// Integrates the legs (and holds the context: physics, mass, tolerance).
    pub runner: LegRunner<'a>,
    /// Fitting mass as a fraction of M.
    pub fit_mass_fraction: f64,
    /// The finest integrator tolerance the iteration tightens to.
    pub tolerance_floor: f64,
    /// Legs integrated (each outward or inward integration counts one).
    pub legs_integrated: u64,
    /// The steps of the last T(tau) atmosphere: the next one at its tolerance follows them.
    atmosphere_steps: KeptSteps,
    /// The last residual evaluation.
    last: Option<LegEnds>,
}

impl<'a> ShootingProblem<'a> {
    /// A problem for `ctx` fitted at `fit_mass_fraction` M, tightening the integrator to
    /// `tolerance_floor` as it converges.
    pub fn new(
        ctx: LegContext<'a>,
        fit_mass_fraction: f64,
        tolerance_floor: f64,
    ) -> LegResult<Self> {
        Ok(Self {
            runner: LegRunner::new(ctx)?,
            fit_mass_fraction,
            tolerance_floor,
            legs_integrated: 0,
            atmosphere_steps: KeptSteps::default(),
            last: None,
        })
    }

    /// The context of the legs (with the current tolerance).
    pub fn ctx(&self) -> &LegContext<'a> {
        &self.runner.ctx
    }

    /// The outward leg at the fitting mass.
    pub fn outward(&mut self, ln_pc: f64, ln_tc: f64) -> LegResult<LegEnd> {
        self.legs_integrated += 1;
        let start = centre::start(&self.runner.ctx, ln_pc, ln_tc)?;
        let x1 = self.fit_mass_fraction.ln();
        self.runner
            .integrate(Leg::Outward, start.x0, x1, start.y0, None)
    }

    /// The inward leg at the fitting mass.
    pub fn inward(&mut self, ln_r: f64, ln_l: f64) -> LegResult<LegEnd> {
        self.inward_with_top(ln_r, ln_l).map(|(end, _)| end)
    }

    /// The inward leg at the fitting mass and the photosphere it started from.
    fn inward_with_top(&mut self, ln_r: f64, ln_l: f64) -> LegResult<(LegEnd, SurfaceStart)> {
        self.legs_integrated += 1;
        let tolerance = self.runner.ctx.tolerance;
        let plan = self.atmosphere_steps.take_at(tolerance);
        let (start, steps) = surface::start_along(&self.runner.ctx, ln_r, ln_l, plan)?;
        self.atmosphere_steps.keep(tolerance, steps);
        let x1 = (1.0 - self.fit_mass_fraction).ln();
        let mut end = self
            .runner
            .integrate(Leg::Inward, start.x0, x1, start.y0, None)?;
        end.cautions.merge(&start.cautions);
        Ok((end, start))
    }

    /// Relative mismatch: differences of ln r, ln P, ln T, and (L_out - L_in) / L_out.
    fn mismatch(&self, out: &State, inn: &State) -> SVector<f64, 4> {
        let ctx = self.ctx();
        let l_out = Leg::Outward.luminosity_form(ctx).luminosity_erg_s(out[LUM]);
        let l_in = Leg::Inward.luminosity_form(ctx).luminosity_erg_s(inn[LUM]);
        SVector::<f64, 4>::new(
            out[0] - inn[0],
            out[1] - inn[1],
            out[2] - inn[2],
            (l_out - l_in) / l_out,
        )
    }

    /// Mismatch with the outward leg from `out` and the inward leg at `(ln R, ln L)`, or with the
    /// inward end `inn` and the outward leg at `(ln P_c, ln T_c)`: one column of the Jacobian by
    /// a forward difference, or a backward one where the forward trial cannot be integrated.
    fn column(
        &mut self,
        u: &Unknowns,
        k: usize,
        h: f64,
        f0: &SVector<f64, 4>,
        out0: &State,
        in0: &State,
    ) -> LegResult<SVector<f64, 4>> {
        let trial = |problem: &mut Self, step: f64| {
            let mut v = *u;
            v[k] += step;
            let f = if k < 2 {
                problem
                    .outward(v[0], v[1])
                    .map(|o| problem.mismatch(&o.y, in0))
            } else {
                problem
                    .inward(v[2], v[3])
                    .map(|i| problem.mismatch(out0, &i.y))
            };
            f.map(|f| (f - f0) / step)
        };
        trial(self, h).or_else(|_| trial(self, -h))
    }

    /// Finite-difference step of the Jacobian's column `k` at the current tolerance. The two
    /// legs need different steps (measured against central differences at tolerance 1e-13,
    /// 0.1-10 M_sun): the outward end is a smooth function of (ln P_c, ln T_c) whose forward
    /// differences are limited by their truncation error (about 50 h relative), so its step is
    /// small, 1e2 x tolerance within [`OUTWARD_STEP_RANGE`]; the inward end varies by some
    /// 100-300 x tolerance from one (ln R, ln L) to the next (the integrator's step sequence
    /// changes), while its truncation error is about h, so its step is
    /// [`INWARD_DIFFERENCE_STEP`] (the single step of 1e3 x tolerance before gave Jacobians 0.6
    /// per cent off at 1 M_sun and 10 per cent off at 0.1 M_sun).
    fn difference_step(&self, k: usize) -> f64 {
        if k < 2 {
            let (lo, hi) = OUTWARD_STEP_RANGE;
            (1e2 * self.ctx().tolerance).clamp(lo, hi)
        } else {
            INWARD_DIFFERENCE_STEP
        }
    }
}

impl ShootingProblem<'_> {
    /// The legs of the last residual evaluation, if it was at `u` with the current tolerance:
    /// at convergence, the converged model's legs.
    pub fn last_legs(&self, u: &Unknowns) -> Option<&LegEnds> {
        self.last
            .as_ref()
            .filter(|l| l.u == *u && l.tolerance == self.ctx().tolerance)
    }

    /// Both legs at `u` and the current tolerance, with the convective boundaries met: the last
    /// evaluation's when it was at the same point (the same unknowns at the same tolerance give
    /// the same legs), else a new integration of both. The one leg runner of the solver: the
    /// residual, the Jacobian's base point and the converged model all come from here.
    pub fn legs_at(&mut self, u: &Unknowns) -> LegResult<LegEnds> {
        if let Some(l) = self.last_legs(u) {
            return Ok(l.clone());
        }
        let out = self.outward(u[0], u[1])?;
        let (inn, top) = self.inward_with_top(u[2], u[3])?;
        let mut boundaries = out.boundaries;
        boundaries.extend(&inn.boundaries);
        let mut cautions = out.cautions;
        cautions.merge(&inn.cautions);
        let legs = LegEnds {
            u: *u,
            tolerance: self.ctx().tolerance,
            out: out.y,
            inn: inn.y,
            boundaries,
            boundary_limit_reached: out.boundary_limit_reached || inn.boundary_limit_reached,
            cautions,
            top,
        };
        self.last = Some(legs.clone());
        Ok(legs)
    }
}

impl NewtonProblem<4> for ShootingProblem<'_> {
    type Error = LegError;

    fn residual(&mut self, u: &Unknowns) -> LegResult<SVector<f64, 4>> {
        let legs = self.legs_at(u)?;
        Ok(self.mismatch(&legs.out, &legs.inn))
    }

    /// Block structure: the outward end depends only on (ln P_c, ln T_c), the inward end only on
    /// (ln R, ln L), so each column costs one leg.
    fn jacobian(&mut self, u: &Unknowns, _f: &SVector<f64, 4>) -> LegResult<SMatrix<f64, 4, 4>> {
        let base = self.legs_at(u)?;
        let (out0, in0) = (base.out, base.inn);
        let f0 = self.mismatch(&out0, &in0);
        let mut j = SMatrix::<f64, 4, 4>::zeros();
        for k in 0..4 {
            let col = self.column(u, k, self.difference_step(k), &f0, &out0, &in0)?;
            j.set_column(k, &col);
        }
        Ok(j)
    }

    /// Tighten the integrator 10x so that the mismatch and its Jacobian are less noisy: down to
    /// the floor, and once at the floor down to 1/100 of it (a stall near the convergence
    /// tolerance is usually integration noise).
    fn sharpen(&mut self) -> bool {
        let limit = (self.tolerance_floor * 1e-2).max(SHARPEST_TOLERANCE);
        let tolerance = self.ctx().tolerance;
        if tolerance > limit {
            self.runner.set_tolerance((tolerance * 0.1).max(limit));
            true
        } else {
            false
        }
    }

    /// The trial of a Newton step is integrated at the accuracy its expected mismatch calls for.
    fn prepare_trial(&mut self, expected_norm: f64) -> bool {
        self.adapt_to_residual(expected_norm)
    }

    /// Integrate coarsely while far from the solution and tighten as the mismatch falls:
    /// tolerance = clamp(1e-3 x mismatch, floor, 1e-7), the floor itself once within a decade
    /// of it; the tolerance is only ever tightened, by at least `MIN_TIGHTENING` unless to
    /// the floor.
    fn adapt_to_residual(&mut self, norm: f64) -> bool {
        // The coarsest tolerance is 1e-7, or the floor itself when the user asked for a coarser
        // one (any floor up to 1e-6 is allowed).
        let coarsest = self.tolerance_floor.max(1e-7);
        let mut wanted = (1e-3 * norm).clamp(self.tolerance_floor, coarsest);
        // Within a decade of the floor, go to the floor at once: an intermediate tolerance
        // would cost one more evaluation of both legs for little saving.
        if wanted < 10.0 * self.tolerance_floor {
            wanted = self.tolerance_floor;
        }
        // A smaller tightening is not worth an evaluation of both legs: from a close guess
        // (mismatch 1e-6 to 1e-5) the Jacobian at the starting tolerance serves as well, and the
        // trial of the step goes to the floor anyway (0.1-100 M_sun from the built-in guesses:
        // 8.6 per cent fewer right-hand sides at Z = 0.02, 13 at Z = 0.002, 5 at Z = 0.03).
        let current = self.ctx().tolerance;
        if wanted < MIN_TIGHTENING * current || (wanted == self.tolerance_floor && wanted < current)
        {
            self.runner.set_tolerance(wanted);
            true
        } else {
            false
        }
    }
}
