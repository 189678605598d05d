//! The linear adiabatic oscillation equations in dimensionless form, with their boundary
//! conditions.
//!
//! # Variables
//!
//! Perturbations vary as f(r) Y_l^m(theta, phi) exp(i omega t); the displacement is
//! xi = xi_r Y e_r + xi_h r grad_h Y. With x = r/R, w = sigma^2 = omega^2 R^3/(G M) and the
//! structure coefficients V, U, c1, A*, Gamma_1 of [`super::equilibrium`], the variables of
//! Dziembowski (1971, Acta Astron. 21, 289), as used by Unno et al. (1989, *Nonradial
//! Oscillations of Stars*, §18.1), are
//!
//! y1 = xi_r/r, y2 = (p'/rho + Phi')/(g r) = omega^2 xi_h/g, y3 = Phi'/(g r), y4 = (dPhi'/dr)/g,
//!
//! with p' and Phi' the Eulerian perturbations of pressure and gravitational potential.
//!
//! # Equations (L^2 = l(l+1))
//!
//! x dy1/dx = (V/Gamma_1 - 3) y1 + (L^2/(c1 w) - V/Gamma_1) y2 + (V/Gamma_1) y3
//! x dy2/dx = (c1 w - A*) y1 + (A* - U + 1) y2 - A* y3
//! x dy3/dx = (1 - U) y3 + y4
//! x dy4/dx = U A* y1 + U (V/Gamma_1) y2 + (L^2 - U V/Gamma_1) y3 - U y4
//!
//! These follow from the linearised continuity, momentum, adiabatic and Poisson equations
//! (Cox 1980, *Theory of Stellar Pulsation*, ch. 15; Unno et al. 1989, §14) with
//! rho' = rho p'/(Gamma_1 P) + rho A xi_r (A = A*/r): the continuity equation gives the first,
//! the radial momentum equation the second, the definition of y4 the third and Poisson's
//! equation the fourth. The derivation was redone for this module; the equations agree with
//! the published form as far as recalled (equation numbers in docs/references.md §8.6).
//!
//! The **Cowling approximation** (Cowling 1941, MNRAS 101, 367) drops Phi': y3 = y4 = 0 and only
//! the first two equations remain.
//!
//! **Radial modes** (l = 0): Poisson's equation integrates to dPhi'/dr = -4 pi G rho xi_r,
//! i.e. y4 = -U y1, and only p' = rho g r (y2 - y3) enters. With z = y2 - y3 the problem is
//! exactly of second order:
//!
//! x dy1/dx = (V/Gamma_1 - 3) y1 - (V/Gamma_1) z
//! x dz/dx  = (c1 w + U - A*) y1 + (A* - U + 1) z
//!
//! (the linear adiabatic wave equation, Cox 1980, ch. 8, in these variables). The potential
//! perturbation is therefore always included for radial modes, with or without `cowling`.
//!
//! # Scaling at the centre
//!
//! Near x = 0 the regular solutions behave as x^(l-2) (xi_r ~ r^(l-1)) for l >= 1, and for
//! l = 0 as y1 ~ 1, z ~ x^(-2). The solver integrates scaled variables that tend to non-zero
//! constants: z_i = x^(2-l) y_i (l >= 1), and (y1, x^2 z) (l = 0). Positive scale factors change
//! neither the zeros of the variables nor the sense of rotation in any (z_i, z_j) plane, so the
//! mode classification is unaffected.
//!
//! # Boundary conditions
//!
//! Centre (regularity; Unno et al. 1989, §18.1): c1 w y1 - l y2 = 0 and l y3 - y4 = 0, i.e.
//! the regular subspace is spanned by (1, c1(0) w/l, 0, 0) and (0, 0, 1, l) in the scaled
//! variables; radial: 3 Gamma_1 y1 + (V/x^2) x^2 z = 0 at x = 0, spanned by
//! (-(V/x^2)(0)/(3 Gamma_1(0)), 1).
//!
//! Surface x = 1: delta p = 0, with delta p/P = V (y2 - y3 - y1), i.e. y1 - y2 + y3 = 0 (also
//! the regularity condition where P = 0 and V is infinite); and Phi' matched to the exterior
//! solution Phi' ~ r^(-l-1), with the jump of dPhi'/dr across a surface density rho_s:
//! U_s y1 + (l+1) y3 + y4 = 0 (U_s = 4 pi R^3 rho_s/M). Spanned by (1, 1, 0, -U_s) and
//! (0, 1, 1, -(l+1)); Cowling and radial: (1, 1).

use super::collocation::{Block, Matrix};
use super::equilibrium::{CentreValues, StructurePoint};

/// Which form of the equations a degree uses.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Formulation {
    /// l = 0: the second-order radial problem, Phi' included exactly.
    Radial,
    /// l >= 1 without the potential perturbation (second order).
    Cowling,
    /// l >= 1 with the potential perturbation (fourth order).
    Full,
}

impl Formulation {
    /// The formulation for degree `l`: radial for l = 0, otherwise full or, with `cowling`,
    /// Cowling.
    pub fn for_degree(l: u32, cowling: bool) -> Self {
        match (l, cowling) {
            (0, _) => Formulation::Radial,
            (_, true) => Formulation::Cowling,
            (_, false) => Formulation::Full,
        }
    }
}

/// The coefficient matrix of dz/dx = C z at one node: C(w) = base + w p E_10 + (q/w) E_01,
/// where E_10 and E_01 select the entries (1,0) and (0,1).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct NodeMatrix<const D: usize> {
    base: Matrix<D>,
    p: f64,
    q: f64,
}

