//! The machine-readable report (`--report FILE.json`).
//!
//! Keys scripts rely on, and their meaning (lengths in `units.length`, forces
//! in `units.force`, y up):
//! * `structure`: `"cable"` or `"arch"`;
//! * `units`: `{ "length", "force" }`;
//! * `thrust`: H > 0, the horizontal force at the left support (for vertical
//!   loads the same in every segment);
//! * `supports`: left then right, each `{ x, y, kind, reaction: { x, y } }`,
//!   the reaction being the force of the support on the structure;
//! * `nodes`: `{ x, y }` from the left support to the right support inclusive;
//! * `segments`: `{ force, length, name }` in the same order, force axial
//!   and tension positive;
//! * `conditions`: the three conditions used.
//!
//! Besides: `span`, `length` (of the profile), `max_force`, `sag` (or
//! `rise`), `towers`, `clearance`, `loads` as read, `force_diagram`,
//! `checks`, `warnings` and the `caution`; with `--strength` or
//! `--catalogue`, `sizing` (see [`crate::sizing::Sizing`]: `format`,
//! `factors`, `material`, `governing`, `size`, `resistance`, `utilisation`,
//! `overloaded`, `segments`, `warnings`, `caution`).

pub mod assess;

use serde::Serialize;

use crate::carry::{Carried, Share};
use crate::layout::Placement;
use crate::layout::nice::member_name;
use crate::model::Support;
use crate::model::fmt_num;
use crate::read::{Reading, StretchRead};
use crate::solve::{Checks, Clearance, Solution, UsedCondition};
use crate::units::Units;

/// The caution every report carries.
pub const CAUTION: &str = "hangline is a preliminary design aid: its results must be checked by a qualified engineer under the local codes before they are used.";

/// One design alternative in the report: what the comparison table shows.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct AlternativeOut {
    /// Its name, also the suffix of its layers (`SAG-4_5`).
    pub name: String,
    /// The condition that differs, in words (`sag 4.5`).
    pub condition: String,
    /// Horizontal thrust.
    pub thrust: f64,
    /// The largest force along the profile.
    pub max_force: f64,
    /// Sag or rise.
    pub sag: f64,
    /// Heights found for tower axes: `{ side, height }`.
    pub towers: Vec<TowerHeightOut>,
    /// Profile length.
    pub length: f64,
    /// The profile's nodes.
    pub nodes: Vec<Xy>,
}

/// A tower height of an alternative.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct TowerHeightOut {
    /// 0 left, 1 right.
    pub side: usize,
    /// Height above the axis line's foot.
    pub height: f64,
}

impl Report {
    /// The report with the alternatives' rows.
    #[must_use]
    pub fn with_alternatives(mut self, alternatives: &[crate::pipeline::Alternative]) -> Report {
        self.alternatives = alternatives
            .iter()
            .map(|a| AlternativeOut {
                name: a.name.clone(),
                condition: a.given.words(),
                thrust: a.solution.thrust,
                max_force: a.solution.max_force().max(a.solution.peak.force),
                sag: a.solution.sag.value,
                towers: a.solution.towers.iter().map(|t| TowerHeightOut { side: t.side, height: t.height }).collect(),
                length: a.solution.length(),
                nodes: a.solution.nodes.iter().map(|&p| p.into()).collect(),
            })
            .collect();
        self
    }
}

/// An x, y pair.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Xy {
    /// x.
    pub x: f64,
    /// y.
    pub y: f64,
}

impl From<kurbo::Point> for Xy {
    fn from(p: kurbo::Point) -> Xy {
        Xy { x: p.x, y: p.y }
    }
}

impl From<kurbo::Vec2> for Xy {
    fn from(p: kurbo::Vec2) -> Xy {
        Xy { x: p.x, y: p.y }
    }
}

impl InputOut {
    fn new(input: &str, reading: &Reading) -> InputOut {
        InputOut {
            file: input.to_string(),
            version: reading.release.name(),
            binary: reading.binary,
            length_unit_from: reading.length_source.clone(),
            force_unit_from: reading.force_source.clone(),
        }
    }
}

/// A support in the report.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SupportOut {
    /// x of the support.
    pub x: f64,
    /// y of the support (found, for a tower axis).
    pub y: f64,
    /// `point` or `tower-axis`.
    pub kind: &'static str,
    /// Force of the support on the structure.
    pub reaction: Xy,
    /// The entity's handle.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub handle: Option<String>,
}

/// A segment in the report.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SegmentOut {
    /// Axial force, tension positive.
    pub force: f64,
    /// Length.
    pub length: f64,
    /// Bow's notation name (spaces on either side).
    pub name: String,
}

