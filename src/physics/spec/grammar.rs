//! The one grammar of a law choice, both ways: `NAME`, `NAME:KEY=VALUE,KEY=VALUE` or, for a law
//! that reads a file, `NAME:PATH`.
//!
//! Parsing fills every parameter the text leaves out with its catalogue default and checks each
//! value against its catalogue range; printing writes every parameter (defaults included), so
//! that what the program prints is exactly what it ran and parses back to the same spec.
//! Numbers are printed in Rust's shortest round-trip form, so the round trip is exact.

use super::catalogue::{LawEntry, LawKind};
use std::fmt;

/// A law choice that could not be understood: which kind, the text given, and what is allowed.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
#[error("{reason}; {allowed}")]
pub struct SpecError {
    /// The kind of law (names the model-file key, e.g. `opacity`).
    pub kind: LawKind,
    /// The text as given.
    pub value: String,
    /// What is wrong.
    pub reason: String,
    /// What is allowed, with an example.
    pub allowed: String,
}

/// The arguments of a law: its numeric parameters in catalogue order, or the file it reads.
#[derive(Debug, Clone, PartialEq)]
pub enum Arguments {
    /// Parameter values, one per catalogue parameter, in catalogue order.
    Numbers(Vec<f64>),
    /// The file a table law reads.
    Path(String),
}

impl Arguments {
    /// Parameter `i` of `entry`: the value given, or the catalogue default.
    pub fn number(&self, entry: &LawEntry, i: usize) -> f64 {
        match self {
            Arguments::Numbers(v) if i < v.len() => v[i],
            _ => entry.params.get(i).map_or(f64::NAN, |p| p.default_value()),
        }
    }
}

/// A typed law choice of one kind: an enum with one arm per catalogued law (and an external arm
/// for a law supplied through the library, which has no text form that parses).
pub trait LawSpec: Sized {
    /// The kind of law.
    const KIND: LawKind;
    /// The catalogue rows of this kind.
    fn catalogue() -> &'static [LawEntry];
    /// The catalogue row of this choice and its arguments; `Err(name)` for an external law.
    fn parts(&self) -> Result<(&'static LawEntry, Arguments), &str>;
    /// The choice for catalogue row `entry` with `arguments` (already complete and in range).
    fn from_parts(entry: &'static LawEntry, arguments: Arguments) -> Self;
}

/// The prefix under which an external law (one supplied through the library) is printed.
pub const EXTERNAL_PREFIX: &str = "external";

/// Parse `text` as a choice of kind `S`.
pub fn parse<S: LawSpec>(text: &str) -> Result<S, SpecError> {
    let fail = |reason: String| SpecError {
        kind: S::KIND,
        value: text.to_string(),
        reason,
        allowed: super::catalogue::allowed(S::catalogue()),
    };
    let trimmed = text.trim();
    let (name, rest) = match trimmed.split_once(':') {
        Some((n, r)) => (n.trim(), Some(r)),
        None => (trimmed, None),
    };
    if name == EXTERNAL_PREFIX {
        return Err(fail(
            "an external law is supplied through the library and cannot be selected by name".into(),
        ));
    }
    let Some(entry) = S::catalogue().iter().find(|e| e.name == name) else {
        return Err(fail(format!("unknown {} law '{name}'", S::KIND.key())));
    };
    if entry.reads_file {
        let path = rest.map(str::trim).unwrap_or("");
        if path.is_empty() {
            return Err(fail(format!(
                "'{name}' reads a file: give it as {name}:PATH"
            )));
        }
        return Ok(S::from_parts(entry, Arguments::Path(path.to_string())));
    }
    let mut values: Vec<Option<f64>> = vec![None; entry.params.len()];
    if let Some(list) = rest {
        if entry.params.is_empty() {
            return Err(fail(format!("'{name}' takes no parameters")));
        }
        for item in list.split(',') {
            let Some((key, value)) = item.split_once('=') else {
                return Err(fail(format!("'{item}' is not KEY=VALUE")));
            };
            let key = key.trim();
            let Some(slot) = entry.params.iter().position(|p| p.key == key) else {
                return Err(fail(format!("'{name}' has no parameter '{key}'")));
            };
            if values[slot].is_some() {
                return Err(fail(format!("parameter '{key}' is given twice")));
            }
            let param = &entry.params[slot];
            let v: f64 = value
                .trim()
                .parse()
                .map_err(|_| fail(format!("{key} = '{}' is not a number", value.trim())))?;
            if !param.contains(v) {
                return Err(fail(format!(
                    "{key} = {v} is outside its range {}",
                    param.range_text()
                )));
            }
            values[slot] = Some(v);
        }
    }
    let numbers = values
        .iter()
        .zip(entry.params)
        .map(|(v, p)| v.unwrap_or_else(|| p.default_value()))
        .collect();
    Ok(S::from_parts(entry, Arguments::Numbers(numbers)))
}

/// Write `spec` in the grammar [`parse`] reads.
pub fn write<S: LawSpec>(spec: &S, f: &mut fmt::Formatter<'_>) -> fmt::Result {
    let (entry, arguments) = match spec.parts() {
        Ok(parts) => parts,
        Err(name) => return write!(f, "{EXTERNAL_PREFIX}:{name}"),
    };
    f.write_str(entry.name)?;
    match arguments {
        Arguments::Path(p) => write!(f, ":{p}"),
        Arguments::Numbers(v) => {
            for (i, (param, value)) in entry.params.iter().zip(&v).enumerate() {
                let sep = if i == 0 { ':' } else { ',' };
                write!(f, "{sep}{}={value}", param.key)?;
            }
            Ok(())
        }
    }
}

/// Implement `FromStr`, `Display`, `Serialize` and `Deserialize` for a [`LawSpec`] through the
/// grammar, so that flags, model files, JSON output and variants all use the same text.
macro_rules! law_spec_text {
    ($ty:ty) => {
        impl std::str::FromStr for $ty {
            type Err = $crate::physics::spec::SpecError;
            fn from_str(s: &str) -> Result<Self, Self::Err> {
                $crate::physics::spec::grammar::parse(s)
            }
        }
        impl std::fmt::Display for $ty {
            fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
                $crate::physics::spec::grammar::write(self, f)
            }
        }
        impl serde::Serialize for $ty {
            fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
                s.collect_str(self)
            }
        }
        impl<'de> serde::Deserialize<'de> for $ty {
            fn deserialize<D: serde::Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
                let text = <std::borrow::Cow<'de, str>>::deserialize(d)?;
                text.parse().map_err(serde::de::Error::custom)
            }
        }
    };
}
pub(crate) use law_spec_text;

impl From<SpecError> for crate::error::Error {
    fn from(e: SpecError) -> Self {
        crate::error::Error::InvalidInput {
            name: e.kind.key().to_string(),
            value: e.value,
            allowed: format!("{}; {}", e.reason, e.allowed),
        }
    }
}
