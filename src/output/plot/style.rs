//! Line and marker styles that stay apart in grey print, fonts, and the legend box.

use super::canvas::drawing_error;
use super::font::text_box_px;
use super::geometry::PixelBox;
use crate::error::Result;
use plotters::coord::Shift;
use plotters::element::DashedPathElement;
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, Pos, VPos};

/// Font family for every text: in SVG files the viewer picks the face; PNG files and the layout
/// of both use the embedded DejaVu Sans registered under this name (see `font.rs`).
pub(crate) const FONT: &str = "sans-serif";
/// Requested font sizes. The SVG backend writes `font-size` as the request divided by 1.24, so
/// these give about 22, 18, 16 and 14 px in the file.
pub(crate) const TITLE_SIZE: f64 = 27.0;
pub(crate) const AXIS_LABEL_SIZE: f64 = 23.0;
pub(crate) const TICK_SIZE: f64 = 20.0;
pub(crate) const NOTE_SIZE: f64 = 17.0;

/// Marker shapes.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) enum Marker {
    FilledCircle,
    OpenSquare,
    FilledTriangle,
    Cross,
    OpenCircle,
    FilledSquare,
    None,
}

/// Line dash patterns, in pixels (dash length, gap).
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) enum Dash {
    Solid,
    Dashed(u32, u32),
}

/// Everything that sets one series apart.
#[derive(Debug, Clone, Copy)]
pub(crate) struct SeriesStyle {
    pub color: RGBColor,
    pub marker: Marker,
    pub dash: Dash,
    pub width: u32,
}

// Okabe–Ito colours (Wong 2011, Nature Methods 8, 441), ordered so that neighbours differ
// strongly in grey value.
pub(crate) const BLACK_OI: RGBColor = RGBColor(0, 0, 0);
pub(crate) const VERMILLION: RGBColor = RGBColor(213, 94, 0);
pub(crate) const BLUE_OI: RGBColor = RGBColor(0, 114, 178);
pub(crate) const BLUISH_GREEN: RGBColor = RGBColor(0, 158, 115);
pub(crate) const REDDISH_PURPLE: RGBColor = RGBColor(204, 121, 167);
pub(crate) const ORANGE_OI: RGBColor = RGBColor(230, 159, 0);
/// Fill of convective regions.
pub(crate) const CONVECTIVE_GREY: RGBColor = RGBColor(222, 222, 222);
/// Grid lines.
pub(crate) const GRID_GREY: RGBColor = RGBColor(232, 232, 232);

/// Styles for overlaid series, used in turn (after six they repeat).
pub(crate) const SERIES_STYLES: [SeriesStyle; 6] = [
    SeriesStyle {
        color: BLACK_OI,
        marker: Marker::FilledCircle,
        dash: Dash::Solid,
        width: 2,
    },
    SeriesStyle {
        color: VERMILLION,
        marker: Marker::OpenSquare,
        dash: Dash::Dashed(10, 5),
        width: 2,
    },
    SeriesStyle {
        color: BLUE_OI,
        marker: Marker::FilledTriangle,
        dash: Dash::Dashed(3, 4),
        width: 3,
    },
    SeriesStyle {
        color: BLUISH_GREEN,
        marker: Marker::Cross,
        dash: Dash::Dashed(16, 4),
        width: 2,
    },
    SeriesStyle {
        color: REDDISH_PURPLE,
        marker: Marker::OpenCircle,
        dash: Dash::Solid,
        width: 1,
    },
    SeriesStyle {
        color: ORANGE_OI,
        marker: Marker::FilledSquare,
        dash: Dash::Dashed(6, 6),
        width: 1,
    },
];

/// The style of series number `index`.
pub(crate) fn series_style(index: usize) -> SeriesStyle {
    SERIES_STYLES[index % SERIES_STYLES.len()]
}

/// Marker half-size in pixels.
pub(crate) const MARKER_RADIUS: i32 = 5;

/// A text style of `size` anchored at `h`, `v`.
pub(crate) fn text_style(size: f64, color: RGBColor, h: HPos, v: VPos) -> TextStyle<'static> {
    TextStyle {
        font: (FONT, size).into_font(),
        color: color.to_backend_color(),
        pos: Pos::new(h, v),
    }
}

