//! Zero-age main-sequence models by fitting-point shooting.
//!
//! Given M, X, Z and a [`PhysicsSet`], find the central pressure and temperature, radius and
//! luminosity for which the outward integration from the centre and the inward integration from
//! the photosphere meet at the fitting mass with matching (r, P, T, L).

pub mod centre;
pub mod equations;
pub mod guess;
pub mod legs;
pub mod model;
pub mod shooting;
pub mod surface;

use crate::constants::{C_CM_S, G_CGS, L_SUN_ERG_S, MEV_ERG, M_SUN_G, M_U_G, R_SUN_CM, YEAR_S};
use crate::error::{Error, Result};
use crate::numerics::newton::{self, NewtonReport, NewtonSettings};
use crate::physics::{Composition, PhysicsSet};
use equations::Scales;
use legs::LegContext;
pub use model::ZamsModel;
pub use shooting::Unknowns;

/// Smallest and largest mass accepted, M_sun.
pub const MASS_RANGE_MSUN: (f64, f64) = (0.05, 150.0);
/// Smallest mass for the `analytic` preset, M_sun: below it the photosphere is cooler than about
/// 1900 K, where that set's full ionisation and Kramers opacity have no meaning.
pub const ANALYTIC_MIN_MASS_MSUN: f64 = 0.7;
/// Default fitting mass, as a fraction of M.
pub const DEFAULT_FIT_MASS_FRACTION: f64 = 0.4;
/// Default (finest) integrator tolerance, relative and absolute on the logarithmic variables.
pub const DEFAULT_TOLERANCE: f64 = 1e-11;
/// Default number of profile rows.
pub const DEFAULT_PROFILE_POINTS: usize = 400;

/// Everything that defines one ZAMS solve.
#[derive(Debug, Clone)]
pub struct ZamsSettings {
    mass_msun: f64,
    composition: Composition,
    physics: PhysicsSet,
    fit_mass_fraction: f64,
    tolerance: f64,
    profile_points: usize,
    profile: bool,
    guess: Option<Unknowns>,
    newton: NewtonSettings,
}

impl ZamsSettings {
    /// Settings for a star of `mass_msun` (0.05–150 M_sun) with the given composition and laws;
    /// fitting mass [`DEFAULT_FIT_MASS_FRACTION`], tolerance [`DEFAULT_TOLERANCE`],
    /// [`DEFAULT_PROFILE_POINTS`] profile rows, the built-in starting guess, and the Newton
    /// defaults of [`NewtonSettings`].
    pub fn new(mass_msun: f64, composition: Composition, physics: PhysicsSet) -> Result<Self> {
        let (lo, hi) = MASS_RANGE_MSUN;
        if !(mass_msun.is_finite() && mass_msun >= lo && mass_msun <= hi) {
            return Err(Error::invalid(
                "--mass",
                mass_msun,
                &format!(
                    "the stellar mass must be between {lo} and {hi} solar masses, e.g. --mass 1"
                ),
            ));
        }
        if composition.x() <= 0.0 {
            return Err(Error::invalid(
                "--x",
                composition.x(),
                "a zero-age main-sequence star burns hydrogen: X must be above 0, e.g. --x 0.70",
            ));
        }
        if physics.preset == "analytic" && mass_msun < ANALYTIC_MIN_MASS_MSUN {
            return Err(Error::invalid(
                "--mass",
                mass_msun,
                &format!(
                    "the analytic physics set (full ionisation, no H-minus opacity) covers {ANALYTIC_MIN_MASS_MSUN}–{hi} solar masses; use --physics refined below that"
                ),
            ));
        }
        Ok(Self {
            mass_msun,
            composition,
            physics,
            fit_mass_fraction: DEFAULT_FIT_MASS_FRACTION,
            tolerance: DEFAULT_TOLERANCE,
            profile_points: DEFAULT_PROFILE_POINTS,
            profile: true,
            guess: None,
            newton: NewtonSettings::default(),
        })
    }

    /// Fitting mass as a fraction of M, in [0.05, 0.95].
    pub fn with_fit_mass_fraction(mut self, q: f64) -> Result<Self> {
        if !(q.is_finite() && (0.05..=0.95).contains(&q)) {
            return Err(Error::invalid(
                "--fit-mass",
                q,
                "the fitting mass fraction must be in [0.05, 0.95], e.g. --fit-mass 0.4",
            ));
        }
        self.fit_mass_fraction = q;
        Ok(self)
    }

    /// Finest integrator tolerance, in [1e-13, 1e-6].
    pub fn with_tolerance(mut self, tol: f64) -> Result<Self> {
        if !(tol.is_finite() && (1e-13..=1e-6).contains(&tol)) {
            return Err(Error::invalid(
                "--tolerance",
                tol,
                "the integration tolerance must be in [1e-13, 1e-6], e.g. 1e-10",
            ));
        }
        self.tolerance = tol;
        Ok(self)
    }

    /// Number of profile rows, in [10, 100000].
    pub fn with_profile_points(mut self, n: usize) -> Result<Self> {
        if !(10..=100_000).contains(&n) {
            return Err(Error::invalid(
                "--points",
                n,
                "the number of profile rows must be in [10, 100000], e.g. --points 400",
            ));
        }
        self.profile_points = n;
        Ok(self)
    }

