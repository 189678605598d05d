//! `starpoise polytrope`: a Lane–Emden polytrope, optionally scaled to a star.

use super::io::Files;
use super::Format;
use clap::Args;
use starpoise::error::{Error, Result};
use starpoise::output::meta::{Meta, Provenance, WithMeta};
use starpoise::output::polytrope::{
    profile_meta, write_profile, PolytropeSummary, POLYTROPE_CONTENT,
};
use starpoise::polytrope::{
    scale_to_star, solve_lane_emden, validate_index, validate_scaling, LaneEmdenSettings,
    StarParameters, DEFAULT_MU,
};
use std::path::PathBuf;

/// Arguments of `starpoise polytrope`, as parsed.
#[derive(Debug, Args)]
pub struct PolytropeArgs {
    /// Polytropic index n, a number in [0, 5].
    #[arg(long, value_parser = super::values::number, allow_hyphen_values = true)]
    index: f64,
    /// Scale to a star of this mass, in solar masses (needs --radius).
    #[arg(long, requires = "radius", value_parser = super::values::number, allow_hyphen_values = true)]
    mass: Option<f64>,
    /// Radius of the star, in nominal solar radii (needs --mass).
    #[arg(long, requires = "mass", value_parser = super::values::number, allow_hyphen_values = true)]
    radius: Option<f64>,
    /// Mean molecular weight for the central temperature [default: 0.61, fully ionised gas of
    /// roughly solar composition] (needs --mass and --radius).
    #[arg(long, requires = "mass", value_parser = super::values::number, allow_hyphen_values = true)]
    mu: Option<f64>,
    /// Eddington's standard model: include radiation pressure with constant
    /// beta = P_gas/P (n = 3 only; needs --mass and --radius).
    #[arg(long)]
    radiation: bool,
    /// Output format of the summary on stdout.
    #[arg(long, value_enum, default_value_t)]
    format: Format,
    /// Also write the profile to this file: CSV; JSON if it ends in .json; ECSV if in .ecsv
    /// (written atomically; `-` for standard output, as CSV).
    #[arg(long, value_name = "FILE.csv", allow_hyphen_values = true)]
    profile: Option<PathBuf>,
    /// Number of profile points from the centre to the surface inclusive (2 to 1000000).
    #[arg(long, default_value_t = 200, value_parser = super::values::polytrope_points, allow_hyphen_values = true)]
    points: usize,
}

/// A checked `polytrope` request: every value validated before anything is computed or
/// written.
#[derive(Debug)]
struct PolytropeRequest {
    index: f64,
    settings: LaneEmdenSettings,
    star: Option<StarParameters>,
    radiation: bool,
    format: Format,
    profile: Option<PathBuf>,
}

impl TryFrom<PolytropeArgs> for PolytropeRequest {
    type Error = Error;

    fn try_from(args: PolytropeArgs) -> Result<Self> {
        let index = validate_index(args.index)?;
        let settings = LaneEmdenSettings::default().with_points(args.points)?;
        let star = match (args.mass, args.radius) {
            (Some(mass), Some(radius)) => Some(StarParameters::new(
                mass,
                radius,
                args.mu.unwrap_or(DEFAULT_MU),
            )?),
            (None, None) => None,
            (Some(_), None) => {
                return Err(Error::invalid(
                    "--radius",
                    "(missing)",
                    "--mass needs --radius, e.g. --mass 1 --radius 1",
                ))
            }
            (None, Some(_)) => {
                return Err(Error::invalid(
                    "--mass",
                    "(missing)",
                    "--radius needs --mass, e.g. --mass 1 --radius 1",
                ))
            }
        };
        if star.is_some() || args.radiation {
            validate_scaling(index, args.radiation)?;
        }
        if args.radiation && star.is_none() {
            return Err(Error::invalid(
                "--radiation",
                "without --mass and --radius",
                "Eddington's standard model needs the star: add --mass and --radius",
            ));
        }
        Ok(Self {
            index,
            settings,
            star,
            radiation: args.radiation,
            format: args.format,
            profile: args.profile,
        })
    }
}

/// Run `starpoise polytrope`: validate, solve, write the profile if asked, print the summary.
pub fn run(args: PolytropeArgs) -> Result<()> {
    let request = PolytropeRequest::try_from(args)?;
    let channel = Files::default()
        .text("--profile", request.profile.as_deref())
        .check()?;
    let solution = solve_lane_emden(request.index, &request.settings)?;
    let scaled = match &request.star {
        Some(star) => Some(scale_to_star(&solution, star, request.radiation)?),
        None => None,
    };
    let summary = PolytropeSummary::new(&solution, scaled.as_ref());
    if let (Some((key, what)), Some(star)) = (summary.non_finite(), &request.star) {
        return Err(Error::invalid(
            "--mass/--radius",
            format!("{:e} M_sun, {:e} R_sun", star.mass_msun(), star.radius_rsun()),
            &format!(
                "{what} ({key}) of this star is not a finite number in cgs units (overflow or underflow); give a mass and radius of stellar size, e.g. --mass 1 --radius 1"
            ),
        ));
    }
    let provenance = Provenance::of_this_process();
    if let Some(path) = &request.profile {
        let meta = profile_meta(&Meta::new(&provenance, POLYTROPE_CONTENT), &summary);
        write_profile(path, &solution, scaled.as_ref(), &meta)?;
    }
    match request.format {
        Format::Text => channel.print(&summary.to_text()),
        Format::Json => {
            let meta = Meta::new(&provenance, "Lane-Emden polytrope summary");
            let value = WithMeta::new(&summary, &meta);
            let json = serde_json::to_string_pretty(&value).map_err(|e| Error::Io {
                path: "stdout".to_string(),
                reason: e.to_string(),
            })?;
            channel.print(&format!("{json}\n"))
        }
    }
}
