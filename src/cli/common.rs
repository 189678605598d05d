//! Flags shared by the commands that build models: composition and the choice of laws.

use clap::Args;
use starpoise::physics::{Composition, PhysicsOptions};
use starpoise::Result;

/// Composition flags. Unset values fall back to a model file, then to X = 0.70, Z = 0.02.
#[derive(Debug, Clone, Default, Args)]
pub struct CompositionFlags {
    /// Hydrogen mass fraction X [default: 0.70].
    #[arg(long, value_name = "X")]
    pub x: Option<f64>,
    /// Metal mass fraction Z [default: 0.02].
    #[arg(long, value_name = "Z")]
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

/// Law-choice flags: a preset and any single law overridden by name.
#[derive(Debug, Clone, Default, Args)]
pub struct PhysicsFlags {
    /// Physics preset: analytic or refined [default: refined].
    #[arg(long, value_name = "SET")]
    pub physics: Option<String>,
    /// Equation of state: ideal, saha, degenerate, refined, molecular.
    #[arg(long, value_name = "LAW")]
    pub eos: Option<String>,
    /// Opacity: electron-scattering, kramers[:guillotine=T], h-minus, bell-lin, conductive, analytic,
    /// refined[:guillotine=T0,exponent=Q], table:PATH, table-clamped:PATH.
    #[arg(long, value_name = "LAW")]
    pub opacity: Option<String>,
    /// Energy generation: analytic, sfactor, power-law[:eps0=E,t0=T,nu=N] (defaults 0.437,
    /// 1.5e7 K, 4).
    #[arg(long, value_name = "LAW")]
    pub rates: Option<String>,
    /// Convection law: adiabatic or mlt.
    #[arg(long, value_name = "LAW")]
    pub convection: Option<String>,
    /// Mixing-length parameter alpha for mlt [default: 2.4].
    #[arg(long, value_name = "A")]
    pub alpha: Option<f64>,
    /// Factor multiplying the opacity [default: 1].
    #[arg(long, value_name = "F")]
    pub opacity_factor: Option<f64>,
    /// Factor multiplying the nuclear energy generation rate [default: 1].
    #[arg(long, value_name = "F")]
    pub rates_factor: Option<f64>,
    /// Outer boundary: photosphere, eddington (or grey), hopf, krishna-swamy [default: the
    /// preset's].
    #[arg(long, value_name = "KIND")]
    pub atmosphere: Option<String>,
}

impl PhysicsFlags {
    /// The options these flags set (unset flags stay unset).
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
            atmosphere: self.atmosphere.clone(),
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
    /// The validated composition (X = 0.70, Z = 0.02 unless given) and the physics options.
    pub fn resolve(&self) -> Result<(Composition, PhysicsOptions)> {
        Ok((
            self.composition.composition(None, None)?,
            self.physics.options(),
        ))
    }
}

/// A number with six significant figures: plain between 1e-3 and 1e6, else in exponent form.
pub fn num(v: f64) -> String {
    let a = v.abs();
    if !v.is_finite() {
        "n/a".to_string()
    } else if a == 0.0 {
        "0".to_string()
    } else if (1e-3..1e6).contains(&a) {
        let decimals = (5 - a.log10().floor() as i32).clamp(0, 8) as usize;
        format!("{v:.decimals$}")
    } else {
        format!("{v:.5e}")
    }
}
