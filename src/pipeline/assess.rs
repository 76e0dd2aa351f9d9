//! The whole assessment of one drawing, bytes in and plan out: scan, read
//! the arch, slice it, find its thrust lines and margins, lay out, write.

use kurbo::{Point, Vec2};

use super::{ForceValue, LengthValue};
use crate::arch::outline::Outline;
use crate::arch::slice::{Cuts, Division, SliceOptions, Sliced, slice};
use crate::arch::thrust::{self, LoadFactor, Thinnest, ThrustRange};
use crate::arch::{BlockLoad, LoadKind, Ring, ThrustLine};
use crate::dxf::File;
use crate::error::Error;
use crate::layout::Placement;
use crate::layout::assess::{AssessView, LineKind, Shown, assess_layout};
use crate::layout::{Additions, LayoutOptions};
use crate::read::arch::{ArchReadOptions, ArchReading, read_arch, scan_options};
use crate::units::{ForceUnit, LengthUnit, Units};
use crate::write::{OutputLayers, Plan, Summary, plan};

/// A weight per volume as given (`24 kN/m3`).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct UnitWeight {
    /// The value.
    pub value: f64,
    /// Its force unit.
    pub force: ForceUnit,
    /// Its length unit (cubed).
    pub length: LengthUnit,
}

impl UnitWeight {
    /// The weight per volume in force units per drawing unit cubed.
    #[must_use]
    pub fn in_units(&self, units: Units) -> f64 {
        self.value * self.force.factor_to(units.force) / self.length.factor_to(units.length).powi(3)
    }
}

/// How many voussoirs: a number, or a target size along the centre line.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Voussoirs {
    /// This many.
    Count(usize),
    /// About this long each.
    Size(LengthValue),
}

/// A trial thrust line: the thrust and where it crosses the springings.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Trial {
    /// The horizontal thrust.
    pub thrust: ForceValue,
    /// Position across the left springing joint (0 intrados, 1 extrados).
    pub left: f64,
    /// Position across the right springing joint.
    pub right: f64,
}

/// A live point load whose collapse factor is wanted.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Live {
    /// Its magnitude (acting straight down).
    pub load: ForceValue,
    /// Its x; `None` runs it across the arch for the worst place.
    pub at: Option<f64>,
}

/// What to do with a drawing of an arch.
#[derive(Clone, Debug, PartialEq)]
pub struct AssessJob {
    /// How to read it.
    pub read: ArchReadOptions,
    /// Unit weight of the masonry.
    pub unit_weight: UnitWeight,
    /// Width of the arch out of the drawing's plane (default 1 m).
    pub width: LengthValue,
    /// Unit weight of the fill, when a fill layer is drawn.
    pub fill_weight: Option<UnitWeight>,
    /// Radial or vertical joints.
    pub cuts: Cuts,
    /// How many voussoirs.
    pub voussoirs: Voussoirs,
    /// A trial thrust line to trace.
    pub trial: Option<Trial>,
    /// A live load to find the collapse factor of.
    pub live: Option<Live>,
    /// Layout choices.
    pub layout: LayoutOptions,
    /// The force polygon's scale as given.
    pub force_scale: Option<ForceValue>,
    /// Output layer names.
    pub layers: OutputLayers,
}

/// The default number of voussoirs: fine enough that the least thickness of
/// a semicircular arch is within about 1 % of its limit (see the convergence
/// test in [`crate::arch::thrust`]), coarse enough to read on a drawing.
pub const DEFAULT_VOUSSOIRS: usize = 48;

/// The live load's collapse factor, where it is worst.
#[derive(Clone, Debug)]
pub struct LiveResult {
    /// The load in force units (downward).
    pub load: f64,
    /// Where it acts (x).
    pub x: f64,
    /// The voussoir it acts on.
    pub block: usize,
    /// The factor and the thrust line at collapse.
    pub factor: LoadFactor,
    /// When swept: (x, factor) at each place tried (`None`: no collapse).
    pub sweep: Vec<(f64, Option<f64>)>,
    /// Places of the sweep the solver could not settle, and why.
    pub skipped: Vec<String>,
}

