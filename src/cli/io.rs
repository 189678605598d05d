//! Printing and outputs of the commands: standard output goes through the library's writer (a
//! closed pipe ends the program quietly, never a panic), standard error ignores failures, and a
//! command's summary moves to standard error when one of its outputs took standard output.

use starpoise::output::{check_outputs, Destination, OutputKind};
use starpoise::Result;
use std::io::Write;
use std::path::Path;

/// Print `text` on standard output.
pub fn out(text: &str) -> Result<()> {
    starpoise::output::print_stdout(text)
}

/// Print `text` on standard error; a closed standard error is ignored.
pub fn err(text: &str) {
    let _ = std::io::stderr().write_all(text.as_bytes());
}

/// Where a command prints what it prints for people (its summary or table).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Channel {
    /// Standard output (the default).
    Stdout,
    /// Standard error: an output file was given as `-` and owns standard output.
    Stderr,
}

impl Channel {
    /// Print `text` on this channel.
    pub fn print(self, text: &str) -> Result<()> {
        match self {
            Channel::Stdout => out(text),
            Channel::Stderr => {
                err(text);
                Ok(())
            }
        }
    }
}

/// The inputs and outputs of one command, checked together before anything is computed.
#[derive(Debug, Default)]
pub struct Files<'a> {
    inputs: Vec<(String, &'a Path)>,
    outputs: Vec<(&'static str, &'a Path, OutputKind)>,
}

impl<'a> Files<'a> {
    /// A file the command reads, described as `what` in messages (e.g. `the model file
    /// (--model)`).
    pub fn input(&mut self, what: impl Into<String>, path: &'a Path) -> &mut Self {
        self.inputs.push((what.into(), path));
        self
    }

    /// A text output given with `flag`, if any.
    pub fn text(&mut self, flag: &'static str, path: Option<&'a Path>) -> &mut Self {
        if let Some(p) = path {
            self.outputs.push((flag, p, OutputKind::Text));
        }
        self
    }

    /// A figure given with `flag`, if any.
    pub fn figure(&mut self, flag: &'static str, path: Option<&'a Path>) -> &mut Self {
        if let Some(p) = path {
            self.outputs.push((flag, p, OutputKind::Figure));
        }
        self
    }

    /// Check every output (see [`check_outputs`]); figures must also name their format. The
    /// channel for the summary: standard error if an output goes to standard output.
    pub fn check(&self) -> Result<Channel> {
        for (flag, path, kind) in &self.outputs {
            if *kind == OutputKind::Figure {
                starpoise::output::plot::check_figure_path(flag, path)?;
            }
        }
        let inputs: Vec<(&str, &Path)> =
            self.inputs.iter().map(|(w, p)| (w.as_str(), *p)).collect();
        let destinations = check_outputs(&inputs, &self.outputs)?;
        Ok(if destinations.iter().any(Destination::is_stdout) {
            Channel::Stderr
        } else {
            Channel::Stdout
        })
    }
}
