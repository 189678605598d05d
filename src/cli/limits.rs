//! `starpoise limits`: the hydrogen-burning minimum mass and the pulsational instability mass
//! for a composition and set of laws.

use super::common::ModelArgs;
use super::io::out;
use super::Format;
use clap::Args;
use starpoise::oscillation::pulsational_instability_mass;
use starpoise::output::limits::{limits_json, limits_text};
use starpoise::output::meta::Provenance;
use starpoise::output::zams::to_json_text;
use starpoise::physics::PhysicsSet;
use starpoise::structure::limits::hydrogen_burning_limit;
use starpoise::Result;

/// Find the lowest mass of a hydrogen-burning (zero-age main-sequence) star for a composition and
/// set of laws (the turning point of the ZAMS branch in mass, and the model there), and the mass
/// above which ZAMS stars are pulsationally unstable (the radial fundamental mode driven by
/// nuclear burning against radiative damping, quasi-adiabatic).
#[derive(Debug, Clone, Args)]
pub struct LimitsArgs {
    /// Composition and physics.
    #[command(flatten)]
    pub model: ModelArgs,
    /// Output format.
    #[arg(long, value_enum, default_value_t = Format::Text)]
    pub format: Format,
}

/// Run `starpoise limits`.
pub fn run(args: LimitsArgs) -> Result<()> {
    let (comp, overrides) = args.model.resolve()?;
    let physics = PhysicsSet::from_spec(&overrides.resolve()?)?;
    let limit = hydrogen_burning_limit(&comp, &physics)?;
    let pulsation = pulsational_instability_mass(&comp, &physics)?;
    match args.format {
        Format::Text => out(&limits_text(&limit, &pulsation)),
        Format::Json => out(&format!(
            "{}\n",
            to_json_text(&limits_json(
                &limit,
                &pulsation,
                &Provenance::of_this_process()
            ))?
        )),
    }
}
