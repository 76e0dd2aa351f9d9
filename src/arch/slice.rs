//! The arch cut into voussoirs, each with its loads: a [`super::Ring`].
//!
//! [`slice`] cuts an [`Outline`] by radial or vertical joints into
//! voussoirs and gathers each voussoir's loads: its own weight at its
//! centroid, the fill above it, the point and distributed loads that reach
//! its extrados.
//!
//! Fill, point and distributed loads are shared out by vertical strips: the
//! strip of voussoir `k` runs between the x of the extrados ends of its two
//! joints. Where the extrados turns back in x (radial cuts on a horseshoe
//! arch), the strip boundaries are made non-decreasing (each is the largest
//! x reached so far), so the strips always partition the extrados' x-range
//! and nothing is counted twice.

use geo::{Area, BooleanOps, Centroid, Coord, LineString, MultiPolygon, Polygon, Rect};
use kurbo::{Point, Vec2};
use thiserror::Error;

use super::outline::Outline;
use super::{BlockLoad, Joint, LoadKind, Ring};
use crate::model::{DistributedLoad, Load, fmt_num, fmt_xy};

/// The most voussoirs [`slice`] will cut (our limit, against runaway
/// divisions).
pub const MAX_VOUSSOIRS: usize = 10_000;

/// How the joints are cut.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Cuts {
    /// At equal steps of the pairing parameter ([`Outline::joint_at`]): for
    /// concentric circular faces, radial joints at equal angles.
    Radial,
    /// Vertical interior joints at equal steps of x across the x-range where
    /// a vertical line meets both faces; the end joints are the springing
    /// lines. Needs faces that are functions of x there.
    Vertical,
}

/// How many voussoirs.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Division {
    /// Exactly this many (1 to [`MAX_VOUSSOIRS`]).
    Count(usize),
    /// A target voussoir length along the centre line, in drawing units:
    /// the count is the centre line's length over this, rounded up.
    Size(f64),
}

/// What [`slice`] needs besides the drawing.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SliceOptions {
    /// Radial or vertical joints.
    pub cuts: Cuts,
    /// How many voussoirs.
    pub division: Division,
    /// Weight of the arch per unit area of the drawing (force units per
    /// drawing unit²: unit weight × width × unit scale, worked out by the
    /// caller), ≥ 0.
    pub weight_per_area: f64,
    /// Weight of the fill per unit area of the drawing, likewise, ≥ 0.
    pub fill_weight_per_area: f64,
}

/// The arch cut into voussoirs.
#[derive(Clone, Debug, PartialEq)]
pub struct Sliced {
    /// The joints and each voussoir's loads.
    pub ring: Ring,
    /// Each voussoir's outline, counter-clockwise, not closed (the first
    /// point is not repeated).
    pub voussoirs: Vec<Vec<Point>>,
    /// The fill over each voussoir, for drawing: the outer boundary of the
    /// largest piece of fill in its strip (empty when there is none; the
    /// loads count every piece).
    pub fill: Vec<Vec<Point>>,
    /// Things the user should know: fill or distributed load beyond the
    /// extrados' x-range, which is not counted.
    pub warnings: Vec<String>,
}

