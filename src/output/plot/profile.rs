//! Profile of one model in two stacked panels against r/R: T/T_c, rho/rho_c, P/P_c,
//! L/L_surface and m/M above; nabla_rad, nabla_ad and nabla below; convective regions shaded
//! in both.

use super::style::{
    draw_legend, draw_line, draw_marker, series_style, Dash, LegendEntry, LegendKey, Marker,
    SeriesStyle, AXIS_LABEL_SIZE, BLACK_OI, BLUE_OI, CONVECTIVE_GREY, FONT, GRID_GREY, ORANGE_OI,
    TICK_SIZE, TITLE_SIZE,
};
use super::{drawing_error, write_svg};
use crate::error::{Error, Result};
use crate::structure::ProfileRow;
use plotters::coord::types::RangedCoordf64;
use plotters::coord::Shift;
use plotters::prelude::*;
use std::path::Path;

/// Figure width, pixels.
pub const PROFILE_WIDTH_PX: u32 = 800;
/// Figure height, pixels (upper panel 470, lower 390).
pub const PROFILE_HEIGHT_PX: u32 = 860;
const TOP_PANEL_PX: u32 = 470;
/// Upper end of the gradient panel's y axis when nabla_rad exceeds it (nabla_rad grows without
/// bound towards a convective surface; the physically interesting range, nabla_ad = 0.4 for an
/// ideal monatomic gas, lies well below).
pub const NABLA_AXIS_CAP: f64 = 1.0;
/// Right margin of each panel, holding its legend.
const LEGEND_MARGIN_PX: u32 = 190;

/// A rendered profile figure, with what was drawn (for checks).
#[derive(Debug, Clone, PartialEq)]
pub struct ProfileFigure {
    /// The SVG document.
    pub svg: String,
    /// Shaded convective regions as (r/R start, r/R end), centre outwards.
    pub convective_bands: Vec<(f64, f64)>,
    /// Upper end of the gradient panel's y axis.
    pub nabla_axis_top: f64,
    /// Whether some gradient exceeded `nabla_axis_top` and was cut off at it.
    pub nabla_clipped: bool,
}

type Chart<'a, 'b> = ChartContext<'a, SVGBackend<'b>, Cartesian2d<RangedCoordf64, RangedCoordf64>>;

fn check_rows(rows: &[ProfileRow]) -> Result<()> {
    if rows.len() < 2 {
        return Err(Error::invalid(
            "profile rows",
            rows.len(),
            "at least 2 rows, centre first",
        ));
    }
    let centre = &rows[0];
    let surface = &rows[rows.len() - 1];
    let positive = |v: f64| v.is_finite() && v > 0.0;
    for (name, v) in [
        ("central temperature_k", centre.temperature_k),
        ("central density_g_cm3", centre.density_g_cm3),
        ("central pressure_dyn_cm2", centre.pressure_dyn_cm2),
        ("surface luminosity_erg_s", surface.luminosity_erg_s),
    ] {
        if !positive(v) {
            return Err(Error::invalid(
                name,
                v,
                "a finite positive value (profiles are normalised by it)",
            ));
        }
    }
    for (i, r) in rows.iter().enumerate() {
        for (name, v) in [
            ("r_over_R", r.r_over_r),
            ("m_over_M", r.m_over_m),
            ("temperature_k", r.temperature_k),
            ("density_g_cm3", r.density_g_cm3),
            ("pressure_dyn_cm2", r.pressure_dyn_cm2),
            ("luminosity_erg_s", r.luminosity_erg_s),
        ] {
            if !v.is_finite() {
                return Err(Error::invalid(
                    &format!("profile row {i} {name}"),
                    v,
                    "a finite number",
                ));
            }
        }
    }
    Ok(())
}

/// Convective regions as (r/R start, r/R end): runs of rows with `convective == 1`, each
/// widened to halfway to the neighbouring radiative rows (to the first or last row at the
/// ends), so that a region resolved by one row still shows.
pub(crate) fn convective_bands(rows: &[ProfileRow]) -> Vec<(f64, f64)> {
    let n = rows.len();
    let mut bands = Vec::new();
    let mut i = 0;
    while i < n {
        if rows[i].convective != 1 {
            i += 1;
            continue;
        }
        let mut j = i;
        while j + 1 < n && rows[j + 1].convective == 1 {
            j += 1;
        }
        let start = if i == 0 {
            rows[0].r_over_r
        } else {
            0.5 * (rows[i - 1].r_over_r + rows[i].r_over_r)
        };
        let end = if j + 1 == n {
            rows[j].r_over_r
        } else {
            0.5 * (rows[j].r_over_r + rows[j + 1].r_over_r)
        };
        bands.push((start, end));
        i = j + 1;
    }
    bands
}

