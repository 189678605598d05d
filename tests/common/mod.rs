//! Helpers shared by the integration tests: running the binary, scratch files, and comparing
//! with published digits.
#![allow(dead_code)]

use std::path::PathBuf;
use std::process::{Command, Output};

/// Run the starpoise binary with `args`.
pub fn starpoise(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_starpoise"))
        .args(args)
        .output()
        .expect("the binary runs")
}

/// A fresh empty directory for one test's files.
pub fn scratch_dir(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("starpoise-test-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).expect("scratch directory");
    dir
}

/// A table file's text without its provenance `command` (the one line in which the outputs of
/// different command lines that computed the same numbers may differ): the `# command: ...`
/// line of CSV, the `command` entry of ECSV's meta, the `"command"` member of JSON.
pub fn without_command(path: &std::path::Path) -> String {
    let text = std::fs::read_to_string(path).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
    text.lines()
        .filter(|l| {
            !(l.starts_with("# command: ")
                || l.starts_with("# - {\"command\": ")
                || l.trim_start().starts_with("\"command\": "))
        })
        .map(|l| format!("{l}\n"))
        .collect()
}

/// Solve the small analytic grid `--masses 1,2` into `out` (a shard file for merge tests).
pub fn small_grid(out: &std::path::Path) {
    let o = starpoise(&[
        "sequence",
        "--quiet",
        "--masses",
        "1,2",
        "--physics",
        "analytic",
        "--out",
        out.to_str().expect("a UTF-8 path"),
    ]);
    assert!(o.status.success(), "{}", stderr(&o));
}

/// Standard error as text.
pub fn stderr(o: &Output) -> String {
    String::from_utf8_lossy(&o.stderr).into_owned()
}

/// Standard output parsed as one JSON value.
pub fn json(o: &Output) -> serde_json::Value {
    serde_json::from_slice(&o.stdout).unwrap_or_else(|e| {
        panic!(
            "stdout is not JSON ({e}): {}",
            String::from_utf8_lossy(&o.stdout)
        )
    })
}

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

/// The largest relative change of R, L, T_c and rho_c between two ZAMS summaries.
pub fn relative_change(
    a: &starpoise::structure::ModelSummary,
    b: &starpoise::structure::ModelSummary,
) -> f64 {
    [
        (a.radius_rsun, b.radius_rsun),
        (a.luminosity_lsun, b.luminosity_lsun),
        (a.central_temperature_k, b.central_temperature_k),
        (a.central_density_g_cm3, b.central_density_g_cm3),
    ]
    .iter()
    .map(|(x, y)| (x / y - 1.0).abs())
    .fold(0.0, f64::max)
}
