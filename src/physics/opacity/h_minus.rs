//! `h-minus`: the negative hydrogen ion, which dominates cool stellar envelopes.

use super::{check_point, Opacity};
use crate::error::PhysicsError;
use crate::physics::composition::Composition;

/// Smallest temperature accepted by the stand-alone law, K.
pub const H_MINUS_T_MIN_K: f64 = 2.0e3;
/// Largest temperature accepted by the stand-alone law, K.
pub const H_MINUS_T_MAX_K: f64 = 1.0e4;
/// Largest density accepted by the stand-alone law, g cm^-3.
pub const H_MINUS_RHO_MAX_G_CM3: f64 = 1.0e-2;

/// kappa_H- = 2.5e-31 (Z / 0.02) rho^(1/2) T^9 cm^2 g^-1 (Hansen & Kawaler 1994, *Stellar
/// Interiors*, ch. 4; fit for 3000 < T < 6000 K, 1e-10 < rho < 1e-5 g/cm^3, X ~ 0.7; the
/// metals supply the free electrons, so Z = 0 gives 0).
///
/// The stand-alone law accepts 2e3 <= T <= 1e4 K and rho <= 1e-2 g/cm^3 (a little wider than the
/// fit, documented) and errors outside; [`super::RefinedOpacity`] uses [`HMinus::formula`] at
/// every T inside its smooth combination, where other terms take over outside that range.
#[derive(Debug, Clone, Copy, Default)]
pub struct HMinus;

impl HMinus {
    /// The fit itself, without domain checks.
    pub fn formula(rho: f64, t: f64, comp: &Composition) -> f64 {
        Self::formula_with_z(rho, t, comp.z())
    }

    /// The fit for metal mass fraction `z`, without domain checks.
    pub fn formula_with_z(rho: f64, t: f64, z: f64) -> f64 {
        2.5e-31 * (z / 0.02) * rho.sqrt() * t.powi(9)
    }
}

impl Opacity for HMinus {
    fn name(&self) -> String {
        "h-minus".to_string()
    }

    fn kappa(&self, rho: f64, t: f64, comp: &Composition) -> Result<f64, PhysicsError> {
        check_point("h-minus", rho, t)?;
        if !(H_MINUS_T_MIN_K..=H_MINUS_T_MAX_K).contains(&t) || rho > H_MINUS_RHO_MAX_G_CM3 {
            return Err(PhysicsError::new(
                "h-minus",
                format!(
                    "outside the law's domain {H_MINUS_T_MIN_K:e} <= T <= {H_MINUS_T_MAX_K:e} K, rho <= {H_MINUS_RHO_MAX_G_CM3:e} g/cm^3"
                ),
                rho,
                t,
            ));
        }
        Ok(Self::formula(rho, t, comp))
    }
}
