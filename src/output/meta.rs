//! What made an output: the provenance every file and JSON output records.
//!
//! JSON outputs carry it as a `meta` object; CSV files as leading `# key: value` lines (read
//! them with `pandas.read_csv(path, comment="#")`). Keys: `program`, `version`, `command` (the
//! command line, or the Python call), `model_name` and `model_note` (from a model file, when one
//! was read), `constants` (the sources of the physical constants).

use serde::Serialize;

/// The sources of the constants every model uses (see `crate::constants`).
pub const CONSTANTS_SOURCES: &str =
    "CODATA 2018 (Tiesinga et al. 2021); IAU 2015 Resolution B3 nominal solar values";

/// The provenance of one output.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Provenance {
    /// The program's name.
    pub program: &'static str,
    /// The program's version (Cargo.toml).
    pub version: &'static str,
    /// The command line (or the library call) that made the output.
    pub command: String,
    /// The `name` of the model file read, if any.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub model_name: Option<String>,
    /// The `note` of the model file read, if any.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub model_note: Option<String>,
    /// The sources of the physical constants.
    pub constants: &'static str,
}

impl Provenance {
    /// The provenance of an output made by `command`.
    pub fn new(command: impl Into<String>) -> Self {
        Self {
            program: env!("CARGO_PKG_NAME"),
            version: env!("CARGO_PKG_VERSION"),
            command: command.into(),
            model_name: None,
            model_note: None,
            constants: CONSTANTS_SOURCES,
        }
    }

    /// The provenance of an output made by this process's command line (arguments joined by
    /// spaces, each quoted if it holds a space or a quote).
    pub fn of_this_process() -> Self {
        let args: Vec<String> = std::env::args()
            .map(|a| {
                if a.is_empty() || a.contains([' ', '\'', '"']) {
                    format!("'{}'", a.replace('\'', "'\\''"))
                } else {
                    a
                }
            })
            .collect();
        Self::new(args.join(" "))
    }

    /// With the `name` and `note` of a model file.
    pub fn with_model(mut self, name: Option<String>, note: Option<String>) -> Self {
        self.model_name = name;
        self.model_note = note;
        self
    }

    /// The `# key: value` lines of a CSV file (each value on one line: line breaks become
    /// spaces).
    pub fn comment_lines(&self) -> Vec<String> {
        let mut lines = vec![
            format!("# program: {}", self.program),
            format!("# version: {}", self.version),
            format!("# command: {}", one_line(&self.command)),
        ];
        if let Some(n) = &self.model_name {
            lines.push(format!("# model_name: {}", one_line(n)));
        }
        if let Some(n) = &self.model_note {
            lines.push(format!("# model_note: {}", one_line(n)));
        }
        lines.push(format!("# constants: {}", self.constants));
        lines
    }
}

fn one_line(text: &str) -> String {
    text.replace(['\n', '\r'], " ")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn comment_lines_are_single_lines() {
        let p = Provenance::new("starpoise zams --mass 1")
            .with_model(Some("Lantern-B".into()), Some("two\nlines".into()));
        let lines = p.comment_lines();
        assert!(lines
            .iter()
            .all(|l| l.starts_with("# ") && !l.contains('\n')));
        assert!(lines.contains(&"# model_note: two lines".to_string()));
        assert_eq!(p.version, env!("CARGO_PKG_VERSION"));
    }
}
