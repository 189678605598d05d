//! An equilibrium model given as arrays on a mesh (a ZAMS model, or any other).
//!
//! # What to supply ([`TabulatedModel::from_physical`])
//!
//! Six arrays of equal length K >= 3, cgs units, on a mesh of strictly increasing radius whose
//! first point is the centre (r = 0, m = 0) and whose last is the surface (r = R, m = M, where
//! the outer boundary conditions are applied; the pressure there must be positive, as at a
//! photosphere):
//!
//! | array | unit | at r = 0 |
//! |---|---|---|
//! | `radius_cm` r | cm | 0 |
//! | `mass_g` m(r) | g | 0 |
//! | `pressure_dyn_cm2` P | dyn cm^-2 | P_c |
//! | `density_g_cm3` rho (> 0 everywhere) | g cm^-3 | rho_c |
//! | `gamma1` Gamma_1 = (dln P/dln rho)_ad | - | Gamma_1,c |
//! | `brunt_n2_s2` N^2 = g (dln P/dr/Gamma_1 - dln rho/dr) | s^-2 | N^2(0) (0 for a regular centre) |
//!
//! # Conversion (definitions in [`super::equilibrium`])
//!
//! At r > 0: x = r/R, V/x^2 = G m rho R^2/(r^3 P), U = 4 pi r^3 rho/m, c1 = x^3 M/m,
//! A* = N^2 r^3/(G m). At r = 0 the limits of the same expressions with m = (4 pi/3) rho_c r^3:
//! V/x^2 = (4 pi/3) G rho_c^2 R^2/P_c, U = 3, c1 = 3 M/(4 pi rho_c R^3),
//! A* = 3 N^2(0)/(4 pi G rho_c). G is CODATA 2018 ([`crate::constants::G_CGS`]).
//!
//! # Interpolation
//!
//! The mesh points are the model's breakpoints. Between two of them:
//!
//! - ln(V/x^2), ln U and ln c1 are quintic Hermite polynomials in x through their values,
//!   slopes and second derivatives at both ends. The slopes come from the structure equations
//!   themselves (exact for a model in hydrostatic equilibrium; derived from the definitions):
//!   with D = d/dln x, D ln(V/x^2) = U - 3 + V (1 - 1/Gamma_1) - A*,
//!   D ln U = 3 - U - V/Gamma_1 - A*, D ln c1 = 3 - U (all three vanish at the centre, where the
//!   functions are even in x); the second derivatives by differentiating these once more, with
//!   D U = U D ln U, D V = V (D ln(V/x^2) + 2) and the slopes of Gamma_1 and A* below
//!   (D^2 ln(V/x^2) = D U + D V (1 - 1/Gamma_1) + V D Gamma_1/Gamma_1^2 - D A*,
//!   D^2 ln U = -D U - D V/Gamma_1 + V D Gamma_1/Gamma_1^2 - D A*, D^2 ln c1 = -D U; then
//!   f'' = (D^2 f - D f)/x^2; at the centre the value at the first mesh point, f'' being even);
//! - A* and Gamma_1 are cubic splines (cubic Hermite with the slopes that make the second
//!   derivative continuous) within each segment between the mesh points that bound a
//!   convective boundary (below), clamped there and at the surface to the slope of the parabola
//!   through the point and its neighbours (zero at the centre by symmetry). Ending the splines
//!   at convective boundaries keeps the kink of N^2 there from ringing through the mesh.
//!
//! The interpolant is thus continuous with its first two derivatives inside each segment, so
//! the solver's steps may straddle mesh points ([`Equilibrium::smooth_at`]) except the two that
//! bound an interval where A* changes sign (A* > 0 on one side, <= 0 on the other): there N^2
//! has a kink at a convective boundary somewhere inside, and steps end at the mesh points
//! around it. (With cubic Hermite polynomials, continuous only in the first derivative, steps
//! across many mesh points of a ZAMS profile left errors of order h^4, 1e-7 at steps of 0.02.)

use super::equilibrium::{validate_breakpoints, CentreValues, Equilibrium, StructurePoint};
use crate::constants::G_CGS;
use crate::error::{Error, Result};
use std::f64::consts::PI;