/// Why an outline could not be sliced.
#[derive(Debug, Error, PartialEq)]
pub enum SliceError {
    /// A weight or size that is not a finite number ≥ 0 (> 0 for a size).
    #[error("the {what} is {value}; give a finite number{}", if *.positive { " > 0" } else { " ≥ 0" })]
    BadNumber {
        /// Which option.
        what: &'static str,
        /// Its value, formatted.
        value: String,
        /// True when zero is not allowed either.
        positive: bool,
    },
    /// Joints that cross each other or leave the arch: faces too uneven
    /// for the cuts asked for.
    #[error(
        "the joints of voussoir {index} (near ({at})) cross each other or a face: the faces are too uneven for {count} {cuts} joints; use fewer voussoirs, the other kind of cuts, or smoother faces"
    )]
    JointsCross {
        /// The voussoir, from 0 at the left springing.
        index: usize,
        /// Near where.
        at: String,
        /// How many voussoirs.
        count: usize,
        /// "radial" or "vertical".
        cuts: &'static str,
    },
    /// Zero voussoirs or too many.
    #[error("{count} voussoirs asked for; give between 1 and {MAX_VOUSSOIRS} (a larger voussoir size gives fewer)")]
    Count {
        /// How many were asked for (or worked out from the size).
        count: String,
    },
    /// A vertical cut meets a face other than once.
    #[error(
        "a vertical cut at x = {x} meets the {face} {times} times: the {face} is not a function of x there (a horseshoe or overhanging arch?); use radial cuts"
    )]
    NotFunctionOfX {
        /// "intrados" or "extrados".
        face: &'static str,
        /// The cut's x.
        x: String,
        /// How many times it meets the face.
        times: usize,
    },
    /// A face turns back in x, which vertical cuts cannot follow.
    #[error(
        "the {face} turns back in x at ({at}) (a horseshoe or overhanging arch?); vertical cuts need faces that run left to right throughout: use radial cuts"
    )]
    TurnsBack {
        /// "intrados" or "extrados".
        face: &'static str,
        /// Where it turns back.
        at: String,
    },
    /// No vertical line meets both faces.
    #[error("no vertical line meets both the intrados and the extrados (near ({at})); use radial cuts")]
    NoVerticalRange {
        /// A point of the outline.
        at: String,
    },
    /// A vertical cut's extrados point is not above its intrados point.
    #[error("the vertical cut at x = {x} meets the extrados at or below the intrados; use radial cuts")]
    VerticalInverted {
        /// The cut's x.
        x: String,
    },
    /// A fill region that cannot be used.
    #[error("fill region {index} (from ({at})) {why}; draw each fill region as a closed polyline of its own")]
    BadFill {
        /// Its index among the fill regions, from 0.
        index: usize,
        /// Its first point.
        at: String,
        /// What is wrong.
        why: &'static str,
    },
    /// A point load with a non-finite or zero force or anchor.
    #[error("the load ({origin}) has a force or position that is not a finite, non-zero number; redraw or relabel it")]
    BadLoad {
        /// The load's origin.
        origin: String,
    },
    /// A point load whose line of action never meets the extrados.
    #[error("the line of action of the load ({origin}) never meets the extrados; move the load over the arch")]
    LoadMisses {
        /// The load's origin.
        origin: String,
    },
    /// A point load outside the extrados' x-range.
    #[error(
        "the load ({origin}) reaches the arch at x = {x}, outside the extrados' x-range {from} to {to}; move the load over the arch or remove it"
    )]
    LoadOutside {
        /// The load's origin.
        origin: String,
        /// Where its line of action meets the extrados (or its x, if vertical).
        x: String,
        /// Left end of the range.
        from: String,
        /// Right end of the range.
        to: String,
    },
    /// A distributed load with non-finite or reversed numbers.
    #[error(
        "the distributed load ({origin}) has an end or intensity that is not a finite number, or ends left of where it starts; redraw or relabel it"
    )]
    BadDistributed {
        /// The load's origin.
        origin: String,
    },
}

fn coord(p: Point) -> Coord<f64> {
    Coord { x: p.x, y: p.y }
}

fn kpoint(p: geo::Point<f64>) -> Point {
    Point::new(p.x(), p.y())
}

fn polygon(pts: &[Point]) -> Polygon<f64> {
    Polygon::new(LineString::new(pts.iter().map(|&p| coord(p)).collect()), Vec::new())
}

/// A joint and where its ends lie along the two faces, as fractional
/// vertex indices.
#[derive(Clone, Copy, Debug)]
struct Cut {
    joint: Joint,
    on_intrados: f64,
    on_extrados: f64,
}

