//! The PNG surface: `plotters`' bitmap backend for shapes, with text set from the embedded font
//! at the same size and baseline as the SVG backend asks a viewer for, and the finished RGB
//! buffer encoded as PNG by the `png` crate (pure Rust: no system image or font library).
//!
//! Text is measured for the chart layout exactly as for SVG (through the font registered with
//! `plotters`), so that both formats put every axis, marker and label at the same pixel.

use super::font::{advance_width, em_px, embedded_font, scaled};
use ab_glyph::{point, Font, ScaleFont};
use plotters::prelude::*;
use plotters_backend::{
    text_anchor::{HPos, VPos},
    BackendColor, BackendCoord, BackendStyle, BackendTextStyle, DrawingErrorKind,
};
use plotters_bitmap::BitMapBackendError;

/// A bitmap surface over an RGB buffer (3 bytes per pixel, rows top to bottom).
pub(crate) struct RasterCanvas<'a> {
    inner: BitMapBackend<'a>,
}

impl<'a> RasterCanvas<'a> {
    /// A surface of `size` pixels over `buffer`, which must hold 3 bytes per pixel.
    pub(crate) fn new(buffer: &'a mut [u8], size: (u32, u32)) -> Self {
        Self {
            inner: BitMapBackend::with_buffer(buffer, size),
        }
    }
}

/// The embedded font is missing (never for a correct build).
#[derive(Debug)]
struct FontUnavailable;

impl std::fmt::Display for FontUnavailable {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str("the embedded font could not be read")
    }
}

impl std::error::Error for FontUnavailable {}

type DrawResult = Result<(), DrawingErrorKind<BitMapBackendError>>;

impl DrawingBackend for RasterCanvas<'_> {
    type ErrorType = BitMapBackendError;

    fn get_size(&self) -> (u32, u32) {
        self.inner.get_size()
    }

    fn ensure_prepared(&mut self) -> DrawResult {
        self.inner.ensure_prepared()
    }

    fn present(&mut self) -> DrawResult {
        self.inner.present()
    }

    fn draw_pixel(&mut self, point: BackendCoord, color: BackendColor) -> DrawResult {
        self.inner.draw_pixel(point, color)
    }

    fn draw_line<S: BackendStyle>(
        &mut self,
        from: BackendCoord,
        to: BackendCoord,
        style: &S,
    ) -> DrawResult {
        self.inner.draw_line(from, to, style)
    }

    fn draw_rect<S: BackendStyle>(
        &mut self,
        upper_left: BackendCoord,
        bottom_right: BackendCoord,
        style: &S,
        fill: bool,
    ) -> DrawResult {
        self.inner.draw_rect(upper_left, bottom_right, style, fill)
    }

    fn draw_path<S: BackendStyle, I: IntoIterator<Item = BackendCoord>>(
        &mut self,
        path: I,
        style: &S,
    ) -> DrawResult {
        self.inner.draw_path(path, style)
    }

    fn draw_circle<S: BackendStyle>(
        &mut self,
        center: BackendCoord,
        radius: u32,
        style: &S,
        fill: bool,
    ) -> DrawResult {
        self.inner.draw_circle(center, radius, style, fill)
    }

    fn fill_polygon<S: BackendStyle, I: IntoIterator<Item = BackendCoord>>(
        &mut self,
        vertices: I,
        style: &S,
    ) -> DrawResult {
        self.inner.fill_polygon(vertices, style)
    }

    fn blit_bitmap(&mut self, pos: BackendCoord, (w, h): (u32, u32), src: &[u8]) -> DrawResult {
        self.inner.blit_bitmap(pos, (w, h), src)
    }

    /// Text with the anchors of the SVG backend: horizontally at the start, middle or end of
    /// the advance width; vertically with the baseline 0.76 em below the anchor (top), half an
    /// x-height below it (centre) or half an x-height above it (bottom). Rotated text turns
    /// about the anchor.
    fn draw_text<S: BackendTextStyle>(
        &mut self,
        text: &str,
        style: &S,
        pos: BackendCoord,
    ) -> DrawResult {
        let color = style.color();
        if color.alpha == 0.0 {
            return Ok(());
        }
        let font =
            embedded_font().map_err(|_| DrawingErrorKind::FontError(Box::new(FontUnavailable)))?;
        let em = em_px(style.size());
        let face = scaled(font, em);
        let width = advance_width(&face, text);
        let x_height = face
            .outline_glyph(face.scaled_glyph('x'))
            .map_or(0.5 * em, |g| -g.px_bounds().min.y);
        let anchor = style.anchor();
        let x0 = match anchor.h_pos {
            HPos::Left => 0.0,
            HPos::Center => -0.5 * width,
            HPos::Right => -width,
        };
        let baseline = match anchor.v_pos {
            VPos::Top => 0.76 * em,
            VPos::Center => 0.5 * x_height,
            VPos::Bottom => -0.5 * x_height,
        };
        let transform = style.transform();
        let (w, h) = self.get_size();
        let mut caret = x0;
        let mut previous = None;
        for c in text.chars() {
            let id = face.glyph_id(c);
            if let Some(p) = previous {
                caret += face.kern(p, id);
            }
            previous = Some(id);
            let glyph = id.with_scale_and_position(face.scale(), point(caret, baseline));
            caret += face.h_advance(id);
            let Some(outline) = font.outline_glyph(glyph) else {
                continue;
            };
            let bounds = outline.px_bounds();
            let mut pixels = Vec::new();
            outline.draw(|x, y, coverage| {
                if coverage > 0.0 {
                    pixels.push((
                        bounds.min.x as i32 + x as i32,
                        bounds.min.y as i32 + y as i32,
                        coverage.min(1.0),
                    ));
                }
            });
            for (x, y, coverage) in pixels {
                let (dx, dy) = transform.transform(x, y);
                let (px, py) = (pos.0 + dx, pos.1 + dy);
                if px >= 0 && py >= 0 && (px as u32) < w && (py as u32) < h {
                    self.inner.draw_pixel(
                        (px, py),
                        BackendColor {
                            alpha: color.alpha * f64::from(coverage),
                            rgb: color.rgb,
                        },
                    )?;
                }
            }
        }
        Ok(())
    }
}

/// Encode an RGB buffer of `size` pixels as PNG.
pub(crate) fn encode_png(rgb: &[u8], (width, height): (u32, u32)) -> std::io::Result<Vec<u8>> {
    let mut out = Vec::new();
    {
        let mut encoder = png::Encoder::new(&mut out, width, height);
        encoder.set_color(png::ColorType::Rgb);
        encoder.set_depth(png::BitDepth::Eight);
        let mut writer = encoder.write_header().map_err(std::io::Error::other)?;
        writer
            .write_image_data(rgb)
            .map_err(std::io::Error::other)?;
        writer.finish().map_err(std::io::Error::other)?;
    }
    Ok(out)
}
