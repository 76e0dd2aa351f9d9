//! The plain domain model: supports, loads and deck, with no DXF types.
//!
//! A [`Structure`] can only be built through [`Structure::new`], which checks
//! it (two supports apart, finite numbers, at least one load, every load
//! positive), so the solvers never have to re-check their input.
//!
//! Lengths are in the drawing's unit and forces in one force unit, both named
//! by [`Units`]; y points up, as in the drawing.

use std::fmt;

use kurbo::{Line, Point, Vec2};
use thiserror::Error;

use crate::units::Units;

/// Where an item came from in the drawing, so that messages can point at it.
#[derive(Clone, Debug, PartialEq)]
pub struct Origin {
    /// Layer the entity is on.
    pub layer: String,
    /// The entity's handle (group code 5), when the drawing has handles.
    pub handle: Option<String>,
    /// A representative position of the entity, in drawing coordinates.
    pub at: Point,
}

impl fmt::Display for Origin {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match &self.handle {
            Some(h) => write!(f, "entity {h} on layer {}", self.layer)?,
            None => write!(f, "entity on layer {}", self.layer)?,
        }
        write!(f, " at ({})", fmt_xy(self.at))
    }
}

/// Formats a point as `x, y` with up to six significant decimals, no trailing zeros.
#[must_use]
pub fn fmt_xy(p: Point) -> String {
    format!("{}, {}", fmt_num(p.x), fmt_num(p.y))
}

/// Formats a number for messages: at most 6 decimals, trailing zeros dropped.
#[must_use]
pub fn fmt_num(v: f64) -> String {
    if !v.is_finite() {
        return format!("{v}");
    }
    if v != 0.0 && (v.abs() >= 1e9 || v.abs() < 1e-4) {
        return format!("{v:.6e}");
    }
    let s = format!("{v:.6}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" { "0".to_string() } else { s.to_string() }
}

/// A support of the cable or arch.
#[derive(Clone, Debug, PartialEq)]
pub enum Support {
    /// A fixed point: an anchor, a pin or a tower top whose height is known.
    Point {
        /// Position of the support.
        at: Point,
        /// Where it was drawn.
        origin: Origin,
    },
    /// A tower axis: the support's x is fixed, its height follows from the
    /// shape. `foot` and `top` are the y of the drawn axis line's lower and
    /// upper ends; the height found is reported above `foot`.
    Axis {
        /// x of the axis.
        x: f64,
        /// y of the lower end of the drawn axis.
        foot: f64,
        /// y of the upper end of the drawn axis.
        top: f64,
        /// Where it was drawn.
        origin: Origin,
    },
}

impl Support {
    /// The support's x.
    #[must_use]
    pub fn x(&self) -> f64 {
        match self {
            Support::Point { at, .. } => at.x,
            Support::Axis { x, .. } => *x,
        }
    }

    /// Where the support was drawn.
    #[must_use]
    pub fn origin(&self) -> &Origin {
        match self {
            Support::Point { origin, .. } | Support::Axis { origin, .. } => origin,
        }
    }

    /// The fixed point, for a point support.
    #[must_use]
    pub fn fixed_point(&self) -> Option<Point> {
        match self {
            Support::Point { at, .. } => Some(*at),
            Support::Axis { .. } => None,
        }
    }
}

/// One concentrated load: a force acting along a line of action.
#[derive(Clone, Debug, PartialEq)]
pub struct Load {
    /// A point on the line of action (for a drawn load line, its midpoint).
    pub anchor: Point,
    /// The force, in force units, pointing the way it acts. A vertical load
    /// has `force.x == 0` exactly.
    pub force: Vec2,
    /// Where it was drawn.
    pub origin: Origin,
}

impl Load {
    /// A downward vertical load of magnitude `w` acting at `x`.
    #[must_use]
    pub fn vertical(x: f64, w: f64, origin: Origin) -> Load {
        Load { anchor: Point::new(x, origin.at.y), force: Vec2::new(0.0, -w), origin }
    }

    /// True when the load acts straight down (or up).
    #[must_use]
    pub fn is_vertical(&self) -> bool {
        self.force.x == 0.0
    }

    /// The magnitude of the force.
    #[must_use]
    pub fn magnitude(&self) -> f64 {
        self.force.hypot()
    }
}

/// A vertical load spread over a stretch of the span, per horizontal
/// length, varying linearly from `w0` at `x0` to `w1` at `x1` (a uniform
/// load has `w0 == w1`). Acts downward; in force units per drawing length
/// unit.
#[derive(Clone, Debug, PartialEq)]
pub struct DistributedLoad {
    /// Left end of the stretch.
    pub x0: f64,
    /// Right end of the stretch (> `x0`).
    pub x1: f64,
    /// Intensity at `x0` (≥ 0).
    pub w0: f64,
    /// Intensity at `x1` (≥ 0).
    pub w1: f64,
    /// Where it was drawn.
    pub origin: Origin,
}

impl DistributedLoad {
    /// The intensity at `x` (zero outside the stretch).
    #[must_use]
    pub fn at(&self, x: f64) -> f64 {
        if x < self.x0 || x > self.x1 {
            0.0
        } else {
            self.w0 + (self.w1 - self.w0) * (x - self.x0) / (self.x1 - self.x0)
        }
    }

    /// The resultant: (w0 + w1)/2 · (x1 − x0).
    #[must_use]
    pub fn total(&self) -> f64 {
        0.5 * (self.w0 + self.w1) * (self.x1 - self.x0)
    }

    /// The x of the resultant (the trapezoid's centroid).
    #[must_use]
    pub fn centroid(&self) -> f64 {
        let l = self.x1 - self.x0;
        let sum = self.w0 + self.w1;
        if sum == 0.0 { self.x0 + l / 2.0 } else { self.x0 + l * (self.w0 + 2.0 * self.w1) / (3.0 * sum) }
    }
}

/// The deck: the line the hangers or posts run to, as drawn segments.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Deck {
    /// The deck's segments, in drawing coordinates.
    pub segments: Vec<Line>,
}

