//! A converged model: the profile on a mesh and the summary quantities with their checks.

use super::equations::{
    local_physics, Point, State, INT_CNO, INT_EPS, INT_GRAVITY, INT_THERMAL, LN_P, LN_R, LN_T, LUM,
};
use super::legs::{integrate, integrate_through, step_points, Leg, LegContext, LegMonitor};
use super::shooting::LegEnds;
use super::{centre, surface, ZamsSettings};
use crate::constants::{G_CGS, L_SUN_ERG_S, R_SUN_CM, YEAR_S};
use crate::error::Result;
use crate::numerics::newton::{IterationRecord, NewtonReport};
use crate::output::zams::{ProfileRow, ZamsSummary};
use crate::structure::Unknowns;

/// A converged ZAMS model.
#[derive(Debug, Clone)]
pub struct ZamsModel {
    /// Summary quantities.
    pub summary: ZamsSummary,
    /// Profile rows, centre first.
    pub profile: Vec<ProfileRow>,
    /// The converged unknowns (ln P_c, ln T_c, ln R, ln L).
    pub unknowns: Unknowns,
    /// Newton history.
    pub history: Vec<IterationRecord>,
}

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

fn row(ctx: &LegContext, leg: Leg, x: f64, y: &State, radius_cm: f64) -> Result<ProfileRow> {
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
        near: None,
    };
    let local = local_physics(ctx.physics, ctx.composition, &point)?;
    let rho = local.eos.density_g_cm3;
    let g = G_CGS * m / (r * r);
    let cs = (local.eos.gamma1 * p / rho).sqrt();
    Ok(ProfileRow {
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
    })
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

/// Convective zones as (lower, upper) mass fractions, from the located boundaries and whether
/// the centre is convective.
pub fn convective_zones(centre_convective: bool, boundaries: &[f64]) -> Vec<(f64, f64)> {
    let mut edges: Vec<f64> = boundaries.to_vec();
    edges.sort_by(f64::total_cmp);
    let mut zones = Vec::new();
    let mut convective = centre_convective;
    let mut lower = 0.0;
    for &e in &edges {
        if convective {
            zones.push((lower, e));
        }
        lower = e;
        convective = !convective;
    }
    if convective {
        zones.push((lower, 1.0));
    }
    zones
}

/// How close (in mass fraction) to the surface a convective zone must reach to count as reaching
/// it: the photosphere and a thin layer below it can be radiative above a convective envelope.
pub const SURFACE_ZONE_MARGIN: f64 = 1e-3;

/// Mass fractions of the convective core (the zone containing the centre, else 0) and of the
/// convective envelope (the outermost zone if its top lies within [`SURFACE_ZONE_MARGIN`] of the
/// surface, else 0). A star convective from the centre to within that margin of the surface is
/// fully convective and reports 1 for both.
pub fn extent_from_zones(zones: &[(f64, f64)]) -> (f64, f64) {
    let reaches_surface = |z: &(f64, f64)| z.1 > 1.0 - SURFACE_ZONE_MARGIN;
    let core = zones.first().filter(|z| z.0 == 0.0).map_or(0.0, |z| {
        if reaches_surface(z) {
            1.0
        } else {
            z.1
        }
    });
    let envelope = zones
        .last()
        .filter(|z| reaches_surface(z))
        .map_or(0.0, |z| 1.0 - z.0);
    (core, envelope)
}

