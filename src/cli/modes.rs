//! `starpoise modes`: oscillation modes of a polytrope (dimensionless).

use super::io::Files;
use super::Format;
use clap::Args;
use starpoise::error::{Error, Result};
use starpoise::oscillation::polytropic::GAMMA1_ALLOWED;
use starpoise::oscillation::search::{MAX_DEGREE, MAX_ORDER};
use starpoise::oscillation::{
    find_modes, Mode, OscillationSettings, PolytropicModel, SeismicSummary,
};
use starpoise::output::meta::Provenance;
use starpoise::output::modes::{write_eigenfunctions_csv, ModesMeta, ModesReport};
use starpoise::polytrope::{solve_lane_emden, LaneEmdenSettings};
use std::path::PathBuf;

/// Fewest Lane–Emden points accepted for an oscillation model.
const MIN_POINTS: usize = 50;
/// Most Lane–Emden points accepted.
const MAX_POINTS: usize = 100_000;
/// Orders of the radial window below the highest computed where the separations are measured.
const SEPARATION_OFFSET: i32 = 3;

/// Arguments of `starpoise modes`, as parsed.
#[derive(Debug, Args)]
pub struct ModesArgs {
    /// Polytropic index n of the model, a number in [0, 5).
    #[arg(long, value_parser = super::values::number, allow_hyphen_values = true)]
    polytrope: f64,
    /// Adiabatic exponent Gamma_1, constant through the model (above 4/3).
    #[arg(long, default_value_t = 5.0 / 3.0, value_parser = super::values::number, allow_hyphen_values = true)]
    gamma1: f64,
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
    /// Lane–Emden profile points of the model (50 to 100000).
    #[arg(long, default_value_t = 500, value_parser = points, allow_hyphen_values = true)]
    points: usize,
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

/// The Lane–Emden points of `--points`.
fn points(text: &str) -> std::result::Result<usize, String> {
    super::values::count_in(text, MIN_POINTS, MAX_POINTS)
}

/// A checked `modes` request.
#[derive(Debug)]
struct ModesRequest {
    index: f64,
    gamma1: f64,
    degrees: Vec<u32>,
    max_order: u32,
    settings: OscillationSettings,
    points: usize,
    format: Format,
    eigenfunctions: Option<PathBuf>,
}

impl TryFrom<ModesArgs> for ModesRequest {
    type Error = Error;

    fn try_from(args: ModesArgs) -> Result<Self> {
        if !(0.0..5.0).contains(&args.polytrope) {
            return Err(Error::invalid(
                "--polytrope",
                args.polytrope,
                "the polytropic index must be a number in [0, 5) (n = 5 has no surface), e.g. \
                 --polytrope 3",
            ));
        }
        if !(args.gamma1.is_finite() && args.gamma1 > 4.0 / 3.0) {
            return Err(Error::invalid("gamma1", args.gamma1, GAMMA1_ALLOWED));
        }
        let mut degrees = args.degrees;
        degrees.sort_unstable();
        degrees.dedup();
        if let Some(&l) = degrees.iter().find(|&&l| l > MAX_DEGREE) {
            return Err(Error::invalid(
                "--degrees",
                l,
                "degrees are integers from 0 to 1000, e.g. --degrees 0,1,2,3",
            ));
        }
        if !(1..=MAX_ORDER).contains(&args.max_order) {
            return Err(Error::invalid(
                "--max-order",
                args.max_order,
                "the highest order must be an integer from 1 to 1000, e.g. --max-order 25",
            ));
        }
        if !(MIN_POINTS..=MAX_POINTS).contains(&args.points) {
            return Err(Error::invalid(
                "--points",
                args.points,
                "the model needs from 50 to 100000 Lane–Emden points, e.g. --points 500",
            ));
        }
        Ok(Self {
            index: args.polytrope,
            gamma1: args.gamma1,
            degrees,
            max_order: args.max_order,
            settings: OscillationSettings::default()
                .with_cowling(args.cowling)
                .with_eigenfunctions(args.eigenfunctions.is_some()),
            points: args.points,
            format: args.format,
            eigenfunctions: args.eigenfunctions,
        })
    }
}

/// Run `starpoise modes`: validate, build the model, find the modes, write the eigenfunctions
/// if asked, print the report.
pub fn run(args: ModesArgs) -> Result<()> {
    let request = ModesRequest::try_from(args)?;
    let channel = Files::default()
        .text("--eigenfunctions", request.eigenfunctions.as_deref())
        .check()?;
    let solution = solve_lane_emden(
        request.index,
        &LaneEmdenSettings::default().with_points(request.points)?,
    )?;
    let model = PolytropicModel::new(&solution, request.gamma1)?;
    let mut modes: Vec<Mode> = Vec::new();
    for &l in &request.degrees {
        modes.extend(find_modes(&model, l, request.max_order, &request.settings)?);
    }
    let provenance = Provenance::of_this_process();
    if let Some(path) = &request.eigenfunctions {
        write_eigenfunctions_csv(path, &modes, &provenance)?;
    }
    let around = separation_frequency(&modes, request.max_order);
    let seismic = SeismicSummary::new(&model, &modes, around);
    let meta = ModesMeta {
        provenance,
        model: "polytrope",
        polytropic_index: request.index,
        gamma1: request.gamma1,
        degrees: request.degrees.clone(),
        max_order: request.max_order,
        cowling: request.settings.cowling(),
        profile_points: request.points,
        phase_per_step: request.settings.phase_per_step(),
        frequency_unit: "sigma = omega sqrt(R^3/(G M)); cyclic nu sqrt(R^3/(G M)) = sigma/(2 pi)",
    };
    let report = ModesReport::new(meta, &modes, &seismic);
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

/// The cyclic frequency of the radial mode of order max_order - 3 (the highest radial mode if
/// fewer): where the separations are measured. `None` without radial modes.
fn separation_frequency(modes: &[Mode], max_order: u32) -> Option<f64> {
    let target = (max_order as i32 - SEPARATION_OFFSET).max(1);
    let radial = modes.iter().filter(|m| m.degree == 0);
    radial
        .clone()
        .find(|m| m.order == target)
        .or_else(|| radial.max_by_key(|m| m.order))
        .map(Mode::cyclic_frequency)
}