impl<const D: usize> NodeMatrix<D> {
    /// C at w = sigma^2 (w must not be zero when q is not).
    pub fn at(&self, w: f64) -> Matrix<D> {
        let mut m = self.base;
        m[1][0] += w * self.p;
        if self.q != 0.0 {
            m[0][1] += self.q / w;
        }
        m
    }

    /// Local rates of change (per unit x) of the solutions of the leading 2 x 2 block at w:
    /// (the imaginary part of its eigenvalues, zero where the solutions do not oscillate; the
    /// largest modulus of its eigenvalues).
    pub fn rates(&self, w: f64) -> (f64, f64) {
        let m = self.at(w);
        let half_trace = 0.5 * (m[0][0] + m[1][1]);
        let det = m[0][0] * m[1][1] - m[0][1] * m[1][0];
        let disc = half_trace * half_trace - det;
        if disc >= 0.0 {
            (0.0, half_trace.abs() + disc.sqrt())
        } else {
            ((-disc).sqrt(), det.sqrt())
        }
    }
}

/// The matrix of the full fourth-order problem of degree `l` >= 1 at `x` (scaled variables).
pub fn full_node(l: u32, x: f64, s: &StructurePoint) -> NodeMatrix<4> {
    let lf = f64::from(l);
    let l2 = lf * (lf + 1.0);
    let a = s.v_over_x2 * x * x / s.gamma1;
    let (u, astar) = (s.u, s.a_star);
    let inv = 1.0 / x;
    NodeMatrix {
        base: [
            [(a - 1.0 - lf) * inv, -a * inv, a * inv, 0.0],
            [
                -astar * inv,
                (astar - u + 3.0 - lf) * inv,
                -astar * inv,
                0.0,
            ],
            [0.0, 0.0, (3.0 - u - lf) * inv, inv],
            [
                u * astar * inv,
                u * a * inv,
                (l2 - u * a) * inv,
                (2.0 - u - lf) * inv,
            ],
        ],
        p: s.c1 * inv,
        q: l2 / (s.c1 * x),
    }
}

/// The matrix of the Cowling problem of degree `l` >= 1 at `x` (scaled variables).
pub fn cowling_node(l: u32, x: f64, s: &StructurePoint) -> NodeMatrix<2> {
    let full = full_node(l, x, s);
    NodeMatrix {
        base: [
            [full.base[0][0], full.base[0][1]],
            [full.base[1][0], full.base[1][1]],
        ],
        p: full.p,
        q: full.q,
    }
}

/// The matrix of the radial problem at `x` in the variables (y1, x^2 z).
pub fn radial_node(x: f64, s: &StructurePoint) -> NodeMatrix<2> {
    let v_g = s.v_over_x2 / s.gamma1;
    let (u, astar) = (s.u, s.a_star);
    NodeMatrix {
        base: [
            [(v_g * x * x - 3.0) / x, -v_g / x],
            [x * (u - astar), (astar - u + 3.0) / x],
        ],
        p: x * s.c1,
        q: 0.0,
    }
}

/// A basis of solutions at a boundary, affine in w: basis(w) = constant + w slope.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BoundaryBasis<const D: usize, const K: usize> {
    constant: Block<D, K>,
    slope: Block<D, K>,
}

impl<const D: usize, const K: usize> BoundaryBasis<D, K> {
    /// The basis at w.
    pub fn at(&self, w: f64) -> Block<D, K> {
        let mut b = self.constant;
        for (row, slope) in b.iter_mut().zip(&self.slope) {
            for (v, s) in row.iter_mut().zip(slope) {
                *v += w * s;
            }
        }
        b
    }
}

/// Regular solutions at the centre, full problem of degree `l` >= 1.
pub fn full_centre(l: u32, c: &CentreValues) -> BoundaryBasis<4, 2> {
    let lf = f64::from(l);
    BoundaryBasis {
        constant: [[1.0, 0.0], [0.0, 0.0], [0.0, 1.0], [0.0, lf]],
        slope: [[0.0, 0.0], [c.c1 / lf, 0.0], [0.0, 0.0], [0.0, 0.0]],
    }
}

/// Solutions satisfying the surface conditions, full problem of degree `l`.
pub fn full_surface(l: u32, surface_u: f64) -> BoundaryBasis<4, 2> {
    BoundaryBasis {
        constant: [
            [1.0, 0.0],
            [1.0, 1.0],
            [0.0, 1.0],
            [-surface_u, -(f64::from(l) + 1.0)],
        ],
        slope: [[0.0; 2]; 4],
    }
}

/// The regular solution at the centre, Cowling problem of degree `l` >= 1.
pub fn cowling_centre(l: u32, c: &CentreValues) -> BoundaryBasis<2, 1> {
    BoundaryBasis {
        constant: [[1.0], [0.0]],
        slope: [[0.0], [c.c1 / f64::from(l)]],
    }
}

/// The regular solution at the centre, radial problem.
pub fn radial_centre(c: &CentreValues) -> BoundaryBasis<2, 1> {
    BoundaryBasis {
        constant: [[-c.v_over_x2 / (3.0 * c.gamma1)], [1.0]],
        slope: [[0.0], [0.0]],
    }
}

/// The solution satisfying delta p = 0 at the surface, Cowling and radial problems.
pub fn second_order_surface() -> BoundaryBasis<2, 1> {
    BoundaryBasis {
        constant: [[1.0], [1.0]],
        slope: [[0.0], [0.0]],
    }
}
