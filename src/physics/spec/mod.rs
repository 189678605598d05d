//! Choosing laws: one typed spec per kind of law, one grammar for each (flags, model files,
//! JSON output and variants all use the same text), and one catalogue of every law.
//!
//! - [`PhysicsSpec`] is a complete choice (one law of each kind, the scale factors, the preset
//!   it started from). Serialised, it is a model-file fragment: merged with `mass_msun`, `x` and
//!   `z` it rebuilds the same model.
//! - [`PhysicsOverrides`] is what a user gives: any subset of the keys, applied over a preset.
//!
//! Keys (model file and JSON): `preset`, `eos`, `opacity`, `opacity_factor`, `rates`,
//! `rates_factor`, `convection`, `alpha` (overrides only), `atmosphere`.

pub mod atmosphere;
pub mod catalogue;
pub mod convection;
pub mod eos;
pub mod grammar;
pub mod opacity;
pub mod preset;
pub mod rates;

pub use atmosphere::AtmosphereSpec;
pub use catalogue::{LawEntry, LawKind, Param};
pub use convection::ConvectionSpec;
pub use eos::EosSpec;
pub use grammar::{LawSpec, SpecError};
pub use opacity::OpacitySpec;
pub use preset::Preset;
pub use rates::RatesSpec;

use crate::error::{Error, Result};
use crate::physics::opacity::refined;
use serde::{Deserialize, Serialize};

/// Smallest and largest scale factor on the opacity or the rates.
pub const FACTOR_RANGE: (f64, f64) = (1e-6, 1e6);

/// A complete choice of laws: exactly what a model was built with.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PhysicsSpec {
    /// The preset the choice started from.
    pub preset: Preset,
    /// Equation of state.
    pub eos: EosSpec,
    /// Opacity law.
    pub opacity: OpacitySpec,
    /// Factor multiplying the opacity.
    pub opacity_factor: f64,
    /// Energy-generation law.
    pub rates: RatesSpec,
    /// Factor multiplying the energy-generation rate.
    pub rates_factor: f64,
    /// Convection law.
    pub convection: ConvectionSpec,
    /// Outer boundary.
    pub atmosphere: AtmosphereSpec,
}

impl Preset {
    /// The complete choice this preset stands for.
    ///
    /// - `refined`: eos `molecular`, opacity `refined` (calibrated guillotine factor), rates
    ///   `sfactor`, convection `mlt` (alpha 2.4, calibrated with this atmosphere), the
    ///   `krishna-swamy` atmosphere.
    /// - `analytic`: ideal gas + radiation; kappa = 0.2(1+X) + (4.34e25 Z + 3.68e22 (1-Z))(1+X)
    ///   rho T^-3.5; the textbook pp and CNO rates without screening; adiabatic convection; the
    ///   one-point photosphere.
    pub fn spec(self) -> PhysicsSpec {
        let (eos, opacity, rates, convection, atmosphere) = match self {
            Preset::Refined => (
                EosSpec::Molecular,
                OpacitySpec::Refined {
                    guillotine: refined::DEFAULT_GUILLOTINE,
                    exponent: refined::DEFAULT_DENSITY_EXPONENT,
                },
                RatesSpec::SFactor,
                ConvectionSpec::MixingLength {
                    alpha: convection::ALPHA.default_value(),
                },
                AtmosphereSpec::KrishnaSwamy,
            ),
            Preset::Analytic => (
                EosSpec::Ideal,
                OpacitySpec::Analytic,
                RatesSpec::Analytic,
                ConvectionSpec::Adiabatic,
                AtmosphereSpec::Photosphere,
            ),
        };
        PhysicsSpec {
            preset: self,
            eos,
            opacity,
            opacity_factor: 1.0,
            rates,
            rates_factor: 1.0,
            convection,
            atmosphere,
        }
    }

    /// The smallest mass this preset's laws describe, M_sun: the `analytic` set has full
    /// ionisation and no H-minus opacity, meaningless in photospheres below about 1900 K, which
    /// stars below 0.7 M_sun have.
    pub fn minimum_mass_msun(self) -> Option<f64> {
        match self {
            Preset::Analytic => Some(0.7),
            Preset::Refined => None,
        }
    }
}

