//! A polytrope scaled to a star of given mass, radius and mean molecular weight.
//!
//! With rho_c = (rho_c/rho_mean) 3M/(4 pi R^3), P_c = W_n G M^2/R^4 and, for an ideal gas,
//! T_c = Theta_n mu m_u G M/(k R), the profile follows from theta (Chandrasekhar 1939, *An
//! Introduction to the Study of Stellar Structure*, ch. IV):
//! r = R xi/xi_1, rho = rho_c theta^n, P = P_c theta^(n+1), T = T_c theta and
//! m(xi) = M xi^2 |theta'(xi)| / (xi_1^2 |theta'(xi_1)|).
//! In Eddington's standard model (n = 3, [`super::eddington`]) P is the total pressure, the gas
//! carries beta P, and T_c = beta Theta_3 mu m_u G M/(k R); T = T_c theta still holds.

use super::eddington::eddington_beta;
use super::solution::LaneEmdenSolution;
use super::{check_mass_msun, check_mu, check_positive};
use crate::constants::{G_CGS, K_B_ERG_K, M_SUN_G, M_U_G, R_SUN_CM};
use crate::error::{Error, Result};
use std::f64::consts::PI;

/// Default mean molecular weight, 0.61: fully ionised gas of roughly solar composition
/// (1/mu = 2X + 3Y/4 + Z/2 with X = 0.70, Y = 0.28, Z = 0.02 gives mu = 0.617; 0.61 is the
/// common textbook round value; common practice, no source).
pub const DEFAULT_MU: f64 = 0.61;

/// Mass, radius and mean molecular weight of the star a polytrope is scaled to.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StarParameters {
    mass_msun: f64,
    radius_rsun: f64,
    mu: f64,
}

impl StarParameters {
    /// `mass_msun` in solar masses (M_sun = GM_sun/G, IAU 2015 B3), `radius_rsun` in nominal
    /// solar radii, `mu` the mean molecular weight in units of m_u. Each must be positive and
    /// finite, else [`Error::InvalidInput`] naming `--mass`, `--radius` or `--mu`.
    pub fn new(mass_msun: f64, radius_rsun: f64, mu: f64) -> Result<Self> {
        Ok(Self {
            mass_msun: check_mass_msun(mass_msun)?,
            radius_rsun: check_positive(
                "radius_rsun",
                radius_rsun,
                "the radius must be a positive number of solar radii, e.g. 1",
            )?,
            mu: check_mu(mu)?,
        })
    }

    /// Mass in solar masses.
    pub fn mass_msun(&self) -> f64 {
        self.mass_msun
    }
    /// Radius in solar radii.
    pub fn radius_rsun(&self) -> f64 {
        self.radius_rsun
    }
    /// Mean molecular weight (units of m_u).
    pub fn mu(&self) -> f64 {
        self.mu
    }
    /// Mass in g.
    pub fn mass_g(&self) -> f64 {
        self.mass_msun * M_SUN_G
    }
    /// Radius in cm.
    pub fn radius_cm(&self) -> f64 {
        self.radius_rsun * R_SUN_CM
    }
}

/// Check that index `n` can be scaled to a star, with Eddington's standard model if
/// `radiation`: with `radiation`, n = 3 (error names `--radiation`); and n < 5 (n = 5 has no
/// finite radius; error names `--index`).
pub fn validate_scaling(n: f64, radiation: bool) -> Result<()> {
    if radiation && n != 3.0 {
        return Err(Error::invalid(
            "radiation",
            format!("with index {n}"),
            "Eddington's standard model is the n = 3 polytrope; use index 3 or leave out the radiation pressure",
        ));
    }
    if n.is_nan() || n >= 5.0 {
        return Err(Error::invalid(
            "index",
            n,
            "a star of finite radius needs an index below 5 (n = 5 has no surface); \
             choose n < 5 or leave out the mass and radius",
        ));
    }
    Ok(())
}

