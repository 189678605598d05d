//! What the HR diagram writes beside its marks: the legend in the emptiest corner, the Sun's
//! label, and the mass labels, roundest first, each placed clear of every mark, label and the
//! legend (see `placement.rs`).

use super::super::font::text_box_px;
use super::super::geometry::PixelBox;
use super::super::labels::{
    format_mass, roundness, select_mass_labels, MassTick, MAX_MASS_LABELS, MIN_LABELS,
};
use super::super::placement::LabelPlacer;
use super::super::style::{
    draw_label, draw_legend, legend_size, series_style, LegendEntry, NOTE_SIZE,
};
use super::{HrSeries, PlacedLabel, MARKER_HALF_PX, SUN_LABEL};
use crate::error::Result;
use plotters::coord::Shift;
use plotters::prelude::*;

/// What is already drawn, in pixels: what labels must stay inside and clear of.
pub(super) struct Marks<'a> {
    /// The plotting area.
    pub frame: PixelBox,
    /// Every mark's box (models, ticks, the Sun).
    pub markers: &'a [PixelBox],
    /// Each series' line through its models in order of mass.
    pub lines: &'a [Vec<(i32, i32)>],
    /// The Sun's centre and box.
    pub sun: ((i32, i32), PixelBox),
}

/// What the annotation wrote.
pub(super) struct Annotations {
    pub labels: Vec<PlacedLabel>,
    /// Per series, in order of increasing mass.
    pub mass_labels: Vec<Vec<String>>,
    pub legend_px: PixelBox,
}

/// A label the diagram asks for, before it is placed.
struct WantedLabel {
    /// Roundness of the mass (labels are placed roundest first).
    level: u8,
    series: usize,
    mass_msun: f64,
    /// Pixel centre of the model or tick.
    at: (i32, i32),
    /// The neighbouring points of the line there (its direction).
    along: ((i32, i32), (i32, i32)),
    interpolated: bool,
}

/// Draw the legend and the labels of `series` (models in the mass order `orders`, round-mass
/// ticks `ticks`) on `root`, beside `marks`.
pub(super) fn annotate<DB: DrawingBackend>(
    root: &DrawingArea<DB, Shift>,
    marks: &Marks,
    series: &[HrSeries],
    orders: &[Vec<usize>],
    ticks: &[Vec<(MassTick, (i32, i32))>],
    legend: &[LegendEntry],
) -> Result<Annotations> {
    let legend_size = legend_size(legend)?;
    let corner = legend_corner(&marks.frame, legend_size, marks.markers, marks.lines);
    let legend_px = draw_legend(root, corner, legend)?;

    let mut placer = LabelPlacer::new(marks.frame.grown(-2));
    for b in marks.markers {
        placer.block(*b);
    }
    placer.block(legend_px);
    for line in marks.lines {
        placer.avoid_line(line);
    }
    let mut labels = Vec::new();
    // The Sun's label first, then mass labels in order of roundness (1, 10, 100 and 0.1
    // before 2, 5, 20, ...), so that the roundest get the best places.
    let sun_text_size = text_box_px(SUN_LABEL, NOTE_SIZE)?;
    if let Some(placement) = placer.place(marks.sun.1, sun_text_size, (0.0, -1.0)) {
        draw_label(root, SUN_LABEL, placement.bbox, BLACK, placement.over_line)?;
        labels.push(PlacedLabel {
            text: SUN_LABEL.to_string(),
            series: None,
            anchor_px: marks.sun.0,
            interpolated: false,
            placement,
        });
    }
    let mut wanted: Vec<WantedLabel> = Vec::new();
    for (k, s) in series.iter().enumerate() {
        let line = &marks.lines[k];
        let masses: Vec<f64> = orders[k].iter().map(|&i| s.points[i].mass_msun).collect();
        let mut series_wanted: Vec<WantedLabel> = select_mass_labels(&masses, MAX_MASS_LABELS)
            .into_iter()
            .map(|j| WantedLabel {
                level: roundness(masses[j]),
                series: k,
                mass_msun: masses[j],
                at: line[j],
                along: (line[j.saturating_sub(1)], line[(j + 1).min(line.len() - 1)]),
                interpolated: false,
            })
            .collect();
        series_wanted.extend(ticks[k].iter().map(|&(tick, at)| WantedLabel {
            level: 0,
            series: k,
            mass_msun: tick.mass_msun,
            at,
            along: (line[tick.below], line[tick.below + 1]),
            interpolated: true,
        }));
        // Masses that are not round only while fewer than a few round ones are labelled.
        let round = series_wanted.iter().filter(|w| w.level < 8).count();
        if round >= MIN_LABELS {
            series_wanted.retain(|w| w.level < 8);
        }
        wanted.extend(series_wanted);
    }
    wanted.sort_by(|a, b| {
        (a.level, a.series)
            .cmp(&(b.level, b.series))
            .then(a.mass_msun.total_cmp(&b.mass_msun))
    });
    let mut mass_labels: Vec<Vec<(f64, String)>> = vec![Vec::new(); series.len()];
    for w in wanted {
        let k = w.series;
        let text = format_mass(w.mass_msun);
        // Two models that print alike (1 and 1.003) get one label.
        if mass_labels[k].iter().any(|(_, t)| *t == text) {
            continue;
        }
        let size = text_box_px(&text, NOTE_SIZE)?;
        let mark = PixelBox::around(w.at, MARKER_HALF_PX, MARKER_HALF_PX);
        let direction = label_direction(marks.lines, k, w.at, w.along);
        let Some(placement) = placer.place(mark, size, direction) else {
            continue;
        };
        draw_label(
            root,
            &text,
            placement.bbox,
            series_style(k).color,
            placement.over_line,
        )?;
        mass_labels[k].push((w.mass_msun, text.clone()));
        labels.push(PlacedLabel {
            text,
            series: Some(k),
            anchor_px: w.at,
            interpolated: w.interpolated,
            placement,
        });
    }
    let mass_labels = mass_labels
        .into_iter()
        .map(|mut v| {
            v.sort_by(|a, b| a.0.total_cmp(&b.0));
            v.into_iter().map(|(_, t)| t).collect()
        })
        .collect();
    Ok(Annotations {
        labels,
        mass_labels,
        legend_px,
    })
}