/// The physical arrays of [`TabulatedModel::from_physical`] (see the module documentation).
#[derive(Debug, Clone, Copy)]
pub struct PhysicalArrays<'a> {
    /// Radius r, cm, from 0 to R.
    pub radius_cm: &'a [f64],
    /// Mass inside r, g, from 0 to M.
    pub mass_g: &'a [f64],
    /// Pressure P, dyn cm^-2 (positive).
    pub pressure_dyn_cm2: &'a [f64],
    /// Density rho, g cm^-3 (positive).
    pub density_g_cm3: &'a [f64],
    /// Adiabatic exponent Gamma_1 (positive).
    pub gamma1: &'a [f64],
    /// Squared buoyancy frequency N^2, s^-2.
    pub brunt_n2_s2: &'a [f64],
}

/// The dimensionless coefficients on a mesh (see [`super::equilibrium`] for the definitions).
#[derive(Debug, Clone, Copy)]
pub struct DimensionlessArrays<'a> {
    /// x = r/R from 0 to 1, strictly increasing.
    pub x: &'a [f64],
    /// V/x^2 (at x = 0 its limit), positive.
    pub v_over_x2: &'a [f64],
    /// U (3 at x = 0), positive.
    pub u: &'a [f64],
    /// c1 (rho_mean/rho_c at x = 0), positive.
    pub c1: &'a [f64],
    /// A*.
    pub a_star: &'a [f64],
    /// Gamma_1, positive.
    pub gamma1: &'a [f64],
}

/// One mesh point: values and x-slopes of ln(V/x^2), ln U, ln c1, A*, Gamma_1.
#[derive(Debug, Clone, Copy, PartialEq)]
struct Knot {
    value: [f64; 5],
    slope: [f64; 5],
    /// Second derivatives of the first three (ln(V/x^2), ln U, ln c1).
    curvature: [f64; 3],
}

/// A model given on a mesh, interpolated as described in the module documentation.
#[derive(Debug, Clone, PartialEq)]
pub struct TabulatedModel {
    breakpoints: Vec<f64>,
    /// Whether a step may straddle each breakpoint (module documentation).
    smooth: Vec<bool>,
    knots: Vec<Knot>,
    centre: CentreValues,
    surface_u: f64,
}

fn bad(name: &str, value: impl std::fmt::Display, allowed: &str) -> Error {
    Error::invalid(name, value, allowed)
}

impl TabulatedModel {
    /// Convert physical arrays (module documentation) and prepare the interpolation. Errors
    /// ([`Error::InvalidInput`]) name the first array and row that break the stated rules.
    pub fn from_physical(a: PhysicalArrays<'_>) -> Result<Self> {
        let k = a.radius_cm.len();
        let lengths = [
            a.mass_g.len(),
            a.pressure_dyn_cm2.len(),
            a.density_g_cm3.len(),
            a.gamma1.len(),
            a.brunt_n2_s2.len(),
        ];
        if k < 3 || lengths.iter().any(|&l| l != k) {
            return Err(bad(
                "model arrays",
                format!("lengths {k} and {lengths:?}"),
                "six arrays of the same length, at least 3 points from the centre to the surface",
            ));
        }
        if a.radius_cm[0] != 0.0 || a.mass_g[0] != 0.0 {
            return Err(bad(
                "radius_cm[0], mass_g[0]",
                format!("{}, {}", a.radius_cm[0], a.mass_g[0]),
                "the first point must be the centre, r = 0 and m = 0",
            ));
        }
        let (radius, mass) = (a.radius_cm[k - 1], a.mass_g[k - 1]);
        let mut x = Vec::with_capacity(k);
        let mut v = Vec::with_capacity(k);
        let mut u = Vec::with_capacity(k);
        let mut c1 = Vec::with_capacity(k);
        let mut a_star = Vec::with_capacity(k);
        for i in 0..k {
            let (r, m, p, rho, n2) = (
                a.radius_cm[i],
                a.mass_g[i],
                a.pressure_dyn_cm2[i],
                a.density_g_cm3[i],
                a.brunt_n2_s2[i],
            );
            if !(p > 0.0 && p.is_finite() && rho > 0.0 && rho.is_finite() && n2.is_finite()) {
                return Err(bad(
                    &format!("row {i}"),
                    format!("P = {p:e}, rho = {rho:e}, N^2 = {n2:e}"),
                    "pressure and density must be finite and positive, N^2 finite",
                ));
            }
            if i == 0 {
                x.push(0.0);
                v.push(4.0 * PI / 3.0 * G_CGS * rho * rho * radius * radius / p);
                u.push(3.0);
                c1.push(3.0 * mass / (4.0 * PI * rho * radius.powi(3)));
                a_star.push(3.0 * n2 / (4.0 * PI * G_CGS * rho));
            } else {
                if !(m > 0.0 && m.is_finite() && r.is_finite()) {
                    return Err(bad(
                        &format!("row {i}"),
                        format!("r = {r:e}, m = {m:e}"),
                        "radius and mass must be finite, with m > 0 away from the centre",
                    ));
                }
                x.push(r / radius);
                v.push(G_CGS * m * rho * radius * radius / (r.powi(3) * p));
                u.push(4.0 * PI * r.powi(3) * rho / m);
                c1.push((r / radius).powi(3) * mass / m);
                a_star.push(n2 * r.powi(3) / (G_CGS * m));
            }
        }
        x[k - 1] = 1.0;
        Self::from_dimensionless(DimensionlessArrays {
            x: &x,
            v_over_x2: &v,
            u: &u,
            c1: &c1,
            a_star: &a_star,
            gamma1: a.gamma1,
        })
    }

