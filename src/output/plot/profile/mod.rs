//! Profile of one model in two stacked panels against r/R, m/M or log10 P (see [`Abscissa`]):
//! normalised T, rho, P, L and the other coordinates above; nabla_rad, nabla_ad and nabla
//! below; convective regions shaded in both.

mod abscissa;
mod panel;

pub use abscissa::Abscissa;

use super::canvas::{figure_format, render, write_figure, Figure, ImageFormat};
use super::style::{series_style, Dash, Marker, SeriesStyle, BLACK_OI, BLUE_OI, ORANGE_OI};
use crate::error::{Error, Result};
use crate::structure::ProfileRow;
use abscissa::{convective_bands, coordinates};
use panel::{draw_panel, Curve, Panel};
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

/// What was drawn on a profile figure (for checks).
#[derive(Debug, Clone, PartialEq)]
pub struct ProfileLayout {
    /// What the x axis shows.
    pub abscissa: Abscissa,
    /// The x axis from the centre (left) to the surface (right), in the abscissa's own values
    /// (r/R, m/M or log10 P).
    pub x_range: (f64, f64),
    /// Shaded convective regions as (start, end) in the abscissa's own values, centre
    /// outwards (on the pressure axis start > end).
    pub convective_bands: Vec<(f64, f64)>,
    /// Upper end of the gradient panel's y axis.
    pub nabla_axis_top: f64,
    /// Whether some gradient exceeded `nabla_axis_top` and was cut off at it.
    pub nabla_clipped: bool,
    /// Legend labels of the upper panel's curves, top to bottom.
    pub upper_curves: Vec<&'static str>,
}

/// A rendered profile figure: the file's bytes and what was drawn.
#[derive(Debug, Clone, PartialEq)]
pub struct ProfileFigure {
    /// The image: SVG text or PNG data, as asked.
    pub image: Vec<u8>,
    /// What was drawn.
    pub layout: ProfileLayout,
}

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

/// The upper panel's curves: the normalised state, then whichever of m/M and r/R is not on the
/// x axis (both on the pressure axis, where P/P_c would only repeat the axis). Each quantity
/// keeps its style whatever the abscissa.
fn upper_curves(rows: &[ProfileRow], abscissa: Abscissa) -> Vec<Curve> {
    let centre = rows[0];
    let surface_l = rows[rows.len() - 1].luminosity_erg_s;
    let column = |f: &dyn Fn(&ProfileRow) -> f64| rows.iter().map(f).collect::<Vec<f64>>();
    let mut curves = vec![
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
    ];
    if abscissa != Abscissa::Pressure {
        curves.push(Curve {
            label: "P / P_c",
            style: series_style(2),
            values: column(&|p| p.pressure_dyn_cm2 / centre.pressure_dyn_cm2),
        });
    }
    curves.push(Curve {
        label: "L / L_surface",
        style: series_style(3),
        values: column(&|p| p.luminosity_erg_s / surface_l),
    });
    if abscissa != Abscissa::Mass {
        curves.push(Curve {
            label: "m / M",
            style: series_style(4),
            values: column(&|p| p.m_over_m),
        });
    }
    if abscissa != Abscissa::Radius {
        curves.push(Curve {
            label: "r / R",
            style: series_style(5),
            values: column(&|p| p.r_over_r),
        });
    }
    curves
}

/// The lower panel's curves. The actual gradient is drawn first and broad, so that where it
/// follows nabla_rad or nabla_ad the thinner line stays visible on top of it.
fn gradient_curves(rows: &[ProfileRow]) -> Vec<Curve> {
    let column = |f: &dyn Fn(&ProfileRow) -> f64| rows.iter().map(f).collect::<Vec<f64>>();
    vec![
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
    ]
}

/// The figure of `rows` against `abscissa`, ready to draw on any backend.
struct ProfileDrawing<'a> {
    rows: &'a [ProfileRow],
    title: &'a str,
    abscissa: Abscissa,
}

