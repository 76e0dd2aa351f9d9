//! The machine-readable report of an arch assessment (`hangline assess
//! --report FILE.json`).
//!
//! Keys scripts rely on (lengths in `units.length`, forces in `units.force`,
//! y up; joints numbered 0 at the left springing):
//! * `thrust.min`, `thrust.max`: the least and greatest horizontal thrust of
//!   a thrust line inside the arch, each with its `hinges` (`joint`, `face`,
//!   `at`), its `line` (the centre of pressure on each joint) and `polygon`
//!   (the funicular polygon of the voussoir loads); `thrust.max` is null when unbounded
//!   (`thrust.max_unbounded`), both null when no thrust line fits;
//! * `least_thickness`: `ratio` (least thickness ÷ drawn thickness, loads
//!   held), `geometric_factor` (= 1 / ratio), `crown` (the least thickness at
//!   the crown), `hinges`;
//! * `middle_third`: whether a thrust line fits in the middle third;
//! * `trial`: the given thrust line, where it leaves the section;
//! * `live_load`: `factor` (null: no collapse), `x`, `hinges`, `sweep`;
//! * `arch`, `voussoirs`, `loads`, `warnings`, `hypotheses`, `caution`.

use serde::Serialize;

use super::{StretchOut, Xy};
use crate::arch::{Face, Hinge, ThrustLine};
use crate::layout::assess::ASSESS_CAUTION;
use crate::pipeline::assess::{AssessJob, Assessment};
use crate::read::arch::ArchReading;
use crate::units::Units;

/// The hypotheses of the method, stated in every report.
pub const HYPOTHESES: &str = "Limit analysis of masonry (J. Heyman, 1966): no tensile strength, unlimited compressive strength, no sliding between voussoirs; the safe theorem: the arch stands if a thrust line in equilibrium with the loads lies within it.";

/// A hinge in the report.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct HingeOut {
    /// Its label on the drawing (`m1`, `M2`, …).
    pub label: String,
    /// The joint it forms at.
    pub joint: usize,
    /// The face touched.
    pub face: Face,
    /// The point of contact.
    pub at: Xy,
}

/// A thrust line in the report.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct LineOut {
    /// Horizontal thrust.
    pub horizontal: f64,
    /// The reaction at the left springing (force on the arch).
    pub left_reaction: Xy,
    /// The reaction at the right springing.
    pub right_reaction: Xy,
    /// The largest force across a joint.
    pub max_force: f64,
    /// Hinges.
    pub hinges: Vec<HingeOut>,
    /// The line of thrust: the centre of pressure on each joint, left to
    /// right (joints where the force runs along the joint left out).
    pub line: Vec<Xy>,
    /// The funicular polygon of the voussoir loads: its corners lie on the
    /// voussoirs' load lines (near a springing, possibly outside the arch).
    pub polygon: Vec<Xy>,
    /// Where it crosses each joint, 0 at the intrados and 1 at the
    /// extrados (null where it runs parallel to the joint).
    pub crossings: Vec<Option<f64>>,
}

fn hinges(h: &[Hinge], prefix: &str) -> Vec<HingeOut> {
    h.iter()
        .enumerate()
        .map(|(k, h)| HingeOut { label: format!("{prefix}{}", k + 1), joint: h.joint, face: h.face, at: h.at.into() })
        .collect()
}

impl LineOut {
    fn new(l: &ThrustLine, prefix: &str) -> LineOut {
        LineOut {
            horizontal: l.horizontal,
            left_reaction: l.left.into(),
            right_reaction: l.right.into(),
            max_force: l.forces.iter().map(|f| f.hypot()).fold(0.0, f64::max),
            hinges: hinges(&l.hinges, prefix),
            line: l.crossings.iter().flatten().map(|c| c.at.into()).collect(),
            polygon: l.polygon.iter().map(|&p| p.into()).collect(),
            crossings: l.crossings.iter().map(|c| c.map(|c| c.position)).collect(),
        }
    }
}