    /// Prepare the interpolation of dimensionless coefficients given on a mesh that runs from
    /// x = 0 to 1 (module documentation).
    pub fn from_dimensionless(a: DimensionlessArrays<'_>) -> Result<Self> {
        let k = a.x.len();
        let lengths = [
            a.v_over_x2.len(),
            a.u.len(),
            a.c1.len(),
            a.a_star.len(),
            a.gamma1.len(),
        ];
        if k < 3 || lengths.iter().any(|&l| l != k) {
            return Err(bad(
                "model arrays",
                format!("lengths {k} and {lengths:?}"),
                "six arrays of the same length, at least 3 points from the centre to the surface",
            ));
        }
        validate_breakpoints("x", a.x)?;
        let mut points = Vec::with_capacity(k);
        for i in 0..k {
            let p = StructurePoint {
                v_over_x2: a.v_over_x2[i],
                u: a.u[i],
                c1: a.c1[i],
                a_star: a.a_star[i],
                gamma1: a.gamma1[i],
            };
            if !(p.is_physical() && p.u > 0.0) {
                return Err(bad(
                    &format!("row {i}"),
                    format!("{p:?}"),
                    "V/x^2, U, c1 and Gamma_1 must be finite and positive, A* finite",
                ));
            }
            points.push(p);
        }
        let x = a.x;
        // A convective boundary lies inside an interval whose ends differ in the sign of A*;
        // the knots around it end the spline segments and the solver's steps.
        let boundary = |i: usize| (a.a_star[i] > 0.0) != (a.a_star[i + 1] > 0.0);
        let smooth: Vec<bool> = (0..k)
            .map(|i| i > 0 && i + 1 < k && !boundary(i - 1) && !boundary(i))
            .collect();
        let a_star_slopes = spline_slopes(x, a.a_star, &smooth);
        let gamma1_slopes = spline_slopes(x, a.gamma1, &smooth);
        // Slopes and second derivatives in x at mesh point i > 0 (module documentation).
        let derivatives = |i: usize| {
            let p = points[i];
            let (xi, v, g, a) = (x[i], p.v_over_x2 * x[i] * x[i], p.gamma1, p.a_star);
            let (dg, da) = (xi * gamma1_slopes[i], xi * a_star_slopes[i]);
            let d = [
                p.u - 3.0 + v * (1.0 - 1.0 / g) - a,
                3.0 - p.u - v / g - a,
                3.0 - p.u,
            ];
            let du = p.u * d[1];
            let dv = v * (d[0] + 2.0);
            let d2 = [
                du + dv * (1.0 - 1.0 / g) + v * dg / (g * g) - da,
                -du - dv / g + v * dg / (g * g) - da,
                -du,
            ];
            let slope = d.map(|di| di / xi);
            let curvature = [0, 1, 2].map(|j| (d2[j] - d[j]) / (xi * xi));
            (slope, curvature)
        };
        let knots = (0..k)
            .map(|i| {
                let p = points[i];
                let value = [p.v_over_x2.ln(), p.u.ln(), p.c1.ln(), p.a_star, p.gamma1];
                let mut slope = [0.0; 5];
                // Even in x at the centre: zero slope, the curvature of the first mesh point.
                let (first, curvature) = derivatives(i.max(1));
                if i > 0 {
                    slope[..3].copy_from_slice(&first);
                    slope[3] = a_star_slopes[i];
                    slope[4] = gamma1_slopes[i];
                }
                Knot {
                    value,
                    slope,
                    curvature,
                }
            })
            .collect();
        Ok(Self {
            breakpoints: x.to_vec(),
            smooth,
            knots,
            centre: CentreValues {
                c1: points[0].c1,
                v_over_x2: points[0].v_over_x2,
                gamma1: points[0].gamma1,
            },
            surface_u: points[k - 1].u,
        })
    }
}

