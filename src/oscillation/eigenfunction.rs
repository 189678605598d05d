//! From the solution at an eigenvalue to what is reported: the mode's order (Eckart–Scuflaire–
//! Osaki–Takata), its normalised inertia and, on request, its eigenfunctions.
//!
//! # Mode order
//!
//! Eckart (1960, *Hydrodynamics of Oceans and Atmospheres*), Scuflaire (1974, A&A 36, 107) and
//! Osaki (1975, PASJ 27, 237): follow the solution in the (y1, y2) plane from the centre to the
//! surface. At each zero of y1 inside the star, the point moves counter-clockwise (p-type node:
//! y1 falls where y2 > 0 or rises where y2 < 0) or clockwise (g-type node). The order is
//! n = n_p - n_g, so that f modes have n = 0, p modes n > 0 and g modes n < 0; for radial modes
//! n = n_p - n_g + 1, so that the fundamental radial mode has order 1.
//!
//! For dipole modes of the full problem the displacement of the star's centre of mass spoils
//! that count in centrally condensed stars; Takata (2006, PASJ 58, 893) replaced y1 by the
//! radial displacement relative to the centre of mass of the sphere inside r and y2 by the
//! Eulerian pressure perturbation:
//!
//! Y1 = J y1 + (y3 - y4)/3 with J = 1 - U/3,  Y2 = y2 - y3,
//!
//! where (y3 - y4) r m/(4 pi) is the dipole moment of the density perturbation inside r (derived
//! here from Poisson's equation for l = 1; the form is Takata's as far as recalled,
//! docs/references.md §8.6). Dipole orders are then n_p - n_g as well, with no f mode (n = 0).
//!
//! Nodes are found between consecutive collocation nodes (three per step), where the structure
//! coefficients are known; positive scale factors of the variables do not change the count.
//!
//! # Normalisation and inertia
//!
//! Eigenfunctions are normalised so that xi_r(R) = R. The mode inertia is
//!
//! E = int_0^M (|xi_r|^2 + l(l+1) |xi_h|^2) dm / (M |xi_r(R)|^2),
//!
//! (the normalised mode inertia of asteroseismology, e.g. Aerts, Christensen-Dalsgaard & Kurtz
//! 2010, *Asteroseismology*, ch. 3; memory), with xi_h the horizontal displacement amplitude
//! (xi_h = g y2/omega^2); in the dimensionless variables dm/M = U x^2 dx/c1 and
//! xi_h/R = x y2/(c1 w). It is integrated by the collocation nodes' Gauss weights.
//! Checks: 3/5 for the radial fundamental of the homogeneous sphere (xi proportional to r) and
//! 3/l for its Kelvin f modes (xi = grad(r^l Y)), both derived from this definition.

use super::equations::Formulation;
use super::equilibrium::Equilibrium;
use super::mesh::Grid;
use super::shooting::Sample;
use std::f64::consts::PI;

/// Eigenfunctions of one mode at the mesh's step boundaries, normalised to xi_r(R) = R.
#[derive(Debug, Clone, PartialEq)]
pub struct Eigenfunction {
    /// x = r/R.
    pub x: Vec<f64>,
    /// Radial displacement xi_r/R.
    pub xi_r: Vec<f64>,
    /// Horizontal displacement amplitude xi_h/R (zero for radial modes).
    pub xi_h: Vec<f64>,
    /// Eulerian pressure perturbation p' in units of G M^2/R^4.
    pub p_prime: Vec<f64>,
    /// Eulerian potential perturbation Phi' in units of G M/R (zero in the Cowling
    /// approximation).
    pub phi_prime: Vec<f64>,
}

/// What the solution at an eigenvalue tells about the mode.
#[derive(Debug, Clone, PartialEq)]
pub struct Analysis {
    /// Nodes of p type.
    pub nodes_p: u32,
    /// Nodes of g type.
    pub nodes_g: u32,
    /// The mode order (module documentation).
    pub order: i32,
    /// Normalised inertia E (module documentation).
    pub inertia: f64,
    /// The eigenfunctions, when asked for.
    pub eigenfunction: Option<Eigenfunction>,
}

/// Signed zeros of the first classification variable Y1 along the star.
#[derive(Debug, Default)]
struct NodeCount {
    p: u32,
    g: u32,
    /// (Y1, q) at the last sample where Y1 was not zero; q decides the type of a node.
    last: Option<(f64, f64)>,
    /// Whether Y1 and Y2 had opposite signs at the first sample (Scuflaire's n_0).
    opposite_at_centre: bool,
}

impl NodeCount {
    /// Record Y1 and q at the next sample. At a sign change of Y1, q is interpolated linearly
    /// to the zero and `p_type(q, falling)` says whether the node (Y1 falling through zero if
    /// `falling`) is of p type.
    fn add(&mut self, y1: f64, q: f64, p_type: impl Fn(f64, bool) -> bool) {
        if y1 == 0.0 {
            return;
        }
        match self.last {
            None => self.opposite_at_centre = y1 * q < 0.0,
            Some((y1a, qa)) if y1a * y1 < 0.0 => {
                let t = y1a / (y1a - y1);
                if p_type(qa + t * (q - qa), y1 < 0.0) {
                    self.p += 1;
                } else {
                    self.g += 1;
                }
            }
            Some(_) => {}
        }
        self.last = Some((y1, q));
    }
}

