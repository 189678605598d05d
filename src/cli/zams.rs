//! `starpoise zams`: one zero-age main-sequence model.

use super::common::{CompositionFlags, PhysicsFlags};
use super::model_file::ModelFile;
use super::Format;
use clap::{Args, ValueEnum};
use starpoise::output::check_output_path;
use starpoise::output::zams::{
    failure_json, summary_json, text_summary, to_json_text, write_profile, ProfileFormat,
};
use starpoise::structure::{profile::check_profile_points, solve, ZamsSettings};
use starpoise::structure::{ProfileGrid, DEFAULT_PROFILE_POINTS};
use starpoise::{Error, Result};
use std::path::PathBuf;

/// Arguments of `starpoise zams`.
#[derive(Debug, Args)]
pub struct ZamsArgs {
    /// Stellar mass in solar masses.
    #[arg(long, value_name = "MSUN", help = mass_help())]
    mass: Option<f64>,
    #[command(flatten)]
    composition: CompositionFlags,
    #[command(flatten)]
    physics: PhysicsFlags,
    /// Fitting mass as a fraction of M [default: 0.4].
    #[arg(long, value_name = "FRACTION")]
    fit_mass: Option<f64>,
    /// Finest integrator tolerance [default: 1e-11].
    #[arg(long, value_name = "TOL")]
    tolerance: Option<f64>,
    /// Maximum Newton iterations [default: 60].
    #[arg(long, value_name = "N")]
    max_iterations: Option<usize>,
    /// Output format of the summary.
    #[arg(long, value_enum, default_value_t = Format::Text)]
    format: Format,
    /// Write the profile to this file (atomically).
    #[arg(long, value_name = "FILE")]
    profile: Option<PathBuf>,
    /// Format of the profile file.
    #[arg(long, value_enum, default_value_t = ProfileFileFormat::Csv)]
    profile_format: ProfileFileFormat,
    /// Draw the profile (T, rho, P, L, m and the gradients against r/R, m/M or log P) to this
    /// figure, SVG or PNG by its extension.
    #[arg(long, value_name = "FILE.svg|FILE.png")]
    plot: Option<PathBuf>,
    /// The x axis of the --plot figure [default: radius].
    #[arg(long, value_enum, requires = "plot")]
    abscissa: Option<super::figure::AbscissaArg>,
    /// Number of profile rows [default: 400].
    #[arg(long, value_name = "K")]
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
    #[arg(long, value_names = ["PC", "TC", "RSUN", "LSUN"], num_args = 4)]
    guess: Option<Vec<f64>>,
}

/// The help of `--mass`, from the library's bounds.
fn mass_help() -> String {
    let (lo, hi) = starpoise::structure::MASS_RANGE_MSUN;
    let (vlo, vhi) = starpoise::structure::model::REFINED_VALIDATED_MASS_RANGE_MSUN;
    format!(
        "Stellar mass in solar masses ({lo}–{hi}; the refined set is compared with measured stars over {vlo}–{vhi} and refuses masses below its hydrogen-burning limit, about 0.07 at solar composition: see `starpoise limits`)"
    )
}

/// Profile file format.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum ProfileFileFormat {
    /// Comma-separated values with a header row.
    Csv,
    /// A JSON array of row objects.
    Json,
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

impl From<ProfileFileFormat> for ProfileFormat {
    fn from(f: ProfileFileFormat) -> Self {
        match f {
            ProfileFileFormat::Csv => ProfileFormat::Csv,
            ProfileFileFormat::Json => ProfileFormat::Json,
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
    if let Some(p) = &args.profile {
        check_output_path("--profile", p)?;
    }
    if let Some(p) = &args.plot {
        starpoise::output::plot::check_figure_path("--plot", p)?;
    }
    let model = match solve(&settings) {
        Ok(m) => m,
        Err(Error::NoConvergence(failure)) => {
            eprint!("{}", starpoise::output::zams::failure_text(&failure));
            if args.format == Format::Json {
                println!("{}", to_json_text(&failure_json(&settings, &failure))?);
            }
            return Err(Error::NoConvergence(failure));
        }
        Err(e) => return Err(e),
    };
    if args.profile.is_some() || args.plot.is_some() {
        let rows = model.profile_on(args.grid.into(), points)?;
        if let Some(path) = &args.profile {
            write_profile(path, &rows, args.profile_format.into())?;
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
        eprintln!("starpoise: warning: {w}");
    }
    match args.format {
        Format::Json => println!("{}", to_json_text(&summary_json(&model))?),
        Format::Text => print!("{}", text_summary(&model)),
    }
    Ok(())
}
