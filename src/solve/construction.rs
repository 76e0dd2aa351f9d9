//! The funicular polygon, constructed the graphic way: from the left end,
//! segment k is drawn parallel to ray k (tₖ = O − aₖ) until it meets the line
//! of action of load k + 1; the last segment runs to the vertical through the
//! right support (Culmann, *Die graphische Statik*, 1866 — from memory).
//!
//! Generic over [`Num`] so that the same construction yields the polygon and,
//! on dual numbers, its exact derivatives for Newton's method.

use super::frame::Frame;
use super::num::Num;

/// A constructed polygon, local coordinates.
#[derive(Clone, Debug)]
pub(crate) struct Polygon<S> {
    /// Left end, one node per load, right end: n + 2 points.
    pub nodes: Vec<[S; 2]>,
    /// Tension vectors tₖ = O − aₖ: n + 1.
    pub rays: Vec<[S; 2]>,
}

/// Why the construction could not be drawn.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) enum Broken {
    /// The segment reaching load `k` (0-based) runs parallel to its line of action.
    Parallel(usize),
    /// The last segment is vertical and never meets the right support's vertical.
    LastVertical,
}

fn cross<S: Num>(a: [S; 2], b: [S; 2]) -> S {
    a[0] * b[1] - a[1] * b[0]
}

/// Draws the polygon for pole `(ox, oy)` and left-end height `y_left`.
pub(crate) fn construct<S: Num>(frame: &Frame, ox: S, oy: S, y_left: S) -> Result<Polygon<S>, Broken> {
    let n = frame.n();
    let mut nodes = Vec::with_capacity(n + 2);
    let mut rays = Vec::with_capacity(n + 1);
    let mut node = [S::c(0.0), y_left];
    nodes.push(node);
    for k in 0..n {
        let a = frame.load_line[k];
        let t = [ox - S::c(a.x), oy - S::c(a.y)];
        rays.push(t);
        let (anchor, force) = (frame.anchors[k], frame.forces[k]);
        let p = [S::c(force.x), S::c(force.y)];
        let den = cross(t, p);
        if !(den.v().is_finite() && den.v() != 0.0) {
            return Err(Broken::Parallel(k));
        }
        node = if force.x == 0.0 {
            // A vertical line of action: the node's x is the load's x exactly.
            let ax = S::c(anchor.x);
            [ax, node[1] + t[1] * ((ax - node[0]) / t[0])]
        } else {
            // node + α t lies on anchor + β P: α = (A − node) × P / (t × P).
            let rel = [S::c(anchor.x) - node[0], S::c(anchor.y) - node[1]];
            let alpha = cross(rel, p) / den;
            [node[0] + alpha * t[0], node[1] + alpha * t[1]]
        };
        nodes.push(node);
    }
    let a = frame.load_line[n];
    let t = [ox - S::c(a.x), oy - S::c(a.y)];
    if !(t[0].v().is_finite() && t[0].v() != 0.0) {
        return Err(Broken::LastVertical);
    }
    rays.push(t);
    let end_x = S::c(frame.span);
    nodes.push([end_x, node[1] + t[1] * ((end_x - node[0]) / t[0])]);
    Ok(Polygon { nodes, rays })
}

/// What is wrong with a constructed polygon's shape.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) enum Misshapen {
    /// Segment `k` has tₖ.x of the wrong sign (or zero).
    WrongWay(usize),
    /// Node `k` (a load node, 1-based) lies outside the span.
    Outside(usize),
    /// Nodes `k` and `k + 1` (load nodes) are not in increasing x.
    OutOfOrder(usize),
}

/// Checks that every segment pulls (cable, `s` = 1) or pushes (arch, `s` = −1)
/// and that the load nodes lie inside the span in increasing x.
pub(crate) fn check_shape(poly: &Polygon<f64>, span: f64, s: f64) -> Result<(), Misshapen> {
    if let Some(k) = poly.rays.iter().position(|t| t[0].is_nan() || s * t[0] <= 0.0) {
        return Err(Misshapen::WrongWay(k));
    }
    let last = poly.nodes.len() - 1;
    for k in 1..last {
        let x = poly.nodes[k][0];
        if x.is_nan() || x <= 0.0 || x >= span {
            return Err(Misshapen::Outside(k));
        }
        let next = poly.nodes[k + 1][0];
        if k + 1 < last && (next.is_nan() || next <= x) {
            return Err(Misshapen::OutOfOrder(k));
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use kurbo::Vec2;

    fn frame(anchors: &[(f64, f64)], forces: &[(f64, f64)], span: f64) -> Frame {
        let mut load_line = vec![Vec2::ZERO];
        for f in forces {
            let last = load_line[load_line.len() - 1];
            load_line.push(last + Vec2::new(f.0, f.1));
        }
        Frame {
            x0: 0.0,
            y0: 0.0,
            span,
            anchors: anchors.iter().map(|a| Vec2::new(a.0, a.1)).collect(),
            forces: forces.iter().map(|f| Vec2::new(f.0, f.1)).collect(),
            load_line,
            vertical: forces.iter().all(|f| f.0 == 0.0),
            force_scale: forces.iter().map(|f| f.0.hypot(f.1)).sum(),
        }
    }

    #[test]
    fn segments_are_parallel_to_rays_and_nodes_on_lines_of_action() {
        // Invented numbers: two inclined loads.
        let f = frame(&[(3.0, 5.0), (7.0, -2.0)], &[(1.0, -10.0), (-2.0, -6.0)], 10.0);
        let p = construct(&f, 12.0, -15.0, 1.0).unwrap();
        assert_eq!(p.nodes.len(), 4);
        for k in 0..3 {
            let seg = [p.nodes[k + 1][0] - p.nodes[k][0], p.nodes[k + 1][1] - p.nodes[k][1]];
            assert!(cross(seg, p.rays[k]).abs() < 1e-12 * 20.0, "segment {k}");
        }
        for k in 0..2 {
            let rel = [p.nodes[k + 1][0] - f.anchors[k].x, p.nodes[k + 1][1] - f.anchors[k].y];
            assert!(cross(rel, [f.forces[k].x, f.forces[k].y]).abs() < 1e-12 * 100.0);
        }
        assert_eq!(p.nodes[3][0], 10.0);
        assert!(check_shape(&p, 10.0, 1.0).is_ok());
        assert_eq!(check_shape(&p, 10.0, -1.0), Err(Misshapen::WrongWay(0)));
    }

    #[test]
    fn a_segment_parallel_to_a_load_is_reported() {
        let f = frame(&[(3.0, 0.0)], &[(0.0, -10.0)], 10.0);
        assert_eq!(construct(&f, 0.0, 4.0, 1.0).unwrap_err(), Broken::Parallel(0));
    }
}
