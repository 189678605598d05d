//! Local microphysics: composition, equation of state, opacity, nuclear energy generation and
//! convection. One trait per kind of law, one type per law; a [`PhysicsSet`] bundles one law of
//! each kind and is what the structure equations evaluate.

pub mod atmosphere;
pub mod composition;
pub mod convection;
pub mod eos;
pub mod nuclear;
pub mod opacity;
pub mod probe;
pub mod scaled;
pub mod spec;

use std::sync::Arc;

pub use composition::Composition;
pub use convection::{Convection, ConvectionPoint};
pub use eos::{EosState, EquationOfState};
pub use nuclear::{EnergyGeneration, EnergyRate};
pub use opacity::Opacity;
pub use scaled::Scaled;
pub use spec::{
    AtmosphereSpec, ConvectionSpec, EosSpec, OpacitySpec, PhysicsOverrides, PhysicsSpec, Preset,
    RatesSpec,
};

use crate::error::Result;

/// One law of each kind, built from the [`PhysicsSpec`] it keeps: everything local that a
/// stellar model needs.
#[derive(Debug, Clone)]
pub struct PhysicsSet {
    spec: PhysicsSpec,
    eos: Arc<dyn EquationOfState>,
    opacity: Arc<dyn Opacity>,
    rates: Arc<dyn EnergyGeneration>,
    convection: Arc<dyn Convection>,
}

impl PhysicsSet {
    /// Build every law of `spec` (a table is read here), wrapping the opacity and the rates in
    /// [`Scaled`] where their factor is not 1. Errors: a parameter a law refuses, an unreadable
    /// table ([`crate::Error::BadFile`]), a factor out of range, or an external law (which only
    /// [`PhysicsSet::with_eos`] and its siblings can supply).
    pub fn from_spec(spec: &PhysicsSpec) -> Result<Self> {
        spec.validate()?;
        let external = |kind: &str, text: String| {
            crate::Error::invalid(
                kind,
                text,
                "an external law is supplied through the library (PhysicsSet::with_*), not by name",
            )
        };
        let eos = spec
            .eos
            .build()
            .ok_or_else(|| external("eos", spec.eos.to_string()))?;
        let mut opacity = spec
            .opacity
            .build()?
            .ok_or_else(|| external("opacity", spec.opacity.to_string()))?;
        let mut rates = spec
            .rates
            .build()?
            .ok_or_else(|| external("rates", spec.rates.to_string()))?;
        let convection = spec
            .convection
            .build()?
            .ok_or_else(|| external("convection", spec.convection.to_string()))?;
        if spec.opacity_factor != 1.0 {
            opacity = Arc::new(Scaled::new(opacity, spec.opacity_factor, "opacity_factor")?);
        }
        if spec.rates_factor != 1.0 {
            rates = Arc::new(Scaled::new(rates, spec.rates_factor, "rates_factor")?);
        }
        Ok(Self {
            spec: spec.clone(),
            eos,
            opacity,
            rates,
            convection,
        })
    }

    /// The `analytic` set (see [`Preset::spec`]).
    pub fn analytic() -> Self {
        Self::of_preset(Preset::Analytic)
    }

    /// The `refined` set, the default (see [`Preset::spec`]).
    pub fn refined() -> Self {
        Self::of_preset(Preset::Refined)
    }

    fn of_preset(preset: Preset) -> Self {
        // The preset's laws with their catalogue defaults, built without the fallible path (no
        // file, no parameter to refuse); tests/spec.rs checks that `from_spec` of the preset's
        // spec gives the same laws.
        let spec = preset.spec();
        match preset {
            Preset::Refined => Self {
                spec,
                eos: Arc::new(eos::MolecularEos),
                opacity: Arc::new(opacity::RefinedOpacity::default()),
                rates: Arc::new(nuclear::SFactorRates::default()),
                convection: Arc::new(convection::MixingLength::default()),
            },
            Preset::Analytic => Self {
                spec,
                eos: Arc::new(eos::IdealGas),
                opacity: Arc::new(opacity::AnalyticOpacity::default()),
                rates: Arc::new(nuclear::AnalyticRates::default()),
                convection: Arc::new(convection::Adiabatic),
            },
        }
    }

    /// The choice of laws this set was built from.
    pub fn spec(&self) -> &PhysicsSpec {
        &self.spec
    }
    /// Equation of state.
    pub fn eos(&self) -> &dyn EquationOfState {
        &*self.eos
    }
    /// Rosseland-mean opacity (scaled by its factor).
    pub fn opacity(&self) -> &dyn Opacity {
        &*self.opacity
    }
    /// Nuclear energy generation (scaled by its factor).
    pub fn rates(&self) -> &dyn EnergyGeneration {
        &*self.rates
    }
    /// Convection law.
    pub fn convection(&self) -> &dyn Convection {
        &*self.convection
    }
    /// Outer boundary condition.
    pub fn atmosphere(&self) -> AtmosphereSpec {
        self.spec.atmosphere
    }

    /// This set with an equation of state written outside the catalogue (reported as
    /// `external:NAME`, with NAME the law's own name).
    pub fn with_eos(mut self, law: Arc<dyn EquationOfState>) -> Self {
        self.spec.eos = EosSpec::External(law.name().to_string());
        self.eos = law;
        self
    }
    /// This set with an opacity law written outside the catalogue (the opacity factor is not
    /// applied to it).
    pub fn with_opacity(mut self, law: Arc<dyn Opacity>) -> Self {
        self.spec.opacity = OpacitySpec::External(law.name());
        self.spec.opacity_factor = 1.0;
        self.opacity = law;
        self
    }
    /// This set with an energy-generation law written outside the catalogue (the rates factor
    /// is not applied to it).
    pub fn with_rates(mut self, law: Arc<dyn EnergyGeneration>) -> Self {
        self.spec.rates = RatesSpec::External(law.name());
        self.spec.rates_factor = 1.0;
        self.rates = law;
        self
    }
    /// This set with a convection law written outside the catalogue.
    pub fn with_convection(mut self, law: Arc<dyn Convection>) -> Self {
        self.spec.convection = ConvectionSpec::External(law.name());
        self.convection = law;
        self
    }
    /// This set with another outer boundary.
    pub fn with_atmosphere(mut self, atmosphere: AtmosphereSpec) -> Self {
        self.spec.atmosphere = atmosphere;
        self
    }
}
