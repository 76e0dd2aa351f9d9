//! The whole job on one drawing, bytes in and bytes out: scan, read, solve,
//! lay out, write. No file system here; the binary owns paths, temporary
//! files and renames.

pub mod assess;

use std::io::Write;

use kurbo::Point;

use crate::carry::{Carried, carry};
use crate::dxf::File;
use crate::error::Error;
use crate::layout::{
    Additions, Annotations, LayoutOptions, Placement, Role, Shape, Variant, compare, layout_with_notes,
};
use crate::model::ModelError;
use crate::read::{ReadOptions, Reading, read, scan_options};
use crate::solve::{Condition, Form, Solution, SolveOptions, follow_sketch, solve_with};
use crate::units::{ForceUnit, LengthUnit, Units};
use crate::write::{OutputLayers, Plan, Summary, WriteError, plan};

/// A force as given on the command line: a value and, optionally, its unit
/// (without one, the model's force unit).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ForceValue {
    /// The value.
    pub value: f64,
    /// Its unit, if written.
    pub unit: Option<ForceUnit>,
}

/// A length as given on the command line: without a unit, drawing units.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LengthValue {
    /// The value.
    pub value: f64,
    /// Its unit, if written.
    pub unit: Option<LengthUnit>,
}

/// A condition as the user gave it, before the drawing's units are known.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Given {
    /// `--through X,Y` (drawing coordinates).
    Through(f64, f64),
    /// `--thrust H`.
    Thrust(ForceValue),
    /// `--sag F`.
    Sag(LengthValue),
    /// `--rise F`.
    Rise(LengthValue),
    /// `--max-force T`.
    MaxForce(ForceValue),
    /// `--level-at X` (drawing x).
    LevelAt(f64),
    /// `--length S`.
    Length(LengthValue),
    /// `--unstressed-length S0`.
    UnstressedLength(LengthValue),
}

/// A force per length as given on the command line.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct IntensityValue {
    /// The value.
    pub value: f64,
    /// Its force unit.
    pub force: ForceUnit,
    /// Its length unit.
    pub length: LengthUnit,
}

/// What to do with a drawing.
#[derive(Clone, Debug, PartialEq)]
pub struct Job {
    /// How to read it.
    pub read: ReadOptions,
    /// Cable or arch.
    pub form: Form,
    /// The user's conditions (fixed supports count as well).
    pub given: Vec<Given>,
    /// Layout choices.
    pub layout: LayoutOptions,
    /// The force diagram's scale (force per drawing unit) as given, which
    /// overrides `layout.force_scale` once the model's force unit is known.
    pub force_scale: Option<ForceValue>,
    /// Output layer names.
    pub layers: OutputLayers,
    /// Self-weight per unit length of the profile (`--self-weight`).
    pub self_weight: Option<IntensityValue>,
    /// Axial stiffness EA (`--axial-stiffness`).
    pub axial_stiffness: Option<ForceValue>,
    /// Chord tolerance of the drawn profile for continuous loads.
    pub chord_tolerance: Option<LengthValue>,
    /// Design alternatives: one more condition each (the values of the one
    /// condition given as a list); empty for a single solution.
    pub alternatives: Vec<Given>,
    /// Member sizing (material and safety factors), if asked for.
    pub sizing: Option<crate::sizing::Spec>,
}

/// What came of a job.
#[derive(Clone, Debug)]
pub struct Outcome {
    /// What was read.
    pub reading: Reading,
    /// The loads as carried to the hangers (the structure solved).
    pub carried: Carried,
    /// The funicular.
    pub solution: Solution,
    /// Where the force diagram went.
    pub placement: Placement,
    /// What the writer did.
    pub summary: Summary,
    /// With alternatives: each one's name and funicular (the first is
    /// `solution`).
    pub alternatives: Vec<Alternative>,
    /// The members' sizes, if asked for (of the first alternative).
    pub sizing: Option<crate::sizing::Sizing>,
    /// Everything added to the drawing, as shapes (for a preview).
    pub additions: Additions,
}

/// One design alternative's result.
#[derive(Clone, Debug)]
pub struct Alternative {
    /// Its name: the condition and value as in its layers' suffix (`SAG-4_5`).
    pub name: String,
    /// The condition that differs.
    pub given: Given,
    /// The funicular.
    pub solution: Solution,
}