/// The parts of the polyline `points` with lo <= y <= hi, cut exactly where it crosses a
/// limit; a non-finite point breaks the line.
pub(crate) fn clip_to_band(points: &[(f64, f64)], lo: f64, hi: f64) -> Vec<Vec<(f64, f64)>> {
    let mut out = Vec::new();
    let mut current: Vec<(f64, f64)> = Vec::new();
    let mut flush = |current: &mut Vec<(f64, f64)>| {
        if current.len() >= 2 {
            out.push(std::mem::take(current));
        } else {
            current.clear();
        }
    };
    for w in points.windows(2) {
        let (a, b) = (w[0], w[1]);
        if !(a.0.is_finite() && a.1.is_finite() && b.0.is_finite() && b.1.is_finite()) {
            flush(&mut current);
            continue;
        }
        let dy = b.1 - a.1;
        let (mut t0, mut t1) = (0.0_f64, 1.0_f64);
        if dy == 0.0 {
            if a.1 < lo || a.1 > hi {
                flush(&mut current);
                continue;
            }
        } else {
            let ta = (lo - a.1) / dy;
            let tb = (hi - a.1) / dy;
            t0 = t0.max(ta.min(tb));
            t1 = t1.min(ta.max(tb));
            if t0 > t1 {
                flush(&mut current);
                continue;
            }
        }
        let at = |t: f64| (a.0 + t * (b.0 - a.0), a.1 + t * dy);
        if current.is_empty() || t0 > 0.0 {
            flush(&mut current);
            current.push(at(t0));
        }
        current.push(at(t1));
        if t1 < 1.0 {
            flush(&mut current);
        }
    }
    flush(&mut current);
    out
}

/// One curve of a panel.
struct Curve {
    label: &'static str,
    style: SeriesStyle,
    values: Vec<f64>,
}

/// Linear interpolation of `values` at `x` over the increasing abscissae `xs`.
fn interpolate(xs: &[f64], values: &[f64], x: f64) -> Option<f64> {
    let k = xs.windows(2).position(|w| w[0] <= x && x <= w[1])?;
    let (x0, x1) = (xs[k], xs[k + 1]);
    let t = if x1 > x0 { (x - x0) / (x1 - x0) } else { 0.0 };
    Some(values[k] + t * (values[k + 1] - values[k]))
}

/// What one panel shows.
struct Panel<'a> {
    /// Title above the panel ("" for none).
    caption: &'a str,
    /// x axis label ("" for none: tick labels only).
    x_desc: &'a str,
    /// y axis label.
    y_desc: &'a str,
    /// y axis range.
    y_range: (f64, f64),
    /// Abscissae r/R, shared by every curve.
    r: &'a [f64],
    curves: &'a [Curve],
    /// Convective regions to shade.
    bands: &'a [(f64, f64)],
}

