//! A Lane–Emden polytrope as an oscillation model.
//!
//! A polytrope of index n has rho = rho_c theta^n, P = P_c theta^(n+1), r = alpha xi
//! (Chandrasekhar 1939, ch. IV). With the surface at xi_s (the first zero xi_1, or a chosen
//! profile point for a pressure-truncated sphere) and x = xi/xi_s, the definitions of
//! [`super::equilibrium`] give
//!
//! - V = -(n+1) xi theta'/theta, so V/x^2 = -(n+1) xi_s^2 theta'/(xi theta);
//! - U = -xi theta^n/theta';
//! - c1 = xi theta'(xi_s)/(xi_s theta') (from m/M = xi^2 theta'/(xi_s^2 theta'(xi_s)));
//! - A* = V (n/(n+1) - 1/Gamma_1) (dln rho/dln r = n xi theta'/theta), with Gamma_1 constant.
//!
//! At the centre theta'/xi -> -1/3, so V/x^2 -> (n+1) xi_s^2/3 and c1 -> -3 theta'(xi_s)/xi_s
//! (= rho_mean/rho_c for the full polytrope).
//!
//! Interpolation. The Lane–Emden solver gives theta and theta' at evenly spaced xi; theta'' follows
//! from the equation, theta'' = -theta^n - 2 theta'/xi (-1/3 at the centre). Between two profile
//! points theta is the quintic Hermite interpolant of (theta, theta', theta'') at both ends, so
//! theta is accurate to O(h^6) and theta' to O(h^5) for profile spacing h (less in the last
//! interval for non-integer n, where theta^n is not smooth at the surface). The profile points are
//! the model's breakpoints.

use super::equilibrium::{CentreValues, Equilibrium, StructurePoint};
use crate::error::{Error, Result};
use crate::polytrope::LaneEmdenSolution;

/// What `--gamma1` allows for a polytrope, in the words of the error message.
pub const GAMMA1_ALLOWED: &str =
    "Gamma_1 must be a finite number above 4/3 (a dynamically stable star), e.g. 1.6667";

/// A polytrope prepared for the oscillation solver.
#[derive(Debug, Clone, PartialEq)]
pub struct PolytropicModel {
    index: f64,
    gamma1: f64,
    xi_surface: f64,
    dtheta_surface: f64,
    /// Profile points used: (xi, theta, theta', theta'').
    nodes: Vec<[f64; 4]>,
    breakpoints: Vec<f64>,
}

impl PolytropicModel {
    /// The whole polytrope of `solution` (surface at its first zero xi_1) with constant
    /// adiabatic exponent `gamma1`. Errors: n = 5 (no surface), a profile of fewer than two
    /// points, or `gamma1` not finite and positive.
    pub fn new(solution: &LaneEmdenSolution, gamma1: f64) -> Result<Self> {
        if solution.xi1.is_none() {
            return Err(Error::invalid(
                "index",
                solution.index,
                "the polytrope must have a surface: an index in [0, 5), e.g. 3",
            ));
        }
        Self::truncated(solution, gamma1, solution.profile.len())
    }

    /// The sphere made of the first `points` profile points of `solution`: its surface is the
    /// last of them, where the pressure is zero only if it is the first zero of theta (a
    /// pressure-truncated polytrope otherwise, with rho_s > 0 and a finite V at the surface).
    pub fn truncated(solution: &LaneEmdenSolution, gamma1: f64, points: usize) -> Result<Self> {
        if !(gamma1.is_finite() && gamma1 > 0.0) {
            return Err(Error::invalid("gamma1", gamma1, GAMMA1_ALLOWED));
        }
        if points < 2 || points > solution.profile.len() {
            return Err(Error::invalid(
                "points",
                points,
                "the truncated polytrope needs at least two of the profile's points",
            ));
        }
        let n = solution.index;
        let profile = &solution.profile[..points];
        let nodes: Vec<[f64; 4]> = profile
            .iter()
            .map(|p| {
                let second = if p.xi == 0.0 {
                    -1.0 / 3.0
                } else {
                    -theta_power(p.theta, n) - 2.0 * p.dtheta_dxi / p.xi
                };
                [p.xi, p.theta, p.dtheta_dxi, second]
            })
            .collect();
        let last = nodes[points - 1];
        let (xi_surface, dtheta_surface) = (last[0], last[2]);
        if !(xi_surface > 0.0 && dtheta_surface < 0.0 && profile[0].xi == 0.0) {
            return Err(Error::invalid(
                "profile",
                format!("xi from {} to {}", profile[0].xi, xi_surface),
                "the profile must start at the centre and end where theta' < 0",
            ));
        }
        let mut breakpoints: Vec<f64> = nodes.iter().map(|p| p[0] / xi_surface).collect();
        breakpoints[points - 1] = 1.0;
        Ok(Self {
            index: n,
            gamma1,
            xi_surface,
            dtheta_surface,
            nodes,
            breakpoints,
        })
    }

