//! `starpoise plot FILE.csv`: redraw a figure from a saved profile or sequence table.

use clap::Args;
use starpoise::output::plot::{hr_diagram, profile_plot, read_table, PlotInput};
use starpoise::Result;
use std::path::PathBuf;

/// Arguments of `starpoise plot`.
#[derive(Debug, Args)]
pub struct PlotArgs {
    /// A profile CSV (`zams --profile`) or a sequence CSV (`sequence --out`).
    #[arg(value_name = "FILE.csv")]
    input: PathBuf,
    /// The SVG to write [default: the input's name with .svg].
    #[arg(long, value_name = "FILE.svg")]
    out: Option<PathBuf>,
    /// Figure title [default: the input's file name].
    #[arg(long)]
    title: Option<String>,
}

/// Run `starpoise plot`.
pub fn run(args: PlotArgs) -> Result<()> {
    let out = args
        .out
        .clone()
        .unwrap_or_else(|| args.input.with_extension("svg"));
    starpoise::output::check_output_path("--out", &out)?;
    let title = args.title.clone().unwrap_or_else(|| {
        args.input
            .file_name()
            .map_or_else(String::new, |n| n.to_string_lossy().into_owned())
    });
    match read_table(&args.input)? {
        PlotInput::Profile(rows) => profile_plot(&out, &rows, &title)?,
        PlotInput::Sequence(series) => hr_diagram(&out, &series, &title)?,
    }
    eprintln!("starpoise: wrote {}", out.display());
    Ok(())
}
