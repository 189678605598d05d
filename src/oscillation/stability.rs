//! Vibrational stability of radial modes of a ZAMS model in the quasi-adiabatic approximation:
//! the work integral of nuclear driving (the epsilon mechanism) against radiative damping.
//!
//! # The growth rate
//!
//! A mode with time dependence exp(i omega t) and adiabatic eigenfunctions grows in amplitude
//! as exp(eta t) with (Ledoux 1941, ApJ 94, 537; Cox 1980, *Theory of Stellar Pulsation*, §9.3
//! and ch. 10, as recalled; re-derived here from the energy equation)
//!
//! eta = W / (2 omega^2 I),  W = int (dT/T) d(eps - dL/dm) dm,  I = int |xi_r|^2 dm,
//!
//! where W is the work per unit time averaged over a cycle (times 2/amplitude^2: the time
//! average of Re(a e^(i omega t)) Re(b e^(i omega t)) is Re(a b*)/2, the mean pulsation
//! energy is omega^2 I/2 and grows at 2 eta), d denotes a Lagrangian perturbation and the
//! perturbations are those of the adiabatic eigenfunction (real). Positive eta: the mode is
//! vibrationally unstable. With xi_r, the Lagrangian pressure perturbation dP/P of the mode
//! (module `eigenfunction`) and the model's local physics:
//!
//! - dT/T = nabla_ad dP/P and drho/rho = (1/Gamma_1) dP/P (adiabatic);
//! - d eps/eps = nu dT/T + lambda drho/rho with nu = dln eps/dln T (rho fixed) and
//!   lambda = dln eps/dln rho (T fixed) of the total rate, the rates responding at once with
//!   their equilibrium exponents;
//! - the radiative luminosity L_rad = -(4 pi r^2)^2 (4 a c T^3/(3 kappa)) dT/dm, which is
//!   L nabla/nabla_rad (all of L in a radiative zone), perturbed:
//!   dL_rad/L_rad = 4 xi_r/r + 4 dT/T - dkappa/kappa + d(dT/T)/dln T, with
//!   dkappa/kappa = kappa_T dT/T + kappa_rho drho/rho (Cox 1980, ch. 9, as recalled; derived
//!   here from the diffusion equation, using d(dT)/dm = d(dT)/dm for the Lagrangian
//!   perturbation in the mass coordinate); the convective flux is frozen, dL_conv = 0.
//!
//! The local derivatives nu, lambda, kappa_T = dln kappa/dln T and
//! kappa_rho = dln kappa/dln rho come from central differences of the laws of the model's
//! [`PhysicsSet`] at each profile row (steps of [`LOG_STEP`] in ln rho and ln T).
//!
//! # Where the quasi-adiabatic approximation stops
//!
//! Near the surface the thermal time of the overlying layers, tau(m) = int_m^M c_V T dm / L,
//! falls below the period and the perturbations are no longer adiabatic; there dL is about
//! constant (frozen in) and does no work. The integral is therefore taken from the centre to
//! the transition point where tau = Pi = 2 pi/omega (Cox 1980, ch. 10: the transition region,
//! as recalled), with dL constant above it. The point is located inside a profile cell, with
//! ln(tau/Pi) linear across the cell, and the integrands linear up to it, so that the growth
//! rate is a continuous function of the model. The damping term is integrated by parts, so that
//! only first derivatives of the eigenfunction enter:
//! -int_0^m_t (dT/T) d(dL)/dm dm = -(dT/T) dL |_(m_t) + int_0^m_t dL d(dT/T)/dm dm.
//!
//! # What the approximation leaves out
//!
//! The non-adiabatic structure of the outer layers (the transition treatment above is only
//! a cut), any coupling of convection to the pulsation (the convective flux is frozen), the
//! kappa mechanism beyond what the adiabatic eigenfunction and the frozen flux give, the
//! strange modes of luminous envelopes (which exist only in non-adiabatic calculations), the
//! departure of the nuclear rates from their equilibrium response on the pulsation time scale,
//! and any non-linear saturation: the result is the onset of weak linear driving of the
//! fundamental, not a statement that such stars cannot exist (docs/references.md §8.7).
//!
//! # The pulsational instability mass
//!
//! [`pulsational_instability_mass`] follows the growth per radian eta/omega of the radial
//! fundamental of ZAMS models up the mass range: evaluated at [`PULSATION_SEARCH_MSUN`] until it
//! turns positive, then the sign change is located by the Illinois method in ln M (to
//! [`PULSATION_MASS_TOLERANCE`]). eta/omega is a smooth function of the mass here (nuclear
//! driving grows and radiative damping falls as radiation pressure softens the star).
//!
//! # The eigenfunction on the profile rows
//!
//! The mode's xi_r/r and dP/P are known at the solver's step boundaries. Between them they are
//! cubic Hermite polynomials in x = r/R whose slopes come from the radial equations
//! themselves, x d(xi_r/r)/dx = -3 xi_r/r - (dP/P)/Gamma_1 (continuity) and
//! x d(dP/P)/dx = V ((c1 sigma^2 + 4) xi_r/r + dP/P) (momentum: d(dP)/dm =
//! (omega^2 + 4 G m/r^3) xi_r/(4 pi r^2)), with sigma^2 = omega^2 R^3/(G M) (derived here from
//! the definitions of module `equilibrium`); at the profile rows the slope of dP/P is taken
//! from the same equation with the row's own V and c1.

