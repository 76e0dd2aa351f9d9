//! One-to-one assignment of load labels to load lines.
//!
//! # The rule (our own convention)
//!
//! Distances run from a text's visual centre to a load line's segment (to
//! its point, for a block load), in drawing units. `r` is
//! [`AssignTolerances::ambiguity_ratio`] (default
//! [`DEFAULT_AMBIGUITY_RATIO`] = 1.25) and `reach` is
//! [`AssignTolerances::max_distance`] (default: no limit).
//!
//! 1. Each text belongs to the load line nearest to it, if that line is
//!    within `reach`; otherwise it belongs to no line. On an exact tie it
//!    belongs to the line given first (and is then ambiguous by rule 4).
//! 2. A line takes, from the texts that belong to it, the nearest one (on an
//!    exact tie, the text given first).
//! 3. A line no text belongs to is an error, [`AssignError::Missing`].
//! 4. The chosen text is ambiguous if another line is nearly as near to it:
//!    with d₁ its distance to its line and d₂ to the next nearest line,
//!    d₂ ≤ r·d₁ is an error, [`AssignError::Ambiguous`].
//! 5. It is ambiguous too if the line's second-nearest own text is nearly as
//!    near: with d₂ that text's distance, d₂ ≤ r·d₁ is an error,
//!    [`AssignError::TwoLabels`].
//! 6. The chosen text must read as a load: otherwise
//!    [`AssignError::Unparsable`].
//! 7. Every other text — one that belongs to a line but was not chosen, or
//!    that belongs to no line — is left over ([`Leftover`]), for the caller
//!    to warn about and ignore.
//!
//! Lines are checked in the order given, rules 3 to 6 in that order, and the
//! first problem found is returned. Ties count as ambiguous (`≤`, not `<`),
//! so a text exactly midway between two lines, or lying on two lines at
//! once, is never silently given to one of them.
//!
//! A line or text with a non-finite coordinate (or one beyond 1e12) takes part in nothing: such a
//! line gets no text (rule 3), such a text belongs to no line (rule 7).
//!
//! # Cost
//!
//! The lines go into an R*-tree (the `rstar` crate), built once in
//! O(n log n); each text then finds its two nearest lines in about O(log n)
//! for lines spread over the drawing as loads are. So n lines and m texts
//! take O(n log n + m log n + m log m): 10 000 of each take milliseconds.

use kurbo::{Line, Point};
use thiserror::Error;

use crate::model::fmt_num;

use super::label::{LabelError, LabelValue, parse_label};

/// Default of [`AssignTolerances::ambiguity_ratio`]: a second candidate
/// less than 25 % farther than the first makes the choice ambiguous. Our own
/// convention: about the spread of hand placement of a label beside its line.
pub const DEFAULT_AMBIGUITY_RATIO: f64 = 1.25;

/// The tolerances of [`assign`].
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct AssignTolerances {
    /// r in the rule: a competing line or text at most r times as far as the
    /// chosen one makes the choice ambiguous. Default
    /// [`DEFAULT_AMBIGUITY_RATIO`]. Values below 1, and NaN, act as 1 (only
    /// exact ties are ambiguous).
    pub ambiguity_ratio: f64,
    /// A text farther than this from every load line belongs to none, in
    /// drawing units. Default `f64::INFINITY` (no limit); NaN acts as no
    /// limit.
    pub max_distance: f64,
}

impl Default for AssignTolerances {
    fn default() -> Self {
        AssignTolerances { ambiguity_ratio: DEFAULT_AMBIGUITY_RATIO, max_distance: f64::INFINITY }
    }
}

/// The geometry of a load.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum LoadShape {
    /// A load drawn as a LINE along its line of action.
    Segment(Line),
    /// A load drawn as a block (INSERT), at its insertion point.
    Point(Point),
}

impl LoadShape {
    /// The shape as a segment (a point is a segment of zero length).
    #[must_use]
    pub fn as_line(&self) -> Line {
        match *self {
            LoadShape::Segment(l) => l,
            LoadShape::Point(p) => Line::new(p, p),
        }
    }
}

