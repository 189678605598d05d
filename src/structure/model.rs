//! A converged model: the summary quantities with their consistency checks, the solve's
//! statistics, and the profile on demand.

use super::equations::{INT_CNO, INT_EPS, INT_GRAVITY, INT_THERMAL};
use super::legs::{Cautions, LegContext};
use super::profile::{self, ProfileGrid, ProfileRow};
use super::shooting::{LegEnds, Unknowns};
use super::summary::ModelSummary;
use super::surface::{self, SurfaceStart};
use super::zones::{convective_zones, extent_from_zones};
use super::{centre, ZamsSettings};
use crate::constants::{G_CGS, L_SUN_ERG_S, R_SUN_CM, YEAR_S};
use crate::error::Result;
use crate::numerics::newton::IterationRecord;
use crate::physics::{Composition, PhysicsSpec};

/// How the shooting iteration went.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SolveStats {
    /// Newton iterations.
    pub iterations: usize,
    /// Final max-norm of the relative mismatch of (r, P, T, L) at the fitting mass.
    pub fit_mismatch: f64,
    /// Evaluations of the mismatch (each integrates both legs unless it reuses them).
    pub residual_evaluations: usize,
    /// Jacobians formed by finite differences (Broyden updates not counted).
    pub jacobian_evaluations: usize,
    /// Right-hand-side evaluations of the structure equations spent on the solve (the profile,
    /// computed on demand, is not counted).
    pub rhs_evaluations: u64,
    /// The integrator tolerance of the converged legs.
    pub tolerance: f64,
}

/// A converged ZAMS model: what was asked, the summary quantities, and how the solve went.
/// A model that did not converge is never a `ZamsModel` (see
/// [`crate::structure::NotConverged`]).
#[derive(Debug, Clone)]
pub struct ZamsModel {
    settings: ZamsSettings,
    /// The summary quantities.
    pub summary: ModelSummary,
    /// How the solve went.
    pub stats: SolveStats,
    /// The converged unknowns (ln P_c, ln T_c, ln R, ln L), cgs.
    pub unknowns: Unknowns,
    /// Newton history.
    pub history: Vec<IterationRecord>,
    /// Where the model leaves what its laws describe well (each law's caution, with where it
    /// applied) or the mass range its set of laws has been compared with measured stars on;
    /// empty when neither.
    pub warnings: Vec<String>,
    /// The photosphere of the converged legs, with the unknowns and the tolerance it was
    /// computed at: a profile at those starts from it instead of integrating the atmosphere
    /// again (the same computation, so the same numbers).
    photosphere: (Unknowns, f64, SurfaceStart),
}

/// The masses on which the `refined` set has been compared with measured stars and published
/// ZAMS relations, M_sun (README's Accuracy section: low-mass eclipsing binaries and single M
/// dwarfs from 0.12 M_sun, the ZAMS relations of Tout et al. 1996 to 30 M_sun; above, the
/// radii are too small without an iron-bump opacity). Outside, a `refined` model carries a
/// warning.
pub const REFINED_VALIDATED_MASS_RANGE_MSUN: (f64, f64) = (0.1, 30.0);

/// A model whose 3He relaxation time (the mixed star's if it is fully convective, else the
/// centre's; [`he3_caution`]) exceeds this, yr, is cautioned that real stars of its mass and a
/// few Gyr of age have not reached the 3He equilibrium its rates law takes.
pub const HE3_CAUTION_TIME_YR: f64 = 1e9;

/// How much fainter and smaller a star is when its pp chain stops at 3He (no 3He burnt at all)
/// than with 3He in equilibrium: log10 L lower by this, dex, and R smaller by
/// [`HE3_UNBURNT_RADIUS_PERCENT`], measured on the `refined` set at 0.23 M_sun, X = 0.70,
/// Z = 0.02 with the `sfactor` rates times 0.509, the energy per pp reaction up to 3He over
/// that of the whole ppI chain (docs/references.md §4.1; `tests/warnings.rs` measures it again).
pub const HE3_UNBURNT_LUMINOSITY_DEX: f64 = 0.061;
/// See [`HE3_UNBURNT_LUMINOSITY_DEX`]: the radius, per cent.
pub const HE3_UNBURNT_RADIUS_PERCENT: f64 = 6.4;