impl Deck {
    /// The deck's height at `x`: the highest segment spanning `x`, if any.
    /// Vertical segments are ignored.
    #[must_use]
    pub fn y_at(&self, x: f64) -> Option<f64> {
        self.segments
            .iter()
            .filter_map(|s| {
                let (a, b) = if s.p0.x <= s.p1.x { (s.p0, s.p1) } else { (s.p1, s.p0) };
                if b.x - a.x <= 0.0 || x < a.x || x > b.x {
                    return None;
                }
                let t = (x - a.x) / (b.x - a.x);
                Some(a.y + t * (b.y - a.y))
            })
            .reduce(f64::max)
    }
}

/// What was read from a drawing: the structure to find the funicular of.
#[derive(Clone, Debug, PartialEq)]
pub struct Structure {
    units: Units,
    left: Support,
    right: Support,
    loads: Vec<Load>,
    distributed: Vec<DistributedLoad>,
    deck: Option<Deck>,
}

/// Why a [`Structure`] could not be built.
#[derive(Debug, Error, PartialEq)]
pub enum ModelError {
    /// Not exactly two supports.
    #[error(
        "found {found} support(s) on layer {layer}, need exactly 2: {detail}; draw one POINT, CIRCLE, INSERT or vertical LINE (tower axis) at each end of the span"
    )]
    SupportCount {
        /// How many were found.
        found: usize,
        /// The supports layer.
        layer: String,
        /// The supports found, listed.
        detail: String,
    },
    /// Two supports at the same x.
    #[error("the two supports ({a}; {b}) are at the same x = {x}; a span needs supports apart in x: move one of them")]
    SameX {
        /// First support.
        a: String,
        /// Second support.
        b: String,
        /// Their common x.
        x: String,
    },
    /// No loads at all.
    #[error(
        "no loads found on layer {layer}; draw each load as a LINE along its line of action with a label such as '85 kN' beside it"
    )]
    NoLoads {
        /// The loads layer.
        layer: String,
    },
    /// A number that is not finite, or too large to compute with.
    #[error("{what} of {origin} is {value}; coordinates and forces must be finite and below 1e12: fix the entity")]
    NotFinite {
        /// Which quantity.
        what: &'static str,
        /// The offending entity.
        origin: String,
        /// The value as read.
        value: String,
    },
    /// A load of zero (or negative) magnitude.
    #[error("the load of {origin} is {value}; a load must be a positive force: fix its label")]
    NotPositive {
        /// The offending load.
        origin: String,
        /// The magnitude.
        value: String,
    },
    /// A vertical load outside the span.
    #[error(
        "the load of {origin} acts at x = {x}, outside the span from x = {left} to x = {right}; loads must act between the supports"
    )]
    OutsideSpan {
        /// The load.
        origin: String,
        /// Its x.
        x: String,
        /// Left support x.
        left: String,
        /// Right support x.
        right: String,
    },
    /// Two vertical loads on the same line of action.
    #[error(
        "the loads of {a} and {b} act on one line of action (through x = {x}); combine them into one load with one label"
    )]
    SameLine {
        /// First load.
        a: String,
        /// Second load.
        b: String,
        /// Their common x.
        x: String,
    },
    /// A distributed load that cannot be right.
    #[error("the distributed load of {origin} {problem}")]
    Stretch {
        /// The load line.
        origin: String,
        /// What is wrong and what to do.
        problem: String,
    },
    /// Two distributed loads over the same stretch.
    #[error(
        "the distributed loads of {a} and {b} overlap from x = {from} to x = {to}; draw one stretch per part of the span, with the summed intensity"
    )]
    Overlap {
        /// First load.
        a: String,
        /// Second load.
        b: String,
        /// Start of the overlap.
        from: String,
        /// End of the overlap.
        to: String,
    },
    /// A load whose line of action is horizontal and so never meets the profile in one point.
    #[error(
        "the load of {origin} is horizontal; a load's line of action must cross the span (draw it steeper than horizontal)"
    )]
    Horizontal {
        /// The load.
        origin: String,
    },
}

