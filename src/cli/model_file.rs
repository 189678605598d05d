//! Model files: every setting `zams` takes, as JSON keys.
//!
//! Keys (all optional; `mass_msun` is needed unless `--mass` is given): `name`, `note` (free
//! text), `mass_msun`, `x`, `z`, `fit_mass_fraction`, `tolerance`, `points`, and the physics keys
//! of [`PhysicsOverrides`] (`preset`, `eos`, `opacity`, `opacity_factor`, `rates`,
//! `rates_factor`, `convection`, `alpha`, `atmosphere`). The `physics` object of
//! `zams --format json` is such a fragment: merged with `mass_msun`, `x` and `z` it rebuilds the
//! same model. Unknown keys and keys given twice are refused, and every value is checked when the
//! file is read, so an error names the file.

use super::common::{CompositionFlags, PhysicsFlags};
use serde::de::{self, MapAccess, Visitor};
use serde::{Deserialize, Deserializer};
use starpoise::physics::{Composition, PhysicsOverrides, PhysicsSet};
use starpoise::structure::{profile::check_profile_points, ZamsSettings};
use starpoise::{Error, Result};
use std::fmt;
use std::path::Path;

/// A model file's contents.
#[derive(Debug, Default, Deserialize)]
pub struct ModelFile {
    /// Free-text name of the star (recorded in the outputs' provenance as `model_name`).
    pub name: Option<String>,
    /// Free-text note (recorded as `model_note`).
    pub note: Option<String>,
    /// Mass, M_sun.
    pub mass_msun: Option<f64>,
    /// Hydrogen mass fraction.
    pub x: Option<f64>,
    /// Metal mass fraction.
    pub z: Option<f64>,
    /// Fitting mass fraction.
    pub fit_mass_fraction: Option<f64>,
    /// Finest integrator tolerance.
    pub tolerance: Option<f64>,
    /// Profile rows.
    pub points: Option<usize>,
    /// The laws.
    #[serde(flatten)]
    pub physics: PhysicsOverrides,
}

/// A JSON object whose keys must be unique (serde_json keeps the last of repeated keys).
struct UniqueObject(serde_json::Map<String, serde_json::Value>);

impl<'de> Deserialize<'de> for UniqueObject {
    fn deserialize<D: Deserializer<'de>>(d: D) -> std::result::Result<Self, D::Error> {
        struct V;
        impl<'de> Visitor<'de> for V {
            type Value = UniqueObject;
            fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
                f.write_str("a JSON object")
            }
            fn visit_map<A: MapAccess<'de>>(
                self,
                mut map: A,
            ) -> std::result::Result<UniqueObject, A::Error> {
                let mut out = serde_json::Map::new();
                while let Some((k, v)) = map.next_entry::<String, serde_json::Value>()? {
                    if out.contains_key(&k) {
                        return Err(de::Error::custom(format!("the key \"{k}\" is given twice")));
                    }
                    out.insert(k, v);
                }
                Ok(UniqueObject(out))
            }
        }
        d.deserialize_map(V)
    }
}

impl ModelFile {
    /// Every key a model file may hold.
    fn keys() -> Vec<String> {
        let own = [
            "name",
            "note",
            "mass_msun",
            "x",
            "z",
            "fit_mass_fraction",
            "tolerance",
            "points",
        ];
        let physics = serde_json::to_value(PhysicsOverrides::default()).ok();
        let physics_keys = physics
            .as_ref()
            .and_then(|v| v.as_object())
            .into_iter()
            .flat_map(|m| m.keys().cloned());
        own.iter()
            .map(|k| k.to_string())
            .chain(physics_keys)
            .collect()
    }

    /// Read, parse and check a model file; errors ([`Error::BadFile`], exit code 2) name the
    /// file and what is wrong.
    pub fn read(path: &Path) -> Result<Self> {
        let bad = |reason: String| Error::BadFile {
            path: path.display().to_string(),
            reason,
        };
        let text = std::fs::read_to_string(path)
            .map_err(|e| bad(format!("cannot read the model file: {e}")))?;
        Self::from_text(&text, path)
    }

