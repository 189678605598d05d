//! `kramers`: Kramers-law free–free and bound–free absorption.

use super::{check_point, Opacity};
use crate::error::{Error, PhysicsError, Result};
use crate::physics::composition::Composition;

/// kappa = kappa_ff + kappa_bf with kappa_ff = 3.68e22 (1 - Z)(1 + X) rho T^-3.5 and
/// kappa_bf = 4.34e25 (Z / t)(1 + X) rho T^-3.5 cm^2 g^-1, Gaunt factors 1 and the guillotine
/// factor t (Hansen & Kawaler 1994, *Stellar Interiors*, §4.4; Schwarzschild 1958; t "between
/// 1 and 100"). Any rho, T > 0; physically meaningful only where matter is ionised
/// (T above about 1e4 K).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Kramers {
    guillotine: f64,
}

impl Default for Kramers {
    /// Guillotine factor 1 (the plain textbook law).
    fn default() -> Self {
        Self { guillotine: 1.0 }
    }
}

impl Kramers {
    /// Kramers opacity with guillotine factor `guillotine` (finite, > 0).
    pub fn new(guillotine: f64) -> Result<Self> {
        if !(guillotine.is_finite() && guillotine > 0.0) {
            return Err(Error::invalid(
                "guillotine",
                guillotine,
                "the guillotine factor must be a positive number, e.g. kramers:guillotine=10",
            ));
        }
        Ok(Self { guillotine })
    }

    /// The guillotine factor t.
    pub fn guillotine(&self) -> f64 {
        self.guillotine
    }

    /// (kappa_ff, kappa_bf) in cm^2 g^-1 without checks (callers check the point).
    pub fn parts(&self, rho: f64, t: f64, comp: &Composition) -> (f64, f64) {
        // T^-3.5 with a square root instead of a power.
        let common = (1.0 + comp.x()) * rho / (t * t * t * t.sqrt());
        (
            3.68e22 * (1.0 - comp.z()) * common,
            4.34e25 * comp.z() / self.guillotine * common,
        )
    }
}

impl Opacity for Kramers {
    fn name(&self) -> String {
        format!("kramers:guillotine={}", self.guillotine)
    }

    fn kappa(&self, rho: f64, t: f64, comp: &Composition) -> Result<f64, PhysicsError> {
        check_point("kramers", rho, t)?;
        let (ff, bf) = self.parts(rho, t, comp);
        Ok(ff + bf)
    }
}
