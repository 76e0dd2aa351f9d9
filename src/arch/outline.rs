//! The intrados and extrados as polylines, left to right, and their checks.
//!
//! An [`Outline`] is the drawn shape of an arch ring: its lower face (the
//! intrados) and its upper face (the extrados), each an open polyline from
//! the left springing to the right springing. The straight lines from the
//! intrados' ends to the extrados' ends are the springing lines.
//!
//! The two faces are paired by arc-length fraction: the point at fraction
//! `s` of the intrados' length faces the point at the same fraction `s` of
//! the extrados' length, and the straight line between them is the joint at
//! `s` ([`Outline::joint_at`]). For an arch whose faces are concentric
//! circular arcs these joints are exactly the radial lines; for any other
//! shape they are this rule's generalisation of "radial".

use geo::{Area, Coord, LineString, Polygon};
use kurbo::Point;
use thiserror::Error;

use super::Joint;
use crate::model::fmt_xy;

/// Why an [`Outline`] could not be built.
#[derive(Debug, Error, PartialEq)]
pub enum OutlineError {
    /// A coordinate is NaN or infinite.
    #[error("the {face} has a coordinate that is not a finite number (vertex {index}); fix or redraw that vertex")]
    NonFinite {
        /// "intrados" or "extrados".
        face: &'static str,
        /// The vertex's index as given.
        index: usize,
    },
    /// Fewer than two distinct points.
    #[error("the {face} has fewer than two distinct points; draw it as an open curve from springing to springing")]
    TooFewPoints {
        /// "intrados" or "extrados".
        face: &'static str,
    },
    /// The face ends where it starts.
    #[error("the {face} is closed; draw the intrados and extrados as two open curves from springing to springing")]
    Closed {
        /// "intrados" or "extrados".
        face: &'static str,
    },
    /// The face's two ends are at the same x: it spans nothing.
    #[error(
        "the {face}'s two ends ({a}; {b}) are at the same x; draw it from the left springing to the right springing"
    )]
    NoSpan {
        /// "intrados" or "extrados".
        face: &'static str,
        /// One end.
        a: String,
        /// The other end.
        b: String,
    },
    /// A face crosses itself or folds back on itself.
    #[error("the {face} crosses or folds back on itself at ({at}); redraw it as one curve that does not cross itself")]
    SelfIntersection {
        /// "intrados" or "extrados".
        face: &'static str,
        /// Where.
        at: String,
    },
    /// The intrados and extrados cross or touch.
    #[error(
        "the intrados and extrados cross or touch at ({at}); the extrados must stay above the intrados from springing to springing"
    )]
    FacesCross {
        /// Where.
        at: String,
    },
    /// A springing line crosses a face.
    #[error(
        "the {side} springing line (from the intrados' end to the extrados' end) crosses the arch at ({at}); check that both faces end at the same springing"
    )]
    SpringingCrosses {
        /// "left" or "right".
        side: &'static str,
        /// Where.
        at: String,
    },
    /// The extrados is below the intrados.
    #[error("the extrados lies below the intrados; swap the layers of the two faces")]
    Inverted,
    /// The outline encloses no area.
    #[error("the outline between intrados and extrados encloses no area (near ({at})); give the arch a thickness")]
    Degenerate {
        /// A point of the outline.
        at: String,
    },
}

/// One face: its vertices, left to right, and each vertex's pairing
/// parameter, strictly increasing from 0 to 1.
#[derive(Clone, Debug, PartialEq)]
struct Face {
    pts: Vec<Point>,
    params: Vec<f64>,
}

impl Face {
    /// A face parametrised by arc-length fraction.
    fn by_length(pts: Vec<Point>) -> Face {
        let mut acc = Vec::with_capacity(pts.len());
        let mut total = 0.0;
        acc.push(0.0);
        for w in pts.windows(2) {
            total += (w[1] - w[0]).hypot();
            acc.push(total);
        }
        let mut params: Vec<f64> = acc.iter().map(|a| a / total).collect();
        if let Some(last) = params.last_mut() {
            *last = 1.0;
        }
        Face { pts, params }
    }