/// Inputs of [`analyse`] besides the samples.
pub struct Context<'a> {
    /// The model.
    pub model: &'a dyn Equilibrium,
    /// The mesh the samples lie on.
    pub grid: &'a Grid,
    /// Formulation used.
    pub formulation: Formulation,
    /// Degree l.
    pub degree: u32,
    /// w = sigma^2 of the mode.
    pub w: f64,
}

/// Count the nodes, compute the inertia and, with `keep`, the eigenfunctions of the solution
/// `samples` (scaled variables, any normalisation). `None` if the surface displacement vanishes.
pub fn analyse<const D: usize>(
    ctx: &Context<'_>,
    samples: &[Sample<D>],
    keep: bool,
) -> Option<Analysis> {
    let last = samples.last()?;
    let surface = last.z[0];
    if !(surface != 0.0 && surface.is_finite()) {
        return None;
    }
    let l = ctx.degree;
    let l2 = f64::from(l) * (f64::from(l) + 1.0);
    let radial = ctx.formulation == Formulation::Radial;
    // (xi_r/R, xi_h/R) before normalisation, with the structure (U, c1) at the point.
    let displacement = |x: f64, z: &[f64; D], c1: f64| -> (f64, f64) {
        if radial {
            (x * z[0], 0.0)
        } else {
            let scale = x.powi(l as i32 - 1);
            (scale * z[0], scale * z[1] / (c1 * ctx.w))
        }
    };
    let dipole = ctx.formulation == Formulation::Full && l == 1;
    let mut count = NodeCount::default();
    let mut inertia = 0.0;
    for s in samples.iter() {
        let Some(j) = s.node else { continue };
        let p = &ctx.grid.points[s.step][j];
        let (xr, xh) = displacement(s.x, &s.z, p.c1);
        inertia += s.weight * (xr * xr + l2 * xh * xh) * p.u * s.x * s.x / p.c1;
        if dipole {
            // Y1 and the sign of the node-type criterion (module documentation).
            let y1 = (1.0 - p.u / 3.0) * s.z[0] + (s.z[2] - s.z[3]) / 3.0;
            let v = p.v_over_x2 * s.x * s.x;
            let j = 1.0 - p.u / 3.0;
            let criterion = 9.0 * v * p.c1 * ctx.w - 18.0 * p.gamma1 * j * j;
            count.add(y1, criterion, |q, _| q > 0.0);
        } else {
            count.add(s.z[0], s.z[1], |y2, falling| (y2 > 0.0) == falling);
        }
    }
    let inertia = inertia / (surface * surface);
    let (nodes_p, nodes_g) = (count.p, count.g);
    let net = i32::try_from(nodes_p).ok()? - i32::try_from(nodes_g).ok()?;
    let order = if dipole {
        net + i32::from(net >= 0)
    } else {
        net + i32::from(count.opposite_at_centre)
    };
    let eigenfunction = keep.then(|| eigenfunction(ctx, samples, surface));
    Some(Analysis {
        nodes_p,
        nodes_g,
        order,
        inertia,
        eigenfunction,
    })
}

/// The eigenfunctions at the step boundaries (module documentation), divided by `surface`.
fn eigenfunction<const D: usize>(
    ctx: &Context<'_>,
    samples: &[Sample<D>],
    surface: f64,
) -> Eigenfunction {
    let l = ctx.degree;
    let radial = ctx.formulation == Formulation::Radial;
    let full = ctx.formulation == Formulation::Full;
    let centre = ctx.model.centre();
    let mut out = Eigenfunction {
        x: Vec::new(),
        xi_r: Vec::new(),
        xi_h: Vec::new(),
        p_prime: Vec::new(),
        phi_prime: Vec::new(),
    };
    // Radial Phi' = int_x^1 (U/c1) xi_r dx (units G M/R), accumulated from the surface inward
    // over the collocation nodes; `outside[i]` is the integral beyond sample i.
    let mut outside = vec![0.0; samples.len()];
    if radial {
        let mut acc = 0.0;
        for (i, s) in samples.iter().enumerate().rev() {
            outside[i] = acc;
            if let Some(j) = s.node {
                let p = &ctx.grid.points[s.step][j];
                acc += s.weight * p.u / p.c1 * s.x * s.z[0] / surface;
            }
        }
    }
    let last_x = ctx.grid.x.len() - 1;
    for (i, s) in samples.iter().enumerate() {
        if s.node.is_some() {
            continue;
        }
        let (u, c1) = if s.x == 0.0 {
            (3.0, centre.c1)
        } else if s.x == ctx.grid.x[last_x] {
            (ctx.model.surface_u(), 1.0)
        } else {
            let p = ctx.model.point(ctx.grid.interval[s.step], s.x);
            (p.u, p.c1)
        };
        let z: Vec<f64> = s.z.iter().map(|v| v / surface).collect();
        out.x.push(s.x);
        if radial {
            out.xi_r.push(s.x * z[0]);
            out.xi_h.push(0.0);
            out.p_prime.push(u * z[1] / (4.0 * PI * c1 * c1));
            out.phi_prime.push(outside[i]);
        } else {
            let scale = s.x.powi(l as i32 - 1);
            out.xi_r.push(scale * z[0]);
            out.xi_h.push(scale * z[1] / (c1 * ctx.w));
            let z3 = if full { z[2] } else { 0.0 };
            let scale_l = s.x.powi(l as i32);
            out.p_prime
                .push(u * scale_l * (z[1] - z3) / (4.0 * PI * c1 * c1));
            out.phi_prime.push(scale_l * z3 / c1);
        }
    }
    out
}
