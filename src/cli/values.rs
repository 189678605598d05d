//! Parsers of flag values: numbers are checked at the door (finite, decimal), and the ranges
//! of the library are checked after parsing, so that a negative number reaches the range check
//! and its message instead of being taken for a flag (`--density -5`, `--tolerance -1e-10`).

/// A finite decimal number (`1.5`, `-2e-3`); `nan` and `inf` are refused.
pub fn number(text: &str) -> Result<f64, String> {
    match text.trim().parse::<f64>() {
        Ok(v) if v.is_finite() => Ok(v),
        Ok(_) => Err(format!(
            "'{text}' is not a finite number; give a decimal number such as 1.5 or 2e-3"
        )),
        Err(_) => Err(format!(
            "'{text}' is not a number; give a decimal number such as 1.5 or 2e-3"
        )),
    }
}

/// A whole number in `lo..=hi` (the message names the range).
pub fn count_in(text: &str, lo: usize, hi: usize) -> Result<usize, String> {
    let allowed = format!("give a whole number from {lo} to {hi}");
    match text.trim().parse::<i128>() {
        Ok(v) if (lo as i128..=hi as i128).contains(&v) => Ok(v as usize),
        Ok(_) => Err(format!("{text} is out of range; {allowed}")),
        Err(_) => Err(format!("'{text}' is not a whole number; {allowed}")),
    }
}

/// Profile rows of `zams --points`.
pub fn profile_points(text: &str) -> Result<usize, String> {
    let (lo, hi) = starpoise::structure::profile::PROFILE_POINTS_RANGE;
    count_in(text, lo, hi)
}

/// Newton iterations of `--max-iterations`.
pub fn max_iterations(text: &str) -> Result<usize, String> {
    let (lo, hi) = starpoise::structure::MAX_ITERATIONS_RANGE;
    count_in(text, lo, hi)
}

/// The most worker threads `--threads` takes.
pub const MAX_THREADS: usize = 256;

/// Worker threads of `--threads` (0: one per core).
pub fn threads(text: &str) -> Result<usize, String> {
    count_in(text, 0, MAX_THREADS)
}

/// Profile points of `polytrope --points`.
pub fn polytrope_points(text: &str) -> Result<usize, String> {
    count_in(
        text,
        starpoise::polytrope::solver::MIN_POINTS,
        starpoise::polytrope::solver::MAX_POINTS,
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_are_finite_decimals() {
        assert_eq!(number("-1e-10"), Ok(-1e-10));
        assert_eq!(number(" 2 "), Ok(2.0));
        for bad in ["nan", "inf", "-inf", "1,5", "", "0x10", "1e400"] {
            assert!(number(bad).is_err(), "{bad}");
        }
    }

    proptest::proptest! {
        #![proptest_config(proptest::prelude::ProptestConfig::with_cases(2000))]
        /// Arbitrary text never panics; what is accepted is finite, or in range.
        #[test]
        fn arbitrary_text_is_parsed_or_refused(text in "\\PC{0,30}") {
            if let Ok(v) = number(&text) {
                proptest::prop_assert!(v.is_finite());
            }
            if let Ok(n) = count_in(&text, 10, 100_000) {
                proptest::prop_assert!((10..=100_000).contains(&n));
            }
        }
    }

    #[test]
    fn counts_name_their_range() {
        assert_eq!(count_in("400", 10, 100_000), Ok(400));
        for bad in ["-5", "9", "100001", "18446744073709551616", "4.5", "x"] {
            let e = count_in(bad, 10, 100_000).unwrap_err();
            assert!(e.contains(bad) && e.contains("10 to 100000"), "{e}");
        }
    }
}