    /// The polytropic index n.
    pub fn index(&self) -> f64 {
        self.index
    }

    /// Gamma_1.
    pub fn gamma1(&self) -> f64 {
        self.gamma1
    }

    /// theta and theta' at `xi` inside profile interval `interval` (quintic Hermite).
    fn theta(&self, interval: usize, xi: f64) -> (f64, f64) {
        let (a, b) = (self.nodes[interval], self.nodes[interval + 1]);
        hermite_quintic(a, b, xi)
    }
}

/// theta^n for theta >= 0 (0^0 = 1); negative theta (never produced inside the star) gives 0.
fn theta_power(theta: f64, n: f64) -> f64 {
    theta.max(0.0).powf(n)
}

/// The quintic Hermite interpolant through (f, f', f'') at `a` = [x, f, f', f''] and `b`,
/// evaluated with its derivative at `x` ([`crate::numerics::quintic::segment`]).
pub(crate) fn hermite_quintic(a: [f64; 4], b: [f64; 4], x: f64) -> (f64, f64) {
    use crate::numerics::quintic::{evaluate, segment};
    let h = b[0] - a[0];
    let c = segment(
        [a[1], h * a[2], h * h * a[3]],
        [b[1], h * b[2], h * h * b[3]],
    );
    let [value, slope, _] = evaluate(&c, (x - a[0]) / h);
    (value, slope / h)
}

impl Equilibrium for PolytropicModel {
    fn breakpoints(&self) -> &[f64] {
        &self.breakpoints
    }

    fn point(&self, interval: usize, x: f64) -> StructurePoint {
        let n = self.index;
        let xi = x * self.xi_surface;
        let (theta, dtheta) = self.theta(interval, xi);
        let v_over_x2 = -(n + 1.0) * self.xi_surface * self.xi_surface * dtheta / (xi * theta);
        StructurePoint {
            v_over_x2,
            u: -xi * theta_power(theta, n) / dtheta,
            c1: xi * self.dtheta_surface / (self.xi_surface * dtheta),
            a_star: v_over_x2 * x * x * (n / (n + 1.0) - 1.0 / self.gamma1),
            gamma1: self.gamma1,
        }
    }

    /// theta is interpolated with its first two derivatives continuous (quintic Hermite), so
    /// the coefficients are continuous with their slopes at every breakpoint.
    fn smooth_at(&self, _i: usize) -> bool {
        true
    }

    fn centre(&self) -> CentreValues {
        CentreValues {
            c1: -3.0 * self.dtheta_surface / self.xi_surface,
            v_over_x2: (self.index + 1.0) * self.xi_surface * self.xi_surface / 3.0,
            gamma1: self.gamma1,
        }
    }

    fn surface_u(&self) -> f64 {
        let last = self.nodes[self.nodes.len() - 1];
        -self.xi_surface * theta_power(last[1], self.index) / self.dtheta_surface
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The quintic Hermite interpolant reproduces any polynomial of degree five exactly.
    #[test]
    fn hermite_quintic_is_exact_for_quintics() {
        let c = [0.3, -1.2, 0.7, 2.1, -0.4, 0.9];
        let f = |x: f64| c.iter().rev().fold(0.0, |acc, k| acc * x + k);
        let df = |x: f64| (1..6).rev().fold(0.0, |acc, k| acc * x + k as f64 * c[k]);
        let d2f = |x: f64| {
            (2..6)
                .rev()
                .fold(0.0, |acc, k| acc * x + (k * (k - 1)) as f64 * c[k])
        };
        let (xa, xb) = (0.4, 1.3);
        let a = [xa, f(xa), df(xa), d2f(xa)];
        let b = [xb, f(xb), df(xb), d2f(xb)];
        for x in [0.4, 0.55, 0.9, 1.17, 1.3] {
            let (v, s) = hermite_quintic(a, b, x);
            assert!((v - f(x)).abs() < 1e-13, "value at {x}");
            assert!((s - df(x)).abs() < 1e-12, "slope at {x}");
        }
    }
}
