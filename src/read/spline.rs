//! SPLINE entities flattened to polylines.
//!
//! A SPLINE is a B-spline (group codes: 71 degree, 40 knots, 10/20 control
//! points, 41 weights, 11/21 fit points, 12/22 and 13/23 end tangents, 70
//! flags — DXF reference, SPLINE). How each kind is flattened:
//!
//! * non-rational, degree 1 to 3: each knot span is turned into its Bézier
//!   segment (the control points one gets by inserting the span's end knots
//!   until each has full multiplicity, computed by blossoming: de Boor's
//!   algorithm with the span's end parameters as arguments), and kurbo
//!   flattens the segments within the tolerance;
//! * rational, or degree above 3: de Boor evaluation (in homogeneous
//!   coordinates when rational), each span subdivided until the curve at the
//!   quarter points of every piece is within the tolerance of its chord;
//! * fit points only (no control points): the C² cubic through the fit
//!   points with chord-length parameters, its end tangents those of codes
//!   12 and 13 when given and otherwise "natural" (no curvature at the
//!   ends). CAD programs fit the same points with end conditions of their
//!   own, so near the ends the curve read may differ slightly from the one
//!   shown; [`is_fit_only`] lets the reader warn.
//!
//! Malformed data never panics: a knot vector that does not match the
//! control points is replaced by a clamped uniform one, weights that are not
//! one positive finite number per control point are ignored, a degree out of
//! range is brought into range.

use kurbo::{BezPath, Point, Vec2};

/// What a SPLINE entity holds.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct SplineData {
    /// Degree (71).
    pub degree: i64,
    /// Flags (70): 1 closed, 2 periodic, 4 rational.
    pub flags: i64,
    /// Knots (40), in order.
    pub knots: Vec<f64>,
    /// Weights (41), one per control point when rational.
    pub weights: Vec<f64>,
    /// Control points (10/20), in world coordinates.
    pub control: Vec<Point>,
    /// Fit points (11/21).
    pub fit: Vec<Point>,
    /// Start tangent (12/22), if given.
    pub start_tangent: Option<Vec2>,
    /// End tangent (13/23), if given.
    pub end_tangent: Option<Vec2>,
}

/// True when the spline is given by fit points alone, so that the curve
/// read is an interpolation of ours (see the module's doc).
#[must_use]
pub fn is_fit_only(s: &SplineData) -> bool {
    s.control.len() < 2 && s.fit.len() >= 2
}

/// The spline flattened into straight pieces within `tolerance` (never finer
/// than 2·10⁻⁶ of the curve's extent, which bounds the number of pieces).
/// A non-finite coordinate gives the raw points back, for the caller's
/// coordinate check to refuse.
#[must_use]
pub fn flatten(s: &SplineData, tolerance: f64) -> Vec<Point> {
    let given = if s.control.len() >= 2 { &s.control } else { &s.fit };
    if given.len() < 2 || given.iter().any(|p| !(p.x.is_finite() && p.y.is_finite())) {
        return given.clone();
    }
    let tol = guard_tolerance(tolerance, given);
    if s.control.len() >= 2 { from_control(s, tol) } else { through_fit_points(s, tol) }
}

fn guard_tolerance(tolerance: f64, pts: &[Point]) -> f64 {
    let (mut lo, mut hi) = (pts[0], pts[0]);
    for p in pts {
        lo = Point::new(lo.x.min(p.x), lo.y.min(p.y));
        hi = Point::new(hi.x.max(p.x), hi.y.max(p.y));
    }
    let t = tolerance.max((hi - lo).hypot() * 2e-6);
    if t.is_finite() && t > 0.0 { t } else { 1.0 }
}

/// A point in homogeneous coordinates: (w·x, w·y, w).
#[derive(Clone, Copy, Debug)]
struct H(f64, f64, f64);

impl H {
    fn lerp(self, o: H, t: f64) -> H {
        H(self.0 + (o.0 - self.0) * t, self.1 + (o.1 - self.1) * t, self.2 + (o.2 - self.2) * t)
    }