/// Largest magnitude accepted for a coordinate or a force: far beyond any
/// structure, small enough that squares and products stay exact to 1e-9.
pub const LIMIT: f64 = 1e12;

fn check_finite(what: &'static str, v: f64, origin: &Origin) -> Result<(), ModelError> {
    if v.is_finite() && v.abs() < LIMIT {
        Ok(())
    } else {
        Err(ModelError::NotFinite { what, origin: origin.to_string(), value: format!("{v}") })
    }
}

impl Structure {
    /// Checks and builds a structure.
    ///
    /// `supports` must hold exactly two (any order; the left one is the one
    /// with the smaller x). Loads are sorted left to right by the x of their
    /// anchor. `supports_layer` and `loads_layer` only serve the messages.
    pub fn new(
        units: Units,
        supports: Vec<Support>,
        mut loads: Vec<Load>,
        mut distributed: Vec<DistributedLoad>,
        deck: Option<Deck>,
        supports_layer: &str,
    ) -> Result<Structure, ModelError> {
        for s in &supports {
            match s {
                Support::Point { at, origin } => {
                    check_finite("the x", at.x, origin)?;
                    check_finite("the y", at.y, origin)?;
                }
                Support::Axis { x, foot, top, origin } => {
                    check_finite("the x", *x, origin)?;
                    check_finite("the foot", *foot, origin)?;
                    check_finite("the top", *top, origin)?;
                }
            }
        }
        if supports.len() != 2 {
            let detail = if supports.is_empty() {
                "none".to_string()
            } else {
                supports.iter().map(|s| s.origin().to_string()).collect::<Vec<_>>().join("; ")
            };
            return Err(ModelError::SupportCount { found: supports.len(), layer: supports_layer.to_string(), detail });
        }
        let mut supports = supports;
        supports.sort_by(|a, b| a.x().total_cmp(&b.x()));
        let Ok([left, right]) = <[Support; 2]>::try_from(supports) else { unreachable!("the count was checked above") };
        if left.x() == right.x() {
            return Err(ModelError::SameX {
                a: left.origin().to_string(),
                b: right.origin().to_string(),
                x: fmt_num(left.x()),
            });
        }
        for l in &loads {
            check_finite("the x", l.anchor.x, &l.origin)?;
            check_finite("the y", l.anchor.y, &l.origin)?;
            check_finite("the force", l.force.x, &l.origin)?;
            check_finite("the force", l.force.y, &l.origin)?;
            let m = l.magnitude();
            if m <= 0.0 || m.is_nan() {
                return Err(ModelError::NotPositive { origin: l.origin.to_string(), value: fmt_num(m) });
            }
            if l.force.y == 0.0 {
                return Err(ModelError::Horizontal { origin: l.origin.to_string() });
            }
            if l.is_vertical() && !(l.anchor.x > left.x() && l.anchor.x < right.x()) {
                return Err(ModelError::OutsideSpan {
                    origin: l.origin.to_string(),
                    x: fmt_num(l.anchor.x),
                    left: fmt_num(left.x()),
                    right: fmt_num(right.x()),
                });
            }
        }
        loads.sort_by(|a, b| a.anchor.x.total_cmp(&b.anchor.x));
        for pair in loads.windows(2) {
            let (a, b) = (&pair[0], &pair[1]);
            // Two loads on one line of action (inclined ones too) meet the
            // profile at one point: they are one load.
            let scale = a.force.hypot() * b.force.hypot();
            let parallel = a.force.cross(b.force).abs() <= 1e-12 * scale;
            let collinear = a.force.cross(b.anchor - a.anchor).abs()
                <= 1e-12 * a.force.hypot() * (b.anchor - a.anchor).hypot().max(1e-300);
            if !a.is_vertical() && parallel && (collinear || a.anchor == b.anchor) {
                return Err(ModelError::SameLine {
                    a: a.origin.to_string(),
                    b: b.origin.to_string(),
                    x: fmt_num(a.anchor.x),
                });
            }
            if pair[0].is_vertical() && pair[1].is_vertical() && pair[0].anchor.x == pair[1].anchor.x {
                return Err(ModelError::SameLine {
                    a: pair[0].origin.to_string(),
                    b: pair[1].origin.to_string(),
                    x: fmt_num(pair[0].anchor.x),
                });
            }
        }
        for d in &distributed {
            for (what, v) in [("the start", d.x0), ("the end", d.x1), ("the intensity", d.w0), ("the intensity", d.w1)]
            {
                check_finite(what, v, &d.origin)?;
            }
            if d.x1 <= d.x0 {
                return Err(ModelError::Stretch { origin: d.origin.to_string(), problem: "has no length".into() });
            }
            if d.w0 < 0.0 || d.w1 < 0.0 || d.w0 + d.w1 == 0.0 {
                return Err(ModelError::Stretch {
                    origin: d.origin.to_string(),
                    problem: format!(
                        "has intensities {} and {}; a distributed load must be downward and not zero",
                        fmt_num(d.w0),
                        fmt_num(d.w1)
                    ),
                });
            }
            if d.x0 < left.x() || d.x1 > right.x() {
                return Err(ModelError::Stretch {
                    origin: d.origin.to_string(),
                    problem: format!(
                        "runs from x = {} to x = {}, beyond the span from x = {} to x = {}; loads must act between the supports",
                        fmt_num(d.x0),
                        fmt_num(d.x1),
                        fmt_num(left.x()),
                        fmt_num(right.x())
                    ),
                });
            }
        }
        distributed.sort_by(|a, b| a.x0.total_cmp(&b.x0));
        for pair in distributed.windows(2) {
            if pair[1].x0 < pair[0].x1 {
                return Err(ModelError::Overlap {
                    a: pair[0].origin.to_string(),
                    b: pair[1].origin.to_string(),
                    from: fmt_num(pair[1].x0),
                    to: fmt_num(pair[0].x1.min(pair[1].x1)),
                });
            }
        }
        Ok(Structure { units, left, right, loads, distributed, deck })
    }

