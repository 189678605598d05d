//! `starpoise sequence`: a grid of ZAMS models (masses x compositions x variants), in parallel,
//! optionally one deterministic shard of it; and `starpoise merge` for the shards.

use super::common::PhysicsFlags;
use super::io::{err, Files};
use clap::Args;
use indicatif::{ProgressBar, ProgressStyle};
use starpoise::grid::fits::{fit_groups, parse_ranges, DEFAULT_FIT_RANGES};
use starpoise::grid::merge::merge_shards;
use starpoise::grid::run::{solve_points, RunSettings};
use starpoise::grid::{parse_value_list, Grid, GridRow, GridTable, Shard, Variant};
use starpoise::output::meta::{Meta, Provenance};
use starpoise::output::plot::{hr_diagram, series_from_rows};
use starpoise::output::sequence::{read_table, write_table, SEQUENCE_CONTENT};
use starpoise::structure::DEFAULT_FIT_MASS_FRACTION;
use starpoise::{Error, Result};
use std::io::IsTerminal;
use std::path::PathBuf;

/// Arguments of `starpoise sequence`.
#[derive(Debug, Args)]
pub struct SequenceArgs {
    /// Masses in M_sun: a list `0.5,1,2` or a range `FROM:TO:COUNT[:log|lin]` (at most
    /// 100000 values).
    #[arg(long, value_name = "LIST", allow_hyphen_values = true)]
    masses: String,
    /// Hydrogen mass fractions (list or range) [default: 0.70].
    #[arg(long, value_name = "LIST", allow_hyphen_values = true)]
    x: Option<String>,
    /// Metal mass fractions (list or range) [default: 0.02].
    #[arg(long, value_name = "LIST", allow_hyphen_values = true)]
    z: Option<String>,
    #[command(flatten)]
    physics: PhysicsFlags,
    /// A physics variant NAME=SPEC (repeatable), e.g. hot=opacity-factor:2. Without any, the
    /// base set alone, named `base`.
    #[arg(long = "variant", value_name = "NAME=SPEC", allow_hyphen_values = true)]
    variants: Vec<String>,
    /// Fitting mass as a fraction of M [default: 0.4].
    #[arg(long, value_name = "FRACTION", value_parser = super::values::number, allow_hyphen_values = true)]
    fit_mass: Option<f64>,
    /// Write the table here: CSV; JSON if the name ends in .json; ECSV if it ends in .ecsv
    /// (atomically; `-` for standard output, as CSV).
    #[arg(long, value_name = "FILE", allow_hyphen_values = true)]
    out: Option<PathBuf>,
    /// Draw the HR diagram of the converged models to this figure, SVG or PNG by its
    /// extension (atomically).
    #[arg(long, value_name = "FILE.svg|FILE.png")]
    plot: Option<PathBuf>,
    /// Run only the K-th of N deterministic slices of the grid.
    #[arg(long, value_name = "K/N", allow_hyphen_values = true)]
    shard: Option<String>,
    /// Worker threads [default: 0, one per core; at most 256].
    #[arg(long, value_name = "T", default_value_t = 0, value_parser = super::values::threads, allow_hyphen_values = true)]
    threads: usize,
    /// Mass ranges of the power-law fits [default: 0.1-0.5,0.5-2,2-20,20-100].
    #[arg(long, value_name = "RANGES", allow_hyphen_values = true)]
    fit_ranges: Option<String>,
    /// No progress bar.
    #[arg(long)]
    quiet: bool,
}

/// Parse the variants; none given means the base set.
pub fn parse_variants(texts: &[String]) -> Result<Vec<Variant>> {
    if texts.is_empty() {
        return Ok(vec![Variant::base()]);
    }
    let variants = texts
        .iter()
        .map(|t| Variant::parse(t))
        .collect::<Result<Vec<_>>>()?;
    for (i, v) in variants.iter().enumerate() {
        if variants[..i].iter().any(|w| w.name == v.name) {
            return Err(Error::invalid("variant", &v.name, "each variant needs its own name, e.g. --variant base= --variant hot=opacity-factor:2"));
        }
    }
    Ok(variants)
}