    /// The fractional vertex index at parameter `s` (clamped to `[0, 1]`).
    fn index(&self, s: f64) -> f64 {
        let s = if s.is_nan() { 0.0 } else { s.clamp(0.0, 1.0) };
        let i = self.params.partition_point(|&p| p <= s);
        if i == 0 {
            return 0.0;
        }
        if i >= self.pts.len() {
            return (self.pts.len() - 1) as f64;
        }
        let (p0, p1) = (self.params[i - 1], self.params[i]);
        let t = if p1 > p0 { (s - p0) / (p1 - p0) } else { 0.0 };
        (i - 1) as f64 + t
    }

    /// The point at parameter `s` (clamped to `[0, 1]`).
    fn at(&self, s: f64) -> Point {
        let s = if s.is_nan() { 0.0 } else { s.clamp(0.0, 1.0) };
        let i = self.params.partition_point(|&p| p <= s);
        if i == 0 {
            return self.pts[0];
        }
        if i >= self.pts.len() {
            return self.pts[self.pts.len() - 1];
        }
        let (p0, p1) = (self.params[i - 1], self.params[i]);
        let t = if p1 > p0 { (s - p0) / (p1 - p0) } else { 0.0 };
        self.pts[i - 1].lerp(self.pts[i], t)
    }
}

/// The intrados and extrados of an arch, both open polylines drawn left to
/// right, checked: finite, open, neither crossing itself nor the other, the
/// extrados above the intrados. Build it with [`Outline::new`].
#[derive(Clone, Debug, PartialEq)]
pub struct Outline {
    intrados: Face,
    extrados: Face,
}

const INTRADOS: &str = "intrados";
const EXTRADOS: &str = "extrados";

/// Orients a face left to right and drops repeated consecutive points.
fn prepare(face: &'static str, mut pts: Vec<Point>) -> Result<Vec<Point>, OutlineError> {
    if let Some(index) = pts.iter().position(|p| !(p.x.is_finite() && p.y.is_finite())) {
        return Err(OutlineError::NonFinite { face, index });
    }
    pts.dedup();
    if pts.len() < 2 {
        return Err(OutlineError::TooFewPoints { face });
    }
    let (first, last) = (pts[0], pts[pts.len() - 1]);
    if first == last {
        return Err(OutlineError::Closed { face });
    }
    if first.x == last.x {
        return Err(OutlineError::NoSpan { face, a: fmt_xy(first), b: fmt_xy(last) });
    }
    if last.x < first.x {
        pts.reverse();
    }
    Ok(pts)
}

/// A segment of the outline's boundary, tagged with where it comes from.
#[derive(Clone, Copy, Debug)]
struct Edge {
    line: geo::Line<f64>,
    /// 0 intrados, 1 extrados, 2 left springing line, 3 right springing line.
    part: u8,
    /// Position around the closed ring.
    index: usize,
}

impl geo::algorithm::sweep::Cross for Edge {
    type Scalar = f64;
    fn line(&self) -> geo::Line<f64> {
        self.line
    }
}

fn coord(p: Point) -> Coord<f64> {
    Coord { x: p.x, y: p.y }
}

fn point(c: Coord<f64>) -> Point {
    Point::new(c.x, c.y)
}

impl Outline {
    /// Checks and builds an outline from the two faces as drawn, in either
    /// direction: each is turned to run left to right (by the x of its
    /// ends) and repeated consecutive points are dropped.
    ///
    /// # Errors
    ///
    /// A non-finite coordinate; a face with fewer than two distinct points,
    /// closed, or with both ends at the same x; a face crossing or folding
    /// back on itself; the faces crossing or touching each other (the
    /// springing ends must be distinct); a springing line crossing a face;
    /// the extrados below the intrados; no area enclosed.
    pub fn new(intrados: Vec<Point>, extrados: Vec<Point>) -> Result<Outline, OutlineError> {
        let i = prepare(INTRADOS, intrados)?;
        let e = prepare(EXTRADOS, extrados)?;
        check_simple(&i, &e)?;
        let outline = Outline { intrados: Face::by_length(i), extrados: Face::by_length(e) };
        let signed = outline.polygon().signed_area();
        let (lo, hi) = outline.bounds();
        let scale = (hi - lo).hypot();
        if signed.abs() <= 1e-12 * scale * scale {
            return Err(OutlineError::Degenerate { at: fmt_xy(outline.intrados.pts[0]) });
        }
        if signed < 0.0 {
            return Err(OutlineError::Inverted);
        }
        Ok(outline)
    }