/// Cuts `outline` into voussoirs and gathers their loads.
///
/// `fill` holds closed polygons (the first point may or may not be
/// repeated at the end); the part of each outside the arch is fill, and its
/// weight goes to the voussoir whose strip it lies over (see the module's
/// doc). `loads` meet the arch where their line of action first meets the
/// extrados, travelling the way the force points; `distributed` loads are
/// integrated over each strip. Loads of zero weight are left out.
///
/// # Errors
///
/// See [`SliceError`]: bad options, vertical cuts on faces that are not
/// functions of x, unusable fill regions, point loads that miss the arch or
/// reach it outside the extrados' x-range, non-finite loads.
pub fn slice(
    outline: &Outline,
    fill: &[Vec<Point>],
    loads: &[Load],
    distributed: &[DistributedLoad],
    options: &SliceOptions,
) -> Result<Sliced, SliceError> {
    for (what, v) in
        [("weight per area", options.weight_per_area), ("fill weight per area", options.fill_weight_per_area)]
    {
        if !(v.is_finite() && v >= 0.0) {
            return Err(SliceError::BadNumber { what, value: fmt_num(v), positive: false });
        }
    }
    let n = match options.division {
        Division::Count(n) => n,
        Division::Size(h) => {
            if !(h.is_finite() && h > 0.0) {
                return Err(SliceError::BadNumber { what: "voussoir size", value: fmt_num(h), positive: true });
            }
            let n = (outline.centre_line_length() / h).ceil().max(1.0);
            if n > MAX_VOUSSOIRS as f64 {
                return Err(SliceError::Count { count: fmt_num(n) });
            }
            n as usize
        }
    };
    if n == 0 || n > MAX_VOUSSOIRS {
        return Err(SliceError::Count { count: n.to_string() });
    }
    let cuts = match options.cuts {
        Cuts::Radial => radial(outline, n),
        Cuts::Vertical => vertical(outline, n)?,
    };
    let (ip, ep) = (outline.intrados(), outline.extrados());
    let mut voussoirs = Vec::with_capacity(n);
    let mut blocks: Vec<Vec<BlockLoad>> = Vec::with_capacity(n);
    for w in cuts.windows(2) {
        let (a, b) = (w[0], w[1]);
        let mut ring = vec![a.joint.intrados];
        ring.extend(vertices_between(ip, a.on_intrados, b.on_intrados));
        ring.push(b.joint.intrados);
        ring.push(b.joint.extrados);
        let mut upper: Vec<Point> = vertices_between(ep, a.on_extrados, b.on_extrados).collect();
        upper.reverse();
        ring.extend(upper);
        ring.push(a.joint.extrados);
        ring.dedup();
        if ring.len() > 1 && ring[0] == ring[ring.len() - 1] {
            ring.pop();
        }
        let poly = polygon(&ring);
        // Crossing joints make a voussoir that is not a simple polygon,
        // whose area and centroid mean nothing.
        if !geo::Validation::is_valid(&poly) {
            return Err(SliceError::JointsCross {
                index: voussoirs.len(),
                at: fmt_xy(a.joint.at(0.5)),
                count: n,
                cuts: match options.cuts {
                    Cuts::Radial => "radial",
                    Cuts::Vertical => "vertical",
                },
            });
        }
        let weight = poly.unsigned_area() * options.weight_per_area;
        let mut mine = Vec::new();
        if weight > 0.0
            && let Some(c) = poly.centroid()
        {
            mine.push(BlockLoad { at: kpoint(c), force: Vec2::new(0.0, -weight), kind: LoadKind::OwnWeight });
        }
        blocks.push(mine);
        voussoirs.push(ring);
    }
    // Strip boundaries: the extrados ends' x, made non-decreasing.
    let mut bounds: Vec<f64> = Vec::with_capacity(n + 1);
    for c in &cuts {
        let x = c.joint.extrados.x;
        bounds.push(bounds.last().map_or(x, |&m: &f64| m.max(x)));
    }
    let (from, to) = (bounds[0], bounds[n]);
    let mut warnings = Vec::new();

    // Fill.
    let mut fill_pieces = vec![Vec::new(); n];
    if !fill.is_empty() {
        let net = fill_outside_arch(outline, fill)?;
        // Fill under the extrados (in the opening, or below the springings)
        // carries nothing down onto the arch: it is left out, and said.
        let drawn = net.unsigned_area();
        let under = {
            let e = outline.extrados();
            let rect = geo::BoundingRect::bounding_rect(&net);
            let low = rect.map_or(0.0, |r| r.min().y).min(e.iter().map(|p| p.y).fold(f64::INFINITY, f64::min)) - 1.0;
            let mut pts: Vec<Point> = e.to_vec();
            pts.push(Point::new(e[e.len() - 1].x, low));
            pts.push(Point::new(e[0].x, low));
            polygon(&pts)
        };
        let net = net.difference(&under);
        let total = net.unsigned_area();
        if drawn - total > 1e-6 * drawn {
            warnings.push(format!(
                "fill of area {} lies under the extrados (in the opening or below the springings) and is not counted; draw fill regions above the extrados",
                fmt_num(drawn - total)
            ));
        }
        if total > 0.0 {
            let rect = geo::BoundingRect::bounding_rect(&net);
            let (ylo, yhi) = rect.map_or((0.0, 0.0), |r| (r.min().y, r.max().y));
            let pad = (yhi - ylo).max(1.0);
            let mut counted = 0.0;
            for k in 0..n {
                if bounds[k + 1] <= bounds[k] {
                    continue;
                }
                let strip = Rect::new(Coord { x: bounds[k], y: ylo - pad }, Coord { x: bounds[k + 1], y: yhi + pad })
                    .to_polygon();
                let piece = net.intersection(&strip);
                let area = piece.unsigned_area();
                counted += area;
                let weight = area * options.fill_weight_per_area;
                if weight > 0.0
                    && let Some(c) = piece.centroid()
                {
                    blocks[k].push(BlockLoad { at: kpoint(c), force: Vec2::new(0.0, -weight), kind: LoadKind::Fill });
                }
                if let Some(largest) = piece.0.iter().max_by(|p, q| p.unsigned_area().total_cmp(&q.unsigned_area())) {
                    let mut pts: Vec<Point> = largest.exterior().0.iter().map(|c| Point::new(c.x, c.y)).collect();
                    if pts.len() > 1 && pts[0] == pts[pts.len() - 1] {
                        pts.pop();
                    }
                    fill_pieces[k] = pts;
                }
            }
            let outside = total - counted;
            // Clipping loses about 1e-8 of the area to round-off.
            if outside > 1e-6 * total {
                warnings.push(format!(
                    "fill of area {} lies beyond the extrados' x-range {} to {} and is not counted; trim the fill or extend the arch",
                    fmt_num(outside),
                    fmt_num(from),
                    fmt_num(to)
                ));
            }
        }
    }

    // Point loads.
    for load in loads {
        let origin = || load.origin.to_string();
        let finite = load.anchor.x.is_finite()
            && load.anchor.y.is_finite()
            && load.force.x.is_finite()
            && load.force.y.is_finite();
        if !finite || load.force.hypot() == 0.0 {
            return Err(SliceError::BadLoad { origin: origin() });
        }
        let outside =
            |x: f64| SliceError::LoadOutside { origin: origin(), x: fmt_num(x), from: fmt_num(from), to: fmt_num(to) };
        if load.force.x == 0.0 && !(from..=to).contains(&load.anchor.x) {
            return Err(outside(load.anchor.x));
        }
        let Some(at) = first_crossing(ep, load.anchor, load.force) else {
            return Err(SliceError::LoadMisses { origin: origin() });
        };
        let Some(k) = strip_of(&bounds, at.x) else {
            return Err(outside(at.x));
        };
        blocks[k].push(BlockLoad { at, force: load.force, kind: LoadKind::Applied });
    }

    // Distributed loads.
    for d in distributed {
        let ok = [d.x0, d.x1, d.w0, d.w1].iter().all(|v| v.is_finite()) && d.x1 > d.x0;
        if !ok {
            return Err(SliceError::BadDistributed { origin: d.origin.to_string() });
        }
        let mut counted = 0.0;
        for k in 0..n {
            let (p, q) = (bounds[k].max(d.x0), bounds[k + 1].min(d.x1));
            if q <= p {
                continue;
            }
            let (wp, wq) = (d.at(p), d.at(q));
            let total = 0.5 * (wp + wq) * (q - p);
            counted += total;
            if total == 0.0 {
                continue;
            }
            // The trapezoid's centroid (elementary statics).
            let xc = if wp + wq == 0.0 { 0.5 * (p + q) } else { p + (q - p) * (wp + 2.0 * wq) / (3.0 * (wp + wq)) };
            let at = first_crossing(ep, Point::new(xc, 0.0), Vec2::new(0.0, -1.0)).unwrap_or(Point::new(xc, 0.0));
            blocks[k].push(BlockLoad { at, force: Vec2::new(0.0, -total), kind: LoadKind::Applied });
        }
        let outside = d.total() - counted;
        if outside.abs() > 1e-9 * d.total().abs().max(f64::MIN_POSITIVE) {
            warnings.push(format!(
                "{} of the distributed load ({}) lies beyond the extrados' x-range {} to {} and is not counted",
                fmt_num(outside),
                d.origin,
                fmt_num(from),
                fmt_num(to)
            ));
        }
    }

    Ok(Sliced {
        ring: Ring { joints: cuts.iter().map(|c| c.joint).collect(), blocks },
        voussoirs,
        fill: fill_pieces,
        warnings,
    })
}