/// One point of the physical profile, matching one [`super::ProfilePoint`].
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PhysicalPoint {
    /// Radius r = R xi/xi_1, cm.
    pub radius_cm: f64,
    /// r / R.
    pub r_over_r: f64,
    /// Mass inside r, g.
    pub mass_g: f64,
    /// m(r) / M.
    pub m_over_m: f64,
    /// Density rho_c theta^n, g cm^-3.
    pub density_g_cm3: f64,
    /// Total pressure P_c theta^(n+1), dyn cm^-2.
    pub pressure_dyn_cm2: f64,
    /// Temperature T_c theta, K.
    pub temperature_k: f64,
}

/// A polytrope scaled to a star.
#[derive(Debug, Clone, PartialEq)]
pub struct ScaledPolytrope {
    /// The star's mass, radius and mu.
    pub star: StarParameters,
    /// Central density, g cm^-3.
    pub central_density_g_cm3: f64,
    /// Central (total) pressure W_n G M^2/R^4, dyn cm^-2.
    pub central_pressure_dyn_cm2: f64,
    /// Central temperature, K: ideal gas, or times beta in Eddington's standard model.
    pub central_temperature_k: f64,
    /// Gas-pressure fraction beta of Eddington's standard model; `None` for a pure ideal gas.
    pub beta: Option<f64>,
    /// Gravitational potential energy Omega = -(3/(5-n)) G M^2/R, erg.
    pub potential_energy_erg: f64,
    /// The physical profile, one point per point of the dimensionless profile.
    pub profile: Vec<PhysicalPoint>,
}

/// theta^n for the density: max(theta, 0)^n, with 0^0 = 1 (uniform density for n = 0).
fn density_factor(theta: f64, n: f64) -> f64 {
    theta.max(0.0).powf(n)
}

/// Scale `solution` to the star `star`; with `radiation`, use Eddington's standard model
/// (n = 3 only).
///
/// Errors ([`Error::InvalidInput`]): n = 5 (no finite radius; names `--index`); `radiation`
/// with n != 3 (names `--radiation`).
pub fn scale_to_star(
    solution: &LaneEmdenSolution,
    star: &StarParameters,
    radiation: bool,
) -> Result<ScaledPolytrope> {
    let n = solution.index;
    validate_scaling(n, radiation)?;
    let (Some(xi1), Some(slope1), Some(density_ratio), Some(w_n), Some(theta_n), Some(pe)) = (
        solution.xi1,
        solution.dtheta_dxi_at_xi1,
        solution.rho_c_over_rho_mean,
        solution.w_n,
        solution.theta_n,
        solution.potential_energy_coefficient,
    ) else {
        return Err(Error::invalid(
            "index",
            n,
            "a star of finite radius needs an index below 5",
        ));
    };
    let star = StarParameters::new(star.mass_msun, star.radius_rsun, star.mu)?;
    let (m, r) = (star.mass_g(), star.radius_cm());
    let rho_c = density_ratio * 3.0 * m / (4.0 * PI * r.powi(3));
    let p_c = w_n * G_CGS * m * m / r.powi(4);
    let t_ideal = theta_n * star.mu * M_U_G * G_CGS * m / (K_B_ERG_K * r);
    let beta = if radiation {
        Some(eddington_beta(star.mass_msun, star.mu, solution.omega_n)?)
    } else {
        None
    };
    let t_c = t_ideal * beta.unwrap_or(1.0);
    let mass_norm = xi1 * xi1 * slope1.abs();
    let profile = solution
        .profile
        .iter()
        .map(|p| {
            let theta = p.theta.max(0.0);
            let m_over_m = p.xi * p.xi * p.dtheta_dxi.abs() / mass_norm;
            PhysicalPoint {
                radius_cm: r * p.xi / xi1,
                r_over_r: p.xi / xi1,
                mass_g: m * m_over_m,
                m_over_m,
                density_g_cm3: rho_c * density_factor(theta, n),
                pressure_dyn_cm2: p_c * theta.powf(n + 1.0),
                temperature_k: t_c * theta,
            }
        })
        .collect();
    Ok(ScaledPolytrope {
        star,
        central_density_g_cm3: rho_c,
        central_pressure_dyn_cm2: p_c,
        central_temperature_k: t_c,
        beta,
        potential_energy_erg: -pe * G_CGS * m * m / r,
        profile,
    })
}