    fn bounds(&self) -> (Point, Point) {
        let all = self.intrados.pts.iter().chain(&self.extrados.pts);
        let lo =
            all.clone().fold(Point::new(f64::INFINITY, f64::INFINITY), |a, p| Point::new(a.x.min(p.x), a.y.min(p.y)));
        let hi =
            all.fold(Point::new(f64::NEG_INFINITY, f64::NEG_INFINITY), |a, p| Point::new(a.x.max(p.x), a.y.max(p.y)));
        (lo, hi)
    }

    /// The intrados' vertices, left to right.
    pub fn intrados(&self) -> &[Point] {
        &self.intrados.pts
    }

    /// The extrados' vertices, left to right.
    pub fn extrados(&self) -> &[Point] {
        &self.extrados.pts
    }

    /// The outline as a closed polygon, counter-clockwise: the intrados left
    /// to right, the right springing line, the extrados right to left, the
    /// left springing line.
    pub fn polygon(&self) -> Polygon<f64> {
        let ring: Vec<Coord<f64>> =
            self.intrados.pts.iter().chain(self.extrados.pts.iter().rev()).map(|&p| coord(p)).collect();
        Polygon::new(LineString::new(ring), Vec::new())
    }

    /// The area between the faces.
    pub fn area(&self) -> f64 {
        self.polygon().unsigned_area()
    }

    /// The horizontal distance between the intrados' two springing points.
    pub fn span(&self) -> f64 {
        let p = &self.intrados.pts;
        p[p.len() - 1].x - p[0].x
    }

    /// The rise of the intrados: the greatest height of an intrados vertex
    /// above the straight line joining its two springing points.
    pub fn rise(&self) -> f64 {
        let p = &self.intrados.pts;
        let (a, b) = (p[0], p[p.len() - 1]);
        p.iter().map(|q| q.y - (a.y + (b.y - a.y) * (q.x - a.x) / (b.x - a.x))).fold(0.0, f64::max)
    }

    /// The pairing parameter of the crown: the intrados' highest vertex
    /// (the first, if several are equally high).
    fn crown(&self) -> f64 {
        let p = &self.intrados.pts;
        let mut best = 0;
        for (k, q) in p.iter().enumerate() {
            if q.y > p[best].y {
                best = k;
            }
        }
        self.intrados.params[best]
    }

    /// The length of the joint at the crown (the intrados' highest vertex).
    pub fn crown_thickness(&self) -> f64 {
        self.joint_at(self.crown()).length()
    }

    /// The lengths of the left and right springing lines.
    pub fn springing_thickness(&self) -> (f64, f64) {
        (self.joint_at(0.0).length(), self.joint_at(1.0).length())
    }

    /// The joint at pairing parameter `s`: from the intrados point at `s` to
    /// the extrados point at `s` (see the module's doc: for a freshly built
    /// outline, `s` is the arc-length fraction of each face; for a
    /// [`scaled`](Outline::scaled) one, the parameter it inherits, so that
    /// `o.scaled(r).joint_at(s) == o.joint_at(s).scaled(r)` up to round-off).
    /// `s` is clamped to `[0, 1]`; NaN reads as 0. `joint_at(0.0)` and
    /// `joint_at(1.0)` are the springing lines.
    pub fn joint_at(&self, s: f64) -> Joint {
        Joint { intrados: self.intrados.at(s), extrados: self.extrados.at(s) }
    }

    /// Every vertex parameter of either face, sorted, without repeats.
    pub(crate) fn breakpoints(&self) -> Vec<f64> {
        let mut all: Vec<f64> = self.intrados.params.iter().chain(&self.extrados.params).copied().collect();
        all.sort_by(f64::total_cmp);
        all.dedup();
        all
    }

