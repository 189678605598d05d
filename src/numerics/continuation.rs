//! Pseudo-arclength continuation of a solution branch F(u, lambda) = 0 and location of its
//! turning point (fold), where the branch doubles back in lambda.
//!
//! Keller's method (Keller 1977, in *Applications of Bifurcation Theory*, ed. Rabinowitz; e.g.
//! Seydel 2010, *Practical Bifurcation and Stability Analysis*, §4.5): from a point z_k =
//! (u_k, lambda_k) on the branch with unit tangent t_k, predict z = z_k + ds t_k and correct by
//! Newton's method on
//!
//! F(z) = 0,   t_k . (z - z_k) - ds = 0,
//!
//! which stays regular through a fold, where dF/du alone is singular. The tangent at the new
//! point is the null vector of [dF/du | dF/dlambda], oriented to continue the direction of
//! travel. A fold is where the tangent's lambda component changes sign; it is located by the
//! secant method on that component along the branch (each trial a corrector step from the
//! last point before the fold), to a given tolerance in lambda.
//!
//! The driver knows nothing about what F means.

use super::newton::max_norm;
use nalgebra::{DMatrix, DVector, SMatrix, SVector};

/// A branch of solutions of F(u, lambda) = 0, u of dimension `N`.
pub trait Branch<const N: usize> {
    /// Why F or its derivatives could not be evaluated.
    type Error;
    /// F(u, lambda).
    fn residual(
        &mut self,
        u: &SVector<f64, N>,
        lambda: f64,
    ) -> Result<SVector<f64, N>, Self::Error>;
    /// dF/du and dF/dlambda at (u, lambda), where F = `f`.
    fn derivatives(
        &mut self,
        u: &SVector<f64, N>,
        lambda: f64,
        f: &SVector<f64, N>,
    ) -> Result<(SMatrix<f64, N, N>, SVector<f64, N>), Self::Error>;
}

/// Settings of the continuation. Defaults: first step 0.02, steps between 1e-5 and 0.2 (in the
/// combined norm of u and lambda), residual tolerance 1e-8 (max-norm), 8 corrector iterations,
/// 300 steps, fold located to 1e-7 in lambda.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ContinuationSettings {
    /// First arclength step.
    pub initial_step: f64,
    /// Smallest step before giving up.
    pub min_step: f64,
    /// Largest step.
    pub max_step: f64,
    /// Converged when max |F_i| is below this.
    pub tolerance: f64,
    /// Newton iterations of one corrector.
    pub max_corrector_iterations: usize,
    /// Accepted steps along the branch.
    pub max_steps: usize,
    /// The fold is located to this width in lambda.
    pub fold_tolerance: f64,
}

impl Default for ContinuationSettings {
    fn default() -> Self {
        Self {
            initial_step: 0.02,
            min_step: 1e-5,
            max_step: 0.2,
            tolerance: 1e-8,
            max_corrector_iterations: 8,
            max_steps: 300,
            fold_tolerance: 1e-7,
        }
    }
}

/// One point of the branch, with its unit tangent.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BranchPoint<const N: usize> {
    /// The unknowns.
    pub u: SVector<f64, N>,
    /// The parameter.
    pub lambda: f64,
    /// Tangent, u part.
    pub tangent_u: SVector<f64, N>,
    /// Tangent, lambda part.
    pub tangent_lambda: f64,
}

/// Why the continuation stopped without a fold.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum ContinuationError<E> {
    /// F or its derivatives failed at the start.
    Start(E),
    /// The step shrank below the minimum: the corrector failed from the last point.
    StepTooSmall {
        /// The last point reached.
        lambda: f64,
    },
    /// The parameter left the allowed range without a fold.
    NoFold {
        /// The last point reached.
        lambda: f64,
    },
    /// Too many steps.
    TooManySteps {
        /// The last point reached.
        lambda: f64,
    },
    /// dF/du at the start is singular (the start is itself a fold or a bad point).
    SingularStart,
}

