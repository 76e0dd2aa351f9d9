//! From the solved parameters to the reported [`Solution`]: the polygon is
//! constructed once more, checked for shape, measured, and self-checked.

use kurbo::{Point, Vec2};

use super::ask::{Cond, Namer};
use super::closed_form;
use super::construction::{Misshapen, Polygon, check_shape, construct};
use super::frame::{Frame, Params};
use super::inclined::broken;
use super::residual::{max_ray, relative, sag};
use super::types::{Checks, Form, NodeKind, Peak, Sag, Segment, Solution, SolveError, TowerFound};
use crate::model::{Structure, Support, fmt_num};

/// Builds the solution for `params`, adding to `warnings`.
pub(crate) fn build(
    structure: &Structure,
    frame: &Frame,
    conds: &[Cond],
    namer: &Namer,
    params: Params,
    mut warnings: Vec<String>,
) -> Result<Solution, SolveError> {
    let s = namer.form.sign();
    let loads = structure.loads();
    let poly = construct(frame, params.ox, params.oy, params.y_left).map_err(|b| broken(b, loads, namer, conds))?;
    check_shape(&poly, frame.span, s).map_err(|m| misshapen(m, structure, frame, &poly, conds, namer))?;
    let n = frame.n();
    let nodes: Vec<Point> = poly
        .nodes
        .iter()
        .enumerate()
        .map(|(k, v)| {
            let mut p = frame.global(*v);
            // Exact coordinates where the drawing fixes them: support points
            // (both x and y: the construction lands on them only to
            // round-off), tower axes and vertical loads (x).
            if k == 0 {
                p = structure.left().fixed_point().unwrap_or(Point::new(structure.left().x(), p.y));
            } else if k == n + 1 {
                p = structure.right().fixed_point().unwrap_or(Point::new(structure.right().x(), p.y));
            } else if loads[k - 1].is_vertical() {
                p.x = loads[k - 1].anchor.x;
            }
            p
        })
        .collect();
    let rays: Vec<Vec2> = poly.rays.iter().map(|t| Vec2::new(t[0], t[1])).collect();
    let segments: Vec<Segment> = rays
        .iter()
        .zip(nodes.windows(2))
        .map(|(t, w)| Segment { force: s * t.hypot(), length: (w[1] - w[0]).hypot(), vector: *t })
        .collect();
    let thrust = rays[0].x.abs();
    let (k_sag, sag_value) = sag(&poly, s);
    let (first, last) = (nodes[0], nodes[n + 1]);
    let at = nodes[k_sag];
    let chord_y = first.y + (last.y - first.y) * (at.x - first.x) / (last.x - first.x);
    let towers = towers(structure, first, last, namer, &mut warnings);
    let checks = Checks {
        equilibrium: equilibrium(&poly, frame, s),
        closed_form: frame.vertical.then(|| closed_form::check(loads, &nodes, thrust, s)),
        conditions: conds.iter().map(|c| relative(c, frame, &poly, s)).fold(0.0, f64::max),
    };
    warnings.extend(checks.warning());
    let load_line: Vec<Point> = frame.load_line.iter().map(|a| a.to_point()).collect();
    let pole = Point::new(params.ox, params.oy);
    let node_kinds: Vec<NodeKind> =
        (0..n + 2).map(|k| if k == 0 || k == n + 1 { NodeKind::Support } else { NodeKind::Load(k - 1) }).collect();
    let profile_length = segments.iter().map(|g| g.length).sum();
    let max_segment = max_ray(&poly);
    // Under point loads the largest force is in a segment; name its end
    // nearer the larger reaction.
    let peak = {
        let (a, b) = (nodes[max_segment], nodes[max_segment + 1]);
        let at = if rays[0].hypot() >= rays[n].hypot() { a } else { b };
        Peak { force: segments[max_segment].force.abs(), at }
    };
    Ok(Solution {
        form: namer.form,
        closing_point: closing_point(pole, load_line[0], load_line[n], last - first),
        load_line,
        pole,
        nodes,
        segments,
        reactions: [-rays[0], rays[n]],
        thrust,
        sag: Sag { value: sag_value, x: at.x, chord_y, profile_y: at.y },
        max_segment,
        towers,
        conditions: conds.iter().map(|c| c.used(namer.form)).collect(),
        node_kinds,
        profile_length,
        unstressed_length: None,
        iterations: 0,
        peak,
        at_supports: [0.0, 0.0],
        checks,
        warnings,
        sketch: None,
    })
}

