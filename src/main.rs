//! The `starpoise` command: parse, call the library, print.

mod cli;

use clap::Parser;

fn main() {
    let args = cli::Cli::parse();
    if let Err(e) = cli::run(args) {
        eprintln!("starpoise: error: {e}");
        std::process::exit(e.exit_code() as i32);
    }
}
