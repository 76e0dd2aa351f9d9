//! How far a constructed polygon is from meeting each condition, measured on
//! the polygon itself (so inclined loads and the final checks share it).

use super::ask::Cond;
use super::construction::Polygon;
use super::frame::Frame;
use super::num::Num;

/// The residual of `c` on `poly`, in the condition's own unit (length or
/// force; for `--level-at`, the vertical component of the level segment's
/// tension). `s` is +1 for a cable, −1 for an arch.
pub(crate) fn residual<S: Num>(c: &Cond, frame: &Frame, poly: &Polygon<S>, s: f64) -> S {
    let nodes = &poly.nodes;
    let last = nodes.len() - 1;
    match *c {
        Cond::Left(p) => nodes[0][1] - S::c(p.y - frame.y0),
        Cond::Right(p) => nodes[last][1] - S::c(p.y - frame.y0),
        Cond::Through(p) => {
            let x = p.x - frame.x0;
            let k = segment_at(poly, x);
            // Along the ray's slope rather than between the nodes: no division
            // by a segment's length, which may be tiny.
            let t = poly.rays[k];
            nodes[k][1] + (S::c(x) - nodes[k][0]) * (t[1] / t[0]) - S::c(p.y - frame.y0)
        }
        Cond::LevelAt(x) => poly.rays[segment_at(poly, x - frame.x0)][1],
        Cond::Thrust(h) => S::c(s) * poly.rays[0][0] - S::c(h),
        Cond::Sag(f) => sag(poly, s).1 - S::c(f),
        Cond::MaxForce(t) => {
            let k = max_ray(poly);
            let r = poly.rays[k];
            (r[0] * r[0] + r[1] * r[1]).root() - S::c(t)
        }
        // The length of the polygon: the profile's length under point loads.
        // Length conditions are solved and checked on the exact curve by
        // `continuous`; the polygon's own stretch needs the axial stiffness,
        // which this residual does not know, so the unstressed length is
        // measured here as if the profile were inextensible.
        Cond::Length(l) | Cond::Unstressed(l) => {
            let mut sum = S::c(0.0);
            for w in nodes.windows(2) {
                let (dx, dy) = (w[1][0] - w[0][0], w[1][1] - w[0][1]);
                sum = sum + (dx * dx + dy * dy).root();
            }
            sum - S::c(l)
        }
    }
}

/// The scale a residual is divided by for Newton's method: the span for
/// lengths, Σ|P| for forces.
pub(crate) fn newton_scale(c: &Cond, frame: &Frame) -> f64 {
    match c {
        Cond::Thrust(_) | Cond::MaxForce(_) | Cond::LevelAt(_) => frame.force_scale,
        _ => frame.span,
    }
}

/// The residual relative to the condition's own scale, for the report: the
/// span for lengths, the asked force, and for `--level-at` the sine of the
/// level segment's slope.
pub(crate) fn relative(c: &Cond, frame: &Frame, poly: &Polygon<f64>, s: f64) -> f64 {
    let r = residual(c, frame, poly, s).abs();
    match *c {
        Cond::Thrust(h) => r / h,
        Cond::MaxForce(t) => r / t,
        Cond::Length(l) | Cond::Unstressed(l) => r / l,
        Cond::LevelAt(x) => {
            let t = poly.rays[segment_at(poly, x - frame.x0)];
            r / t[0].hypot(t[1])
        }
        _ => r / frame.span,
    }
}

/// Index of the segment whose x-range holds local `x`: the last one
/// starting at or left of x (segment 0 when x is left of everything).
pub(crate) fn segment_at<S: Num>(poly: &Polygon<S>, x: f64) -> usize {
    let nodes = &poly.nodes;
    // Nodes are in increasing x for every valid polygon; an invalid one
    // still yields some segment, and the shape check reports it.
    let inner = nodes[1..nodes.len() - 1].partition_point(|n| n[0].v() <= x);
    inner.min(poly.rays.len() - 1)
}

/// The node with the largest s·(chord − y), and that distance.
pub(crate) fn sag<S: Num>(poly: &Polygon<S>, s: f64) -> (usize, S) {
    let nodes = &poly.nodes;
    let (first, last) = (nodes[0], nodes[nodes.len() - 1]);
    let slope = (last[1] - first[1]) / (last[0] - first[0]);
    let mut best = (0, S::c(0.0));
    for (k, n) in nodes.iter().enumerate() {
        let d = S::c(s) * (first[1] + slope * (n[0] - first[0]) - n[1]);
        if d.v() > best.1.v() {
            best = (k, d);
        }
    }
    best
}

/// Index of the ray with the largest magnitude.
pub(crate) fn max_ray<S: Num>(poly: &Polygon<S>) -> usize {
    let m = |r: &[S; 2]| r[0].v().hypot(r[1].v());
    let mut best = 0;
    for (k, r) in poly.rays.iter().enumerate() {
        if m(r) > m(&poly.rays[best]) {
            best = k;
        }
    }
    best
}
