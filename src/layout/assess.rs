//! What an arch assessment draws: the voussoir joints, each thrust line on
//! its own layer with its hinges, the thinner arch of the least thickness,
//! the force polygon of the voussoir loads with one pole per thrust line,
//! and the notes.

use kurbo::{Line, Point, Rect, Vec2};

use super::nice::{fmt_force, fmt_length, round_down, round_up};
use super::shapes::{Additions, DimStyle, HAlign, Item, Role, Shape, Text, VAlign};
use super::{LayoutOptions, Placement, text_height_for};
use crate::arch::{Face, Joint, Ring, ThrustLine};
use crate::units::Units;

/// Most rays drawn from one pole.
const MAX_RAYS: usize = 40;

/// The caution every assessment carries: the hypotheses and who decides.
pub const ASSESS_CAUTION: &str = "Limit analysis assumes masonry with no tensile strength, unlimited compressive \
     strength and no sliding. Assessment aid only: results must be checked by a qualified engineer under the local codes.";

/// Which thrust line a [`Shown`] line is; it sets the layer and the hinge
/// labels' prefix.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum LineKind {
    /// Least horizontal thrust.
    Min,
    /// Greatest horizontal thrust.
    Max,
    /// The thrust the user gave.
    Trial,
    /// At the least thickness.
    Limit,
    /// At collapse under the factored live load.
    Collapse,
}

impl LineKind {
    /// The layer role of this kind of line.
    #[must_use]
    pub fn role(self) -> Role {
        match self {
            LineKind::Min => Role::ThrustMin,
            LineKind::Max => Role::ThrustMax,
            LineKind::Trial => Role::ThrustTrial,
            LineKind::Limit => Role::ThrustLimit,
            LineKind::Collapse => Role::ThrustCollapse,
        }
    }

    /// The prefix of its hinge labels (`m1`, `M1`, …) and its pole's name.
    #[must_use]
    pub fn prefix(self) -> &'static str {
        match self {
            LineKind::Min => "m",
            LineKind::Max => "M",
            LineKind::Trial => "t",
            LineKind::Limit => "g",
            LineKind::Collapse => "c",
        }
    }

    /// In words, for labels.
    #[must_use]
    pub fn words(self) -> &'static str {
        match self {
            LineKind::Min => "least thrust",
            LineKind::Max => "greatest thrust",
            LineKind::Trial => "given thrust",
            LineKind::Limit => "least thickness",
            LineKind::Collapse => "collapse",
        }
    }
}

/// One thrust line to draw.
#[derive(Clone, Copy, Debug)]
pub struct Shown<'a> {
    /// What it is.
    pub kind: LineKind,
    /// The line.
    pub line: &'a ThrustLine,
    /// The joints it was found in, when they are not the ring's (the
    /// thinner arch of the least thickness): its faces are drawn too.
    pub joints: Option<&'a [Joint]>,
    /// Loads on top of the ring's (the factored live load at collapse),
    /// as (block, force): they lengthen the load line for this pole.
    pub extra: Option<(usize, Vec2)>,
}

/// Everything an assessment draws, as plain data.
#[derive(Clone, Debug)]
pub struct AssessView<'a> {
    /// The drawing's units.
    pub units: Units,
    /// The arch cut into voussoirs, with the dead loads.
    pub ring: &'a Ring,
    /// The thrust lines.
    pub lines: Vec<Shown<'a>>,
    /// Lines of notes under the force polygon (results in words).
    pub notes: Vec<String>,
}

fn item(role: Role, shape: Shape) -> Item {
    Item { role, shape, colour: None }
}

fn text(at: Point, height: f64, content: String, h: HAlign, v: VAlign) -> Shape {
    Shape::Text(Text { at, height, rotation: 0.0, content, h, v })
}

fn pole_label_text(kind: LineKind, horizontal: f64, units: Units) -> String {
    format!("pole {} ({}, H = {})", kind.prefix(), kind.words(), fmt_force(horizontal, units.force))
}

fn pole_label(s: &Shown<'_>, units: Units) -> String {
    pole_label_text(s.kind, s.line.horizontal, units)
}

/// The total of each block's loads.
fn block_totals(ring: &Ring) -> Vec<Vec2> {
    ring.blocks.iter().map(|b| b.iter().fold(Vec2::ZERO, |s, l| s + l.force)).collect()
}