/// A load in the report.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct LoadOut {
    /// Where the profile meets its line of action.
    pub node: Xy,
    /// The force vector.
    pub force: Xy,
    /// Its magnitude.
    pub magnitude: f64,
    /// Bow's notation name.
    pub name: String,
    /// The label as read.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub label: Option<String>,
    /// The load line's or block's handle.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub handle: Option<String>,
}

/// The largest force.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct MaxForce {
    /// Its magnitude.
    pub value: f64,
    /// Index into `segments`.
    pub segment: usize,
    /// Bow's notation name.
    pub name: String,
}

/// Sag or rise.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct SagOut {
    /// Largest vertical chord-to-profile distance.
    pub value: f64,
    /// Where.
    pub x: f64,
    /// Chord's y there.
    pub chord_y: f64,
    /// Profile's y there.
    pub profile_y: f64,
}

/// The largest force and where.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct PeakOut {
    /// Its magnitude.
    pub force: f64,
    /// Where.
    pub at: Xy,
}

/// A distributed load as read.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct StretchOut {
    /// Left end.
    pub x0: f64,
    /// Right end.
    pub x1: f64,
    /// Intensity at x0 (force units per length unit).
    pub w0: f64,
    /// Intensity at x1.
    pub w1: f64,
    /// Resultant.
    pub total: f64,
    /// The label as read.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub label: Option<String>,
    /// The intensities as written and their unit.
    pub written: String,
    /// The load line's handle.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub handle: Option<String>,
}

impl From<&StretchRead> for StretchOut {
    fn from(r: &StretchRead) -> StretchOut {
        let unit = format!("{}/{}", r.force_unit, r.length_unit);
        let written = if r.written.0 == r.written.1 {
            format!("{} {unit}", fmt_num(r.written.0))
        } else {
            format!("{} to {} {unit}", fmt_num(r.written.0), fmt_num(r.written.1))
        };
        StretchOut {
            x0: r.x0,
            x1: r.x1,
            w0: r.w0,
            w1: r.w1,
            total: 0.5 * (r.w0 + r.w1) * (r.x1 - r.x0),
            label: r.label.clone(),
            written,
            handle: r.origin.handle.clone(),
        }
    }
}

/// A tower height found.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct TowerOut {
    /// `left` or `right`.
    pub side: &'static str,
    /// x of the axis.
    pub x: f64,
    /// Where the profile meets the axis.
    pub y: f64,
    /// Height above the drawn axis's lower end.
    pub height: f64,
    /// How far above the drawn axis's upper end (negative: below it).
    pub above_top: f64,
}

/// The force diagram as drawn.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct DiagramOut {
    /// Force units per drawing unit.
    pub scale: f64,
    /// Where point a (top of the load line) was drawn.
    pub at: Xy,
}

/// Where the input came from.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct InputOut {
    /// The input file as given.
    pub file: String,
    /// Its release.
    pub version: &'static str,
    /// True for binary DXF.
    pub binary: bool,
    /// How the length unit was decided.
    pub length_unit_from: String,
    /// How the force unit was decided.
    pub force_unit_from: String,
}

/// The whole report.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Report {
    /// Tool and version.
    pub tool: String,
    /// The caution.
    pub caution: &'static str,
    /// The input.
    pub input: InputOut,
    /// `cable` or `arch`.
    pub structure: String,
    /// Units of every number.
    pub units: Units,
    /// Horizontal force at the left support.
    pub thrust: f64,
    /// Horizontal distance between the supports.
    pub span: f64,
    /// Length of the profile.
    pub length: f64,
    /// Unstressed length, when an axial stiffness was given.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub unstressed_length: Option<f64>,
    /// Self-weight iterations (0 without self-weight).
    pub iterations: usize,
    /// The largest force along the profile and where.
    pub peak: PeakOut,
    /// Distributed loads as read.
    pub distributed: Vec<StretchOut>,
    /// What each hanger position received from the distributed loads.
    pub hangers: Vec<Share>,
    /// Distributed load carried straight into the left and right supports.
    pub to_supports: [f64; 2],
    /// Left and right support.
    pub supports: Vec<SupportOut>,
    /// Profile nodes, left support to right support.
    pub nodes: Vec<Xy>,
    /// Segments between nodes.
    pub segments: Vec<SegmentOut>,
    /// Loads left to right.
    pub loads: Vec<LoadOut>,
    /// The largest force.
    pub max_force: MaxForce,
    /// Sag of a cable.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub sag: Option<SagOut>,
    /// Rise of an arch.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub rise: Option<SagOut>,
    /// Tower heights found.
    pub towers: Vec<TowerOut>,
    /// Clearance to the deck.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub clearance: Option<Clearance>,
    /// The conditions used.
    pub conditions: Vec<UsedCondition>,
    /// The force diagram.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub force_diagram: Option<DiagramOut>,
    /// The designer's sketch against the profile, when one was drawn.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub sketch: Option<SketchOut>,
    /// Self-checks.
    pub checks: Checks,
    /// Warnings from reading and solving.
    pub warnings: Vec<String>,
    /// Design alternatives (a condition given as a list): one row each.
    #[serde(skip_serializing_if = "Vec::is_empty")]
    pub alternatives: Vec<AlternativeOut>,
    /// The members' sizes, when asked for (see [`crate::sizing`]).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub sizing: Option<crate::sizing::Sizing>,
}

