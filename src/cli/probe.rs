//! `starpoise probe`: every local physics quantity at one (rho, T).

use super::common::ModelArgs;
use super::io::out;
use super::Format;
use clap::Args;
use starpoise::output::meta::{Meta, Provenance, WithMeta};
use starpoise::output::ProbeReport;
use starpoise::{Error, Result};

/// Print pressure, thermodynamic derivatives, ionisation, opacities and energy generation at
/// one density and temperature.
#[derive(Debug, Clone, Args)]
pub struct ProbeArgs {
    /// Density rho, g/cm^3.
    #[arg(long, value_name = "RHO", value_parser = super::values::number, allow_hyphen_values = true)]
    pub density: f64,
    /// Temperature T, K.
    #[arg(long, value_name = "T", value_parser = super::values::number, allow_hyphen_values = true)]
    pub temperature: f64,
    /// Composition and physics.
    #[command(flatten)]
    pub model: ModelArgs,
    /// Output format.
    #[arg(long, value_enum, default_value_t = Format::Text)]
    pub format: Format,
}

/// Run the probe and print its report to standard output.
pub fn run(args: ProbeArgs) -> Result<()> {
    let (rho, t) = (args.density, args.temperature);
    if !(rho.is_finite() && rho > 0.0) {
        return Err(Error::invalid(
            "--density",
            rho,
            "the density must be a positive number of g/cm^3, e.g. --density 150",
        ));
    }
    if !(t.is_finite() && t > 0.0) {
        return Err(Error::invalid(
            "--temperature",
            t,
            "the temperature must be a positive number of K, e.g. --temperature 1.57e7",
        ));
    }
    let (comp, overrides) = args.model.resolve()?;
    let set = starpoise::physics::PhysicsSet::from_spec(&overrides.resolve()?)?;
    // A point outside a law's domain is bad input for this command (exit code 2).
    let report = ProbeReport::evaluate(rho, t, &comp, &set).map_err(|e| match e {
        Error::Physics(p) => Error::invalid(
            "--density/--temperature",
            format!("{rho:e} g/cm^3, {t:e} K"),
            &format!("outside the domain of the chosen physics: {p}"),
        ),
        other => other,
    })?;
    if let Some(name) = report.non_finite() {
        return Err(Error::invalid(
            "--density/--temperature",
            format!("{rho:e} g/cm^3, {t:e} K"),
            &format!(
                "outside the domain of the chosen physics: {name} is not a finite number there"
            ),
        ));
    }
    match args.format {
        Format::Text => out(&report.to_text()),
        Format::Json => {
            let meta = Meta::new(&Provenance::of_this_process(), "local physics at one point");
            let value = WithMeta::new(&report, &meta);
            let text = serde_json::to_string_pretty(&value).map_err(|e| Error::Io {
                path: "<stdout>".to_string(),
                reason: e.to_string(),
            })?;
            out(&format!("{text}\n"))
        }
    }
}