    /// The units every quantity is in.
    #[must_use]
    pub fn units(&self) -> Units {
        self.units
    }

    /// The support with the smaller x.
    #[must_use]
    pub fn left(&self) -> &Support {
        &self.left
    }

    /// The support with the larger x.
    #[must_use]
    pub fn right(&self) -> &Support {
        &self.right
    }

    /// The loads, left to right.
    #[must_use]
    pub fn loads(&self) -> &[Load] {
        &self.loads
    }

    /// The distributed loads, left to right, not overlapping.
    #[must_use]
    pub fn distributed(&self) -> &[DistributedLoad] {
        &self.distributed
    }

    /// True when there is any load at all (point or distributed).
    #[must_use]
    pub fn has_loads(&self) -> bool {
        !self.loads.is_empty() || !self.distributed.is_empty()
    }

    /// The same structure with other loads (used to carry distributed loads
    /// to hangers).
    #[must_use]
    pub fn with_loads(&self, loads: Vec<Load>, distributed: Vec<DistributedLoad>) -> Structure {
        let mut loads = loads;
        loads.sort_by(|a, b| a.anchor.x.total_cmp(&b.anchor.x));
        Structure { loads, distributed, ..self.clone() }
    }

    /// The deck, if one was drawn.
    #[must_use]
    pub fn deck(&self) -> Option<&Deck> {
        self.deck.as_ref()
    }

    /// Horizontal distance between the supports (> 0).
    #[must_use]
    pub fn span(&self) -> f64 {
        self.right.x() - self.left.x()
    }