/// The fold and the branch that led to it.
#[derive(Debug, Clone, PartialEq)]
pub struct Fold<const N: usize> {
    /// The turning point (its tangent's lambda part is within the tolerance of 0), or, when the
    /// branch could not be followed to it, the last point reached.
    pub point: BranchPoint<N>,
    /// `point.lambda`.
    pub lambda: f64,
    /// How the fold was found.
    pub located: FoldLocation,
    /// The points visited, start first (the fold not included).
    pub branch: Vec<BranchPoint<N>>,
}

/// How a fold was found.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum FoldLocation {
    /// Reached: the tangent's lambda part changed sign between two branch points and the fold
    /// was located between them.
    Reached,
    /// Stalled: the corrector could not step further (F undefined beyond, e.g. a law's
    /// domain) while the branch was approaching a turn: its tangent's lambda part had fallen
    /// below a fifth of its value at the start. The fold lies beyond the last point reached.
    Stalled {
        /// The fold's lambda extrapolated from the approach (lambda, a parabola in the leading
        /// unknown near a simple fold, has its vertex just ahead; see `extrapolate_fold`), or
        /// `None` if the last points do not give a vertex ahead. An estimate only: it depends
        /// on the last steps taken.
        extrapolated: Option<f64>,
    },
}

/// The unit tangent at (u, lambda) from dF/du = `j` and dF/dlambda = `fl`, oriented along
/// `previous` (or with lambda decreasing if `direction` < 0 when there is none).
fn tangent<const N: usize>(
    j: &SMatrix<f64, N, N>,
    fl: &SVector<f64, N>,
    previous: Option<(&SVector<f64, N>, f64)>,
    direction: f64,
) -> Option<(SVector<f64, N>, f64)> {
    // Null vector of [J | F_lambda] by the bordered system [J F_l; c^T] t = [0; 1], with c the
    // previous tangent (or e_lambda): regular through the fold, where J alone is singular.
    let n = N + 1;
    let mut a = DMatrix::<f64>::zeros(n, n);
    for r in 0..N {
        for c in 0..N {
            a[(r, c)] = j[(r, c)];
        }
        a[(r, N)] = fl[r];
    }
    match previous {
        Some((tu, tl)) => {
            for c in 0..N {
                a[(N, c)] = tu[c];
            }
            a[(N, N)] = tl;
        }
        None => a[(N, N)] = 1.0,
    }
    let mut rhs = DVector::<f64>::zeros(n);
    rhs[N] = 1.0;
    let t = a.lu().solve(&rhs)?;
    let norm = t.norm();
    if !(norm.is_finite() && norm > 0.0) {
        return None;
    }
    let mut tu = SVector::<f64, N>::from_fn(|i, _| t[i] / norm);
    let mut tl = t[N] / norm;
    let sign = match previous {
        Some((pu, pl)) => (tu.dot(pu) + tl * pl).signum(),
        None => (tl * direction).signum(),
    };
    if sign < 0.0 {
        tu = -tu;
        tl = -tl;
    }
    Some((tu, tl))
}

/// What one corrector found: the point, F's Jacobians there, and the iterations it took.
struct Corrected<const N: usize> {
    u: SVector<f64, N>,
    lambda: f64,
    j: SMatrix<f64, N, N>,
    fl: SVector<f64, N>,
    iterations: usize,
}

