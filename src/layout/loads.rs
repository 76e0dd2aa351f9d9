//! The load diagram: the loads drawn along the span below the structure —
//! distributed loads and self-weight to scale (per horizontal length),
//! point loads as arrows with their values.

use kurbo::{Line, Point};

use super::nice::{fmt_force, round_up};
use super::shapes::{HAlign, Item, Role, Shape, Text, VAlign};
use crate::model::Structure;
use crate::solve::Solution;

fn item(shape: Shape) -> Item {
    Item { role: Role::LoadDiagram, shape, colour: None }
}

fn text(at: Point, height: f64, content: String, h: HAlign, v: VAlign) -> Shape {
    Shape::Text(Text { at, height, rotation: 0.0, content, h, v })
}

/// The load diagram with its baseline at `base` (y), `th` the text height;
/// `self_weight` per unit length of profile, when there is one.
pub(super) fn load_items(
    structure: &Structure,
    solution: &Solution,
    base: f64,
    th: f64,
    self_weight: Option<f64>,
) -> Vec<Item> {
    let units = structure.units();
    let per = format!("{}/{}", units.force, units.length);
    let (xl, xr) = (structure.left().x(), structure.right().x());
    let mut items = vec![item(Shape::Line(Line::new(Point::new(xl, base), Point::new(xr, base))))];

    // The intensity per horizontal length: the distributed loads, and the
    // self-weight (q·ds/dx on each segment of the profile) as one outline.
    let pieces: Vec<(f64, f64, f64, f64)> = structure.distributed().iter().map(|d| (d.x0, d.x1, d.w0, d.w1)).collect();
    let mut weight: Vec<(f64, f64)> = Vec::new();
    if let Some(q) = self_weight {
        for w in solution.nodes.windows(2) {
            let dx = w[1].x - w[0].x;
            if dx > 0.0 {
                weight.push(((w[0].x + w[1].x) / 2.0, q * (w[1] - w[0]).hypot() / dx));
            }
        }
    }
    let w_max = pieces.iter().map(|p| p.2.max(p.3)).chain(weight.iter().map(|w| w.1)).fold(0.0, f64::max);
    let height = 3.0 * th;
    if w_max > 0.0 {
        // A round intensity scale so that the largest stands `height` tall.
        let scale = round_up(w_max / height);
        let y = |w: f64| base + w / scale;
        for &(x0, x1, w0, w1) in &pieces {
            let outline =
                vec![Point::new(x0, base), Point::new(x0, y(w0)), Point::new(x1, y(w1)), Point::new(x1, base)];
            items.push(item(Shape::Polyline { points: outline, closed: false }));
        }
        if let (Some(first), Some(last)) = (weight.first(), weight.last()) {
            let mut outline = vec![Point::new(xl, base), Point::new(xl, y(first.1))];
            outline.extend(weight.iter().map(|&(x, w)| Point::new(x, y(w))));
            outline.extend([Point::new(xr, y(last.1)), Point::new(xr, base)]);
            items.push(Item {
                role: Role::LoadDiagram,
                shape: Shape::Polyline { points: outline, closed: false },
                colour: Some(8),
            });
        }
        for d in structure.distributed() {
            let value = if d.w0 == d.w1 {
                format!("{} {per}", trim(d.w0))
            } else {
                format!("{} to {} {per}", trim(d.w0), trim(d.w1))
            };
            let at = Point::new((d.x0 + d.x1) / 2.0, y(d.w0.max(d.w1)) + 0.5 * th);
            items.push(item(text(at, 0.8 * th, value, HAlign::Center, VAlign::Bottom)));
        }
        if let Some(q) = self_weight {
            let at = Point::new(xr, base - 0.6 * th);
            let content = format!("self-weight {} {per} of length", trim(q));
            items.push(item(text(at, 0.8 * th, content, HAlign::Right, VAlign::Top)));
        }
    }
    // Point loads: arrows down onto the baseline, not to scale.
    for l in structure.loads() {
        let x = l.anchor.x.clamp(xl, xr);
        let tip = Point::new(x, base);
        let dir = l.force / l.force.hypot();
        let tail = tip - dir * height;
        items.push(item(Shape::Line(Line::new(tail, tip))));
        let side = kurbo::Vec2::new(-dir.y, dir.x) * (0.15 * th);
        let back = tip - dir * (0.6 * th);
        items.push(item(Shape::Solid([tip, back + side, back - side])));
        items.push(item(text(
            tail - dir * (0.3 * th),
            0.8 * th,
            fmt_force(l.magnitude(), units.force),
            HAlign::Center,
            VAlign::Bottom,
        )));
    }
    let title = format!("LOADS ({}, {per})", units.force);
    items.push(item(text(Point::new(xl, base - 0.6 * th), 0.8 * th, title, HAlign::Left, VAlign::Top)));
    items
}

/// A number for a label: up to four significant decimals, no trailing zeros.
fn trim(v: f64) -> String {
    crate::model::fmt_num((v * 1e4).round() / 1e4)
}
