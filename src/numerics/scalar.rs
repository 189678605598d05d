//! One-dimensional root finding.

/// Solve f(s) = 0 by Newton's method with a finite-difference derivative and step halving,
/// starting at `s0`. `f` may fail (return `Err`) for some s; a failed or non-improving trial is
/// halved back toward the last good point. Returns the root with |f| < `tolerance`, or the last
/// error / a description of why it stopped.
pub fn newton_1d<E, F>(
    mut f: F,
    s0: f64,
    tolerance: f64,
    max_iterations: usize,
) -> Result<f64, Option<E>>
where
    F: FnMut(f64) -> Result<f64, E>,
{
    let mut s = s0;
    let mut fs = f(s).map_err(Some)?;
    for _ in 0..max_iterations {
        if fs.abs() < tolerance {
            return Ok(s);
        }
        let h = 1e-7 * (1.0 + s.abs());
        let slope = (f(s + h).map_err(Some)? - fs) / h;
        if !(slope.is_finite()) || slope == 0.0 {
            return Err(None);
        }
        let mut step = -fs / slope;
        let mut accepted = false;
        for _ in 0..30 {
            if let Ok(ft) = f(s + step) {
                if ft.is_finite() && ft.abs() < fs.abs() {
                    s += step;
                    fs = ft;
                    accepted = true;
                    break;
                }
            }
            step *= 0.5;
        }
        if !accepted {
            return Err(None);
        }
    }
    if fs.abs() < tolerance {
        Ok(s)
    } else {
        Err(None)
    }
}

/// A root of g inside a bracket, by the Illinois method (regula falsi whose retained end has
/// its value halved when the same end is kept twice in a row; Dowell & Jarratt 1971, BIT 11,
/// 168), with a bisection whenever two iterations have not halved the bracket.
///
/// `g(a) = ga` and `g(b) = gb` must have opposite signs (or `gb` = 0). Returns the end of the
/// final bracket on `b`'s side: a point where g has the sign of `gb` (or is 0), within
/// `tolerance` of a root. `a` may be above or below `b`. Errors of `g` are passed through.
pub fn illinois<E, G>(mut g: G, a: f64, ga: f64, b: f64, gb: f64, tolerance: f64) -> Result<f64, E>
where
    G: FnMut(f64) -> Result<f64, E>,
{
    // Far more than needed: the bracket at least halves every three evaluations.
    const MAX_ITERATIONS: usize = 400;
    let (mut a, mut ga, mut b, mut gb) = (a, ga, b, gb);
    if gb == 0.0 || ga == 0.0 {
        return Ok(b);
    }
    // +1: b was replaced last, -1: a was replaced last.
    let mut last_side = 0;
    let mut width_two_ago = f64::INFINITY;
    let mut width_one_ago = (b - a).abs();
    for _ in 0..MAX_ITERATIONS {
        let width = (b - a).abs();
        if width <= tolerance {
            break;
        }
        let mut c = b - gb * (b - a) / (gb - ga);
        let inside = (c - a) * (c - b) < 0.0;
        if !inside || width > 0.5 * width_two_ago {
            c = 0.5 * (a + b);
            last_side = 0;
        }
        width_two_ago = width_one_ago;
        width_one_ago = width;
        let gc = g(c)?;
        if gc == 0.0 {
            return Ok(c);
        }
        if (gc < 0.0) == (gb < 0.0) {
            b = c;
            gb = gc;
            if last_side == 1 {
                ga *= 0.5;
            }
            last_side = 1;
        } else {
            a = c;
            ga = gc;
            if last_side == -1 {
                gb *= 0.5;
            }
            last_side = -1;
        }
    }
    Ok(b)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_cube_root_of_two() {
        let r: Result<f64, Option<()>> = newton_1d(|s| Ok(s * s * s - 2.0), 1.0, 1e-14, 50);
        assert!((r.unwrap() - 2f64.cbrt()).abs() < 1e-12);
    }

    /// The Illinois method finds cos x = 0 at pi/2 (to 1e-14: a few ulp of pi/2) from both
    /// orientations of the bracket, returning the end on b's side.
    #[test]
    fn illinois_finds_pi_over_two() {
        const ROOT_TOLERANCE: f64 = 1e-14;
        let g = |x: f64| Ok::<f64, ()>(x.cos());
        let r = illinois(g, 0.0, 1.0, 3.0, 3f64.cos(), ROOT_TOLERANCE).unwrap();
        assert!((r - std::f64::consts::FRAC_PI_2).abs() < ROOT_TOLERANCE);
        assert!(r.cos() <= 0.0);
        let r = illinois(g, 3.0, 3f64.cos(), 0.0, 1.0, ROOT_TOLERANCE).unwrap();
        assert!((r - std::f64::consts::FRAC_PI_2).abs() < ROOT_TOLERANCE);
        assert!(r.cos() >= 0.0);
        // A function flat on one side (regula falsi alone would crawl): x^9 - 1e-9 on [0, 2].
        let mut calls = 0;
        let r = illinois(
            |x: f64| {
                calls += 1;
                Ok::<f64, ()>(x.powi(9) - 1e-9)
            },
            0.0,
            -1e-9,
            2.0,
            512.0,
            1e-13,
        )
        .unwrap();
        assert!((r - 0.1).abs() < 1e-13, "{r}");
        assert!(calls < 80, "{calls} calls");
    }

    #[test]
    fn backs_off_from_failing_region() {
        // f fails for s > 3; the first Newton step from 0.1 on ln s overshoots into it.
        let f = |s: f64| if s > 3.0 { Err(()) } else { Ok(s - 2.5) };
        assert!((newton_1d(f, 0.1, 1e-12, 50).unwrap() - 2.5).abs() < 1e-10);
    }
}
