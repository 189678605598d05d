//! Figures as SVG: the Hertzsprung–Russell diagram of one or more mass sequences and the
//! two-panel profile of one model.
//!
//! Drawing uses the `plotters` crate with its SVG backend only: text is written as SVG `<text>`
//! elements and laid out by the viewer, so no system font library is needed. Every file is
//! rendered to memory first and then written through [`crate::output::write_atomically`], so a
//! failure never leaves a partial file.
//!
//! Styles are chosen to survive grey-scale print: each series differs in marker shape, line
//! dash and width as well as colour (colours from the Okabe–Ito palette, Wong 2011, Nature
//! Methods 8, 441, "Points of view: Color blindness").

mod hr;
mod labels;
mod profile;
mod style;
mod table;

pub use hr::{hr_diagram, render_hr_diagram, HrFigure, HrPoint, HrSeries};
pub use labels::{format_mass, select_mass_labels, MAX_MASS_LABELS};
pub use profile::{profile_plot, render_profile, ProfileFigure, NABLA_AXIS_CAP};
pub use table::{read_table, PlotInput};

use crate::error::{Error, Result};
use std::path::Path;

/// Where a drawing error happened before any file was involved.
const IN_MEMORY: &str = "SVG image (in memory)";

/// Map any `plotters` drawing error into the library's error.
fn drawing_error(e: impl std::fmt::Display) -> Error {
    Error::Io {
        path: IN_MEMORY.to_string(),
        reason: format!("drawing failed: {e}"),
    }
}

/// Write a rendered SVG document to `path` atomically; a drawing error reported against the
/// in-memory image is re-labelled with the target path.
fn write_svg(path: &Path, svg: Result<String>) -> Result<()> {
    let svg = svg.map_err(|e| match e {
        Error::Io { path: p, reason } if p == IN_MEMORY => Error::Io {
            path: path.display().to_string(),
            reason,
        },
        other => other,
    })?;
    crate::output::write_atomically(path, |w| w.write_all(svg.as_bytes()))
}

/// One HR series per (variant, X, Z) of a sequence table, from its converged rows, labelled by
/// the variant and, when the table holds several compositions, the composition.
pub fn series_from_rows(rows: &[crate::grid::GridRow]) -> Vec<HrSeries> {
    let mut keys: Vec<(String, f64, f64)> = Vec::new();
    for r in rows {
        let k = (r.variant.clone(), r.x, r.z);
        if !keys.contains(&k) {
            keys.push(k);
        }
    }
    let several_variants = keys.iter().any(|k| k.0 != keys[0].0);
    let several_compositions = keys.iter().any(|k| k.1 != keys[0].1 || k.2 != keys[0].2);
    keys.iter()
        .map(|(variant, x, z)| {
            let label = match (several_variants, several_compositions) {
                (_, true) if !several_variants => format!("X = {x}, Z = {z}"),
                (_, true) => format!("{variant} (X = {x}, Z = {z})"),
                _ => variant.clone(),
            };
            let points = rows
                .iter()
                .filter(|r| &r.variant == variant && r.x == *x && r.z == *z)
                .filter_map(|r| {
                    let s = r.summary.as_ref()?;
                    Some(HrPoint {
                        mass_msun: r.mass_msun,
                        teff_k: s.teff_k,
                        luminosity_lsun: s.luminosity_lsun,
                    })
                })
                .collect();
            HrSeries { label, points }
        })
        .filter(|s| !s.points.is_empty())
        .collect()
}