/// Slopes of `f` at the knots `x` for cubic Hermite interpolation: at the centre 0 (symmetry),
/// at a knot that is not `smooth` (the segment ends: convective boundaries, the surface) the
/// slope of the parabola through it and its neighbours, and inside each segment between them
/// the slopes of the cubic spline clamped to those end slopes, so that the interpolant is
/// continuous with its second derivative there (C2 continuity at knot i of the Hermite cubics
/// with slopes m and secants d_i = (f_(i+1) - f_i)/h_i gives
/// m_(i-1)/h_(i-1) + 2 m_i (1/h_(i-1) + 1/h_i) + m_(i+1)/h_i = 3 (d_(i-1)/h_(i-1) + d_i/h_i);
/// derived for this module, solved by the tridiagonal (Thomas) algorithm, which needs no
/// pivoting as the system is diagonally dominant).
fn spline_slopes(x: &[f64], f: &[f64], smooth: &[bool]) -> Vec<f64> {
    let k = x.len();
    let mut m: Vec<f64> = (0..k)
        .map(|i| {
            if i == 0 {
                0.0
            } else {
                three_point_slope(x, f, i)
            }
        })
        .collect();
    let secant = |i: usize| (f[i + 1] - f[i]) / (x[i + 1] - x[i]);
    let mut start = 0;
    while start + 1 < k {
        // The segment runs from `start` to the next knot that is not smooth.
        let end = (start + 1..k).find(|&i| !smooth[i]).unwrap_or(k - 1);
        let n = end - start - 1;
        if n > 0 {
            let (mut diag, mut upper, mut rhs) = (vec![0.0; n], vec![0.0; n], vec![0.0; n]);
            for j in 0..n {
                let i = start + 1 + j;
                let (h0, h1) = (x[i] - x[i - 1], x[i + 1] - x[i]);
                diag[j] = 2.0 * (1.0 / h0 + 1.0 / h1);
                upper[j] = 1.0 / h1;
                rhs[j] = 3.0 * (secant(i - 1) / h0 + secant(i) / h1);
                if j == 0 {
                    rhs[j] -= m[start] / h0;
                }
                if j + 1 == n {
                    rhs[j] -= m[end] / h1;
                }
            }
            // Forward elimination (the sub-diagonal entry of row j is 1/h0 = upper[j - 1]'s
            // interval, the same interval seen from the other side), then back substitution.
            for j in 1..n {
                let lower = upper[j - 1];
                let factor = lower / diag[j - 1];
                diag[j] -= factor * upper[j - 1];
                rhs[j] -= factor * rhs[j - 1];
            }
            for j in (0..n).rev() {
                let next = if j + 1 < n {
                    upper[j] * m[start + 2 + j]
                } else {
                    0.0
                };
                m[start + 1 + j] = (rhs[j] - next) / diag[j];
            }
        }
        start = end;
    }
    m
}

/// Slope at point `i` (> 0) of the parabola through it and its neighbours (the two previous
/// points at the last point).
fn three_point_slope(x: &[f64], f: &[f64], i: usize) -> f64 {
    let last = x.len() - 1;
    let (a, b, c) = if i == last {
        (i - 2, i - 1, i)
    } else {
        (i - 1, i, i + 1)
    };
    let (xa, xb, xc) = (x[a], x[b], x[c]);
    let t = x[i];
    // Derivative of the Lagrange parabola at t.
    f[a] * (2.0 * t - xb - xc) / ((xa - xb) * (xa - xc))
        + f[b] * (2.0 * t - xa - xc) / ((xb - xa) * (xb - xc))
        + f[c] * (2.0 * t - xa - xb) / ((xc - xa) * (xc - xb))
}

impl Equilibrium for TabulatedModel {
    fn breakpoints(&self) -> &[f64] {
        &self.breakpoints
    }

    fn smooth_at(&self, i: usize) -> bool {
        self.smooth.get(i).copied().unwrap_or(false)
    }

