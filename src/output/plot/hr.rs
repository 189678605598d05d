//! Hertzsprung–Russell diagram: log10 T_eff (increasing to the left) against log10 L/L_sun,
//! one line with marked, mass-labelled points per series.

use super::labels::{format_mass, select_mass_labels, MAX_MASS_LABELS};
use super::style::{
    draw_legend, draw_line, draw_marker, legend_size, series_style, text_style, LegendEntry,
    LegendKey, AXIS_LABEL_SIZE, FONT, GRID_GREY, NOTE_SIZE, TICK_SIZE, TITLE_SIZE,
};
use super::{drawing_error, write_svg};
use crate::error::{Error, Result};
use plotters::coord::types::RangedCoordf64;
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, VPos};
use std::path::Path;

/// Figure width, pixels.
pub const HR_WIDTH_PX: u32 = 800;
/// Figure height, pixels.
pub const HR_HEIGHT_PX: u32 = 600;

/// One model on the diagram.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct HrPoint {
    /// Stellar mass, M_sun (used for the point's label).
    pub mass_msun: f64,
    /// Effective temperature, K.
    pub teff_k: f64,
    /// Surface luminosity, L_sun.
    pub luminosity_lsun: f64,
}

/// One sequence of models, drawn as one line; `label` appears in the legend.
#[derive(Debug, Clone, PartialEq)]
pub struct HrSeries {
    /// Legend text, e.g. the variant name.
    pub label: String,
    /// The models; they are joined in order of increasing mass.
    pub points: Vec<HrPoint>,
}

/// A rendered HR diagram, with what was drawn where (for checks and for callers that place
/// further marks).
#[derive(Debug, Clone, PartialEq)]
pub struct HrFigure {
    /// The SVG document.
    pub svg: String,
    /// Pixel position (x right, y down, origin top left) of every point, per series, in the
    /// order the points were given.
    pub points_px: Vec<Vec<(i32, i32)>>,
    /// The mass labels written beside the points, per series, in order of increasing mass.
    pub mass_labels: Vec<Vec<String>>,
}

fn check_input(series: &[HrSeries]) -> Result<()> {
    if series.is_empty() {
        return Err(Error::invalid(
            "HR diagram series",
            "none",
            "at least one series with at least one point",
        ));
    }
    for s in series {
        if s.points.is_empty() {
            return Err(Error::invalid(
                "HR diagram series",
                format!("'{}' with no points", s.label),
                "every series needs at least one point",
            ));
        }
        for p in &s.points {
            let ok = |v: f64| v.is_finite() && v > 0.0;
            if !(ok(p.mass_msun) && ok(p.teff_k) && ok(p.luminosity_lsun)) {
                return Err(Error::invalid(
                    "HR diagram point",
                    format!(
                        "'{}': mass_msun = {}, teff_k = {}, luminosity_lsun = {}",
                        s.label, p.mass_msun, p.teff_k, p.luminosity_lsun
                    ),
                    "finite positive mass, effective temperature and luminosity",
                ));
            }
        }
    }
    Ok(())
}

/// Axis range `[lo - pad, hi + pad]` with a padding of 8 % of the span (at least `min_pad`) so
/// that no marker sits on the frame.
fn padded(lo: f64, hi: f64, min_pad: f64) -> (f64, f64) {
    let pad = (0.08 * (hi - lo)).max(min_pad);
    (lo - pad, hi + pad)
}

/// Tick labels asked for along x and y.
const X_TICKS: usize = 12;
const Y_TICKS: usize = 10;

/// The fewest decimals (at most 4) that print every tick of the axis `lo..hi` exactly, with
/// the ticks `plotters` places when asked for `count` labels.
fn tick_decimals(lo: f64, hi: f64, count: usize) -> usize {
    let ticks = RangedCoordf64::from(lo..hi).key_points(count);
    (0..=4)
        .find(|&d| {
            let scale = 10f64.powi(d);
            ticks
                .iter()
                .all(|t| ((t * scale).round() / scale - t).abs() <= 1e-9 * t.abs().max(1.0))
        })
        .unwrap_or(4) as usize
}

