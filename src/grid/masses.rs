//! Parsing lists of values: `1,2,5` or `FROM:TO:COUNT[:log|lin]`.

use crate::error::{Error, Result};

/// The most values one list may hold (a list or a range's COUNT), checked before anything is
/// allocated.
pub const MAX_LIST_VALUES: usize = 100_000;

/// Parse a list for flag `flag`: comma-separated numbers (`0.5,1,2`) or a range
/// `FROM:TO:COUNT[:log|lin]` (log spacing by default, both ends included exactly: the first
/// value is FROM and the last TO, to the bit). Every value must be finite; duplicates are
/// refused; at most [`MAX_LIST_VALUES`] values.
pub fn parse_value_list(flag: &str, text: &str) -> Result<Vec<f64>> {
    let example = "e.g. 0.5,1,2 or 0.1:100:40:log";
    let bad = |why: &str| Error::invalid(flag, text, &format!("{why}; {example}"));
    let text = text.trim();
    if text.is_empty() {
        return Err(bad("the list is empty"));
    }
    let values = if text.contains(':') {
        let parts: Vec<&str> = text.split(':').collect();
        if !(3..=4).contains(&parts.len()) {
            return Err(bad(
                "a range is FROM:TO:COUNT with an optional :log or :lin",
            ));
        }
        let from: f64 = parts[0]
            .trim()
            .parse()
            .map_err(|_| bad("FROM is not a number"))?;
        let to: f64 = parts[1]
            .trim()
            .parse()
            .map_err(|_| bad("TO is not a number"))?;
        let count: usize = parts[2].trim().parse().map_err(|_| {
            bad(&format!(
                "COUNT must be a whole number from 1 to {MAX_LIST_VALUES}"
            ))
        })?;
        let log = match parts.get(3).map(|s| s.trim()) {
            None | Some("log") => true,
            Some("lin") => false,
            Some(_) => return Err(bad("the spacing must be log or lin")),
        };
        if count == 0 || count > MAX_LIST_VALUES {
            return Err(bad(&format!(
                "COUNT must be a whole number from 1 to {MAX_LIST_VALUES}"
            )));
        }
        if !(from.is_finite() && to.is_finite()) || from > to {
            return Err(bad("FROM must not exceed TO"));
        }
        if log && from <= 0.0 {
            return Err(bad("a log range needs FROM > 0"));
        }
        if count == 1 {
            if from != to {
                return Err(bad("COUNT = 1 needs FROM = TO"));
            }
            vec![from]
        } else {
            // The ends are FROM and TO themselves, not exp(ln(FROM)) (which may differ in the
            // last bit).
            (0..count)
                .map(|i| {
                    let f = i as f64 / (count - 1) as f64;
                    if i == 0 {
                        from
                    } else if i == count - 1 {
                        to
                    } else if log {
                        (from.ln() + f * (to.ln() - from.ln())).exp()
                    } else {
                        from + f * (to - from)
                    }
                })
                .collect()
        }
    } else {
        let count = text.split(',').count();
        if count > MAX_LIST_VALUES {
            return Err(bad(&format!(
                "at most {MAX_LIST_VALUES} values, not {count}"
            )));
        }
        text.split(',')
            .map(|s| {
                s.trim()
                    .parse::<f64>()
                    .map_err(|_| bad(&format!("'{s}' is not a number")))
            })
            .collect::<Result<Vec<f64>>>()?
    };
    if values.iter().any(|v| !v.is_finite()) {
        return Err(bad("every value must be a finite number"));
    }
    let mut sorted = values.clone();
    sorted.sort_by(f64::total_cmp);
    if sorted.windows(2).any(|w| w[0] == w[1]) {
        return Err(bad("a value appears twice"));
    }
    Ok(values)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn parses_lists_and_ranges() {
        assert_eq!(
            parse_value_list("--masses", "1, 2,5").unwrap(),
            vec![1.0, 2.0, 5.0]
        );
        let r = parse_value_list("--masses", "0.1:100:4").unwrap();
        assert_eq!(r.len(), 4);
        assert!(
            (r[0] - 0.1).abs() < 1e-15
                && (r[3] - 100.0).abs() < 1e-12
                && (r[1] - 1.0).abs() < 1e-12
        );
        assert_eq!(
            parse_value_list("--z", "0:0.04:3:lin").unwrap(),
            vec![0.0, 0.02, 0.04]
        );
    }

    /// Both ends of a range are the numbers given, to the bit (0.08:120:60:log once gave
    /// 0.07999999999999999 and 119.99999999999997).
    #[test]
    fn ranges_hit_their_ends_exactly() {
        for (text, from, to) in [
            ("0.08:120:60:log", 0.08, 120.0),
            ("0.1:100:7", 0.1, 100.0),
            ("0.0005:0.04:25:log", 0.0005, 0.04),
            ("0.3:0.9:7:lin", 0.3, 0.9),
        ] {
            let v = parse_value_list("--masses", text).unwrap();
            assert_eq!(v.first().copied(), Some(from), "{text}");
            assert_eq!(v.last().copied(), Some(to), "{text}");
        }
    }

    #[test]
    fn refuses_huge_counts_before_allocating() {
        for text in [
            "1:2:18446744073709551615",
            "1:2:1000000000000",
            "1:2:100001",
        ] {
            let e = parse_value_list("--masses", text).unwrap_err();
            assert!(e.to_string().contains("100000"), "{e}");
        }
        assert_eq!(
            parse_value_list("--masses", "1:2:100000").unwrap().len(),
            100_000
        );
    }

    #[test]
    fn refuses_bad_lists() {
        for bad in [
            "",
            "1,,2",
            "5:1:3",
            "1:2:0",
            "0:1:3:log",
            "1:2:3:cubic",
            "1,1",
            "a",
            "1:2",
            "1:2:1",
        ] {
            assert!(parse_value_list("--masses", bad).is_err(), "{bad}");
        }
    }
}