/// Lays out an assessment beside `extents` (the user's drawing, if known).
#[must_use]
pub fn assess_layout(view: &AssessView<'_>, extents: Option<Rect>, options: &LayoutOptions) -> (Additions, Placement) {
    let joints = &view.ring.joints;
    let (left, right) = (joints[0], joints[joints.len() - 1]);
    let span = (right.intrados.midpoint(right.extrados) - left.intrados.midpoint(left.extrados)).hypot().max(1e-9);
    let th = options.text_height.unwrap_or_else(|| text_height_for(span));
    let units = view.units;
    let decimals = super::nice::length_decimals(units.length) as i64;
    let dim_style = DimStyle::for_text_height(th, decimals, options.literal_dimension_text);
    let mut items = Vec::new();

    // Joints.
    for j in joints {
        items.push(item(Role::Voussoirs, Shape::Line(Line::new(j.intrados, j.extrados))));
    }

    // Thrust lines, the thinner arch's faces, hinges.
    let r = 0.3 * th;
    for shown in &view.lines {
        let role = shown.kind.role();
        // The line of thrust as engineers draw it: through the centre of
        // pressure on every joint (the funicular polygon's corners, on the
        // voussoirs' load lines, can lie outside the arch near a springing).
        let points: Vec<Point> = shown.line.crossings.iter().flatten().map(|c| c.at).collect();
        items.push(item(role, Shape::Polyline { points, closed: false }));
        if let Some(js) = shown.joints {
            for face in [Face::Intrados, Face::Extrados] {
                let points = js
                    .iter()
                    .map(|j| match face {
                        Face::Intrados => j.intrados,
                        Face::Extrados => j.extrados,
                    })
                    .collect();
                items.push(item(role, Shape::Polyline { points, closed: false }));
            }
        }
        for (i, h) in shown.line.hinges.iter().enumerate() {
            let colour = Some(shown.kind.role().colour());
            items.push(Item { role: Role::Hinges, shape: Shape::Circle { center: h.at, radius: r }, colour });
            // The label outside the arch: above an extrados hinge, below an intrados one.
            let j =
                joints.get(h.joint).copied().unwrap_or(Joint { intrados: h.at, extrados: h.at + Vec2::new(0.0, 1.0) });
            let out = j.extrados - j.intrados;
            let out = if out.hypot() > 0.0 { out / out.hypot() } else { Vec2::new(0.0, 1.0) };
            let out = match h.face {
                Face::Extrados => out,
                Face::Intrados => -out,
            };
            let label = format!("{}{}", shown.kind.prefix(), i + 1);
            let at = h.at + out * (r + 0.9 * th);
            items.push(Item {
                role: Role::Hinges,
                shape: text(at, 0.8 * th, label, HAlign::Center, VAlign::Middle),
                colour,
            });
        }
    }

    // The force polygon: the load line of the voussoir loads, downward from
    // a0, and each thrust line's pole at a0 minus its left reaction, so the
    // ray to the k-th point of the load line is the force across joint k.
    let totals = block_totals(view.ring);
    let mut load_line = vec![Point::ZERO];
    for w in &totals {
        let last = load_line[load_line.len() - 1];
        load_line.push(last + *w);
    }
    let poles: Vec<(LineKind, Point, Vec<Point>)> = view
        .lines
        .iter()
        .map(|s| {
            let mut pts = load_line.clone();
            if let Some((block, w)) = s.extra {
                for p in pts.iter_mut().skip(block + 1) {
                    *p += w;
                }
            }
            (s.kind, Point::ZERO - s.line.left, pts)
        })
        .collect();
    let mut fbox = Rect::from_points(Point::ZERO, Point::ZERO);
    for p in &load_line {
        fbox = fbox.union_pt(*p);
    }
    for (_, pole, pts) in &poles {
        fbox = fbox.union_pt(*pole);
        for p in pts {
            fbox = fbox.union_pt(*p);
        }
    }
    let force_size = fbox.width().max(fbox.height()).max(1e-12);
    let scale = options.force_scale.unwrap_or_else(|| round_up(force_size / (0.45 * span)));
    let top = joints.iter().map(|j| j.extrados.y.max(j.intrados.y)).fold(f64::NEG_INFINITY, f64::max);
    let drawing_right = joints.iter().map(|j| j.extrados.x.max(j.intrados.x)).fold(f64::NEG_INFINITY, f64::max);
    let mut taken = extents;
    for it in &items {
        if let Some(b) = it.shape.bounds() {
            taken = Some(taken.map_or(b, |t| t.union(b)));
        }
    }
    let at = options.diagram_at.unwrap_or_else(|| {
        let gap = (0.1 * span).max(6.0 * th);
        let right = taken.map_or(drawing_right, |t| t.x1);
        // Room for the pole labels, left of the poles (glyphs about 0.6 of
        // the text height wide: common practice, no source).
        let label = view.lines.iter().map(|s| pole_label(s, units).chars().count()).max().unwrap_or(0) as f64;
        let left_edge = right + gap + 3.0 * th + label * 0.6 * 0.8 * th;
        Point::new(left_edge + (0.0 - fbox.x0) / scale, top - (fbox.y1 - 0.0) / scale)
    });
    let map = |f: Point| at + (f - Point::ZERO) / scale;
    for w in load_line.windows(2) {
        items.push(item(Role::Diagram, Shape::Line(Line::new(map(w[0]), map(w[1])))));
    }
    for p in &load_line {
        let q = map(*p);
        items.push(item(
            Role::Diagram,
            Shape::Line(Line::new(q - Vec2::new(0.25 * th, 0.0), q + Vec2::new(0.25 * th, 0.0))),
        ));
    }
    for (kind, pole, pts) in &poles {
        let colour = Some(kind.role().colour());
        let pole = map(*pole);
        if let Some((block, _)) = view.lines.iter().find(|s| s.kind == *kind).and_then(|s| s.extra) {
            // The factored live load, drawn beside the dead load line.
            let (a, b) = (map(pts[block]), map(pts[block + 1]));
            items.push(Item { role: Role::Diagram, shape: Shape::Line(Line::new(a, b)), colour });
        }
        let step = pts.len().div_ceil(MAX_RAYS).max(1);
        for (k, p) in pts.iter().enumerate() {
            if k % step == 0 || k + 1 == pts.len() {
                items.push(Item { role: Role::Diagram, shape: Shape::Line(Line::new(pole, map(*p))), colour });
            }
        }
        items.push(Item { role: Role::Diagram, shape: Shape::Circle { center: pole, radius: 0.25 * th }, colour });
    }
    // Pole labels in a column left of the leftmost pole, each at its pole's
    // height unless that would overlap the one above; a leader joins them.
    let column = poles.iter().map(|(_, p, _)| map(*p).x).fold(f64::INFINITY, f64::min) - 2.0 * th;
    let mut order: Vec<(LineKind, Point)> = poles.iter().map(|(k, p, _)| (*k, map(*p))).collect();
    order.sort_by(|a, b| b.1.y.total_cmp(&a.1.y));
    let mut last_y = f64::INFINITY;
    for (kind, pole) in order {
        let colour = Some(kind.role().colour());
        let y = pole.y.min(last_y - 1.4 * th);
        last_y = y;
        let at = Point::new(column, y);
        items.push(Item { role: Role::Diagram, shape: Shape::Line(Line::new(at, pole)), colour });
        let h = view.lines.iter().find(|s| s.kind == kind).map_or(0.0, |s| s.line.horizontal);
        items.push(Item {
            role: Role::Diagram,
            shape: text(
                at - Vec2::new(0.4 * th, 0.0),
                0.8 * th,
                pole_label_text(kind, h, units),
                HAlign::Right,
                VAlign::Middle,
            ),
            colour,
        });
    }

    // Title, scale bar, notes.
    let dbox = Rect::from_points(map(Point::new(fbox.x0, fbox.y0)), map(Point::new(fbox.x1, fbox.y1)));
    let x0 = dbox.x0 - 12.0 * th;
    let title = format!("FORCE POLYGON OF THE VOUSSOIR LOADS   {}", super::diagram::scale_words(scale, units));
    items.push(item(
        Role::Diagram,
        text(Point::new(x0, dbox.y1 + 2.5 * th), 1.2 * th, title, HAlign::Left, VAlign::Bottom),
    ));
    let bar_force = round_down(force_size / 2.0);
    let bar = bar_force / scale;
    let yb = dbox.y0 - 3.0 * th;
    items.push(item(Role::Diagram, Shape::Line(Line::new(Point::new(x0, yb), Point::new(x0 + bar, yb)))));
    for f in [0.0, 1.0] {
        let x = x0 + f * bar;
        items.push(item(
            Role::Diagram,
            Shape::Line(Line::new(Point::new(x, yb - 0.5 * th), Point::new(x, yb + 0.5 * th))),
        ));
    }
    items.push(item(Role::Diagram, text(Point::new(x0, yb - th), 0.8 * th, "0".into(), HAlign::Center, VAlign::Top)));
    items.push(item(
        Role::Diagram,
        text(Point::new(x0 + bar, yb - th), 0.8 * th, fmt_force(bar_force, units.force), HAlign::Center, VAlign::Top),
    ));
    let clear = (right.intrados - left.intrados).hypot();
    let mut notes = vec![format!(
        "hangline: arch assessment by thrust lines, {} voussoirs, span {} {} between the springings of the intrados",
        view.ring.blocks.len(),
        fmt_length(clear, units.length),
        units.length
    )];
    notes.extend(view.notes.iter().cloned());
    // The caution in sentences, one a line, so that it stays beside the polygon.
    notes.extend(ASSESS_CAUTION.split_inclusive(". ").map(|s| s.trim().to_string()));
    for (i, line) in notes.into_iter().enumerate() {
        let y = yb - 3.5 * th - i as f64 * 1.6 * th;
        items.push(item(Role::Notes, text(Point::new(x0, y), 0.8 * th, line, HAlign::Left, VAlign::Top)));
    }
    (
        Additions { items, dim_style, variants: Vec::new() },
        Placement { force_scale: scale, diagram_at: at, text_height: th },
    )
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::{BlockLoad, Crossing, Hinge, LoadKind};
    use crate::units::{ForceUnit, LengthUnit};

    /// A flat two-block ring with a line whose left reaction is (10, 5).
    fn sample() -> (Ring, ThrustLine) {
        let joints: Vec<Joint> = (0..3)
            .map(|i| Joint { intrados: Point::new(i as f64 * 5.0, 0.0), extrados: Point::new(i as f64 * 5.0, 1.0) })
            .collect();
        let load =
            |x: f64| BlockLoad { at: Point::new(x, 0.5), force: Vec2::new(0.0, -5.0), kind: LoadKind::OwnWeight };
        let ring = Ring { joints: joints.clone(), blocks: vec![vec![load(2.5)], vec![load(7.5)]] };
        let line = ThrustLine {
            horizontal: 10.0,
            left: Vec2::new(10.0, 5.0),
            right: Vec2::new(-10.0, 5.0),
            forces: vec![Vec2::new(10.0, 5.0), Vec2::new(10.0, 0.0), Vec2::new(10.0, -5.0)],
            crossings: joints.iter().map(|j| Some(Crossing { at: j.at(0.5), position: 0.5 })).collect(),
            polygon: vec![Point::new(0.0, 0.5), Point::new(5.0, 0.5), Point::new(10.0, 0.5)],
            hinges: vec![Hinge { joint: 1, face: Face::Extrados, at: Point::new(5.0, 1.0) }],
        };
        (ring, line)
    }

    #[test]
    fn each_line_on_its_layer_with_its_pole() {
        let (ring, line) = sample();
        let units = Units { length: LengthUnit::Metre, force: ForceUnit::Kilonewton };
        let view = AssessView {
            units,
            ring: &ring,
            lines: vec![Shown { kind: LineKind::Min, line: &line, joints: None, extra: None }],
            notes: vec!["H min = 10 kN".into()],
        };
        let (adds, placement) = assess_layout(&view, None, &LayoutOptions::default());
        let on = |role: Role| adds.items.iter().filter(|i| i.role == role).count();
        assert_eq!(on(Role::Voussoirs), 3);
        assert_eq!(on(Role::ThrustMin), 1);
        assert_eq!(on(Role::Hinges), 2, "a marker and a label");
        // The pole sits at a0 − R, i.e. 10 force units left and 5 below a0.
        let pole = adds
            .items
            .iter()
            .find_map(|i| match (&i.role, &i.shape) {
                (Role::Diagram, Shape::Circle { center, .. }) => Some(*center),
                _ => None,
            })
            .expect("a pole");
        let expect = placement.diagram_at + Vec2::new(-10.0, -5.0) / placement.force_scale;
        assert!((pole - expect).hypot() < 1e-9, "{pole:?} vs {expect:?}");
        // The ray to the middle load-line point is the force across joint 1, horizontal.
        let mid = placement.diagram_at + Vec2::new(0.0, -5.0) / placement.force_scale;
        assert!((mid - pole).y.abs() < 1e-9);
        let texts: Vec<&str> = adds
            .items
            .iter()
            .filter_map(|i| match &i.shape {
                Shape::Text(t) if i.role == Role::Notes => Some(t.content.as_str()),
                _ => None,
            })
            .collect();
        assert!(texts.join(" ").contains(ASSESS_CAUTION), "{texts:?}");
        assert!(adds.items.iter().any(|i| matches!(&i.shape, Shape::Text(t) if t.content.contains("H = 10"))));
    }
}
