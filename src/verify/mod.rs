//! Built-in published checks: the one place where the values that `starpoise verify` and the
//! test suite compare against are written down, each with its source.
//!
//! A [`Check`] pairs a published (or otherwise outside) value with a function that computes the
//! same quantity through the library, and a [`Tolerance`] saying how close is close enough.
//! [`checks`] lists them all, grouped by topic; [`run`] evaluates one. Sources carry the flags
//! of `docs/references.md`: *confirmed* (read in the source), *computed* (reproduced from
//! confirmed inputs) or *memory* (recalled, not re-read); "fact of the trade" marks common
//! practice without a single source.
//!
//! ZAMS models are solved once per process and shared by every check that needs them (see
//! [`zams`]), so a full run costs a few models.

pub mod constants;
pub mod microphysics;
pub mod polytropes;
pub mod report;
pub mod zams;

pub use report::{CheckReport, Summary};

use crate::error::Result;
use serde::Serialize;

/// How close a computed value must be to the expected one.
///
/// Serialised as `{"relative": r}`, `{"absolute": a}` or `{"range": [lo, hi]}`.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Tolerance {
    /// |got - expected| <= r |expected|.
    Relative(f64),
    /// |got - expected| <= a.
    Absolute(f64),
    /// lo <= got <= hi; `expected` is then the nominal published value inside the band.
    Range(f64, f64),
}

impl Tolerance {
    /// Whether `got` is acceptable against `expected`. A non-finite `got` never is.
    pub fn accepts(&self, expected: f64, got: f64) -> bool {
        if !got.is_finite() {
            return false;
        }
        match *self {
            Tolerance::Relative(r) => (got - expected).abs() <= r * expected.abs(),
            Tolerance::Absolute(a) => (got - expected).abs() <= a,
            Tolerance::Range(lo, hi) => (lo..=hi).contains(&got),
        }
    }

    /// Short description for a table column: `rel 1e-10`, `abs 5e-10`, `[0.6, 0.8]`.
    pub fn describe(&self) -> String {
        match *self {
            Tolerance::Relative(r) => format!("rel {}", report::format_number(r)),
            Tolerance::Absolute(a) => format!("abs {}", report::format_number(a)),
            Tolerance::Range(lo, hi) => format!(
                "[{}, {}]",
                report::format_number(lo),
                report::format_number(hi)
            ),
        }
    }
}

/// One built-in check: a value from outside the project and how to compute it with the library.
#[derive(Debug, Clone)]
pub struct Check {
    /// Stable identifier, e.g. `lane-emden.n3.xi1`.
    pub id: &'static str,
    /// Topic: `constants`, `polytropes`, `microphysics`, `zams`.
    pub group: &'static str,
    /// What is checked, in words, with units.
    pub description: &'static str,
    /// The publication (with its flag) or "fact of the trade".
    pub source: &'static str,
    /// The expected value (for a [`Tolerance::Range`], the nominal value inside the band).
    pub expected: f64,
    /// How close the computed value must be.
    pub tolerance: Tolerance,
    compute: fn() -> Result<f64>,
}

impl Check {
    /// A check of the value computed by `compute` against `expected` within `tolerance`.
    pub fn new(
        id: &'static str,
        group: &'static str,
        description: &'static str,
        source: &'static str,
        expected: f64,
        tolerance: Tolerance,
        compute: fn() -> Result<f64>,
    ) -> Self {
        Self {
            id,
            group,
            description,
            source,
            expected,
            tolerance,
            compute,
        }
    }

    /// Compute the checked quantity with the library.
    pub fn compute(&self) -> Result<f64> {
        (self.compute)()
    }
}

/// The outcome of one check.
#[derive(Debug, Clone, PartialEq)]
pub struct CheckResult {
    /// The computed value, or the message of the error that prevented computing it.
    pub got: std::result::Result<f64, String>,
    /// Whether the value was computed and lies within the tolerance.
    pub passed: bool,
}

/// Every built-in check, grouped by topic (constants, polytropes, microphysics, ZAMS models).
pub fn checks() -> Vec<Check> {
    let mut all = constants::checks();
    all.extend(polytropes::checks());
    all.extend(microphysics::checks());
    all.extend(zams::checks());
    all
}

/// Evaluate one check. An error while computing counts as a failure and keeps its message.
pub fn run(check: &Check) -> CheckResult {
    match check.compute() {
        Ok(v) => CheckResult {
            got: Ok(v),
            passed: check.tolerance.accepts(check.expected, v),
        },
        Err(e) => CheckResult {
            got: Err(e.to_string()),
            passed: false,
        },
    }
}

/// Evaluate every check in `list`, in order.
pub fn run_all(list: &[Check]) -> Vec<(Check, CheckResult)> {
    list.iter().map(|c| (c.clone(), run(c))).collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn tolerances_accept_and_refuse() {
        assert!(Tolerance::Relative(1e-3).accepts(100.0, 100.09));
        assert!(!Tolerance::Relative(1e-3).accepts(100.0, 100.2));
        assert!(Tolerance::Absolute(0.1).accepts(0.0, -0.1));
        assert!(!Tolerance::Absolute(0.1).accepts(0.0, 0.11));
        assert!(Tolerance::Range(3.0, 4.5).accepts(3.7, 4.5));
        assert!(!Tolerance::Range(3.0, 4.5).accepts(3.7, 2.9));
        for t in [
            Tolerance::Relative(1.0),
            Tolerance::Absolute(1.0),
            Tolerance::Range(-1.0, 1.0),
        ] {
            assert!(!t.accepts(0.0, f64::NAN));
            assert!(!t.accepts(0.0, f64::INFINITY));
        }
    }

    #[test]
    fn identifiers_are_unique() {
        let list = checks();
        let mut ids: Vec<_> = list.iter().map(|c| c.id).collect();
        ids.sort_unstable();
        ids.dedup();
        assert_eq!(ids.len(), list.len());
    }
}
