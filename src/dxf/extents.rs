//! A running bounding box of drawing coordinates.

use kurbo::{Point, Rect};

/// Coordinates beyond this are treated as junk when estimating extents.
const FAR: f64 = 1e15;

/// The smallest axis-aligned box holding every point added; empty at first.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct Bounds(Option<Rect>);

impl Bounds {
    /// Adds a point; non-finite or absurdly far points are ignored.
    pub fn add(&mut self, p: Point) {
        if !(p.x.is_finite() && p.y.is_finite() && p.x.abs() < FAR && p.y.abs() < FAR) {
            return;
        }
        self.0 = Some(match self.0 {
            None => Rect::from_points(p, p),
            Some(r) => r.union_pt(p),
        });
    }

    /// Adds every corner of another box.
    pub fn add_rect(&mut self, r: Rect) {
        self.add(Point::new(r.x0, r.y0));
        self.add(Point::new(r.x1, r.y1));
    }

    /// Adds another bounds.
    pub fn merge(&mut self, other: Bounds) {
        if let Some(r) = other.0 {
            self.add_rect(r);
        }
    }

    /// The box, if any point was added.
    #[must_use]
    pub fn rect(&self) -> Option<Rect> {
        self.0
    }
}