/// The assessment's results.
#[derive(Clone, Debug)]
pub struct Assessment {
    /// The arch's outline.
    pub outline: Outline,
    /// The voussoirs with their loads.
    pub sliced: Sliced,
    /// Masonry weight per drawing unit² of the drawn section (force units).
    pub weight_per_area: f64,
    /// Fill weight per drawing unit² (force units).
    pub fill_weight_per_area: f64,
    /// The least and greatest thrust lines, if any fits.
    pub range: Option<ThrustRange>,
    /// The least thickness (loads held).
    pub thinnest: Thinnest,
    /// A thrust line within the middle third, if any.
    pub middle_third: Option<ThrustLine>,
    /// The trial line, when asked.
    pub trial: Option<ThrustLine>,
    /// The live load's factor, when asked.
    pub live: Option<LiveResult>,
    /// Things the user should know.
    pub warnings: Vec<String>,
}

/// What came of an assessment.
#[derive(Clone, Debug)]
pub struct AssessOutcome {
    /// What was read.
    pub reading: ArchReading,
    /// The results.
    pub assessment: Assessment,
    /// Where the force polygon went.
    pub placement: Placement,
    /// What the writer did.
    pub summary: Summary,
    /// Everything added to the drawing, as shapes (for a preview).
    pub additions: Additions,
}

/// Runs the assessment on `bytes` up to the plan of the output.
pub fn prepare_assess(bytes: &[u8], job: &AssessJob) -> Result<(AssessOutcome, Plan), Error> {
    let file = File::scan(bytes, &scan_options(&job.read.layers, job.layers.all()))?;
    let mut reading = read_arch(&file, &job.read)?;
    let assessment = assess(&reading, job)?;
    let units = reading.units;
    let mut layout_options = job.layout;
    if let Some(f) = job.force_scale {
        layout_options.force_scale = Some(f.value * f.unit.map_or(1.0, |u| u.factor_to(units.force)));
    }
    if let Some(note) = super::dimension_scale_note(&file) {
        layout_options.literal_dimension_text = true;
        reading.warnings.push(note);
    }
    let view = view(&assessment, units);
    let (additions, placement) = assess_layout(&view, reading.extents, &layout_options);
    let (plan, summary) = plan(&file, &additions, &job.layers)?;
    Ok((AssessOutcome { reading, assessment, placement, summary, additions }, plan))
}

/// Runs the assessment on `bytes`, writing the output drawing to `out`.
pub fn run_assess(bytes: &[u8], job: &AssessJob, out: &mut dyn std::io::Write) -> Result<AssessOutcome, Error> {
    let (outcome, plan) = prepare_assess(bytes, job)?;
    plan.apply(bytes, out).map_err(crate::write::WriteError::from)?;
    Ok(outcome)
}

