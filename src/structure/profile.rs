//! The profile of a converged model: one row per place on the star, centre (r = 0) first,
//! photosphere last, on a grid of the user's choice ([`ProfileGrid`]), each row a full
//! evaluation of the local physics on the model's own fine solution
//! ([`super::profile_mesh`]: both legs integrated once more with their dense output kept).

use super::equations::{local_physics_with_eos, LocalPhysics, Point};
use super::legs::{LegContext, LegResult};
pub use super::profile_mesh::ProfileGrid;
use super::profile_mesh::{FineSolution, Place, Structure};
use super::shooting::Unknowns;
use super::surface::SurfaceStart;
use super::zones::{convective_zones, extent_from_zones};
use crate::constants::G_CGS;
use crate::error::{Error, Result};
use crate::physics::{Composition, EosState};
use serde::{Deserialize, Serialize};
use std::f64::consts::PI;

/// Default number of profile rows.
pub const DEFAULT_PROFILE_POINTS: usize = 400;
/// Smallest and largest number of profile rows.
pub const PROFILE_POINTS_RANGE: (usize, usize) = (10, 100_000);

/// Check a number of profile rows against [`PROFILE_POINTS_RANGE`].
pub fn check_profile_points(n: usize) -> Result<usize> {
    let (lo, hi) = PROFILE_POINTS_RANGE;
    if (lo..=hi).contains(&n) {
        Ok(n)
    } else {
        Err(Error::invalid(
            "points",
            n,
            &format!("the number of profile rows must be in [{lo}, {hi}], e.g. 400"),
        ))
    }
}

