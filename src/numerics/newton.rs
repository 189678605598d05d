//! A damped Newton iteration for small square nonlinear systems F(u) = 0.
//!
//! The driver knows nothing about what F means: a [`NewtonProblem`] supplies the residual and
//! its Jacobian; the driver takes the Newton step J du = -F, limits it to a trust length, and
//! halves it (backtracking line search) until the residual's max-norm decreases, or failing
//! that its 2-norm (the Newton direction is a descent direction of |F|^2). It records the
//! history of every iteration so that a caller can show why a solve failed.

use nalgebra::{SMatrix, SVector};

/// A square system F(u) = 0 of dimension `N`.
pub trait NewtonProblem<const N: usize> {
    /// Why F or its Jacobian could not be evaluated.
    type Error;
    /// F(u). May fail (for a trial outside where F is defined).
    fn residual(&mut self, u: &SVector<f64, N>) -> Result<SVector<f64, N>, Self::Error>;
    /// dF/du at `u`, where F(u) = `f`.
    fn jacobian(
        &mut self,
        u: &SVector<f64, N>,
        f: &SVector<f64, N>,
    ) -> Result<SMatrix<f64, N, N>, Self::Error>;
    /// Told the current residual norm before each iteration, so that a problem can tighten its
    /// own accuracy as the iteration converges. Returns true if it changed how F is computed
    /// (the driver then evaluates F again at the current point).
    fn adapt_to_residual(&mut self, _norm: f64) -> bool {
        false
    }
    /// Asked when no step along the Newton direction helps: a problem that can compute F more
    /// accurately (and so get a better Jacobian) does so and returns true; the driver then tries
    /// again from the same point.
    fn sharpen(&mut self) -> bool {
        false
    }
    /// Told, before the trial of a Newton step, the mismatch expected after it, so that a
    /// problem can evaluate the trial at the accuracy that mismatch calls for instead of the
    /// current one (one evaluation fewer when the step is good). Returns true if it changed how
    /// F is computed: the driver then keeps the Jacobian instead of updating it by Broyden's
    /// formula from two differently computed values of F, and if a trial does not lower the
    /// mismatch it measures F at the current point again at the new accuracy before judging
    /// the step (and aims again from there if the step still does not descend). The default
    /// ignores it.
    fn prepare_trial(&mut self, _expected_norm: f64) -> bool {
        false
    }
}

/// Settings of the iteration. Defaults: tolerance 1e-8 on the max-norm of F, 60 iterations,
/// trust length 0.5 (max-norm of a step), 12 halvings, Broyden updates after full steps.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct NewtonSettings {
    /// Converged when max |F_i| is below this.
    pub tolerance: f64,
    /// Maximum number of Newton iterations.
    pub max_iterations: usize,
    /// Largest max-norm of one step.
    pub max_step: f64,
    /// Maximum halvings of a step in the line search.
    pub max_halvings: usize,
    /// Update the Jacobian by Broyden's rank-one formula after a full Newton step, instead of
    /// asking the problem for a new one (which it recomputes after any damped step, a failed
    /// line search, or a change of accuracy).
    pub broyden: bool,
}

impl Default for NewtonSettings {
    fn default() -> Self {
        Self {
            tolerance: 1e-8,
            max_iterations: 60,
            max_step: 0.5,
            max_halvings: 12,
            broyden: true,
        }
    }
}

/// One iteration of the history.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct IterationRecord {
    /// Max-norm of F at the start of the iteration.
    pub residual_norm: f64,
    /// Fraction of the (trust-limited) Newton step taken.
    pub step_length: f64,
}

/// Why the iteration stopped.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum Termination<E> {
    /// The max-norm of F fell below the tolerance.
    Converged,
    /// F could not be evaluated at the starting point.
    StartNotEvaluable(E),
    /// No step along the Newton direction reduced the mismatch, and the problem could not
    /// sharpen its evaluation.
    Stalled,
    /// The Jacobian was singular or gave a non-finite step.
    SingularJacobian,
    /// The Jacobian could not be evaluated.
    JacobianFailed(E),
    /// F could not be evaluated again after the problem changed its accuracy.
    ReevaluationFailed(E),
    /// The iteration limit was reached.
    IterationLimit,
}

