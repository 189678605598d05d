//! The textbook analytic pp and CNO rates of the `analytic` physics set.

use super::{EnergyGeneration, EnergyRate};
use crate::error::PhysicsError;
use crate::numerics::cube_root::cbrt;
use crate::physics::composition::Composition;
use crate::physics::opacity::check_point;

/// eps_pp = 2.38e6 rho X^2 T6^(-2/3) exp(-33.80 T6^(-1/3)) and
/// eps_CNO = 8.67e27 rho X X_CNO T6^(-2/3) exp(-152.28 T6^(-1/3)), erg g^-1 s^-1, no screening
/// and no higher-order factors (Kippenhahn & Weigert 1990, §18.5, with psi = f = g = 1).
///
/// The temperature exponent of either term is nu = -2/3 + (B/3) T6^(-1/3) for a rate
/// proportional to T6^(-2/3) exp(-B T6^(-1/3)). `scale` multiplies both parts.
#[derive(Debug, Clone, Copy)]
pub struct AnalyticRates {
    /// User scale factor (1 = as published).
    pub scale: f64,
}

impl Default for AnalyticRates {
    fn default() -> Self {
        Self { scale: 1.0 }
    }
}

/// Coefficient and Gamow constant B of the pp term.
const PP: (f64, f64) = (2.38e6, 33.80);
/// Coefficient and Gamow constant B of the CNO term.
const CNO: (f64, f64) = (8.67e27, 152.28);

/// T6^(-2/3) exp(-B T6^(-1/3)) and its logarithmic temperature derivative.
fn gamow_factor(t6: f64, b: f64) -> (f64, f64) {
    let t13 = cbrt(t6);
    let value = (-b / t13).exp() / (t13 * t13);
    (value, -2.0 / 3.0 + b / (3.0 * t13))
}

impl EnergyGeneration for AnalyticRates {
    fn name(&self) -> String {
        if self.scale == 1.0 {
            "analytic".to_string()
        } else {
            format!("analytic*{}", self.scale)
        }
    }

    fn rate(&self, rho: f64, t: f64, comp: &Composition) -> Result<EnergyRate, PhysicsError> {
        check_point("analytic", rho, t)?;
        let t6 = t * 1e-6;
        let x = comp.x();
        let (g_pp, nu_pp) = gamow_factor(t6, PP.1);
        let (g_cno, nu_cno) = gamow_factor(t6, CNO.1);
        Ok(EnergyRate {
            eps_pp_erg_g_s: self.scale * PP.0 * rho * x * x * g_pp,
            eps_cno_erg_g_s: self.scale * CNO.0 * rho * x * comp.x_cno() * g_cno,
            nu_pp,
            nu_cno,
        })
    }
}