/// One row of a ZAMS profile, centre first. CSV columns appear in this order. The first row is
/// the centre itself (m = r = L = 0, the central P, T, rho and the local physics there), the
/// last the photosphere (r = R, T = T_eff). Unless said otherwise a column is the local value
/// from the model's laws at the row's (P, T) (the structure variables are the model's fine
/// solution read at that place).
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
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
    /// Density, g cm^-3 (the equation of state at P, T).
    pub density_g_cm3: f64,
    /// Luminosity through the shell, erg s^-1.
    pub luminosity_erg_s: f64,
    /// pp-chain energy generation, erg g^-1 s^-1 (0 where the rate law says it is negligible
    /// in every star, `EnergyGeneration::negligible_at`, as the structure equations take it).
    pub eps_pp_erg_g_s: f64,
    /// CNO-cycle energy generation, erg g^-1 s^-1 (0 where negligible, as `eps_pp_erg_g_s`).
    pub eps_cno_erg_g_s: f64,
    /// Rosseland-mean opacity, cm^2 g^-1.
    pub opacity_cm2_g: f64,
    /// Radiative gradient (at the centre with L/m = eps_c).
    pub nabla_rad: f64,
    /// Adiabatic gradient.
    pub nabla_ad: f64,
    /// Actual gradient dln T / dln P.
    pub nabla: f64,
    /// 1 where nabla_rad > nabla_ad (Schwarzschild), else 0.
    pub convective: u8,
    /// Mean molecular weight of the gas.
    pub mu: f64,
    /// First adiabatic exponent Gamma_1 = (dln P / dln rho)_s.
    pub gamma1: f64,
    /// Brunt–Väisälä frequency squared N^2 = g^2 rho delta (nabla_ad - nabla) / P, rad^2 s^-2
    /// (homogeneous composition, so no composition-gradient term); 0 at the centre (g = 0).
    pub brunt_n2_rad2_s2: f64,
    /// Lamb frequency S_1 = sqrt(2) c_s / r, rad s^-1; infinite at the centre, written NaN
    /// there (null in JSON).
    pub lamb_l1_rad_s: f64,
    /// Lamb frequency S_2 = sqrt(6) c_s / r, rad s^-1; NaN at the centre as S_1.
    pub lamb_l2_rad_s: f64,
    /// Adiabatic sound speed c_s = sqrt(Gamma_1 P / rho), cm s^-1.
    pub sound_speed_cm_s: f64,
    /// chi_rho = (dln P / dln rho)_T, from the equation of state.
    pub chi_rho: f64,
    /// chi_T = (dln P / dln T)_rho, from the equation of state.
    pub chi_t: f64,
    /// Specific internal energy u, erg g^-1, from the equation of state
    /// ([`EosState::specific_energy_erg_g`]): counted from the fully ionised plasma at rest, so
    /// u = (3/2) P_gas/rho + a T^4/rho where ionisation is complete, and negative where enough
    /// electrons are bound.
    pub specific_energy_erg_g: f64,
    /// Specific entropy s, erg g^-1 K^-1, from the equation of state
    /// ([`crate::physics::EquationOfState::specific_entropy_erg_g_k`]): absolute (Sackur–Tetrode
    /// species with the law's statistical weights, nuclear spin left out, plus radiation);
    /// NaN (null in JSON) for a law that gives none (only laws supplied from outside).
    pub specific_entropy_erg_g_k: f64,
    /// Local gravity g = G m / r^2, cm s^-2; 0 at the centre.
    pub gravity_cm_s2: f64,
    /// Gravitational potential Phi, erg g^-1, zero at infinity: Phi = -G m/r - G int_m^M dm'/r,
    /// so dPhi/dr = g and Phi = -G M / R at the photosphere (the ~1e-11 M above it taken at R);
    /// integrated on the fine solution ([`super::profile_mesh`]).
    pub potential_erg_g: f64,
    /// V = -dln P / dln r = G m rho / (r P) (Unno et al. 1989, §18.1); 0 at the centre (as r^2).
    pub structure_v: f64,
    /// U = dln m / dln r = 4 pi r^3 rho / m; 3 at the centre.
    pub structure_u: f64,
    /// c1 = (r/R)^3 / (m/M); rho_mean / rho_c at the centre (rho_mean = 3M / (4 pi R^3)).
    pub structure_c1: f64,
    /// A* = (1/Gamma_1) dln P/dln r - dln rho/dln r = r N^2 / g, computed as
    /// V delta (nabla_ad - nabla) (equal for a homogeneous star, by 1/chi_rho - 1/Gamma_1 =
    /// delta nabla_ad); 0 at the centre (as r^2).
    pub structure_a_star: f64,
    /// Hydrogen mass fraction X (uniform in a ZAMS star).
    pub x: f64,
    /// Helium mass fraction Y.
    pub y: f64,
    /// Metal mass fraction Z.
    pub z: f64,
}

/// CSV header of a profile: the fixed column names, in order.
pub const PROFILE_COLUMNS: [&str; 34] = [
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
    "sound_speed_cm_s",
    "chi_rho",
    "chi_t",
    "specific_energy_erg_g",
    "specific_entropy_erg_g_k",
    "gravity_cm_s2",
    "potential_erg_g",
    "structure_v",
    "structure_u",
    "structure_c1",
    "structure_a_star",
    "x",
    "y",
    "z",
];

