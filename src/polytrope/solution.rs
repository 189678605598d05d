//! The Lane–Emden solution of an index n: its constants and the profile theta(xi) on a chosen
//! number of points, integrated with the legs of [`super::solver`].

use super::series::LaneEmdenSeries;
use super::solver::{
    first_zero, integration_failure, run_leg, FirstZero, RadialLeg, State, DEFAULT_POINTS,
    DEFAULT_UNBOUNDED_XI_MAX, MAX_POINTS, MIN_POINTS, SERIES_START_XI,
};
use super::validate_index;
use crate::error::{Error, Result};
use std::f64::consts::PI;

/// Settings of [`solve_lane_emden`].
///
/// Defaults: `points` = [`DEFAULT_POINTS`] (200), `unbounded_xi_max` =
/// [`DEFAULT_UNBOUNDED_XI_MAX`] (20, used only for n = 5).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LaneEmdenSettings {
    points: usize,
    unbounded_xi_max: f64,
}

impl Default for LaneEmdenSettings {
    fn default() -> Self {
        Self {
            points: DEFAULT_POINTS,
            unbounded_xi_max: DEFAULT_UNBOUNDED_XI_MAX,
        }
    }
}

impl LaneEmdenSettings {
    /// Number of profile points, from the centre to the surface inclusive; must lie in
    /// [[`MIN_POINTS`], [`MAX_POINTS`]], else [`Error::InvalidInput`] naming `--points`.
    pub fn with_points(mut self, points: usize) -> Result<Self> {
        if !(MIN_POINTS..=MAX_POINTS).contains(&points) {
            return Err(Error::invalid(
                "points",
                points,
                "the number of profile points must be an integer from 2 to 1000000, e.g. 200",
            ));
        }
        self.points = points;
        Ok(self)
    }

    /// Outer end of the profile for n = 5 (which has no surface); must be finite and larger
    /// than [`SERIES_START_XI`].
    pub fn with_unbounded_xi_max(mut self, xi_max: f64) -> Result<Self> {
        if !(xi_max.is_finite() && xi_max > SERIES_START_XI) {
            return Err(Error::invalid(
                "unbounded_xi_max",
                xi_max,
                "the outer end of the n = 5 profile must be a finite number above 0.1",
            ));
        }
        self.unbounded_xi_max = xi_max;
        Ok(self)
    }

    /// Number of profile points.
    pub fn points(&self) -> usize {
        self.points
    }

    /// Outer end of the n = 5 profile.
    pub fn unbounded_xi_max(&self) -> f64 {
        self.unbounded_xi_max
    }
}

/// One point of the dimensionless profile.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ProfilePoint {
    /// Dimensionless radius xi = r / alpha.
    pub xi: f64,
    /// theta(xi); rho = rho_c theta^n.
    pub theta: f64,
    /// dtheta/dxi.
    pub dtheta_dxi: f64,
}

/// A solved Lane–Emden polytrope and its dimensionless constants (Chandrasekhar 1939, ch. IV).
///
/// Every constant that involves xi_1 is `None` for n = 5, where xi_1 is infinite.
#[derive(Debug, Clone, PartialEq)]
pub struct LaneEmdenSolution {
    /// The polytropic index n.
    pub index: f64,
    /// First zero xi_1 of theta; `None` (infinite) for n = 5.
    pub xi1: Option<f64>,
    /// theta'(xi_1).
    pub dtheta_dxi_at_xi1: Option<f64>,
    /// omega_n = -xi_1^2 theta'(xi_1), the dimensionless mass: M = 4 pi alpha^3 rho_c omega_n.
    /// For n = 5 the finite limit of -xi^2 theta' as xi -> infinity, sqrt 3 (from the exact
    /// solution theta = (1 + xi^2/3)^(-1/2)).
    pub omega_n: f64,
    /// rho_c / rho_mean = -xi_1 / (3 theta'(xi_1)).
    pub rho_c_over_rho_mean: Option<f64>,
    /// W_n = 1 / (4 pi (n+1) theta'(xi_1)^2), so that P_c = W_n G M^2 / R^4.
    pub w_n: Option<f64>,
    /// 3 / (5 - n), so that the gravitational energy is Omega = -(3/(5-n)) G M^2 / R.
    pub potential_energy_coefficient: Option<f64>,
    /// Theta_n = 1 / ((n+1) xi_1 |theta'(xi_1)|), so that the ideal-gas central temperature is
    /// T_c = Theta_n mu m_u G M / (k R).
    pub theta_n: Option<f64>,
    /// theta and theta' at `points` values of xi, evenly spaced from 0 to xi_1 inclusive
    /// (for n = 5: to the settings' `unbounded_xi_max`). The last point of a bounded polytrope
    /// is exactly (xi_1, 0, theta'(xi_1)).
    pub profile: Vec<ProfilePoint>,
    /// Right-hand-side evaluations used, zero search and profile together.
    pub evaluations: u64,
}

