//! The fitting-point shooting problem: trial unknowns u = (ln P_c, ln T_c, ln R, ln L) map to
//! the mismatch of (ln r, ln P, ln T, ln L) at the fitting mass between the outward and the
//! inward leg. The Newton driver in [`crate::numerics::newton`] solves it.

use super::centre;
use super::equations::{State, LUM};
use super::legs::{integrate, Leg, LegContext, LegMonitor};
use super::surface;
use crate::error::{Error, Result};
use crate::numerics::newton::NewtonProblem;
use nalgebra::{SMatrix, SVector};

/// The four unknowns (ln P_c, ln T_c, ln R, ln L), cgs.
pub type Unknowns = SVector<f64, 4>;

/// The shooting problem for one star.
pub struct ShootingProblem<'a> {
    /// Physics, composition, mass and integrator tolerance.
    pub ctx: LegContext<'a>,
    /// Fitting mass as a fraction of M.
    pub fit_mass_fraction: f64,
    /// The finest integrator tolerance the iteration tightens to.
    pub tolerance_floor: f64,
    /// Right-hand-side evaluations and the last physics error.
    pub monitor: LegMonitor,
    /// Legs integrated (each outward or inward integration counts one).
    pub legs_integrated: u64,
    /// The last residual evaluation: unknowns, tolerance, outward and inward end states.
    last: Option<(Unknowns, f64, State, State)>,
}

impl<'a> ShootingProblem<'a> {
    /// A problem for `ctx` fitted at `fit_mass_fraction` M, tightening the integrator to
    /// `tolerance_floor` as it converges.
    pub fn new(ctx: LegContext<'a>, fit_mass_fraction: f64, tolerance_floor: f64) -> Self {
        Self {
            ctx,
            fit_mass_fraction,
            tolerance_floor,
            monitor: LegMonitor::default(),
            legs_integrated: 0,
            last: None,
        }
    }

    /// End state of the outward leg at the fitting mass.
    pub fn outward(&mut self, ln_pc: f64, ln_tc: f64) -> Result<State> {
        self.legs_integrated += 1;
        let start = centre::start(&self.ctx, ln_pc, ln_tc)?;
        integrate(
            &self.ctx,
            Leg::Outward,
            start.x0,
            self.fit_mass_fraction.ln(),
            start.y0,
            &self.monitor,
        )
    }

    /// End state of the inward leg at the fitting mass.
    pub fn inward(&mut self, ln_r: f64, ln_l: f64) -> Result<State> {
        self.legs_integrated += 1;
        let start = surface::start(&self.ctx, ln_r, ln_l)?;
        integrate(
            &self.ctx,
            Leg::Inward,
            start.x0,
            (1.0 - self.fit_mass_fraction).ln(),
            start.y0,
            &self.monitor,
        )
    }

    /// Relative mismatch: differences of ln r, ln P, ln T, and (L_out - L_in) / L_out.
    fn mismatch(&self, out: &State, inn: &State) -> SVector<f64, 4> {
        let l_out = Leg::Outward
            .luminosity_form(&self.ctx)
            .luminosity_erg_s(out[LUM]);
        let l_in = Leg::Inward
            .luminosity_form(&self.ctx)
            .luminosity_erg_s(inn[LUM]);
        SVector::<f64, 4>::new(
            out[0] - inn[0],
            out[1] - inn[1],
            out[2] - inn[2],
            (l_out - l_in) / l_out,
        )
    }

    /// Finite-difference step for the Jacobian at the current tolerance: large enough that
    /// integration noise (~ tolerance) stays below 1e-3 of the difference.
    fn difference_step(&self) -> f64 {
        (1e3 * self.ctx.tolerance).clamp(1e-7, 1e-3)
    }
}

impl NewtonProblem<4> for ShootingProblem<'_> {
    fn residual(&mut self, u: &Unknowns) -> Result<SVector<f64, 4>, Error> {
        let out = self.outward(u[0], u[1])?;
        let inn = self.inward(u[2], u[3])?;
        self.last = Some((*u, self.ctx.tolerance, out, inn));
        Ok(self.mismatch(&out, &inn))
    }

    /// Block structure: the outward end depends only on (ln P_c, ln T_c), the inward end only on
    /// (ln R, ln L), so each column costs one leg. Forward differences.
    fn jacobian(
        &mut self,
        u: &Unknowns,
        _f: &SVector<f64, 4>,
    ) -> Result<SMatrix<f64, 4, 4>, Error> {
        let h = self.difference_step();
        let (out0, in0) = match self.last {
            Some((v, tol, o, i)) if v == *u && tol == self.ctx.tolerance => (o, i),
            _ => {
                let f = self.residual(u)?;
                return self.jacobian(u, &f);
            }
        };
        let f0 = self.mismatch(&out0, &in0);
        let out_p = self.outward(u[0] + h, u[1])?;
        let out_t = self.outward(u[0], u[1] + h)?;
        let in_r = self.inward(u[2] + h, u[3])?;
        let in_l = self.inward(u[2], u[3] + h)?;
        let mut j = SMatrix::<f64, 4, 4>::zeros();
        j.set_column(0, &((self.mismatch(&out_p, &in0) - f0) / h));
        j.set_column(1, &((self.mismatch(&out_t, &in0) - f0) / h));
        j.set_column(2, &((self.mismatch(&out0, &in_r) - f0) / h));
        j.set_column(3, &((self.mismatch(&out0, &in_l) - f0) / h));
        Ok(j)
    }

    /// Integrate coarsely while far from the solution and tighten as the mismatch falls:
    /// tolerance = clamp(1e-3 x mismatch, floor, 1e-7).
    /// Tighten the integrator 100x (down to the floor) so that the Jacobian is less noisy.
    fn sharpen(&mut self) -> bool {
        if self.ctx.tolerance > self.tolerance_floor {
            self.ctx.tolerance = (self.ctx.tolerance * 1e-2).max(self.tolerance_floor);
            true
        } else {
            false
        }
    }

    fn adapt_to_residual(&mut self, norm: f64) -> bool {
        let wanted = (1e-3 * norm).clamp(self.tolerance_floor, 1e-7);
        if wanted < 0.5 * self.ctx.tolerance {
            self.ctx.tolerance = wanted;
            true
        } else {
            false
        }
    }
}
