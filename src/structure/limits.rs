//! The hydrogen-burning minimum mass: the lowest mass at which a ZAMS model exists, i.e. a
//! static star whose nuclear burning supplies its surface luminosity.
//!
//! Along the ZAMS, lower masses are denser and more degenerate; electron degeneracy pressure
//! caps the central temperature, and below a certain mass no static model in thermal
//! equilibrium exists (e.g. Kippenhahn & Weigert 1990, §22.4; Chabrier & Baraffe 2000, ARA&A 38,
//! 337). In the unknowns (ln P_c, ln T_c, ln R, ln L) as functions of ln M the ZAMS branch has a
//! turning point there: it doubles back to a second, more degenerate solution. The limit is
//! located as that fold, by pseudo-arclength continuation in ln M
//! ([`crate::numerics::continuation`]), not by where Newton's method happens to fail.

use super::legs::LegContext;
use super::shooting::{ShootingProblem, Unknowns};
use super::{leg_context, model, solve, SolveStats, ZamsModel, ZamsSettings};
use super::{LegError, DEFAULT_TOLERANCE};
use crate::error::{Error, Result};
use crate::numerics::continuation::{
    find_fold, Branch, ContinuationError, ContinuationSettings, FoldLocation,
};
use crate::numerics::newton::NewtonProblem;
use crate::physics::{Composition, PhysicsSet};
use nalgebra::{SMatrix, SVector};

/// Where the continuation starts, M_sun: above the limit for every physics set of the program
/// (the limit lies near 0.07–0.09 M_sun for the refined laws), low enough to be close.
pub const START_MASS_MSUN: f64 = 0.12;
/// Masses the continuation may visit, M_sun.
pub const SEARCH_RANGE_MSUN: (f64, f64) = (0.03, 0.5);
/// Hydrogen mass fractions of the built-in table of limits.
pub const LIMIT_TABLE_X: [f64; 3] = [0.65, 0.70, 0.75];
/// Metal mass fractions of the built-in table of limits.
pub const LIMIT_TABLE_Z: [f64; 5] = [0.001, 0.004, 0.01, 0.02, 0.04];

/// The hydrogen-burning minimum mass of the `refined` preset, M_sun, at each X (rows, in the
/// order of [`LIMIT_TABLE_X`]) and Z (columns, [`LIMIT_TABLE_Z`]): computed by
/// [`hydrogen_burning_limit`] (`cargo run --release --example limit_table`; regenerate it when
/// the refined laws change): for every entry today the turning point of the ZAMS branch. NaN
/// would mark a composition whose limit cannot be found.
pub const REFINED_LIMITS: [[f64; 5]; 3] = [
    [0.080737, 0.077429, 0.074981, 0.073013, 0.070943],
    [0.086079, 0.082727, 0.080226, 0.078194, 0.076041],
    [0.091566, 0.088160, 0.085608, 0.083516, 0.081282],
];

/// How far below the tabulated limit a mass must lie to be refused (the interpolation accuracy
/// of [`REFINED_LIMITS`] between its grid points; the limit itself is computed to 1e-6).
pub const TABLE_MARGIN: f64 = 2e-3;

/// The `refined` preset's limit at (`x`, `z`) from [`REFINED_LIMITS`], bilinear in (X, log Z)
/// inside the table; `None` outside it or next to a composition whose limit is unknown.
pub fn tabulated_refined_limit_msun(x: f64, z: f64) -> Option<f64> {
    let locate = |v: f64, axis: &[f64]| -> Option<(usize, f64)> {
        let i = axis.windows(2).position(|w| v >= w[0] && v <= w[1])?;
        Some((i, (v - axis[i]) / (axis[i + 1] - axis[i])))
    };
    let (i, fx) = locate(x, &LIMIT_TABLE_X)?;
    let log_z: Vec<f64> = LIMIT_TABLE_Z.iter().map(|z| z.ln()).collect();
    let (j, fz) = locate(z.max(f64::MIN_POSITIVE).ln(), &log_z)?;
    let at = |a: usize, b: usize| REFINED_LIMITS[a][b];
    let value = (1.0 - fx) * ((1.0 - fz) * at(i, j) + fz * at(i, j + 1))
        + fx * ((1.0 - fz) * at(i + 1, j) + fz * at(i + 1, j + 1));
    value.is_finite().then_some(value)
}