use super::equilibrium::{point_at, Equilibrium};
use super::search::{find_modes, OscillationSettings};
use super::spectrum::Mode;
use super::tabulated::TabulatedModel;
use super::zams::tabulated_from_profile;
use crate::constants::G_CGS;
use crate::error::{Error, Result};
use crate::numerics::scalar::illinois;
use crate::physics::{Composition, PhysicsSet};
use crate::structure::{solve, ProfileRow, ZamsSettings, MASS_RANGE_MSUN};
use std::f64::consts::PI;

/// Step in ln rho and ln T of the central differences of the laws: the laws are smooth (see
/// DEVELOPERS.md), so the O(h^2) error, about 1e-8, is far below what the growth rate needs.
pub const LOG_STEP: f64 = 1e-4;

/// The quasi-adiabatic stability of one radial mode (module documentation).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RadialStability {
    /// Amplitude growth rate eta, s^-1: positive if the mode is vibrationally unstable.
    pub growth_rate_per_s: f64,
    /// The part of eta from nuclear energy generation (driving), s^-1.
    pub nuclear_part_per_s: f64,
    /// The part of eta from the radiative flux (mostly damping), s^-1.
    pub radiative_part_per_s: f64,
    /// eta/omega: the growth per radian of oscillation.
    pub growth_per_radian: f64,
    /// Mass fraction m/M of the transition point, where the thermal time of the layers above
    /// equals the period (the work integral stops there).
    pub transition_mass_fraction: f64,
}

/// Masses at which [`pulsational_instability_mass`] first evaluates the growth rate, M_sun:
/// increasing, up to the largest mass of [`MASS_RANGE_MSUN`].
pub const PULSATION_SEARCH_MSUN: [f64; 6] = [10.0, 20.0, 40.0, 70.0, 110.0, 150.0];
/// Profile rows of each model of the search: the mass found for X = 0.70, Z = 0.02 moves by 0.08
/// per cent from 1000 to 2000 rows and by 0.05 per cent from 2000 to 4000.
pub const PULSATION_PROFILE_ROWS: usize = 2000;
/// Relative accuracy of the mass found (in ln M): far below the 10 per cent the mass moves when
/// the transition criterion changes by a factor of 6 either way (module documentation).
pub const PULSATION_MASS_TOLERANCE: f64 = 1e-4;

/// Where the radial fundamental of the ZAMS models turns vibrationally unstable.
#[derive(Debug, Clone, PartialEq)]
pub struct PulsationalLimit {
    /// The mass above which it grows, M_sun; `None` if it is stable at every mass searched.
    pub mass_msun: Option<f64>,
    /// (mass in M_sun, eta/omega) of every model evaluated, in the order evaluated.
    pub evaluations: Vec<(f64, f64)>,
}