/// The pure part: outline, slices, thrust lines, margins.
pub fn assess(reading: &ArchReading, job: &AssessJob) -> Result<Assessment, Error> {
    let units = reading.units;
    let mut warnings = Vec::new();
    let outline = Outline::new(reading.intrados.points.clone(), reading.extrados.points.clone())?;
    let width = job.width.value * job.width.unit.map_or(1.0, |u| u.factor_to(units.length));
    if !(width.is_finite() && width > 0.0) {
        return Err(Error::Condition(format!("the arch's width is {}; give a positive --width", job.width.value)));
    }
    let weight_per_area = job.unit_weight.in_units(units) * width;
    if !(weight_per_area.is_finite() && weight_per_area >= 0.0) {
        return Err(Error::Condition(format!(
            "the masonry's unit weight is {}; give a positive --unit-weight such as '22 kN/m3'",
            job.unit_weight.value
        )));
    }
    if weight_per_area == 0.0 && reading.fill.is_empty() && reading.loads.is_empty() && reading.distributed.is_empty() {
        return Err(Error::Condition(format!(
            "the arch carries nothing: its unit weight is zero and layers {} and {} hold no loads; give --unit-weight such as '22 kN/m3'",
            job.read.layers.fill, job.read.layers.loads
        )));
    }
    let fill_weight_per_area = match (job.fill_weight, reading.fill.is_empty()) {
        (Some(w), _) => w.in_units(units) * width,
        (None, false) => {
            return Err(Error::Condition(format!(
                "the drawing has {} fill region(s) on layer {} but no --fill-weight; give the fill's unit weight such as '18 kN/m3'",
                reading.fill.len(),
                job.read.layers.fill
            )));
        }
        (None, true) => 0.0,
    };
    if job.fill_weight.is_some() && reading.fill.is_empty() {
        warnings.push(format!("--fill-weight was given but layer {} holds no fill region", job.read.layers.fill));
    }
    let division = match job.voussoirs {
        Voussoirs::Count(n) => Division::Count(n),
        Voussoirs::Size(l) => Division::Size(l.value * l.unit.map_or(1.0, |u| u.factor_to(units.length))),
    };
    let options = SliceOptions { cuts: job.cuts, division, weight_per_area, fill_weight_per_area };
    let fill: Vec<Vec<Point>> = reading.fill.iter().map(|(p, _)| p.clone()).collect();
    let sliced = slice(&outline, &fill, &reading.loads, &reading.distributed, &options)?;
    warnings.extend(sliced.warnings.iter().cloned());
    let ring = &sliced.ring;

    let range = match thrust::thrust_range(ring) {
        Ok(r) => Some(r),
        Err(thrust::ThrustError::NoFit { .. }) => None,
        Err(e) => return Err(e.into()),
    };
    let thinnest = thrust::least_thickness(ring)?;
    if range.is_none() {
        warnings.push(format!(
            "no thrust line fits inside the arch as drawn: it would need {:.3} times its thickness (geometric factor of safety {:.2})",
            thinnest.ratio,
            1.0 / thinnest.ratio
        ));
    }
    let middle_third = if range.is_some() { thrust::middle_third(ring)? } else { None };
    let trial = match job.trial {
        Some(t) => {
            let h = t.thrust.value * t.thrust.unit.map_or(1.0, |u| u.factor_to(units.force));
            Some(thrust::through(ring, h, t.left, t.right)?)
        }
        None => None,
    };
    let live = match (job.live, &range) {
        (Some(l), Some(_)) => {
            let result = live_factor(ring, l, units)?;
            if !result.skipped.is_empty() {
                warnings.push(format!(
                    "the live load's sweep skipped {} place(s) the solver could not settle: {}",
                    result.skipped.len(),
                    result.skipped.join("; ")
                ));
            }
            Some(result)
        }
        (Some(_), None) => {
            warnings.push("no load factor: no thrust line fits the arch under its dead load alone".into());
            None
        }
        (None, _) => None,
    };
    Ok(Assessment {
        outline,
        sliced,
        weight_per_area,
        fill_weight_per_area,
        range,
        thinnest,
        middle_third,
        trial,
        live,
        warnings,
    })
}

/// The extrados' x range of each block: where a vertical load lands on it.
fn block_ranges(ring: &Ring) -> Vec<(f64, f64)> {
    ring.joints
        .windows(2)
        .map(|w| {
            let (a, b) = (w[0].extrados.x, w[1].extrados.x);
            (a.min(b), a.max(b))
        })
        .collect()
}

/// The live load `p` (downward) at `x` as block loads, and its block.
fn live_at(ring: &Ring, ranges: &[(f64, f64)], x: f64, p: f64) -> Option<(usize, Vec<Vec<BlockLoad>>)> {
    let k = ranges.iter().position(|&(a, b)| x >= a && x <= b)?;
    let (j0, j1) = (ring.joints[k].extrados, ring.joints[k + 1].extrados);
    let t = if j1.x != j0.x { ((x - j0.x) / (j1.x - j0.x)).clamp(0.0, 1.0) } else { 0.5 };
    let at = Point::new(x, j0.y + t * (j1.y - j0.y));
    let mut live = vec![Vec::new(); ring.blocks.len()];
    live[k].push(BlockLoad { at, force: Vec2::new(0.0, -p), kind: LoadKind::Applied });
    Some((k, live))
}

