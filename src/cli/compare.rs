//! `starpoise compare`: the same masses under several physics variants, with the differences
//! against the first variant and the sensitivities to a varied scale factor.

use super::common::{CompositionFlags, PhysicsFlags};
use super::io::Files;
use super::sequence::parse_variants;
use super::Format;
use clap::Args;
use starpoise::grid::run::{solve_points, RunSettings};
use starpoise::grid::{parse_value_list, Grid, GridRow};
use starpoise::output::compare::{
    table_json, write_table, CompareRecord, CompareTable, COMPARE_CONTENT,
};
use starpoise::output::meta::{Meta, Provenance};
use starpoise::structure::DEFAULT_FIT_MASS_FRACTION;
use starpoise::{Error, Result};
use std::path::PathBuf;

const EXAMPLE: &str =
    "e.g. starpoise compare --mass 1,10 --variant base= --variant hot=opacity-factor:2";

/// Arguments of `starpoise compare`.
#[derive(Debug, Args)]
pub struct CompareArgs {
    /// Masses in M_sun: a list `1,10` or a range `FROM:TO:COUNT[:log|lin]`.
    #[arg(long, value_name = "LIST", allow_hyphen_values = true)]
    mass: String,
    /// A physics variant NAME=SPEC (at least two; the first is the reference), e.g. base= (the
    /// base set unchanged), hot=opacity-factor:2, mlt15=alpha:1.5.
    #[arg(long = "variant", value_name = "NAME=SPEC", allow_hyphen_values = true)]
    variants: Vec<String>,
    /// Composition.
    #[command(flatten)]
    composition: CompositionFlags,
    /// The base physics set that every variant overrides.
    #[command(flatten)]
    physics: PhysicsFlags,
    /// Output on stdout.
    #[arg(long, value_enum, default_value_t = Format::Text)]
    format: Format,
    /// Also write the records here: CSV; JSON if the name ends in .json; ECSV if it ends in
    /// .ecsv (atomically; `-` for standard output, as CSV).
    #[arg(long, value_name = "FILE", allow_hyphen_values = true)]
    out: Option<PathBuf>,
    /// Worker threads [default: 0, one per core; at most 256].
    #[arg(long, value_name = "T", default_value_t = 0, value_parser = super::values::threads, allow_hyphen_values = true)]
    threads: usize,
}

/// Run `starpoise compare`.
pub fn run(args: CompareArgs) -> Result<()> {
    let masses = parse_value_list("--mass", &args.mass)?;
    if args.variants.len() < 2 {
        return Err(Error::invalid(
            "variant",
            args.variants.join(" "),
            &format!("give at least two variants, the first being the reference; {EXAMPLE}"),
        ));
    }
    let variants = parse_variants(&args.variants)?;
    let composition = args.composition.composition(None, None)?;
    let base = args.physics.overrides();
    let grid = Grid::product(
        &base,
        variants,
        &masses,
        &[composition.x()],
        &[composition.z()],
        DEFAULT_FIT_MASS_FRACTION,
    )?;
    let tables = grid.input_files();
    let mut files = Files::default();
    for table in &tables {
        files.input("an opacity table of a variant", table);
    }
    let channel = files.text("--out", args.out.as_deref()).check()?;
    let points = grid.select(None);
    let results = solve_points(
        &grid,
        &points,
        &RunSettings {
            threads: super::values::check_threads(args.threads)?,
            tolerance: None,
        },
        &|| {},
    )?;
    let table = CompareTable::new(&grid, &masses, &results);
    let meta = Meta::new(&Provenance::of_this_process(), COMPARE_CONTENT);
    if let Some(path) = &args.out {
        write_table(path, &table, &meta)?;
    }
    match args.format {
        Format::Text => channel.print(&text_table(&grid, &table))?,
        Format::Json => channel.print(&format!(
            "{}\n",
            serde_json::to_string_pretty(&table_json(&table, &meta)).map_err(|e| Error::Io {
                path: "stdout".to_string(),
                reason: e.to_string(),
            })?
        ))?,
    }
    let failed = table.records.iter().filter(|r| !r.converged()).count();
    if failed > 0 {
        return Err(Error::Incomplete {
            failed,
            total: table.records.len(),
        });
    }
    Ok(())
}

