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
        let d = [
            ln_ratio_for_start(p / near.pressure_dyn_cm2),
            ln_ratio_for_start(t / near.temperature_k),
        ];
        Self::start_near_by(d, near)
    }

    /// [`Plasma::start_near`] at the distance d = (d ln P, d ln T) from `near`.
    fn start_near_by([dln_p, dln_t]: [f64; 2], near: &EosState) -> Option<(f64, f64)> {
        (near.density_g_cm3 > 0.0 && near.chi_rho > 0.0 && near.degeneracy_psi.is_finite())
            .then(|| {
                let dln_rho = (dln_p - near.chi_t * dln_t) / near.chi_rho;
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

    /// The joint iteration's start to second order from the states `near` and `before` of the
    /// last two points along a path. With x = (ln P, ln T), d = x - x_near, u = x_near - x_before
    /// and g the gradient in x of f = ln rho or psi (from chi_rho, chi_T and the derivatives of
    /// psi), f(x) = f_near + g_near . d + (1/2) a (g_near - g_before) . d, a = (d . u) / (u . u):
    /// Taylor's formula to second order with the Hessian along the path taken from the change of
    /// the gradient over u (exact for a quadratic f when d is along u). |a| is capped at 2, so
    /// that a point far off the path is not extrapolated wildly. The first-order start of
    /// [`Plasma::start_near`] when `before` is unusable or coincides with `near`.
    ///
    /// Measured on the 1 M_sun refined model (about 8 500 inversions along the legs): the
    /// balance evaluations fall from 20 238 to 18 604 (2.4 to 2.2 per inversion).
    pub(super) fn start_along(
        p: f64,
        t: f64,
        near: &EosState,
        before: &EosState,
    ) -> Option<(f64, f64)> {
        let d = [
            ln_ratio_for_start(p / near.pressure_dyn_cm2),
            ln_ratio_for_start(t / near.temperature_k),
        ];
        let (ln_rho, psi) = Self::start_near_by(d, near)?;
        if !(before.density_g_cm3 > 0.0 && before.chi_rho > 0.0) {
            return Some((ln_rho, psi));
        }
        let u = [
            ln_ratio_for_start(near.pressure_dyn_cm2 / before.pressure_dyn_cm2),
            ln_ratio_for_start(near.temperature_k / before.temperature_k),
        ];
        let uu = u[0] * u[0] + u[1] * u[1];
        if uu.is_nan() || uu <= 0.0 {
            return Some((ln_rho, psi));
        }
        let a = ((d[0] * u[0] + d[1] * u[1]) / uu).clamp(-2.0, 2.0);
        let (rho_near, psi_near) = gradients(near);
        let (rho_before, psi_before) = gradients(before);
        let along = |g1: [f64; 2], g0: [f64; 2]| {
            0.5 * a * ((g1[0] - g0[0]) * d[0] + (g1[1] - g0[1]) * d[1])
        };
        let (ln_rho2, psi2) = (
            ln_rho + along(rho_near, rho_before),
            psi + along(psi_near, psi_before),
        );
        Some(if ln_rho2.is_finite() && psi2.is_finite() {
            (ln_rho2, psi2)
        } else {
            (ln_rho, psi)
        })
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
        let domain = (lo, hi);
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
            let stalled = lo > domain.0 && hi < domain.1 && f.abs() > 0.5 * last_f;
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

/// ln x for the inversion's starting values, where x is the ratio of the pressures or
/// temperatures of nearby points: for 0.8 < x < 1.2 (s = (x - 1)/(x + 1), |s| < 1/11) by
/// ln x = 2 (s + s^3/3 + s^5/5 + s^7/7 + s^9/9) (the series of artanh), whose truncation
/// 2 s^11/11 is below 6e-12 there, a fifth of the cost of `f64::ln`; `f64::ln` elsewhere. A start
/// error of 6e-12 is far below the extrapolation's own (1e-8 to 1e-4), and the iteration
/// converges to its tolerance whatever the start.
#[inline]
fn ln_ratio_for_start(x: f64) -> f64 {
    if (x - 1.0).abs() < 0.2 {
        let s = (x - 1.0) / (x + 1.0);
        let s2 = s * s;
        2.0 * s * (1.0 + s2 * (1.0 / 3.0 + s2 * (1.0 / 5.0 + s2 * (1.0 / 7.0 + s2 / 9.0))))
    } else {
        x.ln()
    }
}

/// The gradients of ln rho and psi in (ln P, ln T) at `s`: d ln rho = (d ln P - chi_T d ln T) /
/// chi_rho, and psi through ln rho and ln T.
fn gradients(s: &EosState) -> ([f64; 2], [f64; 2]) {
    let ln_rho = [1.0 / s.chi_rho, -s.chi_t / s.chi_rho];
    let psi = [
        s.dpsi_dln_rho * ln_rho[0],
        s.dpsi_dln_t + s.dpsi_dln_rho * ln_rho[1],
    ];
    (ln_rho, psi)
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

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::eos::molecular::ENGINE as MOLECULAR;

    #[test]
    fn the_series_logarithm_agrees_with_ln_near_one() {
        for i in 0..=4000 {
            let x = 0.75 + 0.5 * f64::from(i) / 4000.0;
            let err = (ln_ratio_for_start(x) - x.ln()).abs();
            // The series' truncation (6e-12 at the switch) or rounding.
            assert!(err < 6e-12, "{x}: {err:e}");
        }
    }

    /// Along a line through the solar centre, interior, convective envelope and atmosphere
    /// (steps of 5 per cent in P and 2 in T, as between an integration's stages), the start
    /// from two states is closer to the solution than the start from one; where the first-order
    /// error exceeds 1e-5 (the ionisation zones and the atmosphere, where the functions bend),
    /// at least five times closer, as Taylor's formula says (measured: 16 and 6 times at
    /// (1e8, 1.2e4) and (1e5, 6e3); 1.2-1.3 times in the interior, where the first-order start
    /// is already within 1e-6). Errors in ln rho and in psi / 10 (psi changes ten times faster).
    #[test]
    fn two_states_start_the_inversion_closer_than_one() {
        let c = Composition::new(0.70, 0.02).unwrap();
        for (p, t) in [(1e17, 1.3e7), (1e13, 5e5), (1e8, 1.2e4), (1e5, 6e3)] {
            let at = |k: f64| {
                MOLECULAR
                    .at_pressure(p * (1.0 + 0.05 * k), t * (1.0 + 0.02 * k), &c)
                    .unwrap()
            };
            let (target, near, before) = (at(0.0), at(1.0), at(2.0));
            let exact = (target.density_g_cm3.ln(), target.degeneracy_psi);
            let error = |(r, s): (f64, f64)| (r - exact.0).abs().max((s - exact.1).abs() / 10.0);
            let first = error(Plasma::start_near(p, t, &near).unwrap());
            let second = error(Plasma::start_along(p, t, &near, &before).unwrap());
            assert!(second < first, "{p:e} {t:e}: {second:e} vs {first:e}");
            if first > 1e-5 {
                assert!(second < 0.2 * first, "{p:e} {t:e}: {second:e} vs {first:e}");
            }
        }
    }
}
