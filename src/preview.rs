//! A look without CAD: the drawing's relevant input layers and everything
//! the tool adds to it, as one SVG picture.
//!
//! Pure: shapes in, text out; no file system. Drawing coordinates have y up
//! and SVG's have y down, so every point is written as (x, −y): the numbers
//! in the picture are the drawing's own, y negated, and the `viewBox` frames
//! everything with a margin. Each output role is a group
//! `<g id="role-KEY" class="layer" data-layer="LAYER">`; the input layers
//! are groups `<g class="layer input" data-layer="LAYER">` inside
//! `<g id="input">`. Colours are the AutoCAD Colour Index numbers the
//! writer gives the layers, shown on a white background (index 7, white on
//! black in CAD, is black here).
//!
//! The document is built with the `svg` crate, which escapes `&`, `<` and
//! `>` in text and attribute values; the one character it leaves in an
//! attribute, `"`, cannot be in a DXF layer name and is replaced by `'`
//! all the same, and control characters are dropped from texts.

use kurbo::{Line, Point, Rect, Vec2};
use svg::Document;
use svg::Node;
use svg::node::element::{Circle, Element, Group, Line as SvgLine, Polygon, Polyline, Rectangle, Title};

use crate::layout::{Additions, HAlign, Role, Shape, Text, VAlign};
use crate::model::Support;
use crate::read::arch::ArchReading;
use crate::read::{LoadRead, Reading, StretchRead};
use crate::write::OutputLayers;

/// The picture's larger side in pixels (its `width` or `height`; the
/// `viewBox` keeps the drawing's proportions).
pub const PIXELS: f64 = 1600.0;

/// Font size per DXF text height: the height is the capital letters'
/// height, about 0.72 of the font size in common sans-serif fonts
/// (common practice, no source).
const FONT_PER_HEIGHT: f64 = 1.0 / 0.72;

/// Colour of the input layers (their own colours are not read).
const INPUT_COLOUR: &str = "#404040";

/// A shape of the user's drawing, on the layer it was read from.
#[derive(Clone, Debug, PartialEq)]
pub struct InputShape {
    /// The layer it came from.
    pub layer: String,
    /// What to draw.
    pub shape: Shape,
}

/// What the preview shows.
#[derive(Clone, Debug, PartialEq)]
pub struct PreviewInput<'a> {
    /// The picture's title (the input file, for instance).
    pub title: String,
    /// The user's relevant geometry: supports, loads with their labels,
    /// deck, or an arch's faces and fill.
    pub input: Vec<InputShape>,
    /// Everything the tool added to the drawing.
    pub additions: &'a Additions,
    /// The output layers' names.
    pub layers: &'a OutputLayers,
}

impl<'a> PreviewInput<'a> {
    /// The preview of a solved drawing: its supports (triangles, or a tower's
    /// axis), loads (arrows with their labels), distributed loads and deck.
    #[must_use]
    /// `deck_layer` names the layer the deck was read from.
    pub fn solved(
        title: &str,
        reading: &Reading,
        deck_layer: &str,
        additions: &'a Additions,
        layers: &'a OutputLayers,
    ) -> Self {
        let th = text_height(additions);
        let st = &reading.structure;
        let mut input = Vec::new();
        for s in [st.left(), st.right()] {
            let layer = s.origin().layer.clone();
            match s {
                Support::Point { at, .. } => input.push(InputShape { layer, shape: support_marker(*at, th) }),
                Support::Axis { x, foot, top, .. } => input.push(InputShape {
                    layer,
                    shape: Shape::Line(Line::new(Point::new(*x, *foot), Point::new(*x, *top))),
                }),
            }
        }
        if let Some(deck) = st.deck() {
            for seg in &deck.segments {
                input.push(InputShape { layer: deck_layer.to_string(), shape: Shape::Line(*seg) });
            }
        }
        for (x, origin) in &reading.hangers {
            let at = Point::new(*x, origin.at.y);
            input.push(InputShape {
                layer: origin.layer.clone(),
                shape: Shape::Circle { center: at, radius: 0.15 * th },
            });
        }
        push_loads(&mut input, &reading.loads, &reading.distributed, th);
        PreviewInput { title: title.to_string(), input, additions, layers }
    }