    /// Where the intrados point at parameter `s` lies along the intrados'
    /// vertices: `k + t` on the piece from vertex `k` to `k + 1`.
    pub(crate) fn intrados_index(&self, s: f64) -> f64 {
        self.intrados.index(s)
    }

    /// Likewise on the extrados.
    pub(crate) fn extrados_index(&self, s: f64) -> f64 {
        self.extrados.index(s)
    }

    /// The length of the centre line: the polyline through the mid-points
    /// of the joints at every vertex parameter.
    pub fn centre_line_length(&self) -> f64 {
        let mids: Vec<Point> = self.breakpoints().iter().map(|&s| self.joint_at(s).at(0.5)).collect();
        mids.windows(2).map(|w| (w[1] - w[0]).hypot()).sum()
    }

    /// The outline of an arch on the same centre line with `ratio` times the
    /// thickness: both faces are resampled at every vertex parameter of
    /// either face, and each joint is scaled by `ratio` about its mid-point
    /// ([`Joint::scaled`]). The result keeps the pairing of this outline.
    /// It is not checked again: a large ratio can make the faces of a
    /// sharply curved arch cross, a ratio of zero or less collapses or
    /// inverts them.
    pub fn scaled(&self, ratio: f64) -> Outline {
        let params = self.breakpoints();
        let joints: Vec<Joint> = params.iter().map(|&s| self.joint_at(s).scaled(ratio)).collect();
        Outline {
            intrados: Face { pts: joints.iter().map(|j| j.intrados).collect(), params: params.clone() },
            extrados: Face { pts: joints.iter().map(|j| j.extrados).collect(), params },
        }
    }
}

