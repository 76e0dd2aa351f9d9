//! Layout: what the tool draws back into the drawing, as plain shapes.
//!
//! Pure geometry, no DXF: the form diagram's additions ([`form`]: profile,
//! hangers, force annotations, Bow's letters, dimensions) and the force
//! diagram ([`diagram`]) placed beside the drawing. Sizes follow one text
//! height proportioned to the span; the writer turns the result into DXF.

pub mod assess;
pub mod compare;
mod diagram;
mod dimension;
mod form;
mod loads;
pub mod nice;
mod shapes;

use kurbo::{Point, Rect};

use crate::model::Structure;
use crate::solve::Solution;
pub use dimension::linear;
pub use shapes::*;

/// Choices the user can make about the layout.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct LayoutOptions {
    /// Force units per drawing unit in the force diagram; chosen to fit when `None`.
    pub force_scale: Option<f64>,
    /// Where the top of the load line (point a) goes; beside the drawing when `None`.
    pub diagram_at: Option<Point>,
    /// Text height in drawing units; proportioned to the span when `None`.
    pub text_height: Option<f64>,
    /// Self-weight per unit length of the profile, drawn in the load diagram.
    pub self_weight: Option<f64>,
    /// Dimensions carry their measured values as text instead of `<>`
    /// (see [`DimStyle::literal_text`]).
    pub literal_dimension_text: bool,
}

/// What the layout decided, for the report and the summary.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Placement {
    /// Force units per drawing unit in the force diagram.
    pub force_scale: f64,
    /// Where point a (the top of the load line) was drawn.
    pub diagram_at: Point,
    /// The text height used.
    pub text_height: f64,
}

/// The text height proportioned to a span: a round number near 1/60 of it
/// (about 2.5 mm on paper at the scale that fits the span on an A3 sheet;
/// common drafting practice, no source).
#[must_use]
pub fn text_height_for(span: f64) -> f64 {
    nice::round_down(span / 60.0)
}

/// The result in one line: thrust, largest force and where, sag or rise and
/// where, profile length — for the drawing's notes and the command's summary.
#[must_use]
pub fn result_line(structure: &Structure, solution: &Solution) -> String {
    let u = structure.units();
    let word = match solution.form {
        crate::solve::Form::Cable => "sag",
        crate::solve::Form::Arch => "rise",
    };
    let continuous = solution.node_kinds.iter().any(|k| matches!(k, crate::solve::NodeKind::Panel));
    let largest = if continuous {
        format!(
            "{} at ({}, {})",
            nice::fmt_force(solution.peak.force, u.force),
            nice::fmt_length(solution.peak.at.x, u.length),
            nice::fmt_length(solution.peak.at.y, u.length)
        )
    } else {
        format!(
            "{} in {}",
            nice::fmt_force(solution.max_force(), u.force),
            nice::member_name(solution.max_segment, structure.loads().len() + 1)
        )
    };
    format!(
        "H = {}; largest force {largest}; {word} {} {} at x = {}; span {} {}; length {} {}",
        nice::fmt_force(solution.thrust, u.force),
        nice::fmt_length(solution.sag.value, u.length),
        u.length,
        nice::fmt_length(solution.sag.x, u.length),
        nice::fmt_length(structure.span(), u.length),
        u.length,
        nice::fmt_length(solution.length(), u.length),
        u.length,
    )
}

/// Lays out everything the tool adds for `solution`, beside `extents` (the
/// user's drawing, when known).
#[must_use]
///
/// `structure` is the one solved (distributed loads carried to hangers, if
/// any); `drawn` the one read, whose loads the load diagram shows.
pub fn layout(
    structure: &Structure,
    drawn: &Structure,
    solution: &Solution,
    extents: Option<Rect>,
    options: &LayoutOptions,
) -> (Additions, Placement) {
    layout_with_notes(structure, drawn, solution, extents, options, &Annotations::default())
}

/// What a caller adds to the layout's own annotations.
#[derive(Clone, Copy, Debug, Default)]
pub struct Annotations<'a> {
    /// Lines written under the force diagram's summary, before the caution
    /// (e.g. the members' sizing).
    pub notes: &'a [String],
    /// Words added to the pole's label (a design alternative's condition).
    pub pole: Option<&'a str>,
}

/// [`layout`], with the caller's `annotations`.
#[must_use]
pub fn layout_with_notes(
    structure: &Structure,
    drawn: &Structure,
    solution: &Solution,
    extents: Option<Rect>,
    options: &LayoutOptions,
    annotations: &Annotations<'_>,
) -> (Additions, Placement) {
    let th = options.text_height.unwrap_or_else(|| text_height_for(structure.span()));
    let units = structure.units();
    let decimals = nice::length_decimals(units.length) as i64;
    let dim_style = DimStyle::for_text_height(th, decimals, options.literal_dimension_text);
    let mut items = form::form_items(structure, drawn, solution, th, &dim_style, options.self_weight);
    let mut taken = extents;
    for item in &items {
        if let Some(b) = item.shape.bounds() {
            taken = Some(taken.map_or(b, |t| t.union(b)));
        }
    }
    let top = solution.nodes.iter().map(|p| p.y).fold(f64::NEG_INFINITY, f64::max);
    let (diagram, placement) = diagram::diagram_items(structure, solution, taken, top, th, options, annotations);
    items.extend(diagram);
    (Additions { items, dim_style, variants: Vec::new() }, placement)
}
