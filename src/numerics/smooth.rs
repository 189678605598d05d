//! Smooth switches between two regimes, for laws that must stay differentiable in (rho, T):
//! a kink in a right-hand side is invisible to an embedded Runge–Kutta error estimate and costs
//! tolerance-dependent errors in the integrated solution.

use crate::numerics::exponential::FastExp;

/// The weight h of the second regime and dh / dln(a/b) for a switch on the ratio a/b > 0: h = 0
/// for a/b <= `r0`, h = 1 for a/b >= 1/`r0` (0 < r0 < 1), and between them the
/// twice-differentiable h = 6 t^5 - 15 t^4 + 10 t^3 of t = ln(a / (r0 b)) / ln(1 / r0^2).
pub fn switch_weight(a: f64, b: f64, r0: f64) -> (f64, f64) {
    let ratio = a / b;
    if let Some(h) = outside_blend(ratio, r0) {
        return (h, 0.0);
    }
    let lo = r0.ln();
    let width = -2.0 * lo;
    let t = ((ratio.ln() - lo) / width).clamp(0.0, 1.0);
    let h = t * t * t * (10.0 + t * (6.0 * t - 15.0));
    let dh_dt = 30.0 * t * t * (1.0 - t) * (1.0 - t);
    (h, dh_dt / width)
}

/// An infinitely differentiable switch for laws whose thermodynamic derivatives use the
/// switch's curvature: (h, dh / dln(a/b), d^2h / dln(a/b)^2) with h = p(t) / (p(t) + p(1 - t)),
/// p(t) = exp(-1/t), of the same t as [`switch_weight`]. Every derivative vanishes at both ends,
/// so a quantity built from h'' (a heat capacity) is smooth across them.
/// With q = 1/t^2 + 1/(1-t)^2: h' = h (1 - h) q and h'' = h (1 - h) [q^2 (1 - 2h) + q'],
/// q' = 2/(1-t)^3 - 2/t^3 (derivatives in t).
pub fn switch_weight_curved(a: f64, b: f64, r0: f64) -> (f64, f64, f64) {
    let ratio = a / b;
    if let Some(h) = outside_blend(ratio, r0) {
        return (h, 0.0, 0.0);
    }
    switch_weight_curved_ln(ratio.ln(), r0)
}

/// The weight of either switch where the ratio a/b lies outside the blend: exactly 0 at or
/// below `r0`, 1 at or above 1/`r0` (every derivative 0 there), found without a logarithm;
/// `None` inside the blend, and for a ratio that is not positive, which goes on to the
/// logarithm and gives NaN as it always did.
#[inline]
fn outside_blend(ratio: f64, r0: f64) -> Option<f64> {
    if ratio > 0.0 && ratio <= r0 {
        Some(0.0)
    } else if ratio >= 1.0 / r0 {
        Some(1.0)
    } else {
        None
    }
}

/// [`switch_weight_curved`] with ln(a/b) given (a caller that has the logarithm saves one).
/// Inlined, so that ln r0 of a constant r0 is computed at compile time.
#[inline]
pub fn switch_weight_curved_ln(ln_ratio: f64, r0: f64) -> (f64, f64, f64) {
    let lo = r0.ln();
    let width = -2.0 * lo;
    let t = (ln_ratio - lo) / width;
    if t <= 0.0 {
        return (0.0, 0.0, 0.0);
    }
    if t >= 1.0 {
        return (1.0, 0.0, 0.0);
    }
    let u = 1.0 - t;
    // h = 1 / (1 + exp(1/t - 1/u)), stable for any t in (0, 1).
    let h = 1.0 / (1.0 + (1.0 / t - 1.0 / u).fast_exp());
    let hh = h * (1.0 - h);
    let q = 1.0 / (t * t) + 1.0 / (u * u);
    let dq = 2.0 / (u * u * u) - 2.0 / (t * t * t);
    let dh_dt = hh * q;
    let d2h_dt2 = hh * (q * q * (1.0 - 2.0 * h) + dq);
    (h, dh_dt / width, d2h_dt2 / (width * width))
}

/// A twice-differentiable max(a, b) of positive numbers: exactly the larger one unless they are
/// within a factor 1/`r0` of each other, where it blends b (1 - h) + a h with
/// [`switch_weight`]`(a, b, r0)`. Never below the true max by more than the blend allows
/// (at a = b it equals both).
pub fn smooth_max(a: f64, b: f64, r0: f64) -> f64 {
    let (h, _) = switch_weight(a, b, r0);
    b * (1.0 - h) + a * h
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn switch_is_exact_outside_and_smooth_inside() {
        assert_eq!(switch_weight(0.5, 1.0, 0.8), (0.0, 0.0));
        assert_eq!(switch_weight(2.0, 1.0, 0.8), (1.0, 0.0));
        assert_eq!(smooth_max(3.0, 1.0, 0.8), 3.0);
        assert_eq!(smooth_max(0.3, 1.0, 0.8), 1.0);
        assert_eq!(switch_weight_curved(0.5, 1.0, 0.8), (0.0, 0.0, 0.0));
        assert_eq!(switch_weight_curved(2.0, 1.0, 0.8), (1.0, 0.0, 0.0));
        assert!((smooth_max(1.0, 1.0, 0.8) - 1.0).abs() < 1e-15);
        // dh / dln(a/b) against a central difference across the blend.
        for i in 1..100 {
            let ln_r = 0.8f64.ln() * (1.0 - 2.0 * i as f64 / 100.0);
            let (_, dh) = switch_weight(ln_r.exp(), 1.0, 0.8);
            let e = 1e-6;
            let fd = (switch_weight((ln_r + e).exp(), 1.0, 0.8).0
                - switch_weight((ln_r - e).exp(), 1.0, 0.8).0)
                / (2.0 * e);
            assert!((fd - dh).abs() < 1e-6, "{ln_r}: {fd} vs {dh}");
            let curved = |r: f64| switch_weight_curved(r.exp(), 1.0, 0.8);
            let (_, dh2, d2h) = curved(ln_r);
            let fd1 = (curved(ln_r + e).0 - curved(ln_r - e).0) / (2.0 * e);
            assert!((fd1 - dh2).abs() < 1e-6, "{ln_r}: {fd1} vs {dh2}");
            let fd2 = (curved(ln_r + e).1 - curved(ln_r - e).1) / (2.0 * e);
            assert!((fd2 - d2h).abs() < 1e-5, "{ln_r}: {fd2} vs {d2h}");
        }
    }
}
