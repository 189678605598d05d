//! `starpoise completions SHELL`: a completion script for the shell, on standard output.

use super::Cli;
use clap::{Args, CommandFactory};
use clap_complete::Shell;
use starpoise::{Error, Result};

/// Arguments of `starpoise completions`.
#[derive(Debug, Args)]
pub struct CompletionsArgs {
    /// The shell to complete for. Install e.g. with
    /// `starpoise completions bash > ~/.local/share/bash-completion/completions/starpoise`,
    /// `starpoise completions zsh > ~/.zfunc/_starpoise` (with ~/.zfunc in fpath), or
    /// `starpoise completions fish > ~/.config/fish/completions/starpoise.fish`.
    #[arg(value_enum)]
    shell: Shell,
}

/// The completion script for `shell`.
pub fn script(shell: Shell) -> Vec<u8> {
    let mut command = Cli::command();
    let mut out = Vec::new();
    clap_complete::generate(shell, &mut command, "starpoise", &mut out);
    out
}

/// Run `starpoise completions`.
pub fn run(args: &CompletionsArgs) -> Result<()> {
    let script = String::from_utf8(script(args.shell)).map_err(|e| Error::Io {
        path: "standard output".to_string(),
        reason: format!("the completion script is not UTF-8: {e}"),
    })?;
    super::io::out(&script)
}