    /// The preview of an assessed arch: its intrados and extrados, fill
    /// regions and loads.
    #[must_use]
    pub fn assessed(title: &str, reading: &ArchReading, additions: &'a Additions, layers: &'a OutputLayers) -> Self {
        let th = text_height(additions);
        let mut input = Vec::new();
        for face in [&reading.intrados, &reading.extrados] {
            let layer = face.from.first().map_or_else(String::new, |o| o.layer.clone());
            input.push(InputShape { layer, shape: Shape::Polyline { points: face.points.clone(), closed: false } });
        }
        for (outline, origin) in &reading.fill {
            input.push(InputShape {
                layer: origin.layer.clone(),
                shape: Shape::Polyline { points: outline.clone(), closed: true },
            });
        }
        push_loads(&mut input, &reading.load_reads, &reading.stretches, th);
        PreviewInput { title: title.to_string(), input, additions, layers }
    }
}

/// The text height the layout used, from the dimension style it derived
/// from it.
fn text_height(additions: &Additions) -> f64 {
    let th = additions.dim_style.text_height / 0.8;
    if th.is_finite() && th > 0.0 { th } else { 1.0 }
}

/// A support: a triangle standing under the point, and the point.
fn support_marker(at: Point, th: f64) -> Shape {
    let h = 0.8 * th;
    Shape::Polyline {
        points: vec![at, Point::new(at.x - 0.6 * h, at.y - h), Point::new(at.x + 0.6 * h, at.y - h), at],
        closed: true,
    }
}

/// Point loads as arrows through their anchor along the force, two text
/// heights long, with their labels; distributed loads as a line over their
/// stretch with the label above it.
fn push_loads(input: &mut Vec<InputShape>, loads: &[LoadRead], stretches: &[StretchRead], th: f64) {
    for l in loads {
        let layer = l.origin.layer.clone();
        let len = l.force.hypot();
        let dir = if len > 0.0 && len.is_finite() { l.force / len } else { Vec2::new(0.0, -1.0) };
        let tip = l.anchor + dir * th;
        let tail = l.anchor - dir * th;
        input.push(InputShape { layer: layer.clone(), shape: Shape::Line(Line::new(tail, tip)) });
        let side = Vec2::new(-dir.y, dir.x) * (0.2 * th);
        let back = tip - dir * (0.5 * th);
        input.push(InputShape { layer: layer.clone(), shape: Shape::Solid([tip, back + side, back - side]) });
        if let (Some(label), Some(at)) = (&l.label, &l.label_origin) {
            input.push(InputShape {
                layer: at.layer.clone(),
                shape: Shape::Text(Text {
                    at: at.at,
                    height: 0.8 * th,
                    rotation: 0.0,
                    content: label.clone(),
                    h: HAlign::Center,
                    v: VAlign::Middle,
                }),
            });
        }
    }
    for s in stretches {
        let y = s.origin.at.y;
        let (a, b) = (Point::new(s.x0, y), Point::new(s.x1, y));
        input.push(InputShape { layer: s.origin.layer.clone(), shape: Shape::Line(Line::new(a, b)) });
        if let Some(label) = &s.label {
            input.push(InputShape {
                layer: s.origin.layer.clone(),
                shape: Shape::Text(Text {
                    at: a.midpoint(b) + Vec2::new(0.0, 0.5 * th),
                    height: 0.8 * th,
                    rotation: 0.0,
                    content: label.clone(),
                    h: HAlign::Center,
                    v: VAlign::Bottom,
                }),
            });
        }
    }
}

/// The RGB colour of an AutoCAD Colour Index number as shown on a white
/// background: the nine standard colours (7 black here), the greys 250–255
/// and the hues 10, 20, …, 240 (full value and saturation, 15° apart from
/// red); the other shades of a hue are drawn as their full hue. The values
/// are those of the common ACI palette (common practice, from memory).
#[must_use]
pub fn aci_rgb(index: i16) -> (u8, u8, u8) {
    match index {
        1 => (255, 0, 0),
        2 => (255, 255, 0),
        3 => (0, 255, 0),
        4 => (0, 255, 255),
        5 => (0, 0, 255),
        6 => (255, 0, 255),
        8 => (128, 128, 128),
        9 => (192, 192, 192),
        250..=255 => {
            let g = [51, 91, 132, 173, 214, 255][(index - 250) as usize];
            (g, g, g)
        }
        10..=249 => hue_rgb(f64::from(index / 10 - 1) * 15.0),
        _ => (0, 0, 0),
    }
}

