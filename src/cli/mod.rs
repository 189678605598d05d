//! The command line: clap argument structs turned into validated library inputs.
//! The library itself never depends on clap.

use clap::{Parser, Subcommand, ValueEnum};
use starpoise::Result;

pub mod common;
pub mod probe;

/// Zero-age main-sequence stellar interiors by fitting-point shooting.
#[derive(Debug, Parser)]
#[command(name = "starpoise", version, about, long_about = None)]
pub struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Debug, Subcommand)]
enum Command {
    /// Evaluate every physics law at one density and temperature.
    Probe(probe::ProbeArgs),
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
        Command::Probe(args) => probe::run(args),
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
