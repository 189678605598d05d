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

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_cube_root_of_two() {
        let r: Result<f64, Option<()>> = newton_1d(|s| Ok(s * s * s - 2.0), 1.0, 1e-14, 50);
        assert!((r.unwrap() - 2f64.cbrt()).abs() < 1e-12);
    }

    #[test]
    fn backs_off_from_failing_region() {
        // f fails for s > 3; the first Newton step from 0.1 on ln s overshoots into it.
        let f = |s: f64| if s > 3.0 { Err(()) } else { Ok(s - 2.5) };
        assert!((newton_1d(f, 0.1, 1e-12, 50).unwrap() - 2.5).abs() < 1e-10);
    }
}
