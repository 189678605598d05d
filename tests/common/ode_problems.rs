//! Test problems for the ODE integrator with their reference solutions, shared by
//! `tests/ode_dop853.rs` and `benches/ode.rs` (each source beside its values; docs/references.md
//! §9).
#![allow(dead_code)]
// The published digits are kept, beyond what an f64 holds.
#![allow(clippy::excessive_precision)]

use nalgebra::SVector;

/// Arenstorf's periodic orbit of the restricted three-body problem (Earth, Moon, satellite),
/// in the rotating frame: Hairer, Nørsett & Wanner 1993, §II.0, eq. (0.1) with the initial
/// values and period of eq. (0.2) (docs/references.md §9; memory, checked here by the orbit
/// closing). State (y1, y2, y1', y2').
pub mod arenstorf {
    use super::SVector;

    /// Reduced mass of the Moon.
    pub const MU: f64 = 0.012_277_471;
    /// Period of the orbit.
    pub const PERIOD: f64 = 17.065_216_560_157_962_558_891_720_624_9;
    /// y1(0), y2(0), y1'(0), y2'(0).
    pub const Y0: [f64; 4] = [0.994, 0.0, 0.0, -2.001_585_106_379_082_522_405_378_622_24];

    /// y1'' = y1 + 2 y2' - mu' (y1 + mu)/D1 - mu (y1 - mu')/D2,
    /// y2'' = y2 - 2 y1' - mu' y2/D1 - mu y2/D2, D_k = ((y1 +- ...)^2 + y2^2)^(3/2), mu' = 1 - mu.
    pub fn rhs(y: &SVector<f64, 4>, dy: &mut SVector<f64, 4>) {
        let mu1 = 1.0 - MU;
        let d1 = ((y[0] + MU).powi(2) + y[1] * y[1]).powf(1.5);
        let d2 = ((y[0] - mu1).powi(2) + y[1] * y[1]).powf(1.5);
        dy[0] = y[2];
        dy[1] = y[3];
        dy[2] = y[0] + 2.0 * y[3] - mu1 * (y[0] + MU) / d1 - MU * (y[0] - mu1) / d2;
        dy[3] = y[1] - 2.0 * y[2] - mu1 * y[1] / d1 - MU * y[1] / d2;
    }
}

/// The n = 3 Lane–Emden equation theta'' + (2/xi) theta' + theta^3 = 0 as (theta, theta') in
/// xi, started off the centre by its series theta = 1 - xi^2/6 + n xi^4/120 (textbook;
/// docs/references.md §1). It reads xi explicitly. First zero xi_1 = 6.896848619 (§1).
pub mod lane_emden_n3 {
    use super::SVector;

    /// Start of the integration, off the singular centre.
    pub const XI_START: f64 = 1e-3;
    /// First zero of theta for n = 3 (docs/references.md §1).
    pub const XI_1: f64 = 6.896_848_619;

    /// (theta, theta') at `XI_START` from the series.
    pub fn start() -> SVector<f64, 2> {
        let x = XI_START;
        SVector::from([
            1.0 - x * x / 6.0 + 3.0 * x.powi(4) / 120.0,
            -x / 3.0 + 12.0 * x.powi(3) / 120.0,
        ])
    }

    /// theta' and theta'' = -theta^3 - 2 theta'/xi (theta taken as |theta| past the zero).
    pub fn rhs(xi: f64, y: &SVector<f64, 2>, dy: &mut SVector<f64, 2>) {
        dy[0] = y[1];
        dy[1] = -y[0].abs().powi(3) - 2.0 * y[1] / xi;
    }
}
