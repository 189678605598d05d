//! `starpoise zams`: one zero-age main-sequence model.

use super::common::{num, CompositionFlags, PhysicsFlags};
use super::Format;
use clap::{Args, ValueEnum};
use serde::Deserialize;
use starpoise::output::zams::{ProfileRow, ZamsSummary};
use starpoise::output::{check_output_path, write_atomically};
use starpoise::physics::PhysicsOptions;
use starpoise::structure::{solve_detailed, ZamsOutcome, ZamsSettings};
use starpoise::{Error, Result};
use std::path::{Path, PathBuf};

/// Arguments of `starpoise zams`.
#[derive(Debug, Args)]
pub struct ZamsArgs {
    /// Stellar mass in solar masses (0.05–150).
    #[arg(long, value_name = "MSUN")]
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
    #[arg(long, value_enum, default_value_t = ProfileFormat::Csv)]
    profile_format: ProfileFormat,
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
    /// Read the model's settings from this JSON model file; flags override it.
    #[arg(long, value_name = "FILE")]
    model: Option<PathBuf>,
    /// Starting guesses: central pressure (dyn/cm^2), central temperature (K), radius (R_sun),
    /// luminosity (L_sun); all four together.
    #[arg(long, value_names = ["PC", "TC", "RSUN", "LSUN"], num_args = 4)]
    guess: Option<Vec<f64>>,
}

/// Profile file format.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum ProfileFormat {
    /// Comma-separated values with a header row.
    Csv,
    /// A JSON array of row objects.
    Json,
}

/// A model file: every setting `zams` takes, as JSON keys (all optional; `mass_msun` is needed
/// unless `--mass` is given). The law choices use the keys of [`PhysicsOptions`] (`physics`,
/// `eos`, `opacity`, `rates`, `convection`, `alpha`, `opacity_factor`, `rates_factor`,
/// `atmosphere`). Unknown keys are refused.
#[derive(Debug, Default, Deserialize)]
pub struct ModelFile {
    /// Free-text name of the star (informational; accepted so files can label themselves).
    #[allow(dead_code)]
    pub name: Option<String>,
    /// Free-text note (informational).
    #[allow(dead_code)]
    pub note: Option<String>,
    /// Mass, M_sun.
    pub mass_msun: Option<f64>,
    /// Hydrogen mass fraction.
    pub x: Option<f64>,
    /// Metal mass fraction.
    pub z: Option<f64>,
    /// Fitting mass fraction.
    pub fit_mass: Option<f64>,
    /// Profile rows.
    pub points: Option<usize>,
    /// The laws; its own `deny_unknown_fields` refuses any key no field takes.
    #[serde(flatten)]
    pub physics: PhysicsOptions,
}

impl ModelFile {
    /// Read and parse a model file; errors name the file and what is wrong.
    pub fn read(path: &Path) -> Result<Self> {
        let text = std::fs::read_to_string(path).map_err(|e| Error::BadFile {
            path: path.display().to_string(),
            reason: format!("cannot read the model file: {e}"),
        })?;
        let bad = |reason: String| Error::BadFile {
            path: path.display().to_string(),
            reason,
        };
        let value: serde_json::Value = serde_json::from_str(&text)
            .map_err(|e| bad(format!("not a valid model file (a JSON object with keys such as mass_msun, x, z, physics): {e}")))?;
        // serde cannot refuse unknown keys through a flattened field, so check them here.
        let allowed = Self::keys();
        if let Some(map) = value.as_object() {
            if let Some(k) = map.keys().find(|k| !allowed.contains(k)) {
                return Err(bad(format!(
                    "unknown key \"{k}\"; allowed keys: {}",
                    allowed.join(", ")
                )));
            }
        }
        serde_json::from_value(value).map_err(|e| bad(format!("not a valid model file: {e}")))
    }

