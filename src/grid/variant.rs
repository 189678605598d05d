//! Named physics variants: `NAME=SPEC`, where SPEC overrides laws or factors of a base set.

use crate::error::{Error, Result};
use crate::physics::PhysicsOptions;

/// A named set of overrides of the base physics.
#[derive(Debug, Clone, PartialEq)]
pub struct Variant {
    /// The name (letters, digits, `-`, `_`).
    pub name: String,
    /// The SPEC as given.
    pub spec: String,
    /// The overrides.
    pub overrides: PhysicsOptions,
}

const EXAMPLE: &str = "e.g. --variant base= --variant hot=opacity-factor:2 --variant soft='rates:power-law:nu=4;alpha:1.5'";

impl Variant {
    /// The base set unchanged, named `base`.
    pub fn base() -> Self {
        Self {
            name: "base".into(),
            spec: String::new(),
            overrides: PhysicsOptions::default(),
        }
    }

    /// Parse `NAME=SPEC`. SPEC is empty (the base set) or `;`-separated `KEY:VALUE` items with
    /// KEY one of physics, eos, opacity, rates, convection, atmosphere (law names) or alpha,
    /// opacity-factor, rates-factor (numbers). Each key at most once.
    pub fn parse(text: &str) -> Result<Self> {
        let bad = |why: String| Error::invalid("--variant", text, &format!("{why}; {EXAMPLE}"));
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
        let mut o = PhysicsOptions::default();
        for item in spec.split(';').map(str::trim).filter(|s| !s.is_empty()) {
            let (key, value) = item
                .split_once(':')
                .ok_or_else(|| bad(format!("'{item}' is not KEY:VALUE")))?;
            let value = value.trim().to_string();
            let number = |v: &str| -> Result<f64> {
                v.parse::<f64>()
                    .ok()
                    .filter(|x| x.is_finite() && *x > 0.0)
                    .ok_or_else(|| bad(format!("{key} needs a positive number, not '{v}'")))
            };
            let slot_taken = match key.trim() {
                "physics" => o.physics.replace(value).is_some(),
                "eos" => o.eos.replace(value).is_some(),
                "opacity" => o.opacity.replace(value).is_some(),
                "rates" => o.rates.replace(value).is_some(),
                "convection" => o.convection.replace(value).is_some(),
                "atmosphere" => o.atmosphere.replace(value).is_some(),
                "alpha" => o.alpha.replace(number(&value)?).is_some(),
                "opacity-factor" => o.opacity_factor.replace(number(&value)?).is_some(),
                "rates-factor" => o.rates_factor.replace(number(&value)?).is_some(),
                other => {
                    return Err(bad(format!(
                        "unknown key '{other}' (allowed: physics, eos, opacity, rates, convection, atmosphere, alpha, opacity-factor, rates-factor)"
                    )))
                }
            };
            if slot_taken {
                return Err(bad(format!("'{}' is given twice", key.trim())));
            }
        }
        Ok(Self {
            name: name.to_string(),
            spec: spec.trim().to_string(),
            overrides: o,
        })
    }

    /// The factor this variant sets for `which` (`opacity` or `rates`), if any.
    pub fn factor(&self, which: &str) -> Option<f64> {
        match which {
            "opacity" => self.overrides.opacity_factor,
            "rates" => self.overrides.rates_factor,
            _ => None,
        }
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
            v.overrides.opacity.as_deref(),
            Some("table:models/demo-opacity.csv")
        );
        let v = Variant::parse("soft=rates:power-law:nu=4;alpha:1.5").unwrap();
        assert_eq!(v.overrides.rates.as_deref(), Some("power-law:nu=4"));
        assert_eq!(v.overrides.alpha, Some(1.5));
        // The examples this module prints must also build.
        for spec in [
            "hot=opacity-factor:2",
            "soft=rates:power-law:nu=4;alpha:1.5",
        ] {
            let v = Variant::parse(spec).unwrap();
            assert!(
                PhysicsOptions::default()
                    .overridden_by(&v.overrides)
                    .build()
                    .is_ok(),
                "{spec}"
            );
        }
        assert_eq!(
            Variant::parse("base=").unwrap().overrides,
            PhysicsOptions::default()
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
        ] {
            assert!(Variant::parse(bad).is_err(), "{bad}");
        }
    }
}
