//! Named physics variants: `NAME=SPEC`, where SPEC overrides laws or factors of a base set.

use crate::error::{Error, Result};
use crate::physics::spec::OVERRIDE_KEYS;
use crate::physics::PhysicsOverrides;

/// A named set of overrides of the base physics.
#[derive(Debug, Clone, PartialEq)]
pub struct Variant {
    /// The name (letters, digits, `-`, `_`).
    pub name: String,
    /// The SPEC as given.
    pub spec: String,
    /// The overrides.
    pub overrides: PhysicsOverrides,
}

const EXAMPLE: &str =
    "e.g. base= (the base set), hot=opacity-factor:2, soft=rates:power-law:nu=4;alpha:1.5";

impl Variant {
    /// The base set unchanged, named `base`.
    pub fn base() -> Self {
        Self {
            name: "base".into(),
            spec: String::new(),
            overrides: PhysicsOverrides::default(),
        }
    }

    /// Parse `NAME=SPEC`. SPEC is empty (the base set) or `;`-separated `KEY:VALUE` items with
    /// KEY one of [`OVERRIDE_KEYS`] and VALUE in the grammar of that key (a law as printed in the
    /// JSON summary, or a number). Each key at most once.
    pub fn parse(text: &str) -> Result<Self> {
        let bad = |why: String| Error::invalid("variant", text, &format!("{why}; {EXAMPLE}"));
        let (name, spec) = text
            .split_once('=')
            .ok_or_else(|| bad("a variant is NAME=SPEC".into()))?;
        let name = name.trim();
        if name.is_empty()
            || !name
                .chars()
                .all(|c| c.is_ascii_alphanumeric() || c == '-' || c == '_')
        {
            return Err(bad(format!(
                "the name '{name}' must be letters, digits, - or _"
            )));
        }
        let mut overrides = PhysicsOverrides::default();
        for item in spec.split(';').map(str::trim).filter(|s| !s.is_empty()) {
            let (key, value) = item
                .split_once(':')
                .ok_or_else(|| bad(format!("'{item}' is not KEY:VALUE")))?;
            let key = key.trim();
            if !OVERRIDE_KEYS.contains(&key) {
                return Err(bad(format!(
                    "unknown key '{key}' (allowed: {})",
                    OVERRIDE_KEYS.join(", ")
                )));
            }
            overrides.set(key, value.trim()).map_err(|e| match e {
                Error::InvalidInput { allowed, .. } => bad(format!("{key}: {allowed}")),
                other => other,
            })?;
        }
        Ok(Self {
            name: name.to_string(),
            spec: spec.trim().to_string(),
            overrides,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn parses_specs() {
        let v = Variant::parse("hot=opacity-factor:2").unwrap();
        assert_eq!(v.name, "hot");
        assert_eq!(v.overrides.opacity_factor, Some(2.0));
        let v = Variant::parse("tab=opacity:table:models/demo-opacity.csv").unwrap();
        assert_eq!(
            v.overrides.opacity.map(|o| o.to_string()).as_deref(),
            Some("table:models/demo-opacity.csv")
        );
        let v = Variant::parse("soft=rates:power-law:nu=4;alpha:1.5").unwrap();
        assert!(matches!(
            v.overrides.rates,
            Some(crate::physics::RatesSpec::PowerLaw { nu, .. }) if nu == 4.0
        ));
        assert_eq!(v.overrides.alpha, Some(1.5));
        // What the JSON summary prints is accepted as a variant value.
        let v = Variant::parse("m=convection:mlt:alpha=1.8").unwrap();
        assert!(v.overrides.convection.is_some());
        // The examples this module prints must also build.
        for spec in [
            "hot=opacity-factor:2",
            "soft=rates:power-law:nu=4;alpha:1.5",
        ] {
            let v = Variant::parse(spec).unwrap();
            assert!(
                PhysicsOverrides::default()
                    .overridden_by(&v.overrides)
                    .resolve()
                    .is_ok(),
                "{spec}"
            );
        }
        assert_eq!(
            Variant::parse("base=").unwrap().overrides,
            PhysicsOverrides::default()
        );
    }

    #[test]
    fn refuses_bad_specs() {
        for bad in [
            "hot",
            "=x",
            "a b=alpha:1",
            "x=colour:red",
            "x=alpha:-1",
            "x=alpha",
            "x=alpha:1;alpha:2",
            "x=eos:nonsense",
            "x=opacity:kramers:guillotine=-1",
        ] {
            assert!(Variant::parse(bad).is_err(), "{bad}");
        }
    }
}