    fn point(self) -> Point {
        Point::new(self.0 / self.2, self.1 / self.2)
    }
}

/// A B-spline ready to evaluate: degree, knots matching the control
/// points, homogeneous control points.
struct Curve {
    p: usize,
    knots: Vec<f64>,
    ctrl: Vec<H>,
}

impl Curve {
    fn new(s: &SplineData) -> (Curve, bool) {
        let n = s.control.len();
        let p = usize::try_from(s.degree).unwrap_or(1).clamp(1, n - 1);
        let knots_ok = s.knots.len() == n + p + 1
            && s.knots.iter().all(|k| k.is_finite())
            && s.knots.windows(2).all(|w| w[0] <= w[1])
            && s.knots[p] < s.knots[n];
        let knots = if knots_ok { s.knots.clone() } else { clamped_uniform(n, p) };
        let weights_ok = s.weights.len() == n && s.weights.iter().all(|w| w.is_finite() && *w > 0.0);
        let rational = weights_ok && (s.flags & 4 != 0 || s.weights.iter().any(|w| *w != 1.0));
        let ctrl = s
            .control
            .iter()
            .enumerate()
            .map(|(i, c)| {
                let w = if rational { s.weights[i] } else { 1.0 };
                H(c.x * w, c.y * w, w)
            })
            .collect();
        (Curve { p, knots, ctrl }, rational)
    }

    /// The knot spans of the domain with non-zero length: `i` with
    /// `knots[i] < knots[i + 1]`, `p <= i < n`.
    fn spans(&self) -> impl Iterator<Item = usize> + '_ {
        (self.p..self.ctrl.len()).filter(|&i| self.knots[i] < self.knots[i + 1])
    }

    /// The blossom of span `i` at `args` (`p` parameters): with all equal to
    /// `u`, the curve's point at `u` (de Boor's algorithm).
    fn blossom(&self, i: usize, args: &[f64]) -> H {
        let p = self.p;
        let mut d: Vec<H> = (0..=p).map(|j| self.ctrl[i - p + j]).collect();
        for r in 1..=p {
            let u = args[r - 1];
            for j in (r..=p).rev() {
                let k = i - p + j;
                let (a, b) = (self.knots[k], self.knots[k + p + 1 - r]);
                let alpha = if b > a { (u - a) / (b - a) } else { 0.0 };
                d[j] = d[j - 1].lerp(d[j], alpha);
            }
        }
        d[p]
    }

    fn at(&self, i: usize, u: f64) -> Point {
        self.blossom(i, &vec![u; self.p]).point()
    }
}

/// A clamped knot vector with uniform interior knots on [0, 1].
fn clamped_uniform(n: usize, p: usize) -> Vec<f64> {
    let inner = n - p;
    (0..n + p + 1)
        .map(|k| {
            if k <= p {
                0.0
            } else if k >= n {
                1.0
            } else {
                (k - p) as f64 / inner as f64
            }
        })
        .collect()
}

fn from_control(s: &SplineData, tol: f64) -> Vec<Point> {
    let (curve, rational) = Curve::new(s);
    if rational || curve.p > 3 {
        return adaptive(&curve, tol);
    }
    let p = curve.p;
    let mut path = BezPath::new();
    for (k, i) in curve.spans().enumerate() {
        let (a, b) = (curve.knots[i], curve.knots[i + 1]);
        // Bézier point j of the span: the blossom at (a × (p − j), b × j).
        let bez: Vec<Point> = (0..=p)
            .map(|j| {
                let args: Vec<f64> = (0..p).map(|m| if m < p - j { a } else { b }).collect();
                curve.blossom(i, &args).point()
            })
            .collect();
        if k == 0 {
            path.move_to(bez[0]);
        }
        match p {
            1 => path.line_to(bez[1]),
            2 => path.quad_to(bez[1], bez[2]),
            _ => path.curve_to(bez[1], bez[2], bez[3]),
        }
    }
    let mut pts = Vec::new();
    kurbo::flatten(&path, tol, |el| match el {
        kurbo::PathEl::MoveTo(q) | kurbo::PathEl::LineTo(q) => pts.push(q),
        _ => {}
    });
    pts.dedup();
    pts
}