/// Joints at equal steps of the pairing parameter.
fn radial(outline: &Outline, n: usize) -> Vec<Cut> {
    (0..=n)
        .map(|k| {
            let s = k as f64 / n as f64;
            Cut {
                joint: outline.joint_at(s),
                on_intrados: outline.intrados_index(s),
                on_extrados: outline.extrados_index(s),
            }
        })
        .collect()
}

/// The springing lines and `n - 1` vertical cuts between them.
fn vertical(outline: &Outline, n: usize) -> Result<Vec<Cut>, SliceError> {
    let (ip, ep) = (outline.intrados(), outline.extrados());
    for (face, pts) in [("intrados", ip), ("extrados", ep)] {
        if let Some(w) = pts.windows(2).find(|w| w[1].x < w[0].x) {
            return Err(SliceError::TurnsBack { face, at: fmt_xy(w[0]) });
        }
    }
    let a = ip[0].x.max(ep[0].x);
    let b = ip[ip.len() - 1].x.min(ep[ep.len() - 1].x);
    if b <= a {
        return Err(SliceError::NoVerticalRange { at: fmt_xy(ip[0]) });
    }
    let mut cuts = vec![Cut { joint: outline.joint_at(0.0), on_intrados: 0.0, on_extrados: 0.0 }];
    for k in 1..n {
        let x = a + (b - a) * k as f64 / n as f64;
        let (lo, on_intrados) = vertical_hit(ip, x, "intrados")?;
        let (hi, on_extrados) = vertical_hit(ep, x, "extrados")?;
        if hi.y <= lo.y {
            return Err(SliceError::VerticalInverted { x: fmt_num(x) });
        }
        cuts.push(Cut { joint: Joint { intrados: lo, extrados: hi }, on_intrados, on_extrados });
    }
    cuts.push(Cut {
        joint: outline.joint_at(1.0),
        on_intrados: (ip.len() - 1) as f64,
        on_extrados: (ep.len() - 1) as f64,
    });
    Ok(cuts)
}

