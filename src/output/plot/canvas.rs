//! Image formats and rendering: one drawing routine per figure, written once against any
//! `plotters` backend, rendered to SVG text or to a PNG image as the file name asks.

use super::font::register_embedded_font;
use super::raster::{encode_png, RasterCanvas};
use crate::error::{Error, Result};
use plotters::coord::Shift;
use plotters::prelude::*;
use std::path::Path;

/// The file formats a figure can be written in, chosen by the file name's extension.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ImageFormat {
    /// Scalable vector graphics (`.svg`): text stays text, laid out by the viewer.
    Svg,
    /// Portable network graphics (`.png`): a bitmap at the figure's pixel size, text set in the
    /// embedded font.
    Png,
}

/// What the "allowed" part of a refused figure name says.
pub const FIGURE_EXTENSIONS: &str =
    "a figure file name ending in .svg or .png (the format follows the extension)";

impl ImageFormat {
    /// Every format, in the order the help lists them.
    pub const ALL: [ImageFormat; 2] = [ImageFormat::Svg, ImageFormat::Png];

    /// The file name extension, without the dot.
    pub fn extension(self) -> &'static str {
        match self {
            ImageFormat::Svg => "svg",
            ImageFormat::Png => "png",
        }
    }

    /// The format named by `path`'s extension (`.svg` or `.png`, in any letter case), or
    /// `None` for any other extension or none.
    pub fn from_path(path: &Path) -> Option<ImageFormat> {
        let extension = path.extension()?.to_str()?.to_ascii_lowercase();
        Self::ALL.into_iter().find(|f| f.extension() == extension)
    }
}

/// The format of the figure file `path` given with `flag`, before anything is computed: it is
/// not standard output (`-`), it can be written ([`crate::output::check_outputs`]), and its
/// extension names a format ([`ImageFormat::from_path`]).
///
/// Errors: [`Error::InvalidInput`] (exit code 2) naming the flag, the value and the allowed
/// extensions, or what is wrong with the path.
pub fn check_figure_path(flag: &str, path: &Path) -> Result<ImageFormat> {
    use crate::output::OutputKind;
    crate::output::check_outputs(&[], &[(flag, path, OutputKind::Figure)])?;
    figure_format(flag, path)
}

/// The format of `path`, or [`Error::InvalidInput`] naming `what` and the allowed extensions.
pub(crate) fn figure_format(what: &str, path: &Path) -> Result<ImageFormat> {
    ImageFormat::from_path(path)
        .ok_or_else(|| Error::invalid(what, path.display(), FIGURE_EXTENSIONS))
}

/// Where a drawing error happened before any file was involved.
const IN_MEMORY: &str = "figure (in memory)";

/// Map any `plotters` drawing error into the library's error.
pub(crate) fn drawing_error(e: impl std::fmt::Display) -> Error {
    Error::Io {
        path: IN_MEMORY.to_string(),
        reason: format!("drawing failed: {e}"),
    }
}

/// A figure that can draw itself on any backend and report where it put things.
pub(crate) trait Figure {
    /// What the drawing reports (pixel positions of what was drawn, axis ranges).
    type Layout;
    /// Width and height in pixels.
    fn size_px(&self) -> (u32, u32);
    /// Draw everything on `root`, which is `size_px` large and not yet filled.
    fn draw<DB: DrawingBackend>(&self, root: &DrawingArea<DB, Shift>) -> Result<Self::Layout>;
}

/// Fill `root` white, draw `figure` on it and finish the drawing.
fn paint<DB: DrawingBackend, F: Figure>(
    root: DrawingArea<DB, Shift>,
    figure: &F,
) -> Result<F::Layout> {
    root.fill(&WHITE).map_err(drawing_error)?;
    let layout = figure.draw(&root)?;
    root.present().map_err(drawing_error)?;
    Ok(layout)
}

/// Render `figure` in `format`: the file's bytes and the figure's layout.
pub(crate) fn render<F: Figure>(figure: &F, format: ImageFormat) -> Result<(Vec<u8>, F::Layout)> {
    register_embedded_font()?;
    let size = figure.size_px();
    match format {
        ImageFormat::Svg => {
            let mut svg = String::new();
            let layout = paint(
                SVGBackend::with_string(&mut svg, size).into_drawing_area(),
                figure,
            )?;
            Ok((svg.into_bytes(), layout))
        }
        ImageFormat::Png => {
            let mut rgb = vec![255u8; 3 * size.0 as usize * size.1 as usize];
            let layout = paint(
                RasterCanvas::new(&mut rgb, size).into_drawing_area(),
                figure,
            )?;
            let png = encode_png(&rgb, size).map_err(drawing_error)?;
            Ok((png, layout))
        }
    }
}

/// Render `figure` in the format named by `path` and write it there atomically; the layout is
/// returned. A refused extension is reported before anything is drawn, and a drawing error is
/// reported against `path`; no partial file is ever left.
pub(crate) fn write_figure<F: Figure>(path: &Path, figure: &F) -> Result<F::Layout> {
    let format = figure_format("figure file", path)?;
    let (bytes, layout) = render(figure, format).map_err(|e| match e {
        Error::Io { path: p, reason } if p == IN_MEMORY => Error::Io {
            path: path.display().to_string(),
            reason,
        },
        other => other,
    })?;
    crate::output::write_output(path, |w| w.write_all(&bytes))?;
    Ok(layout)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn extension_names_the_format() {
        assert_eq!(
            ImageFormat::from_path(Path::new("a.svg")),
            Some(ImageFormat::Svg)
        );
        assert_eq!(
            ImageFormat::from_path(Path::new("dir/a.PNG")),
            Some(ImageFormat::Png)
        );
        for refused in ["a.pdf", "a", "a.svg.gz", "svg", "a.jpeg", ".png"] {
            assert_eq!(
                ImageFormat::from_path(Path::new(refused)),
                None,
                "{refused}"
            );
        }
    }

    #[test]
    fn refusal_names_flag_value_and_extensions() {
        let err = check_figure_path("--plot", Path::new("star.pdf")).unwrap_err();
        assert_eq!(err.exit_code(), crate::error::ExitCode::BadInput);
        let text = err.to_string();
        for wanted in ["--plot", "star.pdf", ".svg", ".png"] {
            assert!(text.contains(wanted), "{text}");
        }
    }
}