impl Given {
    /// The condition and its value in words, as given (`sag 4.5`,
    /// `thrust 450 kN`).
    #[must_use]
    pub fn words(&self) -> String {
        let num = crate::model::fmt_num;
        let force = |f: ForceValue| format!("{}{}", num(f.value), f.unit.map_or(String::new(), |u| format!(" {u}")));
        let length = |l: LengthValue| format!("{}{}", num(l.value), l.unit.map_or(String::new(), |u| format!(" {u}")));
        match *self {
            Given::Through(x, y) => format!("through ({}, {})", num(x), num(y)),
            Given::Thrust(f) => format!("thrust {}", force(f)),
            Given::Sag(l) => format!("sag {}", length(l)),
            Given::Rise(l) => format!("rise {}", length(l)),
            Given::MaxForce(f) => format!("largest force {}", force(f)),
            Given::LevelAt(x) => format!("level at x = {}", num(x)),
            Given::Length(l) => format!("length {}", length(l)),
            Given::UnstressedLength(l) => format!("unstressed length {}", length(l)),
        }
    }

    /// The condition and its value for a layer-name suffix and the
    /// comparison table: `SAG-4_5`, `THRUST-450KN` (R12-safe characters:
    /// letters, digits, `-` and `_`).
    #[must_use]
    pub fn tag(&self) -> String {
        let num = |v: f64| crate::model::fmt_num(v).replace('.', "_");
        let force = |f: ForceValue| format!("{}{}", num(f.value), f.unit.map_or(String::new(), |u| u.to_string()));
        let length = |l: LengthValue| format!("{}{}", num(l.value), l.unit.map_or(String::new(), |u| u.to_string()));
        let raw = match *self {
            Given::Through(x, y) => format!("THROUGH-{}_{}", num(x), num(y)),
            Given::Thrust(f) => format!("THRUST-{}", force(f)),
            Given::Sag(l) => format!("SAG-{}", length(l)),
            Given::Rise(l) => format!("RISE-{}", length(l)),
            Given::MaxForce(f) => format!("MAXFORCE-{}", force(f)),
            Given::LevelAt(x) => format!("LEVELAT-{}", num(x)),
            Given::Length(l) => format!("LENGTH-{}", length(l)),
            Given::UnstressedLength(l) => format!("UNSTRESSED-{}", length(l)),
        };
        raw.to_uppercase().chars().filter(|c| c.is_ascii_alphanumeric() || matches!(c, '-' | '_')).collect()
    }
}

/// The solver's options in the model's units.
pub fn solve_options(job: &Job, units: Units) -> SolveOptions {
    SolveOptions {
        self_weight: job
            .self_weight
            .map(|w| w.value * w.force.factor_to(units.force) / w.length.factor_to(units.length)),
        axial_stiffness: job.axial_stiffness.map(|f| f.value * f.unit.map_or(1.0, |u| u.factor_to(units.force))),
        chord_tolerance: job.chord_tolerance.map(|l| l.value * l.unit.map_or(1.0, |u| u.factor_to(units.length))),
        ..SolveOptions::default()
    }
}

/// Turns the user's conditions into the solver's, in the model's units.
pub fn conditions(given: &[Given], form: Form, units: Units) -> Result<Vec<Condition>, Error> {
    let force = |f: ForceValue| f.value * f.unit.map_or(1.0, |u| u.factor_to(units.force));
    let length = |l: LengthValue| l.value * l.unit.map_or(1.0, |u| u.factor_to(units.length));
    given
        .iter()
        .map(|g| {
            Ok(match *g {
                Given::Through(x, y) => Condition::Through(Point::new(x, y)),
                Given::Thrust(f) => Condition::Thrust(force(f)),
                Given::MaxForce(f) => Condition::MaxForce(force(f)),
                Given::LevelAt(x) => Condition::LevelAt(x),
                Given::Length(l) => Condition::Length(length(l)),
                Given::UnstressedLength(l) => Condition::UnstressedLength(length(l)),
                Given::Sag(l) if form == Form::Cable => Condition::Sag(length(l)),
                Given::Rise(l) if form == Form::Arch => Condition::Sag(length(l)),
                Given::Sag(_) => {
                    return Err(Error::Condition(
                        "--sag is for a cable; an arch rises above its chord: give --rise instead".into(),
                    ));
                }
                Given::Rise(_) => {
                    return Err(Error::Condition(
                        "--rise is for an arch (--arch); a cable sags below its chord: give --sag instead".into(),
                    ));
                }
            })
        })
        .collect()
}

