//! Starting the outward leg off the singular centre with the series expansions
//! (Kippenhahn & Weigert 1990, §11.3):
//!
//! r = (3 m / (4 pi rho_c))^(1/3),  P = P_c - (3 G / (8 pi)) (4 pi rho_c / 3)^(4/3) m^(2/3),
//! L = eps_c m,  ln T = ln T_c + nabla_c (ln P - ln P_c),
//!
//! where nabla_c is the convection law's gradient at the centre (nabla_ad in a convective core,
//! nabla_rad with L/m = eps_c in a radiative one; the last form is the radiative series
//! T^4 = T_c^4 - (kappa_c eps_c / (2 a c)) (3/(4 pi))^(2/3) rho_c^(4/3) m^(2/3) to first order).

use super::equations::{
    local_physics, LocalPhysics, Point, State, INT_CNO, INT_EPS, INT_GRAVITY, INT_THERMAL, LN_P,
    LN_R, LN_T, LUM,
};
use super::legs::{LegContext, LegResult};
use crate::constants::G_CGS;
use crate::error::{LegCause, LegError, LegName};
use std::f64::consts::PI;

/// Mass fraction at which the outward leg starts: the first neglected series terms are of
/// relative order (m/M)^(4/3) ~ 1e-13 there, below every tolerance used.
pub const CENTRE_START_MASS_FRACTION: f64 = 1e-10;

/// The start of the outward leg.
#[derive(Debug, Clone, Copy)]
pub struct CentreStart {
    /// x0 = ln(m0 / M).
    pub x0: f64,
    /// State at m0.
    pub y0: State,
    /// Local physics at the centre itself (P_c, T_c).
    pub centre: LocalPhysics,
    /// ln P_c and ln T_c, cgs.
    ln_pc: f64,
    ln_tc: f64,
}

/// The structure by the centre series at one mass (see the module documentation).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SeriesPoint {
    /// Radius, cm.
    pub radius_cm: f64,
    /// Pressure, dyn cm^-2.
    pub pressure_dyn_cm2: f64,
    /// Temperature, K.
    pub temperature_k: f64,
    /// Luminosity eps_c m, erg s^-1.
    pub luminosity_erg_s: f64,
}

impl CentreStart {
    /// Central pressure, dyn cm^-2.
    pub fn pressure_dyn_cm2(&self) -> f64 {
        self.ln_pc.exp()
    }

    /// Central temperature, K.
    pub fn temperature_k(&self) -> f64 {
        self.ln_tc.exp()
    }

    /// The series at mass `mass_g` (0 <= m <= m0, where its neglected terms stay below
    /// 1e-13 relative; the centre itself at m = 0).
    pub fn series(&self, mass_g: f64) -> SeriesPoint {
        series(&self.centre, self.ln_pc, self.ln_tc, mass_g)
    }
}

/// The series at mass `m` from the central values: r, P, ln T, L.
fn series(centre: &LocalPhysics, ln_pc: f64, ln_tc: f64, m: f64) -> SeriesPoint {
    let rho_c = centre.eos.density_g_cm3;
    let pc = ln_pc.exp();
    let p = pc
        - 3.0 * G_CGS / (8.0 * PI) * (4.0 * PI * rho_c / 3.0).powf(4.0 / 3.0) * m.powf(2.0 / 3.0);
    SeriesPoint {
        radius_cm: (3.0 * m / (4.0 * PI * rho_c)).cbrt(),
        pressure_dyn_cm2: p,
        temperature_k: (ln_tc + centre.nabla * (p.ln() - ln_pc)).exp(),
        luminosity_erg_s: centre.rate.total_erg_g_s() * m,
    }
}

/// Series start at m0 = [`CENTRE_START_MASS_FRACTION`] M for central pressure e^`ln_pc` and
/// temperature e^`ln_tc`.
pub fn start(ctx: &LegContext, ln_pc: f64, ln_tc: f64) -> LegResult<CentreStart> {
    let pc = ln_pc.exp();
    let tc = ln_tc.exp();
    let m0 = CENTRE_START_MASS_FRACTION * ctx.total_mass_g;
    let error = |cause: LegCause| LegError {
        leg: LegName::Centre,
        variable: "ln(m/M)",
        x: CENTRE_START_MASS_FRACTION.ln(),
        mass_g: m0,
        cause,
    };
    let physics = |e| error(LegCause::Physics(e));
    let eos = ctx
        .physics
        .eos()
        .state_at_pressure(pc, tc, ctx.composition)
        .map_err(physics)?;
    let rho_c = eos.density_g_cm3;
    let r0 = (3.0 * m0 / (4.0 * PI * rho_c)).cbrt();
    let rate = ctx
        .physics
        .rates()
        .rate(rho_c, tc, ctx.composition)
        .map_err(physics)?;
    let eps_c = rate.total_erg_g_s();
    let point = Point {
        mass_g: m0,
        radius_cm: r0,
        pressure_dyn_cm2: pc,
        temperature_k: tc,
        l_over_m: eps_c,
        near: Some(&eos),
        before: None,
    };
    let centre = local_physics(ctx.physics, ctx.composition, &point).map_err(physics)?;
    let p0 = series(&centre, ln_pc, ln_tc, m0).pressure_dyn_cm2;
    if p0 <= 0.0 || eps_c <= 0.0 {
        return Err(error(LegCause::InvalidStart(format!(
            "no valid centre for P_c = {pc:.4e}, T_c = {tc:.4e} (eps_c = {eps_c:.3e})"
        ))));
    }
    let mut y0 = State::zeros();
    y0[LN_R] = r0.ln();
    y0[LN_P] = p0.ln();
    y0[LN_T] = ln_tc + centre.nabla * (p0.ln() - ln_pc);
    y0[LUM] = (eps_c * m0).ln();
    y0[INT_EPS] = eps_c * m0 / ctx.scales.luminosity_erg_s;
    y0[INT_CNO] = rate.eps_cno_erg_g_s * m0 / ctx.scales.luminosity_erg_s;
    y0[INT_THERMAL] = 3.0 * pc / rho_c * m0 / ctx.scales.energy_erg;
    // Integral of G m / r dm for uniform density: (3/5) G m0^2 / r0.
    y0[INT_GRAVITY] = 0.6 * G_CGS * m0 * m0 / r0 / ctx.scales.energy_erg;
    Ok(CentreStart {
        x0: CENTRE_START_MASS_FRACTION.ln(),
        y0,
        centre,
        ln_pc,
        ln_tc,
    })
}
