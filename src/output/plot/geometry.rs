//! Plane geometry for figures: pixel boxes and their overlaps, polylines clipped to a band,
//! linear interpolation along a curve.

/// An axis-aligned box in pixels (x to the right, y downwards, origin top left); `left <=
/// right`, `top <= bottom`, edges included.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct PixelBox {
    /// Smallest x.
    pub left: i32,
    /// Smallest y.
    pub top: i32,
    /// Largest x.
    pub right: i32,
    /// Largest y.
    pub bottom: i32,
}

impl PixelBox {
    /// The box of half-width `half_w` and half-height `half_h` around `centre`.
    pub fn around(centre: (i32, i32), half_w: i32, half_h: i32) -> Self {
        Self {
            left: centre.0 - half_w,
            top: centre.1 - half_h,
            right: centre.0 + half_w,
            bottom: centre.1 + half_h,
        }
    }

    /// The box of `size` (width, height) with its top-left corner at `corner`.
    pub fn at(corner: (i32, i32), size: (i32, i32)) -> Self {
        Self {
            left: corner.0,
            top: corner.1,
            right: corner.0 + size.0,
            bottom: corner.1 + size.1,
        }
    }

    /// The centre, rounded towards the top left.
    pub fn centre(&self) -> (i32, i32) {
        ((self.left + self.right) / 2, (self.top + self.bottom) / 2)
    }

    /// This box grown by `margin` pixels on every side.
    pub fn grown(&self, margin: i32) -> Self {
        Self {
            left: self.left - margin,
            top: self.top - margin,
            right: self.right + margin,
            bottom: self.bottom + margin,
        }
    }

    /// Whether the two boxes share at least one pixel.
    pub fn overlaps(&self, other: &PixelBox) -> bool {
        self.left <= other.right
            && other.left <= self.right
            && self.top <= other.bottom
            && other.top <= self.bottom
    }

    /// Whether `other` lies wholly inside this box.
    pub fn contains(&self, other: &PixelBox) -> bool {
        self.left <= other.left
            && other.right <= self.right
            && self.top <= other.top
            && other.bottom <= self.bottom
    }

    /// Whether the point lies in the box.
    pub fn contains_point(&self, (x, y): (i32, i32)) -> bool {
        self.left <= x && x <= self.right && self.top <= y && y <= self.bottom
    }

    /// Whether the straight segment from `a` to `b` passes through the box (Liang–Barsky
    /// clipping of the segment against the box).
    pub fn meets_segment(&self, a: (i32, i32), b: (i32, i32)) -> bool {
        let (ax, ay) = (f64::from(a.0), f64::from(a.1));
        let (dx, dy) = (f64::from(b.0) - ax, f64::from(b.1) - ay);
        let (mut t0, mut t1) = (0.0_f64, 1.0_f64);
        let edges = [
            (-dx, ax - f64::from(self.left)),
            (dx, f64::from(self.right) - ax),
            (-dy, ay - f64::from(self.top)),
            (dy, f64::from(self.bottom) - ay),
        ];
        for (p, q) in edges {
            if p == 0.0 {
                if q < 0.0 {
                    return false;
                }
            } else {
                let t = q / p;
                if p < 0.0 {
                    t0 = t0.max(t);
                } else {
                    t1 = t1.min(t);
                }
                if t0 > t1 {
                    return false;
                }
            }
        }
        true
    }
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

/// Linear interpolation of `values` at `x` over the increasing abscissae `xs`.
pub(crate) fn interpolate(xs: &[f64], values: &[f64], x: f64) -> Option<f64> {
    let k = xs.windows(2).position(|w| w[0] <= x && x <= w[1])?;
    let (x0, x1) = (xs[k], xs[k + 1]);
    let t = if x1 > x0 { (x - x0) / (x1 - x0) } else { 0.0 };
    Some(values[k] + t * (values[k + 1] - values[k]))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn boxes_overlap_when_they_share_a_pixel() {
        let a = PixelBox::at((0, 0), (10, 10));
        assert!(a.overlaps(&PixelBox::at((10, 10), (5, 5))));
        assert!(!a.overlaps(&PixelBox::at((11, 0), (5, 5))));
        assert!(!a.overlaps(&PixelBox::at((0, 11), (5, 5))));
        assert!(a.contains(&PixelBox::around((5, 5), 2, 3)));
        assert!(!a.contains(&PixelBox::around((9, 5), 2, 3)));
    }

    #[test]
    fn segments_meet_boxes_they_cross() {
        let b = PixelBox::at((10, 10), (10, 10));
        assert!(b.meets_segment((0, 0), (30, 30)));
        assert!(b.meets_segment((15, 0), (15, 12)));
        assert!(!b.meets_segment((0, 0), (30, 5)));
        assert!(!b.meets_segment((0, 30), (30, 25)));
        // Passes by the corner (20, 10) on the outside.
        assert!(!b.meets_segment((15, 0), (30, 11)));
        assert!(b.meets_segment((12, 12), (13, 13)));
    }

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

    #[test]
    fn interpolation_is_linear_between_neighbours() {
        let xs = [0.0, 1.0, 3.0];
        let ys = [0.0, 2.0, 0.0];
        assert_eq!(interpolate(&xs, &ys, 0.5), Some(1.0));
        assert_eq!(interpolate(&xs, &ys, 2.0), Some(1.0));
        assert_eq!(interpolate(&xs, &ys, 4.0), None);
    }
}