/// Warnings about values that are possible but probably not meant: a sag
/// or rise below 1/1000 of the span, or above the span (a unit mix-up, most
/// often). Common practice, no source: cables and arches are rarely flatter
/// than span/100 or deeper than span/2.
fn sanity(reading: &Reading, conditions: &[Condition]) -> Vec<String> {
    let span = reading.structure.span();
    let unit = reading.structure.units().length;
    conditions
        .iter()
        .filter_map(|c| match c {
            Condition::Sag(f) if *f < span / 1000.0 || *f > span => Some(format!(
                "the sag or rise, {} {unit}, is {} of the span ({} {unit}); check its unit (a value may carry one, e.g. \"4.5 m\")",
                crate::model::fmt_num(*f),
                if *f < span / 1000.0 { "under 1/1000" } else { "more than" },
                crate::model::fmt_num(span)
            )),
            _ => None,
        })
        .collect()
}

/// Reads a drawing without solving: what `inspect` shows.
pub fn inspect(bytes: &[u8], options: &ReadOptions, layers: &OutputLayers) -> Result<Reading, Error> {
    let file = File::scan(bytes, &scan_options(&options.layers, layers.all()))?;
    Ok(read(&file, options)?)
}

/// Runs the whole job on `bytes`, writing the output drawing to `out`.
pub fn run(bytes: &[u8], job: &Job, out: &mut dyn Write) -> Result<Outcome, Error> {
    let (outcome, plan) = prepare(bytes, job)?;
    plan.apply(bytes, out).map_err(WriteError::from)?;
    Ok(outcome)
}

/// The warning for a drawing whose header scales dimension measurements
/// (`$DIMLFAC` ≠ 1), when it does; its dimensions then carry their values
/// as text, true lengths in any program.
pub(crate) fn dimension_scale_note(file: &File) -> Option<String> {
    let factor = file.header_f64("$DIMLFAC", 40)?;
    ((factor - 1.0).abs() > 1e-12).then(|| {
        format!(
            "the drawing's $DIMLFAC is {factor}: the tool's dimensions carry their true lengths written out as text, \
             since some programs would multiply a measured value by that factor"
        )
    })
}