/// Builds the report of a whole job, with the sizing when there is one.
#[must_use]
pub fn outcome_report(input: &str, outcome: &crate::pipeline::Outcome) -> Report {
    let mut r = report(input, &outcome.reading, &outcome.carried, &outcome.solution, Some(&outcome.placement));
    r.sizing.clone_from(&outcome.sizing);
    r.with_alternatives(&outcome.alternatives)
}

/// The sketch's vertical deviations from the profile (sketch minus profile,
/// as magnitudes), in the drawing's length unit.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SketchOut {
    /// `fitted` (the sketch supplied conditions) or `compared` (three were given).
    pub mode: &'static str,
    /// Vertices of the sketch between the supports, the ones measured.
    pub points_used: usize,
    /// Root mean square deviation.
    pub rms: f64,
    /// Largest deviation.
    pub max: f64,
    /// The vertex where it occurs.
    pub at: Xy,
    /// The conditions the sketch supplied.
    pub conditions_supplied: Vec<UsedCondition>,
}

/// Builds the report.
#[must_use]
pub fn report(
    input: &str,
    reading: &Reading,
    carried: &Carried,
    solution: &Solution,
    placement: Option<&Placement>,
) -> Report {
    let st = &carried.structure;
    let n = st.loads().len();
    let pole = n + 1;
    let supports = [st.left(), st.right()]
        .iter()
        .enumerate()
        .map(|(i, s)| {
            let node = if i == 0 { solution.nodes[0] } else { solution.nodes[solution.nodes.len() - 1] };
            SupportOut {
                x: node.x,
                y: node.y,
                kind: match s {
                    Support::Point { .. } => "point",
                    Support::Axis { .. } => "tower-axis",
                },
                reaction: solution.reactions[i].into(),
                handle: s.origin().handle.clone(),
            }
        })
        .collect();
    let sag = SagOut {
        value: solution.sag.value,
        x: solution.sag.x,
        chord_y: solution.sag.chord_y,
        profile_y: solution.sag.profile_y,
    };
    let is_cable = solution.form == crate::solve::Form::Cable;
    let mut warnings = reading.warnings.clone();
    warnings.extend(solution.warnings.iter().cloned());
    Report {
        tool: format!("hangline {}", env!("CARGO_PKG_VERSION")),
        caution: CAUTION,
        alternatives: Vec::new(),
        input: InputOut::new(input, reading),
        structure: solution.form.to_string(),
        units: st.units(),
        thrust: solution.thrust,
        span: st.span(),
        length: solution.length(),
        unstressed_length: solution.unstressed_length,
        iterations: solution.iterations,
        peak: PeakOut { force: solution.peak.force, at: solution.peak.at.into() },
        distributed: reading.distributed.iter().map(StretchOut::from).collect(),
        hangers: carried.shares.clone(),
        to_supports: carried.to_supports,
        supports,
        nodes: solution.nodes.iter().map(|p| Xy::from(*p)).collect(),
        segments: solution
            .segments
            .iter()
            .enumerate()
            .map(|(k, s)| SegmentOut { force: s.force, length: s.length, name: member_name(k, pole) })
            .collect(),
        loads: st
            .loads()
            .iter()
            .enumerate()
            .map(|(k, l)| {
                let read = reading.loads.iter().find(|r| r.origin == l.origin);
                LoadOut {
                    node: solution.nodes[k + 1].into(),
                    force: l.force.into(),
                    magnitude: l.magnitude(),
                    name: member_name(k, k + 1),
                    label: read.and_then(|r| r.label.clone()),
                    handle: l.origin.handle.clone(),
                }
            })
            .collect(),
        max_force: MaxForce {
            value: solution.max_force(),
            segment: solution.max_segment,
            name: member_name(solution.max_segment, pole),
        },
        sag: is_cable.then_some(sag),
        rise: (!is_cable).then_some(sag),
        towers: solution
            .towers
            .iter()
            .map(|t| TowerOut {
                side: if t.side == 0 { "left" } else { "right" },
                x: t.at.x,
                y: t.at.y,
                height: t.height,
                above_top: t.above_top,
            })
            .collect(),
        clearance: crate::solve::clearance(st, solution),
        conditions: solution.conditions.clone(),
        force_diagram: placement.map(|p| DiagramOut { scale: p.force_scale, at: p.diagram_at.into() }),
        sketch: solution.sketch.as_ref().map(|f| SketchOut {
            mode: if f.fitted { "fitted" } else { "compared" },
            points_used: f.points_used,
            rms: f.rms,
            max: f.max,
            at: f.at.into(),
            conditions_supplied: f.conditions_supplied.clone(),
        }),
        checks: solution.checks,
        warnings,
        sizing: None,
    }
}

