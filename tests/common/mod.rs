//! Helpers shared by the polytrope checks.
#![allow(dead_code)]

/// Assert that `actual` agrees with the decimal `published` to every digit given: the
/// difference is at most half a unit in the last printed place (plus 1e-15 relative for the
/// binary representation of `published`).
pub fn assert_digits(actual: f64, published: &str, what: &str) {
    let value: f64 = published.parse().expect("published value parses");
    let mantissa = published.split(['e', 'E']).next().unwrap_or(published);
    let exponent: i32 = published
        .split(['e', 'E'])
        .nth(1)
        .map_or(0, |e| e.parse().expect("exponent parses"));
    let decimals = mantissa.split('.').nth(1).map_or(0, |d| d.len() as i32);
    let half_unit = 0.5 * 10f64.powi(exponent - decimals);
    let tolerance = half_unit + 1e-15 * value.abs();
    assert!(
        (actual - value).abs() <= tolerance,
        "{what}: computed {actual:.15e}, published {published} (allowed +-{half_unit:e})"
    );
}

/// Relative difference |a - b| / |b|.
pub fn relative(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs()
}
