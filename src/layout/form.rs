//! The form diagram's additions: profile, hangers or posts, force
//! annotations, Bow's notation letters and dimensions.
//!
//! Bow's notation (R. H. Bow, *Economics of Construction*, 1873, from
//! memory): the load lines divide the load side of the profile into spaces
//! A, B, … (A between the left support and the first load); the space between
//! the profile and the chord gets the next letter, and is the pole of the
//! force diagram. A segment is named by the two spaces it separates (AE),
//! as its ray is in the force diagram (ea).

use kurbo::{Line, Point, Vec2};

use super::dimension::linear;
use super::nice::{fmt_force, member_name, space_letter};
use super::shapes::{DimStyle, HAlign, Item, Role, Shape, Text, VAlign};
use crate::model::{Structure, Support};
use crate::solve::{Form, NodeKind, Solution};

fn item(role: Role, shape: Shape) -> Item {
    Item { role, shape, colour: None }
}

fn text(at: Point, height: f64, rotation: f64, content: String, h: HAlign, v: VAlign) -> Shape {
    Shape::Text(Text { at, height, rotation, content, h, v })
}

/// The profile's y at `x` (linear between nodes; ends held flat).
fn profile_y(nodes: &[Point], x: f64) -> f64 {
    for w in nodes.windows(2) {
        if x >= w[0].x && x <= w[1].x && w[1].x > w[0].x {
            return w[0].y + (w[1].y - w[0].y) * (x - w[0].x) / (w[1].x - w[0].x);
        }
    }
    nodes.first().map_or(0.0, |p| p.y)
}

/// Where the line through `p` along `dir` meets the deck nearest to `p`.
fn deck_hit(segments: &[Line], p: Point, dir: Vec2) -> Option<Point> {
    let mut best: Option<(f64, Point)> = None;
    for s in segments {
        let e = s.p1 - s.p0;
        let den = dir.cross(e);
        if den.abs() < 1e-300 {
            continue;
        }
        let w = s.p0 - p;
        let t = w.cross(e) / den;
        let u = w.cross(dir) / den;
        if (-1e-12..=1.0 + 1e-12).contains(&u) && best.is_none_or(|(bt, _)| t.abs() < bt.abs()) {
            best = Some((t, p + dir * t));
        }
    }
    best.map(|(_, q)| q)
}

