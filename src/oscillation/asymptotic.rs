//! Asymptotic seismic quantities of a model (Tassoul 1980, ApJS 43, 469; memory, see
//! docs/references.md §8.6), dimensionless:
//!
//! - the large separation Delta nu = (2 int_0^R dr/c)^-1, reported as Delta nu sqrt(R^3/(G M))
//!   = 1/(2 int_0^1 dx/c~) with c~^2 = c^2 R/(G M) = Gamma_1/(c1 V/x^2);
//! - the buoyancy integral int N dr/r over the region where N^2 > 0, in units of
//!   sqrt(G M/R^3): int N~ dx/x with N~^2 = A*/c1;
//! - the asymptotic g-mode period spacing Pi_0 = 2 pi^2 (int N dr/r)^-1, in units of
//!   sqrt(R^3/(G M)); modes of degree l are spaced by Pi_0/sqrt(l(l+1)) in period.
//!
//! The integrals use five-point Gauss–Legendre quadrature on each model interval, the last one
//! in the variable t with x = 1 - (1 - x_a) t^2, which removes the (1 - x)^(-1/2) singularity of
//! both integrands at a surface where the pressure vanishes. Where N^2 changes sign the
//! integrand max(N~, 0)/x has a kink and the quadrature is only accurate to O(h^1.5) there.

use super::equilibrium::{Equilibrium, StructurePoint};

/// Five-point Gauss–Legendre nodes on [0, 1].
const NODES5: [f64; 5] = [
    0.046_910_077_030_668_0,
    0.230_765_344_947_158_45,
    0.5,
    0.769_234_655_052_841_6,
    0.953_089_922_969_332,
];
/// Their weights.
const WEIGHTS5: [f64; 5] = [
    0.118_463_442_528_094_54,
    0.239_314_335_249_683_23,
    0.284_444_444_444_444_4,
    0.239_314_335_249_683_23,
    0.118_463_442_528_094_54,
];

/// The asymptotic quantities of one model (module documentation).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AsymptoticValues {
    /// Delta nu sqrt(R^3/(G M)) = 1/(2 int dx/c~).
    pub large_separation: f64,
    /// int N~ dx/x over N^2 > 0, in units of sqrt(G M/R^3); zero without a g-mode cavity.
    pub buoyancy_integral: f64,
}

impl AsymptoticValues {
    /// Pi_0 sqrt(G M/R^3) = 2 pi^2/int N~ dx/x; `None` without a g-mode cavity.
    pub fn period_spacing(&self) -> Option<f64> {
        (self.buoyancy_integral > 0.0)
            .then(|| 2.0 * std::f64::consts::PI.powi(2) / self.buoyancy_integral)
    }
}

/// Integrate `f(x, point)` from 0 to 1 over the model's intervals (module documentation).
fn integrate<F: Fn(f64, &StructurePoint) -> f64>(model: &dyn Equilibrium, f: F) -> f64 {
    let b = model.breakpoints();
    let last = b.len() - 2;
    let mut total = 0.0;
    for i in 0..=last {
        let (xa, xb) = (b[i], b[i + 1]);
        for (t, weight) in NODES5.iter().zip(WEIGHTS5) {
            if i == last {
                let depth = 1.0 - xa;
                let x = 1.0 - depth * t * t;
                total += weight * 2.0 * depth * t * f(x, &model.point(i, x));
            } else {
                let x = xa + t * (xb - xa);
                total += weight * (xb - xa) * f(x, &model.point(i, x));
            }
        }
    }
    total
}

/// The asymptotic quantities of `model`.
pub fn asymptotic_values(model: &dyn Equilibrium) -> AsymptoticValues {
    let acoustic = integrate(model, |_, p| 1.0 / p.sound_speed_squared().sqrt());
    let buoyancy = integrate(model, |x, p| p.buoyancy_squared().max(0.0).sqrt() / x);
    AsymptoticValues {
        large_separation: 0.5 / acoustic,
        buoyancy_integral: buoyancy,
    }
}
