//! The solver's vocabulary: what is asked ([`Form`], [`Condition`]) and what
//! comes back ([`Solution`]), or why nothing does ([`SolveError`]).

use std::fmt;

use kurbo::{Point, Vec2};
use serde::Serialize;
use thiserror::Error;

/// Which way the funicular carries its loads.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Form {
    /// Pure tension, hanging below the chord between the supports.
    Cable,
    /// Pure compression, standing above the chord.
    Arch,
}

impl Form {
    /// `+1` for a cable, `−1` for an arch: the sign of the x-component of
    /// every segment's tension vector.
    #[must_use]
    pub fn sign(self) -> f64 {
        match self {
            Form::Cable => 1.0,
            Form::Arch => -1.0,
        }
    }
}

impl fmt::Display for Form {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Form::Cable => "cable",
            Form::Arch => "arch",
        })
    }
}

/// One condition that picks a member of the three-parameter family of
/// funiculars. Each fixed support point of the structure counts as a
/// condition as well; exactly three are needed in all.
///
/// Lengths are in the structure's length unit, forces in its force unit.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Condition {
    /// The profile passes through this point.
    Through(Point),
    /// The horizontal component of the force at the left support, H > 0.
    Thrust(f64),
    /// The largest vertical distance between the chord joining the two
    /// supports and the profile, f > 0: the sag of a cable or the rise of an
    /// arch.
    Sag(f64),
    /// The largest segment force (magnitude), T > 0.
    MaxForce(f64),
    /// The profile is level (zero slope) at this x: the low point of a cable
    /// or the crown of an arch lies in the segment that spans x.
    LevelAt(f64),
    /// The length of the profile between the supports, S > chord.
    Length(f64),
    /// The unstressed length of the cable (needs [`SolveOptions::axial_stiffness`]).
    UnstressedLength(f64),
}

/// Loads and tolerances beyond what the structure holds.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SolveOptions {
    /// Self-weight per unit length of the profile (force per length unit),
    /// acting along the profile's own length — so the load depends on the
    /// shape. With an axial stiffness it is per unit unstressed length.
    pub self_weight: Option<f64>,
    /// Axial stiffness EA (force), for the unstressed length of a cable.
    pub axial_stiffness: Option<f64>,
    /// Largest distance (drawing units) between the drawn profile and the
    /// exact curve where loads are continuous; `None`: the span / 10,000.
    pub chord_tolerance: Option<f64>,
    /// The self-weight iteration stops when no panel load changes by more
    /// than this fraction of the total load (default 1e-13).
    pub iteration_tolerance: f64,
    /// Most self-weight iterations (default 200).
    pub max_iterations: usize,
}

impl Default for SolveOptions {
    fn default() -> Self {
        SolveOptions {
            self_weight: None,
            axial_stiffness: None,
            chord_tolerance: None,
            iteration_tolerance: 1e-13,
            max_iterations: 200,
        }
    }
}

/// What a node of the polygon is.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum NodeKind {
    /// A support (first and last node).
    Support,
    /// Where point load `k` (index into the structure's loads) acts.
    Load(usize),
    /// A panel point of a continuous load (distributed load, self-weight):
    /// the nodal loads there are statically equivalent to the continuous
    /// load, so the node lies exactly on the continuous funicular.
    Panel,
}

/// The largest force along the profile and where it acts.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Peak {
    /// Its magnitude (≥ every segment's force).
    pub force: f64,
    /// Where.
    pub at: Point,
}

/// A condition as the solver used it, for reports.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct UsedCondition {
    /// `left-support`, `right-support`, `through`, `thrust`, `sag`, `rise`,
    /// `max-force`, `level-at`, `length` or `unstressed-length`.
    pub kind: &'static str,
    /// The point, for point conditions.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub point: Option<[f64; 2]>,
    /// The value (length, force or x), for the others.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub value: Option<f64>,
}

