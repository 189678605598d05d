//! Output schema of `starpoise polytrope`: the JSON summary, its text rendering and the profile
//! CSV. Every key and column is documented with its unit.

use super::columns::polytrope_columns;
use super::meta::Meta;
use super::tabular::{write_table_file, Cell, TableFormat, Tabular};
use crate::error::Result;
use crate::polytrope::{LaneEmdenSolution, ScaledPolytrope};
use serde::Serialize;
use std::fmt::Write as _;
use std::path::Path;

/// The JSON object printed by `starpoise polytrope --format json`. Keys of a scaled star are
/// absent when no mass and radius were given; `beta` is present only with `--radiation`.
/// Constants that involve xi_1 are `null` for n = 5 (xi_1 infinite).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PolytropeSummary {
    /// Polytropic index n (dimensionless).
    pub index: f64,
    /// First zero xi_1 of theta (dimensionless radius); `null` for n = 5.
    pub xi1: Option<f64>,
    /// theta'(xi_1) (dimensionless); `null` for n = 5.
    pub dtheta_dxi_at_xi1: Option<f64>,
    /// omega_n = -xi_1^2 theta'(xi_1) (dimensionless mass); sqrt 3 for n = 5 (the limit).
    pub omega_n: f64,
    /// Central over mean density, -xi_1/(3 theta'(xi_1)) (dimensionless); `null` for n = 5.
    pub rho_c_over_rho_mean: Option<f64>,
    /// W_n = 1/(4 pi (n+1) theta'(xi_1)^2) with P_c = W_n G M^2/R^4 (dimensionless).
    pub w_n: Option<f64>,
    /// 3/(5-n) with Omega = -(3/(5-n)) G M^2/R (dimensionless).
    pub potential_energy_coefficient: Option<f64>,
    /// Theta_n = 1/((n+1) xi_1 |theta'(xi_1)|) with T_c = Theta_n mu m_u G M/(k R)
    /// (dimensionless).
    pub theta_n: Option<f64>,
    /// Number of profile points computed.
    pub points: usize,
    /// Stellar mass, M_sun.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub mass_msun: Option<f64>,
    /// Stellar radius, R_sun (nominal, 6.957e10 cm).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub radius_rsun: Option<f64>,
    /// Mean molecular weight, units of the atomic mass constant m_u.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub mu: Option<f64>,
    /// Stellar mass, g.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub mass_g: Option<f64>,
    /// Stellar radius, cm.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub radius_cm: Option<f64>,
    /// Central density, g cm^-3.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub central_density_g_cm3: Option<f64>,
    /// Central total pressure, dyn cm^-2.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub central_pressure_dyn_cm2: Option<f64>,
    /// Central temperature, K (ideal gas; with `--radiation`, beta times the ideal-gas value).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub central_temperature_k: Option<f64>,
    /// Gravitational potential energy Omega, erg (negative).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub potential_energy_erg: Option<f64>,
    /// Gas-pressure fraction P_gas/P of Eddington's standard model (dimensionless).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub beta: Option<f64>,
}

impl PolytropeSummary {
    /// Collect the summary of `solution`, scaled to a star when `scaled` is given.
    pub fn new(solution: &LaneEmdenSolution, scaled: Option<&ScaledPolytrope>) -> Self {
        Self {
            index: solution.index,
            xi1: solution.xi1,
            dtheta_dxi_at_xi1: solution.dtheta_dxi_at_xi1,
            omega_n: solution.omega_n,
            rho_c_over_rho_mean: solution.rho_c_over_rho_mean,
            w_n: solution.w_n,
            potential_energy_coefficient: solution.potential_energy_coefficient,
            theta_n: solution.theta_n,
            points: solution.profile.len(),
            mass_msun: scaled.map(|s| s.star.mass_msun()),
            radius_rsun: scaled.map(|s| s.star.radius_rsun()),
            mu: scaled.map(|s| s.star.mu()),
            mass_g: scaled.map(|s| s.star.mass_g()),
            radius_cm: scaled.map(|s| s.star.radius_cm()),
            central_density_g_cm3: scaled.map(|s| s.central_density_g_cm3),
            central_pressure_dyn_cm2: scaled.map(|s| s.central_pressure_dyn_cm2),
            central_temperature_k: scaled.map(|s| s.central_temperature_k),
            potential_energy_erg: scaled.map(|s| s.potential_energy_erg),
            beta: scaled.and_then(|s| s.beta),
        }
    }

    /// The first quantity of the scaled star that is not a finite number (an overflow or
    /// underflow from absurd units), as (key, description), or `None` if all are finite.
    pub fn non_finite(&self) -> Option<(&'static str, &'static str)> {
        let values = [
            ("mass_g", "the mass in g", self.mass_g),
            ("radius_cm", "the radius in cm", self.radius_cm),
            (
                "central_density_g_cm3",
                "the central density",
                self.central_density_g_cm3,
            ),
            (
                "central_pressure_dyn_cm2",
                "the central pressure",
                self.central_pressure_dyn_cm2,
            ),
            (
                "central_temperature_k",
                "the central temperature",
                self.central_temperature_k,
            ),
            (
                "potential_energy_erg",
                "the potential energy",
                self.potential_energy_erg,
            ),
            ("beta", "beta = P_gas/P", self.beta),
        ];
        values
            .into_iter()
            .find(|(_, _, v)| v.is_some_and(|v| !v.is_finite() || v == 0.0))
            .map(|(k, d, _)| (k, d))
    }