/// The caution of a model whose central 3He equilibrium time is `central_yr` and, if it is
/// fully convective, whose 3He mixed through the star relaxes in `mixed_yr`
/// ([`super::he3::mixed_relaxation_time_s`]): judged on the mixed time where there is one,
/// else the central one; none at or below [`HE3_CAUTION_TIME_YR`], or when the law has no 3He
/// rates (NaN).
pub fn he3_caution(rates: &str, central_yr: f64, mixed_yr: Option<f64>) -> Option<String> {
    let time_yr = mixed_yr.unwrap_or(central_yr);
    (time_yr > HE3_CAUTION_TIME_YR).then(|| {
        let where_ = match mixed_yr {
            Some(mixed) => format!(
                "mixed through this fully convective star it relaxes to equilibrium in {:.2} Gyr (e-folding time; {:.2} Gyr at the centre alone)",
                mixed / 1e9,
                central_yr / 1e9
            ),
            None => format!(
                "at the centre it relaxes to equilibrium in {:.2} Gyr (e-folding time)",
                central_yr / 1e9
            ),
        };
        format!(
            "rates {rates}: 3He is taken in equilibrium, but {where_}: a star of this mass younger than a few times that burns 3He incompletely and is fainter and smaller than this model (with no 3He burnt at all, L is {HE3_UNBURNT_LUMINOSITY_DEX} dex lower and R {HE3_UNBURNT_RADIUS_PERCENT}% smaller at 0.23 M_sun)"
        )
    })
}

/// A model whose convective core holds all but this fraction of its mass is fully convective.
const FULLY_CONVECTIVE_SLACK: f64 = 1e-9;

/// Below this effective temperature, K, a model is cautioned that its atmosphere is grey. Every
/// atmosphere of this program is: a T(tau) relation (Eddington, Hopf, Krishna Swamy) or the
/// one-point closure, each with the Rosseland mean opacity. Below about 4000 K, the T_eff of the
/// early M dwarfs (a fact of the trade), molecules set the photospheric opacity and grey models
/// are inaccurate (Chabrier & Baraffe 1997, A&A 327, 1039; docs/references.md §8.4).
pub const GREY_ATMOSPHERE_MIN_TEFF_K: f64 = 4000.0;

/// What the `refined` set's models miss by against measured M dwarfs, as the caution quotes them
/// (docs/references.md §8.5; `tests/lowmass_stars.rs` measures them again): T_eff too hot by
/// this, dex, at 0.21-0.23 M_sun (CM Dra A and B, Z = 0.01), and L too bright by
/// [`CM_DRA_LUMINOSITY_EXCESS_DEX`].
pub const CM_DRA_TEFF_EXCESS_DEX: f64 = 0.05;
/// See [`CM_DRA_TEFF_EXCESS_DEX`]: the luminosity, dex.
pub const CM_DRA_LUMINOSITY_EXCESS_DEX: f64 = 0.19;
/// The largest T_eff difference, dex, of the `refined` models from Proxima Cen (0.12 M_sun) and
/// YY Gem (0.60 M_sun), as the caution quotes it (`tests/lowmass_stars.rs`).
pub const QUIET_M_DWARF_TEFF_DEX: f64 = 0.015;

/// The caution of a model with effective temperature `teff_k` under the atmosphere
/// `atmosphere` (its name), with the measured misses of the `refined` set if `refined`.
pub fn grey_atmosphere_caution(atmosphere: &str, teff_k: f64, refined: bool) -> Option<String> {
    (teff_k < GREY_ATMOSPHERE_MIN_TEFF_K).then(|| {
        let measured = if refined {
            format!(
                "; measured, this set's T_eff is {CM_DRA_TEFF_EXCESS_DEX} dex too hot and L {CM_DRA_LUMINOSITY_EXCESS_DEX} dex too bright at 0.21-0.23 M_sun (CM Dra A and B), within {QUIET_M_DWARF_TEFF_DEX} dex in T_eff at 0.12 M_sun (Proxima Cen) and 0.60 M_sun (YY Gem)"
            )
        } else {
            String::new()
        };
        format!(
            "atmosphere {atmosphere}: T_eff {teff_k:.0} K is below {GREY_ATMOSPHERE_MIN_TEFF_K:.0} K, where molecules set the photospheric opacity and a grey atmosphere (Rosseland mean) is inaccurate (Chabrier & Baraffe 1997){measured}"
        )
    })
}