/// The row at `s` with the local physics `local` and the specific entropy `entropy` there.
fn row(
    ctx: &LegContext,
    fine: &FineSolution,
    s: &Structure,
    local: &LocalPhysics,
    entropy: Option<f64>,
) -> ProfileRow {
    let comp: &Composition = ctx.composition;
    let eos = &local.eos;
    let (m, r, p) = (s.mass_g, s.radius_cm, s.pressure_dyn_cm2);
    let (m_total, radius) = (ctx.total_mass_g, fine.radius_cm);
    let rho = eos.density_g_cm3;
    let cs = (eos.gamma1 * p / rho).sqrt();
    let superadiabatic = eos.delta * (eos.nabla_ad - local.nabla);
    let centre = m <= 0.0 || r <= 0.0;
    let (g, v, u, c1, lamb) = if centre {
        let rho_mean = 3.0 * m_total / (4.0 * PI * radius.powi(3));
        (0.0, 0.0, 3.0, rho_mean / rho, f64::NAN)
    } else {
        (
            G_CGS * m / (r * r),
            G_CGS * m * rho / (r * p),
            4.0 * PI * r.powi(3) * rho / m,
            (r / radius).powi(3) / (m / m_total),
            cs / r,
        )
    };
    ProfileRow {
        mass_g: m,
        m_over_m: m / m_total,
        radius_cm: r,
        r_over_r: r / radius,
        pressure_dyn_cm2: p,
        temperature_k: s.temperature_k,
        density_g_cm3: rho,
        luminosity_erg_s: s.luminosity_erg_s,
        eps_pp_erg_g_s: local.rate.eps_pp_erg_g_s,
        eps_cno_erg_g_s: local.rate.eps_cno_erg_g_s,
        opacity_cm2_g: local.opacity_cm2_g,
        nabla_rad: local.nabla_rad,
        nabla_ad: eos.nabla_ad,
        nabla: local.nabla,
        convective: u8::from(local.convective()),
        mu: eos.mu,
        gamma1: eos.gamma1,
        brunt_n2_rad2_s2: g * g * rho * superadiabatic / p,
        lamb_l1_rad_s: 2f64.sqrt() * lamb,
        lamb_l2_rad_s: 6f64.sqrt() * lamb,
        sound_speed_cm_s: cs,
        chi_rho: eos.chi_rho,
        chi_t: eos.chi_t,
        specific_energy_erg_g: eos.specific_energy_erg_g,
        specific_entropy_erg_g_k: entropy.unwrap_or(f64::NAN),
        gravity_cm_s2: g,
        potential_erg_g: s.potential_erg_g,
        structure_v: v,
        structure_u: u,
        structure_c1: c1,
        structure_a_star: v * superadiabatic,
        x: comp.x(),
        y: comp.y(),
        z: comp.z(),
    }
}

/// Mass fractions of the convective core and of the convective envelope from the profile (used
/// when a leg met more boundaries than it locates); boundaries are placed by linear
/// interpolation of nabla_rad - nabla_ad between rows.
pub fn convective_extent(profile: &[ProfileRow]) -> (f64, f64) {
    let excess = |r: &ProfileRow| r.nabla_rad - r.nabla_ad;
    let Some(first) = profile.first() else {
        return (0.0, 0.0);
    };
    let boundaries: Vec<f64> = profile
        .windows(2)
        .filter(|w| w[0].convective != w[1].convective)
        .map(|w| {
            let (ea, eb) = (excess(&w[0]), excess(&w[1]));
            let f = if ea != eb { ea / (ea - eb) } else { 0.5 };
            w[0].m_over_m + f.clamp(0.0, 1.0) * (w[1].m_over_m - w[0].m_over_m)
        })
        .collect();
    extent_from_zones(&convective_zones(first.convective == 1, &boundaries))
}

/// The profile of the model with unknowns `u` fitted at mass fraction `q`, on `total` rows
/// placed by `grid`: each leg is integrated once more, keeping every accepted step's dense
/// output, and the rows are read off that solution; `top` is the photosphere at `u` and
/// `ctx.tolerance` when it is known (else it is computed).
pub(crate) fn profile(
    ctx: &LegContext,
    u: &Unknowns,
    q: f64,
    grid: ProfileGrid,
    total: usize,
    top: Option<&SurfaceStart>,
) -> LegResult<Vec<ProfileRow>> {
    let fine = FineSolution::new(ctx, u, q, top)?;
    let places = fine.places(grid, total);
    let mut rows = Vec::with_capacity(places.len());
    let mut history = History::default();
    for place in places {
        let s = fine.structure_at(place);
        let (p, t) = (s.pressure_dyn_cm2, s.temperature_k);
        let (local, entropy) = if place == Place::Centre {
            let centre = fine.start.centre;
            let entropy = ctx
                .physics
                .eos()
                .specific_entropy_erg_g_k(&centre.eos, ctx.composition);
            (centre, entropy)
        } else {
            let near = history.start(p, t);
            let point = Point {
                mass_g: s.mass_g,
                radius_cm: s.radius_cm,
                pressure_dyn_cm2: p,
                temperature_k: t,
                l_over_m: s.l_over_m,
                near: None,
                before: None,
            };
            ctx.physics
                .eos()
                .state_and_entropy_at_pressure(p, t, ctx.composition, near.as_ref())
                .and_then(|(eos, entropy)| {
                    local_physics_with_eos(ctx.physics, ctx.composition, &point, eos)
                        .map(|local| (local, entropy))
                })
                .map_err(|e| fine.error(&s, e))?
        };
        history.push(local.eos);
        rows.push(row(ctx, &fine, &s, &local, entropy));
    }
    Ok(rows)
}

