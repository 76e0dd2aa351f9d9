//! The reciprocal force diagram, to scale, beside the drawing.
//!
//! Load line a, b, c, …; the pole (lettered as the space between profile and
//! chord); a ray from the pole to each point of the load line, parallel to
//! its segment of the profile; the closing line from the pole parallel to
//! the chord; a scale bar; a title, a summary and the caution.

use kurbo::{Line, Point, Rect, Vec2};

use super::nice::{fmt_force, fmt_length, round_down, round_up, space_letter};
use super::shapes::{HAlign, Item, Role, Shape, Text, VAlign};
use super::{LayoutOptions, Placement};
use crate::model::Structure;
use crate::solve::{Form, Solution};

/// Most rays drawn in the force diagram.
const MAX_RAYS: usize = 40;
/// Most load-line points lettered one by one.
const MAX_LETTERED: usize = 28;

/// The caution every output carries.
pub const CAUTION: &str =
    "Preliminary design aid only: results must be checked by a qualified engineer under the local codes.";

fn item(role: Role, shape: Shape) -> Item {
    Item { role, shape, colour: None }
}

fn text(at: Point, height: f64, content: String, h: HAlign, v: VAlign) -> Shape {
    Shape::Text(Text { at, height, rotation: 0.0, content, h, v })
}

/// Length, sag-to-span ratio, unstressed length and iterations.
fn extra_line(structure: &Structure, s: &Solution) -> String {
    let u = structure.units();
    let ratio = if s.sag.value > 0.0 { format!("1/{:.1}", structure.span() / s.sag.value) } else { "0".into() };
    let word = match s.form {
        Form::Cable => "sag",
        Form::Arch => "rise",
    };
    let mut line = format!("{word}/span {ratio}   profile length {} {}", fmt_length(s.length(), u.length), u.length);
    if let Some(s0) = s.unstressed_length {
        line.push_str(&format!("   unstressed length {} {}", fmt_length(s0, u.length), u.length));
    }
    if s.iterations > 0 {
        line.push_str(&format!("   self-weight found in {} iterations", s.iterations));
    }
    line
}

/// The sketch's deviation from the profile, when a sketch was followed.
fn sketch_line(structure: &Structure, s: &Solution) -> Option<String> {
    let f = s.sketch.as_ref()?;
    let u = structure.units().length;
    let what = if f.fitted { "Nearest funicular to the sketch" } else { "Sketch against the profile" };
    Some(format!(
        "{what}: rms {} {u}, largest {} {u} at x = {}",
        fmt_length(f.rms, u),
        fmt_length(f.max, u),
        fmt_length(f.at.x, u)
    ))
}

/// The scale in words, with a round drawing length that stands for at
/// least one force unit: "1 m = 20 kN", "100 mm = 5 kN".
#[must_use]
pub fn scale_words(scale: f64, units: crate::units::Units) -> String {
    let mut length = 1.0;
    while length * scale < 1.0 && length < 1e9 {
        length *= 10.0;
    }
    let force = length * scale;
    let force = if force.fract() == 0.0 { format!("{force:.0}") } else { format!("{}", (force * 1e6).round() / 1e6) };
    format!("{length:.0} {} = {force} {}", units.length, units.force)
}