/// The warnings of a model of `settings` with effective temperature `teff_k`, whose legs met
/// `cautions` and whose 3He equilibrium times are `he3_times_yr` (central, and mixed through
/// the star if it is fully convective).
fn warnings(
    settings: &ZamsSettings,
    cautions: &Cautions,
    teff_k: f64,
    he3_times_yr: (f64, Option<f64>),
) -> Vec<String> {
    let spec = settings.physics().spec();
    let mut out: Vec<String> = cautions
        .entries
        .iter()
        .map(|c| {
            let law = match c.kind {
                "eos" => spec.eos.to_string(),
                _ => spec.opacity.to_string(),
            };
            format!(
                "{} {law}: {} (at {} integration points, T {:.3e} to {:.3e} K, rho {:.3e} to {:.3e} g/cm^3)",
                c.kind,
                c.text,
                c.points,
                c.temperature_k.0,
                c.temperature_k.1,
                c.density_g_cm3.0,
                c.density_g_cm3.1
            )
        })
        .collect();
    let (lo, hi) = REFINED_VALIDATED_MASS_RANGE_MSUN;
    let m = settings.mass_msun();
    if *spec == crate::physics::Preset::Refined.spec() && !(lo..=hi).contains(&m) {
        out.push(format!(
            "mass {m} M_sun is outside {lo}-{hi} M_sun, the range on which the refined set has been compared with measured stars"
        ));
    }
    let refined = *spec == crate::physics::Preset::Refined.spec();
    if let Some(w) = grey_atmosphere_caution(&spec.atmosphere.to_string(), teff_k, refined) {
        out.push(w);
    }
    if let Some(w) = he3_caution(&spec.rates.to_string(), he3_times_yr.0, he3_times_yr.1) {
        out.push(w);
    }
    out
}

impl ZamsModel {
    /// Mass, M_sun.
    pub fn mass_msun(&self) -> f64 {
        self.settings.mass_msun()
    }
    /// Composition.
    pub fn composition(&self) -> &Composition {
        self.settings.composition()
    }
    /// The laws, as chosen.
    pub fn physics(&self) -> &PhysicsSpec {
        self.settings.physics().spec()
    }
    /// Fitting mass as a fraction of M.
    pub fn fit_mass_fraction(&self) -> f64 {
        self.settings.fit_mass_fraction()
    }
    /// The settings the model was solved with.
    pub fn settings(&self) -> &ZamsSettings {
        &self.settings
    }

    /// The profile on `points` rows (see [`profile::check_profile_points`]) on the balanced
    /// grid ([`ProfileGrid::Auto`]): [`ZamsModel::profile_on`] with that grid.
    pub fn profile(&self, points: usize) -> Result<Vec<ProfileRow>> {
        self.profile_on(ProfileGrid::Auto, points)
    }

    /// The profile on `points` rows (see [`profile::check_profile_points`]) placed by `grid`,
    /// the centre (r = 0) first and the photosphere last; integrated at the tolerance the solve
    /// converged with, so that the legs meet as well as the solution's did.
    pub fn profile_on(&self, grid: ProfileGrid, points: usize) -> Result<Vec<ProfileRow>> {
        let points = profile::check_profile_points(points)?;
        let mut ctx = self.settings.context();
        ctx.tolerance = self.stats.tolerance;
        let (u, tolerance, top) = &self.photosphere;
        let known_top = (*u == self.unknowns && *tolerance == ctx.tolerance).then_some(top);
        Ok(profile::profile(
            &ctx,
            &self.unknowns,
            self.fit_mass_fraction(),
            grid,
            points,
            known_top,
        )?)
    }
}