/// Checks that the closed ring intrados → extrados (reversed) is simple.
fn check_simple(i: &[Point], e: &[Point]) -> Result<(), OutlineError> {
    let mut edges = Vec::new();
    let mut push = |a: Point, b: Point, part: u8| {
        let index = edges.len();
        edges.push(Edge { line: geo::Line::new(coord(a), coord(b)), part, index });
    };
    for w in i.windows(2) {
        push(w[0], w[1], 0);
    }
    push(i[i.len() - 1], e[e.len() - 1], 3);
    for w in e.windows(2).rev() {
        push(w[1], w[0], 1);
    }
    push(e[0], i[0], 2);
    let n = edges.len();
    let ends_touch = i[0] == e[0] || i[i.len() - 1] == e[e.len() - 1];
    if ends_touch {
        let at = if i[0] == e[0] { i[0] } else { i[i.len() - 1] };
        return Err(OutlineError::FacesCross { at: fmt_xy(at) });
    }
    for (a, b, x) in geo::algorithm::sweep::Intersections::from_iter(edges) {
        let (a, b) = if a.index < b.index { (a, b) } else { (b, a) };
        let adjacent = b.index == a.index + 1 || (a.index == 0 && b.index == n - 1);
        let at = match x {
            geo::LineIntersection::SinglePoint { intersection, .. } => {
                if adjacent {
                    continue;
                }
                point(intersection)
            }
            geo::LineIntersection::Collinear { intersection } => point(intersection.start),
        };
        let at = fmt_xy(at);
        return Err(match (a.part, b.part) {
            (0, 0) => OutlineError::SelfIntersection { face: INTRADOS, at },
            (1, 1) => OutlineError::SelfIntersection { face: EXTRADOS, at },
            (0, 1) | (1, 0) => OutlineError::FacesCross { at },
            (2, _) | (_, 2) => OutlineError::SpringingCrosses { side: "left", at },
            _ => OutlineError::SpringingCrosses { side: "right", at },
        });
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::f64::consts::PI;

    /// A circular arc of radius `r` about the origin from angle π to 0, in `n` pieces.
    pub(crate) fn semicircle(r: f64, n: usize) -> Vec<Point> {
        (0..=n)
            .map(|k| Point::new(r * (PI - PI * k as f64 / n as f64).cos(), r * (PI * k as f64 / n as f64).sin()))
            .collect()
    }

    #[test]
    fn semicircular_ring_measures() {
        let o = Outline::new(semicircle(5.0, 64), semicircle(6.0, 64)).unwrap();
        // Closed form: half an annulus, π(R_e² − R_i²)/2, less what the
        // inscribed polygons cut off (elementary geometry).
        let n = 64.0;
        let poly = |r: f64| 0.5 * n * r * r * (PI / n).sin();
        assert!((o.area() - (poly(6.0) - poly(5.0))).abs() < 1e-9);
        assert!((o.span() - 10.0).abs() < 1e-12);
        assert!((o.rise() - 5.0).abs() < 1e-12);
        assert!((o.crown_thickness() - 1.0).abs() < 1e-12);
        let (l, r) = o.springing_thickness();
        assert!((l - 1.0).abs() < 1e-12 && (r - 1.0).abs() < 1e-12);
        // Paired by arc-length fraction: the joints of concentric circles are radial.
        for k in 0..=10 {
            let j = o.joint_at(k as f64 / 10.0);
            let cross = j.intrados.x * j.extrados.y - j.intrados.y * j.extrados.x;
            assert!(cross.abs() < 1e-9, "joint {k} not radial: {j:?}");
        }
    }

    #[test]
    fn orientation_and_duplicates() {
        let mut i = semicircle(5.0, 8);
        i.reverse();
        i.insert(3, i[3]);
        let o = Outline::new(i, semicircle(6.0, 8)).unwrap();
        assert_eq!(o.intrados().len(), 9);
        assert!(o.intrados()[0].x < 0.0);
    }

    #[test]
    fn refusals() {
        let i = semicircle(5.0, 8);
        let e = semicircle(6.0, 8);
        let mut closed = i.clone();
        closed.push(i[0]);
        let err = Outline::new(closed, e.clone()).unwrap_err();
        assert_eq!(err, OutlineError::Closed { face: "intrados" });
        assert!(err.to_string().contains("two open curves"));
        assert!(matches!(Outline::new(e.clone(), i.clone()), Err(OutlineError::Inverted)));
        assert!(matches!(Outline::new(vec![Point::ORIGIN], e.clone()), Err(OutlineError::TooFewPoints { .. })));
        let mut nan = i.clone();
        nan[2].y = f64::NAN;
        assert_eq!(Outline::new(nan, e.clone()).unwrap_err(), OutlineError::NonFinite { face: "intrados", index: 2 });
        // An intrados poking through the extrados at the crown.
        let mut high = i.clone();
        high[4].y = 7.0;
        let err = Outline::new(high, e.clone()).unwrap_err();
        assert!(matches!(err, OutlineError::FacesCross { .. }), "{err}");
        // A face that folds back on itself.
        let zig = vec![Point::new(-5.0, 0.0), Point::new(1.0, 1.0), Point::new(-1.0, 1.0), Point::new(5.0, 0.0)];
        let flat = vec![Point::new(-6.0, 0.0), Point::new(0.0, 6.0), Point::new(6.0, 0.0)];
        assert!(matches!(Outline::new(zig, flat.clone()), Err(OutlineError::SelfIntersection { .. })));
        // Faces meeting at a springing.
        let touching = vec![Point::new(-6.0, 0.0), Point::new(0.0, 3.0), Point::new(5.0, 0.0)];
        assert!(matches!(Outline::new(touching, flat), Err(OutlineError::FacesCross { .. })));
    }

    #[test]
    fn scaled_keeps_centre_line_and_pairing() {
        let o = Outline::new(semicircle(5.0, 32), semicircle(6.0, 20)).unwrap();
        let t = o.scaled(0.5);
        for k in 0..=20 {
            let s = k as f64 / 20.0;
            let (a, b) = (t.joint_at(s), o.joint_at(s).scaled(0.5));
            assert!((a.intrados - b.intrados).hypot() < 1e-9 && (a.extrados - b.extrados).hypot() < 1e-9);
        }
        assert!((t.crown_thickness() - 0.5 * o.crown_thickness()).abs() < 1e-9);
    }
}