/// Where the vertical line at `x` meets a face: the point and its
/// fractional vertex index; an error unless it meets it exactly once.
fn vertical_hit(pts: &[Point], x: f64, face: &'static str) -> Result<(Point, f64), SliceError> {
    let mut hits: Vec<(Point, f64)> = Vec::new();
    for (k, w) in pts.windows(2).enumerate() {
        let (p, q) = (w[0], w[1]);
        if x < p.x.min(q.x) || x > p.x.max(q.x) {
            continue;
        }
        if p.x == q.x {
            // A vertical piece on the cut: it meets the face along a length.
            return Err(SliceError::NotFunctionOfX { face, x: fmt_num(x), times: 2 });
        }
        let hit = if x == p.x {
            (p, k as f64)
        } else if x == q.x {
            (q, (k + 1) as f64)
        } else {
            let t = (x - p.x) / (q.x - p.x);
            (Point::new(x, p.y + t * (q.y - p.y)), k as f64 + t)
        };
        if hits.last().is_none_or(|h| h.0 != hit.0) {
            hits.push(hit);
        }
    }
    if hits.len() == 1 {
        Ok(hits[0])
    } else {
        Err(SliceError::NotFunctionOfX { face, x: fmt_num(x), times: hits.len() })
    }
}

/// The vertices of a polyline strictly between fractional indices `a` and `b`.
fn vertices_between(pts: &[Point], a: f64, b: f64) -> impl Iterator<Item = Point> + '_ {
    pts.iter().enumerate().filter(move |(j, _)| (*j as f64) > a && (*j as f64) < b).map(|(_, p)| *p)
}

/// The first point where the line through `anchor` along `dir` meets the
/// polyline, travelling along `dir` (the least line parameter, which may be
/// behind the anchor).
fn first_crossing(pts: &[Point], anchor: Point, dir: Vec2) -> Option<Point> {
    let d = dir.normalize();
    let mut best: Option<(f64, Point)> = None;
    for w in pts.windows(2) {
        let (p, q) = (w[0], w[1]);
        let e = q - p;
        let denom = d.cross(e);
        if denom == 0.0 || !denom.is_finite() {
            continue;
        }
        let ap = p - anchor;
        let t = ap.cross(e) / denom;
        let u = ap.cross(d) / denom;
        if !(0.0..=1.0).contains(&u) || !t.is_finite() {
            continue;
        }
        let hit = if u == 0.0 {
            p
        } else if u == 1.0 {
            q
        } else {
            p + e * u
        };
        if best.is_none_or(|(bt, _)| t < bt) {
            best = Some((t, hit));
        }
    }
    best.map(|b| b.1)
}

/// The strip holding `x` (the left one on a shared boundary).
fn strip_of(bounds: &[f64], x: f64) -> Option<usize> {
    (0..bounds.len() - 1).find(|&k| bounds[k] <= x && x <= bounds[k + 1] && bounds[k + 1] > bounds[k])
}

