//! Rosseland-mean opacity laws, kappa(rho, T, X, Z) in cm^2 g^-1.

use super::composition::Composition;
use crate::error::PhysicsError;

pub mod analytic;
pub mod bell_lin;
pub mod conductive;
pub mod electron_scattering;
pub mod h_minus;
pub mod kramers;
pub mod refined;
pub mod table;

pub use analytic::AnalyticOpacity;
pub use bell_lin::BellLin;
pub use conductive::Conductive;
pub use electron_scattering::ElectronScattering;
pub use h_minus::HMinus;
pub use kramers::Kramers;
pub use refined::RefinedOpacity;
pub use table::TableOpacity;

/// An opacity law.
pub trait Opacity: Send + Sync + std::fmt::Debug {
    /// The law's name as a user selects it, with its parameters (e.g. `kramers:guillotine=1`).
    fn name(&self) -> String;

    /// A caution when (rho, T) lies where the law still returns a value but is used beyond what
    /// it describes well (a fit outside its range, a table's edge value); `None` inside. A
    /// model that visits such points carries the caution as a warning.
    fn caution(
        &self,
        _rho_g_cm3: f64,
        _temperature_k: f64,
        _comp: &Composition,
    ) -> Option<&'static str> {
        None
    }

    /// Temperatures (K) where kappa is only twice differentiable in T, whatever the density:
    /// the ends of the law's smooth switches in temperature. An embedded Runge–Kutta error
    /// estimate does not see such a kink, so an integration along T(tau) restarts there
    /// (`structure::surface`), in increasing order. Empty (the default) for a law smooth in T.
    fn temperature_breaks_k(&self) -> &'static [f64] {
        &[]
    }

    /// Rosseland-mean opacity kappa, cm^2 g^-1, at density `rho_g_cm3` and temperature
    /// `temperature_k`. Errors (never NaN) outside the law's domain.
    fn kappa(
        &self,
        rho_g_cm3: f64,
        temperature_k: f64,
        comp: &Composition,
    ) -> Result<f64, PhysicsError>;
}

/// Check that (rho, T) is finite and positive; every law starts with this.
pub fn check_point(law: &str, rho_g_cm3: f64, temperature_k: f64) -> Result<(), PhysicsError> {
    if rho_g_cm3.is_finite() && temperature_k.is_finite() && rho_g_cm3 > 0.0 && temperature_k > 0.0
    {
        Ok(())
    } else {
        Err(PhysicsError::new(
            law,
            "density and temperature must be finite and positive",
            rho_g_cm3,
            temperature_k,
        ))
    }
}
