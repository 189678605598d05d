//! The command line: clap argument structs turned into validated library inputs.
//! The library itself never depends on clap.

mod common;
mod compare;
mod modes;
mod plot;
mod polytrope;
mod probe;
mod sequence;
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
    /// Run the built-in published checks (constants, polytropes, microphysics, ZAMS figures).
    Verify(verify::VerifyArgs),
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

/// Run one parsed command line.
pub fn run(cli: Cli) -> Result<()> {
    match cli.command {
        Command::Zams(args) => zams::run(*args),
        Command::Polytrope(args) => polytrope::run(args),
        Command::Sequence(args) => sequence::run(*args),
        Command::Compare(args) => compare::run(*args),
        Command::Merge(args) => sequence::run_merge(args),
        Command::Plot(args) => plot::run(args),
        Command::Modes(args) => modes::run(args),
        Command::Probe(args) => probe::run(args),
        Command::Verify(args) => verify::run(args),
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