/// Newton's method on [F(z); t.(z - z0) - ds] from the predictor z0 + ds t.
fn correct<const N: usize, B: Branch<N>>(
    problem: &mut B,
    from: &BranchPoint<N>,
    ds: f64,
    settings: &ContinuationSettings,
) -> Option<Corrected<N>> {
    let mut u = from.u + from.tangent_u * ds;
    let mut lambda = from.lambda + from.tangent_lambda * ds;
    for iteration in 0..=settings.max_corrector_iterations {
        let f = problem.residual(&u, lambda).ok()?;
        let (j, fl) = problem.derivatives(&u, lambda, &f).ok()?;
        let arclength =
            from.tangent_u.dot(&(u - from.u)) + from.tangent_lambda * (lambda - from.lambda) - ds;
        if max_norm(&f) < settings.tolerance && arclength.abs() < 1e-3 * ds.abs().max(1e-12) {
            return Some(Corrected {
                u,
                lambda,
                j,
                fl,
                iterations: iteration,
            });
        }
        if iteration == settings.max_corrector_iterations {
            return None;
        }
        let n = N + 1;
        let mut a = DMatrix::<f64>::zeros(n, n);
        let mut rhs = DVector::<f64>::zeros(n);
        for r in 0..N {
            for c in 0..N {
                a[(r, c)] = j[(r, c)];
            }
            a[(r, N)] = fl[r];
            rhs[r] = -f[r];
        }
        for c in 0..N {
            a[(N, c)] = from.tangent_u[c];
        }
        a[(N, N)] = from.tangent_lambda;
        rhs[N] = -arclength;
        let dz = a.lu().solve(&rhs)?;
        if !dz.iter().all(|v| v.is_finite()) {
            return None;
        }
        for i in 0..N {
            u[i] += dz[i];
        }
        lambda += dz[N];
    }
    None
}

/// Follow the branch from the solution `u0` at `lambda0` in the direction of `direction`'s sign
/// in lambda, until its tangent's lambda part changes sign (a fold), and locate the fold.
/// Continuation stops with [`ContinuationError::NoFold`] if lambda leaves
/// [`lambda_min`, `lambda_max`].
pub fn find_fold<const N: usize, B: Branch<N>>(
    problem: &mut B,
    u0: SVector<f64, N>,
    lambda0: f64,
    direction: f64,
    (lambda_min, lambda_max): (f64, f64),
    settings: &ContinuationSettings,
) -> Result<Fold<N>, ContinuationError<B::Error>> {
    let f0 = problem
        .residual(&u0, lambda0)
        .map_err(ContinuationError::Start)?;
    let (j0, fl0) = problem
        .derivatives(&u0, lambda0, &f0)
        .map_err(ContinuationError::Start)?;
    let (tu, tl) = tangent(&j0, &fl0, None, direction).ok_or(ContinuationError::SingularStart)?;
    let mut current = BranchPoint {
        u: u0,
        lambda: lambda0,
        tangent_u: tu,
        tangent_lambda: tl,
    };
    let mut branch = vec![current];
    let mut ds = settings.initial_step;
    for _ in 0..settings.max_steps {
        let Some(next) = correct(problem, &current, ds, settings) else {
            ds *= 0.5;
            if ds < settings.min_step {
                return stalled_fold(&branch).ok_or(ContinuationError::StepTooSmall {
                    lambda: current.lambda,
                });
            }
            continue;
        };
        let Some((tu, tl)) = tangent(
            &next.j,
            &next.fl,
            Some((&current.tangent_u, current.tangent_lambda)),
            direction,
        ) else {
            ds *= 0.5;
            continue;
        };
        let point = BranchPoint {
            u: next.u,
            lambda: next.lambda,
            tangent_u: tu,
            tangent_lambda: tl,
        };
        if tl.signum() != current.tangent_lambda.signum() {
            let fold = locate_fold(problem, &current, &point, ds, settings);
            return Ok(Fold {
                point: fold,
                lambda: fold.lambda,
                located: FoldLocation::Reached,
                branch,
            });
        }
        if !(lambda_min..=lambda_max).contains(&point.lambda) {
            return Err(ContinuationError::NoFold {
                lambda: point.lambda,
            });
        }
        branch.push(point);
        current = point;
        ds = if next.iterations <= 2 {
            (ds * 1.5).min(settings.max_step)
        } else if next.iterations >= 5 {
            (ds * 0.7).max(settings.min_step)
        } else {
            ds
        };
    }
    Err(ContinuationError::TooManySteps {
        lambda: current.lambda,
    })
}