    /// Parse and check the text of a model file read from `path` (which names it in errors).
    pub fn from_text(text: &str, path: &Path) -> Result<Self> {
        let bad = |reason: String| Error::BadFile {
            path: path.display().to_string(),
            reason,
        };
        let object: UniqueObject = serde_json::from_str(text).map_err(|e| {
            bad(format!(
                "not a valid model file (a JSON object with keys such as mass_msun, x, z, preset): {e}"
            ))
        })?;
        let allowed = Self::keys();
        if let Some(k) = object.0.keys().find(|k| !allowed.contains(k)) {
            return Err(bad(format!(
                "unknown key \"{k}\"; allowed keys: {}",
                allowed.join(", ")
            )));
        }
        let file: ModelFile = serde_json::from_value(serde_json::Value::Object(object.0))
            .map_err(|e| bad(format!("not a valid model file: {e}")))?;
        file.check().map_err(|e| bad(e.to_string()))?;
        Ok(file)
    }

    /// The ZAMS settings of this file with flags over it: the mass (`mass`, else the file's),
    /// the composition and laws (flags over the file's), and the fitting mass and tolerance
    /// (`fit_mass` and `tolerance`, else the file's, else the defaults). Errors name the key
    /// (`mass_msun` when no mass is given at all).
    pub fn zams_settings(
        &self,
        mass: Option<f64>,
        composition: &CompositionFlags,
        physics: &PhysicsFlags,
        fit_mass: Option<f64>,
        tolerance: Option<f64>,
    ) -> Result<ZamsSettings> {
        let mass = mass.or(self.mass_msun).ok_or_else(|| {
            Error::invalid(
                "mass_msun",
                "(missing)",
                "give the stellar mass in solar masses, e.g. --mass 1",
            )
        })?;
        let comp = composition.composition(self.x, self.z)?;
        let spec = self.physics.overridden_by(&physics.overrides()).resolve()?;
        let mut settings = ZamsSettings::new(mass, comp, PhysicsSet::from_spec(&spec)?)?;
        if let Some(q) = fit_mass.or(self.fit_mass_fraction) {
            settings = settings.with_fit_mass_fraction(q)?;
        }
        if let Some(t) = tolerance.or(self.tolerance) {
            settings = settings.with_tolerance(t)?;
        }
        Ok(settings)
    }

    /// Check every value the file gives on its own (defaults for what it leaves out), so that a
    /// bad value is reported as the file's.
    fn check(&self) -> Result<()> {
        let comp = Composition::new(self.x.unwrap_or(0.70), self.z.unwrap_or(0.02))?;
        let physics = PhysicsSet::from_spec(&self.physics.resolve()?)?;
        let mut s = ZamsSettings::new(self.mass_msun.unwrap_or(1.0), comp, physics)?;
        if let Some(q) = self.fit_mass_fraction {
            s = s.with_fit_mass_fraction(q)?;
        }
        if let Some(t) = self.tolerance {
            s.with_tolerance(t)?;
        }
        if let Some(n) = self.points {
            check_profile_points(n)?;
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    #[test]
    fn repeated_and_unknown_keys_are_refused() {
        let p = Path::new("m.json");
        for (text, needle) in [
            (r#"{"mass_msun": 1, "mass_msun": 2}"#, "given twice"),
            (r#"{"colour": 1}"#, "unknown key"),
            (r#"{"mass_msun": -1}"#, "between"),
            ("[]", "a JSON object"),
        ] {
            let e = ModelFile::from_text(text, p).unwrap_err().to_string();
            assert!(e.contains(needle) && e.contains("m.json"), "{e}");
        }
        let ok = ModelFile::from_text(r#"{"name": "Lantern-T", "mass_msun": 1}"#, p).unwrap();
        assert_eq!(ok.name.as_deref(), Some("Lantern-T"));
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(2000))]
        /// Arbitrary text, and arbitrary values under the real keys, never panic.
        #[test]
        fn model_files_never_panic(
            text in "\\PC{0,120}",
            key in 0usize..8,
            value in "[-0-9eE.a-z:=,\"\\[\\]{}]{0,20}",
        ) {
            let _ = ModelFile::from_text(&text, Path::new("m.json"));
            let keys = ["mass_msun", "x", "z", "points", "tolerance", "opacity", "alpha", "preset"];
            let json = format!("{{\"{}\": {value}}}", keys[key]);
            let _ = ModelFile::from_text(&json, Path::new("m.json"));
        }
    }
}
