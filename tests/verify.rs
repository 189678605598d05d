//! The built-in published checks of `starpoise verify`: every one passes through the library
//! (so the test suite and `verify` share one set of values, in `starpoise::verify`), the command
//! reports them as a table or JSON with exit code 0, and a wrong expectation is reported as a
//! failure.

mod common;

use common::{json, starpoise};
use starpoise::verify::{checks, run, run_all, Check, CheckReport, Summary, Tolerance};

#[test]
fn every_built_in_check_passes() {
    let list = checks();
    // Constants, polytropes, microphysics and ZAMS models are all represented.
    for group in ["constants", "polytropes", "microphysics", "zams"] {
        assert!(list.iter().any(|c| c.group == group), "no {group} checks");
    }
    let failures: Vec<String> = list
        .iter()
        .filter_map(|c| {
            let r = run(c);
            (!r.passed).then(|| {
                format!(
                    "{}: expected {} ({:?}), got {:?}",
                    c.id, c.expected, c.tolerance, r.got
                )
            })
        })
        .collect();
    assert!(failures.is_empty(), "failed:\n{}", failures.join("\n"));
}

#[test]
fn every_check_names_its_source() {
    for c in checks() {
        assert!(!c.source.trim().is_empty(), "{} has no source", c.id);
        assert!(!c.description.trim().is_empty(), "{}", c.id);
        assert!(c.expected.is_finite(), "{}", c.id);
    }
}

fn one() -> starpoise::Result<f64> {
    Ok(1.0)
}

fn broken() -> starpoise::Result<f64> {
    Err(starpoise::Error::invalid(
        "--index",
        7,
        "a number in [0, 5]",
    ))
}

#[test]
fn a_wrong_expectation_is_a_failure() {
    let wrong = Check::new(
        "test.wrong",
        "test",
        "deliberately wrong",
        "none",
        1.1,
        Tolerance::Relative(1e-3),
        one,
    );
    let r = run(&wrong);
    assert_eq!(r.got, Ok(1.0));
    assert!(!r.passed);
    let outside = Check::new(
        "test.range",
        "test",
        "d",
        "none",
        5.0,
        Tolerance::Range(2.0, 3.0),
        one,
    );
    assert!(!run(&outside).passed);
    let right = Check::new(
        "test.right",
        "test",
        "d",
        "none",
        1.0005,
        Tolerance::Relative(1e-3),
        one,
    );
    assert!(run(&right).passed);
    // An error while computing is a failure that keeps its message.
    let failing = Check::new(
        "test.error",
        "test",
        "d",
        "none",
        1.0,
        Tolerance::Absolute(1.0),
        broken,
    );
    let r = run(&failing);
    assert!(!r.passed);
    assert!(r.got.unwrap_err().contains("--index"));
    // And the report counts them.
    let reports: Vec<CheckReport> = run_all(&[wrong, right, failing])
        .iter()
        .map(|(c, r)| CheckReport::new(c, r))
        .collect();
    let summary = Summary::of(&reports);
    assert_eq!((summary.passed, summary.failed), (1, 2));
    let text = starpoise::verify::report::to_text(&reports);
    assert!(text.ends_with("1 passed, 2 failed\n"), "{text}");
    assert_eq!(text.matches("FAIL").count(), 2, "{text}");
    assert!(text.contains("test.error: invalid --index"), "{text}");
}

#[test]
fn command_prints_a_table_and_exits_zero() {
    let out = starpoise(&["verify"]);
    let stdout = String::from_utf8_lossy(&out.stdout);
    assert_eq!(out.status.code(), Some(0), "{stdout}");
    let n = checks().len();
    assert!(
        stdout
            .trim_end()
            .ends_with(&format!("{n} passed, 0 failed")),
        "{stdout}"
    );
    // Header plus one row per check before the summary line.
    assert!(stdout.starts_with("check"), "{stdout}");
    assert_eq!(stdout.lines().count(), n + 2, "{stdout}");
    assert!(stdout.contains("lane-emden.n3.xi1") && stdout.contains("Horedt 1986"));
}

#[test]
fn command_prints_json_with_every_key() {
    let out = starpoise(&["verify", "--format", "json"]);
    assert_eq!(out.status.code(), Some(0));
    let v = json(&out);
    assert_eq!(v["meta"]["program"], "starpoise");
    assert_eq!(v["meta"]["version"], env!("CARGO_PKG_VERSION"));
    let rows = v["checks"].as_array().expect("a JSON array of checks");
    assert_eq!(rows.len(), checks().len());
    for row in rows {
        for key in [
            "id",
            "group",
            "description",
            "source",
            "expected",
            "tolerance",
            "got",
            "passed",
        ] {
            assert!(row.get(key).is_some(), "missing {key} in {row}");
        }
        assert_eq!(row["passed"], serde_json::Value::Bool(true), "{row}");
        assert!(row["got"].is_f64(), "{row}");
        let tol = row["tolerance"].as_object().expect("tolerance object");
        assert!(
            tol.contains_key("relative")
                || tol.contains_key("absolute")
                || tol.contains_key("range"),
            "{row}"
        );
    }
    let stderr = common::stderr(&out);
    assert!(
        stderr.contains(&format!("{} passed, 0 failed", rows.len())),
        "{stderr}"
    );
}

#[test]
fn bad_format_is_refused_with_exit_code_2() {
    let out = starpoise(&["verify", "--format", "xml"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(common::stderr(&out).contains("xml"));
}

/// A run with failures ends in this error: exit code 1 (not 2, bad input, or 3, no convergence).
#[test]
fn failures_map_to_exit_code_1() {
    let e = starpoise::Error::VerificationFailed { failed: 2 };
    assert_eq!(e.exit_code(), starpoise::error::ExitCode::Failure);
    assert_eq!(e.to_string(), "2 of the built-in checks failed");
}
