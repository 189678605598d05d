//! Output schema of a ZAMS model: the summary (JSON object / text) and the profile (CSV or JSON
//! rows). Field names are the JSON keys and CSV column names; each carries its unit.

use crate::physics::PhysicsDescription;
use serde::Serialize;

/// Summary of one converged (or, with `converged: false`, failed) ZAMS model.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ZamsSummary {
    /// Stellar mass, M_sun.
    pub mass_msun: f64,
    /// Hydrogen mass fraction X.
    pub x: f64,
    /// Metal mass fraction Z.
    pub z: f64,
    /// Every law used, with its parameters.
    pub physics: PhysicsDescription,
    /// Whether the fitting-point mismatch fell below the tolerance. A non-converged model has
    /// every physical field `null`.
    pub converged: bool,
    /// Newton iterations.
    pub iterations: usize,
    /// Final max-norm of the relative mismatch of (r, P, T, L) at the fitting mass.
    pub fit_mismatch: f64,
    /// Fitting mass as a fraction of M.
    pub fit_mass_fraction: f64,
    /// Photospheric radius, R_sun.
    pub radius_rsun: Option<f64>,
    /// Surface luminosity, L_sun.
    pub luminosity_lsun: Option<f64>,
    /// Effective temperature, K, from L = 4 pi R^2 sigma T_eff^4.
    pub teff_k: Option<f64>,
    /// log10 of the surface gravity G M / R^2 in cm s^-2.
    pub log_g_cgs: Option<f64>,
    /// Central temperature, K.
    pub central_temperature_k: Option<f64>,
    /// Central density, g cm^-3.
    pub central_density_g_cm3: Option<f64>,
    /// Central pressure, dyn cm^-2.
    pub central_pressure_dyn_cm2: Option<f64>,
    /// Electron degeneracy parameter psi = mu_e,chem / (k T) at the centre (psi << 0: not
    /// degenerate; psi > 0: degenerate). `null` for laws that assume non-degenerate electrons.
    pub central_degeneracy: Option<f64>,
    /// Mass fraction of the convective region that contains the centre (0 if the centre is
    /// radiative).
    pub convective_core_mass_fraction: Option<f64>,
    /// Mass fraction of the outermost convective region if it reaches within 1e-3 M of the
    /// surface (0 otherwise). A star convective from the centre to there is fully convective
    /// and has 1 for both core and envelope (they are the same region: do not add them).
    pub convective_envelope_mass_fraction: Option<f64>,
    /// Fraction of L supplied by the CNO cycle.
    pub cno_luminosity_fraction: Option<f64>,
    /// L / L_Edd with L_Edd = 4 pi G M c / kappa_es and kappa_es = sigma_T (1+X) / (2 m_u).
    pub eddington_ratio: Option<f64>,
    /// Kelvin–Helmholtz time G M^2 / (R L), years.
    pub kelvin_helmholtz_time_yr: Option<f64>,
    /// Dynamical time sqrt(R^3 / (G M)), s.
    pub dynamical_time_s: Option<f64>,
    /// Hydrogen-burning lifetime estimate 0.1 X M (Q / 4 m_H c^2) c^2 / L, years (see
    /// [`crate::structure::nuclear_time_yr`] for the assumptions).
    pub nuclear_time_yr: Option<f64>,
    /// |integral of 3 P / rho dm / integral of G m / r dm - 1| (virial theorem, 0 when exact).
    pub virial_residual: Option<f64>,
    /// |integral of eps dm / L - 1| (energy conservation, 0 when exact).
    pub luminosity_residual: Option<f64>,
    /// Right-hand-side evaluations of the structure equations spent on this model.
    pub rhs_evaluations: u64,
}

/// One row of a ZAMS profile, centre first. CSV columns appear in this order.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, serde::Deserialize)]
pub struct ProfileRow {
    /// Mass inside the shell, g.
    pub mass_g: f64,
    /// m / M.
    #[serde(rename = "m_over_M")]
    pub m_over_m: f64,
    /// Radius, cm.
    pub radius_cm: f64,
    /// r / R.
    #[serde(rename = "r_over_R")]
    pub r_over_r: f64,
    /// Total pressure, dyn cm^-2.
    pub pressure_dyn_cm2: f64,
    /// Temperature, K.
    pub temperature_k: f64,
    /// Density, g cm^-3.
    pub density_g_cm3: f64,
    /// Luminosity through the shell, erg s^-1.
    pub luminosity_erg_s: f64,
    /// pp-chain energy generation, erg g^-1 s^-1.
    pub eps_pp_erg_g_s: f64,
    /// CNO-cycle energy generation, erg g^-1 s^-1.
    pub eps_cno_erg_g_s: f64,
    /// Rosseland-mean opacity, cm^2 g^-1.
    pub opacity_cm2_g: f64,
    /// Radiative gradient.
    pub nabla_rad: f64,
    /// Adiabatic gradient.
    pub nabla_ad: f64,
    /// Actual gradient dln T / dln P.
    pub nabla: f64,
    /// 1 where nabla_rad > nabla_ad (Schwarzschild), else 0.
    pub convective: u8,
    /// Mean molecular weight of the gas.
    pub mu: f64,
    /// First adiabatic exponent.
    pub gamma1: f64,
    /// Brunt–Väisälä frequency squared N^2 = g^2 rho delta (nabla_ad - nabla) / P, rad^2 s^-2
    /// (homogeneous composition, so no composition-gradient term).
    pub brunt_n2_rad2_s2: f64,
    /// Lamb frequency S_1 = sqrt(2) c_s / r, rad s^-1, with c_s^2 = Gamma_1 P / rho.
    pub lamb_l1_rad_s: f64,
    /// Lamb frequency S_2 = sqrt(6) c_s / r, rad s^-1.
    pub lamb_l2_rad_s: f64,
}

/// CSV header of a profile: the fixed column names, in order.
pub const PROFILE_COLUMNS: [&str; 20] = [
    "mass_g",
    "m_over_M",
    "radius_cm",
    "r_over_R",
    "pressure_dyn_cm2",
    "temperature_k",
    "density_g_cm3",
    "luminosity_erg_s",
    "eps_pp_erg_g_s",
    "eps_cno_erg_g_s",
    "opacity_cm2_g",
    "nabla_rad",
    "nabla_ad",
    "nabla",
    "convective",
    "mu",
    "gamma1",
    "brunt_n2_rad2_s2",
    "lamb_l1_rad_s",
    "lamb_l2_rad_s",
];
