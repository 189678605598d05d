//! An exponential for the microphysics' hot paths, cheaper than `f64::exp`.
//!
//! `f64::exp` calls the platform's libm through a wrapper that handles errno and special cases
//! (about 45 instructions a call with glibc, a third of them the wrapper). The equation of state,
//! the rates and the structure equations call it some 300 000 times for one ZAMS model. This
//! one is inlined and takes about 25 instructions for |x| < 708, with the textbook reduction
//! (e.g. Tang 1989, ACM TOMS 15, 144; Muller 2016, *Elementary Functions*, ch. 11):
//!
//! exp(x) = 2^(k / 128) exp(r), k = round(128 x / ln 2), r = x - k ln 2 / 128, |r| <= ln 2 / 256,
//!
//! with 2^(k/128) = 2^q 2^(j/128) (k = 128 q + j) from a 128-entry table computed at build time
//! (`build.rs`, `f64::exp2` of exact arguments), and exp(r) - 1 by its Taylor polynomial to
//! r^6 (truncation about 2e-22 relative). The error is about 1 ulp at most: half an ulp from
//! the table entry and half from the final rounding (1.005 ulp by this bound; no argument of
//! 1e8 random ones, nor of the tests' sweeps, was 2 ulp from libm's exp). Arguments outside
//! (-708, 708), where the result would be subnormal, overflow or be special, go to `f64::exp`
//! itself.

// `static EXP2_TABLE: [f64; 128]`, 2^(j/128), tabulated by build.rs.
include!(concat!(env!("OUT_DIR"), "/exp2_table.rs"));

/// 128 / ln 2.
const INVERSE_STEP: f64 = 184.664_965_233_787_3;
/// ln 2 / 128 split in two: the high part has 33 significant bits, so k times it is exact for
/// |k| < 2^20 (|x| < 708 gives |k| < 131 000), and the low part carries the rest.
const STEP_HI: f64 = 0.005_415_212_347_543_274_5;
const STEP_LO: f64 = 5.812_982_117_197_185e-13;
/// 1.5 2^52: added to a number of magnitude below 2^51 it rounds it to an integer held in the
/// low bits of the sum's mantissa.
const SHIFT: f64 = 6_755_399_441_055_744.0;
/// The bit pattern of SHIFT.
const SHIFT_BITS: u64 = 0x4338_0000_0000_0000;
/// Largest |x| handled here: exp(-708) = 3.3e-308 is still normal.
const LIMIT: f64 = 708.0;

/// e^x to about 1 ulp, for every f64 (see the module's documentation).
#[inline]
pub fn exp(x: f64) -> f64 {
    if x.is_nan() || x.abs() >= LIMIT {
        return x.exp();
    }
    let shifted = x * INVERSE_STEP + SHIFT;
    let k = shifted.to_bits().wrapping_sub(SHIFT_BITS) as i64;
    let kd = shifted - SHIFT;
    let r = (x - kd * STEP_HI) - kd * STEP_LO;
    // exp(r) - 1 = r + r^2/2 + ... + r^6/720.
    let p = r + r
        * r
        * (0.5 + r * (1.0 / 6.0 + r * (1.0 / 24.0 + r * (1.0 / 120.0 + r * (1.0 / 720.0)))));
    let j = (k & 127) as usize;
    let q = k >> 7;
    let scale = f64::from_bits(((q + 1023) as u64) << 52);
    let t = EXP2_TABLE[j] * scale;
    t + t * p
}

/// The method form of [`exp`], so that `y.exp()` in a hot path reads `y.fast_exp()`.
pub trait FastExp {
    /// e^self to about 1 ulp ([`exp`]).
    fn fast_exp(self) -> f64;
}

impl FastExp for f64 {
    #[inline]
    fn fast_exp(self) -> f64 {
        exp(self)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Distance in units in the last place.
    fn ulps(a: f64, b: f64) -> u64 {
        (a.to_bits() as i64 - b.to_bits() as i64).unsigned_abs()
    }

    #[test]
    fn the_step_splits_into_ln2_over_128() {
        let exact = std::f64::consts::LN_2 / 128.0;
        assert!(((STEP_HI + STEP_LO) - exact).abs() <= f64::EPSILON * exact);
        // 33 significant bits: the low 20 bits of the mantissa are zero.
        assert_eq!(STEP_HI.to_bits() & ((1 << 20) - 1), 0);
        assert!((INVERSE_STEP - 1.0 / exact).abs() <= 2.0 * f64::EPSILON * INVERSE_STEP);
        assert_eq!(SHIFT.to_bits(), SHIFT_BITS);
    }

    /// The table is what build.rs meant (exp2 of j/128, read back exactly), and its entries
    /// multiply as powers of two do: 2^(j/128) 2^(k/128) = 2^((j+k)/128) within 2 ulp, which
    /// an entry off by more than about an ulp would break.
    #[test]
    fn the_table_holds_the_powers_of_two() {
        for (j, &t) in EXP2_TABLE.iter().enumerate() {
            assert!(ulps(t, (j as f64 / 128.0).exp2()) == 0, "{j}");
        }
        assert_eq!(EXP2_TABLE[0], 1.0);
        for j in 0..128 {
            for k in 0..128 - j {
                let product = EXP2_TABLE[j] * EXP2_TABLE[k];
                assert!(ulps(product, EXP2_TABLE[j + k]) <= 2, "{j} {k}");
            }
            if j > 0 {
                let product = EXP2_TABLE[j] * EXP2_TABLE[128 - j];
                assert!(ulps(product, 2.0) <= 2, "{j}");
            }
        }
    }

    /// Within 1 ulp of the platform's exp over the whole normal range, on a dense sweep and at
    /// the table's seams, and exactly 1 at 0.
    #[test]
    fn within_one_ulp_of_the_platform_exp() {
        let mut worst = 0;
        let mut x = -707.9;
        while x < 707.9 {
            for y in [x, x * (1.0 + 1e-9), -x * 0.999_999_7] {
                worst = worst.max(ulps(exp(y), y.exp()));
            }
            x += 0.013_7;
        }
        for k in -2000..2000 {
            let seam = (k as f64 + 0.5) / INVERSE_STEP;
            for y in [seam, seam * (1.0 + 1e-15), seam * (1.0 - 1e-15)] {
                worst = worst.max(ulps(exp(y), y.exp()));
            }
        }
        for y in [1e-300, -1e-300, 1e-17, -1e-17, 1e-8, -1e-8, 0.5, -0.5] {
            worst = worst.max(ulps(exp(y), y.exp()));
        }
        assert!(worst <= 1, "worst {worst} ulp");
        assert_eq!(exp(0.0), 1.0);
        assert_eq!(exp(-0.0), 1.0);
    }

    /// Outside (-708, 708) and for special values: the platform's exp itself.
    #[test]
    fn special_values_and_the_ends_of_the_range() {
        for y in [
            708.0,
            709.7,
            710.0,
            -708.0,
            -745.0,
            -746.0,
            f64::INFINITY,
            f64::NEG_INFINITY,
        ] {
            assert_eq!(exp(y).to_bits(), y.exp().to_bits(), "{y}");
        }
        assert!(exp(f64::NAN).is_nan());
        assert!(ulps(exp(707.99), 707.99f64.exp()) <= 1);
        assert!(ulps(exp(-707.99), (-707.99f64).exp()) <= 1);
    }
}