/// Full-value, full-saturation colour of a hue in degrees.
fn hue_rgb(hue: f64) -> (u8, u8, u8) {
    let h = hue.rem_euclid(360.0) / 60.0;
    let x = 1.0 - (h % 2.0 - 1.0).abs();
    let (r, g, b) = match h as u8 {
        0 => (1.0, x, 0.0),
        1 => (x, 1.0, 0.0),
        2 => (0.0, 1.0, x),
        3 => (0.0, x, 1.0),
        4 => (x, 0.0, 1.0),
        _ => (1.0, 0.0, x),
    };
    let c = |v: f64| (v * 255.0).round() as u8;
    (c(r), c(g), c(b))
}

/// `#rrggbb` of an ACI number. Light colours (yellow, green, cyan, amber:
/// relative luminance above 0.6, by the sRGB weights of ITU-R BT.709) are
/// darkened to 70 %, which a white background needs to show them.
fn aci_hex(index: i16) -> String {
    let (r, g, b) = aci_rgb(index);
    let luminance = (0.2126 * f64::from(r) + 0.7152 * f64::from(g) + 0.0722 * f64::from(b)) / 255.0;
    let k = if luminance > 0.6 { 0.7 } else { 1.0 };
    let d = |v: u8| (f64::from(v) * k).round() as u8;
    format!("#{:02x}{:02x}{:02x}", d(r), d(g), d(b))
}

/// A number for the document: Rust's shortest form that reads back as the
/// same `f64`, without a negative zero.
fn num(v: f64) -> String {
    if v == 0.0 { "0".to_string() } else { format!("{v}") }
}

/// A point for the document, y negated.
fn pt(p: Point) -> String {
    format!("{},{}", num(p.x), num(-p.y))
}

fn points(ps: &[Point]) -> String {
    ps.iter().map(|p| pt(*p)).collect::<Vec<_>>().join(" ")
}

/// An attribute value: without `"` (see the module's notes).
fn attr(s: &str) -> String {
    s.replace('"', "'")
}

/// Text content without control characters.
fn clean(s: &str) -> String {
    s.chars().filter(|c| !c.is_control()).collect()
}

/// The box around everything drawn, in drawing coordinates.
fn extent(view: &PreviewInput<'_>) -> Option<Rect> {
    view.input
        .iter()
        .map(|s| &s.shape)
        .chain(view.additions.items.iter().map(|i| &i.shape))
        .filter_map(bounds)
        .filter(|r| [r.x0, r.y0, r.x1, r.y1].iter().all(|v| v.is_finite()))
        .reduce(|a, b| a.union(b))
}

/// A shape's box, texts by their alignment, rotation and an estimated
/// width (`Shape::bounds` keeps a square around a text's anchor, ample for
/// placing things in a drawing but loose for framing a picture).
fn bounds(shape: &Shape) -> Option<Rect> {
    match shape {
        Shape::Text(t) => Some(text_box(t)),
        Shape::Dimension(d) => d.geometry.iter().filter_map(bounds).reduce(|a, b| a.union(b)),
        other => other.bounds(),
    }
}

/// Average advance of a character, in font sizes: about 0.6 em in common
/// sans-serif fonts (common practice, no source).
const ADVANCE: f64 = 0.6;

/// The box around a text as drawn by [`text`].
fn text_box(t: &Text) -> Rect {
    let h = t.height;
    let w = ADVANCE * h * FONT_PER_HEIGHT * t.content.chars().count() as f64;
    let x0 = match t.h {
        HAlign::Left => 0.0,
        HAlign::Center => -0.5 * w,
        HAlign::Right => -w,
    };
    let base = -baseline_shift(t.v) * h;
    let (sin, cos) = t.rotation.to_radians().sin_cos();
    let (sin, cos) = if sin.is_finite() { (sin, cos) } else { (0.0, 1.0) };
    let corners = [(x0, base - 0.3 * h), (x0 + w, base - 0.3 * h), (x0, base + h), (x0 + w, base + h)];
    let turned = corners.map(|(x, y)| t.at + Vec2::new(x * cos - y * sin, x * sin + y * cos));
    turned.iter().fold(Rect::from_points(turned[0], turned[0]), |r, p| r.union_pt(*p))
}

/// How far below the anchor the baseline lies, in text heights: text of a
/// height h reaches h above its baseline and descenders about 0.3 h below
/// it (common practice, no source).
fn baseline_shift(v: VAlign) -> f64 {
    match v {
        VAlign::Baseline => 0.0,
        VAlign::Bottom => -0.3,
        VAlign::Middle => 0.5,
        VAlign::Top => 1.0,
    }
}