/// The least and greatest thrust.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ThrustOut {
    /// The least thrust line.
    pub min: Option<LineOut>,
    /// The greatest.
    pub max: Option<LineOut>,
    /// True when the thrust has no upper bound.
    pub max_unbounded: bool,
}

/// The least thickness.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ThinnestOut {
    /// Least thickness ÷ drawn thickness (loads held at the drawn arch's).
    pub ratio: f64,
    /// The geometric factor of safety, 1 / ratio.
    pub geometric_factor: f64,
    /// The least thickness at the crown.
    pub crown: f64,
    /// True when the arch as drawn holds a thrust line (ratio ≤ 1).
    pub stands: bool,
    /// The thrust line of the thinnest arch.
    pub line: LineOut,
}

/// Where a trial line leaves the section.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct LeaveOut {
    /// The joint.
    pub joint: usize,
    /// Position across it (outside 0..1).
    pub position: f64,
    /// The point.
    pub at: Xy,
}

/// The trial line.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct TrialOut {
    /// The line.
    #[serde(flatten)]
    pub line: LineOut,
    /// True when it stays within every joint.
    pub fits: bool,
    /// The joints where it is outside the section.
    pub outside: Vec<LeaveOut>,
}

/// The live load's factor.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct LiveOut {
    /// The live load (downward).
    pub load: f64,
    /// Where it acts (the worst place when swept).
    pub x: f64,
    /// The voussoir it acts on.
    pub voussoir: usize,
    /// The load factor at collapse; null when no factor brings collapse.
    pub factor: Option<f64>,
    /// The thrust line at collapse.
    pub collapse: Option<LineOut>,
    /// Each place tried when swept: x and its factor.
    pub sweep: Vec<SweepOut>,
}

/// One place of the live load's sweep.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SweepOut {
    /// x of the load.
    pub x: f64,
    /// The load factor there (null: none).
    pub factor: Option<f64>,
}

/// The arch as read.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ArchOut {
    /// Clear span between the springings of the intrados.
    pub span: f64,
    /// Rise of the intrados above its springings.
    pub rise: f64,
    /// Thickness at the crown.
    pub crown_thickness: f64,
    /// Thickness at the left and right springings.
    pub springing_thickness: [f64; 2],
    /// Area of the drawn section.
    pub area: f64,
    /// Masonry weight per unit area of the section (unit weight × width).
    pub weight_per_area: f64,
    /// Fill weight per unit area (0 when no fill).
    pub fill_weight_per_area: f64,
    /// Entity handles of the intrados pieces.
    pub intrados_handles: Vec<String>,
    /// Entity handles of the extrados pieces.
    pub extrados_handles: Vec<String>,
}

/// One voussoir.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct VoussoirOut {
    /// Its own weight.
    pub own_weight: f64,
    /// The fill it carries.
    pub fill: f64,
    /// Applied loads on it (vertical component, downward positive).
    pub applied: f64,
}

/// A point load as read.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct PointLoadOut {
    /// A point on its line of action.
    pub at: Xy,
    /// The force.
    pub force: Xy,
    /// The label as read.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub label: Option<String>,
    /// The entity's handle.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub handle: Option<String>,
}

/// Units.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct UnitsOut {
    /// Length unit.
    pub length: String,
    /// Force unit.
    pub force: String,
}

/// The whole report.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct AssessReport {
    /// Always "arch assessment".
    pub kind: &'static str,
    /// The input file.
    pub input: String,
    /// Units.
    pub units: UnitsOut,
    /// The arch.
    pub arch: ArchOut,
    /// "radial" or "vertical".
    pub cuts: &'static str,
    /// The voussoirs, left to right.
    pub voussoirs: Vec<VoussoirOut>,
    /// Point loads as read.
    pub loads: Vec<PointLoadOut>,
    /// Distributed loads as read.
    pub distributed_loads: Vec<StretchOut>,
    /// The range of thrust.
    pub thrust: ThrustOut,
    /// The least thickness.
    pub least_thickness: ThinnestOut,
    /// Whether a thrust line fits in the middle third (common practice rule).
    pub middle_third: bool,
    /// The trial line.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub trial: Option<TrialOut>,
    /// The live load's factor.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub live_load: Option<LiveOut>,
    /// Things the user should know.
    pub warnings: Vec<String>,
    /// The method's hypotheses.
    pub hypotheses: &'static str,
    /// The caution.
    pub caution: &'static str,
}

