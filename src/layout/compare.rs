//! The comparison table of design alternatives, for the drawing's notes.

use kurbo::Point;

use super::nice::{fmt_force, fmt_length};
use super::shapes::{HAlign, Item, Role, Shape, Text, VAlign};
use crate::model::Structure;
use crate::solve::{Form, Solution};

/// One row of the comparison: the alternative's name and the values a
/// designer weighs (thrust, largest force, sag or rise, tower heights,
/// profile length), as text in the model's units.
#[must_use]
pub fn comparison_rows(structure: &Structure, rows: &[(&str, &Solution)]) -> Vec<[String; 6]> {
    let u = structure.units();
    let word = match rows.first().map(|r| r.1.form) {
        Some(Form::Arch) => "rise",
        _ => "sag",
    };
    let mut out = vec![[
        "alternative (layers)".to_string(),
        format!("H ({})", u.force),
        format!("largest force ({})", u.force),
        format!("{word} ({})", u.length),
        format!("towers ({})", u.length),
        format!("length ({})", u.length),
    ]];
    for (name, s) in rows {
        let towers = if s.towers.is_empty() {
            "-".to_string()
        } else {
            s.towers
                .iter()
                .map(|t| format!("{} {}", if t.side == 0 { "L" } else { "R" }, fmt_length(t.height, u.length)))
                .collect::<Vec<_>>()
                .join(", ")
        };
        out.push([
            (*name).to_string(),
            fmt_force(s.thrust, u.force),
            fmt_force(s.max_force().max(s.peak.force), u.force),
            fmt_length(s.sag.value, u.length),
            towers,
            fmt_length(s.length(), u.length),
        ]);
    }
    out
}

/// The table as texts on the notes layer, its top-left corner at `at`,
/// with the caution under it.
#[must_use]
pub fn comparison_items(structure: &Structure, rows: &[(&str, &Solution)], at: Point, th: f64) -> Vec<Item> {
    let table = comparison_rows(structure, rows);
    let h = 0.8 * th;
    // Column widths from the longest cell (glyphs about 0.6 of the text
    // height wide, a little more for
    // wide fonts: common practice, no source).
    let widths: Vec<f64> = (0..6)
        .map(|c| table.iter().map(|r| r[c].chars().count()).max().unwrap_or(0) as f64 * 0.75 * h + 1.5 * th)
        .collect();
    let mut items = Vec::new();
    let text = |at: Point, content: String| Item {
        role: Role::Notes,
        shape: Shape::Text(Text { at, height: h, rotation: 0.0, content, h: HAlign::Left, v: VAlign::Top }),
        colour: None,
    };
    items.push(text(at, format!("hangline: {} design alternatives, one set of layers each", rows.len())));
    for (r, row) in table.iter().enumerate() {
        let y = at.y - (r as f64 + 1.5) * 1.6 * th;
        let mut x = at.x;
        for (c, cell) in row.iter().enumerate() {
            items.push(text(Point::new(x, y), cell.clone()));
            x += widths[c];
        }
    }
    let y = at.y - (table.len() as f64 + 2.0) * 1.6 * th;
    items.push(text(Point::new(at.x, y), super::diagram::CAUTION.to_string()));
    items
}