/// The quasi-adiabatic stability of the radial fundamental of the ZAMS model of `mass_msun`
/// for `composition` and `physics`, on a profile of `rows` rows.
///
/// Errors: those of the ZAMS solve ([`crate::structure::solve`]), of the mode search and of
/// [`radial_stability`].
pub fn fundamental_stability(
    mass_msun: f64,
    composition: &Composition,
    physics: &PhysicsSet,
    rows: usize,
) -> Result<RadialStability> {
    let model = solve(&ZamsSettings::new(
        mass_msun,
        *composition,
        physics.clone(),
    )?)?;
    let profile = model.profile(rows)?;
    let oscillation_model = tabulated_from_profile(&profile)?;
    let settings = OscillationSettings::default().with_eigenfunctions(true);
    let modes = find_modes(&oscillation_model, 0, 1, &settings)?;
    let fundamental = modes.first().ok_or_else(|| Error::ModeSearch {
        degree: 0,
        reason: format!("no radial fundamental found at {mass_msun} M_sun"),
    })?;
    radial_stability(
        &profile,
        &oscillation_model,
        fundamental,
        physics,
        composition,
    )
}

/// The pulsational instability mass for `composition` and `physics` (module documentation).
///
/// Errors: those of [`fundamental_stability`] at any mass visited, and
/// [`Error::Integration`] (what: "pulsational instability mass") if the fundamental is already
/// unstable at the lowest mass searched.
pub fn pulsational_instability_mass(
    composition: &Composition,
    physics: &PhysicsSet,
) -> Result<PulsationalLimit> {
    let mut evaluations = Vec::new();
    let mut growth = |mass_msun: f64| -> Result<f64> {
        let g = fundamental_stability(mass_msun, composition, physics, PULSATION_PROFILE_ROWS)?
            .growth_per_radian;
        evaluations.push((mass_msun, g));
        Ok(g)
    };
    let mut below: Option<(f64, f64)> = None;
    for mass in PULSATION_SEARCH_MSUN {
        let g = growth(mass)?;
        if g > 0.0 {
            let Some((m0, g0)) = below else {
                return Err(Error::Integration {
                    what: "pulsational instability mass",
                    variable: "M/M_sun",
                    at: mass,
                    reason: format!(
                        "the radial fundamental is already unstable at the lowest mass searched \
                         (eta/omega = {g:e}); this search looks for the onset of the epsilon \
                         mechanism above {mass} M_sun"
                    ),
                });
            };
            let root = illinois(
                |ln_m: f64| growth(ln_m.exp()),
                m0.ln(),
                g0,
                mass.ln(),
                g,
                PULSATION_MASS_TOLERANCE,
            )?;
            return Ok(PulsationalLimit {
                mass_msun: Some(root.exp()),
                evaluations,
            });
        }
        below = Some((mass, g));
    }
    debug_assert_eq!(PULSATION_SEARCH_MSUN[5], MASS_RANGE_MSUN.1);
    Ok(PulsationalLimit {
        mass_msun: None,
        evaluations,
    })
}

/// The eigenfunction of a radial mode as (x, xi_r/r, dP/P) at the solver's step boundaries.
fn samples(model: &TabulatedModel, mode: &Mode) -> Result<Vec<[f64; 3]>> {
    let e = mode.eigenfunction.as_ref().ok_or_else(|| {
        Error::invalid(
            "mode",
            format!("l = {}, n = {}", mode.degree, mode.order),
            "the stability of a mode needs its eigenfunction (OscillationSettings::with_eigenfunctions)",
        )
    })?;
    if mode.degree != 0 {
        return Err(Error::invalid(
            "mode",
            format!("l = {}", mode.degree),
            "the quasi-adiabatic work integral here is for radial modes (l = 0)",
        ));
    }
    let breakpoints = model.breakpoints();
    let last = breakpoints.len() - 2;
    let centre = model.centre();
    let mut out = Vec::with_capacity(e.x.len());
    for i in 0..e.x.len() {
        let x = e.x[i];
        // p'/P = 4 pi c1^2 (V/x^2) p'~/U with p'~ = p' R^4/(G M^2) (module `eigenfunction`).
        let point = if x == 0.0 {
            None
        } else if x >= 1.0 {
            Some(model.point(last, 1.0))
        } else {
            Some(point_at(model, x))
        };
        let (v_over_x2, u, c1, gamma1) = match point {
            Some(p) => (p.v_over_x2, p.u, p.c1, p.gamma1),
            None => (centre.v_over_x2, 3.0, centre.c1, centre.gamma1),
        };
        let p_over_p = 4.0 * PI * c1 * c1 * v_over_x2 * e.p_prime[i] / u;
        let (y1, dp) = if x == 0.0 {
            // Regular centre: 3 Gamma_1 xi_r/r + dP/P = 0, and V = 0 there.
            (-p_over_p / (3.0 * gamma1), p_over_p)
        } else {
            let y1 = e.xi_r[i] / x;
            (y1, p_over_p - v_over_x2 * x * x * y1)
        };
        out.push([x, y1, dp]);
    }
    Ok(out)
}