/// Runs the whole job on `bytes` up to the plan of the output, which the
/// caller applies (from memory, or by copying ranges of the input file).
pub fn prepare(bytes: &[u8], job: &Job) -> Result<(Outcome, Plan), Error> {
    let file = File::scan(bytes, &scan_options(&job.read.layers, job.layers.all()))?;
    let mut reading = read(&file, &job.read)?;
    let units = reading.structure.units();
    let options = solve_options(job, units);
    if !reading.structure.has_loads() && options.self_weight.is_none() {
        return Err(ModelError::NoLoads { layer: job.read.layers.loads.clone() }.into());
    }
    let carried = carry(&reading.structure, &reading.hangers);
    let mut layout_options = job.layout;
    layout_options.self_weight = options.self_weight;
    if let Some(note) = dimension_scale_note(&file) {
        layout_options.literal_dimension_text = true;
        reading.warnings.push(note);
    }
    if let Some(f) = job.force_scale {
        let unit = reading.structure.units().force;
        layout_options.force_scale = Some(f.value * f.unit.map_or(1.0, |u| u.factor_to(unit)));
    }
    if job.alternatives.is_empty() {
        let conditions = conditions(&job.given, job.form, units)?;
        let mut solution = solve_drawn(&reading, &carried, job.form, &conditions, &options)?;
        solution.warnings.extend(sanity(&reading, &conditions));
        let sizing = job.sizing.as_ref().map(|spec| size_members(spec, &carried, &solution)).transpose()?;
        let notes = sizing.as_ref().map(|s| crate::sizing::summary_lines(s, units.force)).unwrap_or_default();
        let (additions, placement) = layout_with_notes(
            &carried.structure,
            &reading.structure,
            &solution,
            reading.extents,
            &layout_options,
            &Annotations { notes: &notes, pole: None },
        );
        let (plan, summary) = plan(&file, &additions, &job.layers)?;
        return Ok((
            Outcome { reading, carried, solution, placement, summary, alternatives: Vec::new(), sizing, additions },
            plan,
        ));
    }

    // Alternatives: each solved on its own, then drawn on its own layers
    // with one force scale and one load line, so that the poles share the
    // pole axis (the line through the closing point parallel to the chord).
    let mut alternatives = Vec::new();
    for given in &job.alternatives {
        let mut all = job.given.clone();
        all.push(*given);
        let conditions = conditions(&all, job.form, units)?;
        let name = given.tag();
        let mut solution = solve_drawn(&reading, &carried, job.form, &conditions, &options)
            .map_err(|e| Error::Condition(format!("alternative {name}: {e}")))?;
        solution.warnings.extend(sanity(&reading, &conditions));
        alternatives.push(Alternative { name, given: *given, solution });
    }
    let lay = |o: &LayoutOptions, a: &Alternative| {
        let words = a.given.words();
        let annotations = Annotations { notes: &[], pole: Some(&words) };
        layout_with_notes(&carried.structure, &reading.structure, &a.solution, reading.extents, o, &annotations)
    };
    // The coarsest scale fits every pole; the first alternative's diagram
    // place with it is everyone's.
    let scale = alternatives.iter().map(|a| lay(&layout_options, a).1.force_scale).fold(0.0, f64::max);
    let mut shared = layout_options;
    shared.force_scale = Some(scale);
    let (base, placement) = lay(&shared, &alternatives[0]);
    shared.diagram_at = Some(placement.diagram_at);
    let mut additions = Additions { items: Vec::new(), dim_style: base.dim_style, variants: Vec::new() };
    // The table goes where the notes would: left of and below every
    // alternative's diagram.
    let mut anchor = Point::new(f64::INFINITY, f64::INFINITY);
    for (k, a) in alternatives.iter().enumerate() {
        let (adds, _) = lay(&shared, a);
        let mut own = Vec::new();
        let mut top = f64::NEG_INFINITY;
        for item in adds.items {
            match (item.role, &item.shape) {
                (Role::Notes, Shape::Text(t)) => {
                    anchor.x = anchor.x.min(t.at.x);
                    top = top.max(t.at.y);
                }
                (Role::Notes, _) => {}
                (Role::LoadDiagram, _) if k > 0 => {}
                (Role::LoadDiagram, _) => additions.items.push(item),
                _ => own.push(item),
            }
        }
        anchor.y = anchor.y.min(top);
        let start = additions.items.len();
        additions.items.extend(own);
        additions.variants.push(Variant { items: start..additions.items.len(), suffix: a.name.clone() });
    }
    let words: Vec<String> = alternatives.iter().map(|a| format!("{} ({})", a.given.words(), a.name)).collect();
    let rows: Vec<(&str, &Solution)> =
        words.iter().map(String::as_str).zip(alternatives.iter().map(|a| &a.solution)).collect();
    additions.items.extend(compare::comparison_items(&carried.structure, &rows, anchor, placement.text_height));
    let (plan, summary) = plan(&file, &additions, &job.layers)?;
    let solution = alternatives[0].solution.clone();
    let sizing = job.sizing.as_ref().map(|spec| size_members(spec, &carried, &solution)).transpose()?;
    Ok((Outcome { reading, carried, solution, placement, summary, alternatives, sizing, additions }, plan))
}

/// Solves the carried structure under `conditions`; a sketch on the drawing
/// supplies the conditions left out, or is compared with the result.
fn solve_drawn(
    reading: &Reading,
    carried: &Carried,
    form: Form,
    conditions: &[Condition],
    options: &SolveOptions,
) -> Result<Solution, crate::solve::SolveError> {
    match &reading.sketch {
        Some(sketch) => follow_sketch(&carried.structure, form, conditions, &sketch.points, options),
        None => solve_with(&carried.structure, form, conditions, options),
    }
}

/// Sizes the members of `solution` (segments named in Bow's notation, as in
/// the report), for the largest force along the profile.
pub fn size_members(
    spec: &crate::sizing::Spec,
    carried: &Carried,
    solution: &Solution,
) -> Result<crate::sizing::Sizing, Error> {
    let pole = carried.structure.loads().len() + 1;
    let members: Vec<crate::sizing::Member> = solution
        .segments
        .iter()
        .enumerate()
        .map(|(k, s)| crate::sizing::Member { name: crate::layout::nice::member_name(k, pole), force: s.force })
        .collect();
    let largest = solution.peak.force.max(solution.max_force());
    Ok(crate::sizing::size(spec, solution.form, &members, largest, carried.structure.units().force)?)
}

