//! A smooth function tabulated on an even grid and interpolated by quintic Hermite segments:
//! on each interval the polynomial matching the value and the first two derivatives at both
//! nodes (e.g. de Boor 1978, *A Practical Guide to Splines*, ch. 2, osculatory interpolation).
//! The interpolant is twice continuously differentiable, and its value, first and second
//! derivatives are those of one function (what a thermodynamic potential needs: quantities
//! derived from it by differentiation stay consistent with each other). The error is at most
//! (h/2)^6 / 6! max |f^(6)| in the value, for node spacing h.

/// A function tabulated as quintic Hermite segments on nodes x_0 + k h, k = 0..n.
#[derive(Debug, Clone)]
pub struct QuinticTable {
    x0: f64,
    inverse_step: f64,
    /// The coefficients c_0..c_5 of each segment in t = (x - x_k) / h.
    segments: Vec<[f64; 6]>,
}

impl QuinticTable {
    /// Tabulates `f` (returning the value, first and second derivative at x) on `intervals`
    /// intervals of [x_min, x_max]. `None` for an empty or inverted range or zero intervals.
    pub fn new(
        x_min: f64,
        x_max: f64,
        intervals: usize,
        f: impl Fn(f64) -> [f64; 3],
    ) -> Option<Self> {
        let ordered = x_max.partial_cmp(&x_min) == Some(std::cmp::Ordering::Greater);
        if !ordered || intervals == 0 {
            return None;
        }
        let step = (x_max - x_min) / intervals as f64;
        let nodes: Vec<[f64; 3]> = (0..=intervals)
            .map(|k| {
                let [v, d, s] = f(x_min + k as f64 * step);
                [v, d * step, s * step * step]
            })
            .collect();
        let segments = nodes.windows(2).map(|w| segment(w[0], w[1])).collect();
        Some(Self {
            x0: x_min,
            inverse_step: 1.0 / step,
            segments,
        })
    }

    /// The interpolant's value, first and second derivative at `x`; `None` outside the range.
    #[inline]
    pub fn at(&self, x: f64) -> Option<[f64; 3]> {
        let u = (x - self.x0) * self.inverse_step;
        if u.is_nan() || u < 0.0 {
            return None;
        }
        // The last node belongs to the last segment.
        let k = (u as usize).min(self.segments.len().checked_sub(1)?);
        let t = u - k as f64;
        if t > 1.0 + 1e-12 {
            return None;
        }
        let [v, d, s] = evaluate(&self.segments[k], t);
        let h = self.inverse_step;
        Some([v, d * h, s * h * h])
    }
}

/// The coefficients c_0..c_5 in t of the quintic on [0, 1] with value, first and second
/// derivative (in t: scaled by the interval and its square) `a` at t = 0 and `b` at t = 1.
pub fn segment(a: [f64; 3], b: [f64; 3]) -> [f64; 6] {
    let ([p0, d0, s0], [p1, d1, s1]) = (a, b);
    let dp = p1 - p0;
    [
        p0,
        d0,
        0.5 * s0,
        10.0 * dp - 6.0 * d0 - 4.0 * d1 - 1.5 * s0 + 0.5 * s1,
        -15.0 * dp + 8.0 * d0 + 7.0 * d1 + 1.5 * s0 - s1,
        6.0 * dp - 3.0 * d0 - 3.0 * d1 - 0.5 * s0 + 0.5 * s1,
    ]
}

/// The value, first and second derivative in t of the segment `c` ([`segment`]) at `t`.
#[inline]
pub fn evaluate(c: &[f64; 6], t: f64) -> [f64; 3] {
    let [c0, c1, c2, c3, c4, c5] = *c;
    [
        c0 + t * (c1 + t * (c2 + t * (c3 + t * (c4 + t * c5)))),
        c1 + t * (2.0 * c2 + t * (3.0 * c3 + t * (4.0 * c4 + t * 5.0 * c5))),
        2.0 * c2 + t * (6.0 * c3 + t * (12.0 * c4 + t * 20.0 * c5)),
    ]
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Quintic polynomials are reproduced exactly (the interpolant is the unique quintic
    /// matching three derivatives at both ends).
    #[test]
    fn quintics_are_exact() {
        let p = |x: f64| {
            [
                1.0 - 2.0 * x + 0.5 * x.powi(3) - 0.1 * x.powi(5),
                -2.0 + 1.5 * x * x - 0.5 * x.powi(4),
                3.0 * x - 2.0 * x.powi(3),
            ]
        };
        let table = QuinticTable::new(-2.0, 3.0, 7, p).unwrap();
        for i in 0..=100 {
            let x = -2.0 + 5.0 * i as f64 / 100.0;
            let [v, d, s] = table.at(x).unwrap();
            let [pv, pd, ps] = p(x);
            assert!((v - pv).abs() < 1e-12 && (d - pd).abs() < 1e-11 && (s - ps).abs() < 1e-10);
        }
        assert!(table.at(-2.001).is_none() && table.at(3.001).is_none());
        assert!(table.at(f64::NAN).is_none());
        assert!(QuinticTable::new(1.0, 1.0, 4, p).is_none());
    }

    /// exp on [0, 1] with 16 intervals: the error bound (h/2)^6 / 6! e = 1.4e-12 for the value.
    #[test]
    fn error_of_a_smooth_function_is_within_the_bound() {
        let table = QuinticTable::new(0.0, 1.0, 16, |x| [x.exp(); 3]).unwrap();
        let bound = (1.0f64 / 32.0).powi(6) / 720.0 * 1f64.exp();
        for i in 0..=1000 {
            let x = i as f64 / 1000.0;
            let [v, d, s] = table.at(x).unwrap();
            assert!((v - x.exp()).abs() <= bound, "{x}");
            // The derivatives' errors: (h/2)^5 / 5! and (h/2)^4 / 4! times e at most (the
            // derivative of the remainder), 6 (h/2)^-1 and 30 (h/2)^-2 times the value's bound.
            let (bd, bs) = (6.0 * 32.0 * bound, 30.0 * 32.0 * 32.0 * bound);
            assert!((d - x.exp()).abs() <= bd, "{x}: {}", d - x.exp());
            assert!((s - x.exp()).abs() <= bs, "{x}: {}", s - x.exp());
        }
    }
}