/// Draw one panel: frame, grid, shading, curves with sparse markers, legend at the right.
fn draw_panel(area: &DrawingArea<SVGBackend<'_>, Shift>, panel: &Panel) -> Result<()> {
    let Panel {
        caption,
        x_desc,
        y_desc,
        y_range,
        r,
        curves,
        bands,
    } = *panel;
    let mut builder = ChartBuilder::on(area);
    builder
        .margin(14)
        .margin_right(LEGEND_MARGIN_PX)
        .x_label_area_size(if x_desc.is_empty() { 40 } else { 66 })
        .y_label_area_size(86);
    if !caption.is_empty() {
        builder.caption(caption, (FONT, TITLE_SIZE));
    }
    let mut chart: Chart = builder
        .build_cartesian_2d(0.0..1.0, y_range.0..y_range.1)
        .map_err(drawing_error)?;
    // Shading first, so grid and curves lie on top of it.
    for &(r0, r1) in bands {
        chart
            .plotting_area()
            .draw(&Rectangle::new(
                [(r0, y_range.1), (r1, y_range.0)],
                ShapeStyle::from(&CONVECTIVE_GREY).filled(),
            ))
            .map_err(drawing_error)?;
    }
    chart
        .configure_mesh()
        .bold_line_style(GRID_GREY)
        .light_line_style(WHITE.mix(0.0))
        .x_labels(6)
        .y_labels(6)
        .x_label_formatter(&|v| format!("{:.1}", v + 0.0))
        .y_label_formatter(&|v| format!("{:.1}", v + 0.0))
        .label_style((FONT, TICK_SIZE))
        .axis_desc_style((FONT, AXIS_LABEL_SIZE))
        .x_desc(x_desc)
        .y_desc(y_desc)
        .draw()
        .map_err(drawing_error)?;
    let plot = chart.plotting_area();
    for (c, curve) in curves.iter().enumerate() {
        let points: Vec<(f64, f64)> = r
            .iter()
            .copied()
            .zip(curve.values.iter().copied())
            .collect();
        for piece in clip_to_band(&points, y_range.0, y_range.1) {
            draw_line(plot, &piece, &curve.style)?;
        }
        // Sparse markers every 0.1 in r/R, staggered between curves, so that curves can be
        // told apart in grey print where they cross.
        if curve.style.marker != Marker::None {
            for k in 0..10 {
                let x = 0.05 + 0.1 * k as f64 + 0.02 * (c % 5) as f64;
                if let Some(y) = interpolate(r, &curve.values, x) {
                    if y.is_finite() && y >= y_range.0 && y <= y_range.1 {
                        draw_marker(plot, (x, y), curve.style.marker, curve.style.color)?;
                    }
                }
            }
        }
    }
    plot.draw(&Rectangle::new(
        [(0.0, y_range.1), (1.0, y_range.0)],
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
    draw_legend(area, (xs.end - ax + 14, ys.start - ay), &legend)
}

/// Render the profile figure to memory (800 x 860 px).
///
/// Upper panel: T/T_c, rho/rho_c, P/P_c (centre = first row), L/L_surface (surface = last
/// row) and m/M against r/R on 0..1. Lower panel: nabla_rad, nabla_ad and nabla on
/// [0, min(1.08 max, [`NABLA_AXIS_CAP`])]; when a gradient is cut off, the axis label says so.
/// Rows with `convective == 1` are shaded grey in both panels.
///
/// Errors: [`Error::InvalidInput`] for fewer than two rows, a non-positive central T, rho, P
/// or surface L, or a non-finite value in a plotted column of the upper panel.
pub fn render_profile(rows: &[ProfileRow], title: &str) -> Result<ProfileFigure> {
    check_rows(rows)?;
    let centre = rows[0];
    let surface_l = rows[rows.len() - 1].luminosity_erg_s;
    let r: Vec<f64> = rows.iter().map(|p| p.r_over_r).collect();
    let column = |f: &dyn Fn(&ProfileRow) -> f64| rows.iter().map(f).collect::<Vec<f64>>();
    let upper = [
        Curve {
            label: "T / T_c",
            style: series_style(0),
            values: column(&|p| p.temperature_k / centre.temperature_k),
        },
        Curve {
            label: "rho / rho_c",
            style: series_style(1),
            values: column(&|p| p.density_g_cm3 / centre.density_g_cm3),
        },
        Curve {
            label: "P / P_c",
            style: series_style(2),
            values: column(&|p| p.pressure_dyn_cm2 / centre.pressure_dyn_cm2),
        },
        Curve {
            label: "L / L_surface",
            style: series_style(3),
            values: column(&|p| p.luminosity_erg_s / surface_l),
        },
        Curve {
            label: "m / M",
            style: series_style(4),
            values: column(&|p| p.m_over_m),
        },
    ];
    // The actual gradient is drawn first and broad, so that where it follows nabla_rad or
    // nabla_ad the thinner line stays visible on top of it.
    let lower = [
        Curve {
            label: "nabla",
            style: SeriesStyle {
                color: ORANGE_OI,
                marker: Marker::None,
                dash: Dash::Solid,
                width: 6,
            },
            values: column(&|p| p.nabla),
        },
        Curve {
            label: "nabla_ad",
            style: SeriesStyle {
                color: BLUE_OI,
                marker: Marker::FilledTriangle,
                dash: Dash::Dashed(3, 4),
                width: 3,
            },
            values: column(&|p| p.nabla_ad),
        },
        Curve {
            label: "nabla_rad",
            style: SeriesStyle {
                color: BLACK_OI,
                marker: Marker::FilledCircle,
                dash: Dash::Dashed(10, 5),
                width: 2,
            },
            values: column(&|p| p.nabla_rad),
        },
    ];
    let nabla_max = lower
        .iter()
        .flat_map(|c| c.values.iter().copied())
        .filter(|v| v.is_finite())
        .fold(0.0_f64, f64::max);
    let nabla_axis_top = if nabla_max > 0.0 {
        (1.08 * nabla_max).min(NABLA_AXIS_CAP)
    } else {
        NABLA_AXIS_CAP
    };
    let nabla_clipped = nabla_max > nabla_axis_top;
    let nabla_desc = if nabla_clipped {
        format!("d ln T / d ln P  (cut at {nabla_axis_top})")
    } else {
        "d ln T / d ln P".to_string()
    };
    let bands = convective_bands(rows);

    let mut svg = String::new();
    {
        let root = SVGBackend::with_string(&mut svg, (PROFILE_WIDTH_PX, PROFILE_HEIGHT_PX))
            .into_drawing_area();
        root.fill(&WHITE).map_err(drawing_error)?;
        let (top, bottom) = root.split_vertically(TOP_PANEL_PX);
        draw_panel(
            &top,
            &Panel {
                caption: title,
                x_desc: "",
                y_desc: "normalised value",
                y_range: (-0.02, 1.04),
                r: &r,
                curves: &upper,
                bands: &bands,
            },
        )?;
        draw_panel(
            &bottom,
            &Panel {
                caption: "",
                x_desc: "r / R",
                y_desc: &nabla_desc,
                y_range: (0.0, nabla_axis_top),
                r: &r,
                curves: &lower,
                bands: &bands,
            },
        )?;
        root.present().map_err(drawing_error)?;
    }
    Ok(ProfileFigure {
        svg,
        convective_bands: bands,
        nabla_axis_top,
        nabla_clipped,
    })
}

/// Draw the profile figure of `rows` (centre first) to the SVG file `path`, written
/// atomically. See [`render_profile`] for the content and the errors; [`Error::Io`] if the
/// file cannot be written (no partial file is left).
pub fn profile_plot(path: &Path, rows: &[ProfileRow], title: &str) -> Result<()> {
    write_svg(path, render_profile(rows, title).map(|f| f.svg))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn clipping_cuts_at_the_limit() {
        let line = [(0.0, 0.5), (1.0, 1.5), (2.0, 0.5)];
        let parts = clip_to_band(&line, 0.0, 1.0);
        assert_eq!(parts.len(), 2);
        // Crossings of y = 1 at x = 0.5 and x = 1.5 (exact in binary floating point).
        assert_eq!(parts[0], vec![(0.0, 0.5), (0.5, 1.0)]);
        assert_eq!(parts[1], vec![(1.5, 1.0), (2.0, 0.5)]);
    }

    #[test]
    fn clipping_keeps_a_line_inside() {
        let line = [(0.0, 0.1), (1.0, 0.2), (2.0, 0.3)];
        assert_eq!(clip_to_band(&line, 0.0, 1.0), vec![line.to_vec()]);
    }

    #[test]
    fn clipping_breaks_at_non_finite_points() {
        let line = [
            (0.0, 0.1),
            (1.0, 0.2),
            (2.0, f64::NAN),
            (3.0, 0.3),
            (4.0, 0.4),
        ];
        let parts = clip_to_band(&line, 0.0, 1.0);
        assert_eq!(
            parts,
            vec![vec![(0.0, 0.1), (1.0, 0.2)], vec![(3.0, 0.3), (4.0, 0.4)]]
        );
    }

    fn row(r: f64, convective: u8) -> ProfileRow {
        ProfileRow {
            mass_g: 0.0,
            m_over_m: 0.0,
            radius_cm: 0.0,
            r_over_r: r,
            pressure_dyn_cm2: 1.0,
            temperature_k: 1.0,
            density_g_cm3: 1.0,
            luminosity_erg_s: 1.0,
            eps_pp_erg_g_s: 0.0,
            eps_cno_erg_g_s: 0.0,
            opacity_cm2_g: 0.0,
            nabla_rad: 0.0,
            nabla_ad: 0.4,
            nabla: 0.0,
            convective,
            mu: 0.6,
            gamma1: 5.0 / 3.0,
            brunt_n2_rad2_s2: 0.0,
            lamb_l1_rad_s: 0.0,
            lamb_l2_rad_s: 0.0,
        }
    }

    #[test]
    fn bands_span_runs_of_convective_rows() {
        let rows = [
            row(0.0, 1),
            row(0.1, 1),
            row(0.2, 0),
            row(0.5, 0),
            row(0.6, 1),
            row(0.8, 0),
            row(0.9, 1),
            row(1.0, 1),
        ];
        let bands = convective_bands(&rows);
        assert_eq!(bands.len(), 3);
        // Edges halfway between neighbouring rows; tolerance for the midpoint rounding.
        let expected = [(0.0, 0.15), (0.55, 0.7), (0.85, 1.0)];
        for (b, e) in bands.iter().zip(expected) {
            assert!(
                (b.0 - e.0).abs() < 1e-12 && (b.1 - e.1).abs() < 1e-12,
                "{b:?} vs {e:?}"
            );
        }
    }
}