/// Points used to extrapolate a fold (at most; at least 4).
const EXTRAPOLATION_POINTS: usize = 8;
/// How far back along the branch the extrapolation looks for them (points).
const EXTRAPOLATION_LOOKBACK: usize = 24;
/// Smallest spacing in v between two of the points fitted, relative to the span looked back
/// over: points that pile up where the corrector stalls carry no curvature, only noise.
const EXTRAPOLATION_MIN_GAP: f64 = 1.0 / 16.0;
/// How small the tangent's lambda part must have become, relative to its value at the start,
/// for an extrapolation to be tried.
const EXTRAPOLATION_RATIO: f64 = 0.2;

/// The fold beyond the last point of `branch` when the corrector stalled there (see
/// [`FoldLocation::Stalled`]); `None` if the branch was not approaching a turn (fewer than 5
/// points, or the tangent's lambda part still above [`EXTRAPOLATION_RATIO`] of its start).
fn stalled_fold<const N: usize>(branch: &[BranchPoint<N>]) -> Option<Fold<N>> {
    let first = branch.first()?.tangent_lambda;
    let last = branch.last()?;
    if branch.len() < 5 || last.tangent_lambda.abs() > EXTRAPOLATION_RATIO * first.abs() {
        return None;
    }
    Some(Fold {
        point: *last,
        lambda: last.lambda,
        located: FoldLocation::Stalled {
            extrapolated: extrapolate_fold(branch),
        },
        branch: branch.to_vec(),
    })
}

/// The fold's lambda ahead of the last points of `branch`: near a simple fold lambda is a
/// parabola in the unknown v that moves most along the branch (the largest component of the
/// last tangent), so a least-squares parabola through the last points gives the fold as its
/// vertex, which must lie ahead of the last point and within a few times the span of the points
/// fitted. The points are taken back from the last one with spacings in v of at least
/// [`EXTRAPOLATION_MIN_GAP`] of the span looked back over, so that a cluster of tiny steps where
/// the corrector stalled does not decide the fit. `None` if that gives no such vertex. (The
/// tangents themselves are too noisy for this once the steps have shrunk: they come from
/// finite-difference Jacobians.)
fn extrapolate_fold<const N: usize>(branch: &[BranchPoint<N>]) -> Option<f64> {
    let n = branch.len();
    let last = branch.last()?;
    let k = last.tangent_u.iamax();
    let v_last = last.u[k];
    let looked_back = &branch[n.saturating_sub(EXTRAPOLATION_LOOKBACK)..];
    let reach = looked_back
        .iter()
        .map(|p| (p.u[k] - v_last).abs())
        .fold(0.0f64, f64::max);
    let mut tail: Vec<&BranchPoint<N>> = vec![last];
    for p in looked_back.iter().rev().skip(1) {
        if tail.len() == EXTRAPOLATION_POINTS {
            break;
        }
        let previous = tail[tail.len() - 1].u[k];
        if (p.u[k] - previous).abs() >= EXTRAPOLATION_MIN_GAP * reach {
            tail.push(p);
        }
    }
    if tail.len() < 4 {
        return None;
    }
    let span = tail
        .iter()
        .map(|p| (p.u[k] - v_last).abs())
        .fold(0.0f64, f64::max);
    if span <= 0.0 {
        return None;
    }
    // lambda = c0 + c1 w + c2 w^2 with w = (v - v_last) / span, by the normal equations.
    let mut a = nalgebra::Matrix3::<f64>::zeros();
    let mut b = nalgebra::Vector3::<f64>::zeros();
    for p in &tail {
        let w = (p.u[k] - v_last) / span;
        let row = nalgebra::Vector3::new(1.0, w, w * w);
        a += row * row.transpose();
        b += row * p.lambda;
    }
    let c = a.lu().solve(&b)?;
    if c[2] == 0.0 {
        return None;
    }
    let w_star = -c[1] / (2.0 * c[2]);
    let lambda = c[0] - c[1] * c[1] / (4.0 * c[2]);
    // Ahead of the last point (in the direction the branch moves in v), not far ahead, and a
    // turn in the direction the branch was going in lambda.
    let ahead = w_star * last.tangent_u[k].signum() > 0.0 && w_star.abs() < 3.0;
    let turning = (lambda - last.lambda) * last.tangent_lambda > 0.0;
    (ahead && turning && lambda.is_finite()).then_some(lambda)
}

