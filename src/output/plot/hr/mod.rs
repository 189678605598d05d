//! Hertzsprung–Russell diagram: log10 T_eff (increasing to the left) against log10 L/L_sun,
//! one line with marked, mass-labelled points per series, and the Sun.

mod annotate;

use super::canvas::{drawing_error, figure_format, render, write_figure, Figure, ImageFormat};
use super::geometry::PixelBox;
use super::labels::decade_ticks;
use super::placement::Placement;
use super::style::{
    draw_line, draw_marker, draw_sun_symbol, draw_tick, series_style, LegendEntry, LegendKey,
    AXIS_LABEL_SIZE, FONT, GRID_GREY, MARKER_RADIUS, TICK_SIZE, TITLE_SIZE,
};
use crate::constants::TEFF_SUN_K;
use crate::error::{Error, Result};
use annotate::{annotate, Marks};
use plotters::coord::types::RangedCoordf64;
use plotters::coord::Shift;
use plotters::prelude::*;
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

/// Where the Sun sits on the diagram: the IAU 2015 Resolution B3 nominal effective temperature
/// (5772 K; Prša et al. 2016, AJ 152, 41) and 1 L_sun (docs/references.md §2).
fn sun_position() -> (f64, f64) {
    (-TEFF_SUN_K.log10(), 0.0)
}

/// Text of the Sun's label.
pub const SUN_LABEL: &str = "Sun";

/// One text label written inside the plotting area.
#[derive(Debug, Clone, PartialEq)]
pub struct PlacedLabel {
    /// The text.
    pub text: String,
    /// The series whose point it names (`None` for the Sun's label).
    pub series: Option<usize>,
    /// Pixel centre of the point, tick or symbol it names.
    pub anchor_px: (i32, i32),
    /// Whether it names a power-of-ten mass that no model has, marked by a tick across the line
    /// where the line between the two neighbouring models passes it in log M (see
    /// [`decade_ticks`](super::labels::decade_ticks)).
    pub interpolated: bool,
    /// Where it went.
    pub placement: Placement,
}

/// What was drawn where on an HR diagram, in pixels (x right, y down, origin top left).
#[derive(Debug, Clone, PartialEq)]
pub struct HrLayout {
    /// Pixel position of every point, per series, in the order the points were given.
    pub points_px: Vec<Vec<(i32, i32)>>,
    /// The mass labels written beside the points, per series, in order of increasing mass.
    pub mass_labels: Vec<Vec<String>>,
    /// Every label in the plotting area (mass labels and the Sun's), in the order placed.
    pub labels: Vec<PlacedLabel>,
    /// The box of every mark drawn in the plotting area: model markers, the ticks of
    /// interpolated round masses and the Sun's symbol.
    pub markers_px: Vec<PixelBox>,
    /// Centre of the Sun's symbol.
    pub sun_px: (i32, i32),
    /// The legend box.
    pub legend_px: PixelBox,
    /// The plotting area (inside the axes).
    pub plot_area_px: PixelBox,
}

/// A rendered HR diagram: the file's bytes and what was drawn where.
#[derive(Debug, Clone, PartialEq)]
pub struct HrFigure {
    /// The image: SVG text or PNG data, as asked.
    pub image: Vec<u8>,
    /// What was drawn where.
    pub layout: HrLayout,
}

/// Half-size in pixels of the box a series marker covers (the triangle is one pixel larger
/// than the others, outlines add one more).
const MARKER_HALF_PX: i32 = MARKER_RADIUS + 2;

/// The diagram of `series` with `title`, ready to draw on any backend.
struct HrDrawing<'a> {
    series: &'a [HrSeries],
    title: &'a str,
}

impl Figure for HrDrawing<'_> {
    type Layout = HrLayout;

    fn size_px(&self) -> (u32, u32) {
        (HR_WIDTH_PX, HR_HEIGHT_PX)
    }

    fn draw<DB: DrawingBackend>(&self, root: &DrawingArea<DB, Shift>) -> Result<HrLayout> {
        draw_hr(root, self.series, self.title)
    }
}

