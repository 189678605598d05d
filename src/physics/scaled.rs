//! A user scale factor on any opacity or energy-generation law ("what if kappa were twice as
//! large"), one wrapper instead of a factor in every law.

use super::composition::Composition;
use super::nuclear::{EnergyGeneration, EnergyRate, He3Equilibrium};
use super::opacity::Opacity;
use crate::error::{Error, PhysicsError, Result};
use std::sync::Arc;

/// `factor` times the law `inner`: kappa -> factor kappa, or eps_pp, eps_CNO -> factor eps
/// (temperature exponents unchanged). Named `INNER*FACTOR`.
#[derive(Debug, Clone)]
pub struct Scaled<L: ?Sized> {
    inner: Arc<L>,
    factor: f64,
}

impl<L: ?Sized> Scaled<L> {
    /// Wrap `inner` with `factor` (finite, > 0). `flag` names the option in errors.
    pub fn new(inner: Arc<L>, factor: f64, flag: &str) -> Result<Self> {
        if !(factor.is_finite() && factor > 0.0) {
            return Err(Error::invalid(
                flag,
                factor,
                "the scale factor must be a positive number, e.g. 2",
            ));
        }
        Ok(Self { inner, factor })
    }

    /// The scale factor.
    pub fn factor(&self) -> f64 {
        self.factor
    }
}

impl<L: Opacity + ?Sized> Opacity for Scaled<L> {
    fn name(&self) -> String {
        format!("{}*{}", self.inner.name(), self.factor)
    }

    fn caution(&self, rho: f64, t: f64, comp: &Composition) -> Option<&'static str> {
        self.inner.caution(rho, t, comp)
    }

    fn temperature_breaks_k(&self) -> &'static [f64] {
        self.inner.temperature_breaks_k()
    }

    fn kappa(&self, rho: f64, t: f64, comp: &Composition) -> Result<f64, PhysicsError> {
        Ok(self.factor * self.inner.kappa(rho, t, comp)?)
    }
}

impl<L: EnergyGeneration + ?Sized> EnergyGeneration for Scaled<L> {
    fn name(&self) -> String {
        format!("{}*{}", self.inner.name(), self.factor)
    }

    fn rate(&self, rho: f64, t: f64, comp: &Composition) -> Result<EnergyRate, PhysicsError> {
        let r = self.inner.rate(rho, t, comp)?;
        Ok(EnergyRate {
            eps_pp_erg_g_s: self.factor * r.eps_pp_erg_g_s,
            eps_cno_erg_g_s: self.factor * r.eps_cno_erg_g_s,
            ..r
        })
    }

    /// The inner law's: the factor scales the energy released, not the rates of the reactions
    /// that make and destroy 3He (a factor 0.509 on `sfactor` is the energy of a pp chain that
    /// stops at 3He, whose 3He reactions run as before).
    fn he3_equilibrium(
        &self,
        rho: f64,
        t: f64,
        comp: &Composition,
    ) -> Result<Option<He3Equilibrium>, PhysicsError> {
        self.inner.he3_equilibrium(rho, t, comp)
    }

    /// The inner law's (a factor within the allowed range does not lift 1e-30 to anything).
    fn negligible_at(&self, rho: f64, t: f64) -> bool {
        self.inner.negligible_at(rho, t)
    }
}