/// Slopes d(xi_r/r)/dx and d(dP/P)/dx at x from the radial equations (module documentation).
fn slopes(x: f64, y1: f64, dp: f64, v: f64, c1: f64, gamma1: f64, w: f64) -> (f64, f64) {
    if x == 0.0 {
        return (0.0, 0.0);
    }
    (
        (-3.0 * y1 - dp / gamma1) / x,
        v * ((c1 * w + 4.0) * y1 + dp) / x,
    )
}

/// Where the work integral stops: the fraction `theta` of the cell from profile row `row` to
/// the next one.
#[derive(Debug, Clone, Copy)]
struct Transition {
    row: usize,
    theta: f64,
}

impl Transition {
    /// The quantity `f(k)` of row k at the transition, linear in the cell.
    fn at(&self, f: impl Fn(usize) -> f64) -> f64 {
        let j = self.row;
        if self.theta > 0.0 {
            f(j) + self.theta * (f(j + 1) - f(j))
        } else {
            f(j)
        }
    }

    /// f at the transition, linear in the cell.
    fn value(&self, f: &[f64]) -> f64 {
        self.at(|k| f[k])
    }

    /// int_0^m_t f dm by the trapezoid rule: whole cells to `row` (`whole`), then the part of
    /// the next cell, f linear in it.
    fn integral(
        &self,
        f: &[f64],
        rows: &[ProfileRow],
        whole: &dyn Fn(&[f64], usize) -> f64,
    ) -> f64 {
        let j = self.row;
        let mut sum = whole(f, j);
        if self.theta > 0.0 {
            let dm = self.theta * (rows[j + 1].mass_g - rows[j].mass_g);
            sum += 0.5 * (f[j] + self.value(f)) * dm;
        }
        sum
    }
}