#[cfg(test)]
mod tests {
    use std::fmt::Write as _;

    use proptest::prelude::*;

    use super::*;

    /// A minimal R12 drawing: supports at (0, 0) and (`span`, `dy`), vertical
    /// loads `(x, w)` with labels beside them.
    fn drawing(span: f64, dy: f64, loads: &[(f64, f64)]) -> String {
        let mut e =
            format!("0\nPOINT\n8\nSUPPORTS\n10\n0.0\n20\n0.0\n0\nPOINT\n8\nSUPPORTS\n10\n{span:?}\n20\n{dy:?}\n");
        for (x, w) in loads {
            let _ = write!(e, "0\nLINE\n8\nLOADS\n10\n{x:?}\n20\n-1.0\n11\n{x:?}\n21\n-2.0\n");
            let _ = write!(e, "0\nTEXT\n8\nLOADS\n10\n{:?}\n20\n-1.5\n40\n0.001\n1\n{w:?} kN\n", x + 0.01);
        }
        format!(
            "0\nSECTION\n2\nHEADER\n9\n$ACADVER\n1\nAC1009\n0\nENDSEC\n0\nSECTION\n2\nENTITIES\n{e}0\nENDSEC\n0\nEOF\n"
        )
    }

    fn job(sag: f64) -> Job {
        Job {
            read: ReadOptions::default(),
            form: Form::Cable,
            given: vec![Given::Sag(LengthValue { value: sag, unit: None })],
            layout: LayoutOptions::default(),
            force_scale: None,
            layers: OutputLayers::default(),
            self_weight: None,
            axial_stiffness: None,
            chord_tolerance: None,
            alternatives: Vec::new(),
            sizing: None,
        }
    }

    #[test]
    fn alternatives_are_named_with_r12_safe_layer_suffixes() {
        let l = |value, unit| LengthValue { value, unit };
        assert_eq!(Given::Sag(l(4.5, None)).tag(), "SAG-4_5");
        assert_eq!(Given::Thrust(ForceValue { value: 450.0, unit: Some(ForceUnit::Kilonewton) }).tag(), "THRUST-450KN");
        assert_eq!(Given::LevelAt(-3.25).tag(), "LEVELAT--3_25");
        assert_eq!(Given::Sag(l(4.5, Some(LengthUnit::Metre))).words(), "sag 4.5 m");
        for g in [Given::Sag(l(4.5, None)), Given::LevelAt(-3.25), Given::Length(l(43.0, Some(LengthUnit::Foot)))] {
            let layer = format!("HANGLINE-PROFILE-{}", g.tag());
            assert!(crate::write::check_layer_name(&layer, crate::dxf::Release::R12).is_ok(), "{layer}");
            assert!(crate::write::is_variant_of("HANGLINE-PROFILE", &layer), "{layer}");
        }
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(48))]

        /// Solving the tool's own output again gives the same profile, and
        /// every node is in equilibrium (property test; our own invariants).
        #[test]
        fn solving_the_output_again_gives_the_same_profile(
            span in 10.0..200.0f64,
            dy in -20.0..20.0f64,
            weights in prop::collection::vec(1.0..100.0f64, 1..25),
            sag_ratio in 0.02..0.3f64,
        ) {
            let n = weights.len();
            // Spread the loads unevenly but well apart (labels stay clear).
            let loads: Vec<(f64, f64)> = weights
                .iter()
                .enumerate()
                .map(|(k, w)| (span * (k as f64 + 0.5 + 0.3 * ((k * 7919) % 5) as f64 / 5.0) / (n as f64 + 0.6), (w * 100.0).round() / 100.0))
                .collect();
            let input = drawing(span, dy, &loads);
            let job = job(span * sag_ratio);
            let mut first = Vec::new();
            let a = run(input.as_bytes(), &job, &mut first).unwrap();
            prop_assert!(a.solution.checks.equilibrium <= 1e-9);
            prop_assert!(a.solution.checks.closed_form.is_some_and(|e| e <= 1e-9));
            let mut second = Vec::new();
            let b = run(&first, &job, &mut second).unwrap();
            prop_assert_eq!(&a.solution.nodes, &b.solution.nodes);
            prop_assert_eq!(a.summary.added, b.summary.replaced);
        }
    }
}