/// How far in pixels a label looks for a neighbouring line on either side of its point.
const NEIGHBOUR_REACH_PX: f64 = 60.0;

/// The preferred direction of a label of series `k` at pixel `at` on its line, where the line
/// runs along `along` (the neighbouring points): at right angles to the line, on the side where
/// the nearest other series' line is farther away (so that labels stay outside the bundle of
/// sequences); with no other line within reach on either side, above the line for even
/// series and below it for odd ones.
fn label_direction(
    lines: &[Vec<(i32, i32)>],
    k: usize,
    at: (i32, i32),
    along: ((i32, i32), (i32, i32)),
) -> (f64, f64) {
    let (a, b) = along;
    let (dx, dy) = (f64::from(b.0 - a.0), f64::from(b.1 - a.1));
    let length = dx.hypot(dy);
    // Normal (dy, -dx) / length; a single point has no direction: label above or below.
    let (nx, ny) = if length > 0.0 {
        (dy / length, -dx / length)
    } else {
        (0.0, -1.0)
    };
    let upward = if ny <= 0.0 { (nx, ny) } else { (-nx, -ny) };
    let downward = (-upward.0, -upward.1);
    let reach = |n: (f64, f64)| {
        let end = (
            at.0 + (NEIGHBOUR_REACH_PX * n.0).round() as i32,
            at.1 + (NEIGHBOUR_REACH_PX * n.1).round() as i32,
        );
        lines
            .iter()
            .enumerate()
            .filter(|&(i, _)| i != k)
            .flat_map(|(_, l)| l.windows(2))
            .filter_map(|s| ray_hit(at, end, s[0], s[1]))
            .fold(f64::INFINITY, f64::min)
    };
    let (up, down) = (reach(upward), reach(downward));
    if up > down {
        upward
    } else if down > up {
        downward
    } else if k.is_multiple_of(2) {
        upward
    } else {
        downward
    }
}

/// Where the segment p0-p1 crosses the segment q0-q1, as a fraction of p0-p1 (None if not).
fn ray_hit(p0: (i32, i32), p1: (i32, i32), q0: (i32, i32), q1: (i32, i32)) -> Option<f64> {
    let f = |v: (i32, i32)| (f64::from(v.0), f64::from(v.1));
    let (p0, p1, q0, q1) = (f(p0), f(p1), f(q0), f(q1));
    let r = (p1.0 - p0.0, p1.1 - p0.1);
    let s = (q1.0 - q0.0, q1.1 - q0.1);
    let denominator = r.0 * s.1 - r.1 * s.0;
    if denominator == 0.0 {
        return None;
    }
    let w = (q0.0 - p0.0, q0.1 - p0.1);
    let t = (w.0 * s.1 - w.1 * s.0) / denominator;
    let u = (w.0 * r.1 - w.1 * r.0) / denominator;
    ((0.0..=1.0).contains(&t) && (0.0..=1.0).contains(&u)).then_some(t)
}

/// Top-left pixel of the legend box of `size`: the corner of the plotting area (upper right,
/// lower left, upper left, lower right, in that order of preference) whose box, with a margin,
/// covers the fewest markers and line segments.
fn legend_corner(
    frame: &PixelBox,
    (w, h): (i32, i32),
    markers: &[PixelBox],
    lines: &[Vec<(i32, i32)>],
) -> (i32, i32) {
    let inset = 10;
    let left = frame.left + inset;
    let right = frame.right - inset - w;
    let top = frame.top + inset;
    let bottom = frame.bottom - inset - h;
    let corners = [(right, top), (left, bottom), (left, top), (right, bottom)];
    let margin = 8;
    let covered = |&(x0, y0): &(i32, i32)| {
        let bbox = PixelBox::at((x0, y0), (w, h)).grown(margin);
        let hit_markers = markers.iter().filter(|m| m.overlaps(&bbox)).count();
        let hit_segments = lines
            .iter()
            .flat_map(|l| l.windows(2))
            .filter(|s| bbox.meets_segment(s[0], s[1]))
            .count();
        hit_markers + hit_segments
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