fn progress(total: usize, quiet: bool) -> ProgressBar {
    if quiet || !std::io::stderr().is_terminal() {
        return ProgressBar::hidden();
    }
    let bar = ProgressBar::new(total as u64);
    if let Ok(style) =
        ProgressStyle::with_template("{bar:40} {pos}/{len} models  {elapsed_precise} (eta {eta})")
    {
        bar.set_style(style);
    }
    bar
}

/// Run `starpoise sequence`.
pub fn run(args: SequenceArgs) -> Result<()> {
    let masses = parse_value_list("--masses", &args.masses)?;
    let xs = parse_value_list("--x", args.x.as_deref().unwrap_or("0.70"))?;
    let zs = parse_value_list("--z", args.z.as_deref().unwrap_or("0.02"))?;
    let variants = parse_variants(&args.variants)?;
    let shard = args.shard.as_deref().map(Shard::parse).transpose()?;
    let ranges = match &args.fit_ranges {
        Some(t) => parse_ranges(t)?,
        None => DEFAULT_FIT_RANGES.to_vec(),
    };
    let fit = args.fit_mass.unwrap_or(DEFAULT_FIT_MASS_FRACTION);
    let grid = Grid::product(&args.physics.overrides(), variants, &masses, &xs, &zs, fit)?;
    let tables = grid.input_files();
    let mut files = Files::default();
    for table in &tables {
        files.input("an opacity table of the grid", table);
    }
    let channel = files
        .text("--out", args.out.as_deref())
        .figure("--plot", args.plot.as_deref())
        .check()?;
    let points = grid.select(shard);
    let bar = progress(points.len(), args.quiet);
    let tick = || bar.inc(1);
    let results = solve_points(
        &grid,
        &points,
        &RunSettings {
            threads: super::values::check_threads(args.threads)?,
            tolerance: None,
        },
        &tick,
    )?;
    bar.finish_and_clear();
    let fingerprint = grid.fingerprint();
    let rows: Vec<GridRow> = results
        .iter()
        .map(|r| GridRow::new(&grid, &fingerprint, r))
        .collect();
    let fits = if shard.is_none() {
        fit_groups(&rows, &ranges)
    } else {
        Vec::new()
    };
    let table = GridTable {
        grid_fingerprint: fingerprint,
        shard: args.shard.clone(),
        fit_ranges: ranges,
        fits,
        rows,
    };
    if let Some(path) = &args.out {
        let meta = Meta::new(&Provenance::of_this_process(), SEQUENCE_CONTENT);
        write_table(path, &table, &meta)?;
    }
    if let Some(path) = &args.plot {
        let series = series_from_rows(&table.rows);
        hr_diagram(path, &series, "Zero-age main sequence")?;
    }
    channel.print(&text_table(&table))?;
    let failed = table.rows.iter().filter(|r| !r.converged()).count();
    if failed > 0 {
        return Err(Error::Incomplete {
            failed,
            total: table.rows.len(),
        });
    }
    Ok(())
}

fn opt(v: Option<f64>, width: usize) -> String {
    let text = v.map_or_else(|| "-".to_string(), super::common::num);
    format!("{text:>width$}")
}

