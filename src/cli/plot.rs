//! `starpoise plot FILE.csv`: redraw a figure from a saved profile or sequence table.

use super::figure::AbscissaArg;
use super::io::{err, Files};
use clap::Args;
use starpoise::output::plot::{hr_diagram, profile_plot, read_table, PlotInput};
use starpoise::{Error, Result};
use std::path::PathBuf;

/// Arguments of `starpoise plot`.
#[derive(Debug, Args)]
pub struct PlotArgs {
    /// A profile CSV (`zams --profile`) or a sequence CSV (`sequence --out`).
    #[arg(value_name = "FILE.csv")]
    input: PathBuf,
    /// The figure to write, SVG or PNG by its extension [default: the input's name with .svg].
    #[arg(long, value_name = "FILE.svg|FILE.png", allow_hyphen_values = true)]
    out: Option<PathBuf>,
    /// Figure title [default: the input's file name].
    #[arg(long)]
    title: Option<String>,
    /// The x axis of a profile figure [default: radius]; refused for a sequence table.
    #[arg(long, value_enum)]
    abscissa: Option<AbscissaArg>,
}

/// Run `starpoise plot`.
pub fn run(args: PlotArgs) -> Result<()> {
    let out = args
        .out
        .clone()
        .unwrap_or_else(|| args.input.with_extension("svg"));
    Files::default()
        .input("the table to draw", &args.input)
        .figure("--out", Some(&out))
        .check()?;
    let title = args.title.clone().unwrap_or_else(|| {
        args.input
            .file_name()
            .map_or_else(String::new, |n| n.to_string_lossy().into_owned())
    });
    match read_table(&args.input)? {
        PlotInput::Profile(rows) => {
            let abscissa = args.abscissa.map(Into::into).unwrap_or_default();
            profile_plot(&out, &rows, &title, abscissa)?;
        }
        PlotInput::Sequence(series) => {
            if let Some(a) = args.abscissa {
                return Err(Error::invalid(
                    "--abscissa",
                    starpoise::output::plot::Abscissa::from(a),
                    &format!(
                        "only for a profile table; {} is a sequence table (its figure is an HR diagram)",
                        args.input.display()
                    ),
                ));
            }
            hr_diagram(&out, &series, &title)?;
        }
    }
    err(&format!("starpoise: wrote {}\n", out.display()));
    Ok(())
}
