//! The profile of a converged model: rows on a mesh spread like the integrator's own steps
//! (dense where the solution changes fast), centre first, photosphere last.

use super::equations::{local_physics, Point, State, LN_P, LN_R, LN_T, LUM};
use super::error::LegError;
use super::legs::{Leg, LegContext, LegResult, LegRunner, LegSolution};
use super::model::{convective_zones, extent_from_zones};
use super::shooting::Unknowns;
use super::{centre, surface};
use crate::constants::G_CGS;
use crate::error::{Error, Result};
use crate::physics::EosState;
use serde::{Deserialize, Serialize};

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

/// One row of a ZAMS profile, centre first. CSV columns appear in this order.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
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

/// Points at which to record a leg: `count` values of x spread like the integrator's own steps
/// (dense where the solution changes fast), always including both ends.
fn mesh_like_steps(steps: &[f64], count: usize) -> Vec<f64> {
    let n = steps.len();
    if n < 2 || count < 2 {
        return steps.to_vec();
    }
    (0..count)
        .map(|j| {
            let s = j as f64 * (n - 1) as f64 / (count - 1) as f64;
            let i = (s.floor() as usize).min(n - 2);
            let f = s - i as f64;
            steps[i] + f * (steps[i + 1] - steps[i])
        })
        .collect()
}

fn row(
    ctx: &LegContext,
    leg: Leg,
    x: f64,
    y: &State,
    radius_cm: f64,
    near: Option<&EosState>,
) -> LegResult<(ProfileRow, EosState)> {
    let (m, _) = leg.mass_and_jacobian(x, ctx.total_mass_g);
    let r = y[LN_R].exp();
    let p = y[LN_P].exp();
    let t = y[LN_T].exp();
    let l = leg.luminosity_form(ctx).luminosity_erg_s(y[LUM]);
    let point = Point {
        mass_g: m,
        radius_cm: r,
        pressure_dyn_cm2: p,
        temperature_k: t,
        l_over_m: l / m,
        near,
    };
    let local = local_physics(ctx.physics, ctx.composition, &point)
        .map_err(|e| leg.error(x, ctx.total_mass_g, super::error::LegCause::Physics(e)))?;
    let rho = local.eos.density_g_cm3;
    let g = G_CGS * m / (r * r);
    let cs = (local.eos.gamma1 * p / rho).sqrt();
    let r_row = ProfileRow {
        mass_g: m,
        m_over_m: m / ctx.total_mass_g,
        radius_cm: r,
        r_over_r: r / radius_cm,
        pressure_dyn_cm2: p,
        temperature_k: t,
        density_g_cm3: rho,
        luminosity_erg_s: l,
        eps_pp_erg_g_s: local.rate.eps_pp_erg_g_s,
        eps_cno_erg_g_s: local.rate.eps_cno_erg_g_s,
        opacity_cm2_g: local.opacity_cm2_g,
        nabla_rad: local.nabla_rad,
        nabla_ad: local.eos.nabla_ad,
        nabla: local.nabla,
        convective: u8::from(local.convective()),
        mu: local.eos.mu,
        gamma1: local.eos.gamma1,
        brunt_n2_rad2_s2: g * g * rho * local.eos.delta * (local.eos.nabla_ad - local.nabla) / p,
        lamb_l1_rad_s: 2f64.sqrt() * cs / r,
        lamb_l2_rad_s: 6f64.sqrt() * cs / r,
    };
    Ok((r_row, local.eos))
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
/// spread like the integrator's steps: each leg is integrated once more, keeping every accepted
/// step's dense output, and the rows are read off that solution.
pub(crate) fn profile(
    ctx: &LegContext,
    u: &Unknowns,
    q: f64,
    total: usize,
) -> LegResult<Vec<ProfileRow>> {
    let mut runner = LegRunner::new(*ctx)?;
    let start = centre::start(ctx, u[0], u[1])?;
    let top = surface::start(ctx, u[2], u[3])?;
    let mut out_steps = Vec::new();
    let mut in_steps = Vec::new();
    runner.integrate(
        Leg::Outward,
        start.x0,
        q.ln(),
        start.y0,
        Some(&mut out_steps),
    )?;
    runner.integrate(
        Leg::Inward,
        top.x0,
        (1.0 - q).ln(),
        top.y0,
        Some(&mut in_steps),
    )?;
    let (outward, inward) = (LegSolution::new(out_steps), LegSolution::new(in_steps));
    let (steps_out, steps_in) = (outward.step_points(), inward.step_points());
    let share = steps_out.len() as f64 / (steps_out.len() + steps_in.len()) as f64;
    let n_out = ((total as f64 * share).round() as usize).clamp(3, total - 3);
    // The fitting point appears once (from the outward leg), so the inward leg gets one extra.
    let n_in = total - n_out + 1;
    let xs_out = mesh_like_steps(&steps_out, n_out);
    let xs_in = mesh_like_steps(&steps_in, n_in);
    let radius_cm = u[2].exp();
    let mut rows = Vec::with_capacity(total);
    let mut near = None;
    let mut add = |leg: Leg, solution: &LegSolution, x: f64, rows: &mut Vec<ProfileRow>| {
        // The first point is the leg's start exactly; the others come from the dense output.
        let y = match (leg, x) {
            (Leg::Outward, x) if x == start.x0 => start.y0,
            (Leg::Inward, x) if x == top.x0 => top.y0,
            _ => solution.at(x).unwrap_or(start.y0),
        };
        let (r, eos) = row(ctx, leg, x, &y, radius_cm, near.as_ref())?;
        near = Some(eos);
        rows.push(r);
        Ok::<(), LegError>(())
    };
    for &x in &xs_out {
        add(Leg::Outward, &outward, x, &mut rows)?;
    }
    for &x in xs_in.iter().rev().skip(1) {
        add(Leg::Inward, &inward, x, &mut rows)?;
    }
    Ok(rows)
}