/// The greatest distance from `q` to the segment `a`–`b`.
fn off_chord(q: Point, a: Point, b: Point) -> f64 {
    let ab = b - a;
    let len2 = ab.hypot2();
    let t = if len2 > 0.0 { ((q - a).dot(ab) / len2).clamp(0.0, 1.0) } else { 0.0 };
    (q - (a + ab * t)).hypot()
}

/// Subdivides each span until every piece's quarter points are within
/// `tol` of its chord (at least four pieces a span, at most 2²⁰).
fn adaptive(curve: &Curve, tol: f64) -> Vec<Point> {
    let mut out: Vec<Point> = Vec::new();
    for i in curve.spans() {
        let (a, b) = (curve.knots[i], curve.knots[i + 1]);
        if out.is_empty() {
            out.push(curve.at(i, a));
        }
        // Depth-first over (u0, p0, u1, p1, depth), left pieces first.
        let mut stack = vec![(a, curve.at(i, a), b, curve.at(i, b), 0u32)];
        while let Some((u0, p0, u1, p1, depth)) = stack.pop() {
            let du = u1 - u0;
            let q = [curve.at(i, u0 + 0.25 * du), curve.at(i, u0 + 0.5 * du), curve.at(i, u0 + 0.75 * du)];
            let err = q.iter().map(|&m| off_chord(m, p0, p1)).fold(0.0, f64::max);
            if (err <= tol && depth >= 2) || depth >= 20 {
                out.push(p1);
            } else {
                let um = u0 + 0.5 * du;
                stack.push((um, q[1], u1, p1, depth + 1));
                stack.push((u0, p0, um, q[1], depth + 1));
            }
        }
    }
    out.dedup();
    out
}

