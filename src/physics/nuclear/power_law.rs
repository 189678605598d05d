//! `power-law`: eps = eps0 rho X^2 (T / T0)^nu, for homology experiments.

use super::{EnergyGeneration, EnergyRate};
use crate::error::{Error, PhysicsError, Result};
use crate::physics::composition::Composition;
use crate::physics::opacity::check_point;

/// eps = eps0 rho X^2 (T / T0)^nu erg g^-1 s^-1, all of it reported as the pp part (eps_CNO = 0,
/// nu_pp = nu, nu_CNO = 0). The textbook homology form (e.g. Kippenhahn & Weigert 1990, §20).
/// Any rho, T > 0.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PowerLawRates {
    eps0: f64,
    t0_k: f64,
    nu: f64,
}

/// Default reference temperature T0 of `power-law`, K.
pub const DEFAULT_T0_K: f64 = 1.5e7;
/// Default exponent nu of `power-law` (the pp chain near 1.5e7 K; textbook value).
pub const DEFAULT_NU: f64 = 4.0;

/// Default eps0 of `power-law`: the `analytic` pp rate per unit rho X^2 at T0 = 1.5e7 K,
/// 2.38e6 T6^(-2/3) exp(-33.80 T6^(-1/3)) = 0.437 erg cm^3 g^-2 s^-1 (Kippenhahn & Weigert 1990,
/// §18.5), so that `power-law` with its defaults matches the analytic pp chain at 15 MK.
pub fn default_eps0() -> f64 {
    let t6 = DEFAULT_T0_K * 1e-6;
    2.38e6 * t6.powf(-2.0 / 3.0) * (-33.80 * t6.powf(-1.0 / 3.0)).exp()
}

impl PowerLawRates {
    /// The law with coefficient `eps0` (erg cm^3 g^-2 s^-1, > 0), reference temperature `t0_k`
    /// (K, > 0) and exponent `nu` (finite).
    pub fn new(eps0: f64, t0_k: f64, nu: f64) -> Result<Self> {
        let allowed = "power-law:eps0=E,t0=T,nu=N with E > 0, T > 0 K, N finite, e.g. power-law:eps0=0.1,t0=1.5e7,nu=4";
        if !(eps0.is_finite() && eps0 > 0.0) {
            return Err(Error::invalid("eps0", eps0, allowed));
        }
        if !(t0_k.is_finite() && t0_k > 0.0) {
            return Err(Error::invalid("t0", t0_k, allowed));
        }
        if !nu.is_finite() {
            return Err(Error::invalid("nu", nu, allowed));
        }
        Ok(Self { eps0, t0_k, nu })
    }
}

impl EnergyGeneration for PowerLawRates {
    fn name(&self) -> String {
        format!(
            "power-law:eps0={},t0={},nu={}",
            self.eps0, self.t0_k, self.nu
        )
    }

    fn rate(&self, rho: f64, t: f64, comp: &Composition) -> Result<EnergyRate, PhysicsError> {
        check_point("power-law", rho, t)?;
        let x = comp.x();
        let eps = self.eps0 * rho * x * x * (t / self.t0_k).powf(self.nu);
        if !eps.is_finite() {
            return Err(PhysicsError::new("power-law", "rate overflows", rho, t));
        }
        Ok(EnergyRate {
            eps_pp_erg_g_s: eps,
            eps_cno_erg_g_s: 0.0,
            nu_pp: self.nu,
            nu_cno: 0.0,
        })
    }
}
