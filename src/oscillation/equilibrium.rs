//! What the oscillation solver needs to know about a star in hydrostatic equilibrium.
//!
//! The linear adiabatic equations depend on the equilibrium only through five dimensionless
//! functions of the fractional radius x = r/R (Dziembowski 1971, Acta Astron. 21, 289; Unno et
//! al. 1989, *Nonradial Oscillations of Stars*, 2nd ed., §18.1):
//!
//! - V = -dln P/dln r = G m rho/(r P), stored as V/x^2, which is finite at the centre
//!   (V -> (4 pi/3) G rho_c^2 R^2 x^2/P_c) and infinite only at a surface where P = 0;
//! - U = dln m/dln r = 4 pi r^3 rho/m, 3 at the centre;
//! - c1 = (r/R)^3 (M/m), which tends to rho_mean/rho_c at the centre and is 1 at the surface;
//! - A* = (1/Gamma_1) dln P/dln r - dln rho/dln r = r N^2/g, the dimensionless buoyancy
//!   (N^2 > 0 where A* > 0; zero at a regular centre);
//! - Gamma_1 = (dln P/dln rho)_ad.
//!
//! From these: the sound speed c^2 R/(G M) = Gamma_1/(c1 V/x^2), the buoyancy frequency
//! N^2 R^3/(G M) = A*/c1 and the gravity g R^2/(G M) = x/c1 (all derived from the definitions).
//!
//! A model supplies them through [`Equilibrium`]: a set of breakpoints 0 = x_0 < ... < x_N = 1
//! between which its coefficients are smooth (the solver never straddles a breakpoint), their
//! values at points strictly inside an interval, and a few limits at the centre and surface.

use crate::error::{Error, Result};

/// The dimensionless structure coefficients at one point (see the module documentation).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StructurePoint {
    /// V/x^2 with V = -dln P/dln r.
    pub v_over_x2: f64,
    /// U = dln m/dln r.
    pub u: f64,
    /// c1 = x^3 M/m.
    pub c1: f64,
    /// A* = r N^2/g.
    pub a_star: f64,
    /// Gamma_1, the adiabatic exponent.
    pub gamma1: f64,
}

impl StructurePoint {
    /// Whether every coefficient is finite and V/x^2, c1, Gamma_1 are positive and U is not
    /// negative (what a physical model has at every point strictly inside the star).
    pub fn is_physical(&self) -> bool {
        self.v_over_x2.is_finite()
            && self.v_over_x2 > 0.0
            && self.u.is_finite()
            && self.u >= 0.0
            && self.c1.is_finite()
            && self.c1 > 0.0
            && self.a_star.is_finite()
            && self.gamma1.is_finite()
            && self.gamma1 > 0.0
    }

    /// Squared sound speed in units of G M/R: c^2 R/(G M) = Gamma_1/(c1 V/x^2).
    pub fn sound_speed_squared(&self) -> f64 {
        self.gamma1 / (self.c1 * self.v_over_x2)
    }

    /// Squared buoyancy frequency in units of G M/R^3: N^2 R^3/(G M) = A*/c1.
    pub fn buoyancy_squared(&self) -> f64 {
        self.a_star / self.c1
    }
}

/// Limits at the regular centre x = 0.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CentreValues {
    /// c1(0) = rho_mean/rho_c.
    pub c1: f64,
    /// lim V/x^2 = (4 pi/3) G rho_c^2 R^2/P_c.
    pub v_over_x2: f64,
    /// Gamma_1(0).
    pub gamma1: f64,
}

/// An equilibrium model as the oscillation solver sees it (see the module documentation).
///
/// Implementations: [`super::HomogeneousSphere`] (analytic), [`super::PolytropicModel`] (a
/// Lane–Emden solution from [`crate::polytrope`]) and [`super::TabulatedModel`] (arrays on a
/// mesh, e.g. a ZAMS model).
pub trait Equilibrium {
    /// Breakpoints 0 = x_0 < x_1 < ... < x_N = 1, N >= 1: the coefficients are smooth inside
    /// each interval [x_i, x_(i+1)].
    fn breakpoints(&self) -> &[f64];

    /// The coefficients at `x` strictly inside interval `interval` (x_i < x < x_(i+1)).
    fn point(&self, interval: usize, x: f64) -> StructurePoint;

    /// Limits at the centre.
    fn centre(&self) -> CentreValues;

    /// U at the surface, 4 pi R^3 rho_s/M: zero where the density vanishes at the surface, 3 for
    /// the homogeneous sphere. It enters the matching of the potential perturbation to the
    /// exterior solution through the surface mass layer.
    fn surface_u(&self) -> f64;
}

/// Check that breakpoints start at 0, end at 1, increase strictly, and number at least two.
pub fn validate_breakpoints(name: &str, x: &[f64]) -> Result<()> {
    let increasing = x.windows(2).all(|w| w[1] > w[0]);
    if x.len() < 2 || x.first() != Some(&0.0) || x.last() != Some(&1.0) || !increasing {
        return Err(Error::invalid(
            name,
            format!("{} points", x.len()),
            "the mesh must run from x = r/R = 0 to 1 in strictly increasing order",
        ));
    }
    Ok(())
}
