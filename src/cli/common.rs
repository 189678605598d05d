//! Flags shared by every command that evaluates physics: composition and the choice of laws.
//! Flatten them into a command with `#[command(flatten)]` and call [`ModelArgs::resolve`].

use clap::Args;
use starpoise::physics::{Composition, PhysicsOptions};
use starpoise::Result;

/// Chemical composition flags.
#[derive(Debug, Clone, Args)]
pub struct CompositionArgs {
    /// Hydrogen mass fraction X.
    #[arg(long = "x", value_name = "X", default_value_t = 0.70)]
    pub x: f64,
    /// Metal mass fraction Z (helium Y = 1 - X - Z).
    #[arg(long = "z", value_name = "Z", default_value_t = 0.02)]
    pub z: f64,
}

impl CompositionArgs {
    /// The validated composition.
    pub fn composition(&self) -> Result<Composition> {
        Composition::new(self.x, self.z)
    }
}

/// Flags choosing the physics laws; unset flags keep the preset's law.
#[derive(Debug, Clone, Args)]
pub struct PhysicsArgs {
    /// Physics preset: analytic or refined [default: refined].
    #[arg(long, value_name = "PRESET")]
    pub physics: Option<String>,
    /// Equation of state: ideal, saha, degenerate, refined.
    #[arg(long, value_name = "LAW")]
    pub eos: Option<String>,
    /// Opacity: electron-scattering, kramers[:guillotine=T], h-minus, conductive, analytic,
    /// refined[:guillotine=T0,exponent=Q], table:PATH, table-clamped:PATH.
    #[arg(long, value_name = "LAW")]
    pub opacity: Option<String>,
    /// Energy generation: analytic, sfactor, power-law:eps0=E,t0=T,nu=N.
    #[arg(long, value_name = "LAW")]
    pub rates: Option<String>,
    /// Convection: adiabatic or mlt.
    #[arg(long, value_name = "LAW")]
    pub convection: Option<String>,
    /// Mixing-length parameter alpha for mlt [default: 1.8].
    #[arg(long, value_name = "ALPHA")]
    pub alpha: Option<f64>,
    /// Factor multiplying the opacity [default: 1].
    #[arg(long, value_name = "F")]
    pub opacity_factor: Option<f64>,
    /// Factor multiplying the energy generation rate [default: 1].
    #[arg(long, value_name = "F")]
    pub rates_factor: Option<f64>,
}

impl PhysicsArgs {
    /// The options these flags describe (not yet validated: [`PhysicsOptions::build`] does).
    pub fn options(&self) -> PhysicsOptions {
        PhysicsOptions {
            physics: self.physics.clone(),
            eos: self.eos.clone(),
            opacity: self.opacity.clone(),
            rates: self.rates.clone(),
            convection: self.convection.clone(),
            alpha: self.alpha,
            opacity_factor: self.opacity_factor,
            rates_factor: self.rates_factor,
            atmosphere: None,
        }
    }
}

/// Composition and physics flags together.
#[derive(Debug, Clone, Args)]
pub struct ModelArgs {
    /// Composition.
    #[command(flatten)]
    pub composition: CompositionArgs,
    /// Physics laws.
    #[command(flatten)]
    pub physics: PhysicsArgs,
}

impl ModelArgs {
    /// The validated composition and the physics options.
    pub fn resolve(&self) -> Result<(Composition, PhysicsOptions)> {
        Ok((self.composition.composition()?, self.physics.options()))
    }
}