    /// Every key a model file may hold: its own and those of [`PhysicsOptions`].
    fn keys() -> Vec<String> {
        let own = ["name", "note", "mass_msun", "x", "z", "fit_mass", "points"];
        let physics = serde_json::to_value(PhysicsOptions::default()).ok();
        let physics_keys = physics
            .as_ref()
            .and_then(|v| v.as_object())
            .into_iter()
            .flat_map(|m| m.keys().cloned());
        own.iter()
            .map(|k| k.to_string())
            .chain(physics_keys)
            .collect()
    }
}

impl ZamsArgs {
    /// Validated settings: model file first, flags over it.
    fn settings(&self) -> Result<ZamsSettings> {
        let file = match &self.model {
            Some(p) => ModelFile::read(p)?,
            None => ModelFile::default(),
        };
        let mass = self.mass.or(file.mass_msun).ok_or_else(|| {
            Error::invalid(
                "--mass",
                "(missing)",
                "give the stellar mass in solar masses, e.g. --mass 1",
            )
        })?;
        let comp = self.composition.composition(file.x, file.z)?;
        let physics = file
            .physics
            .overridden_by(&self.physics.options())
            .build()?;
        let mut settings = ZamsSettings::new(mass, comp, physics)?;
        if let Some(q) = self.fit_mass.or(file.fit_mass) {
            settings = settings.with_fit_mass_fraction(q)?;
        }
        if let Some(t) = self.tolerance {
            settings = settings.with_tolerance(t)?;
        }
        if let Some(k) = self.points.or(file.points) {
            settings = settings.with_profile_points(k)?;
        }
        if let Some(n) = self.max_iterations {
            settings = settings.with_max_iterations(n)?;
        }
        settings = settings.with_profile(self.profile.is_some() || self.plot.is_some());
        if let Some(g) = &self.guess {
            settings = settings.with_guess(g[0], g[1], g[2], g[3])?;
        }
        Ok(settings)
    }
}

/// Run `starpoise zams`.
pub fn run(args: ZamsArgs) -> Result<()> {
    let settings = args.settings()?;
    if let Some(p) = &args.profile {
        check_output_path("--profile", p)?;
    }
    if let Some(p) = &args.plot {
        starpoise::output::plot::check_figure_path("--plot", p)?;
    }
    match solve_detailed(&settings)? {
        ZamsOutcome::Converged(model) => {
            if let Some(path) = &args.profile {
                write_profile(path, &model.profile, args.profile_format)?;
            }
            if let Some(path) = &args.plot {
                let title = format!(
                    "ZAMS model, {} M_sun, X = {}, Z = {}",
                    settings.mass_msun(),
                    model.summary.x,
                    model.summary.z
                );
                let abscissa = args.abscissa.map(Into::into).unwrap_or_default();
                starpoise::output::plot::profile_plot(path, &model.profile, &title, abscissa)?;
            }
            match args.format {
                Format::Json => println!("{}", to_json(&model.summary)?),
                Format::Text => print!("{}", text_summary(&model.summary)),
            }
            Ok(())
        }
        ZamsOutcome::NotConverged {
            report,
            rhs_evaluations,
        } => {
            eprintln!(
                "starpoise: the {} M_sun model did not converge: {}",
                settings.mass_msun(),
                report.failure.clone().unwrap_or_default()
            );
            eprintln!("  iteration  mismatch      step");
            for (i, h) in report.history.iter().enumerate() {
                eprintln!(
                    "  {:>9}  {:<12.4e}  {:.4}",
                    i + 1,
                    h.residual_norm,
                    h.step_length
                );
            }
            let u = report.solution;
            eprintln!(
                "  last guesses: P_c = {:.6e} dyn/cm^2, T_c = {:.6e} K, R = {:.6} R_sun, L = {:.6e} L_sun",
                u[0].exp(),
                u[1].exp(),
                u[2].exp() / starpoise::constants::R_SUN_CM,
                u[3].exp() / starpoise::constants::L_SUN_ERG_S
            );
            if args.format == Format::Json {
                let failed = ZamsSummary::not_converged(&settings, &report, rhs_evaluations);
                println!("{}", to_json(&failed)?);
            }
            Err(Error::NoConvergence {
                iterations: report.iterations,
                residual: report.residual_norm,
                reason: report.failure.unwrap_or_default(),
            })
        }
    }
}