/// The union of the fill regions less the arch.
fn fill_outside_arch(outline: &Outline, fill: &[Vec<Point>]) -> Result<MultiPolygon<f64>, SliceError> {
    let mut union = MultiPolygon::<f64>::new(Vec::new());
    for (index, region) in fill.iter().enumerate() {
        let at = region.first().map_or_else(|| "nothing".to_string(), |p| fmt_xy(*p));
        let bad = |why| SliceError::BadFill { index, at: at.clone(), why };
        if region.iter().any(|p| !(p.x.is_finite() && p.y.is_finite())) {
            return Err(bad("has a coordinate that is not a finite number"));
        }
        let mut pts = region.clone();
        pts.dedup();
        if pts.len() > 1 && pts[0] == pts[pts.len() - 1] {
            pts.pop();
        }
        if pts.len() < 3 {
            return Err(bad("has fewer than three distinct points"));
        }
        let poly = polygon(&pts);
        if poly.unsigned_area() == 0.0 {
            return Err(bad("encloses no area"));
        }
        union = union.union(&poly);
    }
    Ok(union.difference(&outline.polygon()))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::Origin;
    use std::f64::consts::PI;

    fn arc(r: f64, n: usize) -> Vec<Point> {
        (0..=n).map(|k| Vec2::from_angle(PI - PI * k as f64 / n as f64) * r).map(|v| v.to_point()).collect()
    }

    fn options(cuts: Cuts, division: Division) -> SliceOptions {
        SliceOptions { cuts, division, weight_per_area: 1.0, fill_weight_per_area: 1.0 }
    }

    fn origin(at: Point) -> Origin {
        Origin { layer: "LOADS".into(), handle: Some("2A".into()), at }
    }

    fn weights(s: &Sliced, kind: LoadKind) -> Vec<f64> {
        s.ring.blocks.iter().map(|b| b.iter().filter(|l| l.kind == kind).map(|l| -l.force.y).sum()).collect()
    }

    /// An annular semicircle cut radially into voussoirs: each is an annular
    /// sector. Area (θ/2)(R_e² − R_i²) (elementary geometry); centroid at
    /// radius (2/3)(R_e³ − R_i³)/(R_e² − R_i²) · sin(θ/2)/(θ/2) on its
    /// bisector (the centroid of an annular sector, from memory; it follows
    /// from the circular sector's 2R sin(α)/(3α) by subtraction).
    #[test]
    fn annular_semicircle_radial() {
        let (ri, re, faces, n) = (5.0, 6.0, 720, 12);
        let o = Outline::new(arc(ri, faces), arc(re, faces)).unwrap();
        let s = slice(&o, &[], &[], &[], &options(Cuts::Radial, Division::Count(n))).unwrap();
        assert_eq!(s.ring.joints.len(), n + 1);
        let theta = PI / n as f64;
        let area = theta / 2.0 * (re * re - ri * ri);
        let rc = 2.0 / 3.0 * (re.powi(3) - ri.powi(3)) / (re * re - ri * ri) * (theta / 2.0).sin() / (theta / 2.0);
        // Flattening: each face is a polygon inscribed in its circle, with
        // sagitta R(1 − cos(π/2m)) for m pieces.
        let sag = |r: f64| r * (1.0 - (PI / (2.0 * faces as f64)).cos());
        let area_tol = (sag(ri) * ri + sag(re) * re) * theta;
        let mut sum = 0.0;
        for (k, b) in s.ring.blocks.iter().enumerate() {
            assert_eq!(b.len(), 1);
            let w = -b[0].force.y;
            sum += w;
            assert!((w - area).abs() <= area_tol, "voussoir {k}: area {w}, closed form {area}");
            let mid = PI - theta * (k as f64 + 0.5);
            let expect = Point::new(rc * mid.cos(), rc * mid.sin());
            assert!((b[0].at - expect).hypot() <= sag(re), "voussoir {k}: centroid {:?} vs {expect:?}", b[0].at);
        }
        assert!((sum - o.area()).abs() < 1e-9 * o.area());
    }

    /// A parabolic segment arch whose extrados is its intrados raised by t:
    /// between vertical cuts the area is t·Δx exactly (the area between two
    /// curves a constant apart; elementary calculus), and the fill up to a
    /// level road at height Y is ∫(Y − e(x))dx, with e the extrados polyline:
    /// Y·L − (2/3)·h·L − t·L for the parabola, plus c·L³/(6m²) for the m
    /// chords of y = c·x² (the segment between a parabola and its chord
    /// has area |c|Δx³/6; elementary calculus).
    #[test]
    fn parabolic_arch_vertical_and_fill() {
        let (l, h, t, m, yroad) = (12.0, 3.0, 0.6, 96, 4.5);
        let c = 4.0 * h / (l * l);
        let xs: Vec<f64> = (0..=m).map(|k| -l / 2.0 + l * k as f64 / m as f64).collect();
        let i: Vec<Point> = xs.iter().map(|&x| Point::new(x, h - c * x * x)).collect();
        let e: Vec<Point> = i.iter().map(|p| Point::new(p.x, p.y + t)).collect();
        let o = Outline::new(i, e.clone()).unwrap();
        let mut road = vec![Point::new(-l / 2.0, yroad), Point::new(l / 2.0, yroad)];
        road.extend(e.iter().rev());
        let n = 10;
        let loads = [Load::vertical(1.3, 40.0, origin(Point::new(1.3, 6.0)))];
        let w = [DistributedLoad { x0: -l / 2.0, x1: l / 2.0, w0: 2.0, w1: 5.0, origin: origin(Point::new(0.0, 5.0)) }];
        let s = slice(&o, &[road], &loads, &w, &options(Cuts::Vertical, Division::Count(n))).unwrap();
        assert!(s.warnings.is_empty(), "{:?}", s.warnings);
        let own = weights(&s, LoadKind::OwnWeight);
        for (k, a) in own.iter().enumerate() {
            assert!((a - t * l / n as f64).abs() < 1e-12, "voussoir {k}: {a}");
        }
        assert!((own.iter().sum::<f64>() - t * l).abs() < 1e-12);
        let fill: f64 = weights(&s, LoadKind::Fill).iter().sum();
        let expect = yroad * l - 2.0 / 3.0 * h * l - t * l + c * l.powi(3) / (6.0 * (m * m) as f64);
        assert!((fill - expect).abs() < 1e-6 * expect, "fill {fill}, closed form {expect}");
        // The point load at x = 1.3 lies in strip 6 of 10 (x from 1.2 to 2.4),
        // on the extrados.
        let applied: Vec<(usize, BlockLoad)> = s
            .ring
            .blocks
            .iter()
            .enumerate()
            .flat_map(|(k, b)| {
                b.iter().filter(|l| l.kind == LoadKind::Applied && l.force.y == -40.0).map(move |l| (k, *l))
            })
            .collect();
        assert_eq!(applied.len(), 1);
        assert_eq!(applied[0].0, 6);
        assert!((applied[0].1.at.y - (h + t - c * 1.3 * 1.3)).abs() < c * (l / m as f64).powi(2) / 4.0);
        // The distributed load: (w0 + w1)/2 · L in all.
        let dist: f64 = weights(&s, LoadKind::Applied).iter().sum::<f64>() - 40.0;
        assert!((dist - 3.5 * l).abs() < 1e-9);
    }

    #[test]
    fn inclined_load_and_refusals() {
        let o = Outline::new(arc(5.0, 90), arc(6.0, 90)).unwrap();
        // A load from the upper right towards the centre meets the extrados
        // on its radius at 60°, x = 3, in voussoir 2 of 4 (elementary
        // geometry; to within the chord sagitta).
        let from = (Vec2::from_angle(PI / 3.0) * 10.0).to_point();
        let p = Load { anchor: from, force: Vec2::new(-1.5, -1.5 * 3f64.sqrt()), origin: origin(from) };
        let s = slice(&o, &[], &[p], &[], &options(Cuts::Radial, Division::Count(4))).unwrap();
        let hit = s.ring.blocks[2].iter().find(|l| l.kind == LoadKind::Applied).unwrap();
        assert!((hit.at.to_vec2().hypot() - 6.0).abs() < 6.0 * (1.0 - (PI / 180.0).cos()) + 1e-12);
        let off = Load::vertical(7.5, 1.0, origin(Point::new(7.5, 2.0)));
        let err = slice(&o, &[], &[off], &[], &options(Cuts::Radial, Division::Count(4))).unwrap_err();
        assert!(err.to_string().contains("x = 7.5") && err.to_string().contains("entity 2A"), "{err}");
        assert!(matches!(
            slice(&o, &[], &[], &[], &options(Cuts::Radial, Division::Count(0))),
            Err(SliceError::Count { .. })
        ));
        assert!(matches!(
            slice(&o, &[], &[], &[], &options(Cuts::Radial, Division::Size(1e-6))),
            Err(SliceError::Count { .. })
        ));
        let s = slice(&o, &[], &[], &[], &options(Cuts::Radial, Division::Size(1.0))).unwrap();
        assert_eq!(s.voussoirs.len(), (o.centre_line_length()).ceil() as usize);
        // A horseshoe: the faces turn back below the widest point.
        let shoe = |r: f64| -> Vec<Point> {
            (0..=60)
                .map(|k| Vec2::from_angle(PI * 1.25 - PI * 1.5 * k as f64 / 60.0) * r)
                .map(|v| v.to_point())
                .collect()
        };
        let o = Outline::new(shoe(5.0), shoe(6.0)).unwrap();
        let err = slice(&o, &[], &[], &[], &options(Cuts::Vertical, Division::Count(8))).unwrap_err();
        assert!(err.to_string().contains("use radial cuts"), "{err}");
        assert!(slice(&o, &[], &[], &[], &options(Cuts::Radial, Division::Count(8))).is_ok());
    }

    #[test]
    fn fill_beyond_the_extrados_is_reported() {
        let o = Outline::new(arc(5.0, 90), arc(6.0, 90)).unwrap();
        let fill = vec![Point::new(-8.0, 0.0), Point::new(8.0, 0.0), Point::new(8.0, 7.0), Point::new(-8.0, 7.0)];
        let s = slice(&o, &[fill], &[], &[], &options(Cuts::Vertical, Division::Count(6))).unwrap();
        assert_eq!(s.warnings.len(), 2, "{:?}", s.warnings);
        // The opening under a semicircular intrados of radius 5, drawn as 90
        // chords: ½·r²·90·sin(π/90) = 39.2619 (πr²/2 = 39.27 for the true
        // circle) is not fill.
        let opening = 0.5 * 25.0 * 90.0 * (PI / 90.0).sin();
        assert!((opening - 39.2619).abs() < 1e-4);
        assert!(s.warnings[0].contains("area 39.2619"), "{}", s.warnings[0]);
        assert!(s.warnings[1].contains("area 28"), "{}", s.warnings[1]);
        assert!(s.fill.iter().all(|f| !f.is_empty()));
    }

    mod never_panics {
        use super::*;
        use proptest::prelude::*;

        fn pts(range: f64) -> impl Strategy<Value = Vec<Point>> {
            prop::collection::vec((-range..range, -range..range).prop_map(|(x, y)| Point::new(x, y)), 0..7)
        }

        /// An arch-like face: `n` points on a rough half sine, jittered.
        fn face(n: usize, rise: f64, jitter: &[(f64, f64)]) -> Vec<Point> {
            (0..n)
                .map(|k| {
                    let t = k as f64 / (n - 1) as f64;
                    let (jx, jy) = jitter[k % jitter.len()];
                    Point::new(
                        -5.0 * (1.0 + rise * 0.1) + 10.0 * (1.0 + rise * 0.1) * t + jx,
                        rise * (PI * t).sin() + jy,
                    )
                })
                .collect()
        }

        proptest! {
            #![proptest_config(ProptestConfig::with_cases(256))]

            /// Arch-like outlines, mostly valid: sliced every way with fill
            /// and loads, never a panic, and the voussoirs' areas sum to the
            /// outline's (property test; our own invariants).
            #[test]
            fn arch_like(
                n in 2usize..30, rise in 0.5..6.0f64, t in 0.05..2.0f64,
                jitter in prop::collection::vec((-0.3..0.3f64, -0.3..0.3f64), 1..5),
                count in 1usize..40, vertical in any::<bool>(), lx in -5.0..5.0f64, dx in -0.15..0.15f64,
            ) {
                let i = face(n, rise, &jitter);
                let e = face(n + 3, rise + t, &[(0.0, 0.0)]);
                if let Ok(o) = Outline::new(i, e) {
                    let cuts = if vertical { Cuts::Vertical } else { Cuts::Radial };
                    let load = Load { anchor: Point::new(lx, 20.0), force: Vec2::new(dx, -1.0), origin: origin(Point::ORIGIN) };
                    let fill = vec![Point::new(-8.0, 0.0), Point::new(8.0, 0.0), Point::new(8.0, rise + t + 1.0), Point::new(-8.0, rise + t + 1.0)];
                    match slice(&o, &[fill], &[load], &[], &options(cuts, Division::Count(count))) {
                        Ok(s) => {
                            let sum: f64 = s.voussoirs.iter().map(|v| polygon(v).unsigned_area()).sum();
                            prop_assert!((sum - o.area()).abs() <= 1e-9 * o.area(), "{sum} vs {}", o.area());
                        }
                        Err(err) => prop_assert!(!matches!(err, SliceError::BadNumber { .. } | SliceError::Count { .. }), "{err}"),
                    }
                }
            }

            /// Any finite input gives an outline or an error, and any outline
            /// slices or errs, never panics (property test; our own rule).
            #[test]
            fn outline_and_slice(
                i in pts(10.0), e in pts(10.0), fill in pts(12.0), scale in prop_oneof![Just(1.0), Just(1e-9), Just(1e150)],
                n in 0usize..20, vertical in any::<bool>(), lx in -12.0..12.0f64, dx in -1.0..1.0f64,
            ) {
                let sc = |v: Vec<Point>| v.into_iter().map(|p| (p.to_vec2() * scale).to_point()).collect::<Vec<_>>();
                if let Ok(o) = Outline::new(sc(i), sc(e)) {
                    let _ = o.scaled(0.5).area();
                    let _ = (o.span(), o.rise(), o.crown_thickness(), o.springing_thickness(), o.centre_line_length());
                    let cuts = if vertical { Cuts::Vertical } else { Cuts::Radial };
                    let load = Load { anchor: Point::new(lx * scale, 20.0 * scale), force: Vec2::new(dx, -1.0), origin: origin(Point::ORIGIN) };
                    let d = DistributedLoad { x0: -5.0 * scale, x1: 5.0 * scale, w0: 1.0, w1: 2.0, origin: origin(Point::ORIGIN) };
                    let _ = slice(&o, &[sc(fill)], &[load], &[d], &options(cuts, Division::Count(n)));
                }
            }
        }
    }
}
