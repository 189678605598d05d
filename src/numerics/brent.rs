//! Root of a bracketed scalar function by Brent's method.
//!
//! Brent (1973, *Algorithms for Minimization without Derivatives*, ch. 4): inverse quadratic
//! interpolation or secant steps, falling back to bisection whenever they would leave the
//! bracket or converge too slowly, so that the root stays bracketed and the number of
//! evaluations is at most about the square of that of bisection.

/// Why [`brent`] stopped without a root.
#[derive(Debug, Clone, PartialEq)]
pub enum BrentError<E> {
    /// f(a) and f(b) have the same sign (or one is not finite).
    NotBracketed,
    /// The evaluation of f failed.
    Evaluation(E),
    /// The iteration limit was reached; the last bracket is given.
    TooManyIterations {
        /// One end of the last bracket.
        a: f64,
        /// The other end.
        b: f64,
    },
}

/// A root of `f` in [a, b], given f(a) = `fa` and f(b) = `fb` of opposite signs, to an
/// absolute accuracy `tolerance` (plus four units of rounding of the root). Returns the root.
pub fn brent<E, F>(
    mut f: F,
    a: f64,
    b: f64,
    fa: f64,
    fb: f64,
    tolerance: f64,
    max_iterations: usize,
) -> Result<f64, BrentError<E>>
where
    F: FnMut(f64) -> Result<f64, E>,
{
    if !(fa.is_finite() && fb.is_finite()) || fa * fb > 0.0 {
        return Err(BrentError::NotBracketed);
    }
    let (mut a, mut b, mut fa, mut fb) = (a, b, fa, fb);
    if fa == 0.0 {
        return Ok(a);
    }
    let (mut c, mut fc) = (a, fa);
    let mut d = b - a;
    let mut e = d;
    for _ in 0..max_iterations {
        if fb * fc > 0.0 {
            c = a;
            fc = fa;
            d = b - a;
            e = d;
        }
        if fc.abs() < fb.abs() {
            a = b;
            b = c;
            c = a;
            fa = fb;
            fb = fc;
            fc = fa;
        }
        let tol = 2.0 * f64::EPSILON * b.abs() + 0.5 * tolerance;
        let half = 0.5 * (c - b);
        if half.abs() <= tol || fb == 0.0 {
            return Ok(b);
        }
        if e.abs() >= tol && fa.abs() > fb.abs() {
            let s = fb / fa;
            let (mut p, mut q);
            if a == c {
                p = 2.0 * half * s;
                q = 1.0 - s;
            } else {
                let qa = fa / fc;
                let r = fb / fc;
                p = s * (2.0 * half * qa * (qa - r) - (b - a) * (r - 1.0));
                q = (qa - 1.0) * (r - 1.0) * (s - 1.0);
            }
            if p > 0.0 {
                q = -q;
            } else {
                p = -p;
            }
            if 2.0 * p < (3.0 * half * q - (tol * q).abs()).min((e * q).abs()) {
                e = d;
                d = p / q;
            } else {
                d = half;
                e = d;
            }
        } else {
            d = half;
            e = d;
        }
        a = b;
        fa = fb;
        b += if d.abs() > tol { d } else { tol.copysign(half) };
        fb = f(b).map_err(BrentError::Evaluation)?;
    }
    Err(BrentError::TooManyIterations { a: b, b: c })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_cosine_root() {
        let f = |x: f64| Ok::<f64, ()>(x.cos());
        let root = brent(f, 1.0, 2.0, 1f64.cos(), 2f64.cos(), 1e-15, 100).unwrap();
        assert!((root - std::f64::consts::FRAC_PI_2).abs() < 1e-14);
    }

    #[test]
    fn refuses_an_interval_without_sign_change() {
        let f = |x: f64| Ok::<f64, ()>(x * x + 1.0);
        assert_eq!(
            brent(f, -1.0, 1.0, 2.0, 2.0, 1e-12, 50),
            Err(BrentError::NotBracketed)
        );
    }

    /// A function that is flat on most of the bracket still converges (bisection fallback).
    #[test]
    fn converges_on_a_steep_step() {
        let f = |x: f64| Ok::<f64, ()>((50.0 * (x - 0.3)).tanh());
        let root = brent(f, -1.0, 1.0, f(-1.0).unwrap(), f(1.0).unwrap(), 1e-13, 200).unwrap();
        assert!((root - 0.3).abs() < 1e-12);
    }
}
