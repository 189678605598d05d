//! The four structure equations of a static, chemically homogeneous star in the mass coordinate:
//!
//! dr/dm = 1 / (4 pi r^2 rho),  dP/dm = -G m / (4 pi r^4),  dL/dm = eps_nuc,
//! dT/dm = -(G m T / (4 pi r^4 P)) nabla
//!
//! (Kippenhahn & Weigert 1990, eqs. 10.1–10.4, without the gravothermal term: this is the ZAMS).
//! The state carries y = (ln r, ln P, ln T, L-variable) and four running integrals used for the
//! model's consistency checks. The luminosity variable is
//! ln L on the outward leg (L > 0 there, and ln L keeps its relative accuracy near the centre,
//! where L ~ eps_c m is tiny) and L / L_scale on the inward leg (a poor trial can use up all of
//! L before the fitting mass; the linear form then stays finite and Newton still sees a
//! mismatch, where ln L would end the integration).

use crate::constants::G_CGS;
use crate::error::PhysicsError;
use crate::numerics::exponential::FastExp;
use crate::physics::{convection, Composition, ConvectionPoint, EnergyRate, EosState, PhysicsSet};
use std::f64::consts::PI;

/// Number of components of the integrated state.
pub const STATE_LEN: usize = 8;
/// Index of ln r in the state.
pub const LN_R: usize = 0;
/// Index of ln P in the state.
pub const LN_P: usize = 1;
/// Index of ln T in the state.
pub const LN_T: usize = 2;
/// Index of the luminosity variable (see [`LuminosityForm`]).
pub const LUM: usize = 3;

/// How the state holds the luminosity.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum LuminosityForm {
    /// y\[LUM\] = ln L (L in erg s^-1).
    Log,
    /// y\[LUM\] = L / scale.
    Linear {
        /// The scale, erg s^-1.
        scale_erg_s: f64,
    },
}

impl LuminosityForm {
    /// L in erg s^-1 from the state component.
    pub fn luminosity_erg_s(&self, y_lum: f64) -> f64 {
        match self {
            LuminosityForm::Log => y_lum.fast_exp(),
            LuminosityForm::Linear { scale_erg_s } => y_lum * scale_erg_s,
        }
    }

    /// The state component for luminosity `l_erg_s` (positive for the log form).
    pub fn component(&self, l_erg_s: f64) -> f64 {
        match self {
            LuminosityForm::Log => l_erg_s.ln(),
            LuminosityForm::Linear { scale_erg_s } => l_erg_s / scale_erg_s,
        }
    }

    /// d(component)/dm for dL/dm = `eps` at luminosity `l_erg_s`.
    fn derivative(&self, eps: f64, l_erg_s: f64) -> f64 {
        match self {
            LuminosityForm::Log => eps / l_erg_s,
            LuminosityForm::Linear { scale_erg_s } => eps / scale_erg_s,
        }
    }
}
/// Index of the running integral of eps_nuc dm, in units of [`Scales::luminosity_erg_s`].
pub const INT_EPS: usize = 4;
/// Index of the running integral of eps_CNO dm, same units.
pub const INT_CNO: usize = 5;
/// Index of the running integral of 3 P / rho dm, in units of [`Scales::energy_erg`].
pub const INT_THERMAL: usize = 6;
/// Index of the running integral of G m / r dm, same units.
pub const INT_GRAVITY: usize = 7;

/// The integrated state vector.
pub type State = nalgebra::SVector<f64, STATE_LEN>;

/// Scales that make the running integrals of order one.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Scales {
    /// Luminosity scale, erg s^-1.
    pub luminosity_erg_s: f64,
    /// Energy scale, erg.
    pub energy_erg: f64,
}

/// Everything local at one point of the star.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LocalPhysics {
    /// Thermodynamic state (density, derivatives, ionisation).
    pub eos: EosState,
    /// Opacity, cm^2 g^-1.
    pub opacity_cm2_g: f64,
    /// Nuclear energy generation.
    pub rate: EnergyRate,
    /// Radiative gradient.
    pub nabla_rad: f64,
    /// Actual gradient from the convection law.
    pub nabla: f64,
    /// Local gravity G m / r^2, cm s^-2.
    pub gravity_cm_s2: f64,
}

impl LocalPhysics {
    /// Schwarzschild criterion: convective where nabla_rad > nabla_ad.
    pub fn convective(&self) -> bool {
        self.nabla_rad > self.eos.nabla_ad
    }
}

/// Where the point is and what is known near it.
#[derive(Debug, Clone, Copy)]
pub struct Point<'a> {
    /// Mass coordinate m, g.
    pub mass_g: f64,
    /// Radius r, cm.
    pub radius_cm: f64,
    /// Pressure, dyn cm^-2.
    pub pressure_dyn_cm2: f64,
    /// Temperature, K.
    pub temperature_k: f64,
    /// L / m, erg g^-1 s^-1, used in nabla_rad (so that the centre limit L/m -> eps_c can be
    /// passed directly).
    pub l_over_m: f64,
    /// The equation-of-state result at a nearby point, to start the inversion from.
    pub near: Option<&'a EosState>,
    /// The result at the point before `near` along the same path (with `near`, a start to
    /// second order: [`crate::physics::EquationOfState::state_at_pressure_along`]).
    pub before: Option<&'a EosState>,
}