    /// Whether to compute the profile (default true). Without it a model costs about a third
    /// less; the summary is the same.
    pub fn with_profile(mut self, on: bool) -> Self {
        self.profile = on;
        self
    }

    /// Whether the profile is computed.
    pub fn wants_profile(&self) -> bool {
        self.profile
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
            ("--guess-pc", pc_dyn_cm2),
            ("--guess-tc", tc_k),
            ("--guess-radius", radius_rsun),
            ("--guess-luminosity", luminosity_lsun),
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

    /// Maximum number of Newton iterations, in [1, 500].
    pub fn with_max_iterations(mut self, n: usize) -> Result<Self> {
        if !(1..=500).contains(&n) {
            return Err(Error::invalid(
                "--max-iterations",
                n,
                "the Newton iteration limit must be in [1, 500], e.g. 60",
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
    /// Number of profile rows.
    pub fn profile_points(&self) -> usize {
        self.profile_points
    }

    fn context(&self) -> LegContext<'_> {
        let m = self.mass_msun * M_SUN_G;
        LegContext {
            physics: &self.physics,
            composition: &self.composition,
            total_mass_g: m,
            scales: Scales {
                luminosity_erg_s: L_SUN_ERG_S,
                energy_erg: G_CGS * m * m / R_SUN_CM,
            },
            tolerance: 1e-7,
        }
    }
}

/// The outcome of a solve: a converged model, or the Newton history of a failed one.
#[derive(Debug, Clone)]
pub enum ZamsOutcome {
    /// Converged.
    Converged(Box<ZamsModel>),
    /// Did not converge: the iteration history and the last unknowns.
    NotConverged {
        /// The Newton report (history, last point, reason).
        report: NewtonReport<4>,
        /// Right-hand-side evaluations spent.
        rhs_evaluations: u64,
    },
}

/// Luminosity factors of the restarts from the built-in guess when the first iteration fails.
const RESTART_LUMINOSITY_FACTORS: [f64; 3] = [0.1, 0.3, 3.0];

/// Solve for the ZAMS model; a model that did not converge is reported as such, with its history.
pub fn solve_detailed(settings: &ZamsSettings) -> Result<ZamsOutcome> {
    let ctx = settings.context();
    let u0 = settings
        .guess
        .unwrap_or_else(|| guess::initial_guess(settings.mass_msun, &settings.composition));
    let mut problem =
        shooting::ShootingProblem::new(ctx, settings.fit_mass_fraction, settings.tolerance);
    let u0 = repaired_guess(&mut problem, u0);
    let mut report = newton::solve(&mut problem, u0, &settings.newton);
    // The built-in guess is a table of `refined` models: for other physics (the `analytic` set's
    // stars are up to ten times fainter) the iteration can wander off from it. Then restart from
    // the same guess with the luminosity scaled, once per factor, before reporting a failure.
    if !report.converged && settings.guess.is_none() {
        for l_factor in RESTART_LUMINOSITY_FACTORS {
            let mut u = u0;
            u[3] += l_factor.ln();
            problem.ctx.tolerance = ctx.tolerance;
            let retry = newton::solve(&mut problem, u, &settings.newton);
            if retry.converged {
                report = retry;
                break;
            }
        }
    }
    let evaluations = problem.monitor.evaluations.get();
    if !report.converged {
        return Ok(ZamsOutcome::NotConverged {
            report,
            rhs_evaluations: evaluations,
        });
    }
    // The profile is integrated at the tolerance the iteration converged with (sharpening may
    // have taken it below the setting), so that its legs meet as well as the solution's did.
    let mut final_ctx = ctx;
    final_ctx.tolerance = problem.ctx.tolerance.min(settings.tolerance);
    let legs = problem
        .last_legs(&report.solution)
        .filter(|l| l.tolerance == final_ctx.tolerance);
    let model = model::build(settings, &final_ctx, &report, evaluations, legs)?;
    Ok(ZamsOutcome::Converged(Box::new(model)))
}

/// A starting guess whose legs can be integrated. If `u0` itself cannot be (a poor guess can use
/// up the luminosity or the radius before the fitting mass), try luminosities and radii scaled
/// by factors up to 30 and 1.5 and take the one with the smallest mismatch; if none works,
/// return `u0` and let the Newton driver report the failure.
fn repaired_guess(problem: &mut shooting::ShootingProblem, u0: Unknowns) -> Unknowns {
    use crate::numerics::newton::NewtonProblem;
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

/// Solve for the ZAMS model; non-convergence is an [`Error::NoConvergence`].
pub fn solve(settings: &ZamsSettings) -> Result<ZamsModel> {
    match solve_detailed(settings)? {
        ZamsOutcome::Converged(m) => Ok(*m),
        ZamsOutcome::NotConverged { report, .. } => Err(Error::NoConvergence {
            iterations: report.iterations,
            residual: report.residual_norm,
            reason: report.failure.unwrap_or_default(),
        }),
    }
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
