//! Zero-age main-sequence models by fitting-point shooting.
//!
//! Given M, X, Z and a [`PhysicsSet`], find the central pressure and temperature, radius and
//! luminosity for which the outward integration from the centre and the inward integration from
//! the photosphere meet at the fitting mass with matching (r, P, T, L).

pub mod centre;
pub mod equations;
pub mod guess;
pub mod he3;
pub mod legs;
pub mod limits;
pub mod model;
pub mod profile;
pub mod profile_mesh;
pub mod shooting;
pub mod summary;
pub mod surface;
pub mod zones;

use crate::constants::{C_CM_S, G_CGS, L_SUN_ERG_S, MEV_ERG, M_SUN_G, M_U_G, R_SUN_CM, YEAR_S};
use crate::error::{Error, Result};
pub use crate::error::{LegCause, LegError, LegName, NotConverged};
use crate::numerics::newton::{self, NewtonProblem, NewtonSettings};
use crate::physics::{Composition, PhysicsSet};
use equations::Scales;
use legs::LegContext;
pub use model::{SolveStats, ZamsModel};
pub use profile::{ProfileGrid, ProfileRow, DEFAULT_PROFILE_POINTS, PROFILE_COLUMNS};
pub use shooting::Unknowns;
pub use summary::{ModelSummary, SummaryField};

/// Smallest and largest mass accepted, M_sun.
pub const MASS_RANGE_MSUN: (f64, f64) = (0.05, 150.0);
/// Smallest mass for the `analytic` preset, M_sun: below it the photosphere is cooler than about
/// 1900 K, where that set's full ionisation and Kramers opacity have no meaning.
pub const ANALYTIC_MIN_MASS_MSUN: f64 = 0.7;
/// Default fitting mass, as a fraction of M.
pub const DEFAULT_FIT_MASS_FRACTION: f64 = 0.4;
/// Default (finest) integrator tolerance, relative and absolute on the logarithmic variables.
pub const DEFAULT_TOLERANCE: f64 = 1e-11;
/// The integrator tolerance of the first evaluations of a solve (tightened as the mismatch falls).
pub const START_TOLERANCE: f64 = 1e-8;
/// Smallest and largest finest integrator tolerance.
pub const TOLERANCE_RANGE: (f64, f64) = (1e-13, 1e-6);
/// Smallest and largest fitting mass fraction.
pub const FIT_MASS_RANGE: (f64, f64) = (0.05, 0.95);
/// Smallest and largest Newton iteration limit.
pub const MAX_ITERATIONS_RANGE: (usize, usize) = (1, 500);

/// Everything that defines one ZAMS solve.
#[derive(Debug, Clone)]
pub struct ZamsSettings {
    mass_msun: f64,
    composition: Composition,
    physics: PhysicsSet,
    fit_mass_fraction: f64,
    tolerance: f64,
    guess: Option<Unknowns>,
    newton: NewtonSettings,
}

/// The refusal of `mass_msun` below the hydrogen-burning limit (`whose` laws', M_sun) of
/// `composition`, found `how`: an [`Error::InvalidInput`] naming the mass.
fn no_star_below(
    mass_msun: f64,
    composition: &Composition,
    (whose, limit_msun): (&str, f64),
    how: &str,
) -> Error {
    Error::invalid(
        "mass_msun",
        mass_msun,
        &format!(
            "no hydrogen-burning star of this mass exists for X = {}, Z = {}: the hydrogen-burning minimum mass of {whose} is {limit_msun:.4} M_sun there ({how})",
            composition.x(),
            composition.z()
        ),
    )
}

