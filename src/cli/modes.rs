//! `starpoise modes`: oscillation modes of a polytrope (dimensionless) or of a ZAMS model (also
//! in uHz, with the quasi-adiabatic growth rates of its radial modes).

use super::common::{CompositionFlags, PhysicsFlags};
use super::io::Files;
use super::model_file::ModelFile;
use super::Format;
use clap::{ArgGroup, Args};
use starpoise::error::{Error, Result};
use starpoise::oscillation::polytropic::GAMMA1_ALLOWED;
use starpoise::oscillation::search::{MAX_DEGREE, MAX_ORDER};
use starpoise::oscillation::{
    checked_degrees, find_modes_of_degrees, separation_frequency, star_modes, OscillationSettings,
    PolytropicModel, SeismicSummary, DEFAULT_PROFILE_ROWS,
};
use starpoise::output::meta::Provenance;
use starpoise::output::modes::{
    write_eigenfunctions_csv, zams_modes_report, ModesMeta, ModesReport, ModesRequestMeta,
};
use starpoise::polytrope::{solve_lane_emden, LaneEmdenSettings};
use starpoise::structure::{profile::check_profile_points, solve, ZamsModel, ZamsSettings};
use std::path::PathBuf;

/// Fewest Lane–Emden points accepted for an oscillation model.
const MIN_POINTS: usize = 50;
/// Most Lane–Emden points accepted.
const MAX_POINTS: usize = 100_000;
/// Default Lane–Emden points of a polytrope.
const POLYTROPE_POINTS: usize = 500;
/// Default Gamma_1 of a polytrope.
const POLYTROPE_GAMMA1: f64 = 5.0 / 3.0;

/// Arguments of `starpoise modes`, as parsed.
#[derive(Debug, Args)]
#[command(group(ArgGroup::new("equilibrium").required(true).args(["polytrope", "mass", "model"])))]
pub struct ModesArgs {
    /// Polytropic index n of a polytrope to oscillate, a number in [0, 5) (dimensionless
    /// frequencies).
    #[arg(long, value_parser = super::values::number, allow_hyphen_values = true, conflicts_with_all = ["mass", "model"])]
    polytrope: Option<f64>,
    /// Adiabatic exponent Gamma_1 of the polytrope, constant through it (above 4/3)
    /// [default: 5/3].
    #[arg(long, value_parser = super::values::number, allow_hyphen_values = true)]
    gamma1: Option<f64>,
    /// Mass in solar masses of a ZAMS model to oscillate, built with the composition and physics
    /// flags (frequencies also in uHz, growth rates of the radial modes).
    #[arg(long, value_name = "MSUN", value_parser = super::values::number, allow_hyphen_values = true)]
    mass: Option<f64>,
    #[command(flatten)]
    composition: CompositionFlags,
    #[command(flatten)]
    physics: PhysicsFlags,
    /// Read the ZAMS model's settings from this JSON model file (as `zams --model`); flags
    /// override it.
    #[arg(long, value_name = "FILE")]
    model: Option<PathBuf>,
    /// Spherical degrees, comma-separated (each 0 to 1000).
    #[arg(long, value_delimiter = ',', default_value = "0,1,2,3", value_parser = degree, allow_hyphen_values = true)]
    degrees: Vec<u32>,
    /// Highest order: radial and p modes up to n = K, g modes down to n = -K (1 to 1000).
    #[arg(long, default_value_t = 25, value_parser = max_order, allow_hyphen_values = true)]
    max_order: u32,
    /// Neglect the perturbation of the gravitational potential for l >= 1 (Cowling).
    #[arg(long)]
    cowling: bool,
    /// Output format on stdout.
    #[arg(long, value_enum, default_value_t)]
    format: Format,
    /// Also write every mode's eigenfunctions to this CSV file (written atomically; `-` for
    /// standard output).
    #[arg(long, value_name = "FILE.csv", allow_hyphen_values = true)]
    eigenfunctions: Option<PathBuf>,
    /// Profile points of the model: Lane–Emden points of a polytrope (50 to 100000, default
    /// 500) or profile rows of a ZAMS model (10 to 100000, default 2000).
    #[arg(long, value_parser = points, allow_hyphen_values = true)]
    points: Option<usize>,
}