/// Draw the polyline `points` (in the area's coordinates) with the style's dash and width.
pub(crate) fn draw_line<DB, CT>(
    area: &DrawingArea<DB, CT>,
    points: &[CT::From],
    style: &SeriesStyle,
) -> Result<()>
where
    DB: DrawingBackend,
    CT: CoordTranslate,
    CT::From: Clone,
{
    let shape = ShapeStyle::from(&style.color).stroke_width(style.width);
    match style.dash {
        Dash::Solid => area
            .draw(&PathElement::new(points.to_vec(), shape))
            .map_err(drawing_error),
        Dash::Dashed(dash, gap) => area
            .draw(&DashedPathElement::new(
                points.iter().cloned(),
                dash,
                gap,
                shape,
            ))
            .map_err(drawing_error),
    }
}

/// Draw one marker of `marker` shape at `at` (in the area's coordinates).
pub(crate) fn draw_marker<DB, CT>(
    area: &DrawingArea<DB, CT>,
    at: CT::From,
    marker: Marker,
    color: RGBColor,
) -> Result<()>
where
    DB: DrawingBackend,
    CT: CoordTranslate,
    CT::From: Clone,
{
    let r = MARKER_RADIUS;
    let filled = ShapeStyle::from(&color).filled();
    let outline = ShapeStyle::from(&color).stroke_width(2);
    let result = match marker {
        Marker::FilledCircle => area.draw(&Circle::new(at, r, filled)),
        Marker::OpenCircle => area.draw(&Circle::new(at, r, outline)),
        Marker::FilledTriangle => area.draw(&TriangleMarker::new(at, r + 1, filled)),
        Marker::Cross => area.draw(&Cross::new(at, r, outline)),
        Marker::OpenSquare => {
            area.draw(&(EmptyElement::at(at) + Rectangle::new([(-r, -r), (r, r)], outline)))
        }
        Marker::FilledSquare => {
            area.draw(&(EmptyElement::at(at) + Rectangle::new([(-r, -r), (r, r)], filled)))
        }
        Marker::None => Ok(()),
    };
    result.map_err(drawing_error)
}

/// What one legend row shows beside its text.
#[derive(Debug, Clone)]
pub(crate) enum LegendKey {
    /// A short stretch of line with a marker in the middle.
    Line(SeriesStyle),
    /// A filled swatch (for shaded regions).
    Swatch(RGBColor),
}

/// One legend row.
#[derive(Debug, Clone)]
pub(crate) struct LegendEntry {
    pub label: String,
    pub key: LegendKey,
}

const LEGEND_PAD: i32 = 8;
const LEGEND_KEY_WIDTH: i32 = 40;
const LEGEND_ROW: i32 = 24;

/// Width and height in pixels of the legend box for `entries`, with the text measured in the
/// embedded font.
pub(crate) fn legend_size(entries: &[LegendEntry]) -> Result<(i32, i32)> {
    let mut text_w = 0;
    for e in entries {
        text_w = text_w.max(text_box_px(&e.label, NOTE_SIZE)?.0);
    }
    Ok((
        3 * LEGEND_PAD + LEGEND_KEY_WIDTH + text_w,
        2 * LEGEND_PAD + LEGEND_ROW * entries.len() as i32,
    ))
}

/// Draw a legend box with its top-left corner at pixel `corner` of `area`; returns the box.
pub(crate) fn draw_legend<DB: DrawingBackend>(
    area: &DrawingArea<DB, Shift>,
    corner: (i32, i32),
    entries: &[LegendEntry],
) -> Result<PixelBox> {
    let (w, h) = legend_size(entries)?;
    let (x0, y0) = corner;
    area.draw(&Rectangle::new(
        [(x0, y0), (x0 + w, y0 + h)],
        ShapeStyle::from(&WHITE).filled(),
    ))
    .map_err(drawing_error)?;
    area.draw(&Rectangle::new(
        [(x0, y0), (x0 + w, y0 + h)],
        ShapeStyle::from(&RGBColor(120, 120, 120)).stroke_width(1),
    ))
    .map_err(drawing_error)?;
    for (k, entry) in entries.iter().enumerate() {
        let yc = y0 + LEGEND_PAD + LEGEND_ROW * k as i32 + LEGEND_ROW / 2;
        let xk = x0 + LEGEND_PAD;
        match &entry.key {
            LegendKey::Line(style) => {
                draw_line(area, &[(xk, yc), (xk + LEGEND_KEY_WIDTH, yc)], style)?;
                draw_marker(
                    area,
                    (xk + LEGEND_KEY_WIDTH / 2, yc),
                    style.marker,
                    style.color,
                )?;
            }
            LegendKey::Swatch(color) => {
                area.draw(&Rectangle::new(
                    [(xk, yc - 8), (xk + LEGEND_KEY_WIDTH, yc + 8)],
                    ShapeStyle::from(color).filled(),
                ))
                .map_err(drawing_error)?;
            }
        }
        area.draw(&Text::new(
            entry.label.clone(),
            (xk + LEGEND_KEY_WIDTH + LEGEND_PAD, yc),
            text_style(NOTE_SIZE, BLACK, HPos::Left, VPos::Center),
        ))
        .map_err(drawing_error)?;
    }
    Ok(PixelBox::at(corner, (w, h)))
}