/// Refuses (as [`Error::InvalidInput`] naming `mass_msun`) a mass below the built-in table of
/// hydrogen-burning limits of the refined preset ([`limits::tabulated_refined_limit_msun`],
/// less [`limits::TABLE_MARGIN`]): no hydrogen-burning star of that mass exists.
fn check_tabulated_limit(
    mass_msun: f64,
    composition: &Composition,
    physics: &PhysicsSet,
) -> Result<()> {
    if *physics.spec() == crate::physics::Preset::Refined.spec() {
        if let Some(limit) = limits::tabulated_refined_limit_msun(composition.x(), composition.z())
        {
            if mass_msun < limit * (1.0 - limits::TABLE_MARGIN) {
                return Err(no_star_below(
                    mass_msun,
                    composition,
                    ("the refined physics", limit),
                    "built-in table; `starpoise limits` computes it, also for other laws",
                ));
            }
        }
    }
    Ok(())
}

impl ZamsSettings {
    /// Settings for a star of `mass_msun` (see [`MASS_RANGE_MSUN`]) with the given
    /// composition and laws; fitting mass [`DEFAULT_FIT_MASS_FRACTION`], tolerance
    /// [`DEFAULT_TOLERANCE`], the built-in starting guess, and the Newton defaults of
    /// [`NewtonSettings`]. Errors name the key (`mass_msun`, `x`).
    pub fn new(mass_msun: f64, composition: Composition, physics: PhysicsSet) -> Result<Self> {
        let (lo, hi) = MASS_RANGE_MSUN;
        if !(mass_msun.is_finite() && mass_msun >= lo && mass_msun <= hi) {
            return Err(Error::invalid(
                "mass_msun",
                mass_msun,
                &format!("the stellar mass must be between {lo} and {hi} solar masses, e.g. 1"),
            ));
        }
        if composition.x() <= 0.0 {
            return Err(Error::invalid(
                "x",
                composition.x(),
                "a zero-age main-sequence star burns hydrogen: X must be above 0, e.g. 0.70",
            ));
        }
        check_tabulated_limit(mass_msun, &composition, &physics)?;
        Self::near_the_limit(mass_msun, composition, physics)
    }

    /// [`ZamsSettings::new`] without the check against the built-in table of hydrogen-burning
    /// limits: for the search of the limit itself ([`limits::hydrogen_burning_limit`]), which
    /// must be free to go below a table made with other laws' versions.
    pub(crate) fn near_the_limit(
        mass_msun: f64,
        composition: Composition,
        physics: PhysicsSet,
    ) -> Result<Self> {
        let (_, hi) = MASS_RANGE_MSUN;
        let preset = physics.spec().preset;
        if let Some(min) = preset.minimum_mass_msun() {
            if mass_msun < min {
                return Err(Error::invalid(
                    "mass_msun",
                    mass_msun,
                    &format!(
                        "the {preset} physics set (full ionisation, no H-minus opacity) covers {min}–{hi} solar masses; use the refined preset below that"
                    ),
                ));
            }
        }
        Ok(Self {
            mass_msun,
            composition,
            physics,
            fit_mass_fraction: DEFAULT_FIT_MASS_FRACTION,
            tolerance: DEFAULT_TOLERANCE,
            guess: None,
            newton: NewtonSettings::default(),
        })
    }

    /// Fitting mass as a fraction of M, in [`FIT_MASS_RANGE`].
    pub fn with_fit_mass_fraction(mut self, q: f64) -> Result<Self> {
        let (lo, hi) = FIT_MASS_RANGE;
        if !(q.is_finite() && (lo..=hi).contains(&q)) {
            return Err(Error::invalid(
                "fit_mass_fraction",
                q,
                &format!("the fitting mass fraction must be in [{lo}, {hi}], e.g. 0.4"),
            ));
        }
        self.fit_mass_fraction = q;
        Ok(self)
    }

    /// Finest integrator tolerance, in [`TOLERANCE_RANGE`].
    pub fn with_tolerance(mut self, tol: f64) -> Result<Self> {
        let (lo, hi) = TOLERANCE_RANGE;
        if !(tol.is_finite() && (lo..=hi).contains(&tol)) {
            return Err(Error::invalid(
                "tolerance",
                tol,
                &format!("the integration tolerance must be in [{lo:e}, {hi:e}], e.g. 1e-10"),
            ));
        }
        self.tolerance = tol;
        Ok(self)
    }