/// A load as the assignment sees it.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LoadGeom {
    /// The caller's id for the load, returned in results and errors.
    pub id: usize,
    /// Its geometry.
    pub shape: LoadShape,
}

/// A text near the loads, as the assignment sees it.
#[derive(Clone, Debug, PartialEq)]
pub struct LabelText {
    /// The caller's id for the text, returned in results and errors.
    pub id: usize,
    /// The visual centre of the text, in drawing coordinates.
    pub centre: Point,
    /// The text, already plain (see [`super::mtext`]).
    pub text: String,
    /// The text read as a load (a force or a force per length).
    pub parsed: Result<LabelValue, LabelError>,
}

impl LabelText {
    /// A text at `centre`, read with [`parse_label`].
    #[must_use]
    pub fn new(id: usize, centre: Point, text: impl Into<String>) -> LabelText {
        let text = text.into();
        let parsed = parse_label(&text);
        LabelText { id, centre, text, parsed }
    }
}

/// A load line and the label it took.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Match {
    /// The line's id.
    pub line: usize,
    /// The label's id.
    pub label: usize,
    /// What the label says.
    pub value: LabelValue,
    /// Distance from the label's centre to the line.
    pub distance: f64,
}

/// Why a text was not taken by any line.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum LeftoverReason {
    /// No load line within reach ("not near any load line; ignored").
    NoLine,
    /// Its nearest line took another, nearer text.
    NotChosen {
        /// The line it is nearest to.
        line: usize,
        /// The label that line took.
        taken: usize,
    },
}

/// A text no line took.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Leftover {
    /// The text's id.
    pub label: usize,
    /// Why it was left.
    pub reason: LeftoverReason,
}

/// The result of [`assign`]: every load line with its label, and the texts
/// left over.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Assignment {
    /// One per load line, in the order the lines were given.
    pub matches: Vec<Match>,
    /// The texts no line took, in the order the texts were given.
    pub leftovers: Vec<Leftover>,
}

impl Assignment {
    /// The match of the line with this id.
    #[must_use]
    pub fn of_line(&self, line: usize) -> Option<&Match> {
        self.matches.iter().find(|m| m.line == line)
    }
}

/// Why labels could not be assigned. It carries the caller's ids and the
/// distances; the caller turns them into messages naming handles and
/// positions. The messages here are the fallback wording.
#[derive(Clone, Debug, Error, PartialEq)]
pub enum AssignError {
    /// A load line without a label.
    #[error(
        "load line {line} has no label near it: put a text such as '85 kN' beside it, nearer to it than to any other load line"
    )]
    Missing {
        /// The line's id.
        line: usize,
    },
    /// The chosen label is nearly as near to another line.
    #[error(
        "label {label} is {} from load line {line} and {} from load line {other_line}, too close to tell which load it gives: move it nearer to its own line",
        fmt_num(*.distance),
        fmt_num(*.other_distance)
    )]
    Ambiguous {
        /// The line the label is nearest to.
        line: usize,
        /// The label.
        label: usize,
        /// The nearest other line.
        other_line: usize,
        /// Distance from the label to `line`.
        distance: f64,
        /// Distance from the label to `other_line`.
        other_distance: f64,
    },
    /// Two labels nearly as near to one line.
    #[error(
        "load line {line} has two labels about as near, {label} at {} and {other_label} at {}: keep one label beside each load line and move other text away",
        fmt_num(*.distance),
        fmt_num(*.other_distance)
    )]
    TwoLabels {
        /// The line.
        line: usize,
        /// The nearest label.
        label: usize,
        /// The second-nearest label.
        other_label: usize,
        /// Distance from `label` to the line.
        distance: f64,
        /// Distance from `other_label` to the line.
        other_distance: f64,
    },
    /// The chosen label does not read as a load.
    #[error("label {label}, the one nearest to load line {line}, does not read as a load: {error}")]
    Unparsable {
        /// The line.
        line: usize,
        /// The label.
        label: usize,
        /// Why it does not read.
        error: LabelError,
    },
}