/// Assemble the converged model from the legs of the converged unknowns `legs` (integrated at
/// `ctx.tolerance`): the summary's integrals and convective boundaries come from those legs.
pub(crate) fn build(
    settings: &ZamsSettings,
    ctx: &LegContext,
    legs: &LegEnds,
    history: Vec<IterationRecord>,
    stats: SolveStats,
) -> Result<ZamsModel> {
    let u = legs.u;
    let start = centre::start(ctx, u[0], u[1])?;
    let (core, envelope) = if legs.boundary_limit_reached {
        // A leg met more boundaries than it locates: place them on a profile instead.
        let rows = profile::profile(
            ctx,
            &u,
            settings.fit_mass_fraction(),
            ProfileGrid::Auto,
            profile::DEFAULT_PROFILE_POINTS,
            (legs.tolerance == ctx.tolerance).then_some(&legs.top),
        )?;
        profile::convective_extent(&rows)
    } else {
        extent_from_zones(&convective_zones(
            start.centre.convective(),
            &legs.boundaries,
        ))
    };
    let (out_end, in_end) = (legs.out, legs.inn);
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
    let central_temperature_k = u[1].exp();
    // A diagnostic: a law without 3He rates (or whose rates underflow) gives NaN, not an error.
    let he3 = settings
        .physics()
        .rates()
        .he3_equilibrium(centre_eos.density_g_cm3, central_temperature_k, comp)
        .ok()
        .flatten();
    let summary = ModelSummary {
        radius_rsun: radius_cm / R_SUN_CM,
        luminosity_lsun: luminosity / L_SUN_ERG_S,
        teff_k: surface::effective_temperature_k(radius_cm, luminosity),
        log_g_cgs: (G_CGS * m / (radius_cm * radius_cm)).log10(),
        central_temperature_k,
        central_density_g_cm3: centre_eos.density_g_cm3,
        central_pressure_dyn_cm2: u[0].exp(),
        central_degeneracy: if centre_eos.degeneracy_psi.is_finite() {
            centre_eos.degeneracy_psi
        } else {
            f64::NAN
        },
        convective_core_mass_fraction: core,
        convective_envelope_mass_fraction: envelope,
        cno_luminosity_fraction: cno_total / eps_total,
        eddington_ratio: luminosity / super::eddington_luminosity_erg_s(m, comp.x()),
        kelvin_helmholtz_time_yr: G_CGS * m * m / (radius_cm * luminosity) / YEAR_S,
        dynamical_time_s: (radius_cm.powi(3) / (G_CGS * m)).sqrt(),
        nuclear_time_yr: super::nuclear_time_yr(m, comp.x(), luminosity),
        he3_equilibrium_time_yr: he3.map_or(f64::NAN, |e| e.relaxation_time_s / YEAR_S),
        virial_residual: (thermal / gravity - 1.0).abs(),
        luminosity_residual: (eps_total / luminosity - 1.0).abs(),
    };
    // A fully convective star mixes its 3He through the whole star.
    let he3_mixed_yr = (core >= 1.0 - FULLY_CONVECTIVE_SLACK)
        .then(|| {
            super::he3::mixed_relaxation_time_s(
                settings.physics().rates(),
                comp,
                centre_eos.density_g_cm3,
                central_temperature_k,
            )
        })
        .flatten()
        .map(|s| s / YEAR_S);
    Ok(ZamsModel {
        settings: settings.clone(),
        summary,
        stats,
        unknowns: u,
        history,
        warnings: warnings(
            settings,
            &legs.cautions,
            summary.teff_k,
            (summary.he3_equilibrium_time_yr, he3_mixed_yr),
        ),
        photosphere: (u, legs.tolerance, legs.top.clone()),
    })
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

    /// The photosphere a model keeps for its profiles is the one computed again at its unknowns
    /// and tolerance (to the integration's accuracy: the solve's atmospheres follow each
    /// other's steps), and a profile at other unknowns does not use it.
    #[test]
    fn the_kept_photosphere_is_the_recomputed_one() {
        let settings = ZamsSettings::new(
            1.0,
            Composition::new(0.70, 0.02).unwrap(),
            crate::physics::PhysicsSet::refined(),
        )
        .unwrap();
        let mut model = crate::structure::solve(&settings).unwrap();
        let mut ctx = settings.context();
        ctx.tolerance = model.stats.tolerance;
        let u = model.unknowns;
        let (kept_u, kept_tolerance, kept_top) = model.photosphere.clone();
        assert_eq!((kept_u, kept_tolerance), (u, ctx.tolerance));
        // The solve integrated its atmospheres along the steps of the one before; one computed
        // afresh chooses its own steps: the same photosphere to the integration's accuracy.
        let fresh = surface::start(&ctx, u[2], u[3]).unwrap();
        assert_eq!(kept_top.teff_k, fresh.teff_k);
        let close = |a: f64, b: f64| (a - b).abs() <= 100.0 * ctx.tolerance * b.abs().max(1.0);
        assert!(close(kept_top.pressure_dyn_cm2, fresh.pressure_dyn_cm2));
        assert!(close(kept_top.x0, fresh.x0));
        for k in 0..4 {
            assert!(close(kept_top.y0[k], fresh.y0[k]), "{k}");
        }
        let rows = model.profile_on(ProfileGrid::Auto, 40).unwrap();
        // Another radius: the profile's photosphere moves with it.
        model.unknowns[2] += 1e-3;
        let moved = model.profile_on(ProfileGrid::Auto, 40).unwrap();
        // The last row's radius is e^(ln R): the ratio is e^(1e-3) to a few roundings.
        const ROUNDING: f64 = 1e-14;
        let (r, moved_r) = (rows[39].radius_cm, moved[39].radius_cm);
        assert!(
            (moved_r / r - 1e-3f64.exp()).abs() < ROUNDING,
            "{r} {moved_r}"
        );
    }
}