/// The profile on `settings.profile_points()` rows, spread like the integrator's steps.
fn profile(
    settings: &ZamsSettings,
    ctx: &LegContext,
    u: &Unknowns,
    monitor: &LegMonitor,
) -> Result<Vec<ProfileRow>> {
    let q = settings.fit_mass_fraction();
    let start = centre::start(ctx, u[0], u[1])?;
    let top = surface::start(ctx, u[2], u[3])?;
    let steps_out = step_points(ctx, Leg::Outward, start.x0, q.ln(), start.y0, monitor)?;
    let steps_in = step_points(ctx, Leg::Inward, top.x0, (1.0 - q).ln(), top.y0, monitor)?;
    let total = settings.profile_points();
    let n_out = ((total as f64 * steps_out.len() as f64 / (steps_out.len() + steps_in.len()) as f64).round() as usize)
        .clamp(3, total - 3);
    // The fitting point appears once (from the outward leg), so the inward leg gets one extra.
    let n_in = total - n_out + 1;
    let xs_out = mesh_like_steps(&steps_out, n_out);
    let xs_in = mesh_like_steps(&steps_in, n_in);
    let ys_out = integrate_through(ctx, Leg::Outward, &xs_out, start.y0, monitor)?;
    let ys_in = integrate_through(ctx, Leg::Inward, &xs_in, top.y0, monitor)?;
    let radius_cm = u[2].exp();
    let mut rows = Vec::with_capacity(total);
    for (x, y) in xs_out.iter().zip(&ys_out) {
        rows.push(row(ctx, Leg::Outward, *x, y, radius_cm)?);
    }
    for (x, y) in xs_in.iter().zip(&ys_in).rev().skip(1) {
        rows.push(row(ctx, Leg::Inward, *x, y, radius_cm)?);
    }
    Ok(rows)
}

/// Assemble the summary and, if asked, the profile of the converged unknowns.
///
/// The summary's integrals and convective boundaries come from the converged legs themselves:
/// `legs`, the iteration's last evaluation when it is at the solution, or else one fresh
/// integration of each leg. The profile re-integrates segment by segment onto its mesh.
pub fn build(
    settings: &ZamsSettings,
    ctx: &LegContext,
    report: &NewtonReport<4>,
    rhs_before: u64,
    legs: Option<&LegEnds>,
) -> Result<ZamsModel> {
    let u = report.solution;
    let monitor = LegMonitor::default();
    let q = settings.fit_mass_fraction();
    let start = centre::start(ctx, u[0], u[1])?;
    let fresh;
    let legs = match legs {
        Some(l) => l,
        None => {
            // The atmosphere is integrated only here: the summary needs just T_eff from R and L.
            let top = surface::start(ctx, u[2], u[3])?;
            let out = integrate(ctx, Leg::Outward, start.x0, q.ln(), start.y0, &monitor)?;
            let inn = integrate(ctx, Leg::Inward, top.x0, (1.0 - q).ln(), top.y0, &monitor)?;
            fresh = LegEnds {
                u,
                tolerance: ctx.tolerance,
                out,
                inn,
                boundaries: monitor.boundaries.borrow().clone(),
                boundary_limit_reached: monitor.boundary_limit_reached.get(),
            };
            &fresh
        }
    };
    let (out_end, in_end) = (legs.out, legs.inn);
    let boundaries = &legs.boundaries;
    let profile_rows = if settings.wants_profile() || legs.boundary_limit_reached {
        profile(settings, ctx, &u, &monitor)?
    } else {
        Vec::new()
    };
    let (core, envelope) = if legs.boundary_limit_reached {
        convective_extent(&profile_rows)
    } else {
        extent_from_zones(&convective_zones(start.centre.convective(), boundaries))
    };
    let profile = if settings.wants_profile() {
        profile_rows
    } else {
        Vec::new()
    };
    let radius_cm = u[2].exp();
    let luminosity = u[3].exp();
    // The inward leg accumulates its integrals with dm < 0: the star's total is out - in.
    let integral = |k: usize| out_end[k] - in_end[k];
    let eps_total = integral(INT_EPS) * ctx.scales.luminosity_erg_s;
    let cno_total = integral(INT_CNO) * ctx.scales.luminosity_erg_s;
    let thermal = integral(INT_THERMAL);
    let gravity = integral(INT_GRAVITY);
    let m = ctx.total_mass_g;
    let comp = ctx.composition;
    let centre_eos = start.centre.eos;
    let summary = ZamsSummary {
        mass_msun: settings.mass_msun(),
        x: comp.x(),
        z: comp.z(),
        physics: ctx.physics.describe(),
        converged: true,
        iterations: report.iterations,
        fit_mismatch: report.residual_norm,
        fit_mass_fraction: q,
        radius_rsun: Some(radius_cm / R_SUN_CM),
        luminosity_lsun: Some(luminosity / L_SUN_ERG_S),
        teff_k: Some(surface::effective_temperature_k(radius_cm, luminosity)),
        log_g_cgs: Some((G_CGS * m / (radius_cm * radius_cm)).log10()),
        central_temperature_k: Some(u[1].exp()),
        central_density_g_cm3: Some(centre_eos.density_g_cm3),
        central_pressure_dyn_cm2: Some(u[0].exp()),
        central_degeneracy: centre_eos
            .degeneracy_psi
            .is_finite()
            .then_some(centre_eos.degeneracy_psi),
        convective_core_mass_fraction: Some(core),
        convective_envelope_mass_fraction: Some(envelope),
        cno_luminosity_fraction: Some(cno_total / eps_total),
        eddington_ratio: Some(luminosity / super::eddington_luminosity_erg_s(m, comp.x())),
        kelvin_helmholtz_time_yr: Some(G_CGS * m * m / (radius_cm * luminosity) / YEAR_S),
        dynamical_time_s: Some((radius_cm.powi(3) / (G_CGS * m)).sqrt()),
        nuclear_time_yr: Some(super::nuclear_time_yr(m, comp.x(), luminosity)),
        virial_residual: Some((thermal / gravity - 1.0).abs()),
        luminosity_residual: Some((eps_total / luminosity - 1.0).abs()),
        rhs_evaluations: rhs_before + monitor.evaluations.get(),
    };
    Ok(ZamsModel {
        summary,
        profile,
        unknowns: u,
        history: report.history.clone(),
    })
}

