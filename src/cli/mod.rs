//! The command line: clap argument structs turned into validated library inputs.
//! The library itself never depends on clap.

mod common;
mod compare;
mod completions;
mod figure;
mod io;
mod limits;
mod model_file;
mod modes;
mod plot;
mod polytrope;
mod probe;
mod sequence;
mod values;
mod verify;
mod zams;

use clap::{Parser, Subcommand, ValueEnum};
use starpoise::Result;

/// Zero-age main-sequence stellar interiors by fitting-point shooting.
#[derive(Debug, Parser)]
#[command(name = "starpoise", version, about, long_about = None)]
pub struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Debug, Subcommand)]
enum Command {
    /// Build one zero-age main-sequence model of the given mass.
    #[command(allow_negative_numbers = true)]
    Zams(Box<zams::ZamsArgs>),
    /// Solve a grid of ZAMS models (masses x compositions x physics variants) in parallel.
    #[command(allow_negative_numbers = true)]
    Sequence(Box<sequence::SequenceArgs>),
    /// Solve the same masses under several physics variants and compare them with the first.
    #[command(allow_negative_numbers = true)]
    Compare(Box<compare::CompareArgs>),
    /// Join the outputs of the shards of one grid into one table.
    Merge(sequence::MergeArgs),
    /// Redraw a figure (profile or HR diagram) from a saved CSV table.
    Plot(plot::PlotArgs),
    /// Solve a Lane–Emden polytrope of index n, optionally scaled to a star.
    Polytrope(polytrope::PolytropeArgs),
    /// Oscillation modes (radial, p, f, g) of a polytrope, dimensionless.
    #[command(allow_negative_numbers = true)]
    Modes(modes::ModesArgs),
    /// Evaluate every physics law at one density and temperature.
    Probe(probe::ProbeArgs),
    /// Find the hydrogen-burning minimum mass and the pulsational instability mass for a
    /// composition and set of laws.
    Limits(limits::LimitsArgs),
    /// Run the built-in published checks (constants, polytropes, microphysics, ZAMS figures).
    Verify(verify::VerifyArgs),
    /// Write a shell completion script to standard output.
    Completions(completions::CompletionsArgs),
}

/// Output format of a summary.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum, Default)]
pub enum Format {
    /// Aligned text with units, for people.
    #[default]
    Text,
    /// One JSON object.
    Json,
}

/// The command-line flag of a library key, for messages (the library names keys, not flags).
fn flag_of(sequence: bool, compare: bool, key: &str) -> Option<&'static str> {
    Some(match key {
        "mass_msun" if sequence => "--masses",
        "mass_msun" => "--mass",
        "masses" if sequence => "--masses",
        "x" => "--x",
        "z" => "--z",
        "x + z" => "--x + --z",
        "index" => "--index",
        "radius_rsun" => "--radius",
        "mu" => "--mu",
        "radiation" => "--radiation",
        "fit_mass_fraction" => "--fit-mass",
        "tolerance" => "--tolerance",
        "max_iterations" => "--max-iterations",
        "points" => "--points",
        "degrees" => "--degrees",
        "preset" => "--preset",
        "eos" => "--eos",
        "opacity" => "--opacity",
        "opacity_factor" => "--opacity-factor",
        "rates" => "--rates",
        "rates_factor" => "--rates-factor",
        "convection" => "--convection",
        "alpha" => "--alpha",
        "atmosphere" => "--atmosphere",
        "variant" => "--variant",
        "threads" => "--threads",
        "fit_ranges" => "--fit-ranges",
        "shard" => "--shard",
        "masses" if compare => "--mass",
        "files" => "FILES",
        "guess central pressure (dyn/cm^2)" => "--guess PC",
        "guess central temperature (K)" => "--guess TC",
        "guess radius (R_sun)" => "--guess RSUN",
        "guess luminosity (L_sun)" => "--guess LSUN",
        "grid size" => "--masses x --x x --z x --variant",
        "gamma1" => "--gamma1",
        "degree" => "--degrees",
        "max_order" => "--max-order",
        _ => return None,
    })
}

/// Run one parsed command line; errors name the flags of this command line.
pub fn run(cli: Cli) -> Result<()> {
    let sequence = matches!(cli.command, Command::Sequence(_));
    let compare = matches!(cli.command, Command::Compare(_));
    dispatch(cli.command).map_err(|e| match e {
        starpoise::Error::InvalidInput {
            name,
            value,
            allowed,
        } => starpoise::Error::InvalidInput {
            name: flag_of(sequence, compare, &name).map_or(name, String::from),
            value,
            allowed,
        },
        other => other,
    })
}

fn dispatch(command: Command) -> Result<()> {
    match command {
        Command::Zams(args) => zams::run(*args),
        Command::Polytrope(args) => polytrope::run(args),
        Command::Sequence(args) => sequence::run(*args),
        Command::Compare(args) => compare::run(*args),
        Command::Merge(args) => sequence::run_merge(args),
        Command::Plot(args) => plot::run(args),
        Command::Modes(args) => modes::run(args),
        Command::Probe(args) => probe::run(args),
        Command::Limits(args) => limits::run(args),
        Command::Verify(args) => verify::run(args),
        Command::Completions(args) => completions::run(&args),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use clap::CommandFactory;

    #[test]
    fn command_line_definition_is_consistent() {
        Cli::command().debug_assert();
    }
}