fn live_factor(ring: &Ring, live: Live, units: Units) -> Result<LiveResult, Error> {
    let p = live.load.value * live.load.unit.map_or(1.0, |u| u.factor_to(units.force));
    if !(p.is_finite() && p > 0.0) {
        return Err(Error::Condition(format!("the live load is {}; give a positive force", live.load.value)));
    }
    let ranges = block_ranges(ring);
    let (lo, hi) = ranges.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), r| (a.min(r.0), b.max(r.1)));
    match live.at {
        Some(x) => {
            let Some((block, loads)) = live_at(ring, &ranges, x, p) else {
                return Err(Error::Condition(format!(
                    "the live load's x = {} is off the arch, whose extrados runs from x = {} to x = {}; give --live-at within it",
                    crate::model::fmt_num(x),
                    crate::model::fmt_num(lo),
                    crate::model::fmt_num(hi)
                )));
            };
            let factor = thrust::load_factor(ring, &loads)?;
            Ok(LiveResult { load: p, x, block, factor, sweep: Vec::new(), skipped: Vec::new() })
        }
        None => {
            // One place per voussoir: at the middle of its extrados.
            let mut sweep = Vec::new();
            let mut skipped = Vec::new();
            let mut worst: Option<LiveResult> = None;
            // The places are independent programmes: solved in parallel,
            // then read in order (the same result on any number of cores).
            use rayon::prelude::*;
            let tried: Vec<_> = ranges
                .par_iter()
                .map(|&(a, b)| {
                    let x = 0.5 * (a + b);
                    live_at(ring, &ranges, x, p).map(|(block, loads)| (x, block, thrust::load_factor(ring, &loads)))
                })
                .collect();
            for (x, block, result) in tried.into_iter().flatten() {
                // One place the solver cannot settle does not stop the sweep.
                let factor = match result {
                    Ok(f) => f,
                    Err(e @ thrust::ThrustError::Solver { .. }) => {
                        skipped.push(format!("x = {} ({e})", crate::model::fmt_num(x)));
                        continue;
                    }
                    Err(e) => return Err(e.into()),
                };
                sweep.push((x, factor.factor));
                let better = match (&worst, factor.factor) {
                    (None, _) => true,
                    (Some(w), Some(f)) => w.factor.factor.is_none_or(|g| f < g),
                    (Some(_), None) => false,
                };
                if better {
                    worst = Some(LiveResult { load: p, x, block, factor, sweep: Vec::new(), skipped: Vec::new() });
                }
            }
            let mut worst = worst.ok_or_else(|| Error::Condition("the arch has no voussoir to load".into()))?;
            worst.sweep = sweep;
            worst.skipped = skipped;
            Ok(worst)
        }
    }
}

/// What the layout draws, from the results.
fn view(a: &Assessment, units: Units) -> AssessView<'_> {
    let mut lines = Vec::new();
    if let Some(r) = &a.range {
        lines.push(Shown { kind: LineKind::Min, line: &r.min, joints: None, extra: None });
        if let Some(max) = &r.max {
            lines.push(Shown { kind: LineKind::Max, line: max, joints: None, extra: None });
        }
    }
    if let Some(t) = &a.trial {
        lines.push(Shown { kind: LineKind::Trial, line: t, joints: None, extra: None });
    }
    lines.push(Shown { kind: LineKind::Limit, line: &a.thinnest.line, joints: Some(&a.thinnest.joints), extra: None });
    if let Some(l) = &a.live
        && let (Some(f), Some(line)) = (l.factor.factor, &l.factor.line)
    {
        lines.push(Shown {
            kind: LineKind::Collapse,
            line,
            joints: None,
            extra: Some((l.block, Vec2::new(0.0, -f * l.load))),
        });
    }
    AssessView { units, ring: &a.sliced.ring, lines, notes: notes(a, units) }
}

/// The results in words, for the drawing.
pub fn notes(a: &Assessment, units: Units) -> Vec<String> {
    use crate::layout::nice::fmt_force;
    let f = |v: f64| fmt_force(v, units.force);
    let mut n = Vec::new();
    match &a.range {
        Some(r) => {
            let max = r.max.as_ref().map_or("unbounded".to_string(), |m| f(m.horizontal));
            n.push(format!("Horizontal thrust: least {}, greatest {max}", f(r.min.horizontal)));
        }
        None => n.push("No thrust line fits inside the arch as drawn".into()),
    }
    let ratio = a.thinnest.ratio;
    if ratio > 1.0 {
        n.push(format!(
            "It would need {ratio:.3} times its thickness (geometric factor of safety {:.2}): under these hypotheses it cannot stand",
            1.0 / ratio
        ));
    } else if ratio < 1e-3 {
        n.push("A thrust line runs along the centre line: the least thickness is below 0.001 of the drawn one".into());
    } else {
        n.push(format!(
            "Geometric factor of safety {:.2} (least thickness {ratio:.3} of the drawn thickness)",
            1.0 / ratio
        ));
    }
    n.push(if a.middle_third.is_some() {
        "A thrust line fits within the middle third (common practice rule)".into()
    } else {
        "No thrust line fits within the middle third (common practice rule)".into()
    });
    if let Some(l) = &a.live {
        match l.factor.factor {
            Some(fac) => n.push(format!(
                "Live load {} at x = {}: collapse at {:.2} times it",
                f(l.load),
                crate::layout::nice::fmt_length(l.x, units.length),
                fac
            )),
            None => n.push(format!("Live load {}: no collapse at any factor", f(l.load))),
        }
    }
    n
}