/// Draw the diagram on `root`. The x axis carries u = -log10 T_eff so that T_eff increases to
/// the left; its tick labels print log10 T_eff.
fn draw_hr<DB: DrawingBackend>(
    root: &DrawingArea<DB, Shift>,
    series: &[HrSeries],
    title: &str,
) -> Result<HrLayout> {
    let sun = sun_position();
    let (mut t_lo, mut t_hi, mut l_lo, mut l_hi) = (-sun.0, -sun.0, sun.1, sun.1);
    for p in series.iter().flat_map(|s| s.points.iter()) {
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

    let mut builder = ChartBuilder::on(root);
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
    let (xs, ys) = area.get_pixel_range();
    let plot_area_px = PixelBox {
        left: xs.start,
        top: ys.start,
        right: xs.end - 1,
        bottom: ys.end - 1,
    };

    // Lines and markers first; their pixels are what the legend and the labels avoid.
    let mut points_px = Vec::with_capacity(series.len());
    let mut markers_px = Vec::new();
    let mut lines_px: Vec<Vec<(i32, i32)>> = Vec::new();
    let mut orders = Vec::with_capacity(series.len());
    let mut ticks = Vec::with_capacity(series.len());
    let mut legend = Vec::with_capacity(series.len());
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
        let line: Vec<(i32, i32)> = coords.iter().map(|c| chart.backend_coord(c)).collect();
        markers_px.extend(
            line.iter()
                .map(|&p| PixelBox::around(p, MARKER_HALF_PX, MARKER_HALF_PX)),
        );
        let masses: Vec<f64> = order.iter().map(|&i| s.points[i].mass_msun).collect();
        let mut series_ticks = Vec::new();
        for tick in decade_ticks(&masses) {
            let (a, b) = (coords[tick.below], coords[tick.below + 1]);
            let f = tick.fraction;
            let at = chart.backend_coord(&(a.0 + f * (b.0 - a.0), a.1 + f * (b.1 - a.1)));
            let (pa, pb) = (line[tick.below], line[tick.below + 1]);
            markers_px.push(draw_tick(root, at, (pa, pb), style.color)?);
            series_ticks.push((tick, at));
        }
        ticks.push(series_ticks);
        lines_px.push(line);
        points_px.push(
            s.points
                .iter()
                .map(|p| chart.backend_coord(&(-p.teff_k.log10(), p.luminosity_lsun.log10())))
                .collect::<Vec<_>>(),
        );
        orders.push(order);
        legend.push(LegendEntry {
            label: s.label.clone(),
            key: LegendKey::Line(style),
        });
    }
    let sun_px = chart.backend_coord(&sun);
    let sun_box = draw_sun_symbol(root, sun_px)?;
    markers_px.push(sun_box);

    let annotations = annotate(
        root,
        &Marks {
            frame: plot_area_px,
            markers: &markers_px,
            lines: &lines_px,
            sun: (sun_px, sun_box),
        },
        series,
        &orders,
        &ticks,
        &legend,
    )?;
    Ok(HrLayout {
        points_px,
        mass_labels: annotations.mass_labels,
        labels: annotations.labels,
        markers_px,
        sun_px,
        legend_px: annotations.legend_px,
        plot_area_px,
    })
}

/// Render the diagram of `series` in `format` (800 x 600 px): one line per series with a
/// marker per model and round masses labelled, the Sun marked with ⊙ and labelled, a legend
/// in the emptiest corner. No label overlaps a marker, another label or the legend; a label
/// that found room only across a line is set on a white backing; one that found no room is
/// left out (see [`HrLayout::labels`]).
///
/// Errors: [`Error::InvalidInput`] for no series, a series without points, or a point whose
/// mass, T_eff or L is not finite and positive.
pub fn render_hr_diagram(
    series: &[HrSeries],
    title: &str,
    format: ImageFormat,
) -> Result<HrFigure> {
    check_input(series)?;
    let (image, layout) = render(&HrDrawing { series, title }, format)?;
    Ok(HrFigure { image, layout })
}

/// Draw the HR diagram of `series` (see [`render_hr_diagram`]) to `path`, written atomically,
/// as SVG or PNG by the file name's extension; returns what was drawn where.
///
/// Errors: as [`render_hr_diagram`]; [`Error::InvalidInput`] for an extension other than
/// `.svg` or `.png` (before anything is drawn); [`Error::Io`] if the file cannot be written (no
/// partial file is left).
pub fn hr_diagram(path: &Path, series: &[HrSeries], title: &str) -> Result<HrLayout> {
    figure_format("figure file", path)?;
    check_input(series)?;
    write_figure(path, &HrDrawing { series, title })
}