/// The report of an assessment.
#[must_use]
pub fn assess_report(input: &str, reading: &ArchReading, a: &Assessment, job: &AssessJob) -> AssessReport {
    let units: Units = reading.units;
    let o = &a.outline;
    let handles = |from: &[crate::model::Origin]| from.iter().filter_map(|o| o.handle.clone()).collect();
    let (sl, sr) = o.springing_thickness();
    let voussoirs = a
        .sliced
        .ring
        .blocks
        .iter()
        .map(|b| {
            let sum = |k: crate::arch::LoadKind| -> f64 { b.iter().filter(|l| l.kind == k).map(|l| -l.force.y).sum() };
            VoussoirOut {
                own_weight: sum(crate::arch::LoadKind::OwnWeight),
                fill: sum(crate::arch::LoadKind::Fill),
                applied: sum(crate::arch::LoadKind::Applied),
            }
        })
        .collect();
    let trial = a.trial.as_ref().map(|t| TrialOut {
        line: LineOut::new(t, "t"),
        fits: t.fits(0.0),
        outside: t
            .crossings
            .iter()
            .enumerate()
            .filter_map(|(j, c)| {
                c.filter(|c| !(0.0..=1.0).contains(&c.position)).map(|c| LeaveOut {
                    joint: j,
                    position: c.position,
                    at: c.at.into(),
                })
            })
            .collect(),
    });
    let live = a.live.as_ref().map(|l| LiveOut {
        load: l.load,
        x: l.x,
        voussoir: l.block,
        factor: l.factor.factor,
        collapse: l.factor.line.as_ref().map(|c| LineOut::new(c, "c")),
        sweep: l.sweep.iter().map(|&(x, factor)| SweepOut { x, factor }).collect(),
    });
    let mut warnings = reading.warnings.clone();
    warnings.extend(a.warnings.iter().cloned());
    AssessReport {
        kind: "arch assessment",
        input: input.to_string(),
        units: UnitsOut { length: units.length.to_string(), force: units.force.to_string() },
        arch: ArchOut {
            span: o.span(),
            rise: o.rise(),
            crown_thickness: o.crown_thickness(),
            springing_thickness: [sl, sr],
            area: o.area(),
            weight_per_area: a.weight_per_area,
            fill_weight_per_area: a.fill_weight_per_area,
            intrados_handles: handles(&reading.intrados.from),
            extrados_handles: handles(&reading.extrados.from),
        },
        cuts: match job.cuts {
            crate::arch::slice::Cuts::Radial => "radial",
            crate::arch::slice::Cuts::Vertical => "vertical",
        },
        voussoirs,
        loads: reading
            .load_reads
            .iter()
            .map(|l| PointLoadOut {
                at: l.anchor.into(),
                force: l.force.into(),
                label: l.label.clone(),
                handle: l.origin.handle.clone(),
            })
            .collect(),
        distributed_loads: reading.stretches.iter().map(StretchOut::from).collect(),
        thrust: ThrustOut {
            min: a.range.as_ref().map(|r| LineOut::new(&r.min, "m")),
            max: a.range.as_ref().and_then(|r| r.max.as_ref()).map(|m| LineOut::new(m, "M")),
            max_unbounded: a.range.as_ref().is_some_and(|r| r.max.is_none()),
        },
        least_thickness: ThinnestOut {
            ratio: a.thinnest.ratio,
            geometric_factor: 1.0 / a.thinnest.ratio,
            crown: a.thinnest.ratio * o.crown_thickness(),
            stands: a.thinnest.ratio <= 1.0,
            line: LineOut::new(&a.thinnest.line, "g"),
        },
        middle_third: a.middle_third.is_some(),
        trial,
        live_load: live,
        warnings,
        hypotheses: HYPOTHESES,
        caution: ASSESS_CAUTION,
    }
}