/// Step in ln M of the finite difference dF/dln M.
const LN_MASS_STEP: f64 = 1e-6;

/// The hydrogen-burning limit of one composition and set of laws.
#[derive(Debug, Clone)]
pub struct HydrogenBurningLimit {
    /// The limiting mass, M_sun: the turning point of the ZAMS branch where the continuation
    /// reached it; otherwise the lowest mass at which the laws still give a model (the laws
    /// fail just below it, `stopped_by`), an upper bound of the turning point of these laws.
    pub mass_msun: f64,
    /// The model at `mass_msun`.
    pub model: ZamsModel,
    /// `None` when the continuation reached the turning point; otherwise where the turning
    /// point lies by a parabola through the branch's approach to it, M_sun
    /// ([`crate::numerics::continuation::FoldLocation::Stalled`]; `None` also when the parabola
    /// gives no vertex ahead): an estimate beyond the
    /// laws' domain, which moves by up to about 1 per cent with the branch's last steps.
    pub turning_point_estimate_msun: Option<f64>,
    /// Why the branch could not be followed below `mass_msun` (`None` when the turning point
    /// was reached).
    pub stopped_by: Option<String>,
    /// Masses visited along the branch, M_sun, from the start down to the limit.
    pub branch_masses_msun: Vec<f64>,
}

/// The ZAMS mismatch as a function of the unknowns and lambda = ln(M / M_sun).
struct ZamsBranch<'a> {
    physics: &'a PhysicsSet,
    composition: &'a Composition,
    tolerance: f64,
    /// The last failure of an evaluation (why a corrector step could not be taken).
    last_error: Option<LegError>,
}

impl<'a> ZamsBranch<'a> {
    fn context(&self, lambda: f64) -> LegContext<'a> {
        leg_context(lambda.exp(), self.physics, self.composition, self.tolerance)
    }

    fn problem(&self, lambda: f64) -> std::result::Result<ShootingProblem<'a>, LegError> {
        ShootingProblem::new(self.context(lambda), 0.4, self.tolerance)
    }
}

impl Branch<4> for ZamsBranch<'_> {
    type Error = LegError;

    fn residual(
        &mut self,
        u: &Unknowns,
        lambda: f64,
    ) -> std::result::Result<SVector<f64, 4>, LegError> {
        let f = self.problem(lambda).and_then(|mut p| p.residual(u));
        if let Err(e) = &f {
            self.last_error = Some(e.clone());
        }
        f
    }

    fn derivatives(
        &mut self,
        u: &Unknowns,
        lambda: f64,
        f: &SVector<f64, 4>,
    ) -> std::result::Result<(SMatrix<f64, 4, 4>, SVector<f64, 4>), LegError> {
        let j = self.problem(lambda).and_then(|mut p| p.jacobian(u, f));
        let f_up = self.residual(u, lambda + LN_MASS_STEP);
        match (j, f_up) {
            (Ok(j), Ok(f_up)) => Ok((j, (f_up - f) / LN_MASS_STEP)),
            (Err(e), _) | (_, Err(e)) => {
                self.last_error = Some(e.clone());
                Err(e)
            }
        }
    }
}

