//! Solving for the state: charge neutrality at given (rho, T), and the inversion rho(P, T) (a
//! joint Newton iteration on (ln rho, psi), with a bracketed nested iteration as fallback).

use super::point::{AtPsi, Balance, Setup};
use super::{Plasma, Solved};
use crate::constants::{A_RAD_CGS, K_B_ERG_K, M_U_G};
use crate::error::PhysicsError;
use crate::numerics::exponential::FastExp;
use crate::physics::composition::Composition;
use crate::physics::eos::EosState;

/// Relative slack of the density domain's ends in the joint iteration (see `joint_newton`).
const DOMAIN_SLACK: f64 = 1e-14;

impl Plasma {
    /// psi from charge neutrality G(psi) = ln F_1/2(psi) + ln q - ln(rho/m_u) - ln N_e(psi) = 0,
    /// G increasing: Newton steps kept inside the bracket (lo, hi], bisection or a downward
    /// search when a step would leave it. `psi_max` is a rigorous upper bound (G >= 0 there).
    pub(super) fn solve_neutrality(
        &self,
        setup: &Setup,
        guess: f64,
    ) -> Result<(f64, Balance), PhysicsError> {
        let (ln_q_over_n, psi_max) = (setup.ln_q_over_n, setup.psi_max);
        let (rho, t) = (setup.rho, setup.t);
        let mut lo = f64::NEG_INFINITY;
        let mut hi = psi_max;
        let mut psi = guess.min(psi_max);
        // |G| of the previous iterate: a Newton step that does not halve it is replaced by
        // bisection (G bent by the Coulomb shift can make Newton cycle inside the bracket).
        let mut last_g = f64::INFINITY;
        for _ in 0..300 {
            let b = self.balance(setup, psi);
            let (stages, el) = (&b.stages, &b.el);
            let g = el.ln_f_half + ln_q_over_n - stages.n_e.ln();
            if g.abs() < 1e-12 {
                return Ok((psi, b));
            }
            if g > 0.0 {
                hi = psi;
            } else {
                lo = psi;
            }
            let slope = el.slope_half - stages.d_n_e.psi / stages.n_e;
            let step = g / slope;
            if step.abs() < 1e-13 * (1.0 + psi.abs()) {
                return Ok((psi, b));
            }
            let newton = psi - step;
            let stalled = lo.is_finite() && g.abs() > 0.5 * last_g;
            last_g = g.abs();
            psi = if !stalled && newton.is_finite() && newton > lo && newton < hi {
                newton
            } else if lo.is_finite() {
                0.5 * (lo + hi)
            } else {
                // No lower end yet: step down geometrically.
                psi - (2.0 * (hi - psi)).max(10.0)
            };
            if hi - lo < 1e-13 * (1.0 + psi.abs()) {
                return Ok((psi, self.balance(setup, psi)));
            }
        }
        Err(self.error("charge neutrality not solved in 300 iterations", rho, t))
    }

    /// The joint iteration's start from the state `near` of a nearby point, to first order in
    /// the distance: d ln rho = (d ln P - chi_T d ln T) / chi_rho and
    /// d psi = (d psi / d ln rho) d ln rho + (d psi / d ln T) d ln T, from its derivatives.
    pub(super) fn start_near(p: f64, t: f64, near: &EosState) -> Option<(f64, f64)> {
        (near.density_g_cm3 > 0.0 && near.chi_rho > 0.0 && near.degeneracy_psi.is_finite())
            .then(|| {
                let dln_t = (t / near.temperature_k).ln();
                let dln_rho =
                    ((p / near.pressure_dyn_cm2).ln() - near.chi_t * dln_t) / near.chi_rho;
                let dpsi = near.dpsi_dln_rho * dln_rho + near.dpsi_dln_t * dln_t;
                let psi = if dpsi.is_finite() {
                    near.degeneracy_psi + dpsi
                } else {
                    near.degeneracy_psi
                };
                (near.density_g_cm3.ln() + dln_rho, psi)
            })
            .filter(|(r, _)| r.is_finite())
    }