/// What the iteration did.
#[derive(Debug, Clone, PartialEq)]
pub struct NewtonReport<const N: usize, E> {
    /// The last accepted point (the solution when converged).
    pub solution: SVector<f64, N>,
    /// Max-norm of F there.
    pub residual_norm: f64,
    /// Iterations done.
    pub iterations: usize,
    /// Why it stopped.
    pub termination: Termination<E>,
    /// Every iteration.
    pub history: Vec<IterationRecord>,
    /// Evaluations of F asked of the problem (including line-search trials).
    pub residual_evaluations: usize,
    /// Jacobians asked of the problem (Broyden updates not counted).
    pub jacobian_evaluations: usize,
}

impl<const N: usize, E> NewtonReport<N, E> {
    /// Whether the tolerance was met.
    pub fn converged(&self) -> bool {
        matches!(self.termination, Termination::Converged)
    }
}

fn two_norm<const N: usize>(v: &SVector<f64, N>) -> f64 {
    let n = v.norm();
    if n.is_nan() {
        f64::INFINITY
    } else {
        n
    }
}

/// max_i |v_i|, infinite if any component is NaN.
pub(crate) fn max_norm<const N: usize>(v: &SVector<f64, N>) -> f64 {
    v.iter().fold(0.0f64, |a, x| {
        if x.is_nan() {
            f64::INFINITY
        } else {
            a.max(x.abs())
        }
    })
}

/// F at `u` again after the problem changed its accuracy, with its max-norm recorded in the
/// report; `None` (with the failure recorded) if it cannot be evaluated.
fn reevaluate<const N: usize, P: NewtonProblem<N>>(
    problem: &mut P,
    u: &SVector<f64, N>,
    report: &mut NewtonReport<N, P::Error>,
) -> Option<(SVector<f64, N>, f64)> {
    report.residual_evaluations += 1;
    match problem.residual(u) {
        Ok(f) => {
            let norm = max_norm(&f);
            report.residual_norm = norm;
            Some((f, norm))
        }
        Err(e) => {
            report.termination = Termination::ReevaluationFailed(e);
            None
        }
    }
}

