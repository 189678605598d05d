//! `starpoise verify`: run the built-in published checks and report them.

use super::io::{err, out};
use super::Format;
use clap::Args;
use starpoise::output::meta::{Meta, Provenance};
use starpoise::verify::{checks, run_all, CheckReport, Summary};
use starpoise::{Error, Result};

/// Run every built-in check (Lane–Emden solutions and tables, constants, microphysics limits,
/// ZAMS figures) against its published value; exit code 1 if any fails.
#[derive(Debug, Clone, Args)]
pub struct VerifyArgs {
    /// Output format: an aligned table (text) or a JSON object {meta, checks} with one object
    /// per check.
    #[arg(long, value_enum, default_value_t = Format::Text)]
    pub format: Format,
}

/// Run the checks, print the table (text) or array (JSON) on standard output, and the summary
/// line last (on standard error for JSON, so that standard output stays one JSON value).
pub fn run(args: VerifyArgs) -> Result<()> {
    let reports: Vec<CheckReport> = run_all(&checks())
        .iter()
        .map(|(check, result)| CheckReport::new(check, result))
        .collect();
    let summary = Summary::of(&reports);
    match args.format {
        Format::Text => out(&starpoise::verify::report::to_text(&reports))?,
        Format::Json => {
            let meta = Meta::new(&Provenance::of_this_process(), "built-in published checks");
            let value = serde_json::json!({ "meta": meta.to_json(), "checks": reports });
            let text = serde_json::to_string_pretty(&value).map_err(|e| Error::Io {
                path: "<stdout>".to_string(),
                reason: e.to_string(),
            })?;
            out(&format!("{text}\n"))?;
            err(&format!("{}\n", summary.line()));
        }
    }
    if summary.failed > 0 {
        return Err(Error::VerificationFailed {
            failed: summary.failed,
        });
    }
    Ok(())
}