/// A number with six significant figures right-aligned in `width`, or `-`.
fn sci(v: Option<f64>, width: usize) -> String {
    let text = v.map_or_else(|| "-".to_string(), super::common::num);
    format!("{text:>width$}")
}

/// A signed fixed-point number right-aligned in `width`, or `-`; a value that rounds to zero
/// prints as +0 (no "-0.0000").
fn signed(v: Option<f64>, width: usize, prec: usize) -> String {
    v.map_or_else(
        || format!("{:>width$}", "-"),
        |x| {
            let shown = if x.abs() < 0.5 * 10f64.powi(-(prec as i32)) {
                0.0
            } else {
                x
            };
            format!("{shown:>+width$.prec$}")
        },
    )
}

const NAME_WIDTH: usize = 10;

fn header() -> String {
    format!(
        "    {:<NAME_WIDTH$} {:>10} {:>10} {:>7} {:>10} {:>10} {:>6} | {:>8} {:>8} {:>8} {:>8} {:>8}\n",
        "variant",
        "L/L_sun",
        "R/R_sun",
        "Teff/K",
        "T_c/K",
        "rho_c/cgs",
        "q_cc",
        "dlog L",
        "dlog R",
        "dlog T_c",
        "dlog rho",
        "d q_cc"
    )
}

fn row(r: &CompareRecord) -> String {
    let mark = if r.reference { "ref" } else { "" };
    let name = format!("{mark:>3} {:<NAME_WIDTH$}", r.variant);
    if !r.converged() {
        return format!("{name} not converged ({}): {}\n", r.status, r.reason);
    }
    let mut line = format!(
        "{name} {} {} {:>7} {} {} {:>6} | {} {} {} {} {}\n",
        sci(r.luminosity_lsun, 10),
        sci(r.radius_rsun, 10),
        r.teff_k.map_or("-".to_string(), |v| format!("{v:.0}")),
        sci(r.central_temperature_k, 10),
        sci(r.central_density_g_cm3, 10),
        r.convective_core_mass_fraction
            .map_or("-".to_string(), |v| format!("{v:.3}")),
        signed(r.dlog_luminosity_dex, 8, 4),
        signed(r.dlog_radius_dex, 8, 4),
        signed(r.dlog_central_temperature_dex, 8, 4),
        signed(r.dlog_central_density_dex, 8, 4),
        signed(r.delta_convective_core_mass_fraction, 8, 4),
    );
    for warning in r
        .warnings
        .split(GridRow::WARNING_SEPARATOR)
        .filter(|w| !w.is_empty())
    {
        line.push_str(&format!(
            "{:>pad$}warning: {warning}\n",
            "",
            pad = NAME_WIDTH + 6
        ));
    }
    if let (Some(f), Some(a), Some(b)) = (&r.varied_factor, r.factor_reference, r.factor_variant) {
        line.push_str(&format!(
            "{:>w$}dlog Q / dlog({f} {a} -> {b}):  L {}  R {}  T_c {}  rho_c {}\n",
            "",
            signed(r.sensitivity_luminosity, 6, 3).trim_start(),
            signed(r.sensitivity_radius, 6, 3).trim_start(),
            signed(r.sensitivity_central_temperature, 6, 3).trim_start(),
            signed(r.sensitivity_central_density, 6, 3).trim_start(),
            w = NAME_WIDTH + 6
        ));
    }
    line
}

/// The comparison for people: a legend of the variants, then one block per mass with one line
/// per variant (the reference marked `ref`), the differences after the bar.
fn text_table(grid: &Grid, t: &CompareTable) -> String {
    let mut out = format!(
        "compare at X = {}, Z = {}; reference: {} (first variant)\n",
        t.x, t.z, t.reference
    );
    for v in &grid.variants {
        let spec = if v.spec.is_empty() {
            "the base set"
        } else {
            &v.spec
        };
        out.push_str(&format!("  {:<NAME_WIDTH$} = {spec}\n", v.name));
    }
    out.push_str(
        "dlog Q = log10(Q / Q_ref) in dex; q_cc = convective-core mass / M, d q_cc = q_cc - q_cc,ref; rho_c in g/cm^3\n",
    );
    let mut mass = None;
    for r in &t.records {
        if mass != Some(r.mass_msun) {
            mass = Some(r.mass_msun);
            out.push_str(&format!("\nM = {} M_sun\n", r.mass_msun));
            out.push_str(&header());
        }
        out.push_str(&row(r));
    }
    out
}