/// The equilibrium model asked for.
#[derive(Debug)]
enum ModelKind {
    Polytrope { index: f64, gamma1: f64 },
    Zams(Box<ZamsSettings>),
}

/// A spherical degree of `--degrees` (the range is checked with the request).
fn degree(text: &str) -> std::result::Result<u32, String> {
    super::values::count_in(text, 0, MAX_DEGREE as usize)
        .map(|n| u32::try_from(n).unwrap_or(u32::MAX))
}

/// The highest order of `--max-order` (the range is checked with the request).
fn max_order(text: &str) -> std::result::Result<u32, String> {
    super::values::count_in(text, 1, MAX_ORDER as usize)
        .map(|n| u32::try_from(n).unwrap_or(u32::MAX))
}

/// The points of `--points` (the range of each kind of model is checked with the request).
fn points(text: &str) -> std::result::Result<usize, String> {
    super::values::count_in(text, starpoise::oscillation::zams::MIN_ROWS, MAX_POINTS).map_err(|e| {
        format!("{e} (a polytrope takes 50 to 100000 Lane–Emden points, a ZAMS model 10 to 100000 profile rows)")
    })
}

/// A checked `modes` request.
#[derive(Debug)]
struct ModesRequest {
    equilibrium: ModelKind,
    degrees: Vec<u32>,
    max_order: u32,
    settings: OscillationSettings,
    points: usize,
    format: Format,
    eigenfunctions: Option<PathBuf>,
    /// The model file read (an input no output may replace).
    model_file: Option<PathBuf>,
    provenance: Provenance,
}

impl TryFrom<ModesArgs> for ModesRequest {
    type Error = Error;

    fn try_from(args: ModesArgs) -> Result<Self> {
        let mut provenance = Provenance::of_this_process();
        let (equilibrium, points) = match args.polytrope {
            Some(index) => {
                if !(0.0..5.0).contains(&index) {
                    return Err(Error::invalid(
                        "--polytrope",
                        index,
                        "the polytropic index must be a number in [0, 5) (n = 5 has no \
                         surface), e.g. --polytrope 3",
                    ));
                }
                let gamma1 = args.gamma1.unwrap_or(POLYTROPE_GAMMA1);
                if !(gamma1.is_finite() && gamma1 > 4.0 / 3.0) {
                    return Err(Error::invalid("gamma1", gamma1, GAMMA1_ALLOWED));
                }
                if args.composition.x.is_some()
                    || args.composition.z.is_some()
                    || args.physics.overrides() != Default::default()
                {
                    return Err(Error::invalid(
                        "--polytrope",
                        index,
                        "composition and physics flags describe a ZAMS model (--mass); a \
                         polytrope takes --gamma1 only",
                    ));
                }
                let points = args.points.unwrap_or(POLYTROPE_POINTS);
                if !(MIN_POINTS..=MAX_POINTS).contains(&points) {
                    return Err(Error::invalid(
                        "--points",
                        points,
                        "the model needs from 50 to 100000 Lane–Emden points, e.g. --points 500",
                    ));
                }
                (ModelKind::Polytrope { index, gamma1 }, points)
            }
            None => {
                if let Some(g) = args.gamma1 {
                    return Err(Error::invalid(
                        "gamma1",
                        g,
                        "Gamma_1 is set for a polytrope (--polytrope N --gamma1 G); a ZAMS \
                         model's Gamma_1 comes from its equation of state",
                    ));
                }
                let file = match &args.model {
                    Some(p) => ModelFile::read(p)?,
                    None => ModelFile::default(),
                };
                provenance = provenance.with_model(file.name.clone(), file.note.clone());
                let settings =
                    file.zams_settings(args.mass, &args.composition, &args.physics, None, None)?;
                let points = check_profile_points(args.points.unwrap_or(DEFAULT_PROFILE_ROWS))?;
                (ModelKind::Zams(Box::new(settings)), points)
            }
        };
        let asked: Vec<i64> = args.degrees.iter().map(|&l| i64::from(l)).collect();
        let (degrees, max_order) = checked_degrees(&asked, i64::from(args.max_order))?;
        Ok(Self {
            equilibrium,
            degrees,
            max_order,
            settings: OscillationSettings::default()
                .with_cowling(args.cowling)
                .with_eigenfunctions(args.eigenfunctions.is_some()),
            points,
            format: args.format,
            eigenfunctions: args.eigenfunctions,
            model_file: args.model,
            provenance,
        })
    }
}