/// The equation-of-state results of the last three rows (with their ln P and ln rho, taken once
/// per row), to start the next row's inversion rho(P, T) close to its answer. Fixed-size: no
/// allocation per row.
#[derive(Debug, Default)]
struct History {
    rows: [Option<Remembered>; 3],
}

/// One row's equation-of-state result with ln P and ln rho.
#[derive(Debug, Clone, Copy)]
struct Remembered {
    state: EosState,
    ln_p: f64,
    ln_rho: f64,
}

impl History {
    fn push(&mut self, state: EosState) {
        let row = Remembered {
            state,
            ln_p: state.pressure_dyn_cm2.ln(),
            ln_rho: state.density_g_cm3.ln(),
        };
        self.rows = [Some(row), self.rows[0], self.rows[1]];
    }

    /// A start for the inversion at (`p`, `t`): the last row's state with ln rho and psi
    /// extrapolated to ln P = ln p along the rows by the parabola through the last three (the
    /// line through two, the last state alone at first), placed at (p, t). An inversion that
    /// starts from a nearby state extrapolates from its (P, T) to the target with the state's
    /// chi_rho and chi_T; placed at the target, the start is the extrapolated (rho, psi)
    /// itself. The rows lie along the star, where ln rho and psi are smooth in ln P, so the
    /// start is off by the cube of the rows' spacing and the inversion (Newton) needs one
    /// or two steps instead of three or four; its answer does not depend on the start
    /// ([`crate::physics::EquationOfState::state_at_pressure_near`]).
    fn start(&self, p: f64, t: f64) -> Option<EosState> {
        let last = self.rows[0]?.state;
        let x = p.ln();
        // (ln P, ln rho, psi) of the rows known so far (a prefix: rows are pushed in front).
        let mut points = [(0.0, 0.0, 0.0); 3];
        let mut known = 0;
        for r in self.rows.iter().flatten() {
            points[known] = (r.ln_p, r.ln_rho, r.state.degeneracy_psi);
            known += 1;
        }
        let points = &points[..known];
        // Lagrange weights at x through the distinct abscissae.
        let mut weights = [0.0; 3];
        for (i, w) in weights.iter_mut().enumerate().take(known) {
            *w = points
                .iter()
                .enumerate()
                .filter(|&(j, _)| j != i)
                .map(|(_, q)| (x - q.0) / (points[i].0 - q.0))
                .product();
        }
        let weights = &weights[..known];
        if !weights.iter().all(|w| w.is_finite()) {
            return Some(last);
        }
        let ln_rho: f64 = points.iter().zip(weights).map(|(q, w)| w * q.1).sum();
        let psi = if points.iter().all(|q| q.2.is_finite()) {
            points.iter().zip(weights).map(|(q, w)| w * q.2).sum()
        } else {
            last.degeneracy_psi
        };
        Some(EosState {
            density_g_cm3: ln_rho.exp(),
            pressure_dyn_cm2: p,
            temperature_k: t,
            degeneracy_psi: psi,
            ..last
        })
    }
}
