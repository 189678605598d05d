//! Figures: the Hertzsprung–Russell diagram of one or more mass sequences and the two-panel
//! profile of one model, as SVG or PNG by the file name's extension.
//!
//! Each figure is drawn once against any `plotters` backend (`canvas.rs`): SVG through the SVG
//! backend, whose text stays text laid out by the viewer; PNG through the bitmap backend with
//! text set from a font embedded in the program (`font.rs`, `raster.rs`), so neither needs a
//! system font or image library. Every file is rendered to memory first and then written
//! through [`crate::output::write_output`], so a failure never leaves a partial file; a
//! file name whose extension names neither format is refused before anything is drawn.
//!
//! Styles are chosen to survive grey-scale print: each series differs in marker shape, line
//! dash and width as well as colour (colours from the Okabe–Ito palette, Wong 2011, Nature
//! Methods 8, 441, "Points of view: Color blindness"). Labels are placed so that they never
//! overlap a marker, another label or the legend (`placement.rs`).

mod canvas;
mod font;
mod geometry;
mod hr;
mod labels;
mod placement;
mod profile;
mod raster;
mod style;
mod table;

pub use canvas::{check_figure_path, ImageFormat, FIGURE_EXTENSIONS};
pub use font::text_box_px;
pub use geometry::PixelBox;
pub use hr::{
    hr_diagram, render_hr_diagram, HrFigure, HrLayout, HrPoint, HrSeries, PlacedLabel,
    HR_HEIGHT_PX, HR_WIDTH_PX, SUN_LABEL,
};
pub use labels::{
    decade_ticks, format_mass, select_mass_labels, MassTick, MAX_MASS_LABELS, MAX_TICK_RATIO,
};
pub use placement::Placement;
pub use profile::{
    profile_plot, render_profile, Abscissa, ProfileFigure, ProfileLayout, NABLA_AXIS_CAP,
    PROFILE_HEIGHT_PX, PROFILE_WIDTH_PX,
};
pub use table::{read_table, PlotInput};

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
