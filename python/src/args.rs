//! Python arguments to library inputs: the law choices (the same text as the command line's
//! flags, parsed by the typed specs' own `FromStr`), lists of values, counts, and the record
//! of the call for the metadata.

use crate::convert::{repr_f64, repr_str};
use crate::errors::{Caller, OrRaise};
use pyo3::prelude::*;
use pyo3::types::{PyDict, PyString};
use starpoise::grid::{parse_value_list, Variant};
use starpoise::output::meta::Provenance;
use starpoise::physics::{
    AtmosphereSpec, Composition, ConvectionSpec, EosSpec, OpacitySpec, PhysicsOverrides,
    PhysicsSpec, Preset, RatesSpec,
};
use starpoise::{Error, Result};

/// The law-choice arguments shared by `zams`, `sequence`, `compare` and `probe`.
#[derive(Debug, Clone, Default)]
pub struct LawArgs {
    /// `physics=`: the preset.
    pub physics: Option<String>,
    /// `eos=`.
    pub eos: Option<String>,
    /// `opacity=`.
    pub opacity: Option<String>,
    /// `rates=`.
    pub rates: Option<String>,
    /// `convection=`.
    pub convection: Option<String>,
    /// `atmosphere=`.
    pub atmosphere: Option<String>,
    /// `alpha=`.
    pub alpha: Option<f64>,
    /// `opacity_factor=`.
    pub opacity_factor: Option<f64>,
    /// `rates_factor=`.
    pub rates_factor: Option<f64>,
}

/// The law arguments of a function's signature as [`LawArgs`]: `physics` (the preset's text),
/// then the other eight by name (`eos, opacity, rates, convection, atmosphere, alpha,
/// opacity_factor, rates_factor`; the compiler checks that none is missing).
macro_rules! law_args {
    ($physics:ident, $($name:ident),+ $(,)?) => {
        $crate::args::LawArgs {
            physics: Some($physics.to_string()),
            $($name),+
        }
    };
}
pub(crate) use law_args;

fn law<S: std::str::FromStr<Err = starpoise::physics::spec::SpecError>>(
    text: &Option<String>,
) -> Result<Option<S>> {
    text.as_deref()
        .map(|t| t.parse::<S>().map_err(Error::from))
        .transpose()
}

impl LawArgs {
    /// The overrides these arguments set (over the `refined` preset unless `physics` names
    /// another). Errors name the library key (`opacity`, `preset`, `alpha`).
    pub fn overrides(&self) -> Result<PhysicsOverrides> {
        Ok(PhysicsOverrides {
            preset: law::<Preset>(&self.physics)?,
            eos: law::<EosSpec>(&self.eos)?,
            opacity: law::<OpacitySpec>(&self.opacity)?,
            opacity_factor: self.opacity_factor,
            rates: law::<RatesSpec>(&self.rates)?,
            rates_factor: self.rates_factor,
            convection: law::<ConvectionSpec>(&self.convection)?,
            alpha: self.alpha,
            atmosphere: law::<AtmosphereSpec>(&self.atmosphere)?,
        })
    }

    /// The complete choice of laws.
    pub fn spec(&self) -> Result<PhysicsSpec> {
        self.overrides()?.resolve()
    }

    /// Add the arguments given to the record of the call.
    pub fn record(&self, call: &mut Call<'_>) {
        for (name, text) in [
            ("physics", &self.physics),
            ("eos", &self.eos),
            ("opacity", &self.opacity),
            ("rates", &self.rates),
            ("convection", &self.convection),
            ("atmosphere", &self.atmosphere),
        ] {
            // The default preset is not worth recording.
            if !(name == "physics" && text.as_deref() == Some("refined")) {
                call.text(name, text.as_deref());
            }
        }
        call.float("alpha", self.alpha);
        call.float("opacity_factor", self.opacity_factor);
        call.float("rates_factor", self.rates_factor);
    }
}

/// A list of values given as one number, a sequence of numbers, or the command line's text
/// (`"0.5,1,2"`, `"0.1:100:40:log"`); checked by the library's list parser either way (finite,
/// no value twice), errors naming `key`.
pub fn value_list(caller: Caller, key: &str, values: &Bound<'_, PyAny>) -> PyResult<Vec<f64>> {
    let py = values.py();
    if let Ok(text) = values.cast::<PyString>() {
        return parse_value_list(key, &text.to_cow()?).or_raise(py, caller);
    }
    let numbers: Vec<f64> = match values.extract::<f64>() {
        Ok(v) => vec![v],
        Err(_) => values.extract()?,
    };
    if numbers.is_empty() {
        return Err(Error::invalid(
            key,
            "[]",
            "the list is empty; e.g. [0.5, 1, 2] or \"0.1:100:40:log\"",
        ))
        .or_raise(py, caller);
    }
    // Rust's shortest round-trip text of each number reads back to the same double, so the
    // library's parser sees exactly these values.
    let text: Vec<String> = numbers.iter().map(|v| format!("{v}")).collect();
    parse_value_list(key, &text.join(",")).or_raise(py, caller)
}