/// Pixel box (x0, y0, x1, y1) of a mass label of `chars` characters whose anchor is `at`,
/// left-bottom anchored if `left_bottom`, else right-top. Widths at 0.6 em per character, a
/// generous sans-serif average (common practice, no source).
fn label_box(at: (i32, i32), chars: usize, left_bottom: bool) -> (i32, i32, i32, i32) {
    let em = NOTE_SIZE / 1.24;
    let w = (chars as f64 * 0.6 * em).ceil() as i32;
    let h = em.ceil() as i32;
    if left_bottom {
        (at.0, at.1 - h, at.0 + w, at.1)
    } else {
        (at.0 - w, at.1, at.0, at.1 + h)
    }
}

fn boxes_overlap(a: (i32, i32, i32, i32), b: (i32, i32, i32, i32)) -> bool {
    let gap = 2;
    a.0 < b.2 + gap && b.0 < a.2 + gap && a.1 < b.3 + gap && b.1 < a.3 + gap
}

/// Render the diagram to memory. The x axis carries u = -log10 T_eff so that T_eff increases to
/// the left; its tick labels print log10 T_eff.
///
/// Errors: [`Error::InvalidInput`] for no series, a series without points, or a point whose
/// mass, T_eff or L is not finite and positive.
pub fn render_hr_diagram(series: &[HrSeries], title: &str) -> Result<HrFigure> {
    check_input(series)?;
    let all = series.iter().flat_map(|s| s.points.iter());
    let (mut t_lo, mut t_hi, mut l_lo, mut l_hi) = (
        f64::INFINITY,
        f64::NEG_INFINITY,
        f64::INFINITY,
        f64::NEG_INFINITY,
    );
    for p in all {
        let (t, l) = (p.teff_k.log10(), p.luminosity_lsun.log10());
        t_lo = t_lo.min(t);
        t_hi = t_hi.max(t);
        l_lo = l_lo.min(l);
        l_hi = l_hi.max(l);
    }
    let (t_lo, t_hi) = padded(t_lo, t_hi, 0.02);
    let (l_lo, l_hi) = padded(l_lo, l_hi, 0.1);
    let x_decimals = tick_decimals(-t_hi, -t_lo, X_TICKS);
    let y_decimals = tick_decimals(l_lo, l_hi, Y_TICKS);
    let x_format = move |u: &f64| format!("{:.*}", x_decimals, -u + 0.0);
    let y_format = move |v: &f64| format!("{:.*}", y_decimals, v + 0.0);

    let mut svg = String::new();
    let mut points_px = Vec::with_capacity(series.len());
    let mut mass_labels = Vec::with_capacity(series.len());
    {
        let root =
            SVGBackend::with_string(&mut svg, (HR_WIDTH_PX, HR_HEIGHT_PX)).into_drawing_area();
        root.fill(&WHITE).map_err(drawing_error)?;
        let mut builder = ChartBuilder::on(&root);
        builder
            .margin(16)
            .margin_right(32)
            .x_label_area_size(64)
            .y_label_area_size(80);
        if !title.is_empty() {
            builder.caption(title, (FONT, TITLE_SIZE));
        }
        let mut chart = builder
            .build_cartesian_2d(-t_hi..-t_lo, l_lo..l_hi)
            .map_err(drawing_error)?;
        chart
            .configure_mesh()
            .bold_line_style(GRID_GREY)
            .light_line_style(WHITE.mix(0.0))
            .x_labels(X_TICKS)
            .y_labels(Y_TICKS)
            .x_label_formatter(&x_format)
            .y_label_formatter(&y_format)
            .label_style((FONT, TICK_SIZE))
            .axis_desc_style((FONT, AXIS_LABEL_SIZE))
            .x_desc("log10 T_eff / K")
            .y_desc("log10 L / L_sun")
            .draw()
            .map_err(drawing_error)?;
        let area = chart.plotting_area();
        area.draw(&Rectangle::new(
            [(-t_hi, l_hi), (-t_lo, l_lo)],
            ShapeStyle::from(&BLACK).stroke_width(1),
        ))
        .map_err(drawing_error)?;

        let mut legend = Vec::with_capacity(series.len());
        let mut occupied = Vec::new();
        let mut label_boxes = Vec::new();
        for (k, s) in series.iter().enumerate() {
            let style = series_style(k);
            let mut order: Vec<usize> = (0..s.points.len()).collect();
            order.sort_by(|&a, &b| s.points[a].mass_msun.total_cmp(&s.points[b].mass_msun));
            let coords: Vec<(f64, f64)> = order
                .iter()
                .map(|&i| {
                    let p = &s.points[i];
                    (-p.teff_k.log10(), p.luminosity_lsun.log10())
                })
                .collect();
            draw_line(area, &coords, &style)?;
            for &c in &coords {
                draw_marker(area, c, style.marker, style.color)?;
            }
            // Labels above-right of the line for even series, below-left for odd ones, so
            // that neighbouring sequences do not write over each other; a label that would
            // overlap one already written is left out.
            let (dx, dy, h, v) = if k % 2 == 0 {
                (7, -6, HPos::Left, VPos::Bottom)
            } else {
                (-7, 6, HPos::Right, VPos::Top)
            };
            let masses: Vec<f64> = order.iter().map(|&i| s.points[i].mass_msun).collect();
            let mut labels = Vec::new();
            for j in select_mass_labels(&masses, MAX_MASS_LABELS) {
                let text = format_mass(masses[j]);
                let (px, py) = chart.backend_coord(&coords[j]);
                let bx = label_box((px + dx, py + dy), text.chars().count(), k % 2 == 0);
                if label_boxes.iter().any(|&b| boxes_overlap(b, bx)) {
                    continue;
                }
                label_boxes.push(bx);
                area.draw(
                    &(EmptyElement::at(coords[j])
                        + Text::new(
                            text.clone(),
                            (dx, dy),
                            text_style(NOTE_SIZE, style.color, h, v),
                        )),
                )
                .map_err(drawing_error)?;
                occupied.extend([(bx.0, bx.1), (bx.2, bx.3)]);
                labels.push(text);
            }
            let px: Vec<(i32, i32)> = s
                .points
                .iter()
                .map(|p| chart.backend_coord(&(-p.teff_k.log10(), p.luminosity_lsun.log10())))
                .collect();
            occupied.extend(px.iter().copied());
            points_px.push(px);
            mass_labels.push(labels);
            legend.push(LegendEntry {
                label: s.label.clone(),
                key: LegendKey::Line(style),
            });
        }
        let corner = legend_corner(area.get_pixel_range(), legend_size(&legend), &occupied);
        draw_legend(&root, corner, &legend)?;
        root.present().map_err(drawing_error)?;
    }
    Ok(HrFigure {
        svg,
        points_px,
        mass_labels,
    })
}

