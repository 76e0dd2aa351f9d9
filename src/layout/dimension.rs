//! Linear dimensions and the geometry they display.
//!
//! The geometry follows the usual drafting layout (common practice, no
//! source): extension lines from a small offset off each origin to a little
//! beyond the dimension line, filled arrowheads inside, and the text above
//! the dimension line's middle, reading from the bottom or the right.

use kurbo::{Line, Point, Vec2};

use super::shapes::{DimStyle, Dimension, HAlign, Shape, Text, VAlign};

/// A linear dimension measuring `p1`–`p2` along the direction `angle`
/// (degrees), its dimension line through `through`, its text `prefix` and
/// the measurement to `decimals` places.
#[must_use]
pub fn linear(p1: Point, p2: Point, angle: f64, through: Point, prefix: &str, style: &DimStyle) -> Dimension {
    let (s, c) = angle.to_radians().sin_cos();
    let u = Vec2::new(c, s);
    let n = Vec2::new(-s, c);
    let a = p1 + n * (through - p1).dot(n);
    let b = p2 + n * (through - p2).dot(n);
    let measurement = (p2 - p1).dot(u).abs();
    let mut geometry = Vec::new();
    for (origin, foot) in [(p1, a), (p2, b)] {
        let d = foot - origin;
        let len = d.hypot();
        if len > style.ext_offset {
            let dir = d / len;
            geometry.push(Shape::Line(Line::new(origin + dir * style.ext_offset, foot + dir * style.ext_extend)));
        }
    }
    geometry.push(Shape::Line(Line::new(a, b)));
    let ab = b - a;
    let length = ab.hypot();
    let v = if length > 0.0 { ab / length } else { u };
    if length > 0.0 {
        for (tip, dir) in [(a, v), (b, -v)] {
            let w = Vec2::new(-dir.y, dir.x) * (style.arrow / 6.0);
            let base = tip + dir * style.arrow;
            geometry.push(Shape::Solid([tip, base + w, base - w]));
        }
    }
    // Text reads left to right, or bottom to top.
    let mut text_angle = angle.rem_euclid(360.0);
    if text_angle > 90.0 && text_angle <= 270.0 {
        text_angle -= 180.0;
    }
    let (ts, tc) = text_angle.to_radians().sin_cos();
    let up = Vec2::new(-ts, tc);
    let value = format!("{:.*}", style.decimals.max(0) as usize, measurement);
    let content = format!("{prefix} {value}");
    // Text longer than the dimension goes out beyond the first extension
    // line, above the dimension line drawn on under it (common drafting
    // practice, no source); callers put the clear side first.
    let text_length = content.chars().count() as f64 * CHARACTER_WIDTH * style.text_height;
    let text_moved = text_length > length;
    let along = if text_moved {
        let reach = style.ext_extend + style.gap + text_length;
        geometry.push(Shape::Line(Line::new(a, a - v * reach)));
        a - v * (reach - text_length / 2.0)
    } else {
        a.midpoint(b)
    };
    let text_at = along + up * (style.gap + style.text_height / 2.0);
    let override_text = if style.literal_text { content.clone() } else { format!("{prefix} <>") };
    geometry.push(Shape::Text(Text {
        at: text_at,
        height: style.text_height,
        rotation: text_angle,
        content,
        h: HAlign::Center,
        v: VAlign::Middle,
    }));
    Dimension { p1, p2, line_at: b, angle, text_at, measurement, override_text, text_moved, geometry }
}

/// A character's advance as a fraction of the text height, for the usual
/// CAD fonts (common practice, no source; a little generous, so that a text
/// said to fit does).
const CHARACTER_WIDTH: f64 = 0.7;

#[cfg(test)]
mod tests {
    use super::*;

    fn style() -> DimStyle {
        DimStyle {
            text_height: 0.5,
            arrow: 0.4,
            ext_offset: 0.1,
            ext_extend: 0.2,
            gap: 0.1,
            decimals: 3,
            literal_text: false,
        }
    }

    #[test]
    fn a_vertical_dimension_measures_the_height() {
        let d = linear(Point::new(5.0, 10.0), Point::new(5.0, 4.0), 90.0, Point::new(7.0, 0.0), "sag", &style());
        assert!((d.measurement - 6.0).abs() < 1e-12);
        assert_eq!(d.line_at, Point::new(7.0, 4.0));
        assert_eq!(d.override_text, "sag <>");
        let literal = DimStyle { literal_text: true, ..style() };
        let d = linear(Point::new(5.0, 10.0), Point::new(5.0, 4.0), 90.0, Point::new(7.0, 0.0), "sag", &literal);
        assert_eq!(d.override_text, "sag 6.000");
        let text = d.geometry.iter().find_map(|s| if let Shape::Text(t) = s { Some(t) } else { None }).unwrap();
        assert_eq!(text.content, "sag 6.000");
        assert_eq!(text.rotation, 90.0);
        // The text sits beside the dimension line, on its left (x < 7).
        assert!(text.at.x < 7.0 && (text.at.y - 7.0).abs() < 1e-12);
        // Two extension lines, the dimension line, two arrowheads, the text.
        assert_eq!(d.geometry.len(), 6);
    }

    #[test]
    fn a_horizontal_dimension_below_its_points() {
        let d = linear(Point::new(0.0, 0.0), Point::new(48.0, 3.0), 0.0, Point::new(0.0, -4.0), "span", &style());
        assert_eq!(d.measurement, 48.0);
        assert_eq!(d.line_at, Point::new(48.0, -4.0));
        let Shape::Line(ext) = &d.geometry[0] else { panic!("extension line first") };
        assert_eq!(ext.p0, Point::new(0.0, -0.1));
        assert!((ext.p1.y - -4.2).abs() < 1e-12);
        // 48 long, "span 48.000" about 3.9: the text sits over the middle.
        assert!(!d.text_moved);
        assert!((d.text_at.x - 24.0).abs() < 1e-12 && d.text_at.y > -4.0);
    }

    #[test]
    fn a_text_longer_than_its_dimension_goes_beyond_the_first_point() {
        // 1.5 high; "sag 1.500" is 9 characters, about 3.2 long at 0.5 high.
        let d = linear(Point::new(5.0, 10.0), Point::new(5.0, 8.5), 90.0, Point::new(7.0, 0.0), "sag", &style());
        assert!(d.text_moved);
        let Some(Shape::Text(t)) = d.geometry.last() else { panic!("text last") };
        let half = 9.0 * CHARACTER_WIDTH * 0.5 / 2.0;
        // Above the first point, clear of the dimension by the extension and gap.
        assert!(t.at.y - half >= 10.0 + 0.2 + 0.1 - 1e-12, "{:?}", t.at);
        assert_eq!(t.at, d.text_at);
        // The dimension line runs on under the text.
        let under = d
            .geometry
            .iter()
            .any(|g| matches!(g, Shape::Line(l) if l.p0 == Point::new(7.0, 10.0) && l.p1.y >= t.at.y + half));
        assert!(under, "{:?}", d.geometry);
    }
}