/// The fold between `before` and `after` (whose tangents' lambda parts differ in sign, `after`
/// reached from `before` by the arclength step `ds`): the secant method on the tangent's lambda
/// part as a function of the arclength from `before`, each trial a corrector step from `before`.
fn locate_fold<const N: usize, B: Branch<N>>(
    problem: &mut B,
    before: &BranchPoint<N>,
    after: &BranchPoint<N>,
    ds: f64,
    settings: &ContinuationSettings,
) -> BranchPoint<N> {
    let (mut s0, mut t0) = (0.0, before.tangent_lambda);
    let (mut s1, mut t1) = (ds, after.tangent_lambda);
    let mut best = *after;
    let mut previous_lambda = after.lambda;
    for _ in 0..40 {
        let s = if t1 != t0 {
            (s1 - t1 * (s1 - s0) / (t1 - t0)).clamp(0.0, ds)
        } else {
            0.5 * (s0 + s1)
        };
        let Some(next) = correct(problem, before, s, settings) else {
            return best;
        };
        let Some((tu, tl)) = tangent(
            &next.j,
            &next.fl,
            Some((&before.tangent_u, before.tangent_lambda)),
            0.0,
        ) else {
            return best;
        };
        best = BranchPoint {
            u: next.u,
            lambda: next.lambda,
            tangent_u: tu,
            tangent_lambda: tl,
        };
        let moved = (next.lambda - previous_lambda).abs();
        previous_lambda = next.lambda;
        if moved < settings.fold_tolerance || tl == 0.0 {
            return best;
        }
        // Keep a bracket when the new point has the sign of the far end (regula falsi with
        // the secant's speed is enough here: tl is smooth in s near a simple fold).
        if tl.signum() == t1.signum() {
            s1 = s;
            t1 = tl;
        } else {
            s0 = s;
            t0 = tl;
        }
    }
    best
}

#[cfg(test)]
mod tests {
    use super::*;

    /// F(u, lambda) = u^2 + lambda - 1 (and a second, trivial component v - lambda): the branch
    /// u = sqrt(1 - lambda) folds at lambda = 1, u = 0.
    struct Parabola;
    impl Branch<2> for Parabola {
        type Error = ();
        fn residual(&mut self, u: &SVector<f64, 2>, l: f64) -> Result<SVector<f64, 2>, ()> {
            Ok(SVector::<f64, 2>::new(u[0] * u[0] + l - 1.0, u[1] - l))
        }
        fn derivatives(
            &mut self,
            u: &SVector<f64, 2>,
            _l: f64,
            _f: &SVector<f64, 2>,
        ) -> Result<(SMatrix<f64, 2, 2>, SVector<f64, 2>), ()> {
            Ok((
                SMatrix::<f64, 2, 2>::new(2.0 * u[0], 0.0, 0.0, 1.0),
                SVector::<f64, 2>::new(1.0, -1.0),
            ))
        }
    }