/// Run `starpoise modes`: validate, build the model, find the modes (and, for a ZAMS model, the
/// growth rates of its radial modes), write the eigenfunctions if asked, print the report.
pub fn run(args: ModesArgs) -> Result<()> {
    let request = ModesRequest::try_from(args)?;
    let mut files = Files::default();
    if let Some(path) = &request.model_file {
        files.input("the model file (--model)", path);
    }
    let channel = files
        .text("--eigenfunctions", request.eigenfunctions.as_deref())
        .check()?;
    let report = match &request.equilibrium {
        ModelKind::Polytrope { index, gamma1 } => polytrope_report(&request, *index, *gamma1)?,
        ModelKind::Zams(settings) => zams_report(&request, settings)?,
    };
    match request.format {
        Format::Text => channel.print(&report.to_text()),
        Format::Json => {
            let json = serde_json::to_string_pretty(&report).map_err(|e| Error::Io {
                path: "stdout".to_string(),
                reason: e.to_string(),
            })?;
            channel.print(&format!("{json}\n"))
        }
    }
}

/// The meta object shared by both kinds of model.
fn meta(request: &ModesRequest, model: &'static str, frequency_unit: &'static str) -> ModesMeta {
    ModesMeta {
        provenance: request.provenance.clone(),
        model,
        polytropic_index: None,
        gamma1: None,
        star: None,
        degrees: request.degrees.clone(),
        max_order: request.max_order,
        cowling: request.settings.cowling(),
        profile_points: request.points,
        phase_per_step: request.settings.phase_per_step(),
        frequency_unit,
    }
}

fn polytrope_report(request: &ModesRequest, index: f64, gamma1: f64) -> Result<ModesReport> {
    let solution = solve_lane_emden(
        index,
        &LaneEmdenSettings::default().with_points(request.points)?,
    )?;
    let model = PolytropicModel::new(&solution, gamma1)?;
    let modes = find_modes_of_degrees(
        &model,
        &request.degrees,
        request.max_order,
        &request.settings,
    )?;
    if let Some(path) = &request.eigenfunctions {
        write_eigenfunctions_csv(path, &modes, &request.provenance)?;
    }
    let around = separation_frequency(&modes, request.max_order, None);
    let seismic = SeismicSummary::new(&model, &modes, around);
    let mut meta = meta(
        request,
        "polytrope",
        "sigma = omega sqrt(R^3/(G M)); cyclic nu sqrt(R^3/(G M)) = sigma/(2 pi)",
    );
    meta.polytropic_index = Some(index);
    meta.gamma1 = Some(gamma1);
    Ok(ModesReport::new(meta, &modes, &seismic, None))
}

fn zams_report(request: &ModesRequest, settings: &ZamsSettings) -> Result<ModesReport> {
    let model: ZamsModel = solve(settings)?;
    for w in &model.warnings {
        eprintln!("starpoise: warning: {w}");
    }
    let spectrum = star_modes(
        &model,
        request.points,
        &request.degrees,
        request.max_order,
        &request.settings,
    )?;
    if let Some(path) = &request.eigenfunctions {
        write_eigenfunctions_csv(path, &spectrum.modes, &request.provenance)?;
    }
    Ok(zams_modes_report(
        &model,
        &spectrum,
        ModesRequestMeta {
            provenance: request.provenance.clone(),
            degrees: request.degrees.clone(),
            max_order: request.max_order,
            cowling: request.settings.cowling(),
            profile_points: request.points,
            phase_per_step: request.settings.phase_per_step(),
        },
    ))
}
