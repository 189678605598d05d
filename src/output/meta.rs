//! What made an output: the provenance every file and JSON output records, and the metadata
//! block ([`Meta`]) that carries it with what describes the data.
//!
//! JSON outputs carry it as a `meta` object; CSV files as leading `# key: value` lines (read
//! them with `pandas.read_csv(path, comment="#")`); ECSV files in the `meta` of their YAML
//! header. Provenance keys: `program`, `version`, `command` (the command line, or the Python
//! call), `model_name` and `model_note` (from a model file, when one was read), `constants` (the
//! sources of the physical constants). Then, per output: `content` (what the table is), and
//! where they apply `physics` (the complete choice of laws, a model-file fragment that rebuilds
//! the same model: [`crate::physics::PhysicsSpec`]), `x`, `y`, `z` (mass fractions), and keys of
//! the output's own (documented with each output).

use serde::Serialize;
use serde_json::Value;

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

/// The metadata of one output: provenance first, then the keys that describe the data, in
/// order. Values are JSON values; in CSV comment lines a string is written as it is (line
/// breaks become spaces) and anything else as compact JSON.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Meta {
    entries: Vec<(String, Value)>,
}

impl Meta {
    /// The metadata of an output made as `provenance` says, holding `content` (what the table
    /// is, e.g. `ZAMS profile`).
    pub fn new(provenance: &Provenance, content: &str) -> Self {
        let mut m = Meta::default();
        if let Ok(Value::Object(map)) = serde_json::to_value(provenance) {
            for key in [
                "program",
                "version",
                "command",
                "model_name",
                "model_note",
                "constants",
            ] {
                if let Some(v) = map.get(key) {
                    m.entries.push((key.to_string(), v.clone()));
                }
            }
        }
        m.with("content", content)
    }

    /// With `key` set to `value` (replacing an earlier value of the key, in its place).
    pub fn with(mut self, key: &str, value: impl Serialize) -> Self {
        let value = serde_json::to_value(value).unwrap_or(Value::Null);
        match self.entries.iter_mut().find(|(k, _)| k == key) {
            Some(entry) => entry.1 = value,
            None => self.entries.push((key.to_string(), value)),
        }
        self
    }

    /// With the complete choice of laws under `physics`.
    pub fn physics(self, spec: &crate::physics::PhysicsSpec) -> Self {
        self.with("physics", spec)
    }

    /// With the mass fractions `x`, `y`, `z`.
    pub fn composition(self, c: &crate::physics::Composition) -> Self {
        self.with("x", c.x()).with("y", c.y()).with("z", c.z())
    }

    /// The entries in order.
    pub fn entries(&self) -> &[(String, Value)] {
        &self.entries
    }

    /// The value of `key`.
    pub fn get(&self, key: &str) -> Option<&Value> {
        self.entries.iter().find(|(k, _)| k == key).map(|(_, v)| v)
    }

    /// A JSON object of the entries.
    pub fn to_json(&self) -> Value {
        Value::Object(self.entries.iter().cloned().collect())
    }

    /// The metadata from a JSON object (as written by [`Meta::to_json`]).
    pub fn from_json(value: &Value) -> Self {
        let entries = value
            .as_object()
            .map(|m| m.iter().map(|(k, v)| (k.clone(), v.clone())).collect())
            .unwrap_or_default();
        Self { entries }
    }

    /// The text of a value in a CSV comment line: a string as it is (on one line), anything
    /// else as compact JSON.
    pub fn comment_text(value: &Value) -> String {
        match value {
            Value::String(s) => one_line(s),
            other => other.to_string(),
        }
    }

    /// The `# key: value` lines of a CSV file, each ending in a line break.
    pub fn comment_block(&self) -> String {
        self.entries
            .iter()
            .map(|(k, v)| format!("# {k}: {}\n", Self::comment_text(v)))
            .collect()
    }

    /// The (key, text) pairs of the leading `# key: value` lines of a CSV text (as written by
    /// [`Meta::comment_block`]).
    pub fn read_comment_lines(text: &str) -> Vec<(String, String)> {
        text.lines()
            .take_while(|l| l.starts_with('#'))
            .filter_map(|l| {
                let (k, v) = l.trim_start_matches('#').split_once(':')?;
                Some((k.trim().to_string(), v.trim().to_string()))
            })
            .collect()
    }
}

/// A serialisable value followed by a `meta` member, keeping the value's own field order (for
/// the JSON summaries and tables that are structs).
#[derive(Debug, Serialize)]
pub struct WithMeta<'a, T: Serialize> {
    /// The value, its fields first.
    #[serde(flatten)]
    pub value: &'a T,
    /// The metadata.
    pub meta: Value,
}

impl<'a, T: Serialize> WithMeta<'a, T> {
    /// `value` with `meta`.
    pub fn new(value: &'a T, meta: &Meta) -> Self {
        Self {
            value,
            meta: meta.to_json(),
        }
    }
}

fn one_line(text: &str) -> String {
    text.replace(['\n', '\r'], " ")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn meta_keeps_order_and_round_trips_through_comments_and_json() {
        let p =
            Provenance::new("starpoise zams --mass 1").with_model(Some("Lantern-B".into()), None);
        let comp = crate::physics::Composition::new(0.7, 0.02).unwrap();
        let m = Meta::new(&p, "ZAMS profile")
            .physics(&crate::physics::PhysicsSpec::default())
            .composition(&comp)
            .with("mass_msun", 1.0);
        let keys: Vec<&str> = m.entries().iter().map(|(k, _)| k.as_str()).collect();
        assert_eq!(
            keys,
            [
                "program",
                "version",
                "command",
                "model_name",
                "constants",
                "content",
                "physics",
                "x",
                "y",
                "z",
                "mass_msun"
            ]
        );
        assert_eq!(Meta::from_json(&m.to_json()).to_json(), m.to_json());
        let read = Meta::read_comment_lines(&m.comment_block());
        assert_eq!(read.len(), m.entries().len());
        for ((k, text), (key, value)) in read.iter().zip(m.entries()) {
            assert_eq!(k, key);
            assert_eq!(text, &Meta::comment_text(value));
        }
        // The physics line is the model-file fragment, read back to the same spec.
        let physics: crate::physics::PhysicsSpec = serde_json::from_str(&read[6].1).unwrap();
        assert_eq!(physics, crate::physics::PhysicsSpec::default());
    }

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
