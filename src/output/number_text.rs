//! The text of a number in a CSV or ECSV cell, written without allocating.
//!
//! A cell holds the shortest decimal text that reads back to the same double, plain for
//! 1e-5 <= |v| < 1e16 (`0.000010119107603725222`, `13306703.600443467`, `3.0`) and in exponent
//! form outside (`1.5080116840627478e17`, `4.3e-14`, `1e30`): the text that `ryu` writes (Adams
//! 2018), which the files have always held.
//!
//! The digits come from `zmij` (Schubfach with yy's digit writing), which gives the same shortest
//! correctly rounded digits at about half of ryu's cost and the same layout except for a `+`
//! in positive exponents (`1.5e+17`, the JSON text that serde_json writes); [`NumberText`]
//! drops that `+`. The tests compare it with ryu on every kind of double.

/// A reusable buffer that writes numbers as CSV and ECSV cells hold them (see the module
/// documentation).
pub struct NumberText {
    digits: zmij::Buffer,
    /// The text of a number with a positive exponent, without its `+`.
    unsigned_exponent: [u8; 32],
}

impl Default for NumberText {
    fn default() -> Self {
        Self::new()
    }
}

impl NumberText {
    /// An empty buffer.
    pub fn new() -> Self {
        NumberText {
            digits: zmij::Buffer::new(),
            unsigned_exponent: [0; 32],
        }
    }

    /// The shortest decimal text that reads back to `v`, which must be finite (a value that is
    /// not gives some number's text: callers write those as empty cells).
    pub fn format(&mut self, v: f64) -> &[u8] {
        let text = self.digits.format_finite(v).as_bytes();
        // A `+` stands only in a positive exponent, and those are `e+16` to `e+308` (smaller
        // ones are written plainly): third or fourth byte from the end.
        let n = text.len();
        let plus = if n >= 4 && text[n - 3] == b'+' {
            n - 3
        } else if n >= 5 && text[n - 4] == b'+' {
            n - 4
        } else {
            return text;
        };
        let out = &mut self.unsigned_exponent;
        out[..plus].copy_from_slice(&text[..plus]);
        out[plus..n - 1].copy_from_slice(&text[plus + 1..]);
        &out[..n - 1]
    }
}

#[cfg(test)]
mod tests {
    use super::NumberText;

    /// The text ryu writes, which the cells have always held.
    fn ryu_text(v: f64) -> String {
        ryu::Buffer::new().format_finite(v).to_string()
    }

    fn assert_same(text: &mut NumberText, v: f64) {
        assert_eq!(
            std::str::from_utf8(text.format(v)).unwrap(),
            ryu_text(v),
            "{v:e} ({:#x})",
            v.to_bits()
        );
    }

    #[test]
    fn layout_of_each_range() {
        let mut text = NumberText::new();
        for (v, want) in [
            (0.0, "0.0"),
            (-0.0, "-0.0"),
            (3.0, "3.0"),
            (0.7, "0.7"),
            (1e-5, "0.00001"),
            (9.999e-6, "9.999e-6"),
            (1e15, "1000000000000000.0"),
            (1e16, "1e16"),
            (-8870250726298384.0, "-8870250726298384.0"),
            (1.5080116840627478e17, "1.5080116840627478e17"),
            (4.307129710230769e-14, "4.307129710230769e-14"),
            (1.9884098706980498e33, "1.9884098706980498e33"),
            (f64::MAX, "1.7976931348623157e308"),
            (5e-324, "5e-324"),
        ] {
            assert_eq!(std::str::from_utf8(text.format(v)).unwrap(), want);
            assert_eq!(ryu_text(v), want);
        }
    }

    /// Around every power of two, ten and five (the edges of the rounding intervals, where the
    /// interval is lopsided, and of the plain range), a few ulps either side, both signs.
    #[test]
    fn same_text_as_ryu_at_the_edges() {
        let mut text = NumberText::new();
        for e in -1100..1100 {
            for base in [10f64.powi(e / 3), 2f64.powi(e), 5f64.powi(e / 2)] {
                if !base.is_finite() || base == 0.0 {
                    continue;
                }
                for d in 0..4 {
                    for v in [
                        f64::from_bits(base.to_bits() + d),
                        f64::from_bits(base.to_bits() - d),
                    ] {
                        if v.is_finite() {
                            assert_same(&mut text, v);
                            assert_same(&mut text, -v);
                        }
                    }
                }
            }
        }
    }

    /// Random bit patterns (normal and subnormal), short decimals at every exponent and
    /// integers: the digits of both algorithms are the shortest correctly rounded ones, so they
    /// must agree everywhere.
    #[test]
    fn same_text_as_ryu_on_random_doubles() {
        let mut text = NumberText::new();
        // xorshift64: a fixed, repeatable sequence.
        let mut bits: u64 = 0x9E37_79B9_7F4A_7C15;
        for i in 0..400_000_u64 {
            bits ^= bits << 13;
            bits ^= bits >> 7;
            bits ^= bits << 17;
            let short = ((bits >> 11) % 100_000) as f64;
            for v in [
                f64::from_bits(bits),
                f64::from_bits(bits & 0x000F_FFFF_FFFF_FFFF),
                short * 10f64.powi((i % 700) as i32 - 350),
                short / 1000.0,
                i as f64,
            ] {
                if v.is_finite() {
                    assert_same(&mut text, v);
                }
            }
        }
    }
}
