//! The opacity of the `analytic` physics set, exactly as specified for reproduction by hand.

use super::{check_point, Opacity};
use crate::error::PhysicsError;
use crate::physics::composition::Composition;

/// kappa = 0.2 (1 + X) + (4.34e25 Z + 3.68e22 (1 - Z)) (1 + X) rho T^-3.5, cm^2 g^-1.
///
/// Electron scattering in its rounded textbook form 0.2 (1 + X) plus Kramers bound–free
/// (guillotine factor 1, Gaunt factor 1) and free–free opacity (e.g. Hansen & Kawaler 1994,
/// *Stellar Interiors*, §4.4; Kippenhahn & Weigert 1990, §17). Kept bit-for-bit so that other
/// people can reproduce models of this set by hand; `scale` multiplies the whole law.
#[derive(Debug, Clone, Copy)]
pub struct AnalyticOpacity {
    /// User scale factor (1 = as published).
    pub scale: f64,
}

impl Default for AnalyticOpacity {
    fn default() -> Self {
        Self { scale: 1.0 }
    }
}

impl Opacity for AnalyticOpacity {
    fn name(&self) -> String {
        if self.scale == 1.0 {
            "analytic".to_string()
        } else {
            format!("analytic*{}", self.scale)
        }
    }

    fn kappa(&self, rho: f64, t: f64, comp: &Composition) -> Result<f64, PhysicsError> {
        check_point("analytic", rho, t)?;
        let x = comp.x();
        let z = comp.z();
        let kramers = (4.34e25 * z + 3.68e22 * (1.0 - z)) * (1.0 + x) * rho * t.powf(-3.5);
        Ok(self.scale * (0.2 * (1.0 + x) + kramers))
    }
}