/// Run the damped Newton iteration from `u0`.
pub fn solve<const N: usize, P: NewtonProblem<N>>(
    problem: &mut P,
    u0: SVector<f64, N>,
    settings: &NewtonSettings,
) -> NewtonReport<N, P::Error> {
    let mut report = NewtonReport {
        solution: u0,
        residual_norm: f64::INFINITY,
        iterations: 0,
        termination: Termination::IterationLimit,
        history: Vec::new(),
        residual_evaluations: 1,
        jacobian_evaluations: 0,
    };
    let mut u = u0;
    let mut f = match problem.residual(&u) {
        Ok(f) => f,
        Err(e) => {
            report.termination = Termination::StartNotEvaluable(e);
            return report;
        }
    };
    let mut norm = max_norm(&f);
    report.residual_norm = norm;
    let mut reusable: Option<SMatrix<f64, N, N>> = None;
    let mut remeasures = 0usize;
    while report.iterations < settings.max_iterations {
        // A change of accuracy keeps the Jacobian: F moves by about the old accuracy, its
        // derivatives hardly at all, and a Jacobian that no longer serves is replaced anyway
        // when the line search fails with it.
        if problem.adapt_to_residual(norm) {
            match reevaluate(problem, &u, &mut report) {
                Some((g, n)) => (f, norm) = (g, n),
                None => return report,
            }
        }
        if norm < settings.tolerance {
            report.termination = Termination::Converged;
            return report;
        }
        report.iterations += 1;
        let used_broyden = reusable.is_some();
        let jac = match reusable.take() {
            Some(j) => j,
            None => {
                report.jacobian_evaluations += 1;
                match problem.jacobian(&u, &f) {
                    Ok(j) => j,
                    Err(e) => {
                        report.termination = Termination::JacobianFailed(e);
                        return report;
                    }
                }
            }
        };
        // Solved as a dynamic matrix: once per iteration, so the allocation does not matter.
        let dense = nalgebra::DMatrix::from_fn(N, N, |i, j| jac[(i, j)]);
        let rhs = nalgebra::DVector::from_fn(N, |i, _| -f[i]);
        let Some(solution) = dense.lu().solve(&rhs) else {
            report.termination = Termination::SingularJacobian;
            return report;
        };
        let mut du = SVector::<f64, N>::from_fn(|i, _| solution[i]);
        let step_norm = max_norm(&du);
        if !step_norm.is_finite() {
            report.termination = Termination::SingularJacobian;
            return report;
        }
        if step_norm > settings.max_step {
            du *= settings.max_step / step_norm;
        }
        // Backtracking: accept the first step length that lowers the max-norm of F; failing
        // that, the first that lowers its 2-norm (the Newton direction always descends |F|^2,
        // while the max-norm can stall on a curved valley).
        // The mismatch expected after the step: the contraction of the last step if there was
        // one, else that of a quadratically converging iteration from this mismatch (e -> e^1.5,
        // the geometric mean of linear and quadratic); only the accuracy of the trial depends
        // on it, never the answer.
        let contraction = match report.history.last() {
            Some(previous) if previous.residual_norm > 0.0 => norm / previous.residual_norm,
            _ => norm.sqrt(),
        };
        let trial_changed_accuracy = problem.prepare_trial(norm * contraction.min(1.0));
        let mut norm2 = two_norm(&f);
        // Whether F here is still at the old accuracy while the trials are at the new one.
        let mut stale = trial_changed_accuracy;
        // One pass over the step lengths serves both criteria: the first length that lowers
        // the 2-norm is remembered while the max-norm is tried, so that no trial is computed
        // twice.
        let mut accepted = None;
        let mut two_norm_candidate = None;
        let mut remeasured = false;
        let mut lambda = 1.0;
        for _ in 0..=settings.max_halvings {
            let trial = u + du * lambda;
            report.residual_evaluations += 1;
            if let Ok(ft) = problem.residual(&trial) {
                let nt = max_norm(&ft);
                // A trial computed at a new accuracy would be compared with F here at the old
                // one; near convergence the change of accuracy alone can move F by more than
                // the step gains (the integration error of a shooting leg at a coarse
                // tolerance can be a hundred times the tolerance), and every shorter step
                // would then be rejected too. So the first trial that does not descend has F
                // here measured again at the new accuracy and is judged against that; if it
                // still does not descend, the step itself was aimed with the old F and the
                // iteration starts again from here.
                if nt >= norm && stale {
                    match reevaluate(problem, &u, &mut report) {
                        Some((g, n)) => (f, norm) = (g, n),
                        None => return report,
                    }
                    norm2 = two_norm(&f);
                    stale = false;
                    if nt >= norm {
                        remeasured = true;
                        break;
                    }
                }
                if nt < norm {
                    accepted = Some((trial, ft, nt, lambda));
                    break;
                }
                if two_norm_candidate.is_none() && two_norm(&ft) < norm2 {
                    two_norm_candidate = Some((trial, ft, nt, lambda));
                }
            }
            lambda *= 0.5;
        }
        if remeasured {
            // F here is now at the new accuracy: aim again from here with the same Jacobian.
            // Not an iteration of its own (no history record; the next iteration starts from
            // the re-measured mismatch), unless the problem keeps changing its accuracy: past
            // `max_iterations` re-measurements they count, so the loop ends.
            remeasures += 1;
            if remeasures <= settings.max_iterations {
                report.iterations -= 1;
            }
            reusable = Some(jac);
            continue;
        }
        let accepted = accepted.or(two_norm_candidate);
        let lambda = accepted.as_ref().map_or(0.0, |a| a.3);
        report.history.push(IterationRecord {
            residual_norm: norm,
            step_length: lambda,
        });
        match accepted {
            Some((trial, ft, nt, _)) => {
                // Broyden's update J += (df - J du) du^T / (du^T du) after a full step; any
                // damped step means the local model was poor, so the next Jacobian is fresh.
                // When the trial was computed at another accuracy than F here (and F was not
                // measured again), df holds the change of accuracy as well (often larger than
                // the step's own change near convergence): the Jacobian is kept as it is
                // instead, as after a change of accuracy at the start of an iteration.
                if settings.broyden && lambda == 1.0 && stale {
                    reusable = Some(jac);
                } else if settings.broyden && lambda == 1.0 {
                    let step = trial - u;
                    let denom = step.dot(&step);
                    if denom > 0.0 {
                        reusable = Some(jac + (ft - f - jac * step) * step.transpose() / denom);
                    }
                }
                u = trial;
                f = ft;
                norm = nt;
                report.solution = u;
                report.residual_norm = norm;
            }
            // The Jacobian was a Broyden update: try again from here with a fresh one.
            None if used_broyden => {}
            None if problem.sharpen() => match reevaluate(problem, &u, &mut report) {
                Some((g, n)) => (f, norm) = (g, n),
                None => return report,
            },
            None => {
                report.termination = Termination::Stalled;
                return report;
            }
        }
    }
    report.termination = if norm < settings.tolerance {
        Termination::Converged
    } else {
        Termination::IterationLimit
    };
    report
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Rosenbrock-like 2-D system with root (1, 1): F = (10 (u1 - u0^2), 1 - u0).
    struct Banana;
    impl NewtonProblem<2> for Banana {
        type Error = ();
        fn residual(&mut self, u: &SVector<f64, 2>) -> Result<SVector<f64, 2>, ()> {
            Ok(SVector::<f64, 2>::new(
                10.0 * (u[1] - u[0] * u[0]),
                1.0 - u[0],
            ))
        }
        fn jacobian(
            &mut self,
            u: &SVector<f64, 2>,
            _f: &SVector<f64, 2>,
        ) -> Result<SMatrix<f64, 2, 2>, ()> {
            Ok(SMatrix::<f64, 2, 2>::new(-20.0 * u[0], 10.0, -1.0, 0.0))
        }
    }

    #[test]
    fn converges_on_a_curved_valley() {
        let settings = NewtonSettings {
            max_step: 10.0,
            ..Default::default()
        };
        let r = solve(&mut Banana, SVector::<f64, 2>::new(-1.2, 1.0), &settings);
        assert!(r.converged(), "{r:?}");
        assert!(r.residual_evaluations > r.iterations && r.jacobian_evaluations >= 1);
        assert!((r.solution[0] - 1.0).abs() < 1e-8 && (r.solution[1] - 1.0).abs() < 1e-8);
    }

    /// F(u) = u^2 + 1 has no real root: the driver must stop and say so, not loop.
    struct NoRoot;
    impl NewtonProblem<1> for NoRoot {
        type Error = ();
        fn residual(&mut self, u: &SVector<f64, 1>) -> Result<SVector<f64, 1>, ()> {
            Ok(SVector::<f64, 1>::new(u[0] * u[0] + 1.0))
        }
        fn jacobian(
            &mut self,
            u: &SVector<f64, 1>,
            _f: &SVector<f64, 1>,
        ) -> Result<SMatrix<f64, 1, 1>, ()> {
            Ok(SMatrix::<f64, 1, 1>::new(2.0 * u[0]))
        }
    }

    #[test]
    fn reports_failure_without_a_root() {
        let r = solve(
            &mut NoRoot,
            SVector::<f64, 1>::new(0.5),
            &NewtonSettings::default(),
        );
        assert!(!r.converged());
        assert!(matches!(
            r.termination,
            Termination::Stalled | Termination::SingularJacobian
        ));
    }

    /// A linear F = u - 1 computed with an error that depends on the accuracy (coarse, then
    /// fine once `prepare_trial` switches), as shooting legs integrated at two tolerances are.
    /// With offsets (1e-6, -2e-6) from u = 1 + 1e-6 (F = 2e-6 coarse) the full Newton step
    /// lands where the fine F is -3e-6: it does not descend, and the step was aimed the wrong
    /// way (judged against the coarse F, a quarter step would be taken, away from the root).
    struct TwoAccuracies {
        /// The error of F at the coarse and at the fine accuracy.
        offsets: (f64, f64),
        /// F cannot be evaluated strictly inside this interval of u.
        hole: (f64, f64),
        fine: bool,
        evaluations: usize,
    }
    impl NewtonProblem<1> for TwoAccuracies {
        type Error = ();
        fn residual(&mut self, u: &SVector<f64, 1>) -> Result<SVector<f64, 1>, ()> {
            self.evaluations += 1;
            if u[0] > self.hole.0 && u[0] < self.hole.1 {
                return Err(());
            }
            let offset = if self.fine {
                self.offsets.1
            } else {
                self.offsets.0
            };
            Ok(SVector::<f64, 1>::new(u[0] - 1.0 + offset))
        }
        fn jacobian(
            &mut self,
            _u: &SVector<f64, 1>,
            _f: &SVector<f64, 1>,
        ) -> Result<SMatrix<f64, 1, 1>, ()> {
            Ok(SMatrix::<f64, 1, 1>::new(1.0))
        }
        fn prepare_trial(&mut self, _expected_norm: f64) -> bool {
            let changed = !self.fine;
            self.fine = true;
            changed
        }
    }

    /// Solve a [`TwoAccuracies`] problem with `offsets` and `hole` from u = 1 + 1e-6 to a
    /// mismatch of 1e-9, check that it converged to its root 1 - (fine offset), and return the
    /// report, the evaluations of F and the step lengths of the history.
    fn two_accuracies(
        offsets: (f64, f64),
        hole: (f64, f64),
    ) -> (NewtonReport<1, ()>, usize, Vec<f64>) {
        let mut problem = TwoAccuracies {
            offsets,
            hole,
            fine: false,
            evaluations: 0,
        };
        let settings = NewtonSettings {
            tolerance: 1e-9,
            ..Default::default()
        };
        let r = solve(&mut problem, SVector::<f64, 1>::new(1.0 + 1e-6), &settings);
        assert!(r.converged(), "{r:?}");
        assert!((r.solution[0] - (1.0 - offsets.1)).abs() < 1e-12, "{r:?}");
        let lengths = r.history.iter().map(|h| h.step_length).collect();
        (r, problem.evaluations, lengths)
    }

    /// The step computed at a new accuracy is judged against F measured again at that
    /// accuracy: one re-evaluation, not a failed line search.
    #[test]
    fn a_step_at_a_new_accuracy_is_judged_at_that_accuracy() {
        // Start, the full-step trial, F again at the fine accuracy, the step aimed with it; the
        // re-measurement is not an iteration of its own.
        let (r, evaluations, lengths) = two_accuracies((1e-6, -2e-6), (0.0, 0.0));
        assert_eq!(evaluations, 4, "{r:?}");
        assert_eq!(lengths, [1.0], "{r:?}");
        assert_eq!(r.iterations, 1, "{r:?}");
        assert_eq!(r.jacobian_evaluations, 1, "{r:?}");

        // A step that is good at the fine accuracy but not against the coarse F: taken after
        // F is measured again, without a line search.
        let (r, evaluations, lengths) = two_accuracies((-0.9e-6, 1e-6), (0.0, 0.0));
        assert_eq!(evaluations, 4, "{r:?}");
        assert_eq!(lengths, [1.0, 1.0], "{r:?}");

        // The full step cannot be evaluated (it lands in a hole of F's domain): the first
        // shorter trial that does not descend against the coarse F is judged again at the fine
        // accuracy. Offsets (1e-6, 2.5e-6): the half step has F = 2.5e-6 fine, above the coarse
        // 2e-6 but below the fine 3.5e-6 at the start. Start, the full step (not evaluable),
        // the half step, F again, the next full step.
        let (r, evaluations, lengths) =
            two_accuracies((1e-6, 2.5e-6), (1.0 - 1.5e-6, 1.0 - 0.5e-6));
        assert_eq!(evaluations, 5, "{r:?}");
        assert_eq!(lengths, [0.5, 1.0], "{r:?}");
    }
}