impl Default for PhysicsSpec {
    /// The `refined` preset.
    fn default() -> Self {
        Preset::Refined.spec()
    }
}

fn check_factor(key: &str, f: f64) -> Result<f64> {
    let (lo, hi) = FACTOR_RANGE;
    if f.is_finite() && (lo..=hi).contains(&f) {
        Ok(f)
    } else {
        Err(Error::invalid(
            key,
            f,
            &format!("a scale factor must be a number in [{lo}, {hi}], e.g. 2"),
        ))
    }
}

fn check_alpha(alpha: f64) -> Result<f64> {
    let param = convection::ALPHA;
    if param.contains(alpha) {
        Ok(alpha)
    } else {
        Err(Error::invalid(
            "alpha",
            alpha,
            &format!(
                "the mixing-length parameter must be in {}, e.g. 1.8",
                param.range_text()
            ),
        ))
    }
}

impl PhysicsSpec {
    /// Check the parts that the grammar cannot: the factors' ranges.
    pub fn validate(&self) -> Result<()> {
        check_factor("opacity_factor", self.opacity_factor)?;
        check_factor("rates_factor", self.rates_factor)?;
        Ok(())
    }

    /// Every file this choice reads (an opacity table), so that no output replaces it.
    pub fn input_files(&self) -> Vec<&std::path::Path> {
        self.opacity.input_file().into_iter().collect()
    }

    /// The overrides that reproduce this choice exactly (every key set, `alpha` left to the
    /// convection law's own parameter).
    pub fn as_overrides(&self) -> PhysicsOverrides {
        PhysicsOverrides {
            preset: Some(self.preset),
            eos: Some(self.eos.clone()),
            opacity: Some(self.opacity.clone()),
            opacity_factor: Some(self.opacity_factor),
            rates: Some(self.rates.clone()),
            rates_factor: Some(self.rates_factor),
            convection: Some(self.convection.clone()),
            alpha: None,
            atmosphere: Some(self.atmosphere),
        }
    }
}

/// What a user chooses: any subset of the keys, applied over a preset (default `refined`).
/// The same keys serve the command-line flags (`--preset`, `--eos`, ..., `--opacity-factor`),
/// the model-file keys and the variant keys (`opacity-factor:2` in a variant).
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PhysicsOverrides {
    /// Preset to start from (default `refined`).
    pub preset: Option<Preset>,
    /// Equation of state.
    pub eos: Option<EosSpec>,
    /// Opacity law.
    pub opacity: Option<OpacitySpec>,
    /// Factor multiplying the opacity (default 1).
    pub opacity_factor: Option<f64>,
    /// Energy-generation law.
    pub rates: Option<RatesSpec>,
    /// Factor multiplying the energy-generation rate (default 1).
    pub rates_factor: Option<f64>,
    /// Convection law.
    pub convection: Option<ConvectionSpec>,
    /// Mixing-length parameter: sets `alpha` of the convection law (which must take one).
    pub alpha: Option<f64>,
    /// Outer boundary.
    pub atmosphere: Option<AtmosphereSpec>,
}

/// The variant keys of [`PhysicsOverrides`], as written in `NAME=KEY:VALUE;...` (the flag names
/// without `--`).
pub const OVERRIDE_KEYS: [&str; 9] = [
    "preset",
    "eos",
    "opacity",
    "opacity-factor",
    "rates",
    "rates-factor",
    "convection",
    "alpha",
    "atmosphere",
];

impl PhysicsOverrides {
    /// These overrides with every key that `over` sets taken from `over`.
    pub fn overridden_by(&self, over: &PhysicsOverrides) -> PhysicsOverrides {
        PhysicsOverrides {
            preset: over.preset.or(self.preset),
            eos: over.eos.clone().or_else(|| self.eos.clone()),
            opacity: over.opacity.clone().or_else(|| self.opacity.clone()),
            opacity_factor: over.opacity_factor.or(self.opacity_factor),
            rates: over.rates.clone().or_else(|| self.rates.clone()),
            rates_factor: over.rates_factor.or(self.rates_factor),
            convection: over.convection.clone().or_else(|| self.convection.clone()),
            alpha: over.alpha.or(self.alpha),
            atmosphere: over.atmosphere.or(self.atmosphere),
        }
    }

