//! Mass labels beside the points of an HR diagram: how a mass is written and which points of a
//! crowded series get one.

/// At most this many points of one series carry a mass label.
pub const MAX_MASS_LABELS: usize = 12;

/// A mass in M_sun as a short label: three significant figures, trailing zeros dropped, no
/// exponent ("0.08", "0.1", "1", "1.5", "12.6", "120"). Masses of 100 M_sun or more are
/// rounded to whole numbers.
pub fn format_mass(mass_msun: f64) -> String {
    if !mass_msun.is_finite() || mass_msun <= 0.0 {
        return format!("{mass_msun}");
    }
    if mass_msun >= 100.0 {
        return format!("{mass_msun:.0}");
    }
    let decimals = (2.0 - mass_msun.log10().floor()).max(0.0) as usize;
    let text = format!("{mass_msun:.decimals$}");
    if text.contains('.') {
        text.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        text
    }
}

/// Relative tolerance for "equals a round number": masses come from grids built by
/// multiplication, so allow a few parts in 1e6 of rounding (common practice, no source).
const ROUND_TOLERANCE: f64 = 1e-6;

fn is_near(value: f64, target: f64) -> bool {
    (value - target).abs() <= ROUND_TOLERANCE * target
}

/// How round a mass is, smaller is rounder: 1×10^k first, then 2 and 5×10^k, then other
/// one-digit mantissas, then one-decimal mantissas (1.5, 2.5), then the rest.
pub(crate) fn roundness(mass_msun: f64) -> u8 {
    let mantissa = mass_msun / 10f64.powf(mass_msun.log10().floor());
    let near = |x: f64| is_near(mantissa, x);
    if near(1.0) || near(10.0) {
        0
    } else if near(2.0) || near(5.0) {
        2
    } else if (2..10).any(|d| near(d as f64)) {
        4
    } else if (10..100).any(|d| near(d as f64 / 10.0)) {
        6
    } else {
        8
    }
}

/// Below this many labels, a crowded series also labels masses that are not round.
pub(crate) const MIN_LABELS: usize = 3;

/// Indices (ascending) of the points of one series that get a mass label.
///
/// Every point is labelled when there are at most `max_labels`. Otherwise points are taken in
/// order of roundness (1, 10, 100 before 2, 5, 20, 50; the two ends of the series just after
/// those; then 3, 4, 6, ... and 1.5, 2.5, ...), skipping any closer than 1/(2 `max_labels`)
/// of the series' span in log10 mass to one already taken, until `max_labels` are chosen.
/// Masses that are not round (such as 2.89 from a logarithmic grid) are taken only while
/// fewer than three labels were found. Non-finite or non-positive masses are never labelled.
pub fn select_mass_labels(masses_msun: &[f64], max_labels: usize) -> Vec<usize> {
    let valid: Vec<usize> = (0..masses_msun.len())
        .filter(|&i| masses_msun[i].is_finite() && masses_msun[i] > 0.0)
        .collect();
    if valid.len() <= max_labels {
        return valid;
    }
    let logs: Vec<f64> = masses_msun.iter().map(|m| m.log10()).collect();
    let (lo, hi) = valid
        .iter()
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), &i| {
            (lo.min(logs[i]), hi.max(logs[i]))
        });
    let min_separation = (hi - lo) / (2.0 * max_labels as f64);
    let mut candidates: Vec<(u8, usize)> = valid
        .iter()
        .map(|&i| {
            let mut level = roundness(masses_msun[i]);
            if logs[i] == lo || logs[i] == hi {
                level = level.min(3);
            }
            (level, i)
        })
        .collect();
    candidates.sort_unstable();
    let mut chosen: Vec<usize> = Vec::with_capacity(max_labels);
    for (level, i) in candidates {
        if chosen.len() == max_labels || (level > 6 && chosen.len() >= MIN_LABELS) {
            break;
        }
        if chosen
            .iter()
            .all(|&j| (logs[i] - logs[j]).abs() >= min_separation && logs[i] != logs[j])
        {
            chosen.push(i);
        }
    }
    chosen.sort_unstable();
    chosen
}

/// Largest mass ratio between two neighbouring models across which a power of ten is marked on
/// the line between them: with at least about three models per decade the straight line
/// between neighbours is a fair reading of the sequence there.
pub const MAX_TICK_RATIO: f64 = 2.0;

/// A power-of-ten mass that no model has, between two neighbouring models.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct MassTick {
    /// The mass, M_sun (0.1, 1, 10, 100, ...).
    pub mass_msun: f64,
    /// Index of the model just below it (the one just above is the next).
    pub below: usize,
    /// How far from the model below to the one above it lies, in log M (0..1).
    pub fraction: f64,
}