/// The quasi-adiabatic stability of the radial `mode` (with its eigenfunction) of the ZAMS
/// model whose profile is `rows` and oscillation model `model` (built from those rows by
/// [`super::tabulated_from_profile`]), with the laws `physics` and `composition` it was built
/// with (module documentation).
///
/// Errors: [`Error::InvalidInput`] for a non-radial mode or one without eigenfunction, or
/// fewer than three rows; the laws' [`crate::error::PhysicsError`] if a difference step leaves
/// their domain.
pub fn radial_stability(
    rows: &[ProfileRow],
    model: &TabulatedModel,
    mode: &Mode,
    physics: &PhysicsSet,
    composition: &Composition,
) -> Result<RadialStability> {
    let n = rows.len();
    if n < 3 {
        return Err(Error::invalid(
            "profile",
            format!("{n} rows"),
            "the work integral needs the model's profile rows",
        ));
    }
    let surface = rows[n - 1];
    let (mass_g, radius_cm) = (surface.mass_g, surface.radius_cm);
    let w = mode.sigma_squared;
    let omega = (w * G_CGS * mass_g / radius_cm.powi(3)).sqrt();
    let period_s = 2.0 * PI / omega;
    let known = samples(model, mode)?;
    // Slopes at the samples, from the model's coefficients there.
    let sample_slopes: Vec<(f64, f64)> = known
        .iter()
        .map(|&[x, y1, dp]| {
            if x == 0.0 {
                return (0.0, 0.0);
            }
            let p = if x >= 1.0 {
                model.point(model.breakpoints().len() - 2, 1.0)
            } else {
                point_at(model, x)
            };
            slopes(x, y1, dp, p.v_over_x2 * x * x, p.c1, p.gamma1, w)
        })
        .collect();
    // The eigenfunction at each row: (xi_r/r, dP/P, d(dP/P)/dx).
    let mut k = 0;
    let eigen: Vec<(f64, f64, f64)> = rows
        .iter()
        .map(|row| {
            let x = row.r_over_r;
            if x == 0.0 {
                // The centre row: the regular solution's values there, zero slope (xi_r/r and
                // dP/P are even in x at a regular centre).
                let c = known[0];
                return (c[1], c[2], 0.0);
            }
            while k + 2 < known.len() && known[k + 1][0] < x {
                k += 1;
            }
            let (a, b) = (known[k], known[k + 1]);
            let h = b[0] - a[0];
            let t = ((x - a[0]) / h).clamp(0.0, 1.0);
            let (t2, t3) = (t * t, t * t * t);
            let basis = [
                2.0 * t3 - 3.0 * t2 + 1.0,
                t3 - 2.0 * t2 + t,
                -2.0 * t3 + 3.0 * t2,
                t3 - t2,
            ];
            let (sa, sb) = (sample_slopes[k], sample_slopes[k + 1]);
            let y1 = basis[0] * a[1] + h * basis[1] * sa.0 + basis[2] * b[1] + h * basis[3] * sb.0;
            let dp = basis[0] * a[2] + h * basis[1] * sa.1 + basis[2] * b[2] + h * basis[3] * sb.1;
            let v = G_CGS * row.mass_g * row.density_g_cm3 / (row.radius_cm * row.pressure_dyn_cm2);
            let c1 = x.powi(3) * mass_g / row.mass_g;
            let (_, slope) = slopes(x, y1, dp, v, c1, row.gamma1, w);
            (y1, dp, slope)
        })
        .collect();
    // Local physics at each row: (eps, nu, lambda, kappa_T, kappa_rho, c_V T).
    let mut local = Vec::with_capacity(n);
    for row in rows {
        let (rho, t) = (row.density_g_cm3, row.temperature_k);
        let up = LOG_STEP.exp();
        let down = (-LOG_STEP).exp();
        let eps = |rho: f64, t: f64| -> Result<f64> {
            Ok(physics.rates().rate(rho, t, composition)?.total_erg_g_s())
        };
        let kappa =
            |rho: f64, t: f64| -> Result<f64> { Ok(physics.opacity().kappa(rho, t, composition)?) };
        let log_slope = |f: &dyn Fn(f64, f64) -> Result<f64>, along_t: bool| -> Result<f64> {
            let (hi, lo) = if along_t {
                (f(rho, t * up)?, f(rho, t * down)?)
            } else {
                (f(rho * up, t)?, f(rho * down, t)?)
            };
            Ok(if hi > 0.0 && lo > 0.0 {
                (hi / lo).ln() / (2.0 * LOG_STEP)
            } else {
                0.0
            })
        };
        let total = row.eps_pp_erg_g_s + row.eps_cno_erg_g_s;
        let (nu, lambda) = if total > 0.0 {
            (log_slope(&eps, true)?, log_slope(&eps, false)?)
        } else {
            (0.0, 0.0)
        };
        let (kappa_t, kappa_rho) = (log_slope(&kappa, true)?, log_slope(&kappa, false)?);
        let state = physics.eos().state(rho, t, composition)?;
        let cv = state.cp_erg_g_k
            - state.pressure_dyn_cm2 * state.chi_t * state.chi_t / (rho * t * state.chi_rho);
        local.push([total, nu, lambda, kappa_t, kappa_rho, cv * t]);
    }
    // nabla_ad's slope in x, by differences along the rows.
    let nabla_ad_slope = |j: usize| {
        let (a, b) = (j.saturating_sub(1), (j + 1).min(n - 1));
        (rows[b].nabla_ad - rows[a].nabla_ad) / (rows[b].r_over_r - rows[a].r_over_r)
    };
    // The transition point, where the thermal time of the layers above equals the period: in
    // the cell between the outermost row j where it exceeds the period and row j + 1, at the
    // fraction `theta` of the cell where ln(tau / Pi), linear in the cell, vanishes. (Cut at a
    // row instead, the work integral jumped by a cell's contribution whenever the rows moved
    // across the crossing: 1e-3 of the growth rate for a 1e-10 change of X.)
    let mut heat_above = 0.0;
    let mut transition = Transition {
        row: n - 1,
        theta: 0.0,
    };
    let mut ln_ratio_above = f64::NAN;
    for j in (0..n - 1).rev() {
        let dm = rows[j + 1].mass_g - rows[j].mass_g;
        heat_above += 0.5 * (local[j][5] + local[j + 1][5]) * dm;
        let lum = rows[j].luminosity_erg_s;
        let ln_ratio = if lum > 0.0 {
            (heat_above / lum / period_s).ln()
        } else {
            f64::NAN
        };
        if ln_ratio > 0.0 {
            // Row j + 1 is the first below the period (ln_ratio_above <= 0) unless j + 1 is
            // the surface row, whose thermal time is zero.
            let theta = if ln_ratio_above.is_finite() && ln_ratio_above <= 0.0 {
                ln_ratio / (ln_ratio - ln_ratio_above)
            } else {
                1.0
            };
            transition = Transition { row: j, theta };
            break;
        }
        ln_ratio_above = ln_ratio;
        transition = Transition { row: j, theta: 0.0 };
    }
    // The integrands at each row.
    let mut nuclear = vec![0.0; n];
    let mut radiative = vec![0.0; n];
    let mut inertia = vec![0.0; n];
    let mut d_lum = vec![0.0; n];
    let mut dtt = vec![0.0; n];
    for (j, row) in rows.iter().enumerate() {
        let (y1, dp, dp_slope) = eigen[j];
        let x = row.r_over_r;
        let dt = row.nabla_ad * dp;
        let drho = dp / row.gamma1;
        let [eps, nu, lambda, kappa_t, kappa_rho, _] = local[j];
        nuclear[j] = dt * eps * (nu * dt + lambda * drho);
        dtt[j] = dt;
        if x == 0.0 {
            // At the centre L_rad ~ r^3 and dm/dx ~ r^2: the radiative integrand vanishes, as
            // do xi_r and the luminosity perturbation.
            continue;
        }
        // d(dT/T)/dx and d(dT/T)/dln T = that / (dln T/dx), dln T/dx = -nabla V/x.
        let dt_slope = nabla_ad_slope(j) * dp + row.nabla_ad * dp_slope;
        let v = G_CGS * row.mass_g * row.density_g_cm3 / (row.radius_cm * row.pressure_dyn_cm2);
        let dlnt_dx = -row.nabla * v / x;
        let dkappa = kappa_t * dt + kappa_rho * drho;
        let l_rad = row.luminosity_erg_s * row.nabla / row.nabla_rad;
        let d_l = l_rad * (4.0 * y1 + 4.0 * dt - dkappa + dt_slope / dlnt_dx);
        // dm/dx = 4 pi r^2 rho R.
        let dm_dx = 4.0 * PI * row.radius_cm * row.radius_cm * row.density_g_cm3 * radius_cm;
        radiative[j] = d_l * dt_slope / dm_dx;
        let xi = x * y1 * radius_cm;
        inertia[j] = xi * xi;
        d_lum[j] = d_l;
    }
    let trapezoid = |f: &[f64], upto: usize| -> f64 {
        (0..upto)
            .map(|j| 0.5 * (f[j] + f[j + 1]) * (rows[j + 1].mass_g - rows[j].mass_g))
            .sum()
    };
    let w_nuclear = transition.integral(&nuclear, rows, &trapezoid);
    let w_radiative = transition.integral(&radiative, rows, &trapezoid)
        - transition.value(&dtt) * transition.value(&d_lum);
    let inertia_g_cm2 = trapezoid(&inertia, n - 1);
    let scale = 1.0 / (2.0 * omega * omega * inertia_g_cm2);
    let result = RadialStability {
        growth_rate_per_s: (w_nuclear + w_radiative) * scale,
        nuclear_part_per_s: w_nuclear * scale,
        radiative_part_per_s: w_radiative * scale,
        growth_per_radian: (w_nuclear + w_radiative) * scale / omega,
        transition_mass_fraction: transition.at(|k| rows[k].m_over_m),
    };
    if !(result.growth_rate_per_s.is_finite() && inertia_g_cm2 > 0.0) {
        return Err(Error::ModeSearch {
            degree: 0,
            reason: format!(
                "the work integral of order {} is not finite (inertia {inertia_g_cm2:e})",
                mode.order
            ),
        });
    }
    Ok(result)
}