/// The hydrogen-burning minimum mass for `composition` and `physics`: the fold of the ZAMS
/// branch in mass, followed downward from [`START_MASS_MSUN`] at the default tolerance.
///
/// Errors: [`Error::InvalidInput`] for a set of laws that does not describe stars near the limit
/// (a preset with a minimum mass above it, e.g. `analytic`); [`Error::NoConvergence`] if the
/// model at the start does not converge; [`Error::Integration`] (what: "hydrogen-burning limit")
/// if the continuation finds no fold in [`SEARCH_RANGE_MSUN`] or cannot go on.
pub fn hydrogen_burning_limit(
    composition: &Composition,
    physics: &PhysicsSet,
) -> Result<HydrogenBurningLimit> {
    let preset = physics.spec().preset;
    if let Some(min) = preset.minimum_mass_msun() {
        return Err(Error::invalid(
            "preset",
            preset,
            &format!(
                "the {preset} set describes stars above {min} M_sun only, far from the hydrogen-burning limit; use the refined preset"
            ),
        ));
    }
    let start = ZamsSettings::new(START_MASS_MSUN, *composition, physics.clone())?;
    let u0 = solve(&start)?.unknowns;
    let mut branch = ZamsBranch {
        physics,
        composition,
        tolerance: DEFAULT_TOLERANCE,
        last_error: None,
    };
    let (lo, hi) = SEARCH_RANGE_MSUN;
    let fail = |why: String, at: f64| Error::Integration {
        what: "hydrogen-burning limit",
        variable: "M/M_sun",
        at,
        reason: why,
    };
    let result = find_fold(
        &mut branch,
        u0,
        START_MASS_MSUN.ln(),
        -1.0,
        (lo.ln(), hi.ln()),
        &ContinuationSettings::default(),
    );
    let stopped_by = branch.last_error.map(|e| e.to_string());
    let last_error = stopped_by
        .as_ref()
        .map_or(String::new(), |e| format!(" (last failure: {e})"));
    let fold = result.map_err(|e| match e {
        ContinuationError::Start(leg) => Error::Leg(leg),
        ContinuationError::NoFold { lambda } => fail(
            format!("no turning point of the ZAMS branch between {lo} and {hi} M_sun"),
            lambda.exp(),
        ),
        ContinuationError::StepTooSmall { lambda } => fail(
            format!(
                "the ZAMS branch could not be followed further down in mass before a turning point{last_error}"
            ),
            lambda.exp(),
        ),
        ContinuationError::TooManySteps { lambda } => {
            fail("too many continuation steps".into(), lambda.exp())
        }
        ContinuationError::SingularStart => fail(
            "the Jacobian at the starting model is singular".into(),
            START_MASS_MSUN,
        ),
    })?;
    let model = model_at(composition, physics, fold.point.lambda.exp(), fold.point.u)?;
    let (mass_msun, turning_point_estimate_msun, stopped_by) = match fold.located {
        FoldLocation::Reached => (fold.lambda.exp(), None, None),
        FoldLocation::Stalled { extrapolated } => {
            let why = stopped_by.unwrap_or_else(|| {
                "Newton's method did not converge on the branch below it".to_string()
            });
            (model.mass_msun(), extrapolated.map(f64::exp), Some(why))
        }
    };
    Ok(HydrogenBurningLimit {
        mass_msun,
        model,
        turning_point_estimate_msun,
        stopped_by,
        branch_masses_msun: fold.branch.iter().map(|p| p.lambda.exp()).collect(),
    })
}

/// The model of the converged unknowns `u` at `mass_msun` (the fold, where Newton's method on
/// the plain problem would be singular): its legs integrated once at the default tolerance.
fn model_at(
    composition: &Composition,
    physics: &PhysicsSet,
    mass_msun: f64,
    u: Unknowns,
) -> Result<ZamsModel> {
    let settings = ZamsSettings::near_the_limit(mass_msun, *composition, physics.clone())?
        .with_unknowns_guess(u);
    let ctx = leg_context(mass_msun, physics, composition, DEFAULT_TOLERANCE);
    let mut problem = ShootingProblem::new(ctx, settings.fit_mass_fraction(), DEFAULT_TOLERANCE)?;
    let legs = problem.legs_at(&u)?;
    let mismatch = problem.residual(&u)?.amax();
    let stats = SolveStats {
        iterations: 0,
        fit_mismatch: mismatch,
        residual_evaluations: 1,
        jacobian_evaluations: 0,
        rhs_evaluations: problem.runner.rhs_evaluations(),
        tolerance: DEFAULT_TOLERANCE,
    };
    model::build(&settings, problem.ctx(), &legs, Vec::new(), stats)
}
