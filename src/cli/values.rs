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

/// A whole number for a count whose range `lo..=hi` the library checks (so that the command
/// line and the library give one message): a negative or non-whole number, or one beyond what
/// the type holds, is refused here, naming the range.
pub fn count_in(text: &str, lo: usize, hi: usize) -> Result<usize, String> {
    match text.trim().parse::<i128>() {
        Ok(v) if v < 0 => Err(format!(
            "{text} is negative; give a whole number from {lo} to {hi}"
        )),
        Ok(v) => usize::try_from(v)
            .map_err(|_| format!("{text} is out of range; give a whole number from {lo} to {hi}")),
        Err(_) if text.trim().chars().all(|c| c.is_ascii_digit()) && !text.trim().is_empty() => {
            Err(format!(
                "{text} is out of range; give a whole number from {lo} to {hi}"
            ))
        }
        Err(_) => Err(format!(
            "'{text}' is not a whole number; give one from {lo} to {hi}"
        )),
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

/// Check a number of worker threads against [`MAX_THREADS`] (key `threads`).
pub fn check_threads(n: usize) -> starpoise::Result<usize> {
    if n <= MAX_THREADS {
        Ok(n)
    } else {
        Err(starpoise::Error::invalid(
            "threads",
            n,
            &format!("the number of worker threads must be in [0, {MAX_THREADS}] (0: one per core), e.g. 2"),
        ))
    }
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
            if count_in(&text, 10, 100_000).is_ok() {
                proptest::prop_assert!(!text.trim().starts_with('-'));
            }
        }
    }

    #[test]
    fn counts_refuse_negatives_and_leave_ranges_to_the_library() {
        assert_eq!(count_in("400", 10, 100_000), Ok(400));
        assert_eq!(count_in("5", 10, 100_000), Ok(5));
        let huge = "1".repeat(60);
        for bad in ["-5", "4.5", "x", "", "18446744073709551616", huge.as_str()] {
            let e = count_in(bad, 10, 100_000).unwrap_err();
            assert!(e.contains(bad) && e.contains("10 to 100000"), "{e}");
        }
        assert!(check_threads(256).is_ok() && check_threads(257).is_err());
    }
}