/// The powers of ten strictly inside the range of `masses_msun` (ascending, finite, positive)
/// that no model has (to `ROUND_TOLERANCE`) and whose neighbouring models are at most
/// [`MAX_TICK_RATIO`] apart in mass, each with where it lies between them in log M.
pub fn decade_ticks(masses_msun: &[f64]) -> Vec<MassTick> {
    let (Some(&lo), Some(&hi)) = (masses_msun.first(), masses_msun.last()) else {
        return Vec::new();
    };
    if !(lo > 0.0 && hi.is_finite()) {
        return Vec::new();
    }
    let first = lo.log10().floor() as i32;
    let last = hi.log10().ceil() as i32;
    (first..=last)
        .map(|k| 10f64.powi(k))
        .filter(|&d| d > lo && d < hi && !masses_msun.iter().any(|&m| is_near(m, d)))
        .filter_map(|d| {
            let below = masses_msun.windows(2).position(|w| w[0] < d && d < w[1])?;
            let (m0, m1) = (masses_msun[below], masses_msun[below + 1]);
            (m1 / m0 <= MAX_TICK_RATIO).then(|| MassTick {
                mass_msun: d,
                below,
                fraction: (d / m0).log10() / (m1 / m0).log10(),
            })
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn masses_print_short() {
        assert_eq!(format_mass(1.0), "1");
        assert_eq!(format_mass(10.0), "10");
        assert_eq!(format_mass(0.1), "0.1");
        assert_eq!(format_mass(0.08), "0.08");
        assert_eq!(format_mass(1.5), "1.5");
        assert_eq!(format_mass(12.589), "12.6");
        assert_eq!(format_mass(120.0), "120");
        assert_eq!(format_mass(100.0), "100");
    }

    #[test]
    fn decades_between_close_models_are_ticked() {
        // 60 masses log-spaced from 0.08 to 150: none is a power of ten, neighbours are 13.6 %
        // apart, so 0.1, 1, 10 and 100 are ticked.
        let masses: Vec<f64> = (0..60)
            .map(|i| 0.08 * (150.0_f64 / 0.08).powf(i as f64 / 59.0))
            .collect();
        let ticks = decade_ticks(&masses);
        let decades: Vec<f64> = ticks.iter().map(|t| t.mass_msun).collect();
        assert_eq!(decades, [0.1, 1.0, 10.0, 100.0]);
        for t in &ticks {
            let (m0, m1) = (masses[t.below], masses[t.below + 1]);
            assert!(m0 < t.mass_msun && t.mass_msun < m1);
            // log M interpolation puts the decade back; tolerance for rounding only.
            let back = m0 * (m1 / m0).powf(t.fraction);
            assert!((back / t.mass_msun - 1.0).abs() < 1e-12, "{t:?}");
        }
        // A model at the decade needs no tick; models far apart get none.
        assert!(decade_ticks(&[0.5, 1.0, 1.5]).is_empty());
        assert!(decade_ticks(&[0.5, 2.5, 5.0]).is_empty());
        assert_eq!(decade_ticks(&[0.9, 1.2]).len(), 1);
    }

    #[test]
    fn few_points_all_labelled() {
        assert_eq!(select_mass_labels(&[0.5, 1.0, 2.0], 12), vec![0, 1, 2]);
    }

    #[test]
    fn crowded_series_keeps_round_masses() {
        // 40 masses log-spaced from 0.1 to 100 (a typical refined grid), plus exact round ones.
        let mut masses: Vec<f64> = (0..40)
            .map(|i| 10f64.powf(-1.0 + 3.0 * i as f64 / 39.0))
            .collect();
        masses.extend([1.0, 2.0, 5.0, 10.0, 20.0, 50.0]);
        masses.sort_by(f64::total_cmp);
        let chosen = select_mass_labels(&masses, MAX_MASS_LABELS);
        assert!(chosen.len() <= MAX_MASS_LABELS);
        assert!(chosen.len() >= 8, "too few labels: {chosen:?}");
        let labels: Vec<String> = chosen.iter().map(|&i| format_mass(masses[i])).collect();
        for round in ["0.1", "1", "2", "5", "10", "20", "50", "100"] {
            assert!(
                labels.iter().any(|l| l == round),
                "{round} missing: {labels:?}"
            );
        }
        // Nothing but round masses: the grid's 2.03 or 0.588 would only clutter.
        assert_eq!(labels.len(), 8, "{labels:?}");
    }

    #[test]
    fn grid_without_round_masses_still_gets_a_few_labels() {
        let masses = [
            0.137, 0.2884, 0.613, 1.293, 2.734, 5.771, 12.23, 25.83, 54.61, 115.3, 133.1, 171.2,
            199.0,
        ];
        let chosen = select_mass_labels(&masses, MAX_MASS_LABELS);
        // Both ends (ranked with the round masses) and the first other mass far enough away.
        assert_eq!(chosen, vec![0, 1, 12]);
    }
}
