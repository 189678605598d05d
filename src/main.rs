//! The `starpoise` command: parse, call the library, print.

mod cli;

use clap::Parser;
use starpoise::Error;

/// On SIGINT, SIGTERM or SIGHUP: remove the temporary files of writes in progress, then end as
/// the signal would have (the usual exit status, e.g. 130 for SIGINT in a shell).
fn remove_temporary_files_on_signals() {
    use signal_hook::consts::{SIGHUP, SIGINT, SIGTERM};
    let Ok(mut signals) = signal_hook::iterator::Signals::new([SIGINT, SIGTERM, SIGHUP]) else {
        return;
    };
    std::thread::spawn(move || {
        if let Some(signal) = signals.forever().next() {
            end_by_signal(signal);
        }
    });
}

/// Remove the temporary files and end the process by `signal`'s default action, holding the
/// register of temporary files so that none is created or renamed meanwhile.
fn end_by_signal(signal: i32) -> ! {
    let _held = starpoise::output::pending::remove_all();
    let _ = signal_hook::low_level::emulate_default_handler(signal);
    std::process::exit(128 + signal);
}

fn main() {
    remove_temporary_files_on_signals();
    let args = cli::Cli::parse();
    match cli::run(args) {
        Ok(()) => {}
        // The reader of standard output went away (`| head`): end quietly, as a filter killed
        // by SIGPIPE does.
        Err(Error::OutputClosed { .. }) => end_by_signal(signal_hook::consts::SIGPIPE),
        Err(e) => {
            use std::io::Write;
            let _ = writeln!(std::io::stderr(), "starpoise: error: {e}");
            std::process::exit(e.exit_code() as i32);
        }
    }
}