/// Radius in pixels of the circle of the solar symbol (small enough that a model one marker
/// away, such as the 1 M_sun ZAMS model, stays visible beside it).
pub(crate) const SUN_RADIUS: i32 = 6;
/// Colour of the solar symbol's circle: Okabe–Ito orange, which no series uses before the
/// sixth, so that the symbol does not read as a model of the first series.
pub(crate) const SUN_COLOR: RGBColor = ORANGE_OI;

/// Draw the astronomical symbol of the Sun, a circle with a dot at its centre (⊙), centred at
/// pixel `at` of `area`, on a white disc so that it reads as a symbol over the lines; returns
/// the box it covers.
pub(crate) fn draw_sun_symbol<DB: DrawingBackend>(
    area: &DrawingArea<DB, Shift>,
    at: (i32, i32),
) -> Result<PixelBox> {
    area.draw(&Circle::new(
        at,
        SUN_RADIUS,
        ShapeStyle::from(&WHITE).filled(),
    ))
    .map_err(drawing_error)?;
    area.draw(&Circle::new(
        at,
        SUN_RADIUS,
        ShapeStyle::from(&SUN_COLOR).stroke_width(2),
    ))
    .map_err(drawing_error)?;
    area.draw(&Circle::new(at, 2, ShapeStyle::from(&BLACK).filled()))
        .map_err(drawing_error)?;
    Ok(PixelBox::around(at, SUN_RADIUS + 1, SUN_RADIUS + 1))
}

/// Half-length in pixels of the tick that marks a round mass between two models.
pub(crate) const TICK_HALF_LENGTH: i32 = 7;

/// Draw a short tick across the line running from `along.0` to `along.1`, centred at pixel
/// `at` of `area`, in `color`; returns the box it covers.
pub(crate) fn draw_tick<DB: DrawingBackend>(
    area: &DrawingArea<DB, Shift>,
    at: (i32, i32),
    along: ((i32, i32), (i32, i32)),
    color: RGBColor,
) -> Result<PixelBox> {
    let (dx, dy) = (
        f64::from(along.1 .0 - along.0 .0),
        f64::from(along.1 .1 - along.0 .1),
    );
    let length = dx.hypot(dy);
    let (nx, ny) = if length > 0.0 {
        (-dy / length, dx / length)
    } else {
        (0.0, 1.0)
    };
    let h = f64::from(TICK_HALF_LENGTH);
    let end = |s: f64| {
        (
            at.0 + (s * h * nx).round() as i32,
            at.1 + (s * h * ny).round() as i32,
        )
    };
    area.draw(&PathElement::new(
        vec![end(-1.0), end(1.0)],
        ShapeStyle::from(&color).stroke_width(3),
    ))
    .map_err(drawing_error)?;
    Ok(PixelBox::around(
        at,
        TICK_HALF_LENGTH + 1,
        TICK_HALF_LENGTH + 1,
    ))
}

/// Write `text` centred in the pixel box `within` of `area`, in `color`; with `backing`, on a
/// white box first (for a label that had to be set over a line).
pub(crate) fn draw_label<DB: DrawingBackend>(
    area: &DrawingArea<DB, Shift>,
    text: &str,
    within: PixelBox,
    color: RGBColor,
    backing: bool,
) -> Result<()> {
    if backing {
        area.draw(&Rectangle::new(
            [(within.left, within.top), (within.right, within.bottom)],
            ShapeStyle::from(&WHITE).filled(),
        ))
        .map_err(drawing_error)?;
    }
    area.draw(&Text::new(
        text.to_string(),
        within.centre(),
        text_style(NOTE_SIZE, color, HPos::Center, VPos::Center),
    ))
    .map_err(drawing_error)
}