/// The C² cubic through the fit points, parametrised by chord length, as
/// Bézier segments flattened by kurbo.
fn through_fit_points(s: &SplineData, tol: f64) -> Vec<Point> {
    let mut pts = s.fit.clone();
    pts.dedup();
    if pts.len() < 3 {
        return pts;
    }
    let n = pts.len() - 1;
    let h: Vec<f64> = pts.windows(2).map(|w| (w[1] - w[0]).hypot()).collect();
    let unit = |t: Option<Vec2>| t.filter(|v| v.hypot() > 0.0 && v.is_finite()).map(|v| v.normalize());
    let (t0, t1) = (unit(s.start_tangent), unit(s.end_tangent));
    // Tangents D_k (derivatives by chord length) from the continuity of the
    // second derivative: a tridiagonal system (the first-derivative form
    // of cubic spline interpolation; from memory).
    let mut sub = vec![0.0; n + 1];
    let mut diag = vec![0.0; n + 1];
    let mut sup = vec![0.0; n + 1];
    let mut rhs = vec![Vec2::ZERO; n + 1];
    let chord = |k: usize| (pts[k + 1] - pts[k]) / h[k];
    match t0 {
        Some(t) => (diag[0], rhs[0]) = (1.0, t),
        None => (diag[0], sup[0], rhs[0]) = (2.0, 1.0, chord(0) * 3.0),
    }
    for k in 1..n {
        sub[k] = h[k];
        diag[k] = 2.0 * (h[k - 1] + h[k]);
        sup[k] = h[k - 1];
        rhs[k] = (chord(k - 1) * h[k] + chord(k) * h[k - 1]) * 3.0;
    }
    match t1 {
        Some(t) => (diag[n], rhs[n]) = (1.0, t),
        None => (sub[n], diag[n], rhs[n]) = (1.0, 2.0, chord(n - 1) * 3.0),
    }
    // Thomas algorithm (the system is diagonally dominant).
    for k in 1..=n {
        let m = sub[k] / diag[k - 1];
        diag[k] -= m * sup[k - 1];
        rhs[k] = rhs[k] - rhs[k - 1] * m;
    }
    let mut d = vec![Vec2::ZERO; n + 1];
    d[n] = rhs[n] / diag[n];
    for k in (0..n).rev() {
        d[k] = (rhs[k] - d[k + 1] * sup[k]) / diag[k];
    }
    let mut path = BezPath::new();
    path.move_to(pts[0]);
    for k in 0..n {
        path.curve_to(pts[k] + d[k] * (h[k] / 3.0), pts[k + 1] - d[k + 1] * (h[k] / 3.0), pts[k + 1]);
    }
    let mut out = Vec::new();
    kurbo::flatten(&path, tol, |el| match el {
        kurbo::PathEl::MoveTo(q) | kurbo::PathEl::LineTo(q) => out.push(q),
        _ => {}
    });
    out.dedup();
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    fn dist_to_polyline(q: Point, line: &[Point]) -> f64 {
        line.windows(2).map(|w| off_chord(q, w[0], w[1])).fold(f64::INFINITY, f64::min)
    }

    /// A clamped cubic that is the parabola y = 1 − x² on [−1, 1]: the
    /// quadratic Bézier (−1, 0), (0, 2), (1, 0) raised to degree 3
    /// (Bézier degree elevation, from memory) and split at u = ½ by knot
    /// insertion, worked by hand. Every point read must lie on the parabola.
    #[test]
    fn cubic_parabola_is_on_the_closed_form() {
        let s = SplineData {
            degree: 3,
            knots: vec![0.0, 0.0, 0.0, 0.0, 0.5, 1.0, 1.0, 1.0, 1.0],
            control: vec![
                Point::new(-1.0, 0.0),
                Point::new(-2.0 / 3.0, 2.0 / 3.0),
                Point::new(0.0, 4.0 / 3.0),
                Point::new(2.0 / 3.0, 2.0 / 3.0),
                Point::new(1.0, 0.0),
            ],
            ..Default::default()
        };
        let pts = flatten(&s, 1e-4);
        assert!(pts.len() > 10);
        assert_eq!(pts[0], Point::new(-1.0, 0.0));
        for p in &pts {
            assert!((p.y - (1.0 - p.x * p.x)).abs() < 1e-12, "{p:?}");
        }
        // The last point is the last control point (clamped end).
        let last = pts[pts.len() - 1];
        assert!((last - Point::new(1.0, 0.0)).hypot() < 1e-12, "{last:?}");
    }

    #[test]
    fn malformed_splines_do_not_panic() {
        let c = vec![Point::new(0.0, 0.0), Point::new(1.0, 1.0), Point::new(2.0, 0.0)];
        for degree in [-3, 0, 1, 2, 3, 9] {
            for knots in [vec![], vec![0.0; 6], vec![1.0, 0.0, 2.0], vec![f64::NAN; 6]] {
                for weights in [vec![], vec![1.0, 0.0, 1.0], vec![1.0, 2.0, 1.0]] {
                    let s = SplineData {
                        degree,
                        flags: 4,
                        knots: knots.clone(),
                        weights,
                        control: c.clone(),
                        ..Default::default()
                    };
                    let pts = flatten(&s, 1e-3);
                    assert!(pts.len() >= 2 && pts.iter().all(|p| p.x.is_finite() && p.y.is_finite()));
                }
            }
        }
        let fit = SplineData { fit: c.clone(), start_tangent: Some(Vec2::new(1.0, 1.0)), ..Default::default() };
        let pts = flatten(&fit, 1e-3);
        for q in &c {
            assert!(dist_to_polyline(*q, &pts) < 1e-12);
        }
        assert!(flatten(&SplineData::default(), 1e-3).is_empty());
    }
}