/// Evaluate every law at `point`. Inlined, as is [`derivatives_in_mass`]: each returns the
/// whole local physics, which the right-hand side would otherwise copy at every call.
#[inline]
pub fn local_physics(
    physics: &PhysicsSet,
    comp: &Composition,
    point: &Point,
) -> Result<LocalPhysics, PhysicsError> {
    let (p, t) = (point.pressure_dyn_cm2, point.temperature_k);
    let eos = match (point.near, point.before) {
        (Some(n), Some(b)) => physics.eos().state_at_pressure_along(p, t, comp, n, b)?,
        (Some(n), None) => physics.eos().state_at_pressure_near(p, t, comp, n)?,
        (None, _) => physics.eos().state_at_pressure(p, t, comp)?,
    };
    local_physics_with_eos(physics, comp, point, eos)
}

/// Evaluate every law at `point` whose equation-of-state result `eos` is known (at the
/// point's P and T).
#[inline]
pub fn local_physics_with_eos(
    physics: &PhysicsSet,
    comp: &Composition,
    point: &Point,
    eos: EosState,
) -> Result<LocalPhysics, PhysicsError> {
    let Point {
        mass_g,
        radius_cm,
        pressure_dyn_cm2,
        temperature_k,
        l_over_m,
        ..
    } = *point;
    let rho = eos.density_g_cm3;
    let opacity = physics.opacity().kappa(rho, temperature_k, comp)?;
    // Below the rates' negligible temperature (the cool envelope) eps = 0, without evaluating
    // the law.
    let rate = if physics.rates().negligible_at(rho, temperature_k) {
        EnergyRate::default()
    } else {
        physics.rates().rate(rho, temperature_k, comp)?
    };
    // nabla_rad = 3 kappa L P / (16 pi a c G m T^4), written with L/m.
    let nabla_rad = convection::nabla_rad(opacity, l_over_m, pressure_dyn_cm2, 1.0, temperature_k);
    let gravity = if radius_cm > 0.0 {
        G_CGS * mass_g / (radius_cm * radius_cm)
    } else {
        0.0
    };
    let point = ConvectionPoint {
        nabla_rad,
        nabla_ad: eos.nabla_ad,
        pressure_dyn_cm2,
        temperature_k,
        density_g_cm3: rho,
        gravity_cm_s2: gravity,
        opacity_cm2_g: opacity,
        cp_erg_g_k: eos.cp_erg_g_k,
        delta: eos.delta,
    };
    let nabla = physics.convection().nabla(&point)?;
    if !(nabla.is_finite() && opacity.is_finite() && opacity > 0.0) {
        return Err(PhysicsError::new(
            "structure",
            format!("non-finite local physics (kappa {opacity:e}, nabla {nabla:e})"),
            rho,
            temperature_k,
        ));
    }
    Ok(LocalPhysics {
        eos,
        opacity_cm2_g: opacity,
        rate,
        nabla_rad,
        nabla,
        gravity_cm_s2: gravity,
    })
}

/// dy/dm at mass `mass_g` for the state `y`, together with the local physics.
#[inline]
pub fn derivatives_in_mass(
    physics: &PhysicsSet,
    comp: &Composition,
    scales: &Scales,
    mass_g: f64,
    y: &State,
    form: LuminosityForm,
    (near, before): (Option<&EosState>, Option<&EosState>),
) -> Result<(State, LocalPhysics), PhysicsError> {
    let r = y[LN_R].fast_exp();
    let p = y[LN_P].fast_exp();
    let t = y[LN_T].fast_exp();
    let l = form.luminosity_erg_s(y[LUM]);
    let point = Point {
        mass_g,
        radius_cm: r,
        pressure_dyn_cm2: p,
        temperature_k: t,
        l_over_m: l / mass_g,
        near,
        before,
    };
    let local = local_physics(physics, comp, &point)?;
    let rho = local.eos.density_g_cm3;
    let dlnp_dm = -G_CGS * mass_g / (4.0 * PI * r.powi(4) * p);
    let mut dy = State::zeros();
    dy[LN_R] = 1.0 / (4.0 * PI * r.powi(3) * rho);
    dy[LN_P] = dlnp_dm;
    dy[LN_T] = local.nabla * dlnp_dm;
    dy[LUM] = form.derivative(local.rate.total_erg_g_s(), l);
    dy[INT_EPS] = local.rate.total_erg_g_s() / scales.luminosity_erg_s;
    dy[INT_CNO] = local.rate.eps_cno_erg_g_s / scales.luminosity_erg_s;
    dy[INT_THERMAL] = 3.0 * p / rho / scales.energy_erg;
    dy[INT_GRAVITY] = G_CGS * mass_g / r / scales.energy_erg;
    Ok((dy, local))
}
