//! `starpoise zams`: one zero-age main-sequence model.

use super::common::{CompositionFlags, PhysicsFlags};
use super::io::{err, Files};
use super::model_file::ModelFile;
use super::{values, Format};
use clap::{Args, ValueEnum};
use starpoise::output::meta::{Meta, Provenance};
use starpoise::output::zams::{
    failure_json, profile_meta, summary_json, text_summary, to_json_text, with_meta, write_profile,
};
use starpoise::output::TableFormat;
use starpoise::structure::{profile::check_profile_points, solve, ZamsSettings};
use starpoise::structure::{ProfileGrid, DEFAULT_PROFILE_POINTS};
use starpoise::{Error, Result};
use std::path::PathBuf;

/// Arguments of `starpoise zams`.
#[derive(Debug, Args)]
pub struct ZamsArgs {
    /// Stellar mass in solar masses.
    #[arg(long, value_name = "MSUN", help = mass_help(), value_parser = values::number, allow_hyphen_values = true)]
    mass: Option<f64>,
    #[command(flatten)]
    composition: CompositionFlags,
    #[command(flatten)]
    physics: PhysicsFlags,
    /// Fitting mass as a fraction of M [default: 0.4].
    #[arg(long, value_name = "FRACTION", value_parser = values::number, allow_hyphen_values = true)]
    fit_mass: Option<f64>,
    /// Finest integrator tolerance [default: 1e-11; range 1e-13 to 1e-6].
    #[arg(long, value_name = "TOL", value_parser = values::number, allow_hyphen_values = true)]
    tolerance: Option<f64>,
    /// Maximum Newton iterations [default: 60; range 1 to 500].
    #[arg(long, value_name = "N", value_parser = values::max_iterations, allow_hyphen_values = true)]
    max_iterations: Option<usize>,
    /// Output format of the summary.
    #[arg(long, value_enum, default_value_t = Format::Text)]
    format: Format,
    /// Write the profile to this file (atomically; `-` for standard output).
    #[arg(long, value_name = "FILE", allow_hyphen_values = true)]
    profile: Option<PathBuf>,
    /// Format of the profile file [default: by the extension: .json JSON, .ecsv ECSV, else
    /// CSV].
    #[arg(long, value_enum)]
    profile_format: Option<ProfileFileFormat>,
    /// Draw the profile (T, rho, P, L, m and the gradients against r/R, m/M or log P) to this
    /// figure, SVG or PNG by its extension.
    #[arg(long, value_name = "FILE.svg|FILE.png")]
    plot: Option<PathBuf>,
    /// The x axis of the --plot figure [default: radius].
    #[arg(long, value_enum, requires = "plot")]
    abscissa: Option<super::figure::AbscissaArg>,
    /// Number of profile rows [default: 400; range 10 to 100000].
    #[arg(long, value_name = "K", value_parser = values::profile_points, allow_hyphen_values = true)]
    points: Option<usize>,
    /// Where the profile's rows go: auto (balanced between the integrator's steps, equal
    /// radius and equal mass), radius (uniform in r) or mass (uniform in m); centre first,
    /// photosphere last.
    #[arg(long, value_enum, default_value_t = GridArg::Auto)]
    grid: GridArg,
    /// Read the model's settings from this JSON model file; flags override it.
    #[arg(long, value_name = "FILE")]
    model: Option<PathBuf>,
    /// Starting guesses: central pressure (dyn/cm^2), central temperature (K), radius (R_sun),
    /// luminosity (L_sun); all four together.
    #[arg(long, value_names = ["PC", "TC", "RSUN", "LSUN"], num_args = 4, value_parser = values::number, allow_hyphen_values = true)]
    guess: Option<Vec<f64>>,
}

/// The help of `--mass`, from the library's bounds.
fn mass_help() -> String {
    let (lo, hi) = starpoise::structure::MASS_RANGE_MSUN;
    let (vlo, vhi) = starpoise::structure::model::REFINED_VALIDATED_MASS_RANGE_MSUN;
    let limit = starpoise::structure::limits::tabulated_refined_limit_msun(0.70, 0.02)
        .map_or_else(String::new, |m| format!(", {m:.3} at X = 0.70, Z = 0.02"));
    format!(
        "Stellar mass in solar masses ({lo}–{hi}; the refined set is compared with measured stars over {vlo}–{vhi} and refuses masses below its hydrogen-burning limit{limit}: see `starpoise limits`)"
    )
}