    #[test]
    fn finds_the_fold_of_a_parabola() {
        // Start at lambda = 0, u = 1, moving towards larger lambda.
        let fold = find_fold(
            &mut Parabola,
            SVector::<f64, 2>::new(1.0, 0.0),
            0.0,
            1.0,
            (-10.0, 10.0),
            &ContinuationSettings::default(),
        )
        .expect("a fold");
        assert!((fold.point.lambda - 1.0).abs() < 1e-6, "{:?}", fold.point);
        assert_eq!(fold.located, FoldLocation::Reached);
        assert_eq!(fold.lambda, fold.point.lambda);
        assert!(fold.point.u[0].abs() < 1e-3);
        assert!(fold.branch.len() > 3);
    }

    /// A branch without a fold (u = lambda) leaves the range and says so.
    struct Line;
    impl Branch<1> for Line {
        type Error = ();
        fn residual(&mut self, u: &SVector<f64, 1>, l: f64) -> Result<SVector<f64, 1>, ()> {
            Ok(SVector::<f64, 1>::new(u[0] - l))
        }
        fn derivatives(
            &mut self,
            _u: &SVector<f64, 1>,
            _l: f64,
            _f: &SVector<f64, 1>,
        ) -> Result<(SMatrix<f64, 1, 1>, SVector<f64, 1>), ()> {
            Ok((SMatrix::<f64, 1, 1>::new(1.0), SVector::<f64, 1>::new(-1.0)))
        }
    }

    #[test]
    fn a_branch_without_a_fold_leaves_the_range() {
        let r = find_fold(
            &mut Line,
            SVector::<f64, 1>::new(0.0),
            0.0,
            -1.0,
            (-1.0, 1.0),
            &ContinuationSettings::default(),
        );
        assert!(matches!(r, Err(ContinuationError::NoFold { lambda }) if lambda < -1.0));
    }
}

#[cfg(test)]
mod extrapolation {
    use super::*;

    /// F(u, lambda) = u^2 + lambda - 1, defined only for u > 0.05: the branch from u = 1 cannot be
    /// followed to its fold at (u, lambda) = (0, 1); the fold is extrapolated from the points
    /// before the barrier (where t_lambda = 2u / sqrt(1 + 4u^2) is nearly linear in arclength).
    struct Fenced;
    impl Branch<1> for Fenced {
        type Error = ();
        fn residual(&mut self, u: &SVector<f64, 1>, l: f64) -> Result<SVector<f64, 1>, ()> {
            if u[0] < 0.05 {
                return Err(());
            }
            Ok(SVector::<f64, 1>::new(u[0] * u[0] + l - 1.0))
        }
        fn derivatives(
            &mut self,
            u: &SVector<f64, 1>,
            _l: f64,
            _f: &SVector<f64, 1>,
        ) -> Result<(SMatrix<f64, 1, 1>, SVector<f64, 1>), ()> {
            Ok((
                SMatrix::<f64, 1, 1>::new(2.0 * u[0]),
                SVector::<f64, 1>::new(1.0),
            ))
        }
    }

    #[test]
    fn a_fold_beyond_a_barrier_stalls_and_is_extrapolated() {
        let settings = ContinuationSettings {
            max_step: 0.05,
            ..ContinuationSettings::default()
        };
        let fold = find_fold(
            &mut Fenced,
            SVector::<f64, 1>::new(1.0),
            0.0,
            1.0,
            (-10.0, 10.0),
            &settings,
        )
        .expect("an extrapolated fold");
        let FoldLocation::Stalled {
            extrapolated: Some(extrapolated),
        } = fold.located
        else {
            panic!("{:?}", fold.located)
        };
        // The last point reached has u above the barrier 0.05, lambda = 1 - u^2 below 0.9975;
        // the fold is at lambda = 1, and the extrapolation removes most of the gap (the
        // remaining error is of order the gap times the curvature of t_lambda(s) over it).
        let gap = 1.0 - fold.point.lambda;
        assert!(gap > 0.0025 && gap < 0.05, "{gap}");
        assert_eq!(fold.lambda, fold.point.lambda);
        assert!(
            (extrapolated - 1.0).abs() < 0.1 * gap,
            "{extrapolated} (gap {gap})"
        );
    }
}