    /// Starting guess: central pressure (dyn cm^-2), central temperature (K), radius (R_sun)
    /// and luminosity (L_sun), all positive.
    pub fn with_guess(
        mut self,
        pc_dyn_cm2: f64,
        tc_k: f64,
        radius_rsun: f64,
        luminosity_lsun: f64,
    ) -> Result<Self> {
        for (name, v) in [
            ("guess central pressure (dyn/cm^2)", pc_dyn_cm2),
            ("guess central temperature (K)", tc_k),
            ("guess radius (R_sun)", radius_rsun),
            ("guess luminosity (L_sun)", luminosity_lsun),
        ] {
            if !(v.is_finite() && v > 0.0) {
                return Err(Error::invalid(
                    name,
                    v,
                    "a starting guess must be a positive number",
                ));
            }
        }
        self.guess = Some(Unknowns::new(
            pc_dyn_cm2.ln(),
            tc_k.ln(),
            (radius_rsun * R_SUN_CM).ln(),
            (luminosity_lsun * L_SUN_ERG_S).ln(),
        ));
        Ok(self)
    }

    /// Starting guess as ln-unknowns (for continuation from a neighbour).
    pub fn with_unknowns_guess(mut self, u: Unknowns) -> Self {
        self.guess = Some(u);
        self
    }

    /// Maximum number of Newton iterations, in [`MAX_ITERATIONS_RANGE`].
    pub fn with_max_iterations(mut self, n: usize) -> Result<Self> {
        let (lo, hi) = MAX_ITERATIONS_RANGE;
        if !(lo..=hi).contains(&n) {
            return Err(Error::invalid(
                "max_iterations",
                n,
                &format!("the Newton iteration limit must be in [{lo}, {hi}], e.g. 60"),
            ));
        }
        self.newton.max_iterations = n;
        Ok(self)
    }

    /// Newton settings.
    pub fn with_newton(mut self, newton: NewtonSettings) -> Self {
        self.newton = newton;
        self
    }

    /// Mass, M_sun.
    pub fn mass_msun(&self) -> f64 {
        self.mass_msun
    }
    /// Composition.
    pub fn composition(&self) -> &Composition {
        &self.composition
    }
    /// Laws.
    pub fn physics(&self) -> &PhysicsSet {
        &self.physics
    }
    /// Fitting mass fraction.
    pub fn fit_mass_fraction(&self) -> f64 {
        self.fit_mass_fraction
    }
    /// Finest integrator tolerance.
    pub fn tolerance(&self) -> f64 {
        self.tolerance
    }

    pub(crate) fn context(&self) -> LegContext<'_> {
        // The starting tolerance of the iteration (or the finest asked, if coarser): a leg at
        // 1e-8 costs hardly more than at 1e-7, and a good guess needs no finer one to take its
        // first Newton step.
        leg_context(
            self.mass_msun,
            &self.physics,
            &self.composition,
            self.tolerance.max(START_TOLERANCE),
        )
    }
}

/// The context of the legs of a star of `mass_msun` with these laws and composition.
pub(crate) fn leg_context<'a>(
    mass_msun: f64,
    physics: &'a PhysicsSet,
    composition: &'a Composition,
    tolerance: f64,
) -> LegContext<'a> {
    let m = mass_msun * M_SUN_G;
    LegContext {
        physics,
        composition,
        total_mass_g: m,
        scales: Scales {
            luminosity_erg_s: L_SUN_ERG_S,
            energy_erg: G_CGS * m * m / R_SUN_CM,
        },
        tolerance,
    }
}

/// Luminosity factors of the restarts from the built-in guess when the first iteration fails.
const RESTART_LUMINOSITY_FACTORS: [f64; 3] = [0.1, 0.3, 3.0];