impl ZamsSummary {
    /// The summary of a model that did not converge: identification and the iteration count,
    /// with every physical field `None` (a non-converged model is never shown as a result).
    pub fn not_converged(
        settings: &ZamsSettings,
        report: &NewtonReport<4>,
        rhs_evaluations: u64,
    ) -> Self {
        ZamsSummary {
            mass_msun: settings.mass_msun(),
            x: settings.composition().x(),
            z: settings.composition().z(),
            physics: settings.physics().describe(),
            converged: false,
            iterations: report.iterations,
            fit_mismatch: report.residual_norm,
            fit_mass_fraction: settings.fit_mass_fraction(),
            radius_rsun: None,
            luminosity_lsun: None,
            teff_k: None,
            log_g_cgs: None,
            central_temperature_k: None,
            central_density_g_cm3: None,
            central_pressure_dyn_cm2: None,
            central_degeneracy: None,
            convective_core_mass_fraction: None,
            convective_envelope_mass_fraction: None,
            cno_luminosity_fraction: None,
            eddington_ratio: None,
            kelvin_helmholtz_time_yr: None,
            dynamical_time_s: None,
            nuclear_time_yr: None,
            virial_residual: None,
            luminosity_residual: None,
            rhs_evaluations,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn zones_and_extents() {
        // Radiative centre, one boundary at 0.98: a convective envelope of 0.02 M.
        let z = convective_zones(false, &[0.98]);
        assert_eq!(z, vec![(0.98, 1.0)]);
        assert_eq!(extent_from_zones(&z), (0.0, 0.020000000000000018));
        // Convective core to 0.2, radiative above, thin surface zone from 0.9999999.
        let z = convective_zones(true, &[0.9999999, 0.2]);
        assert_eq!(z, vec![(0.0, 0.2), (0.9999999, 1.0)]);
        let (core, env) = extent_from_zones(&z);
        assert_eq!(core, 0.2);
        assert!((env - 1e-7).abs() < 1e-15);
        // Convective from the centre to 1 - 1e-9 (a radiative photosphere on top): fully
        // convective.
        assert_eq!(
            extent_from_zones(&convective_zones(true, &[1.0 - 1e-9])),
            (1.0, 1.0)
        );
        // A zone ending well below the surface is not an envelope.
        assert_eq!(
            extent_from_zones(&convective_zones(false, &[0.5, 0.9])),
            (0.0, 0.0)
        );
    }
}
