//! Piecewise power-law fits of the mass–luminosity and mass–radius relations.

use super::row::GridRow;
use crate::error::{Error, Result};
use serde::{Deserialize, Serialize};

/// Default mass ranges (M_sun) of the piecewise fits.
pub const DEFAULT_FIT_RANGES: [(f64, f64); 4] =
    [(0.1, 0.5), (0.5, 2.0), (2.0, 20.0), (20.0, 100.0)];

/// Exponents of L ~ M^a and R ~ M^b over one mass range.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct PowerLawFit {
    /// Lower end of the range, M_sun.
    pub from_msun: f64,
    /// Upper end of the range, M_sun.
    pub to_msun: f64,
    /// Models in the range.
    pub models: usize,
    /// a in L ~ M^a (least squares in log-log), `None` with fewer than two models.
    pub luminosity_exponent: Option<f64>,
    /// b in R ~ M^b.
    pub radius_exponent: Option<f64>,
}

/// Least-squares slope of y against x.
fn slope(x: &[f64], y: &[f64]) -> Option<f64> {
    let n = x.len() as f64;
    if x.len() < 2 {
        return None;
    }
    let mx = x.iter().sum::<f64>() / n;
    let my = y.iter().sum::<f64>() / n;
    let sxx: f64 = x.iter().map(|a| (a - mx).powi(2)).sum();
    let sxy: f64 = x.iter().zip(y).map(|(a, b)| (a - mx) * (b - my)).sum();
    (sxx > 0.0).then(|| sxy / sxx)
}

/// Fit log L and log R against log M over each range (ends included), from (M, L, R) triples.
pub fn power_law_fits(models: &[(f64, f64, f64)], ranges: &[(f64, f64)]) -> Vec<PowerLawFit> {
    ranges
        .iter()
        .map(|&(lo, hi)| {
            let inside: Vec<&(f64, f64, f64)> = models
                .iter()
                .filter(|m| m.0 >= lo * (1.0 - 1e-12) && m.0 <= hi * (1.0 + 1e-12))
                .collect();
            let lm: Vec<f64> = inside.iter().map(|m| m.0.log10()).collect();
            let ll: Vec<f64> = inside.iter().map(|m| m.1.log10()).collect();
            let lr: Vec<f64> = inside.iter().map(|m| m.2.log10()).collect();
            PowerLawFit {
                from_msun: lo,
                to_msun: hi,
                models: inside.len(),
                luminosity_exponent: slope(&lm, &ll),
                radius_exponent: slope(&lm, &lr),
            }
        })
        .collect()
}

/// The fits of one variant and composition.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct FitGroup {
    /// Variant name.
    pub variant: String,
    /// Hydrogen mass fraction.
    pub x: f64,
    /// Metal mass fraction.
    pub z: f64,
    /// One fit per mass range.
    pub ranges: Vec<PowerLawFit>,
}

/// Fits of L(M) and R(M) for each variant and composition (in the order they first appear),
/// from the converged rows.
pub fn fit_groups(rows: &[GridRow], ranges: &[(f64, f64)]) -> Vec<FitGroup> {
    let mut groups: Vec<FitGroup> = Vec::new();
    for r in rows {
        if groups
            .iter()
            .any(|g| g.variant == r.variant && g.x == r.x && g.z == r.z)
        {
            continue;
        }
        let models: Vec<(f64, f64, f64)> = rows
            .iter()
            .filter(|s| s.variant == r.variant && s.x == r.x && s.z == r.z)
            .filter_map(|s| {
                let m = s.summary.as_ref()?;
                Some((s.mass_msun, m.luminosity_lsun, m.radius_rsun))
            })
            .collect();
        groups.push(FitGroup {
            variant: r.variant.clone(),
            x: r.x,
            z: r.z,
            ranges: power_law_fits(&models, ranges),
        });
    }
    groups
}

/// Format ranges as `0.1-0.5,0.5-2` (the text [`parse_ranges`] reads).
pub fn format_ranges(ranges: &[(f64, f64)]) -> String {
    let parts: Vec<String> = ranges.iter().map(|(a, b)| format!("{a}-{b}")).collect();
    parts.join(",")
}

/// Parse `0.1-0.5,0.5-2` into ranges.
pub fn parse_ranges(text: &str) -> Result<Vec<(f64, f64)>> {
    let bad = || {
        Error::invalid(
            "fit_ranges",
            text,
            "ranges are LO-HI separated by commas with 0 < LO < HI, e.g. 0.1-0.5,0.5-2,2-20",
        )
    };
    text.split(',')
        .map(|r| {
            let (a, b) = r.trim().split_once('-').ok_or_else(bad)?;
            let a: f64 = a.trim().parse().map_err(|_| bad())?;
            let b: f64 = b.trim().parse().map_err(|_| bad())?;
            if a > 0.0 && b > a && b.is_finite() {
                Ok((a, b))
            } else {
                Err(bad())
            }
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Exact power laws L = M^4, R = M^0.8 give those exponents.
    #[test]
    fn recovers_exact_power_laws() {
        let models: Vec<(f64, f64, f64)> = [1.0, 1.5, 2.0]
            .iter()
            .map(|&m: &f64| (m, m.powi(4), m.powf(0.8)))
            .collect();
        let f = power_law_fits(&models, &[(1.0, 2.0), (5.0, 10.0)]);
        assert!((f[0].luminosity_exponent.unwrap() - 4.0).abs() < 1e-12);
        assert!((f[0].radius_exponent.unwrap() - 0.8).abs() < 1e-12);
        assert_eq!(f[1].models, 0);
        assert!(f[1].luminosity_exponent.is_none());
        assert!(parse_ranges("1-0.5").is_err() && parse_ranges("a-b").is_err());
        assert_eq!(
            parse_ranges("0.1-0.5, 2-20").unwrap(),
            vec![(0.1, 0.5), (2.0, 20.0)]
        );
        let r = vec![(0.1, 0.5), (0.5, 2.0), (20.0, 100.0)];
        assert_eq!(parse_ranges(&format_ranges(&r)).unwrap(), r);
    }
}