    /// The inversion, started at (ln rho, psi) = `start` if given, else from the fully ionised
    /// ideal gas; the entropy too if `with_entropy` (on the fast path; the caller computes it
    /// after the bracketed fallback). Inlined: its callers keep only the parts of the result
    /// they return, without copying the whole.
    #[inline]
    pub(super) fn at_pressure_from(
        &self,
        p: f64,
        t: f64,
        comp: &Composition,
        start: Option<(f64, f64)>,
        with_entropy: bool,
    ) -> Result<Solved, PhysicsError> {
        if !(p.is_finite() && p > 0.0) {
            return Err(self.error(
                format!("pressure {p:e} dyn/cm^2 must be finite and positive"),
                f64::NAN,
                t,
            ));
        }
        self.check(self.rho_range_g_cm3.0, t)?;
        let p_rad = A_RAD_CGS * t.powi(4) / 3.0;
        if p <= p_rad {
            return Err(self.error(
                format!(
                    "pressure {p:.4e} dyn/cm^2 does not exceed the radiation pressure {p_rad:.4e}"
                ),
                f64::NAN,
                t,
            ));
        }
        let ln_p = p.ln();
        if let Some((warm_rho, warm_psi)) = start {
            if let Some(solved) = self.joint_newton(
                ln_p,
                p_rad,
                t,
                comp,
                (warm_rho, Some(warm_psi)),
                with_entropy,
            ) {
                return Ok(solved);
            }
        }
        // Cold start (or a warm start that failed): the fully ionised ideal gas.
        let (rlo, rhi) = self.rho_range_g_cm3;
        let (mut lo, mut hi) = (rlo.ln(), rhi.ln());
        let n_full = 2.0 * comp.x() + 0.75 * comp.y() + 0.5 * comp.z();
        let ideal = ((p - p_rad) * M_U_G / (K_B_ERG_K * t * n_full))
            .ln()
            .clamp(lo, hi);
        let mut ln_rho = ideal;
        if let Some(solved) = self.joint_newton(ln_p, p_rad, t, comp, (ln_rho, None), with_entropy)
        {
            return Ok(solved);
        }
        // Fallback: nested iteration, slower but bracketed. A Newton step that does not halve
        // |f| is replaced by bisection: across pressure ionisation P(rho) can steepen thirty-fold
        // within the bracket, and Newton from its ends then creeps in from both sides.
        let mut psi_guess = None;
        let mut last_f = f64::INFINITY;
        for _ in 0..100 {
            let solved = self.solve(ln_rho.fast_exp().clamp(rlo, rhi), t, comp, psi_guess)?;
            let s = solved.state;
            let f = s.pressure_dyn_cm2.ln() - ln_p;
            if f.abs() < 1e-12 {
                return Ok(solved);
            }
            if f > 0.0 {
                hi = ln_rho;
            } else {
                lo = ln_rho;
            }
            let newton = ln_rho - f / s.chi_rho.max(1e-6);
            let stalled = lo > rlo.ln() && hi < rhi.ln() && f.abs() > 0.5 * last_f;
            last_f = f.abs();
            let next = if !stalled && newton > lo && newton < hi && (newton - ln_rho).abs() < 3.0 {
                newton
            } else if (hi - lo) < 6.0 {
                0.5 * (lo + hi)
            } else if f > 0.0 {
                (ln_rho - 3.0).max(lo + 0.5 * (ln_rho - lo).min(3.0))
            } else {
                (ln_rho + 3.0).min(hi - 0.5 * (hi - ln_rho).min(3.0))
            };
            if hi - lo < 1e-14 {
                break;
            }
            psi_guess = Some(s.degeneracy_psi + solved.dpsi_dlnrho * (next - ln_rho));
            ln_rho = next;
        }
        Err(self.error(
            format!(
                "no density in {rlo:e}..{rhi:e} g/cm^3 gives pressure {p:.4e} dyn/cm^2 at this temperature"
            ),
            f64::NAN,
            t,
        ))
    }
}