/// Profile file format.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum ProfileFileFormat {
    /// Comma-separated values: `#` metadata lines, then a header row.
    Csv,
    /// One JSON object {meta, columns, units, rows}.
    Json,
    /// ECSV 1.0 (astropy's Enhanced CSV, with units and metadata).
    Ecsv,
}

/// The profile grid (see [`ProfileGrid`]).
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum GridArg {
    /// Balanced: a third each of equal steps in r/R, in m/M and in the integrator's steps.
    Auto,
    /// Uniform in radius, for codes on a radial grid.
    Radius,
    /// Uniform in mass, for particle codes.
    Mass,
}

impl From<GridArg> for ProfileGrid {
    fn from(g: GridArg) -> Self {
        match g {
            GridArg::Auto => ProfileGrid::Auto,
            GridArg::Radius => ProfileGrid::Radius,
            GridArg::Mass => ProfileGrid::Mass,
        }
    }
}

impl From<ProfileFileFormat> for TableFormat {
    fn from(f: ProfileFileFormat) -> Self {
        match f {
            ProfileFileFormat::Csv => TableFormat::Csv,
            ProfileFileFormat::Json => TableFormat::Json,
            ProfileFileFormat::Ecsv => TableFormat::Ecsv,
        }
    }
}

impl ZamsArgs {
    /// Validated settings: model file first, flags over it; and the number of profile rows.
    fn settings(&self, file: &ModelFile) -> Result<(ZamsSettings, usize)> {
        let mut settings = file.zams_settings(
            self.mass,
            &self.composition,
            &self.physics,
            self.fit_mass,
            self.tolerance,
        )?;
        if let Some(n) = self.max_iterations {
            settings = settings.with_max_iterations(n)?;
        }
        if let Some(g) = &self.guess {
            settings = settings.with_guess(g[0], g[1], g[2], g[3])?;
        }
        let points = check_profile_points(
            self.points
                .or(file.points)
                .unwrap_or(DEFAULT_PROFILE_POINTS),
        )?;
        Ok((settings, points))
    }
}

/// Run `starpoise zams`.
pub fn run(args: ZamsArgs) -> Result<()> {
    let file = match &args.model {
        Some(p) => ModelFile::read(p)?,
        None => ModelFile::default(),
    };
    let (settings, points) = args.settings(&file)?;
    let spec = settings.physics().spec().clone();
    let mut files = Files::default();
    if let Some(p) = &args.model {
        files.input("the model file (--model)", p);
    }
    for table in spec.input_files() {
        files.input("the opacity table", table);
    }
    let channel = files
        .text("--profile", args.profile.as_deref())
        .figure("--plot", args.plot.as_deref())
        .check()?;
    let provenance = Provenance::of_this_process().with_model(file.name.clone(), file.note.clone());
    let summary_meta = Meta::new(&provenance, "ZAMS model summary");
    let model = match solve(&settings) {
        Ok(m) => m,
        Err(Error::NoConvergence(failure)) => {
            err(&starpoise::output::zams::failure_text(&failure));
            if args.format == Format::Json {
                let json = with_meta(failure_json(&settings, &failure), &summary_meta);
                channel.print(&format!("{}\n", to_json_text(&json)?))?;
            }
            return Err(Error::NoConvergence(failure));
        }
        Err(e) => return Err(e),
    };
    if args.profile.is_some() || args.plot.is_some() {
        let rows = model.profile_on(args.grid.into(), points)?;
        if let Some(path) = &args.profile {
            let format = args
                .profile_format
                .map_or_else(|| TableFormat::from_path(path), Into::into);
            write_profile(path, &rows, format, &profile_meta(&provenance, &model))?;
        }
        if let Some(path) = &args.plot {
            let c = model.composition();
            let title = format!(
                "ZAMS model, {} M_sun, X = {}, Z = {}",
                model.mass_msun(),
                c.x(),
                c.z()
            );
            let abscissa = args.abscissa.map(Into::into).unwrap_or_default();
            starpoise::output::plot::profile_plot(path, &rows, &title, abscissa)?;
        }
    }
    for w in &model.warnings {
        err(&format!("starpoise: warning: {w}\n"));
    }
    match args.format {
        Format::Json => channel.print(&format!(
            "{}\n",
            to_json_text(&with_meta(summary_json(&model), &summary_meta))?
        )),
        Format::Text => channel.print(&text_summary(&model)),
    }
}