/// A count from a Python int, checked by the library's `check`. A negative count is refused
/// with the library's message for 0 (its lower bound) and the value given; `allowed` words the
/// refusal where 0 is allowed.
pub fn count<T>(
    key: &str,
    n: i64,
    allowed: &str,
    check: impl FnOnce(usize) -> Result<T>,
) -> Result<T> {
    let Ok(u) = usize::try_from(n) else {
        return Err(match check(0) {
            Err(Error::InvalidInput { name, allowed, .. }) => Error::InvalidInput {
                name,
                value: n.to_string(),
                allowed,
            },
            Err(e) => e,
            Ok(_) => Error::invalid(key, n, allowed),
        });
    };
    check(u)
}

/// Physics variants from a dict `{name: spec}` (in order; the first is the reference of a
/// comparison) or a list of the command line's `NAME=SPEC` texts; `None` is the base set
/// alone, named `base`.
pub fn variants(caller: Caller, value: Option<&Bound<'_, PyAny>>) -> PyResult<Vec<Variant>> {
    let Some(value) = value else {
        return Ok(vec![Variant::base()]);
    };
    let py = value.py();
    let texts: Vec<String> = if let Ok(d) = value.cast::<PyDict>() {
        let mut t = Vec::new();
        for (name, spec) in d.iter() {
            t.push(format!(
                "{}={}",
                name.extract::<String>()?,
                spec.extract::<String>()?
            ));
        }
        t
    } else {
        value.extract()?
    };
    let mut out: Vec<Variant> = Vec::new();
    for text in &texts {
        let v = Variant::parse(text).or_raise(py, caller)?;
        if out.iter().any(|w| w.name == v.name) {
            return Err(Error::invalid(
                "variant",
                &v.name,
                "each variant needs its own name, e.g. [\"base=\", \"hot=opacity-factor:2\"]",
            ))
            .or_raise(py, caller);
        }
        out.push(v);
    }
    Ok(out)
}

/// The record of a Python call, as it would be typed: `starpoise.zams(1.0, x=0.7, ...)`.
pub struct Call<'py> {
    py: Python<'py>,
    name: &'static str,
    parts: Vec<String>,
}

impl<'py> Call<'py> {
    /// A call of `starpoise.<name>`.
    pub fn new(py: Python<'py>, name: &'static str) -> Self {
        Self {
            py,
            name,
            parts: Vec::new(),
        }
    }
    /// A positional argument, already as Python text.
    pub fn positional(&mut self, text: String) -> &mut Self {
        self.parts.push(text);
        self
    }
    /// A keyword argument, already as Python text.
    pub fn keyword(&mut self, key: &str, text: String) -> &mut Self {
        self.parts.push(format!("{key}={text}"));
        self
    }
    /// A float keyword argument if given.
    pub fn float(&mut self, key: &str, v: Option<f64>) -> &mut Self {
        if let Some(v) = v {
            let t = repr_f64(self.py, v);
            self.keyword(key, t);
        }
        self
    }
    /// A str keyword argument if given.
    pub fn text(&mut self, key: &str, v: Option<&str>) -> &mut Self {
        if let Some(v) = v {
            let t = repr_str(self.py, v);
            self.keyword(key, t);
        }
        self
    }
    /// The repr of any Python object as a keyword argument, if given.
    pub fn object(&mut self, key: &str, v: Option<&Bound<'_, PyAny>>) -> &mut Self {
        if let Some(v) = v {
            let t = v.repr().map_or_else(|_| "?".to_string(), |r| r.to_string());
            self.keyword(key, t);
        }
        self
    }
    /// The call as text.
    pub fn text_of(&self) -> String {
        format!("starpoise.{}({})", self.name, self.parts.join(", "))
    }
}

/// The metadata of an output: the provenance record with the Python call as its command.
pub fn meta<'py>(py: Python<'py>, command: &str) -> PyResult<Bound<'py, PyDict>> {
    let v = crate::convert::serialized(py, &Provenance::new(command))?;
    Ok(v.cast_into::<PyDict>()?)
}

/// Add the composition and the laws to a metadata dict.
pub fn add_model<'py>(
    py: Python<'py>,
    meta: &Bound<'py, PyDict>,
    composition: &Composition,
    spec: &PhysicsSpec,
) -> PyResult<()> {
    meta.set_item("x", composition.x())?;
    meta.set_item("y", composition.y())?;
    meta.set_item("z", composition.z())?;
    meta.set_item("physics", crate::convert::serialized(py, spec)?)?;
    Ok(())
}