/// Top-left pixel of the legend box: the corner of the plotting area (upper right, lower left,
/// upper left, lower right, in that order of preference) whose box covers the fewest drawn
/// points and labels.
fn legend_corner(
    (xs, ys): (std::ops::Range<i32>, std::ops::Range<i32>),
    (w, h): (i32, i32),
    occupied: &[(i32, i32)],
) -> (i32, i32) {
    let inset = 10;
    let left = xs.start + inset;
    let right = xs.end - inset - w;
    let top = ys.start + inset;
    let bottom = ys.end - inset - h;
    let corners = [(right, top), (left, bottom), (left, top), (right, bottom)];
    let margin = 12;
    let covered = |&(x0, y0): &(i32, i32)| {
        occupied
            .iter()
            .filter(|&&(x, y)| {
                x >= x0 - margin && x <= x0 + w + margin && y >= y0 - margin && y <= y0 + h + margin
            })
            .count()
    };
    let mut best = corners[0];
    let mut best_count = covered(&best);
    for c in &corners[1..] {
        let n = covered(c);
        if n < best_count {
            best = *c;
            best_count = n;
        }
    }
    best
}

/// Draw the HR diagram of `series` to the SVG file `path` (800 x 600 px), written atomically.
///
/// Errors: as [`render_hr_diagram`]; [`Error::Io`] if the file cannot be written (no partial
/// file is left).
pub fn hr_diagram(path: &Path, series: &[HrSeries], title: &str) -> Result<()> {
    write_svg(path, render_hr_diagram(series, title).map(|f| f.svg))
}