/// One straight segment of the funicular polygon.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Segment {
    /// Axial force, tension positive (negative in an arch).
    pub force: f64,
    /// Length of the segment.
    pub length: f64,
    /// Tension vector tₖ = O − aₖ: the force the segment exerts on its left
    /// end node, pointing from the left end to the right end for a cable.
    pub vector: Vec2,
}

/// Where the largest vertical chord-to-profile distance occurs.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Sag {
    /// The distance, > 0 (sag of a cable, rise of an arch).
    pub value: f64,
    /// Its x (always at a node of the polygon).
    pub x: f64,
    /// The chord's y at `x`.
    pub chord_y: f64,
    /// The profile's y at `x`.
    pub profile_y: f64,
}

/// The height found for a tower axis.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct TowerFound {
    /// 0 for the left support, 1 for the right.
    pub side: usize,
    /// Where the profile meets the axis.
    pub at: Point,
    /// `at.y` minus the y of the axis line's lower end.
    pub height: f64,
    /// How far `at` lies above the drawn axis line's upper end (negative
    /// when below it).
    pub above_top: f64,
}

/// How well the solution satisfies what it must.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Checks {
    /// Largest force imbalance at any node, divided by the total load.
    pub equilibrium: f64,
    /// For vertical loads: the largest difference between the polygon's
    /// ordinates and the closed form y = chord(x) ∓ M(x)/H (M the simple-beam
    /// moment, Beer & Johnston, *Vector Mechanics for Engineers: Statics*,
    /// §7.8–7.9), divided by the span. `None` when some load is inclined.
    pub closed_form: Option<f64>,
    /// Largest residual of the conditions, relative to their scale.
    pub conditions: f64,
}

impl Checks {
    /// Self-check figures above this earn a warning.
    pub const WARN: f64 = 1e-9;

    /// The warning when any figure is looser than [`Checks::WARN`].
    #[must_use]
    pub fn warning(&self) -> Option<String> {
        let loose = self.equilibrium > Self::WARN
            || self.closed_form.unwrap_or(0.0) > Self::WARN
            || self.conditions > Self::WARN;
        loose.then(|| {
            format!(
                "the self-checks are looser than 1e-9 (equilibrium {}, closed form {}, conditions {}): treat the result with care",
                crate::model::fmt_num(self.equilibrium),
                self.closed_form.map_or_else(|| "n/a".to_string(), crate::model::fmt_num),
                crate::model::fmt_num(self.conditions)
            )
        })
    }
}

/// A funicular polygon and its force diagram.
#[derive(Clone, Debug, PartialEq)]
pub struct Solution {
    /// Cable or arch.
    pub form: Form,
    /// Load line a₀ … aₙ in force space (force units), a₀ at the origin and
    /// aₖ = aₖ₋₁ + Pₖ: n + 1 points. With continuous loads the Pₖ are the
    /// nodal loads of the n interior nodes (the loads at the supports are in
    /// [`Solution::at_supports`]).
    pub load_line: Vec<Point>,
    /// The pole O in force space.
    pub pole: Point,
    /// Where the closing line (through O, parallel to the chord joining the
    /// supports) meets the line a₀aₙ, in force space; `None` if parallel.
    pub closing_point: Option<Point>,
    /// Polygon nodes: the left support, one node per load left to right, the
    /// right support: n + 2 points. With continuous loads, one node per panel
    /// point (see [`Solution::node_kinds`]), each on the exact curve.
    pub nodes: Vec<Point>,
    /// Segments between consecutive nodes: n + 1.
    pub segments: Vec<Segment>,
    /// Force of each support on the structure, left then right.
    pub reactions: [Vec2; 2],
    /// Horizontal component of the force at the left support (> 0). For
    /// vertical loads (and continuous ones) it is the same in every segment:
    /// the pole distance H.
    pub thrust: f64,
    /// The largest vertical chord-to-profile distance and where.
    pub sag: Sag,
    /// Index of the segment with the largest force magnitude.
    pub max_segment: usize,
    /// Heights found where a support is a tower axis.
    pub towers: Vec<TowerFound>,
    /// The conditions, as used.
    pub conditions: Vec<UsedCondition>,
    /// What each node is (as many as `nodes`).
    pub node_kinds: Vec<NodeKind>,
    /// Length of the profile: of the exact curve where loads are continuous,
    /// else of the polygon.
    pub profile_length: f64,
    /// Unstressed length, when an axial stiffness is given.
    pub unstressed_length: Option<f64>,
    /// Self-weight iterations taken (0 without self-weight).
    pub iterations: usize,
    /// The largest force along the profile (at a support, for a cable under
    /// downward loads) — for continuous loads larger than any segment's.
    pub peak: Peak,
    /// Load carried straight into each support by continuous loads at the
    /// ends (already in `reactions`, not in the polygon's load line).
    pub at_supports: [f64; 2],
    /// Self-checks of the result.
    pub checks: Checks,
    /// Things the user should know (a second solution exists, …).
    pub warnings: Vec<String>,
    /// How far the designer's sketch lies from this profile, when one was
    /// followed ([`super::follow_sketch`]).
    pub sketch: Option<SketchFit>,
}