    fn point(&self, interval: usize, x: f64) -> StructurePoint {
        let (xa, xb) = (self.breakpoints[interval], self.breakpoints[interval + 1]);
        let (ka, kb) = (&self.knots[interval], &self.knots[interval + 1]);
        let h = xb - xa;
        let t = (x - xa) / h;
        let (t2, t3) = (t * t, t * t * t);
        let (t4, t5) = (t3 * t, t3 * t2);
        // Cubic Hermite basis: value and slope at 0 and at 1.
        let c = [
            2.0 * t3 - 3.0 * t2 + 1.0,
            t3 - 2.0 * t2 + t,
            -2.0 * t3 + 3.0 * t2,
            t3 - t2,
        ];
        // Quintic Hermite basis: value, slope, second derivative at 0; the same at 1.
        let q = [
            1.0 - 10.0 * t3 + 15.0 * t4 - 6.0 * t5,
            t - 6.0 * t3 + 8.0 * t4 - 3.0 * t5,
            0.5 * (t2 - 3.0 * t3 + 3.0 * t4 - t5),
            10.0 * t3 - 15.0 * t4 + 6.0 * t5,
            -4.0 * t3 + 7.0 * t4 - 3.0 * t5,
            0.5 * (t3 - 2.0 * t4 + t5),
        ];
        let quintic = |j: usize| {
            q[0] * ka.value[j]
                + h * (q[1] * ka.slope[j] + h * q[2] * ka.curvature[j])
                + q[3] * kb.value[j]
                + h * (q[4] * kb.slope[j] + h * q[5] * kb.curvature[j])
        };
        let cubic = |j: usize| {
            c[0] * ka.value[j]
                + h * c[1] * ka.slope[j]
                + c[2] * kb.value[j]
                + h * c[3] * kb.slope[j]
        };
        StructurePoint {
            v_over_x2: quintic(0).exp(),
            u: quintic(1).exp(),
            c1: quintic(2).exp(),
            a_star: cubic(3),
            gamma1: cubic(4),
        }
    }

    fn centre(&self) -> CentreValues {
        self.centre
    }

    fn surface_u(&self) -> f64 {
        self.surface_u
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Spline slopes: exact for an even parabola (whose three-point end slopes are exact), and the
    /// Hermite cubics they define are continuous in the second derivative inside a segment,
    /// for a function that is not a polynomial, on an uneven mesh with a segment end at knot 4.
    #[test]
    fn spline_slopes_are_exact_for_parabolas_and_c2() {
        let x = [0.0, 0.1, 0.25, 0.3, 0.5, 0.55, 0.7, 1.0];
        let smooth = [false, true, true, true, false, true, true, false];
        // An even parabola: zero slope at the centre, as the spline assumes.
        let f: Vec<f64> = x.iter().map(|t| 2.0 + 5.0 * t * t).collect();
        let m = spline_slopes(&x, &f, &smooth);
        for i in 1..x.len() {
            assert!((m[i] - 10.0 * x[i]).abs() < 1e-12, "{i}");
        }
        let g: Vec<f64> = x.iter().map(|t| (3.0 * t).sin()).collect();
        let m = spline_slopes(&x, &g, &smooth);
        let second = |i: usize, at_right_end: bool| {
            let h = x[i + 1] - x[i];
            let d = (g[i + 1] - g[i]) / h;
            if at_right_end {
                (2.0 * m[i] + 4.0 * m[i + 1] - 6.0 * d) / h
            } else {
                (-4.0 * m[i] - 2.0 * m[i + 1] + 6.0 * d) / h
            }
        };
        for i in [1, 2, 3, 5, 6] {
            let (left, right) = (second(i - 1, true), second(i, false));
            assert!((left - right).abs() < 1e-10, "knot {i}: {left} vs {right}");
        }
    }

    /// The three-point slope is exact for a parabola on an uneven mesh, inside and at the end.
    #[test]
    fn three_point_slope_is_exact_for_parabolas() {
        let x = [0.0, 0.1, 0.35, 0.5, 1.0];
        let f: Vec<f64> = x.iter().map(|t| 2.0 - 3.0 * t + 5.0 * t * t).collect();
        for i in 1..x.len() {
            let exact = -3.0 + 10.0 * x[i];
            assert!((three_point_slope(&x, &f, i) - exact).abs() < 1e-12, "{i}");
        }
    }
}