impl AssignError {
    /// The id of the load line the problem is at.
    #[must_use]
    pub fn line(&self) -> usize {
        match self {
            AssignError::Missing { line }
            | AssignError::Ambiguous { line, .. }
            | AssignError::TwoLabels { line, .. }
            | AssignError::Unparsable { line, .. } => *line,
        }
    }
}

/// Gives each load line its label, by the rule in the
/// [module documentation](self).
pub fn assign(
    lines: &[LoadGeom],
    labels: &[LabelText],
    tolerances: AssignTolerances,
) -> Result<Assignment, AssignError> {
    let ratio = if tolerances.ambiguity_ratio >= 1.0 { tolerances.ambiguity_ratio } else { 1.0 };
    let reach = if tolerances.max_distance.is_nan() { f64::INFINITY } else { tolerances.max_distance };

    let tree = Tree::new(lines);
    // For each text: its line (position in `lines`), d₁, and the nearest
    // other line (id, d₂).
    let near: Vec<Option<Near>> = labels
        .iter()
        .map(|t| {
            let (first, second) = tree.as_ref()?.nearest_two(t.centre)?;
            (first.d <= reach).then(|| Near { line: first.pos, d1: first.d, other: second.map(|h| (h.id, h.d)) })
        })
        .collect();

    // The texts belonging to each line, nearest first.
    let mut own: Vec<Vec<(f64, usize, &LabelText)>> = vec![Vec::new(); lines.len()];
    for ((j, text), n) in labels.iter().enumerate().zip(&near) {
        if let Some(n) = n {
            if let Some(list) = own.get_mut(n.line) {
                list.push((n.d1, j, text));
            }
        }
    }
    for list in &mut own {
        list.sort_by(|a, b| a.0.total_cmp(&b.0).then(a.1.cmp(&b.1)));
    }

    let mut matches = Vec::with_capacity(lines.len());
    let mut taken_by_line: Vec<Option<usize>> = vec![None; lines.len()];
    let mut chosen = vec![false; labels.len()];
    for ((line, list), taken) in lines.iter().zip(&own).zip(&mut taken_by_line) {
        let Some(&(d1, j, text)) = list.first() else {
            return Err(AssignError::Missing { line: line.id });
        };
        if let Some(&Some(Near { other: Some((other_line, d2)), .. })) = near.get(j) {
            if d2 <= ratio * d1 {
                return Err(AssignError::Ambiguous {
                    line: line.id,
                    label: text.id,
                    other_line,
                    distance: d1,
                    other_distance: d2,
                });
            }
        }
        if let Some(&(d2, _, other)) = list.get(1) {
            if d2 <= ratio * d1 {
                return Err(AssignError::TwoLabels {
                    line: line.id,
                    label: text.id,
                    other_label: other.id,
                    distance: d1,
                    other_distance: d2,
                });
            }
        }
        let value = match &text.parsed {
            Ok(v) => *v,
            Err(error) => {
                return Err(AssignError::Unparsable { line: line.id, label: text.id, error: error.clone() });
            }
        };
        matches.push(Match { line: line.id, label: text.id, value, distance: d1 });
        *taken = Some(text.id);
        if let Some(c) = chosen.get_mut(j) {
            *c = true;
        }
    }

    let leftovers = labels
        .iter()
        .zip(&near)
        .zip(&chosen)
        .filter(|(_, was_chosen)| !**was_chosen)
        .map(|((text, n), _)| {
            let reason = n
                .as_ref()
                .and_then(|n| {
                    let line = lines.get(n.line)?.id;
                    let taken = (*taken_by_line.get(n.line)?)?;
                    Some(LeftoverReason::NotChosen { line, taken })
                })
                .unwrap_or(LeftoverReason::NoLine);
            Leftover { label: text.id, reason }
        })
        .collect();

    Ok(Assignment { matches, leftovers })
}

/// Where a text stands with respect to the lines.
#[derive(Clone, Copy, Debug)]
struct Near {
    /// Position in `lines` of its nearest line.
    line: usize,
    /// Distance to it.
    d1: f64,
    /// The next nearest line's id and distance.
    other: Option<(usize, f64)>,
}

