//! Lane–Emden polytropes: the dimensionless solution and its scaling to a star.
//!
//! A polytrope P = K rho^(1 + 1/n) in hydrostatic equilibrium, with rho = rho_c theta^n and
//! r = alpha xi, obeys the Lane–Emden equation
//!
//! theta'' + (2/xi) theta' + theta^n = 0,  theta(0) = 1,  theta'(0) = 0
//!
//! (Chandrasekhar 1939, *An Introduction to the Study of Stellar Structure*, ch. IV). The first
//! zero xi_1 of theta is the surface. [`solve_lane_emden`] integrates it for any real n in
//! [0, 5]; [`scale_to_star`] turns the dimensionless constants into central density, pressure
//! and temperature for a given mass, radius and mean molecular weight, optionally in
//! Eddington's standard model ([`eddington_beta`]).

pub mod eddington;
pub mod series;
pub mod solution;
pub mod solver;
pub mod star;

pub use eddington::{eddington_beta, eddington_constant};
pub use series::LaneEmdenSeries;
pub use solution::{solve_lane_emden, LaneEmdenSettings, LaneEmdenSolution, ProfilePoint};
pub use solver::{first_zero, FirstZero};
pub use star::{
    scale_to_star, validate_scaling, PhysicalPoint, ScaledPolytrope, StarParameters, DEFAULT_MU,
};

use crate::error::{Error, Result};

/// What `--index` allows, in the words of the error message.
pub const INDEX_ALLOWED: &str = "the polytropic index must be a number in [0, 5], e.g. 3";

/// Check a polytropic index: finite and 0 <= n <= 5, else [`Error::InvalidInput`] naming
/// `index`.
pub fn validate_index(n: f64) -> Result<f64> {
    if (0.0..=5.0).contains(&n) {
        Ok(n)
    } else {
        Err(Error::invalid("index", n, INDEX_ALLOWED))
    }
}

/// `x` if it is finite and positive, else an error naming `name` with `allowed`.
pub(crate) fn check_positive(name: &str, x: f64, allowed: &str) -> Result<f64> {
    if x.is_finite() && x > 0.0 {
        Ok(x)
    } else {
        Err(Error::invalid(name, x, allowed))
    }
}

/// A mass in solar masses: positive and finite, else an error naming `mass_msun`.
pub(crate) fn check_mass_msun(mass_msun: f64) -> Result<f64> {
    check_positive(
        "mass_msun",
        mass_msun,
        "the mass must be a positive number of solar masses, e.g. 1",
    )
}

/// A mean molecular weight: positive and finite, else an error naming `mu`.
pub(crate) fn check_mu(mu: f64) -> Result<f64> {
    check_positive(
        "mu",
        mu,
        "the mean molecular weight must be a positive number, e.g. 0.61",
    )
}
