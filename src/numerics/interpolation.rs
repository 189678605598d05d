//! Monotone cubic interpolation of tabulated values (Steffen 1990, A&A 239, 443): a cubic
//! Hermite interpolant whose slopes are limited so that it is monotone on every interval and
//! never overshoots the values of the nodes around it (the opacity tables, the built-in
//! starting guesses).

/// Index i with x[i] <= q <= x[i+1] (q inside the grid), 0 <= i <= n - 2.
pub fn interval(x: &[f64], q: f64) -> usize {
    x.partition_point(|&v| v <= q)
        .saturating_sub(1)
        .min(x.len() - 2)
}

/// Steffen (1990) slope at node k of (x, y): the harmonic-like limited slope inside, the
/// one-sided secant at the ends.
pub fn steffen_slope(x: &[f64], y: &[f64], k: usize) -> f64 {
    let n = x.len();
    let secant = |m: usize| (y[m + 1] - y[m]) / (x[m + 1] - x[m]);
    if k == 0 {
        return secant(0);
    }
    if k == n - 1 {
        return secant(n - 2);
    }
    let (h0, h1) = (x[k] - x[k - 1], x[k + 1] - x[k]);
    let (s0, s1) = (secant(k - 1), secant(k));
    if s0 * s1 <= 0.0 {
        return 0.0;
    }
    let p = (s0 * h1 + s1 * h0) / (h0 + h1);
    s0.signum() * 2.0 * s0.abs().min(s1.abs()).min(0.5 * p.abs())
}

/// Cubic Hermite value on [x[i], x[i+1]] at q with Steffen slopes.
pub fn steffen(x: &[f64], y: &[f64], i: usize, q: f64) -> f64 {
    let h = x[i + 1] - x[i];
    let s = (q - x[i]) / h;
    let (d0, d1) = (steffen_slope(x, y, i), steffen_slope(x, y, i + 1));
    let s2 = s * s;
    let s3 = s2 * s;
    (2.0 * s3 - 3.0 * s2 + 1.0) * y[i]
        + (s3 - 2.0 * s2 + s) * h * d0
        + (-2.0 * s3 + 3.0 * s2) * y[i + 1]
        + (s3 - s2) * h * d1
}