/// A line found by a search.
#[derive(Clone, Copy, Debug, PartialEq)]
struct Hit {
    /// Distance from the query point.
    d: f64,
    /// Position in the input, for ties.
    pos: usize,
    /// The caller's id.
    id: usize,
}

/// A load line in the spatial index (a point load is a line of no length).
#[derive(Clone, Copy, Debug)]
struct Item {
    seg: Line,
    pos: usize,
    id: usize,
}

impl rstar::RTreeObject for Item {
    type Envelope = rstar::AABB<[f64; 2]>;

    fn envelope(&self) -> Self::Envelope {
        rstar::AABB::from_corners([self.seg.p0.x, self.seg.p0.y], [self.seg.p1.x, self.seg.p1.y])
    }
}

impl rstar::PointDistance for Item {
    fn distance_2(&self, p: &[f64; 2]) -> f64 {
        segment_distance(self.seg, Point::new(p[0], p[1])).powi(2)
    }
}

/// True for a coordinate the search can square without overflow: finite
/// and below the model's limit (the R*-tree needs distances that compare).
fn usable(v: f64) -> bool {
    v.is_finite() && v.abs() < crate::model::LIMIT
}

/// How many lines at one distance from a text are looked at.
const MAX_TIES: usize = 16;

/// An R*-tree over the load lines (the `rstar` crate, which geo uses too).
struct Tree(rstar::RTree<Item>);

impl Tree {
    /// The tree of the lines with finite coordinates; `None` when there are none.
    fn new(lines: &[LoadGeom]) -> Option<Tree> {
        let items: Vec<Item> = lines
            .iter()
            .enumerate()
            .map(|(pos, l)| Item { seg: l.shape.as_line(), pos, id: l.id })
            .filter(|i| [i.seg.p0.x, i.seg.p0.y, i.seg.p1.x, i.seg.p1.y].iter().all(|v| usable(*v)))
            .collect();
        (!items.is_empty()).then(|| Tree(rstar::RTree::bulk_load(items)))
    }

    /// The nearest line to `p` and the next nearest, if any; `None` when `p`
    /// is not finite. Among lines at exactly the same distance the one given
    /// first comes first.
    fn nearest_two(&self, p: Point) -> Option<(Hit, Option<Hit>)> {
        if !(usable(p.x) && usable(p.y)) {
            return None;
        }
        let mut hits: Vec<Hit> = Vec::with_capacity(2);
        for (item, d2) in self.0.nearest_neighbor_iter_with_distance_2(&[p.x, p.y]) {
            let d = d2.sqrt();
            // Keep going past the second only while distances tie, so that
            // the tie-break by input order is exact — up to a bound, so that
            // thousands of coincident lines cannot make this quadratic (any
            // tie is ambiguous anyway).
            if hits.len() >= 2 && (d > hits[1].d || hits.len() >= MAX_TIES) {
                break;
            }
            hits.push(Hit { d, pos: item.pos, id: item.id });
        }
        hits.sort_by(|a, b| a.d.total_cmp(&b.d).then(a.pos.cmp(&b.pos)));
        let mut it = hits.into_iter();
        Some((it.next()?, it.next()))
    }
}

