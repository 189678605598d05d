//! One panel of the profile figure: frame, grid, shaded convective regions, curves with sparse
//! markers, and the legend in the right margin.

use super::super::canvas::drawing_error;
use super::super::geometry::{clip_to_band, interpolate};
use super::super::style::{
    draw_legend, draw_line, draw_marker, LegendEntry, LegendKey, Marker, SeriesStyle,
    AXIS_LABEL_SIZE, CONVECTIVE_GREY, FONT, GRID_GREY, TICK_SIZE, TITLE_SIZE,
};
use super::Abscissa;
use crate::error::Result;
use plotters::coord::types::RangedCoordf64;
use plotters::coord::Shift;
use plotters::prelude::*;

/// Right margin of each panel, holding its legend.
const LEGEND_MARGIN_PX: u32 = 190;
/// Markers along each curve (staggered between curves, so that curves can be told apart in
/// grey print where they cross).
const MARKERS_PER_CURVE: usize = 10;

/// One curve of a panel.
pub(super) struct Curve {
    pub label: &'static str,
    pub style: SeriesStyle,
    pub values: Vec<f64>,
}

/// What one panel shows.
pub(super) struct Panel<'a> {
    /// Title above the panel ("" for none).
    pub caption: &'a str,
    /// Whether the abscissa's name is written under the axis (tick labels only otherwise).
    pub x_desc: bool,
    /// y axis label.
    pub y_desc: &'a str,
    /// y axis range.
    pub y_range: (f64, f64),
    /// What the x axis shows.
    pub abscissa: Abscissa,
    /// Chart coordinates of the rows (abscissa times its sign), shared by every curve.
    pub u: &'a [f64],
    pub curves: &'a [Curve],
    /// Convective regions to shade, in the chart coordinate.
    pub bands: &'a [(f64, f64)],
}

/// Tick label of chart coordinate `u`: r/R and m/M with one decimal, log10 P as a whole
/// number (its axis spans ten or more decades).
fn tick_label(abscissa: Abscissa, u: f64) -> String {
    let v = abscissa.sign() * u + 0.0;
    match abscissa {
        Abscissa::Radius | Abscissa::Mass => format!("{v:.1}"),
        Abscissa::Pressure => format!("{v:.0}"),
    }
}

/// Draw one panel on `area`.
pub(super) fn draw_panel<DB: DrawingBackend>(
    area: &DrawingArea<DB, Shift>,
    panel: &Panel,
) -> Result<()> {
    let Panel {
        caption,
        x_desc,
        y_desc,
        y_range,
        abscissa,
        u,
        curves,
        bands,
    } = *panel;
    let x_range = match abscissa {
        Abscissa::Radius | Abscissa::Mass => (0.0, 1.0),
        Abscissa::Pressure => (u[0], u[u.len() - 1]),
    };
    let mut builder = ChartBuilder::on(area);
    builder
        .margin(14)
        .margin_right(LEGEND_MARGIN_PX)
        .x_label_area_size(if x_desc { 66 } else { 40 })
        .y_label_area_size(86);
    if !caption.is_empty() {
        builder.caption(caption, (FONT, TITLE_SIZE));
    }
    let mut chart: ChartContext<DB, Cartesian2d<RangedCoordf64, RangedCoordf64>> = builder
        .build_cartesian_2d(x_range.0..x_range.1, y_range.0..y_range.1)
        .map_err(drawing_error)?;
    // Shading first, so grid and curves lie on top of it.
    for &(u0, u1) in bands {
        chart
            .plotting_area()
            .draw(&Rectangle::new(
                [(u0, y_range.1), (u1, y_range.0)],
                ShapeStyle::from(&CONVECTIVE_GREY).filled(),
            ))
            .map_err(drawing_error)?;
    }
    let x_format = move |u: &f64| tick_label(abscissa, *u);
    chart
        .configure_mesh()
        .bold_line_style(GRID_GREY)
        .light_line_style(WHITE.mix(0.0))
        .x_labels(if abscissa == Abscissa::Pressure {
            10
        } else {
            6
        })
        .y_labels(6)
        .x_label_formatter(&x_format)
        .y_label_formatter(&|v| format!("{:.1}", v + 0.0))
        .label_style((FONT, TICK_SIZE))
        .axis_desc_style((FONT, AXIS_LABEL_SIZE))
        .x_desc(if x_desc { abscissa.axis_label() } else { "" })
        .y_desc(y_desc)
        .draw()
        .map_err(drawing_error)?;
    let plot = chart.plotting_area();
    let span = x_range.1 - x_range.0;
    for (c, curve) in curves.iter().enumerate() {
        let points: Vec<(f64, f64)> = u
            .iter()
            .copied()
            .zip(curve.values.iter().copied())
            .collect();
        for piece in clip_to_band(&points, y_range.0, y_range.1) {
            draw_line(plot, &piece, &curve.style)?;
        }
        if curve.style.marker != Marker::None {
            for k in 0..MARKERS_PER_CURVE {
                let step = span / MARKERS_PER_CURVE as f64;
                let x = x_range.0 + step * (0.5 + k as f64 + 0.2 * (c % 5) as f64);
                if let Some(y) = interpolate(u, &curve.values, x) {
                    if y.is_finite() && y >= y_range.0 && y <= y_range.1 {
                        draw_marker(plot, (x, y), curve.style.marker, curve.style.color)?;
                    }
                }
            }
        }
    }
    plot.draw(&Rectangle::new(
        [(x_range.0, y_range.1), (x_range.1, y_range.0)],
        ShapeStyle::from(&BLACK).stroke_width(1),
    ))
    .map_err(drawing_error)?;

    let mut legend: Vec<LegendEntry> = curves
        .iter()
        .map(|c| LegendEntry {
            label: c.label.to_string(),
            key: LegendKey::Line(c.style),
        })
        .collect();
    if !bands.is_empty() {
        legend.push(LegendEntry {
            label: "convective".to_string(),
            key: LegendKey::Swatch(CONVECTIVE_GREY),
        });
    }
    let (xs, ys) = plot.get_pixel_range();
    let (ax, ay) = area.get_base_pixel();
    draw_legend(area, (xs.end - ax + 14, ys.start - ay), &legend).map(|_| ())
}