pub(super) fn form_items(
    structure: &Structure,
    drawn: &Structure,
    s: &Solution,
    th: f64,
    dim: &DimStyle,
    self_weight: Option<f64>,
) -> Vec<Item> {
    let units = structure.units();
    let nodes = &s.nodes;
    let n = structure.loads().len();
    let pole_space = n + 1;
    // The load side: below a cable (loads hang from it), above an arch.
    let load_side = match s.form {
        Form::Cable => -1.0,
        Form::Arch => 1.0,
    };
    let mut items = vec![item(Role::Profile, Shape::Polyline { points: nodes.clone(), closed: false })];
    // Continuous loads (distributed, self-weight) put panel points between
    // the loads: no Bow letters or per-segment forces there.
    let continuous = s.node_kinds.iter().any(|k| matches!(k, NodeKind::Panel));
    let node_of = |k: usize| s.node_kinds.iter().position(|kind| *kind == NodeKind::Load(k)).map(|i| nodes[i]);

    // Hangers (cable) or posts (arch), along each load's line of action.
    if let Some(deck) = structure.deck() {
        for (k, load) in structure.loads().iter().enumerate() {
            let Some(node) = node_of(k) else { continue };
            let dir = load.force / load.force.hypot();
            if let Some(q) = deck_hit(&deck.segments, node, dir) {
                items.push(item(Role::Hangers, Shape::Line(Line::new(q, node))));
            }
        }
    }

    // Segment forces, on the pole side of each segment, along it; for
    // continuous loads the largest force, where it acts.
    let fh = 0.8 * th;
    if continuous {
        let at = s.peak.at;
        items.push(item(Role::Forces, Shape::Circle { center: at, radius: 0.3 * th }));
        let content = format!("largest force {}", fmt_force(s.peak.force, units.force));
        let side = if at.x <= (nodes[0].x + nodes[nodes.len() - 1].x) / 2.0 { HAlign::Left } else { HAlign::Right };
        let dx = if side == HAlign::Left { 0.6 * th } else { -0.6 * th };
        items.push(item(Role::Forces, text(at + Vec2::new(dx, -1.5 * fh), fh, 0.0, content, side, VAlign::Top)));
    }
    for (k, seg) in s.segments.iter().enumerate().filter(|_| !continuous) {
        let (a, b) = (nodes[k], nodes[k + 1]);
        let d = b - a;
        if d.hypot() == 0.0 {
            continue;
        }
        let mut angle = d.y.atan2(d.x).to_degrees();
        if angle > 90.0 {
            angle -= 180.0;
        } else if angle <= -90.0 {
            angle += 180.0;
        }
        let normal = Vec2::new(-d.y, d.x) / d.hypot();
        let normal = if normal.y * load_side > 0.0 { -normal } else { normal };
        let content = format!("{} {}", member_name(k, pole_space), fmt_force(seg.force, units.force));
        // Smaller text on short segments, so that neighbours do not run
        // into each other (a glyph is up to about 0.75 of the height wide
        // in common CAD fonts).
        let h = fh.min(0.9 * d.hypot() / (0.75 * content.chars().count() as f64)).max(0.4 * fh);
        let at = a.midpoint(b) + normal * (0.5 * th + h / 2.0);
        items.push(item(Role::Forces, text(at, h, angle, content, HAlign::Center, VAlign::Middle)));
    }

    // Reactions above each support, reading outward from the span (clear
    // of a tower's height dimension, which stands beside the axis below).
    for (side, r) in s.reactions.iter().enumerate() {
        let node = if side == 0 { nodes[0] } else { nodes[nodes.len() - 1] };
        let (dx, h) = if side == 0 { (-0.5 * th, HAlign::Right) } else { (0.5 * th, HAlign::Left) };
        let lines = [
            format!("R = {}", fmt_force(r.hypot(), units.force)),
            format!("H {}  V {}", fmt_force(r.x.abs(), units.force), fmt_force(r.y, units.force)),
        ];
        for (i, l) in lines.into_iter().enumerate() {
            let at = node + Vec2::new(dx, (2.0 - i as f64) * 1.5 * fh);
            items.push(item(Role::Forces, text(at, fh, 0.0, l, h, VAlign::Middle)));
        }
    }

    // Bow's letters: spaces between load lines on the load side, the pole
    // space between profile and chord.
    let lh = 1.2 * th;
    for k in (0..=n).filter(|_| !continuous) {
        let x = (nodes[k].x + nodes[k + 1].x) / 2.0;
        let at = Point::new(x, profile_y(nodes, x) + load_side * 2.5 * th);
        items.push(item(Role::Bow, text(at, lh, 0.0, space_letter(k), HAlign::Center, VAlign::Middle)));
    }
    // Beside the sag dimension (drawn to the right of sag.x), not on it.
    let pole_at = Point::new(s.sag.x - 1.5 * th, (s.sag.chord_y + s.sag.profile_y) / 2.0);
    if !continuous {
        items.push(item(Role::Bow, text(pole_at, lh, 0.0, space_letter(pole_space), HAlign::Center, VAlign::Middle)));
    }

    // Dimensions.
    let lowest = nodes
        .iter()
        .map(|p| p.y)
        .chain(structure.deck().into_iter().flat_map(|d| d.segments.iter().flat_map(|l| [l.p0.y, l.p1.y])))
        .chain([structure.left(), structure.right()].into_iter().filter_map(|s| match s {
            Support::Axis { foot, .. } => Some(*foot),
            Support::Point { .. } => None,
        }))
        .fold(f64::INFINITY, f64::min);
    let (first, last) = (nodes[0], nodes[nodes.len() - 1]);
    let span = linear(first, last, 0.0, Point::new(first.x, lowest - 4.0 * th), "span", dim);
    items.push(item(Role::Dimensions, Shape::Dimension(Box::new(span))));
    let word = match s.form {
        Form::Cable => "sag",
        Form::Arch => "rise",
    };
    // Vertical dimensions start at their upper point: a text too long for
    // the dimension goes above it, into the open sky of an elevation.
    let (top, bottom) = higher_first(Point::new(s.sag.x, s.sag.chord_y), Point::new(s.sag.x, s.sag.profile_y));
    let sag = linear(top, bottom, 90.0, Point::new(s.sag.x + 2.5 * th, 0.0), word, dim);
    items.push(item(Role::Dimensions, Shape::Dimension(Box::new(sag))));
    for t in &s.towers {
        let support = if t.side == 0 { structure.left() } else { structure.right() };
        if let Support::Axis { x, foot, .. } = support {
            let out = if t.side == 0 { -3.0 * th } else { 3.0 * th };
            let (top, bottom) = higher_first(Point::new(*x, *foot), t.at);
            let d = linear(top, bottom, 90.0, Point::new(x + out, 0.0), "tower", dim);
            items.push(item(Role::Dimensions, Shape::Dimension(Box::new(d))));
        }
    }
    // The loads as drawn (before they were carried to hangers).
    if !drawn.distributed().is_empty() || self_weight.is_some() {
        items.extend(super::loads::load_items(drawn, s, lowest - 9.0 * th, th, self_weight));
    }
    if let Some(c) = crate::solve::clearance(structure, s) {
        let (top, bottom) = higher_first(Point::new(c.x, c.deck_y), Point::new(c.x, c.profile_y));
        let d = linear(top, bottom, 90.0, Point::new(c.x - 2.5 * th, 0.0), "clearance", dim);
        items.push(item(Role::Dimensions, Shape::Dimension(Box::new(d))));
    }
    items
}

/// The two points, the higher first.
fn higher_first(a: Point, b: Point) -> (Point, Point) {
    if a.y >= b.y { (a, b) } else { (b, a) }
}
