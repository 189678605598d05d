//! Convection: the Schwarzschild criterion and the actual temperature gradient nabla.

use crate::constants::{A_RAD_CGS, C_CM_S, G_CGS};
use crate::error::PhysicsError;

pub mod adiabatic;
pub mod mlt;

pub use adiabatic::Adiabatic;
pub use mlt::MixingLength;

/// Local conditions a convection law needs, all in cgs.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ConvectionPoint {
    /// Radiative gradient nabla_rad.
    pub nabla_rad: f64,
    /// Adiabatic gradient nabla_ad.
    pub nabla_ad: f64,
    /// Pressure P, dyn cm^-2.
    pub pressure_dyn_cm2: f64,
    /// Temperature T, K.
    pub temperature_k: f64,
    /// Density rho, g cm^-3.
    pub density_g_cm3: f64,
    /// Local gravity g = G m / r^2, cm s^-2.
    pub gravity_cm_s2: f64,
    /// Opacity kappa, cm^2 g^-1.
    pub opacity_cm2_g: f64,
    /// Specific heat at constant pressure, erg g^-1 K^-1.
    pub cp_erg_g_k: f64,
    /// delta = -(dln rho / dln T)_P.
    pub delta: f64,
}

impl ConvectionPoint {
    /// Schwarzschild criterion: the layer is convective where nabla_rad > nabla_ad.
    pub fn is_convective(&self) -> bool {
        self.nabla_rad > self.nabla_ad
    }
}

/// A convection law: the actual gradient nabla where the layer is convectively unstable.
pub trait Convection: Send + Sync + std::fmt::Debug {
    /// The law's name as a user selects it, with its parameters (e.g. `mlt:alpha=1.8`).
    fn name(&self) -> String;

    /// The actual temperature gradient nabla = dln T / dln P. Where the layer is stable
    /// (nabla_rad <= nabla_ad) every law returns nabla_rad.
    fn nabla(&self, point: &ConvectionPoint) -> Result<f64, PhysicsError>;
}

/// Radiative gradient nabla_rad = 3 kappa L P / (16 pi a c G m T^4)
/// (Kippenhahn & Weigert 1990, eq. 5.28).
pub fn nabla_rad(
    opacity_cm2_g: f64,
    luminosity_erg_s: f64,
    pressure_dyn_cm2: f64,
    mass_g: f64,
    temperature_k: f64,
) -> f64 {
    3.0 * opacity_cm2_g * luminosity_erg_s * pressure_dyn_cm2
        / (16.0
            * std::f64::consts::PI
            * A_RAD_CGS
            * C_CM_S
            * G_CGS
            * mass_g
            * temperature_k.powi(4))
}