    /// The summary as aligned text for people: one quantity per line, value, unit.
    pub fn to_text(&self) -> String {
        let mut rows: Vec<(&str, String, &str)> = vec![
            ("polytropic index n", number(self.index), ""),
            ("first zero xi_1", optional(self.xi1), ""),
            (
                "dtheta/dxi at xi_1",
                // For n = 5, theta' -> 0 as xi -> infinity.
                self.dtheta_dxi_at_xi1
                    .map_or_else(|| "0 (limit)".to_string(), number),
                "",
            ),
            ("omega_n = -xi_1^2 theta'(xi_1)", number(self.omega_n), ""),
            ("rho_c / rho_mean", optional(self.rho_c_over_rho_mean), ""),
            ("W_n (P_c = W_n G M^2/R^4)", optional(self.w_n), ""),
            (
                "3/(5-n) (Omega = -3/(5-n) G M^2/R)",
                optional(self.potential_energy_coefficient),
                "",
            ),
            (
                "Theta_n (T_c = Theta_n mu m_u G M/(k R))",
                optional(self.theta_n),
                "",
            ),
        ];
        let scaled = [
            ("mass", self.mass_msun, "M_sun"),
            ("radius", self.radius_rsun, "R_sun"),
            ("mean molecular weight mu", self.mu, ""),
            ("mass", self.mass_g, "g"),
            ("radius", self.radius_cm, "cm"),
            ("central density", self.central_density_g_cm3, "g/cm^3"),
            (
                "central pressure",
                self.central_pressure_dyn_cm2,
                "dyn/cm^2",
            ),
            ("central temperature", self.central_temperature_k, "K"),
            ("potential energy Omega", self.potential_energy_erg, "erg"),
            ("beta = P_gas/P (Eddington)", self.beta, ""),
        ];
        for (label, value, unit) in scaled {
            if let Some(v) = value {
                rows.push((label, number(v), unit));
            }
        }
        let label_width = rows.iter().map(|r| r.0.len()).max().unwrap_or(0);
        let value_width = rows.iter().map(|r| r.1.len()).max().unwrap_or(0);
        let mut text = String::new();
        for (label, value, unit) in rows {
            let line = format!("{label:<label_width$}  {value:>value_width$}  {unit}");
            let _ = writeln!(text, "{}", line.trim_end());
        }
        text
    }
}

/// Ten significant digits: fixed notation between 1e-3 and 1e6, scientific otherwise.
pub(crate) fn number(x: f64) -> String {
    let magnitude = x.abs();
    if magnitude == 0.0 {
        return "0".to_string();
    }
    if (1e-3..1e6).contains(&magnitude) {
        let decimals = (9 - magnitude.log10().floor() as i32).max(0) as usize;
        format!("{x:.decimals$}")
    } else {
        format!("{x:.9e}")
    }
}

fn optional(x: Option<f64>) -> String {
    x.map_or_else(|| "infinite".to_string(), number)
}

/// The content of a polytrope profile's metadata.
pub const POLYTROPE_CONTENT: &str = "Lane-Emden polytrope profile";

/// The metadata of a polytrope profile: `base` (provenance and content), `index`, and for a
/// scaled star `mass_msun`, `radius_rsun`, `mu` and (Eddington's standard model) `beta`.
pub fn profile_meta(base: &Meta, summary: &PolytropeSummary) -> Meta {
    let mut m = base.clone().with("index", summary.index);
    for (key, value) in [
        ("mass_msun", summary.mass_msun),
        ("radius_rsun", summary.radius_rsun),
        ("mu", summary.mu),
        ("beta", summary.beta),
    ] {
        if let Some(v) = value {
            m = m.with(key, v);
        }
    }
    m
}

/// Write the profile of `solution` to `path`, centre first, one row per profile point: CSV
/// (metadata lines, units line, header), JSON if the name ends in `.json`, ECSV if in `.ecsv`
/// ([`crate::output::tabular`]); `-` is standard output (CSV), a file is written atomically (no
/// partial file on failure).
///
/// Columns ([`polytrope_columns`]): `xi,theta,dtheta_dxi` (dimensionless) always; when `scaled`
/// is given also `radius_cm,r_over_R,mass_g,m_over_M,density_g_cm3,pressure_dyn_cm2,
/// temperature_k` (cm, -, g, -, g cm^-3, dyn cm^-2, K).
pub fn write_profile(
    path: &Path,
    solution: &LaneEmdenSolution,
    scaled: Option<&ScaledPolytrope>,
    meta: &Meta,
) -> Result<()> {
    let columns = polytrope_columns(scaled.is_some());
    let row = |i: usize| {
        let p = &solution.profile[i];
        let mut cells = vec![
            Cell::number(p.xi),
            Cell::number(p.theta),
            Cell::number(p.dtheta_dxi),
        ];
        if let Some(q) = scaled.and_then(|s| s.profile.get(i)) {
            cells.extend(
                [
                    q.radius_cm,
                    q.r_over_r,
                    q.mass_g,
                    q.m_over_m,
                    q.density_g_cm3,
                    q.pressure_dyn_cm2,
                    q.temperature_k,
                ]
                .map(Cell::number),
            );
        }
        cells
    };
    let len = match scaled {
        Some(s) => solution.profile.len().min(s.profile.len()),
        None => solution.profile.len(),
    };
    let table = Tabular {
        columns: &columns,
        meta,
        len,
        row: &row,
    };
    write_table_file(path, TableFormat::from_path(path), &table, None::<&()>)
}