/// Solve for the ZAMS model. A model that does not converge is an [`Error::NoConvergence`]
/// carrying its [`NotConverged`] report (reason, history, last unknowns).
///
/// From the built-in guess (no guess given), a failed iteration is restarted from the same guess
/// with the luminosity scaled by each of `RESTART_LUMINOSITY_FACTORS` in turn (a set of laws
/// far from its preset's can make stars several times fainter or brighter than the preset's
/// table) before the failure of the first attempt is reported.
pub fn solve(settings: &ZamsSettings) -> Result<ZamsModel> {
    let ctx = settings.context();
    let u0 = settings.guess.unwrap_or_else(|| {
        guess::initial_guess(
            settings.mass_msun,
            &settings.composition,
            settings.physics.spec().preset,
        )
    });
    let mut problem =
        shooting::ShootingProblem::new(ctx, settings.fit_mass_fraction, settings.tolerance)?;
    let u0 = repaired_guess(&mut problem, u0);
    let mut report = newton::solve(&mut problem, u0, &settings.newton);
    if !report.converged() && settings.guess.is_none() {
        for l_factor in RESTART_LUMINOSITY_FACTORS {
            let mut u = u0;
            u[3] += l_factor.ln();
            problem.runner.set_tolerance(ctx.tolerance);
            let retry = newton::solve(&mut problem, u, &settings.newton);
            if retry.converged() {
                report = retry;
                break;
            }
        }
    }
    if !report.converged() {
        if let Some(below) = below_the_computed_limit(settings) {
            return Err(below);
        }
        return Err(Error::NoConvergence(Box::new(NotConverged {
            mass_msun: settings.mass_msun,
            termination: report.termination,
            iterations: report.iterations,
            mismatch: report.residual_norm,
            history: report.history,
            last_unknowns: report.solution,
            rhs_evaluations: problem.runner.rhs_evaluations(),
        })));
    }
    // The converged legs at the tolerance the iteration converged with (sharpening may have
    // taken it below the setting): the last evaluation when it was at the solution, else one
    // more evaluation by the same leg runner.
    let u = report.solution;
    let residual_evaluations =
        report.residual_evaluations + usize::from(problem.last_legs(&u).is_none());
    let legs = problem.legs_at(&u)?;
    let stats = SolveStats {
        iterations: report.iterations,
        fit_mismatch: report.residual_norm,
        residual_evaluations,
        jacobian_evaluations: report.jacobian_evaluations,
        rhs_evaluations: problem.runner.rhs_evaluations(),
        tolerance: problem.ctx().tolerance,
    };
    model::build(settings, problem.ctx(), &legs, report.history, stats)
}

/// After a failed solve below [`limits::START_MASS_MSUN`]: whether the mass lies below the
/// hydrogen-burning limit of these laws and this composition, computed
/// ([`limits::hydrogen_burning_limit`], a few seconds; the built-in table covers only the refined
/// preset over X = 0.65-0.75, Z = 0.001-0.04, and [`ZamsSettings::new`] refuses below it before
/// any solve). If so, an [`Error::InvalidInput`] naming the mass and the limit: no
/// hydrogen-burning star of that mass exists. `None` when the mass is above the limit, the limit
/// cannot be computed, or the mass is at or above the limit search's starting mass (whose own
/// solve calls this function).
fn below_the_computed_limit(settings: &ZamsSettings) -> Option<Error> {
    if settings.mass_msun >= limits::START_MASS_MSUN {
        return None;
    }
    let (comp, physics) = (&settings.composition, &settings.physics);
    let (limit_msun, stopped_by) = computed_limit(comp, physics)?;
    if settings.mass_msun >= limit_msun {
        return None;
    }
    Some(match stopped_by {
        None => no_star_below(
            settings.mass_msun,
            comp,
            ("these laws", limit_msun),
            "computed: the turning point of the ZAMS branch; `starpoise limits` shows its model",
        ),
        Some(why) => Error::invalid(
            "mass_msun",
            settings.mass_msun,
            &format!(
                "these laws give no ZAMS model of this mass for X = {}, Z = {}: below {limit_msun:.4} M_sun they fail before the ZAMS branch turns ({why}); `starpoise limits` shows the lowest model",
                comp.x(),
                comp.z()
            ),
        ),
    })
}

/// A computed limit with the reason its search stopped short of the turning point, if it did.
type ComputedLimit = (f64, Option<String>);