/// The table for people: one line per model, then the fits.
pub fn text_table(t: &GridTable) -> String {
    let mut out = format!(
        "{:<10} {:>6} {:>6} {:>9} {:>11} {:>9} {:>7} {:>10} {:>9} {:>6}  status\n",
        "variant", "X", "Z", "M/M_sun", "L/L_sun", "R/R_sun", "Teff/K", "T_c/K", "rho_c", "M_cc/M"
    );
    for r in &t.rows {
        let s = r.summary.as_ref();
        let status = if r.converged() {
            match r.warnings.len() {
                0 => r.status.code().to_string(),
                1 => format!("{} (1 warning, below)", r.status.code()),
                n => format!("{} ({n} warnings, below)", r.status.code()),
            }
        } else {
            format!("{}: {}", r.status.code(), r.reason)
        };
        out.push_str(&format!(
            "{:<10} {:>6.4} {:>6.4} {:>9.4} {} {} {:>7} {} {} {:>6}  {}\n",
            r.variant,
            r.x,
            r.z,
            r.mass_msun,
            opt(s.map(|s| s.luminosity_lsun), 11),
            opt(s.map(|s| s.radius_rsun), 9),
            s.map_or("-".to_string(), |s| format!("{:.0}", s.teff_k)),
            opt(s.map(|s| s.central_temperature_k), 10),
            opt(s.map(|s| s.central_density_g_cm3), 9),
            s.map_or("-".to_string(), |s| format!(
                "{:.3}",
                s.convective_core_mass_fraction
            )),
            status
        ));
    }
    let warned: Vec<&GridRow> = t.rows.iter().filter(|r| !r.warnings.is_empty()).collect();
    if !warned.is_empty() {
        out.push_str("\nwarnings (laws used outside their validity, and cautions):\n");
        for r in warned {
            for w in &r.warnings {
                out.push_str(&format!(
                    "  {} X = {} Z = {} M = {} M_sun: {w}\n",
                    r.variant, r.x, r.z, r.mass_msun
                ));
            }
        }
    }
    for g in &t.fits {
        out.push_str(&format!(
            "\npower-law fits, variant {} (X = {}, Z = {}): L ~ M^a, R ~ M^b\n",
            g.variant, g.x, g.z
        ));
        for f in &g.ranges {
            let e = |v: Option<f64>| v.map_or("-".to_string(), |v| format!("{v:.3}"));
            out.push_str(&format!(
                "  {:>7} - {:<7} M_sun  ({:>3} models)  a = {:>7}  b = {:>7}\n",
                f.from_msun,
                f.to_msun,
                f.models,
                e(f.luminosity_exponent),
                e(f.radius_exponent)
            ));
        }
    }
    out
}

/// Arguments of `starpoise merge`.
#[derive(Debug, Args)]
pub struct MergeArgs {
    /// Shard outputs of one grid (CSV, ECSV or JSON, as `sequence --out` wrote them).
    #[arg(required = true, value_name = "FILES")]
    files: Vec<PathBuf>,
    /// The merged table (CSV; JSON if it ends in .json; ECSV if it ends in .ecsv), written
    /// atomically (`-` for standard output, as CSV).
    #[arg(long, value_name = "FILE", allow_hyphen_values = true)]
    out: PathBuf,
}

/// Run `starpoise merge`.
pub fn run_merge(args: MergeArgs) -> Result<()> {
    let mut files = Files::default();
    for f in &args.files {
        files.input(format!("the shard file {}", f.display()), f);
    }
    files.text("--out", Some(args.out.as_path())).check()?;
    let tables = args
        .files
        .iter()
        .map(|p| Ok((p.display().to_string(), read_table(p)?)))
        .collect::<Result<Vec<_>>>()?;
    // The fits use the ranges the shards were run with; the shards must agree on them.
    let mut ranges: Option<(String, Vec<(f64, f64)>)> = None;
    for (file, t) in &tables {
        match &ranges {
            Some((first, r)) if *r != t.fit_ranges => {
                return Err(Error::invalid(
                    "files",
                    file,
                    &format!("its fit ranges differ from those of {first}: the shards of one grid are run with the same --fit-ranges"),
                ))
            }
            Some(_) => {}
            None => ranges = Some((file.clone(), t.fit_ranges.clone())),
        }
    }
    let ranges = ranges
        .map(|(_, r)| r)
        .filter(|r| !r.is_empty())
        .unwrap_or_else(|| DEFAULT_FIT_RANGES.to_vec());
    let rows = merge_shards(tables.into_iter().map(|(f, t)| (f, t.rows)).collect())?;
    let fingerprint = rows
        .first()
        .map(|r| r.grid_fingerprint.clone())
        .unwrap_or_default();
    let fits = fit_groups(&rows, &ranges);
    let table = GridTable {
        grid_fingerprint: fingerprint,
        shard: None,
        fit_ranges: ranges,
        fits,
        rows,
    };
    let meta = Meta::new(&Provenance::of_this_process(), SEQUENCE_CONTENT);
    write_table(&args.out, &table, &meta)?;
    err(&format!(
        "starpoise: merged {} grid points from {} files into {}\n",
        table.rows.len(),
        args.files.len(),
        args.out.display()
    ));
    Ok(())
}