impl Plasma {
    /// Fast path of the inversion: Newton iteration on (ln rho, psi) together, solving
    /// ln P(rho, psi) = ln P_target and charge neutrality at once with the analytic 2x2 Jacobian
    /// (its determinant is positive: P and the neutrality residual both increase with psi and
    /// the residual falls with rho). Steps are limited to 2 in ln rho and 10 in psi. Returns
    /// `None` (and the caller falls back to the bracketed nested iteration) if it does not
    /// converge in 40 steps or leaves the density domain.
    fn joint_newton(
        &self,
        ln_p: f64,
        p_rad: f64,
        t: f64,
        comp: &Composition,
        (ln_rho_start, psi_start): (f64, Option<f64>),
        with_entropy: bool,
    ) -> Option<Solved> {
        let (rlo, rhi) = self.rho_range_g_cm3;
        let mut ln_rho = ln_rho_start;
        let mut psi: Option<f64> = psi_start;
        let mut at_edge = 0;
        let per_t = self.per_temperature(t, comp);
        for iteration in 0..40 {
            // The density domain is checked on rho itself (the exponential is needed anyway),
            // so that no logarithm of its ends is taken unless a step leaves it. A start outside
            // is moved to the nearer end; a step that leaves it counts towards the limit of
            // two returns to the end. The slack of a few ulp keeps an iterate at an end (whose
            // exponential can round just past it) from counting as leaving.
            let mut rho = ln_rho.fast_exp();
            if !(rho >= rlo * (1.0 - DOMAIN_SLACK) && rho <= rhi * (1.0 + DOMAIN_SLACK)) {
                if iteration > 0 {
                    at_edge += 1;
                    if at_edge > 2 {
                        return None;
                    }
                }
                ln_rho = ln_rho.clamp(rlo.ln(), rhi.ln());
                rho = ln_rho.fast_exp();
            }
            let setup = self
                .setup_with(rho.clamp(rlo, rhi), ln_rho, t, comp, &per_t)
                .ok()?;
            let ps = psi.unwrap_or(setup.psi_full).min(setup.psi_max);
            let b = self.balance(&setup, ps);
            let (stages, el) = (&b.stages, &b.el);
            let r2 = el.ln_f_half + setup.ln_q_over_n - stages.n_e.ln();
            let p_e = setup.q * setup.kt * (2.0 / 3.0) * el.f_three_halves;
            let p_ion = setup.rho / M_U_G * stages.n_p * setup.kt;
            let p_tot = p_e + p_ion + p_rad + b.coulomb.pressure;
            let r1 = p_tot.ln() - ln_p;
            if r1.abs() < 1e-12 && r2.abs() < 1e-12 {
                return self
                    .finish(&AtPsi::new(&setup, ps, &b), comp, with_entropy)
                    .ok();
            }
            // At fixed psi the Coulomb pressure depends on T alone (n_e = q F_1/2(psi)).
            let a11 = p_ion * (1.0 + stages.d_n_p.ln_rho / stages.n_p) / p_tot;
            let a12 = (p_e * el.slope_three_halves
                + p_ion * stages.d_n_p.psi / stages.n_p
                + b.coulomb.dp.0)
                / p_tot;
            let a21 = -1.0 - stages.d_n_e.ln_rho / stages.n_e;
            let a22 = el.slope_half - stages.d_n_e.psi / stages.n_e;
            let det = a11 * a22 - a12 * a21;
            if !(det.is_finite() && det > 0.0 && r1.is_finite() && r2.is_finite()) {
                return None;
            }
            let d_ln_rho = (r1 * a22 - a12 * r2) / det;
            let d_psi = (a11 * r2 - a21 * r1) / det;
            let scale = 1.0f64
                .min(2.0 / d_ln_rho.abs().max(1e-300))
                .min(10.0 / d_psi.abs().max(1e-300));
            ln_rho -= scale * d_ln_rho;
            psi = Some(ps - scale * d_psi);
        }
        None
    }
}