/// A support as read, for `inspect`.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SupportRead {
    /// `point` or `tower-axis`.
    pub kind: &'static str,
    /// x of the support.
    pub x: f64,
    /// y of a point support.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub y: Option<f64>,
    /// Lower and upper y of a tower axis.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub axis: Option<[f64; 2]>,
    /// The entity's handle.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub handle: Option<String>,
    /// The layer.
    pub layer: String,
}

/// A load as read, for `inspect`.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct LoadReadOut {
    /// A point on the line of action.
    pub at: Xy,
    /// The force vector, model units.
    pub force: Xy,
    /// The magnitude, model units.
    pub magnitude: f64,
    /// The magnitude as written.
    pub written: f64,
    /// The unit as written.
    pub written_unit: crate::units::ForceUnit,
    /// The label's plain text.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub label: Option<String>,
    /// The label's handle.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub label_handle: Option<String>,
    /// The load line's or block's handle.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub handle: Option<String>,
}

/// What `inspect` shows.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Inspection {
    /// The input.
    pub input: InputOut,
    /// Units of every number.
    pub units: Units,
    /// The drawing's layers.
    pub layers: Vec<String>,
    /// The supports, left then right.
    pub supports: Vec<SupportRead>,
    /// The loads, left to right.
    pub loads: Vec<LoadReadOut>,
    /// Distributed loads as read.
    pub distributed: Vec<StretchOut>,
    /// Hanger positions (x) from the hangers layer.
    pub hanger_positions: Vec<f64>,
    /// How the distributed loads are carried: what each hanger position
    /// receives (empty when they stay continuous).
    pub shares: Vec<Share>,
    /// Distributed load carried straight into the left and right supports.
    pub to_supports: [f64; 2],
    /// Sum of the load magnitudes (point and distributed).
    pub total_load: f64,
    /// Number of deck segments (after flattening arcs).
    pub deck_segments: usize,
    /// The drawing's model-space extents [x0, y0, x1, y1].
    #[serde(skip_serializing_if = "Option::is_none")]
    pub extents: Option<[f64; 4]>,
    /// Warnings.
    pub warnings: Vec<String>,
}

/// Builds what `inspect` shows.
#[must_use]
pub fn inspection(input: &str, reading: &Reading) -> Inspection {
    let st = &reading.structure;
    let carried = crate::carry::carry(st, &reading.hangers);
    let supports = [st.left(), st.right()]
        .into_iter()
        .map(|s| {
            let o = s.origin();
            match s {
                Support::Point { at, .. } => SupportRead {
                    kind: "point",
                    x: at.x,
                    y: Some(at.y),
                    axis: None,
                    handle: o.handle.clone(),
                    layer: o.layer.clone(),
                },
                Support::Axis { x, foot, top, .. } => SupportRead {
                    kind: "tower-axis",
                    x: *x,
                    y: None,
                    axis: Some([*foot, *top]),
                    handle: o.handle.clone(),
                    layer: o.layer.clone(),
                },
            }
        })
        .collect();
    Inspection {
        input: InputOut::new(input, reading),
        units: st.units(),
        layers: reading.layers.clone(),
        supports,
        loads: reading
            .loads
            .iter()
            .map(|l| LoadReadOut {
                at: l.anchor.into(),
                force: l.force.into(),
                magnitude: l.force.hypot(),
                written: l.value,
                written_unit: l.unit,
                label: l.label.clone(),
                label_handle: l.label_origin.as_ref().and_then(|o| o.handle.clone()),
                handle: l.origin.handle.clone(),
            })
            .collect(),
        distributed: reading.distributed.iter().map(StretchOut::from).collect(),
        hanger_positions: reading.hangers.iter().map(|h| h.0).collect(),
        shares: carried.shares.clone(),
        to_supports: carried.to_supports,
        total_load: st.loads().iter().map(|l| l.magnitude()).sum::<f64>()
            + st.distributed().iter().map(crate::model::DistributedLoad::total).sum::<f64>(),
        deck_segments: st.deck().map_or(0, |d| d.segments.len()),
        extents: reading.extents.map(|r| [r.x0, r.y0, r.x1, r.y1]),
        warnings: reading.warnings.clone(),
    }
}
