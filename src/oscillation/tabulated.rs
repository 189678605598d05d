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
//! The mesh points are the model's breakpoints. Between two of them each coefficient is a cubic
//! Hermite polynomial in x (error O(h^4) for mesh spacing h):
//!
//! - ln(V/x^2), ln U and ln c1, with slopes from the structure equations themselves (exact for
//!   a model in hydrostatic equilibrium; derived from the definitions):
//!   dln(V/x^2)/dln x = U - 3 + V (1 - 1/Gamma_1) - A*, dln U/dln x = 3 - U - V/Gamma_1 - A*,
//!   dln c1/dln x = 3 - U (all three vanish at the centre, where the functions are even in x);
//! - A* and Gamma_1, with slopes from the parabola through each point and its two neighbours
//!   (one-sided at the surface, zero at the centre by symmetry). These local slopes keep a kink
//!   of N^2 at a convective boundary from ringing through the mesh, as a spline would.

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
}

/// A model given on a mesh, interpolated as described in the module documentation.
#[derive(Debug, Clone, PartialEq)]
pub struct TabulatedModel {
    breakpoints: Vec<f64>,
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
        let knots = (0..k)
            .map(|i| {
                let p = points[i];
                let value = [p.v_over_x2.ln(), p.u.ln(), p.c1.ln(), p.a_star, p.gamma1];
                let mut slope = [0.0; 5];
                if i > 0 {
                    let (xi, v) = (x[i], p.v_over_x2 * x[i] * x[i]);
                    slope[0] = (p.u - 3.0 + v * (1.0 - 1.0 / p.gamma1) - p.a_star) / xi;
                    slope[1] = (3.0 - p.u - v / p.gamma1 - p.a_star) / xi;
                    slope[2] = (3.0 - p.u) / xi;
                    slope[3] = three_point_slope(x, a.a_star, i);
                    slope[4] = three_point_slope(x, a.gamma1, i);
                }
                Knot { value, slope }
            })
            .collect();
        Ok(Self {
            breakpoints: x.to_vec(),
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

    fn point(&self, interval: usize, x: f64) -> StructurePoint {
        let (xa, xb) = (self.breakpoints[interval], self.breakpoints[interval + 1]);
        let (ka, kb) = (&self.knots[interval], &self.knots[interval + 1]);
        let h = xb - xa;
        let t = (x - xa) / h;
        let t2 = t * t;
        let t3 = t2 * t;
        // Cubic Hermite basis.
        let h00 = 2.0 * t3 - 3.0 * t2 + 1.0;
        let h10 = t3 - 2.0 * t2 + t;
        let h01 = -2.0 * t3 + 3.0 * t2;
        let h11 = t3 - t2;
        let f = |j: usize| {
            h00 * ka.value[j] + h * h10 * ka.slope[j] + h01 * kb.value[j] + h * h11 * kb.slope[j]
        };
        StructurePoint {
            v_over_x2: f(0).exp(),
            u: f(1).exp(),
            c1: f(2).exp(),
            a_star: f(3),
            gamma1: f(4),
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