    /// True when every load is vertical.
    #[must_use]
    pub fn all_vertical(&self) -> bool {
        self.loads.iter().all(Load::is_vertical)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::{ForceUnit, LengthUnit};

    fn o(x: f64, y: f64) -> Origin {
        Origin { layer: "L".into(), handle: Some("1F".into()), at: Point::new(x, y) }
    }

    fn units() -> Units {
        Units { length: LengthUnit::Metre, force: ForceUnit::Kilonewton }
    }

    fn pt(x: f64, y: f64) -> Support {
        Support::Point { at: Point::new(x, y), origin: o(x, y) }
    }

    #[test]
    fn supports_are_ordered_and_loads_sorted() {
        let s = Structure::new(
            units(),
            vec![pt(10.0, 0.0), pt(0.0, 1.0)],
            vec![Load::vertical(7.0, 1.0, o(7.0, 0.0)), Load::vertical(3.0, 2.0, o(3.0, 0.0))],
            Vec::new(),
            None,
            "S",
        )
        .unwrap();
        assert_eq!(s.left().x(), 0.0);
        assert_eq!(s.span(), 10.0);
        assert_eq!(s.loads()[0].anchor.x, 3.0);
    }

    #[test]
    fn three_supports_is_an_error_that_lists_them() {
        let e = Structure::new(
            units(),
            vec![pt(0.0, 0.0), pt(5.0, 0.0), pt(10.0, 0.0)],
            vec![Load::vertical(3.0, 2.0, o(3.0, 0.0))],
            Vec::new(),
            None,
            "SUPPORTS",
        )
        .unwrap_err();
        let m = e.to_string();
        assert!(m.contains("found 3 support(s) on layer SUPPORTS"), "{m}");
        assert!(m.contains("entity 1F"), "{m}");
    }

    #[test]
    fn load_outside_span_is_refused() {
        let e = Structure::new(
            units(),
            vec![pt(0.0, 0.0), pt(10.0, 0.0)],
            vec![Load::vertical(12.0, 2.0, o(12.0, 0.0))],
            Vec::new(),
            None,
            "S",
        )
        .unwrap_err();
        assert!(matches!(e, ModelError::OutsideSpan { .. }));
    }

    #[test]
    fn nan_coordinate_is_refused() {
        let e = Structure::new(
            units(),
            vec![pt(0.0, f64::NAN), pt(10.0, 0.0)],
            vec![Load::vertical(2.0, 2.0, o(2.0, 0.0))],
            Vec::new(),
            None,
            "S",
        )
        .unwrap_err();
        assert!(matches!(e, ModelError::NotFinite { .. }));
    }

    #[test]
    fn two_loads_on_one_inclined_line_are_refused() {
        let tilted = |x: f64, y: f64| Load { anchor: Point::new(x, y), force: Vec2::new(1.0, -3.0), origin: o(x, y) };
        let e = Structure::new(
            units(),
            vec![pt(0.0, 0.0), pt(10.0, 0.0)],
            vec![tilted(5.0, -3.0), tilted(6.0, -6.0)],
            Vec::new(),
            None,
            "S",
        )
        .unwrap_err();
        assert!(matches!(e, ModelError::SameLine { .. }), "{e}");
        assert!(e.to_string().contains("one line of action"));
        // Parallel but apart is fine.
        assert!(
            Structure::new(
                units(),
                vec![pt(0.0, 0.0), pt(10.0, 0.0)],
                vec![tilted(5.0, -3.0), tilted(6.0, -3.0)],
                Vec::new(),
                None,
                "S"
            )
            .is_ok()
        );
    }

    #[test]
    fn deck_height_takes_the_highest_segment() {
        let d = Deck {
            segments: vec![
                Line::new((0.0, 0.0), (10.0, 0.0)),
                Line::new((4.0, 1.0), (6.0, 1.0)),
                Line::new((5.0, -3.0), (5.0, 3.0)),
            ],
        };
        assert_eq!(d.y_at(5.0), Some(1.0));
        assert_eq!(d.y_at(2.0), Some(0.0));
        assert_eq!(d.y_at(11.0), None);
    }

    #[test]
    fn numbers_format_without_noise() {
        assert_eq!(fmt_num(12.5), "12.5");
        assert_eq!(fmt_num(3.0), "3");
        assert_eq!(fmt_num(-0.0), "0");
    }
}