/// Solve the Lane–Emden equation for index `n` in [0, 5]: first zero, dimensionless constants
/// and profile. See the module documentation for the method.
///
/// Errors: index outside [0, 5] or NaN ([`Error::InvalidInput`] naming `--index`);
/// [`Error::Integration`] if an integration leg fails.
pub fn solve_lane_emden(n: f64, settings: &LaneEmdenSettings) -> Result<LaneEmdenSolution> {
    let n = validate_index(n)?;
    let settings = LaneEmdenSettings::default()
        .with_points(settings.points)?
        .with_unbounded_xi_max(settings.unbounded_xi_max)?;
    let zero = first_zero(n)?;
    let outer = zero.map_or(settings.unbounded_xi_max, |z| z.xi1);
    let (profile, profile_evaluations) = sample_profile(n, outer, settings.points, zero)?;
    let evaluations = profile_evaluations + zero.map_or(0, |z| z.evaluations);
    Ok(match zero {
        Some(z) => {
            let slope = z.dtheta_dxi;
            LaneEmdenSolution {
                index: n,
                xi1: Some(z.xi1),
                dtheta_dxi_at_xi1: Some(slope),
                omega_n: -z.xi1 * z.xi1 * slope,
                rho_c_over_rho_mean: Some(-z.xi1 / (3.0 * slope)),
                w_n: Some(1.0 / (4.0 * PI * (n + 1.0) * slope * slope)),
                potential_energy_coefficient: Some(3.0 / (5.0 - n)),
                theta_n: Some(1.0 / ((n + 1.0) * z.xi1 * slope.abs())),
                profile,
                evaluations,
            }
        }
        None => LaneEmdenSolution {
            index: n,
            xi1: None,
            dtheta_dxi_at_xi1: None,
            // lim -xi^2 theta' of theta = (1 + xi^2/3)^(-1/2) (Chandrasekhar 1939, ch. IV).
            omega_n: 3.0_f64.sqrt(),
            rho_c_over_rho_mean: None,
            w_n: None,
            potential_energy_coefficient: None,
            theta_n: None,
            profile,
            evaluations,
        },
    })
}

/// theta and theta' at `points` evenly spaced xi in [0, outer]. Points inside the series start
/// come from the series; the rest from consecutive integration legs, each ending exactly on its
/// grid point. A bounded polytrope's last point is set to the located zero.
fn sample_profile(
    n: f64,
    outer: f64,
    points: usize,
    zero: Option<FirstZero>,
) -> Result<(Vec<ProfilePoint>, u64)> {
    let series = LaneEmdenSeries::new(n)?;
    let mut profile = Vec::with_capacity(points);
    let mut evaluations = 0;
    let (theta0, dtheta0) = series.evaluate(SERIES_START_XI);
    let mut current = (
        SERIES_START_XI,
        State::new(theta0, dtheta0, SERIES_START_XI),
    );
    let last = points - 1;
    for j in 0..points {
        let xi = if j == last {
            outer
        } else {
            outer * j as f64 / last as f64
        };
        if let (true, Some(z)) = (j == last, zero) {
            profile.push(ProfilePoint {
                xi: z.xi1,
                theta: 0.0,
                dtheta_dxi: z.dtheta_dxi,
            });
            continue;
        }
        if xi <= SERIES_START_XI {
            let (theta, dtheta_dxi) = series.evaluate(xi);
            profile.push(ProfilePoint {
                xi,
                theta,
                dtheta_dxi,
            });
            continue;
        }
        let leg = run_leg(
            RadialLeg {
                n,
                stop_at_zero: false,
            },
            current.0,
            xi,
            current.1,
            "profile",
        )?;
        evaluations += leg.evaluations;
        let Some((x_end, y_end)) = leg.end() else {
            return Err(integration_failure("profile", current.0, "no output"));
        };
        if x_end != xi {
            return Err(integration_failure("profile", x_end, "leg ended early"));
        }
        // Restart the carried xi from the grid value, so rounding does not accumulate.
        current = (xi, State::new(y_end[0], y_end[1], xi));
        profile.push(ProfilePoint {
            xi,
            theta: y_end[0],
            dtheta_dxi: y_end[1],
        });
    }
    Ok((profile, evaluations))
}
