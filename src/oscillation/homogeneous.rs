//! The homogeneous compressible sphere: constant density and constant Gamma_1.
//!
//! With rho constant, m/M = x^3 and hydrostatic equilibrium gives P = P_c (1 - x^2) with
//! P_c = (3/(8 pi)) G M^2/R^4 (Chandrasekhar 1939, ch. IV, the polytrope of index 0; the
//! `polytrope` module checks W_0 = 3/(8 pi)). Hence (from the definitions in
//! [`super::equilibrium`]):
//!
//! V = 2 x^2/(1 - x^2), U = 3, c1 = 1, A* = -V/Gamma_1 (convectively unstable for every finite
//! Gamma_1: its g modes have sigma^2 < 0), U at the surface = 3.
//!
//! Its oscillation frequencies are known in closed form (Pekeris 1938, ApJ 88, 189; radial modes
//! Sterne 1937, MNRAS 97, 582): `docs/references.md` §8.6.

use super::equilibrium::{CentreValues, Equilibrium, StructurePoint};
use crate::error::{Error, Result};

/// Fewest mesh intervals allowed.
pub const MIN_INTERVALS: usize = 1;
/// Most mesh intervals allowed.
pub const MAX_INTERVALS: usize = 1_000_000;

/// The homogeneous compressible sphere of a given Gamma_1, with a mesh of breakpoints for the
/// solver (the coefficients are analytic, so the mesh sets only the solver's resolution).
#[derive(Debug, Clone, PartialEq)]
pub struct HomogeneousSphere {
    gamma1: f64,
    breakpoints: Vec<f64>,
}

impl HomogeneousSphere {
    /// The sphere with adiabatic exponent `gamma1` (finite, > 0) and `intervals` mesh intervals
    /// ([`MIN_INTERVALS`] to [`MAX_INTERVALS`]), uniform in x.
    pub fn new(gamma1: f64, intervals: usize) -> Result<Self> {
        if !(gamma1.is_finite() && gamma1 > 0.0) {
            return Err(Error::invalid(
                "gamma1",
                gamma1,
                "Gamma_1 must be a finite positive number, e.g. 1.6667",
            ));
        }
        if !(MIN_INTERVALS..=MAX_INTERVALS).contains(&intervals) {
            return Err(Error::invalid(
                "intervals",
                intervals,
                "the number of mesh intervals must be an integer from 1 to 1000000",
            ));
        }
        let breakpoints = (0..=intervals)
            .map(|i| i as f64 / intervals as f64)
            .collect();
        Ok(Self {
            gamma1,
            breakpoints,
        })
    }

    /// Gamma_1.
    pub fn gamma1(&self) -> f64 {
        self.gamma1
    }
}

impl Equilibrium for HomogeneousSphere {
    fn breakpoints(&self) -> &[f64] {
        &self.breakpoints
    }

    fn point(&self, _interval: usize, x: f64) -> StructurePoint {
        let v_over_x2 = 2.0 / (1.0 - x * x);
        StructurePoint {
            v_over_x2,
            u: 3.0,
            c1: 1.0,
            a_star: -v_over_x2 * x * x / self.gamma1,
            gamma1: self.gamma1,
        }
    }

    fn centre(&self) -> CentreValues {
        CentreValues {
            c1: 1.0,
            v_over_x2: 2.0,
            gamma1: self.gamma1,
        }
    }

    fn surface_u(&self) -> f64 {
        3.0
    }
}
