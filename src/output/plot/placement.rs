//! Placing text labels beside marks so that they collide with nothing: each label tries the
//! eight compass positions around its mark, nearest ring first, in order of a preferred
//! direction, and takes the first that stays inside the frame, clear of every marker, label
//! and box already placed, and off every line; failing that, the first clear of everything but
//! lines; failing that, it is left out.

use super::geometry::PixelBox;

/// Gap in pixels between a mark's box and its label, on the inner and on the outer ring.
const RINGS_PX: [i32; 2] = [3, 12];
/// Labels keep at least this many pixels from other boxes (so that they never touch).
const CLEARANCE_PX: i32 = 2;
/// The eight compass directions (x right, y down): E, NE, N, NW, W, SW, S, SE.
const DIRECTIONS: [(i32, i32); 8] = [
    (1, 0),
    (1, -1),
    (0, -1),
    (-1, -1),
    (-1, 0),
    (-1, 1),
    (0, 1),
    (1, 1),
];

/// Where one label went.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Placement {
    /// The label's box, pixels.
    pub bbox: PixelBox,
    /// Whether no position off every line was free, so the label lies across a line (it is then
    /// drawn on a white backing).
    pub over_line: bool,
}

/// What labels must avoid, and the frame they must stay in.
#[derive(Debug, Clone)]
pub(crate) struct LabelPlacer {
    frame: PixelBox,
    obstacles: Vec<PixelBox>,
    segments: Vec<((i32, i32), (i32, i32))>,
}

impl LabelPlacer {
    /// Labels must lie inside `frame`.
    pub(crate) fn new(frame: PixelBox) -> Self {
        Self {
            frame,
            obstacles: Vec::new(),
            segments: Vec::new(),
        }
    }

    /// A box no label may overlap (a marker, a symbol, a legend).
    pub(crate) fn block(&mut self, bbox: PixelBox) {
        self.obstacles.push(bbox);
    }

    /// A drawn polyline that labels should not cross.
    pub(crate) fn avoid_line(&mut self, points: &[(i32, i32)]) {
        self.segments
            .extend(points.windows(2).map(|w| (w[0], w[1])));
    }

    /// The box of a label of `size` (width, height) set off from the mark box `mark` in
    /// direction `d` with a gap of `gap` pixels.
    fn candidate(mark: PixelBox, size: (i32, i32), d: (i32, i32), gap: i32) -> PixelBox {
        let (w, h) = size;
        let (cx, cy) = mark.centre();
        let left = match d.0 {
            1 => mark.right + gap,
            -1 => mark.left - gap - w,
            _ => cx - w / 2,
        };
        let top = match d.1 {
            1 => mark.bottom + gap,
            -1 => mark.top - gap - h,
            _ => cy - h / 2,
        };
        PixelBox::at((left, top), size)
    }

    fn is_clear(&self, bbox: &PixelBox) -> bool {
        self.frame.contains(bbox)
            && self
                .obstacles
                .iter()
                .all(|o| !o.grown(CLEARANCE_PX).overlaps(bbox))
    }

    fn is_off_lines(&self, bbox: &PixelBox) -> bool {
        let grown = bbox.grown(1);
        self.segments
            .iter()
            .all(|&(a, b)| !grown.meets_segment(a, b))
    }

    /// Place a label of `size` pixels beside the mark `mark`, trying directions in order of
    /// their closeness to `preferred` (a direction vector, x right, y down). The chosen box is
    /// blocked for later labels. `None` if no free position exists.
    pub(crate) fn place(
        &mut self,
        mark: PixelBox,
        size: (i32, i32),
        preferred: (f64, f64),
    ) -> Option<Placement> {
        let mut order = DIRECTIONS;
        let alignment = |d: &(i32, i32)| {
            let (x, y) = (f64::from(d.0), f64::from(d.1));
            -(x * preferred.0 + y * preferred.1) / x.hypot(y)
        };
        order.sort_by(|a, b| alignment(a).total_cmp(&alignment(b)));
        let candidates: Vec<PixelBox> = RINGS_PX
            .iter()
            .flat_map(|&gap| {
                order
                    .iter()
                    .map(move |&d| Self::candidate(mark, size, d, gap))
            })
            .collect();
        let chosen = candidates
            .iter()
            .find(|b| self.is_clear(b) && self.is_off_lines(b))
            .map(|b| Placement {
                bbox: *b,
                over_line: false,
            })
            .or_else(|| {
                candidates
                    .iter()
                    .find(|b| self.is_clear(b))
                    .map(|b| Placement {
                        bbox: *b,
                        over_line: true,
                    })
            })?;
        self.block(chosen.bbox);
        Some(chosen)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn frame() -> PixelBox {
        PixelBox::at((0, 0), (400, 300))
    }

    #[test]
    fn label_goes_the_preferred_way_when_free() {
        let mut placer = LabelPlacer::new(frame());
        let mark = PixelBox::around((200, 150), 6, 6);
        placer.block(mark);
        let p = placer.place(mark, (20, 14), (1.0, -1.0)).unwrap();
        // North-east: left edge 3 px right of the mark, bottom edge 3 px above it.
        assert_eq!(p.bbox, PixelBox::at((209, 127), (20, 14)));
        assert!(!p.over_line);
        assert!(!p.bbox.overlaps(&mark));
    }

    #[test]
    fn labels_avoid_each_other_lines_and_the_frame() {
        let mut placer = LabelPlacer::new(frame());
        let mark = PixelBox::around((200, 150), 6, 6);
        placer.block(mark);
        // A line from the mark up and to the right blocks the north-east.
        placer.avoid_line(&[(200, 150), (300, 50)]);
        let first = placer.place(mark, (20, 14), (1.0, -1.0)).unwrap();
        assert!(!first.over_line);
        assert_ne!(first.bbox, PixelBox::at((209, 127), (20, 14)));
        let second = placer.place(mark, (20, 14), (1.0, -1.0)).unwrap();
        assert!(!second.bbox.grown(CLEARANCE_PX).overlaps(&first.bbox));
        // A mark in the corner: the label stays inside the frame.
        let corner = PixelBox::around((3, 3), 3, 3);
        let p = placer.place(corner, (20, 14), (-1.0, -1.0)).unwrap();
        assert!(frame().contains(&p.bbox));
    }

    #[test]
    fn a_label_with_no_room_is_left_out() {
        let mut placer = LabelPlacer::new(PixelBox::at((0, 0), (30, 30)));
        let mark = PixelBox::around((15, 15), 6, 6);
        placer.block(mark);
        assert_eq!(placer.place(mark, (40, 14), (1.0, 0.0)), None);
    }
}