/// The hydrogen-burning limit of these laws and this composition ([`limits::hydrogen_burning_limit`])
/// once per process: a grid of several masses below it at one composition computes it once.
/// `None` if it cannot be computed.
fn computed_limit(comp: &Composition, physics: &PhysicsSet) -> Option<ComputedLimit> {
    type Known = Vec<(
        Composition,
        crate::physics::PhysicsSpec,
        Option<ComputedLimit>,
    )>;
    static KNOWN: std::sync::Mutex<Known> = std::sync::Mutex::new(Vec::new());
    let lookup = |known: &Known| {
        known
            .iter()
            .find(|(c, spec, _)| c == comp && spec == physics.spec())
            .map(|(_, _, limit)| limit.clone())
    };
    if let Some(limit) = KNOWN.lock().ok().and_then(|known| lookup(&known)) {
        return limit;
    }
    // Computed outside the lock (seconds); two threads may both compute the same limit.
    let limit = limits::hydrogen_burning_limit(comp, physics)
        .ok()
        .map(|l| (l.mass_msun, l.stopped_by));
    if let Ok(mut known) = KNOWN.lock() {
        if lookup(&known).is_none() {
            known.push((*comp, physics.spec().clone(), limit.clone()));
        }
    }
    limit
}

/// A starting guess whose legs can be integrated. If `u0` itself cannot be (a poor guess can use
/// up the luminosity or the radius before the fitting mass), try luminosities and radii scaled
/// by factors up to 30 and 1.5 and take the one with the smallest mismatch; if none works,
/// return `u0` and let the Newton driver report the failure.
fn repaired_guess(problem: &mut shooting::ShootingProblem, u0: Unknowns) -> Unknowns {
    if problem.residual(&u0).is_ok() {
        return u0;
    }
    let mut best: Option<(f64, Unknowns)> = None;
    for l_factor in [0.3f64, 0.1, 0.03, 3.0, 1.0] {
        for r_factor in [1.0f64, 1.25, 0.8, 1.5] {
            let mut u = u0;
            u[2] += r_factor.ln();
            u[3] += l_factor.ln();
            if let Ok(f) = problem.residual(&u) {
                let norm = f.amax();
                if best.is_none_or(|(b, _)| norm < b) {
                    best = Some((norm, u));
                }
            }
        }
    }
    best.map_or(u0, |(_, u)| u)
}

/// Energy released per unit mass of hydrogen burnt to helium, Q / (4 m_H c^2) c^2 with
/// Q = 26.731 MeV (docs/references.md §4) and m_H = 1.007825 u (atomic mass of 1H), erg g^-1.
pub fn hydrogen_burning_energy_erg_g() -> f64 {
    26.731 * MEV_ERG / (4.0 * 1.007_825 * M_U_G)
}

/// Main-sequence lifetime estimate, years: t_nuc = f X M q_H / L, with q_H from
/// [`hydrogen_burning_energy_erg_g`] and f = 0.1 the fraction of the star's hydrogen burnt on the
/// main sequence (the usual textbook assumption, e.g. Kippenhahn & Weigert 1990, §1.3 — neutrino
/// losses of a few per cent and the growth of L during the main sequence are ignored; from
/// memory). Gives about 10 Gyr for the Sun.
pub fn nuclear_time_yr(mass_g: f64, x: f64, luminosity_erg_s: f64) -> f64 {
    0.1 * x * mass_g * hydrogen_burning_energy_erg_g() / luminosity_erg_s / YEAR_S
}

/// Eddington luminosity for electron scattering, 4 pi G M c / kappa_es with
/// kappa_es = sigma_T (1 + X) / (2 m_u), erg s^-1.
pub fn eddington_luminosity_erg_s(mass_g: f64, x: f64) -> f64 {
    let kappa_es = crate::constants::SIGMA_T_CM2 * (1.0 + x) / (2.0 * M_U_G);
    4.0 * std::f64::consts::PI * G_CGS * mass_g * C_CM_S / kappa_es
}