/// Appends the SVG elements of `shape` to `group`. `colour` is the stroke
/// and fill of this shape when it has one of its own.
fn draw(group: Group, shape: &Shape, colour: Option<&str>) -> Group {
    match shape {
        Shape::Line(l) => {
            let mut e = SvgLine::new()
                .set("x1", num(l.p0.x))
                .set("y1", num(-l.p0.y))
                .set("x2", num(l.p1.x))
                .set("y2", num(-l.p1.y));
            if let Some(c) = colour {
                e = e.set("stroke", c);
            }
            group.add(e)
        }
        Shape::Polyline { points: ps, closed } => {
            let p = points(ps);
            if *closed {
                let mut e = Polygon::new().set("points", p).set("fill", "none");
                if let Some(c) = colour {
                    e = e.set("stroke", c);
                }
                group.add(e)
            } else {
                let mut e = Polyline::new().set("points", p).set("fill", "none");
                if let Some(c) = colour {
                    e = e.set("stroke", c);
                }
                group.add(e)
            }
        }
        Shape::Circle { center, radius } => {
            let mut e = Circle::new()
                .set("cx", num(center.x))
                .set("cy", num(-center.y))
                .set("r", num(*radius))
                .set("fill", "none");
            if let Some(c) = colour {
                e = e.set("stroke", c);
            }
            group.add(e)
        }
        Shape::Solid(ps) => {
            let mut e = Polygon::new().set("points", points(ps)).set("stroke", "none");
            e = e.set("fill", colour.unwrap_or("currentColor"));
            group.add(e)
        }
        Shape::Text(t) => group.add(text(t, colour)),
        Shape::Dimension(d) => {
            let mut g = Group::new().set("class", "dimension");
            for s in &d.geometry {
                g = draw(g, s, colour);
            }
            group.add(g)
        }
    }
}

/// A line of text: anchored as in the drawing (the vertical alignment by a
/// shift of the baseline, which every renderer honours), rotated
/// counter-clockwise in the drawing, so clockwise in SVG's y-down frame.
///
/// Built as a plain element: the crate's own text element writes its
/// content on lines of its own, which XML parsers then return with the
/// line breaks.
fn text(t: &Text, colour: Option<&str>) -> Element {
    let anchor = match t.h {
        HAlign::Left => "start",
        HAlign::Center => "middle",
        HAlign::Right => "end",
    };
    let shift = baseline_shift(t.v) * t.height;
    let (x, y) = (t.at.x, -t.at.y);
    let mut e = Element::new("text");
    e.assign("x", num(x));
    e.assign("y", num(y));
    e.assign("dy", num(shift));
    e.assign("font-size", num(t.height * FONT_PER_HEIGHT));
    e.assign("text-anchor", anchor);
    e.assign("stroke", "none");
    if t.rotation != 0.0 && t.rotation.is_finite() {
        e.assign("transform", format!("rotate({} {} {})", num(-t.rotation), num(x), num(y)));
    }
    e.assign("fill", colour.unwrap_or("currentColor"));
    e.append(svg::node::Text::new(clean(&t.content)));
    e
}