impl Figure for ProfileDrawing<'_> {
    type Layout = ProfileLayout;

    fn size_px(&self) -> (u32, u32) {
        (PROFILE_WIDTH_PX, PROFILE_HEIGHT_PX)
    }

    fn draw<DB: DrawingBackend>(&self, root: &DrawingArea<DB, Shift>) -> Result<ProfileLayout> {
        let (rows, abscissa) = (self.rows, self.abscissa);
        let u = coordinates(rows, abscissa)?;
        let upper = upper_curves(rows, abscissa);
        let lower = gradient_curves(rows);
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
        let bands = convective_bands(rows, &u);
        let (top, bottom) = root.split_vertically(TOP_PANEL_PX);
        draw_panel(
            &top,
            &Panel {
                caption: self.title,
                x_desc: false,
                y_desc: "normalised value",
                y_range: (-0.02, 1.04),
                abscissa,
                u: &u,
                curves: &upper,
                bands: &bands,
            },
        )?;
        draw_panel(
            &bottom,
            &Panel {
                caption: "",
                x_desc: true,
                y_desc: &nabla_desc,
                y_range: (0.0, nabla_axis_top),
                abscissa,
                u: &u,
                curves: &lower,
                bands: &bands,
            },
        )?;
        let s = abscissa.sign();
        let x_range = match abscissa {
            Abscissa::Radius | Abscissa::Mass => (0.0, 1.0),
            Abscissa::Pressure => (s * u[0], s * u[u.len() - 1]),
        };
        Ok(ProfileLayout {
            abscissa,
            x_range,
            convective_bands: bands.iter().map(|&(a, b)| (s * a, s * b)).collect(),
            nabla_axis_top,
            nabla_clipped,
            upper_curves: upper.iter().map(|c| c.label).collect(),
        })
    }
}

/// Render the profile figure in `format` (800 x 860 px) against `abscissa`.
///
/// Upper panel: T/T_c, rho/rho_c, P/P_c (centre = first row), L/L_surface (surface = last
/// row), and m/M and r/R where they are not the abscissa (P/P_c is left out on the pressure
/// axis). Lower panel: nabla_rad, nabla_ad and nabla on [0, min(1.08 max,
/// [`NABLA_AXIS_CAP`])]; when a gradient is cut off, the axis label says so. Rows with
/// `convective == 1` are shaded grey in both panels. The x axis runs from the centre (left) to
/// the surface: r/R and m/M on [0, 1], log10 P from its central to its surface value.
///
/// Errors: [`Error::InvalidInput`] for fewer than two rows, a non-positive central T, rho, P
/// or surface L, a non-finite value in a plotted column of the upper panel, or (pressure axis)
/// a pressure that is not positive.
pub fn render_profile(
    rows: &[ProfileRow],
    title: &str,
    abscissa: Abscissa,
    format: ImageFormat,
) -> Result<ProfileFigure> {
    check_rows(rows)?;
    let (image, layout) = render(
        &ProfileDrawing {
            rows,
            title,
            abscissa,
        },
        format,
    )?;
    Ok(ProfileFigure { image, layout })
}

/// Draw the profile figure of `rows` (centre first) against `abscissa` to `path`, written
/// atomically, as SVG or PNG by the file name's extension; returns what was drawn. See
/// [`render_profile`] for the content and the errors; [`Error::InvalidInput`] also for an
/// extension other than `.svg` or `.png` (before anything is drawn), [`Error::Io`] if the file
/// cannot be written (no partial file is left).
pub fn profile_plot(
    path: &Path,
    rows: &[ProfileRow],
    title: &str,
    abscissa: Abscissa,
) -> Result<ProfileLayout> {
    figure_format("figure file", path)?;
    check_rows(rows)?;
    write_figure(
        path,
        &ProfileDrawing {
            rows,
            title,
            abscissa,
        },
    )
}
