//! Flags shared by the commands that build models: composition and the choice of laws.

use clap::Args;
use starpoise::physics::spec::{catalogue, LawKind};
use starpoise::physics::{
    AtmosphereSpec, Composition, ConvectionSpec, EosSpec, OpacitySpec, PhysicsOverrides, Preset,
    RatesSpec,
};
use starpoise::Result;

/// Composition flags. Unset values fall back to a model file, then to X = 0.70, Z = 0.02.
#[derive(Debug, Clone, Default, Args)]
pub struct CompositionFlags {
    /// Hydrogen mass fraction X [default: 0.70].
    #[arg(long, value_name = "X", value_parser = super::values::number, allow_hyphen_values = true)]
    pub x: Option<f64>,
    /// Metal mass fraction Z [default: 0.02].
    #[arg(long, value_name = "Z", value_parser = super::values::number, allow_hyphen_values = true)]
    pub z: Option<f64>,
}

impl CompositionFlags {
    /// The composition, with `fallback` (e.g. from a model file) for unset flags.
    pub fn composition(
        &self,
        fallback_x: Option<f64>,
        fallback_z: Option<f64>,
    ) -> Result<Composition> {
        Composition::new(
            self.x.or(fallback_x).unwrap_or(0.70),
            self.z.or(fallback_z).unwrap_or(0.02),
        )
    }
}

/// Law-choice flags: a preset and any single law overridden by name. Each law flag is parsed by
/// the spec's own grammar (what the JSON summary prints is accepted here); the help lists the
/// catalogue.
#[derive(Debug, Clone, Default, Args)]
pub struct PhysicsFlags {
    /// Physics preset [default: refined].
    #[arg(long, visible_alias = "physics", value_name = "SET", allow_hyphen_values = true, help = help(LawKind::Preset))]
    pub preset: Option<Preset>,
    /// Equation of state.
    #[arg(long, value_name = "LAW", allow_hyphen_values = true, help = help(LawKind::Eos))]
    pub eos: Option<EosSpec>,
    /// Opacity law.
    #[arg(long, value_name = "LAW", allow_hyphen_values = true, help = help(LawKind::Opacity))]
    pub opacity: Option<OpacitySpec>,
    /// Energy generation law.
    #[arg(long, value_name = "LAW", allow_hyphen_values = true, help = help(LawKind::Rates))]
    pub rates: Option<RatesSpec>,
    /// Convection law.
    #[arg(long, value_name = "LAW", allow_hyphen_values = true, help = help(LawKind::Convection))]
    pub convection: Option<ConvectionSpec>,
    /// Mixing-length parameter alpha of mlt [default: 2.4; range 0.1-10].
    #[arg(long, value_name = "A", value_parser = super::values::number, allow_hyphen_values = true)]
    pub alpha: Option<f64>,
    /// Factor multiplying the opacity [default: 1; range 1e-6-1e6].
    #[arg(long, value_name = "F", value_parser = super::values::number, allow_hyphen_values = true)]
    pub opacity_factor: Option<f64>,
    /// Factor multiplying the nuclear energy generation rate [default: 1; range 1e-6-1e6].
    #[arg(long, value_name = "F", value_parser = super::values::number, allow_hyphen_values = true)]
    pub rates_factor: Option<f64>,
    /// Outer boundary [default: the preset's].
    #[arg(long, value_name = "KIND", allow_hyphen_values = true, help = help(LawKind::Atmosphere))]
    pub atmosphere: Option<AtmosphereSpec>,
}

/// The help line of a kind of law: "NAME[:KEY=DEFAULT,...] (what it is); ..." from the
/// catalogue.
fn help(kind: LawKind) -> String {
    let what = match kind {
        LawKind::Preset => "Physics preset [default: refined]",
        LawKind::Eos => "Equation of state",
        LawKind::Opacity => "Opacity law",
        LawKind::Rates => "Energy generation law",
        LawKind::Convection => "Convection law",
        LawKind::Atmosphere => "Outer boundary [default: the preset's]",
    };
    format!("{what}: {}", catalogue::help(kind))
}

impl PhysicsFlags {
    /// The overrides these flags set (unset flags stay unset).
    pub fn overrides(&self) -> PhysicsOverrides {
        PhysicsOverrides {
            preset: self.preset,
            eos: self.eos.clone(),
            opacity: self.opacity.clone(),
            opacity_factor: self.opacity_factor,
            rates: self.rates.clone(),
            rates_factor: self.rates_factor,
            convection: self.convection.clone(),
            alpha: self.alpha,
            atmosphere: self.atmosphere,
        }
    }
}

/// Composition and physics flags together.
#[derive(Debug, Clone, Default, Args)]
pub struct ModelArgs {
    /// Composition.
    #[command(flatten)]
    pub composition: CompositionFlags,
    /// Physics laws.
    #[command(flatten)]
    pub physics: PhysicsFlags,
}

impl ModelArgs {
    /// The validated composition (X = 0.70, Z = 0.02 unless given) and the physics overrides.
    pub fn resolve(&self) -> Result<(Composition, PhysicsOverrides)> {
        Ok((
            self.composition.composition(None, None)?,
            self.physics.overrides(),
        ))
    }
}

pub use starpoise::output::format::num;