/// The preview as an SVG document.
#[must_use]
pub fn svg(view: &PreviewInput<'_>) -> String {
    let th = text_height(view.additions);
    let r = extent(view).unwrap_or(Rect::new(0.0, 0.0, 1.0, 1.0));
    let margin = (0.03 * r.width().max(r.height())).max(th);
    let r = r.inflate(margin, margin);
    let (w, h) = (r.width().max(f64::MIN_POSITIVE), r.height().max(f64::MIN_POSITIVE));
    let size = w.max(h);
    let stroke = size / 1500.0;
    let (px_w, px_h) = if w >= h { (PIXELS, (PIXELS * h / w).max(1.0)) } else { ((PIXELS * w / h).max(1.0), PIXELS) };
    // The viewBox in SVG's frame: top edge at −y1.
    let (x0, y0) = (r.x0, -r.y1);
    let mut doc = Document::new()
        .set("viewBox", format!("{} {} {} {}", num(x0), num(y0), num(w), num(h)))
        .set("width", num(px_w.round()))
        .set("height", num(px_h.round()))
        .set("font-family", "DejaVu Sans, Arial, Helvetica, sans-serif")
        .set("stroke-linecap", "round")
        .set("stroke-linejoin", "round")
        .add(Title::new(clean(&view.title)))
        .add(
            Rectangle::new()
                .set("x", num(x0))
                .set("y", num(y0))
                .set("width", num(w))
                .set("height", num(h))
                .set("fill", "#ffffff"),
        );

    // The input layers, in the order first met.
    let mut layers: Vec<&str> = Vec::new();
    for s in &view.input {
        if !layers.contains(&s.layer.as_str()) {
            layers.push(&s.layer);
        }
    }
    let mut input = Group::new()
        .set("id", "input")
        .set("stroke", INPUT_COLOUR)
        .set("color", INPUT_COLOUR)
        .set("stroke-width", num(1.5 * stroke));
    for layer in layers {
        let mut g = Group::new().set("class", "layer input").set("data-layer", attr(layer));
        for s in view.input.iter().filter(|s| s.layer == layer) {
            g = draw(g, &s.shape, None);
        }
        input = input.add(g);
    }
    doc = doc.add(input);

    for role in Role::ALL {
        let items: Vec<_> = view.additions.items.iter().filter(|i| i.role == role).collect();
        if items.is_empty() {
            continue;
        }
        let colour = aci_hex(role.colour());
        let width = if role == Role::Profile || role.key().starts_with("thrust") { 3.0 } else { 1.0 } * stroke;
        let mut g = Group::new()
            .set("id", format!("role-{}", role.key()))
            .set("class", "layer")
            .set("data-layer", attr(view.layers.get(role)))
            .set("stroke", colour.clone())
            .set("color", colour)
            .set("stroke-width", num(width));
        for item in items {
            let own = item.colour.map(aci_hex);
            g = draw(g, &item.shape, own.as_deref());
        }
        doc = doc.add(g);
    }
    doc.to_string()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::layout::{DimStyle, Item};

    fn additions(items: Vec<Item>) -> Additions {
        Additions {
            items,
            variants: Vec::new(),
            dim_style: DimStyle {
                text_height: 0.8,
                arrow: 0.8,
                ext_offset: 0.25,
                ext_extend: 0.4,
                gap: 0.2,
                decimals: 2,
                literal_text: false,
            },
        }
    }

    fn item(role: Role, shape: Shape) -> Item {
        Item { role, shape, colour: None }
    }

    #[test]
    fn preview_flips_y_and_groups_by_role() {
        let a = additions(vec![
            item(
                Role::Profile,
                Shape::Polyline {
                    points: vec![Point::new(0.0, 0.0), Point::new(5.0, -2.5), Point::new(10.0, 0.0)],
                    closed: false,
                },
            ),
            item(Role::Diagram, Shape::Circle { center: Point::new(20.0, 1.0), radius: 0.2 }),
        ]);
        let layers = OutputLayers::default();
        let view = PreviewInput { title: "t".into(), input: vec![], additions: &a, layers: &layers };
        let s = svg(&view);
        assert!(s.contains(r#"id="role-profile""#), "{s}");
        assert!(s.contains(r#"data-layer="HANGLINE-PROFILE""#), "{s}");
        assert!(s.contains(r#"points="0,0 5,2.5 10,0""#), "{s}");
        assert!(s.contains(r#"cx="20" cy="-1""#), "{s}");
        // Profile magenta (ACI 6).
        assert!(s.contains("#ff00ff"), "{s}");
        assert!(!s.contains("role-notes"));
    }

    #[test]
    fn preview_escapes_text_and_drops_control_characters() {
        let a = additions(vec![item(
            Role::Notes,
            Shape::Text(Text {
                at: Point::new(0.0, 0.0),
                height: 1.0,
                rotation: 90.0,
                content: "H < 5 & \"x\" > 2\u{7}".into(),
                h: HAlign::Right,
                v: VAlign::Top,
            }),
        )]);
        let layers = OutputLayers::default();
        let view = PreviewInput { title: "a<b".into(), input: vec![], additions: &a, layers: &layers };
        let s = svg(&view);
        assert!(s.contains("H &lt; 5 &amp; \"x\" &gt; 2</text>"), "{s}");
        assert!(s.contains("<title>a&lt;b</title>"), "{s}");
        assert!(s.contains(r#"text-anchor="end""#), "{s}");
        assert!(s.contains(r#"transform="rotate(-90 0 0)""#), "{s}");
        assert!(s.contains(r#"dy="1""#), "{s}");
    }

    /// ACI 1–9 as in the DXF reference's colour table (common practice).
    #[test]
    fn preview_aci_colours() {
        assert_eq!(aci_rgb(1), (255, 0, 0));
        assert_eq!(aci_rgb(5), (0, 0, 255));
        assert_eq!(aci_rgb(7), (0, 0, 0));
        assert_eq!(aci_rgb(30), (255, 128, 0));
        assert_eq!(aci_rgb(150), (0, 128, 255));
        assert_eq!(aci_rgb(210), (255, 0, 255));
        assert_eq!(aci_hex(4), "#00b3b3");
        assert_eq!(aci_hex(2), "#b3b300");
        assert_eq!(aci_hex(3), "#00b300");
        assert_eq!(aci_hex(6), "#ff00ff");
    }

    #[test]
    fn preview_of_nothing_is_a_document() {
        let a = additions(vec![]);
        let layers = OutputLayers::default();
        let view = PreviewInput { title: String::new(), input: vec![], additions: &a, layers: &layers };
        let s = svg(&view);
        assert!(s.starts_with("<svg"), "{s}");
        assert!(s.contains("viewBox"));
    }
    /// A text's box follows its alignment and rotation: right-aligned,
    /// top-anchored text lies left of and below its anchor; turned by 90°
    /// it lies below and right (x ↦ −y, y ↦ x).
    #[test]
    fn preview_text_box_follows_alignment_and_rotation() {
        let t = Text {
            at: Point::new(10.0, 5.0),
            height: 1.0,
            rotation: 0.0,
            content: "abcd".into(),
            h: HAlign::Right,
            v: VAlign::Top,
        };
        let b = text_box(&t);
        assert!((b.x1 - 10.0).abs() < 1e-12 && b.x0 < 10.0 - 3.0, "{b:?}");
        assert!((b.y1 - 5.0).abs() < 1e-12 && (b.y0 - (5.0 - 1.3)).abs() < 1e-12, "{b:?}");
        let turned = text_box(&Text { rotation: 90.0, ..t });
        assert!((turned.y1 - 5.0).abs() < 1e-9 && turned.y0 < 5.0 - 3.0, "{turned:?}");
        assert!((turned.x0 - 10.0).abs() < 1e-9 && (turned.x1 - 11.3).abs() < 1e-9, "{turned:?}");
    }

    /// A dimension is drawn as its geometry, inside a group of its own.
    #[test]
    fn preview_draws_a_dimension_as_its_geometry() {
        let d = crate::layout::linear(
            Point::new(0.0, 0.0),
            Point::new(10.0, 0.0),
            0.0,
            Point::new(5.0, -2.0),
            "span ",
            &additions(vec![]).dim_style,
        );
        let count = d.geometry.len();
        let a = additions(vec![item(Role::Dimensions, Shape::Dimension(Box::new(d)))]);
        let layers = OutputLayers::default();
        let view = PreviewInput { title: String::new(), input: vec![], additions: &a, layers: &layers };
        let s = svg(&view);
        let inside = s.split(r#"<g class="dimension">"#).nth(1).expect("a dimension group");
        let drawn =
            inside.matches("<line").count() + inside.matches("<polygon").count() + inside.matches("<text").count();
        assert_eq!(drawn, count, "{s}");
    }

    /// Beer & Johnston, Vector Mechanics for Engineers: Statics, Prob.
    /// 7.116 (the fixture of the crate's doc example): the preview holds
    /// both supports, an arrow and a label per load, and frames every node.
    #[test]
    fn preview_of_a_solved_drawing_shows_its_input() {
        use crate::pipeline::{Given, Job, prepare};
        let bytes = std::fs::read("fixtures/bj7116-ft-r2000.dxf").expect("the fixture");
        let job = Job {
            read: Default::default(),
            form: crate::solve::Form::Cable,
            given: vec![Given::Through(4.0, -3.6)],
            layout: Default::default(),
            force_scale: None,
            layers: Default::default(),
            self_weight: None,
            axial_stiffness: None,
            chord_tolerance: None,
            alternatives: Vec::new(),
            sizing: None,
        };
        let (o, _) = prepare(&bytes, &job).expect("solved");
        let view = PreviewInput::solved("bj", &o.reading, "DECK", &o.additions, &job.layers);
        let loads = o.reading.loads.len();
        assert_eq!(view.input.iter().filter(|s| matches!(s.shape, Shape::Solid(_))).count(), loads);
        let labels = view.input.iter().filter(|s| matches!(s.shape, Shape::Text(_))).count();
        assert_eq!(labels, o.reading.loads.iter().filter(|l| l.label.is_some()).count());
        let r = extent(&view).expect("an extent");
        for p in &o.solution.nodes {
            assert!(r.contains(*p), "{p:?} outside {r:?}");
        }
        let s = svg(&view);
        assert!(s.contains(r#"data-layer="SUPPORTS""#) && s.contains(r#"data-layer="LOADS""#), "{s}");
    }
}