/// The designer's sketch against the funicular: vertical deviations of the
/// sketch's vertices from the profile, in the structure's length unit.
#[derive(Clone, Debug, PartialEq)]
pub struct SketchFit {
    /// Vertices of the sketch on the span (between the supports' x), the
    /// ones measured.
    pub points_used: usize,
    /// Root mean square of the deviations.
    pub rms: f64,
    /// The largest deviation (magnitude).
    pub max: f64,
    /// The sketch's vertex where the largest deviation occurs.
    pub at: Point,
    /// The conditions the sketch supplied (the least-squares fit turned into
    /// conditions of the normal solve); empty when the user's conditions were
    /// three already and the sketch was only compared.
    pub conditions_supplied: Vec<UsedCondition>,
    /// True when the profile was fitted to the sketch, false when only compared.
    pub fitted: bool,
}

impl Solution {
    /// The largest segment force magnitude.
    #[must_use]
    pub fn max_force(&self) -> f64 {
        self.segments[self.max_segment].force.abs()
    }

    /// Length of the profile (see [`Solution::profile_length`]).
    #[must_use]
    pub fn length(&self) -> f64 {
        self.profile_length
    }
}

/// Why no funicular could be found.
#[derive(Debug, Error, PartialEq)]
pub enum SolveError {
    /// Not exactly three conditions.
    #[error("{given} condition(s) given ({list}); a funicular needs exactly 3. {advice}")]
    Count {
        /// How many were given.
        given: usize,
        /// The conditions given, described.
        list: String,
        /// What to add or drop.
        advice: String,
    },
    /// Conditions that fix the same thing, or contradict each other.
    #[error("the conditions {list} {problem}; {advice}")]
    Dependent {
        /// The conditions involved, described.
        list: String,
        /// What is wrong with them.
        problem: String,
        /// What to do.
        advice: String,
    },
    /// A condition with a value that cannot be right (negative sag, x outside the span).
    #[error("{condition}: {problem}")]
    BadValue {
        /// The condition, described.
        condition: String,
        /// What is wrong and what to do.
        problem: String,
    },
    /// A sketch that cannot be followed (too few vertices on the span, bent
    /// the wrong way, or with conditions or loads that make the fit nonlinear).
    #[error("the sketch: {problem}")]
    Sketch {
        /// What is wrong and what to do.
        problem: String,
    },
    /// The conditions are consistent but no funicular of the asked form meets them.
    #[error("no {form} meets the conditions {list}: {reason}")]
    NoSolution {
        /// Cable or arch.
        form: Form,
        /// The conditions, described.
        list: String,
        /// Why, and what to change.
        reason: String,
    },
}
