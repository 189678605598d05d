//! A cube root for the microphysics' hot paths, cheaper than `f64::cbrt`.
//!
//! `f64::cbrt` is the correctly rounded software routine of Rust's bundled libm (about 150
//! instructions a call). This one takes a first guess from the bit pattern (the exponent divided
//! by 3, the classic trick of Kahan's and BSD's cube roots, good to about 5 bits), two steps of
//! Halley's iteration y <- y (y^3 + 2a) / (2 y^3 + a) (cubic convergence: 5 -> 15 -> 45 bits)
//! and one of Newton's y <- y - (y^3 - a) / (3 y^2) (to full precision). The result is within
//! 2 ulp of the true cube root (checked against `f64::cbrt` in the tests); smooth to rounding,
//! so no kink for the integrator to see.

/// Exponent bias of f64 times 2/3 in the bit pattern, less a tweak that centres the error of the
/// first guess: (bits / 3 + this) has about the cube root's exponent and leading bits. The high
/// word 0x2A9F7893 is the constant of the BSD libm cube root (715094163).
const FIRST_GUESS_OFFSET: u64 = 0x2A9F_7893_0000_0000;

/// 2^54 = (2^18)^3: scales subnormal arguments into the normal range (and huge ones down, so
/// that 2 y^3 + a cannot overflow).
const SCALE: f64 = 18_014_398_509_481_984.0;
/// 2^18, the cube root of SCALE.
const SCALE_CBRT: f64 = 262_144.0;
/// Above this, y^3 in the iteration could overflow: scale down first.
const LARGE: f64 = 1e300;

/// x^(1/3) for every f64 (negative x gives the negative root; 0, infinities and NaN come back
/// unchanged), within 2 ulp.
pub fn cbrt(x: f64) -> f64 {
    if x == 0.0 || !x.is_finite() {
        return x;
    }
    let a = x.abs();
    let (a, unscale) = if a < f64::MIN_POSITIVE {
        (a * SCALE, 1.0 / SCALE_CBRT)
    } else if a > LARGE {
        (a / SCALE, SCALE_CBRT)
    } else {
        (a, 1.0)
    };
    let mut y = f64::from_bits(a.to_bits() / 3 + FIRST_GUESS_OFFSET);
    for _ in 0..2 {
        let y3 = y * y * y;
        y *= (y3 + 2.0 * a) / (2.0 * y3 + a);
    }
    y -= (y * y * y - a) / (3.0 * y * y);
    (y * unscale).copysign(x)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Two ulp: the final Newton step rounds in y^3, in the division and in the subtraction.
    const ULP_TOLERANCE: f64 = 2.0;

    fn ulps(a: f64, b: f64) -> f64 {
        ((a - b) / (b.abs() * f64::EPSILON)).abs()
    }

    #[test]
    fn agrees_with_the_correctly_rounded_root() {
        // Deterministic sweep over 600 decades and every mantissa region (a linear congruential
        // sequence for the mantissa).
        let mut state: u64 = 0x9E37_79B9_7F4A_7C15;
        let mut worst: f64 = 0.0;
        for i in 0..200_000 {
            state = state
                .wrapping_mul(6_364_136_223_846_793_005)
                .wrapping_add(1_442_695_040_888_963_407);
            let mantissa = 1.0 + (state >> 11) as f64 / (1u64 << 53) as f64;
            let exponent = (i % 2046) - 1022;
            let x = mantissa * 2f64.powi(exponent);
            worst = worst.max(ulps(cbrt(x), x.cbrt()));
            worst = worst.max(ulps(cbrt(-x), (-x).cbrt()));
        }
        assert!(worst <= ULP_TOLERANCE, "worst {worst} ulp");
    }

    #[test]
    fn exact_cubes_and_special_values() {
        for k in [1.0f64, 2.0, 3.0, 10.0, 1e5, 0.5, 0.125] {
            assert!(ulps(cbrt(k * k * k), k) <= ULP_TOLERANCE, "{k}");
        }
        assert_eq!(cbrt(0.0).to_bits(), 0.0f64.to_bits());
        assert_eq!(cbrt(-0.0).to_bits(), (-0.0f64).to_bits());
        assert_eq!(cbrt(f64::INFINITY), f64::INFINITY);
        assert_eq!(cbrt(f64::NEG_INFINITY), f64::NEG_INFINITY);
        assert!(cbrt(f64::NAN).is_nan());
        let tiny = 5e-324;
        assert!(ulps(cbrt(tiny), tiny.cbrt()) <= ULP_TOLERANCE);
        assert!(ulps(cbrt(1e-310), 1e-310f64.cbrt()) <= ULP_TOLERANCE);
        assert!(ulps(cbrt(f64::MAX), f64::MAX.cbrt()) <= ULP_TOLERANCE);
    }
}