pub(super) fn diagram_items(
    structure: &Structure,
    s: &Solution,
    taken: Option<Rect>,
    top: f64,
    th: f64,
    options: &LayoutOptions,
    annotations: &super::Annotations<'_>,
) -> (Vec<Item>, Placement) {
    let extra = annotations.notes;
    let units = structure.units();
    let n = structure.loads().len();
    let pole_space = n + 1;

    // Force space box.
    let mut fbox = Rect::from_points(s.pole, s.pole);
    for p in &s.load_line {
        fbox = fbox.union_pt(*p);
    }
    let force_size = fbox.width().max(fbox.height());
    // Fit the diagram to about half the span, but keep the load line long
    // enough for its letters (1.6 text heights each).
    let lettered_points = s.load_line.len().min(MAX_LETTERED) as f64;
    let load_line_length = s.load_line.first().zip(s.load_line.last()).map_or(0.0, |(a, b)| (*b - *a).hypot());
    let fit = force_size / (0.45 * structure.span());
    let roomy = if lettered_points > 1.0 { load_line_length / (lettered_points * 1.6 * th) } else { fit };
    let scale = options.force_scale.unwrap_or_else(|| {
        let fitted = round_up(fit);
        if fitted > roomy { round_down(roomy).max(round_up(fit / 4.0)) } else { fitted }
    });
    let a0 = s.load_line[0];
    // Drawing position of a0.
    let at = options.diagram_at.unwrap_or_else(|| {
        let gap = (0.1 * structure.span()).max(6.0 * th);
        let right = taken.map_or(s.nodes[s.nodes.len() - 1].x, |r| r.x1);
        // Left edge of the diagram (including its letters) a gap past the drawing.
        let left_edge = right + gap + 2.0 * th;
        let top_edge = if top.is_finite() { top } else { 0.0 };
        Point::new(left_edge + (a0.x - fbox.x0) / scale, top_edge - (fbox.y1 - a0.y) / scale)
    });
    let map = |f: Point| at + (f - a0) / scale;
    let mut items = Vec::new();

    // Load line, with a tick at each point.
    for w in s.load_line.windows(2) {
        items.push(item(Role::Diagram, Shape::Line(Line::new(map(w[0]), map(w[1])))));
    }
    let pole = map(s.pole);
    let lh = 1.0 * th;
    // With many loads (a continuous load in panels) every ray would blacken
    // the fan: draw at most about forty, always the first and the last, and
    // letter only the ends.
    let count = s.load_line.len();
    let step = count.div_ceil(MAX_RAYS).max(1);
    // Panel loads of a continuous load have no letters of their own.
    let continuous = s.node_kinds.iter().any(|k| matches!(k, crate::solve::NodeKind::Panel));
    let lettered = count <= MAX_LETTERED && !continuous;
    for (k, f) in s.load_line.iter().enumerate() {
        let p = map(*f);
        if k % step == 0 || k + 1 == count {
            items.push(item(Role::Diagram, Shape::Line(Line::new(p, pole))));
        }
        if lettered || (!continuous && (k == 0 || k + 1 == count)) {
            // Letters outward along the ray, away from the pole.
            let away = p - pole;
            let away = if away.hypot() > 0.0 { away / away.hypot() } else { Vec2::new(-1.0, 0.0) };
            let letter = space_letter(k).to_lowercase();
            items.push(item(Role::Bow, text(p + away * (1.2 * th), lh, letter, HAlign::Center, VAlign::Middle)));
        }
    }
    items.push(item(Role::Diagram, Shape::Circle { center: pole, radius: 0.25 * th }));
    let out = pole - map(a0.midpoint(*s.load_line.last().unwrap_or(&a0)));
    let out = if out.hypot() > 0.0 { out / out.hypot() } else { Vec2::new(1.0, 0.0) };
    let pole_label = match (continuous, annotations.pole) {
        (true, None) => "pole".to_string(),
        (true, Some(words)) => format!("pole ({words})"),
        (false, words) => format!("{} ({})", space_letter(pole_space).to_lowercase(), words.unwrap_or("pole")),
    };
    let align = if out.x >= 0.0 { HAlign::Left } else { HAlign::Right };
    items.push(item(Role::Bow, text(pole + out * (1.0 * th), lh, pole_label, align, VAlign::Middle)));
    if let Some(c) = s.closing_point {
        items.push(Item { role: Role::Diagram, shape: Shape::Line(Line::new(pole, map(c))), colour: Some(1) });
    }

    // Title above, scale bar and notes below.
    let diagram_box = Rect::from_points(map(Point::new(fbox.x0, fbox.y0)), map(Point::new(fbox.x1, fbox.y1)));
    let x0 = diagram_box.x0;
    let th_title = 1.2 * th;
    let scale_text = format!("FORCE DIAGRAM   {}", scale_words(scale, units));
    items.push(item(
        Role::Diagram,
        text(Point::new(x0, diagram_box.y1 + 2.5 * th), th_title, scale_text, HAlign::Left, VAlign::Bottom),
    ));
    let bar_force = round_down(force_size / 2.0);
    let bar = bar_force / scale;
    let yb = diagram_box.y0 - 3.0 * th;
    items.push(item(Role::Diagram, Shape::Line(Line::new(Point::new(x0, yb), Point::new(x0 + bar, yb)))));
    for (i, f) in [0.0, 0.5, 1.0].into_iter().enumerate() {
        let x = x0 + f * bar;
        let tick = if i == 1 { 0.25 } else { 0.5 } * th;
        items.push(item(Role::Diagram, Shape::Line(Line::new(Point::new(x, yb - tick), Point::new(x, yb + tick)))));
    }
    items.push(item(Role::Diagram, text(Point::new(x0, yb - th), 0.8 * th, "0".into(), HAlign::Center, VAlign::Top)));
    items.push(item(
        Role::Diagram,
        text(Point::new(x0 + bar, yb - th), 0.8 * th, fmt_force(bar_force, units.force), HAlign::Center, VAlign::Top),
    ));
    let form = match s.form {
        Form::Cable => "CABLE (pure tension)",
        Form::Arch => "ARCH (pure compression)",
    };
    let mut notes = vec![
        format!("hangline: funicular {form}, {} loads", n),
        super::result_line(structure, s),
        extra_line(structure, s),
    ];
    notes.extend(extra.iter().cloned());
    notes.extend(sketch_line(structure, s));
    notes.push(CAUTION.to_string());
    for (i, line) in notes.into_iter().enumerate() {
        let y = yb - 3.5 * th - i as f64 * 1.6 * th;
        items.push(item(Role::Notes, text(Point::new(x0, y), 0.8 * th, line, HAlign::Left, VAlign::Top)));
    }
    (items, Placement { force_scale: scale, diagram_at: at, text_height: th })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::{ForceUnit, LengthUnit, Units};

    #[test]
    fn scale_in_words() {
        let m = Units { length: LengthUnit::Metre, force: ForceUnit::Kilonewton };
        assert_eq!(scale_words(20.0, m), "1 m = 20 kN");
        let mm = Units { length: LengthUnit::Millimetre, force: ForceUnit::Kilonewton };
        assert_eq!(scale_words(0.05, mm), "100 mm = 5 kN");
        assert_eq!(scale_words(0.025, mm), "100 mm = 2.5 kN");
    }
}