fn to_json<T: serde::Serialize>(v: &T) -> Result<String> {
    serde_json::to_string_pretty(v).map_err(|e| Error::Io {
        path: "stdout".to_string(),
        reason: e.to_string(),
    })
}

/// Write profile rows as CSV (header from the field names) or JSON, atomically.
pub fn write_profile(path: &Path, rows: &[ProfileRow], format: ProfileFormat) -> Result<()> {
    write_atomically(path, |w| match format {
        ProfileFormat::Csv => {
            let mut csv = csv::Writer::from_writer(w);
            for r in rows {
                csv.serialize(r).map_err(std::io::Error::other)?;
            }
            csv.flush()
        }
        ProfileFormat::Json => {
            serde_json::to_writer(&mut *w, rows).map_err(std::io::Error::other)?;
            w.write_all(b"\n")
        }
    })
}

/// The summary as aligned text with units.
pub fn text_summary(s: &ZamsSummary) -> String {
    let f = |v: Option<f64>| v.map_or_else(|| "n/a".to_string(), num);
    let mut out = String::new();
    let mut line = |label: &str, value: String, unit: &str| {
        out.push_str(&format!("{label:<32} {value:>13}  {unit}\n"));
    };
    let p = &s.physics;
    line("mass", num(s.mass_msun), "M_sun");
    line(
        "X, Y, Z",
        format!("{:.4}, {:.4}, {:.4}", s.x, 1.0 - s.x - s.z, s.z),
        "mass fractions",
    );
    line(
        "physics",
        p.preset.clone(),
        &format!("eos {}, opacity {}, rates {},", p.eos, p.opacity, p.rates),
    );
    line(
        "",
        String::new(),
        &format!("convection {}, atmosphere {}", p.convection, p.atmosphere),
    );
    line(
        "converged",
        s.converged.to_string(),
        &format!(
            "{} Newton iterations, mismatch {:.1e} at m/M = {}",
            s.iterations, s.fit_mismatch, s.fit_mass_fraction
        ),
    );
    line("radius", f(s.radius_rsun), "R_sun");
    line("luminosity", f(s.luminosity_lsun), "L_sun");
    line("effective temperature", f(s.teff_k), "K");
    line("log g", f(s.log_g_cgs), "(g in cm/s^2)");
    line("central temperature", f(s.central_temperature_k), "K");
    line("central density", f(s.central_density_g_cm3), "g/cm^3");
    line(
        "central pressure",
        f(s.central_pressure_dyn_cm2),
        "dyn/cm^2",
    );
    line(
        "central degeneracy psi",
        f(s.central_degeneracy),
        "(electron chemical potential / kT; < 0: not degenerate)",
    );
    line(
        "convective core",
        f(s.convective_core_mass_fraction),
        "of M",
    );
    line(
        "convective envelope",
        f(s.convective_envelope_mass_fraction),
        "of M",
    );
    line("CNO share of L", f(s.cno_luminosity_fraction), "");
    line("L / L_Edd", f(s.eddington_ratio), "(electron scattering)");
    line(
        "Kelvin-Helmholtz time",
        f(s.kelvin_helmholtz_time_yr),
        "yr (G M^2 / R L)",
    );
    line(
        "dynamical time",
        f(s.dynamical_time_s),
        "s (sqrt(R^3 / G M))",
    );
    line(
        "main-sequence lifetime",
        f(s.nuclear_time_yr),
        "yr (10% of H burnt at this L)",
    );
    line(
        "virial residual",
        s.virial_residual
            .map_or("n/a".into(), |v| format!("{v:.1e}")),
        "(|3 int P/rho dm / int Gm/r dm - 1|)",
    );
    line(
        "luminosity residual",
        s.luminosity_residual
            .map_or("n/a".into(), |v| format!("{v:.1e}")),
        "(|int eps dm / L - 1|)",
    );
    out
}
