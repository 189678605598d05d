//! Modes as found, and the separations measured from a set of them.
//!
//! Frequencies are dimensionless: sigma = omega sqrt(R^3/(G M)) (angular) and
//! nu~ = sigma/(2 pi) = nu sqrt(R^3/(G M)) (cyclic). For a star of mass M and radius R,
//! nu = nu~ sqrt(G M/R^3), with G M = (M/M_sun) G M_sun (IAU 2015 B3 nominal GM_sun) and
//! R = (R/R_sun) R_sun (nominal).

use super::asymptotic::asymptotic_values;
use super::eigenfunction::Eigenfunction;
use super::equilibrium::Equilibrium;
use crate::constants::{GM_SUN_CGS, R_SUN_CM};
use std::f64::consts::PI;

/// The kind of a mode, from its order (Eckart–Scuflaire–Osaki–Takata).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ModeKind {
    /// Pressure mode, order > 0 (every radial mode).
    P,
    /// Fundamental (surface-gravity) mode, order 0.
    F,
    /// Gravity mode, order < 0.
    G,
}

impl ModeKind {
    /// The kind of a mode of this order.
    pub fn of_order(order: i32) -> Self {
        match order {
            n if n > 0 => ModeKind::P,
            0 => ModeKind::F,
            _ => ModeKind::G,
        }
    }

    /// "p", "f" or "g".
    pub fn as_str(&self) -> &'static str {
        match self {
            ModeKind::P => "p",
            ModeKind::F => "f",
            ModeKind::G => "g",
        }
    }
}

/// One eigenmode.
#[derive(Debug, Clone, PartialEq)]
pub struct Mode {
    /// Spherical degree l.
    pub degree: u32,
    /// Order n (radial fundamental 1, f modes 0, g modes negative).
    pub order: i32,
    /// p, f or g.
    pub kind: ModeKind,
    /// sigma^2 = omega^2 R^3/(G M).
    pub sigma_squared: f64,
    /// Nodes of p type in the classification variables.
    pub nodes_p: u32,
    /// Nodes of g type.
    pub nodes_g: u32,
    /// Normalised inertia (module `eigenfunction`).
    pub inertia: f64,
    /// Eigenfunctions, when asked for.
    pub eigenfunction: Option<Eigenfunction>,
}

impl Mode {
    /// sigma = omega sqrt(R^3/(G M)).
    pub fn sigma(&self) -> f64 {
        self.sigma_squared.sqrt()
    }

    /// Cyclic frequency nu sqrt(R^3/(G M)) = sigma/(2 pi).
    pub fn cyclic_frequency(&self) -> f64 {
        self.sigma() / (2.0 * PI)
    }

    /// Period in units of sqrt(R^3/(G M)): 2 pi/sigma.
    pub fn period(&self) -> f64 {
        2.0 * PI / self.sigma()
    }

    /// Frequency in microhertz for a star of `mass_msun` and `radius_rsun`.
    pub fn frequency_uhz(&self, mass_msun: f64, radius_rsun: f64) -> f64 {
        self.cyclic_frequency() * dynamical_frequency_hz(mass_msun, radius_rsun) * 1e6
    }
}

/// sqrt(G M/R^3) in s^-1 for a star of `mass_msun` and `radius_rsun`.
pub fn dynamical_frequency_hz(mass_msun: f64, radius_rsun: f64) -> f64 {
    (mass_msun * GM_SUN_CGS / (radius_rsun * R_SUN_CM).powi(3)).sqrt()
}

/// The mode of `degree` and `order`, if present.
pub fn find(modes: &[Mode], degree: u32, order: i32) -> Option<&Mode> {
    modes
        .iter()
        .find(|m| m.degree == degree && m.order == order)
}

/// Large separation from the radial modes near `around` (cyclic, nu~): the least-squares slope
/// of nu~ against order over the radial modes whose orders lie within `half_width` of the
/// radial mode nearest to `around` (fewer at the ends of the available orders). `None` with
/// fewer than two such modes.
pub fn large_separation_near(modes: &[Mode], around: f64, half_width: u32) -> Option<f64> {
    let nearest = nearest_radial(modes, around)?;
    let window: Vec<(f64, f64)> = modes
        .iter()
        .filter(|m| m.degree == 0 && (m.order - nearest.order).unsigned_abs() <= half_width)
        .map(|m| (f64::from(m.order), m.cyclic_frequency()))
        .collect();
    if window.len() < 2 {
        return None;
    }
    let k = window.len() as f64;
    let mean_n = window.iter().map(|p| p.0).sum::<f64>() / k;
    let mean_nu = window.iter().map(|p| p.1).sum::<f64>() / k;
    let sxy: f64 = window
        .iter()
        .map(|p| (p.0 - mean_n) * (p.1 - mean_nu))
        .sum();
    let sxx: f64 = window.iter().map(|p| (p.0 - mean_n).powi(2)).sum();
    Some(sxy / sxx)
}

/// Small separation d02 = nu~(n, 0) - nu~(n-1, 2) at the radial mode n nearest to `around`.
/// `None` if either mode is missing.
pub fn small_separation_near(modes: &[Mode], around: f64) -> Option<f64> {
    let radial = nearest_radial(modes, around)?;
    let quadrupole = find(modes, 2, radial.order - 1)?;
    Some(radial.cyclic_frequency() - quadrupole.cyclic_frequency())
}

fn nearest_radial(modes: &[Mode], around: f64) -> Option<&Mode> {
    modes.iter().filter(|m| m.degree == 0).min_by(|a, b| {
        (a.cyclic_frequency() - around)
            .abs()
            .total_cmp(&(b.cyclic_frequency() - around).abs())
    })
}

/// The seismic quantities of a model and its modes, dimensionless (module documentation).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SeismicSummary {
    /// Asymptotic large separation Delta nu sqrt(R^3/(G M)) = (2 int dx/c~)^-1.
    pub large_separation_asymptotic: f64,
    /// Large separation from the radial modes around `around` ([`large_separation_near`] with a
    /// half-width of [`SEPARATION_HALF_WIDTH`] orders); `None` without two radial modes.
    pub large_separation_radial: Option<f64>,
    /// d02 = nu~(n, 0) - nu~(n-1, 2) at the radial mode nearest `around`; `None` if either mode
    /// is missing.
    pub small_separation_d02: Option<f64>,
    /// Asymptotic g-mode period spacing Pi_0 sqrt(G M/R^3); `None` without a g-mode cavity.
    pub period_spacing_asymptotic: Option<f64>,
    /// The cyclic frequency nu~ around which the separations are measured.
    pub around: Option<f64>,
}

/// Half-width, in radial orders, of the window of [`SeismicSummary::large_separation_radial`].
pub const SEPARATION_HALF_WIDTH: u32 = 3;

impl SeismicSummary {
    /// The summary of `model` and its `modes`, with the separations measured around the cyclic
    /// frequency `around` (nu~); without `around` only the asymptotic quantities are given.
    pub fn new(model: &dyn Equilibrium, modes: &[Mode], around: Option<f64>) -> Self {
        let asymptotic = asymptotic_values(model);
        Self {
            large_separation_asymptotic: asymptotic.large_separation,
            large_separation_radial: around
                .and_then(|f| large_separation_near(modes, f, SEPARATION_HALF_WIDTH)),
            small_separation_d02: around.and_then(|f| small_separation_near(modes, f)),
            period_spacing_asymptotic: asymptotic.period_spacing(),
            around,
        }
    }
}