/// Distance from `p` to the segment `s` (to its start when it has no length).
fn segment_distance(s: Line, p: Point) -> f64 {
    let d = s.p1 - s.p0;
    let len2 = d.hypot2();
    let t = if len2 > 0.0 { ((p - s.p0).dot(d) / len2).clamp(0.0, 1.0) } else { 0.0 };
    (p - (s.p0 + d * t)).hypot()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::ForceUnit;
    use proptest::prelude::*;

    // The assignment rule is our own convention; all layouts are invented.

    /// A vertical load line with id `id` at x, from y = 0 down to y = −4.
    fn vline(id: usize, x: f64) -> LoadGeom {
        LoadGeom { id, shape: LoadShape::Segment(Line::new((x, 0.0), (x, -4.0))) }
    }

    fn text(id: usize, x: f64, y: f64, s: &str) -> LabelText {
        LabelText::new(id, Point::new(x, y), s)
    }

    fn tol() -> AssignTolerances {
        AssignTolerances::default()
    }

    /// Five loads 2 apart (ids 10…14), each labelled 0.3 to its right (ids 20…24).
    fn row() -> (Vec<LoadGeom>, Vec<LabelText>) {
        let lines = (0..5).map(|k| vline(10 + k, 2.0 * k as f64)).collect();
        let labels = (0..5)
            .map(|k| text(20 + k, 2.0 * k as f64 + 0.3, -2.0, &format!("P{} = {} kN", k + 1, 10 * (k + 1))))
            .collect();
        (lines, labels)
    }

    #[test]
    fn evenly_spaced_lines_take_the_label_beside_each() {
        let (lines, labels) = row();
        let a = assign(&lines, &labels, tol()).unwrap();
        let pairs: Vec<(usize, usize)> = a.matches.iter().map(|m| (m.line, m.label)).collect();
        assert_eq!(pairs, vec![(10, 20), (11, 21), (12, 22), (13, 23), (14, 24)]);
        let Some(LabelValue::Force(f)) = a.of_line(13).map(|m| m.value) else { panic!("a force") };
        assert_eq!((f.value, f.unit), (40.0, Some(ForceUnit::Kilonewton)));
        assert!((a.matches[0].distance - 0.3).abs() < 1e-12);
        assert!(a.leftovers.is_empty());
    }

    #[test]
    fn a_label_midway_between_two_lines_is_ambiguous() {
        let (lines, mut labels) = row();
        labels[2].centre = Point::new(5.0, -2.0); // midway between x = 4 and x = 6
        let e = assign(&lines, &labels, tol()).unwrap_err();
        assert_eq!(
            e,
            AssignError::Ambiguous { line: 12, label: 22, other_line: 13, distance: 1.0, other_distance: 1.0 }
        );
        assert_eq!(e.line(), 12);
        assert!(e.to_string().contains("from load line 13"), "{e}");
    }

    #[test]
    fn a_label_nearly_midway_is_ambiguous_but_a_clear_one_is_not() {
        let (lines, mut labels) = row();
        // 0.9 from x = 4, 1.1 from x = 6: 1.1 ≤ 1.25 × 0.9.
        labels[2].centre = Point::new(4.9, -2.0);
        assert!(matches!(assign(&lines, &labels, tol()), Err(AssignError::Ambiguous { .. })));
        // 0.8 and 1.2: 1.2 > 1.25 × 0.8 = 1.0, clear. Line 13's own label
        // (0.3) stays nearer, so label 22 is taken by line 12.
        labels[2].centre = Point::new(4.8, -2.0);
        let a = assign(&lines, &labels, tol()).unwrap();
        assert_eq!(a.of_line(12).map(|m| m.label), Some(22));
        // A stricter ratio makes the nearly-midway one clear too.
        labels[2].centre = Point::new(4.9, -2.0);
        let strict = AssignTolerances { ambiguity_ratio: 1.1, ..tol() };
        assert!(assign(&lines, &labels, strict).is_ok());
    }

    #[test]
    fn a_line_with_no_label_is_missing() {
        let (lines, mut labels) = row();
        labels.remove(3);
        assert_eq!(assign(&lines, &labels, tol()), Err(AssignError::Missing { line: 13 }));
    }

    #[test]
    fn two_labels_near_one_line_are_ambiguous() {
        let (lines, mut labels) = row();
        labels.push(text(30, 3.7, -1.0, "5 kN")); // 0.3 left of x = 4, like label 22 on the right
        match assign(&lines, &labels, tol()).unwrap_err() {
            AssignError::TwoLabels { line: 12, label: 22, other_label: 30, distance, other_distance } => {
                assert!((distance - 0.3).abs() < 1e-12 && (other_distance - 0.3).abs() < 1e-12);
            }
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn a_second_label_clearly_farther_is_left_over() {
        let (lines, mut labels) = row();
        labels.push(text(30, 4.0 - 0.6, -1.0, "5 kN")); // 0.6 from x = 4, twice label 22's distance
        let a = assign(&lines, &labels, tol()).unwrap();
        assert_eq!(a.of_line(12).map(|m| m.label), Some(22));
        assert_eq!(
            a.leftovers,
            vec![Leftover { label: 30, reason: LeftoverReason::NotChosen { line: 12, taken: 22 } }]
        );
    }

    #[test]
    fn stray_title_far_away_is_left_over() {
        let (lines, mut labels) = row();
        labels.insert(0, text(99, 4.0, 30.0, "ELEVATION 1:100"));
        let a = assign(&lines, &labels, tol()).unwrap();
        assert_eq!(a.matches.len(), 5);
        assert_eq!(
            a.leftovers,
            vec![Leftover { label: 99, reason: LeftoverReason::NotChosen { line: 12, taken: 22 } }]
        );
        // With a reach, it belongs to no line at all.
        let near_only = AssignTolerances { max_distance: 5.0, ..tol() };
        let a = assign(&lines, &labels, near_only).unwrap();
        assert_eq!(a.leftovers, vec![Leftover { label: 99, reason: LeftoverReason::NoLine }]);
    }

    #[test]
    fn a_reach_turns_a_far_label_into_a_missing_one() {
        let lines = vec![vline(1, 0.0)];
        let labels = vec![text(2, 9.0, -2.0, "5 kN")];
        assert!(assign(&lines, &labels, tol()).is_ok());
        let near_only = AssignTolerances { max_distance: 5.0, ..tol() };
        assert_eq!(assign(&lines, &labels, near_only), Err(AssignError::Missing { line: 1 }));
    }

    #[test]
    fn an_unparsable_nearest_label_is_an_error() {
        let (lines, mut labels) = row();
        labels[1] = text(21, 2.3, -2.0, "20 kNm");
        let e = assign(&lines, &labels, tol()).unwrap_err();
        match e {
            AssignError::Unparsable { line: 11, label: 21, error: LabelError::UnknownUnit { unit, .. } } => {
                assert_eq!(unit, "kNm");
            }
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn block_loads_and_inclined_lines() {
        let lines = vec![
            LoadGeom { id: 1, shape: LoadShape::Point(Point::new(0.0, 0.0)) },
            LoadGeom { id: 2, shape: LoadShape::Segment(Line::new((4.0, 0.0), (8.0, -4.0))) },
        ];
        let labels = vec![
            text(3, 6.5, -1.5, "12 kN"), // 0.5·√2 ≈ 0.71 from the inclined line
            text(4, 0.0, 0.5, "3 kips"),
        ];
        let a = assign(&lines, &labels, tol()).unwrap();
        let pairs: Vec<(usize, usize)> = a.matches.iter().map(|m| (m.line, m.label)).collect();
        assert_eq!(pairs, vec![(1, 4), (2, 3)]);
        assert!((a.matches[1].distance - 0.5 * 2f64.sqrt()).abs() < 1e-12);
    }

    #[test]
    fn a_text_on_two_lines_at_once_is_ambiguous() {
        let lines = vec![
            LoadGeom { id: 1, shape: LoadShape::Segment(Line::new((0.0, 0.0), (2.0, 2.0))) },
            LoadGeom { id: 2, shape: LoadShape::Segment(Line::new((0.0, 2.0), (2.0, 0.0))) },
        ];
        let labels = vec![text(3, 1.0, 1.0, "5 kN"), text(4, 2.0, 2.2, "5 kN")];
        assert!(matches!(
            assign(&lines, &labels, tol()),
            Err(AssignError::Ambiguous { line: 1, label: 3, other_line: 2, .. })
        ));
    }

    #[test]
    fn no_lines_leaves_every_text_over() {
        let labels = vec![text(1, 0.0, 0.0, "5 kN")];
        let a = assign(&[], &labels, tol()).unwrap();
        assert_eq!(a.leftovers, vec![Leftover { label: 1, reason: LeftoverReason::NoLine }]);
        assert_eq!(assign(&[vline(7, 0.0)], &[], tol()), Err(AssignError::Missing { line: 7 }));
    }

    #[test]
    fn non_finite_coordinates_take_part_in_nothing() {
        let mut lines = vec![vline(1, 0.0), vline(2, 5.0)];
        lines[1].shape = LoadShape::Segment(Line::new((f64::NAN, 0.0), (5.0, -4.0)));
        let labels = vec![text(3, 0.3, -1.0, "5 kN"), text(4, f64::INFINITY, 0.0, "6 kN"), text(5, 4.7, -1.0, "7 kN")];
        // Text 5 is nearest to line 1 (line 2 is skipped), behind text 3.
        assert_eq!(assign(&lines, &labels, tol()), Err(AssignError::Missing { line: 2 }));
        let a = assign(&lines[..1], &labels, tol()).unwrap();
        assert_eq!(a.leftovers.len(), 2);
        assert_eq!(a.leftovers[0], Leftover { label: 4, reason: LeftoverReason::NoLine });
        // Odd tolerances do not panic.
        let odd = AssignTolerances { ambiguity_ratio: f64::NAN, max_distance: f64::NAN };
        assert!(assign(&lines[..1], &labels, odd).is_ok());
    }

    #[test]
    fn ten_thousand_loads_and_labels() {
        let n = 10_000;
        let lines: Vec<LoadGeom> = (0..n).map(|k| vline(k, k as f64)).collect();
        let labels: Vec<LabelText> = (0..n).map(|k| text(n + k, k as f64 + 0.2, -2.0, "1 kN")).collect();
        let a = assign(&lines, &labels, tol()).unwrap();
        assert_eq!(a.matches.len(), n);
        assert!(a.matches.iter().all(|m| m.label == m.line + n));
    }

    /// The nearest two lines by trying every one.
    fn brute_nearest_two(lines: &[LoadGeom], p: Point) -> (Option<Hit>, Option<Hit>) {
        let mut all: Vec<Hit> = lines
            .iter()
            .enumerate()
            .map(|(pos, l)| Hit { d: segment_distance(l.shape.as_line(), p), pos, id: l.id })
            .collect();
        all.sort_by(|a, b| a.d.total_cmp(&b.d).then(a.pos.cmp(&b.pos)));
        (all.first().copied(), all.get(1).copied())
    }

    fn arb_line() -> impl Strategy<Value = LoadGeom> {
        (-50.0..50.0f64, -50.0..50.0f64, -10.0..10.0f64, -10.0..10.0f64, any::<bool>()).prop_map(
            |(x, y, dx, dy, point)| LoadGeom {
                id: 0,
                shape: if point {
                    LoadShape::Point(Point::new(x, y))
                } else {
                    LoadShape::Segment(Line::new((x, y), (x + dx, y + dy)))
                },
            },
        )
    }

    proptest! {
        #[test]
        fn the_tree_finds_what_trying_every_line_finds(
            mut lines in prop::collection::vec(arb_line(), 1..60),
            points in prop::collection::vec((-60.0..60.0f64, -60.0..60.0f64), 1..20),
        ) {
            for (k, l) in lines.iter_mut().enumerate() {
                l.id = 100 + k;
            }
            let tree = Tree::new(&lines).unwrap();
            for (x, y) in points {
                let p = Point::new(x, y);
                let (first, second) = tree.nearest_two(p).unwrap();
                let (bf, bs) = brute_nearest_two(&lines, p);
                prop_assert_eq!(Some(first), bf);
                prop_assert_eq!(second, bs);
            }
        }

        #[test]
        fn assignment_never_panics(
            coords in prop::collection::vec(prop_oneof![
                -1e3..1e3f64, Just(f64::NAN), Just(f64::INFINITY), Just(-1e300), Just(0.0)
            ], 0..40),
            ratio in prop_oneof![0.0..3.0f64, Just(f64::NAN), Just(f64::INFINITY)],
        ) {
            let lines: Vec<LoadGeom> = coords
                .chunks_exact(4)
                .enumerate()
                .map(|(k, c)| LoadGeom { id: k, shape: LoadShape::Segment(Line::new((c[0], c[1]), (c[2], c[3]))) })
                .collect();
            let labels: Vec<LabelText> = coords
                .chunks_exact(2)
                .enumerate()
                .map(|(k, c)| text(k, c[0], c[1], "5 kN"))
                .collect();
            let _ = assign(&lines, &labels, AssignTolerances { ambiguity_ratio: ratio, max_distance: 10.0 });
        }
    }
}
