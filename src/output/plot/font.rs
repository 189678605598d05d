//! The one typeface of every figure, embedded in the program: DejaVu Sans 2.37 (Bitstream Vera
//! licence with the Arev additions, text in `assets/fonts/DejaVuSans-LICENSE.txt`, which permits
//! redistribution of the unmodified font with the software).
//!
//! Nothing is read from the system at build or run time. The font is registered with `plotters`
//! under [`FONT`] (which sizes text while laying out a chart, for either format), and the PNG
//! surface rasterises text with it directly (see `raster.rs`). Sizes follow the SVG backend's
//! convention: a requested size s is written as `font-size` s / 1.24 px, so one em is s / 1.24
//! pixels in both formats.

use super::style::FONT;
use crate::error::{Error, Result};
use ab_glyph::{Font, FontRef, PxScale, ScaleFont};
use std::sync::OnceLock;

/// The font file's bytes (DejaVu Sans 2.37, unmodified).
const FONT_BYTES: &[u8] = include_bytes!("../../../assets/fonts/DejaVuSans.ttf");

/// Ratio of a requested text size to its em in pixels (the SVG backend's convention).
const SIZE_PER_EM: f64 = 1.24;

/// Error of the embedded font, for the drawing-error paths.
fn font_error() -> Error {
    Error::Io {
        path: "embedded font".to_string(),
        reason: "the embedded DejaVu Sans font could not be read".to_string(),
    }
}

/// The parsed embedded font.
pub(crate) fn embedded_font() -> Result<&'static FontRef<'static>> {
    static PARSED: OnceLock<Option<FontRef<'static>>> = OnceLock::new();
    PARSED
        .get_or_init(|| FontRef::try_from_slice(FONT_BYTES).ok())
        .as_ref()
        .ok_or_else(font_error)
}

/// Register the embedded font with `plotters` under [`FONT`] (once per process); every drawing
/// needs it, since `plotters` measures text through its registered fonts.
pub(crate) fn register_embedded_font() -> Result<()> {
    static REGISTERED: OnceLock<bool> = OnceLock::new();
    let ok = *REGISTERED.get_or_init(|| {
        plotters::style::register_font(FONT, plotters::style::FontStyle::Normal, FONT_BYTES).is_ok()
    });
    if ok {
        Ok(())
    } else {
        Err(font_error())
    }
}

/// One em in pixels for a requested text size.
pub(crate) fn em_px(size: f64) -> f32 {
    (size / SIZE_PER_EM) as f32
}

/// The font scaled so that one em is `em_px` pixels (ab_glyph's scale is the height from
/// descender to ascender, not the em).
pub(crate) fn scaled<'f>(
    font: &'f FontRef<'static>,
    em_px: f32,
) -> ab_glyph::PxScaleFont<&'f FontRef<'static>> {
    let units_per_em = font.units_per_em().unwrap_or(2048.0);
    let height = em_px * font.height_unscaled() / units_per_em;
    font.as_scaled(PxScale::from(height))
}

/// Advance width in pixels of `text` set in one line at one em = `em_px`, with kerning.
pub(crate) fn advance_width<F: Font, S: ScaleFont<F>>(scaled: &S, text: &str) -> f32 {
    let mut width = 0.0;
    let mut previous = None;
    for c in text.chars() {
        let id = scaled.glyph_id(c);
        if let Some(p) = previous {
            width += scaled.kern(p, id);
        }
        width += scaled.h_advance(id);
        previous = Some(id);
    }
    width
}

/// Width and height in pixels of the box that `text` at requested size `size` occupies: its
/// advance width by one em (digits and capitals fit inside one em centred on the text's middle).
///
/// Errors: [`Error::Io`] if the embedded font cannot be read (never for a correct build).
pub fn text_box_px(text: &str, size: f64) -> Result<(i32, i32)> {
    let font = embedded_font()?;
    let em = em_px(size);
    let width = advance_width(&scaled(font, em), text);
    Ok((width.ceil() as i32, em.ceil() as i32))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn embedded_font_reads_and_has_the_symbols_used() {
        let font = embedded_font().unwrap();
        for c in ['0', '9', 'M', 'g', '_', '/', '^'] {
            assert_ne!(font.glyph_id(c).0, 0, "no glyph for {c:?}");
        }
        register_embedded_font().unwrap();
    }

    #[test]
    fn text_widths_grow_with_length_and_size() {
        // Digits of DejaVu Sans are 0.636 em wide (the font's own advance, 1303/2048 units).
        let (w1, h) = text_box_px("1", 24.8).unwrap();
        assert_eq!(h, 20);
        assert_eq!(w1, (20.0_f64 * 1303.0 / 2048.0).ceil() as i32);
        let (w3, _) = text_box_px("100", 24.8).unwrap();
        assert!(w3 > 2 * w1 && w3 <= 3 * w1, "{w3} vs {w1}");
    }
}