    /// Set the key `key` (one of [`OVERRIDE_KEYS`]) from its text. Errors name the key and what
    /// is allowed; a key already set is refused (`already_set` is then true).
    pub fn set(&mut self, key: &str, value: &str) -> Result<()> {
        fn law<S: std::str::FromStr<Err = SpecError>>(
            slot: &mut Option<S>,
            value: &str,
        ) -> Result<()> {
            *slot = Some(value.parse().map_err(Error::from)?);
            Ok(())
        }
        let number = |slot: &mut Option<f64>, name: &str| -> Result<()> {
            let v: f64 = value
                .trim()
                .parse()
                .map_err(|_| Error::invalid(name, value, "a number is needed, e.g. 2"))?;
            *slot = Some(if name == "alpha" {
                check_alpha(v)?
            } else {
                check_factor(name, v)?
            });
            Ok(())
        };
        let taken = match key {
            "preset" => self.preset.is_some(),
            "eos" => self.eos.is_some(),
            "opacity" => self.opacity.is_some(),
            "opacity-factor" => self.opacity_factor.is_some(),
            "rates" => self.rates.is_some(),
            "rates-factor" => self.rates_factor.is_some(),
            "convection" => self.convection.is_some(),
            "alpha" => self.alpha.is_some(),
            "atmosphere" => self.atmosphere.is_some(),
            other => {
                return Err(Error::invalid(
                    "key",
                    other,
                    &format!("allowed keys: {}", OVERRIDE_KEYS.join(", ")),
                ))
            }
        };
        if taken {
            return Err(Error::invalid(key, value, "this key is given twice"));
        }
        match key {
            "preset" => law(&mut self.preset, value),
            "eos" => law(&mut self.eos, value),
            "opacity" => law(&mut self.opacity, value),
            "rates" => law(&mut self.rates, value),
            "convection" => law(&mut self.convection, value),
            "atmosphere" => law(&mut self.atmosphere, value),
            "opacity-factor" => number(&mut self.opacity_factor, "opacity_factor"),
            "rates-factor" => number(&mut self.rates_factor, "rates_factor"),
            _ => number(&mut self.alpha, "alpha"),
        }
    }

    /// The complete choice: the preset's laws, then every law named here, then `alpha`, then
    /// the factors. Errors: `alpha` given for a law without one, or out of range; a factor out of
    /// [`FACTOR_RANGE`].
    pub fn resolve(&self) -> Result<PhysicsSpec> {
        let mut spec = self.preset.unwrap_or(Preset::Refined).spec();
        if let Some(e) = &self.eos {
            spec.eos = e.clone();
        }
        if let Some(o) = &self.opacity {
            spec.opacity = o.clone();
        }
        if let Some(r) = &self.rates {
            spec.rates = r.clone();
        }
        if let Some(c) = &self.convection {
            spec.convection = c.clone();
        }
        if let Some(a) = self.atmosphere {
            spec.atmosphere = a;
        }
        if let Some(alpha) = self.alpha {
            check_alpha(alpha)?;
            spec.convection = spec.convection.with_alpha(alpha).ok_or_else(|| {
                Error::invalid(
                    "alpha",
                    alpha,
                    &format!(
                        "the mixing-length parameter applies only to convection mlt, not {}",
                        spec.convection
                    ),
                )
            })?;
        }
        if let Some(f) = self.opacity_factor {
            spec.opacity_factor = check_factor("opacity_factor", f)?;
        }
        if let Some(f) = self.rates_factor {
            spec.rates_factor = check_factor("rates_factor", f)?;
        }
        Ok(spec)
    }

    /// Every file these overrides read (an opacity table).
    pub fn input_files(&self) -> Vec<&std::path::Path> {
        self.opacity
            .as_ref()
            .and_then(OpacitySpec::input_file)
            .into_iter()
            .collect()
    }
}
