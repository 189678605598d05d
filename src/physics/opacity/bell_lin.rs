//! `bell-lin`: the piecewise power-law Rosseland opacity of Bell & Lin (1994), and its
//! molecular term, which [`super::RefinedOpacity`] uses below ~4000 K.

use super::{check_point, Opacity};
use crate::error::PhysicsError;
use crate::numerics::smooth::smooth_max;
use crate::physics::composition::Composition;

/// One regime kappa = kappa0 rho^a T^b, cm^2 g^-1.
#[derive(Debug, Clone, Copy)]
struct Regime {
    kappa0: f64,
    a: f64,
    b: f64,
}

impl Regime {
    fn kappa(&self, rho: f64, t: f64) -> f64 {
        self.kappa0 * rho.powf(self.a) * t.powf(self.b)
    }
}

/// Bell & Lin (1994, ApJ 427, 987) regimes from metal grains up (coefficients from memory,
/// supported by their computed regime bounds; docs/references.md §8.3).
const METAL_GRAINS: Regime = Regime {
    kappa0: 0.1,
    a: 0.0,
    b: 0.5,
};
const METAL_EVAPORATION: Regime = Regime {
    kappa0: 2e81,
    a: 1.0,
    b: -24.0,
};
const MOLECULES: Regime = Regime {
    kappa0: 1e-8,
    a: 2.0 / 3.0,
    b: 3.0,
};
const H_SCATTERING: Regime = Regime {
    kappa0: 1e-36,
    a: 1.0 / 3.0,
    b: 10.0,
};
const BOUND_FREE: Regime = Regime {
    kappa0: 1.5e20,
    a: 1.0,
    b: -2.5,
};
const ELECTRON_SCATTERING: f64 = 0.348;

/// Metallicity of the solar mixture the fit was made for (Bell & Lin use solar abundances).
pub const BELL_LIN_Z: f64 = 0.02;

/// Smallest and largest temperature accepted by the stand-alone law, K (above the ice regimes).
pub const BELL_LIN_T_RANGE_K: (f64, f64) = (300.0, 1.0e6);
/// Smallest and largest density accepted by the stand-alone law, g cm^-3 (the published range).
pub const BELL_LIN_RHO_RANGE_G_CM3: (f64, f64) = (1e-20, 1e-4);

/// Width of the rounded corners between regimes: exact outside a factor 1/0.9 of a crossing.
const CORNER: f64 = 0.9;

/// A twice-differentiable min of positive numbers, a b / smooth_max(a, b).
fn smooth_min(a: f64, b: f64) -> f64 {
    a * b / smooth_max(a, b, CORNER)
}

/// The molecular regime of Bell & Lin (1994), kappa = 1e-8 rho^(2/3) T^3 cm^2 g^-1 (solar
/// mixture; water and other molecules, fitted for T up to 1e4 rho^(1/21) K, rho <= 1e-4).
pub fn molecular_kappa(rho: f64, t: f64) -> f64 {
    MOLECULES.kappa(rho, t)
}

/// Bell & Lin (1994) piecewise Rosseland mean for a solar mixture, from metal grains up:
/// kappa = kappa0 rho^a T^b in the regimes metal grains (0.1, 0, 1/2), metal-grain evaporation
/// (2e81, 1, -24), molecules (1e-8, 2/3, 3), H- "H scattering" (1e-36, 1/3, 10), bound–free and
/// free–free (1.5e20, 1, -5/2) and electron scattering (0.348), each used between the
/// temperatures where it meets its neighbours (docs/references.md §8.3); the corners are rounded
/// over a factor 1/0.9 in kappa so that the law is smooth. Composition is fixed (the fit's solar
/// mixture): X and Z are ignored.
///
/// Domain: 300 <= T <= 1e6 K and 1e-20 <= rho <= 1e-4 g/cm^3 (the fitted range; the ice
/// regimes below 203 K are left out); errors outside. For stellar interiors use `refined`.
#[derive(Debug, Clone, Copy, Default)]
pub struct BellLin;

impl BellLin {
    /// The piecewise law without domain checks.
    pub fn formula(rho: f64, t: f64) -> f64 {
        let grains = smooth_min(METAL_GRAINS.kappa(rho, t), METAL_EVAPORATION.kappa(rho, t));
        let cool = smooth_max(
            smooth_max(grains, MOLECULES.kappa(rho, t), CORNER),
            H_SCATTERING.kappa(rho, t),
            CORNER,
        );
        smooth_min(
            cool,
            smooth_max(BOUND_FREE.kappa(rho, t), ELECTRON_SCATTERING, CORNER),
        )
    }
}

impl Opacity for BellLin {
    fn name(&self) -> String {
        "bell-lin".to_string()
    }

    fn kappa(&self, rho: f64, t: f64, _comp: &Composition) -> Result<f64, PhysicsError> {
        check_point("bell-lin", rho, t)?;
        let (tlo, thi) = BELL_LIN_T_RANGE_K;
        let (rlo, rhi) = BELL_LIN_RHO_RANGE_G_CM3;
        if !(tlo..=thi).contains(&t) || !(rlo..=rhi).contains(&rho) {
            return Err(PhysicsError::new(
                "bell-lin",
                format!(
                    "outside the law's domain {tlo:e} <= T <= {thi:e} K, {rlo:e} <= rho <= {rhi:e} g/cm^3"
                ),
                rho,
                t,
            ));
        }
        Ok(Self::formula(rho, t))
    }
}
