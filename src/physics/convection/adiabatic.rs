//! Adiabatic convection: nabla = nabla_ad wherever the Schwarzschild criterion says convective.

use super::{Convection, ConvectionPoint};
use crate::error::PhysicsError;

/// nabla = min(nabla_rad, nabla_ad): the limit of perfectly efficient convection (common
/// practice for stellar interiors, e.g. Kippenhahn & Weigert 1990, §7.3).
#[derive(Debug, Clone, Copy, Default)]
pub struct Adiabatic;

impl Convection for Adiabatic {
    fn name(&self) -> String {
        "adiabatic".to_string()
    }

    fn nabla(&self, p: &ConvectionPoint) -> Result<f64, PhysicsError> {
        Ok(p.nabla_rad.min(p.nabla_ad))
    }
}