/// Where the line through the pole parallel to the chord meets the line a₀aₙ.
pub(crate) fn closing_point(pole: Point, a0: Point, an: Point, chord: Vec2) -> Option<Point> {
    let line = an - a0;
    let den = chord.cross(line);
    if den.is_nan() || den.abs() <= 1e-14 * chord.hypot() * line.hypot() {
        return None;
    }
    // pole + α·chord = a0 + β·line  ⇒  β = (pole − a0) × chord / (line × chord).
    let beta = (pole - a0).cross(chord) / line.cross(chord);
    Some(a0 + beta * line)
}

/// Largest node imbalance over Σ|P|, with each segment's force taken along
/// the drawn segment (magnitude |tₖ|), so the check covers the drawing and
/// not only the load line.
fn equilibrium(poly: &Polygon<f64>, frame: &Frame, s: f64) -> f64 {
    // Below this a segment has no drawn direction: two loads whose lines of
    // action meet the polygon at one point give nodes apart by round-off.
    let shortest = 1e-9 * frame.span;
    let force = |k: usize| {
        let (a, b) = (poly.nodes[k], poly.nodes[k + 1]);
        let d = Vec2::new(b[0] - a[0], b[1] - a[1]);
        let t = Vec2::new(poly.rays[k][0], poly.rays[k][1]);
        // A (next to) zero-length segment: fall back on the ray.
        if d.hypot() > shortest { s * t.hypot() * d / d.hypot() } else { t }
    };
    (0..frame.n()).map(|k| (force(k + 1) - force(k) + frame.forces[k]).hypot() / frame.force_scale).fold(0.0, f64::max)
}

/// The heights found on tower axes, with warnings when off the drawn tower.
pub(crate) fn towers(
    structure: &Structure,
    first: Point,
    last: Point,
    namer: &Namer,
    warnings: &mut Vec<String>,
) -> Vec<TowerFound> {
    let mut out = Vec::new();
    for (side, support, at) in [(0, structure.left(), first), (1, structure.right(), last)] {
        if let Support::Axis { foot, top, .. } = *support {
            let name = if side == 0 { "left" } else { "right" };
            let above_top = at.y - top;
            if above_top > 0.0 {
                warnings.push(format!(
                    "the profile meets the {name} tower axis at y = {}, {} above its drawn top: raise the tower or change a condition",
                    fmt_num(at.y),
                    namer.length(above_top)
                ));
            } else if at.y < foot {
                warnings.push(format!(
                    "the profile meets the {name} tower axis at y = {}, {} below its foot: change a condition",
                    fmt_num(at.y),
                    namer.length(foot - at.y)
                ));
            }
            out.push(TowerFound { side, at, height: at.y - foot, above_top });
        }
    }
    out
}

/// Explains a polygon of the wrong shape.
fn misshapen(
    m: Misshapen,
    structure: &Structure,
    frame: &Frame,
    poly: &Polygon<f64>,
    conds: &[Cond],
    namer: &Namer,
) -> SolveError {
    let x = |k: usize| fmt_num(poly.nodes[k][0] + frame.x0);
    let loads = structure.loads();
    let reason = match m {
        Misshapen::WrongWay(k) => {
            let (would, larger) = if namer.form == Form::Cable {
                ("push instead of pull", "a larger --thrust or a smaller --sag")
            } else {
                ("pull instead of push", "a larger --thrust or a smaller --rise")
            };
            format!(
                "the segment from x = {} to x = {} would {would}: the horizontal components of the loads left of it add up to {}, more than the thrust of {}; give a larger thrust ({larger}) or draw the loads nearer vertical",
                x(k),
                x(k + 1),
                namer.force(frame.load_line[k].x.abs()),
                namer.force(poly.rays[0][0].abs())
            )
        }
        Misshapen::Outside(k) => format!(
            "the line of action of the load of {} meets the profile at x = {}, outside the span from x = {} to x = {}; move that load or change a condition",
            loads[k - 1].origin,
            x(k),
            fmt_num(structure.left().x()),
            fmt_num(structure.right().x())
        ),
        Misshapen::OutOfOrder(k) => format!(
            "the lines of action of the loads of {} and {} meet the profile out of order (at x = {}, then x = {}); move one of them or draw them nearer vertical",
            loads[k - 1].origin,
            loads[k].origin,
            x(k),
            x(k + 1)
        ),
    };
    SolveError::NoSolution { form: namer.form, list: namer.list(conds), reason }
}
