//! `electron-scattering`: Thomson scattering on the free electrons of fully ionised matter.

use super::{check_point, Opacity};
use crate::constants::{M_U_G, SIGMA_T_CM2};
use crate::error::PhysicsError;
use crate::physics::composition::Composition;

/// kappa_es = (sigma_T / m_u) (1 + X) / 2 = 0.20031 (1 + X) cm^2 g^-1, computed from the CODATA
/// Thomson cross-section (e.g. Kippenhahn & Weigert 1990, eq. 17.2, where it is rounded to
/// 0.20 (1 + X)). Fully ionised matter, no Compton or collective corrections; any rho, T > 0.
#[derive(Debug, Clone, Copy, Default)]
pub struct ElectronScattering;

impl ElectronScattering {
    /// (sigma_T / m_u) (1 + X) / 2 for composition `comp`, cm^2 g^-1.
    pub fn kappa_cm2_g(comp: &Composition) -> f64 {
        SIGMA_T_CM2 / M_U_G * 0.5 * (1.0 + comp.x())
    }
}

impl Opacity for ElectronScattering {
    fn name(&self) -> String {
        "electron-scattering".to_string()
    }

    fn kappa(&self, rho: f64, t: f64, comp: &Composition) -> Result<f64, PhysicsError> {
        check_point("electron-scattering", rho, t)?;
        Ok(Self::kappa_cm2_g(comp))
    }
}
