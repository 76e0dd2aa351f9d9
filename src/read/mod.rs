//! The reader: a scanned DXF drawing in, the plain [`Structure`] out.
//!
//! By layer (names are defaults; each can be renamed):
//! * `SUPPORTS`: a POINT, CIRCLE (its centre) or INSERT (its insertion
//!   point) is a fixed support; a vertical LINE is a tower axis.
//! * `LOADS`: a LINE is a load's line of action, acting toward its lower end
//!   (a vertical line: straight down); its magnitude is the nearest TEXT or
//!   MTEXT ([`assign`], [`label`]), or its length times `--load-scale`. An
//!   INSERT is a load acting through its insertion point along the block's
//!   −y axis (rotation 0: straight down), its magnitude in an attribute or,
//!   failing that, in the nearest text.
//! * `DECK` (optional): LINE, ARC, LWPOLYLINE or POLYLINE of the deck.
//! * `SKETCH` (optional): the designer's intended shape, one LWPOLYLINE,
//!   POLYLINE, SPLINE or chain of LINEs and ARCs meeting end to end; its
//!   vertices are what the fit measures.
//!
//! Only model-space entities count. Entities of other types on these layers
//! are passed over and counted in a warning. [`mtext`] strips formatting
//! codes; [`drawn`] turns an entity's pairs into world geometry.

pub mod arch;
pub mod assign;
mod drawn;
pub mod label;
pub mod mtext;
mod spline;

use kurbo::{Line, Point, Rect, Vec2};
use thiserror::Error;

use crate::dxf::{File, Format, Release, ScanOptions, names_match};
use crate::model::{Deck, DistributedLoad, LIMIT, Load, ModelError, Origin, Structure, Support, fmt_num, fmt_xy};
use crate::units::{ForceUnit, LengthUnit, Units};
use assign::{AssignError, AssignTolerances, LabelText, LoadGeom, LoadShape};
use drawn::{Drawn, drawn};
use label::{LabelForce, LabelValue, parse_force};

/// The layers the reader takes its input from.
#[derive(Clone, Debug, PartialEq)]
pub struct InputLayers {
    /// Supports and tower axes.
    pub supports: String,
    /// Load lines, load blocks and labels.
    pub loads: String,
    /// The deck.
    pub deck: String,
    /// True when the deck layer was named by the user (then it must exist).
    pub deck_required: bool,
    /// Hanger or post positions (vertical lines), where distributed loads
    /// are carried to the cable or arch.
    pub hangers: String,
    /// True when the hangers layer was named by the user.
    pub hangers_required: bool,
    /// The designer's sketch of the intended shape.
    pub sketch: String,
    /// True when the sketch layer was named by the user (then it must exist).
    pub sketch_required: bool,
}

impl Default for InputLayers {
    fn default() -> Self {
        InputLayers {
            supports: "SUPPORTS".into(),
            loads: "LOADS".into(),
            deck: "DECK".into(),
            deck_required: false,
            hangers: "HANGERS".into(),
            hangers_required: false,
            sketch: "SKETCH".into(),
            sketch_required: false,
        }
    }
}

/// How to read the drawing.
#[derive(Clone, Debug, PartialEq)]
pub struct ReadOptions {
    /// Input layers.
    pub layers: InputLayers,
    /// The drawing's length unit, overriding `$INSUNITS`.
    pub length_unit: Option<LengthUnit>,
    /// The force unit of the model and the report; by default the labels'
    /// unit when they all agree, else kN.
    pub force_unit: Option<ForceUnit>,
    /// The unit of labels written without one.
    pub label_unit: ForceUnit,
    /// Force per drawing unit of load-line length: magnitudes from lengths.
    pub load_scale: Option<(f64, ForceUnit)>,
}

impl Default for ReadOptions {
    fn default() -> Self {
        ReadOptions {
            layers: InputLayers::default(),
            length_unit: None,
            force_unit: None,
            label_unit: ForceUnit::Kilonewton,
            load_scale: None,
        }
    }
}

/// A load as read, for `inspect` and the report.
#[derive(Clone, Debug, PartialEq)]
pub struct LoadRead {
    /// The load line or block.
    pub origin: Origin,
    /// The label's text as shown (plain), when a label gave the magnitude.
    pub label: Option<String>,
    /// Where the label is (its handle and centre).
    pub label_origin: Option<Origin>,
    /// The magnitude as written.
    pub value: f64,
    /// The unit as written (or assumed).
    pub unit: ForceUnit,
    /// The force in the model's units.
    pub force: Vec2,
    /// A point on the line of action.
    pub anchor: Point,
}

/// A distributed load as read, for `inspect` and the report.
#[derive(Clone, Debug, PartialEq)]
pub struct StretchRead {
    /// The load line.
    pub origin: Origin,
    /// The label's text as shown (plain).
    pub label: Option<String>,
    /// The intensities as written, left and right.
    pub written: (f64, f64),
    /// The force unit written.
    pub force_unit: ForceUnit,
    /// The length unit written.
    pub length_unit: LengthUnit,
    /// Left end of the stretch.
    pub x0: f64,
    /// Right end.
    pub x1: f64,
    /// Intensity at x0 in model units (force unit per drawing length unit).
    pub w0: f64,
    /// Intensity at x1 in model units.
    pub w1: f64,
}

/// A polyline as read from pieces drawn end to end (an arch's face, the
/// designer's sketch): its vertices and the entities they came from.
#[derive(Clone, Debug, PartialEq)]
pub struct Chain {
    /// The vertices in order along the chain (either direction).
    pub points: Vec<Point>,
    /// The entities it came from, in chain order.
    pub from: Vec<Origin>,
}

/// The designer's sketch as read: one chain of vertices.
pub type Sketch = Chain;

/// Everything read from a drawing.
#[derive(Clone, Debug)]
pub struct Reading {
    /// The structure.
    pub structure: Structure,
    /// The loads as read, left to right (same order as the structure's).
    pub loads: Vec<LoadRead>,
    /// The distributed loads as read, left to right.
    pub distributed: Vec<StretchRead>,
    /// Hanger or post positions from the hangers layer: x and where drawn, sorted.
    pub hangers: Vec<(f64, Origin)>,
    /// The designer's sketch, when the sketch layer holds one.
    pub sketch: Option<Sketch>,
    /// The drawing's model-space extents (without the tool's own layers).
    pub extents: Option<Rect>,
    /// The drawing's release.
    pub release: Release,
    /// True for binary DXF.
    pub binary: bool,
    /// How the length unit was decided.
    pub length_source: String,
    /// How the force unit was decided.
    pub force_source: String,
    /// The drawing's layers, from its LAYER table.
    pub layers: Vec<String>,
    /// Things the user should know.
    pub warnings: Vec<String>,
}

/// Why a drawing could not be read.
#[derive(Debug, Error, PartialEq)]
pub enum ReadError {
    /// A required layer is not in the drawing.
    #[error(
        "the drawing has no layer named {layer} for the {role} (its layers: {present}); put them on {layer} or name their layer with --layer {key}=NAME"
    )]
    MissingLayer {
        /// What the layer holds.
        role: &'static str,
        /// The command-line key.
        key: &'static str,
        /// The layer name looked for.
        layer: String,
        /// The layers the drawing has.
        present: String,
    },
    /// `$INSUNITS` names a unit this tool does not use.
    #[error(
        "the drawing's unit ($INSUNITS = {code}) is not one this tool uses; give the unit with --units (mm, cm, m, in, ft, …)"
    )]
    Units {
        /// The code found.
        code: i64,
    },
    /// A load line or block without a usable label.
    #[error("{0}")]
    Label(String),
    /// An entity whose geometry cannot be used.
    #[error("{origin}: {problem}")]
    Geometry {
        /// The entity, as a message.
        origin: String,
        /// What is wrong and what to do.
        problem: String,
    },
    /// The structure read is not a valid model.
    #[error(transparent)]
    Model(#[from] ModelError),
}

/// The scan options the reader needs, plus `extra` layers (the tool's
/// output layers, which the writer must see and the extents must skip).
#[must_use]
pub fn scan_options<'a>(layers: &InputLayers, extra: impl Iterator<Item = &'a str>) -> ScanOptions {
    let inputs = [&layers.supports, &layers.loads, &layers.deck, &layers.hangers, &layers.sketch];
    scan_layers(&inputs, extra)
}

/// The scan options for `inputs` (read) and `extra` (the tool's output
/// layers, which the writer must see and the extents must skip).
pub(crate) fn scan_layers<'a>(inputs: &[&String], extra: impl Iterator<Item = &'a str>) -> ScanOptions {
    let extra: Vec<String> = extra.map(String::from).collect();
    let mut keep: Vec<String> = inputs.iter().map(|s| (*s).clone()).collect();
    keep.extend(extra.iter().cloned());
    // The layers of design alternatives: a tool layer's name, a hyphen and more.
    let keep_prefixes = extra.iter().map(|n| format!("{n}-")).collect();
    ScanOptions { keep_layers: keep, skip_extents_layers: extra, keep_prefixes, ..ScanOptions::default() }
}

/// The drawing's layers (from its LAYER table) and the entities on them.
pub(crate) struct DrawingLayers<'a, 'f> {
    file: &'a File<'f>,
    /// The layer names in the LAYER table.
    pub table: Vec<String>,
}

impl<'a, 'f> DrawingLayers<'a, 'f> {
    pub(crate) fn new(file: &'a File<'f>) -> Self {
        let table = file.table("LAYER").map(|t| t.records.iter().map(|r| r.name.clone()).collect()).unwrap_or_default();
        DrawingLayers { file, table }
    }

    /// The kept entities on layer `name`.
    pub(crate) fn on(&self, name: &str) -> Vec<&'a crate::dxf::EntityRef> {
        self.file.entities.iter().filter(|e| names_match(&e.layer, name)).collect()
    }

    /// An error unless the layer is in the table or holds an entity.
    pub(crate) fn require(&self, role: &'static str, key: &'static str, layer: &str) -> Result<(), ReadError> {
        if self.table.iter().any(|l| names_match(l, layer)) || !self.on(layer).is_empty() {
            return Ok(());
        }
        let mut l = self.table.clone();
        l.truncate(20);
        let present = if l.is_empty() { "none".to_string() } else { l.join(", ") };
        Err(ReadError::MissingLayer { role, key, layer: layer.to_string(), present })
    }

    /// The scan's warnings, and one more when entities on the input layers
    /// were in paper space: `what` says what to draw in model space.
    pub(crate) fn warnings(&self, what: &str) -> Vec<String> {
        let mut warnings = self.file.warnings.clone();
        if self.file.paper_space_kept > 0 {
            warnings.push(format!(
                "{} entities on the input layers are in paper space and were ignored; draw {what} in model space",
                self.file.paper_space_kept
            ));
        }
        warnings
    }
}

/// Tolerance for "vertical": |dx| at most this fraction of a line's length
/// counts as exactly vertical (drafting noise of snapped lines; our choice).
const VERTICAL: f64 = 1e-9;

/// Reads the structure from a scanned drawing.
pub fn read(file: &File<'_>, options: &ReadOptions) -> Result<Reading, ReadError> {
    let layers = &options.layers;
    let drawing = DrawingLayers::new(file);
    let on = |name: &str| drawing.on(name);
    drawing.require("supports", "supports", &layers.supports)?;
    drawing.require("loads", "loads", &layers.loads)?;
    if layers.deck_required {
        drawing.require("deck", "deck", &layers.deck)?;
    }
    if layers.sketch_required {
        drawing.require("sketch", "sketch", &layers.sketch)?;
    }
    let mut warnings = drawing.warnings("supports and loads");

    let (length, length_source) = length_unit(file, options, &mut warnings)?;
    let extents = file.extents.rect();
    let tolerance = extents.map_or(1e-3, |r| (r.width().hypot(r.height()) * 1e-5).max(1e-9));

    // Supports.
    let mut supports = Vec::new();
    let mut ignored = Ignored::default();
    for e in on(&layers.supports) {
        let d = drawn(file, e, tolerance);
        let o = drawn::origin(e, drawn::position(&d));
        check_finite(&d, &o)?;
        match d {
            Drawn::Point(p) | Drawn::Circle(p) | Drawn::Insert { at: p, .. } => {
                supports.push(Support::Point { at: p, origin: o })
            }
            Drawn::Line(l) if is_vertical(l) => supports.push(Support::Axis {
                x: (l.p0.x + l.p1.x) / 2.0,
                foot: l.p0.y.min(l.p1.y),
                top: l.p0.y.max(l.p1.y),
                origin: o,
            }),
            Drawn::Line(_) => warnings.push(format!(
                "{o}: a LINE on {} that is not vertical was ignored (a tower axis must be vertical)",
                layers.supports
            )),
            other => ignored.add(&other),
        }
    }
    ignored.warn(&layers.supports, &mut warnings);

    let LoadsRead { loads, mut reads, distributed, mut stretches, force_unit, force_source } =
        read_loads(file, &layers.loads, options, length, tolerance, &mut warnings)?;

    // Hanger or post positions: vertical lines on the hangers layer.
    let mut hangers = Vec::new();
    let mut ignored = Ignored::default();
    for e in on(&layers.hangers) {
        let d = drawn(file, e, tolerance);
        let o = drawn::origin(e, drawn::position(&d));
        check_finite(&d, &o)?;
        match d {
            Drawn::Line(l) if is_vertical(l) => hangers.push(((l.p0.x + l.p1.x) / 2.0, o)),
            other => ignored.add(&other),
        }
    }
    ignored.warn(&layers.hangers, &mut warnings);
    hangers.sort_by(|a, b| a.0.total_cmp(&b.0));
    hangers.dedup_by(|a, b| a.0 == b.0);

    // Deck.
    let mut deck = Deck::default();
    let mut ignored = Ignored::default();
    for e in on(&layers.deck) {
        warnings.extend(drawn::approximate(file, e));
        let d = drawn(file, e, tolerance);
        let o = drawn::origin(e, drawn::position(&d));
        check_finite(&d, &o)?;
        match d {
            Drawn::Line(l) => deck.segments.push(l),
            Drawn::Path(p) => deck.segments.extend(p.windows(2).map(|w| Line::new(w[0], w[1]))),
            other => ignored.add(&other),
        }
    }
    ignored.warn(&layers.deck, &mut warnings);
    let deck = (!deck.segments.is_empty()).then_some(deck);
    let sketch = read_sketch(file, &layers.sketch, tolerance, &mut warnings)?;

    let units = Units { length, force: force_unit };
    let structure = Structure::new(units, supports, loads, distributed, deck, &layers.supports)?;
    reads.sort_by(|a, b| a.anchor.x.total_cmp(&b.anchor.x));
    stretches.sort_by(|a, b| a.x0.total_cmp(&b.x0));
    Ok(Reading {
        structure,
        loads: reads,
        distributed: stretches,
        hangers,
        sketch,
        extents,
        release: file.release,
        binary: file.format != Format::Ascii,
        length_source,
        force_source,
        layers: drawing.table,
        warnings,
    })
}

/// The sketch on `layer`: `None` when the layer holds no line; one chain of
/// pieces meeting end to end (within the drawing's diagonal × 1e-7, as for
/// an arch's faces); several apart are an error naming them.
fn read_sketch(
    file: &File<'_>,
    layer: &str,
    tolerance: f64,
    warnings: &mut Vec<String>,
) -> Result<Option<Sketch>, ReadError> {
    let drawing = DrawingLayers::new(file);
    let mut pieces = Vec::new();
    let mut ignored = Ignored::default();
    for e in drawing.on(layer) {
        let d = drawn(file, e, tolerance);
        let o = drawn::origin(e, drawn::position(&d));
        check_finite(&d, &o)?;
        match d {
            Drawn::Line(l) if l.p0 != l.p1 => pieces.push((vec![l.p0, l.p1], o)),
            Drawn::Path(p) if p.len() >= 2 => pieces.push((p, o)),
            other => ignored.add(&other),
        }
    }
    ignored.warn(layer, warnings);
    match pieces.len() {
        0 => Ok(None),
        1 => {
            let (points, o) = pieces.remove(0);
            Ok(Some(Sketch { points, from: vec![o] }))
        }
        n => {
            let gap = file.extents.rect().map_or(1e-9, |r| (r.width().hypot(r.height()) * 1e-7).max(1e-9));
            let names: Vec<String> = pieces.iter().map(|(_, o)| o.to_string()).take(10).collect();
            match arch::chain("sketch", layer, pieces, gap) {
                Ok(face) => Ok(Some(face)),
                Err(_) => Err(ReadError::Geometry {
                    origin: format!("layer {layer}"),
                    problem: format!(
                        "the sketch must be one line, but its {n} pieces ({}) do not join end to end into one open line; join them into one polyline, or move all but one off the layer",
                        names.join("; ")
                    ),
                }),
            }
        }
    }
}

/// The drawing's length unit and how it was decided: `--units`, else
/// `$INSUNITS`, else metres with a warning.
pub(crate) fn length_unit(
    file: &File<'_>,
    options: &ReadOptions,
    warnings: &mut Vec<String>,
) -> Result<(LengthUnit, String), ReadError> {
    Ok(match options.length_unit {
        Some(u) => (u, "given with --units".to_string()),
        None => match file.header_i64("$INSUNITS") {
            Some(code) if code != 0 => {
                let u = LengthUnit::from_insunits(code).ok_or(ReadError::Units { code })?;
                (u, format!("from $INSUNITS = {code}"))
            }
            found => {
                let why = if found.is_some() { "$INSUNITS is 0 (unitless)" } else { "the drawing has no $INSUNITS" };
                warnings.push(format!("{why}; lengths read as metres: give --units if they are not"));
                (LengthUnit::Metre, format!("assumed ({why})"))
            }
        },
    })
}

/// The loads read from the loads layer, in the model's units.
pub(crate) struct LoadsRead {
    /// Point loads.
    pub loads: Vec<Load>,
    /// Point loads as read.
    pub reads: Vec<LoadRead>,
    /// Distributed loads.
    pub distributed: Vec<DistributedLoad>,
    /// Distributed loads as read.
    pub stretches: Vec<StretchRead>,
    /// The force unit of the model.
    pub force_unit: ForceUnit,
    /// How it was decided.
    pub force_source: String,
}

/// Reads point and distributed loads and their labels from `layer`.
pub(crate) fn read_loads(
    file: &File<'_>,
    layer: &str,
    options: &ReadOptions,
    length: LengthUnit,
    tolerance: f64,
    warnings: &mut Vec<String>,
) -> Result<LoadsRead, ReadError> {
    let drawing = DrawingLayers::new(file);
    let on = |name: &str| drawing.on(name);
    // Loads: lines and blocks, and the texts that label them.
    let mut items: Vec<LoadItem> = Vec::new();
    let mut texts: Vec<(LabelText, Origin)> = Vec::new();
    let mut ignored = Ignored::default();
    for e in on(layer) {
        let d = drawn(file, e, tolerance);
        let o = drawn::origin(e, drawn::position(&d));
        check_finite(&d, &o)?;
        match d {
            Drawn::Line(l) => {
                if l.p0 == l.p1 {
                    return Err(ReadError::Geometry {
                        origin: o.to_string(),
                        problem: "this load line has no length; draw it along the load's line of action".into(),
                    });
                }
                let kind = if is_horizontal(l) {
                    ItemKind::Stretch { x0: l.p0.x.min(l.p1.x), x1: l.p0.x.max(l.p1.x) }
                } else {
                    ItemKind::Point { direction: line_direction(l) }
                };
                items.push(LoadItem { shape: LoadShape::Segment(l), kind, origin: o, given: None });
            }
            Drawn::Path(points) => {
                // A polyline on the loads layer is a distributed load when
                // it runs horizontally.
                match horizontal_extent(&points) {
                    Some(l) => items.push(LoadItem {
                        shape: LoadShape::Segment(l),
                        kind: ItemKind::Stretch { x0: l.p0.x, x1: l.p1.x },
                        origin: o,
                        given: None,
                    }),
                    None => warnings.push(format!(
                        "{o}: a polyline on {} that is not horizontal was ignored (a distributed load is drawn as a horizontal line)",
                        layer
                    )),
                }
            }
            Drawn::Insert { at, rotation, attributes } => {
                let given = attribute_force(&attributes, &o)?;
                let (sin, cos) = rotation.to_radians().sin_cos();
                let dir = Vec2::new(sin, -cos);
                let dir = if dir.x.abs() <= VERTICAL { Vec2::new(0.0, -1.0) } else { dir };
                items.push(LoadItem {
                    shape: LoadShape::Point(at),
                    kind: ItemKind::Point { direction: dir },
                    origin: o,
                    given,
                });
            }
            Drawn::Text(t) => {
                let plain = if t.mtext { mtext::plain_mtext(&t.raw) } else { mtext::plain_text(&t.raw) };
                let plain = label_line(&plain);
                let id = texts.len();
                let o = Origin { at: t.centre, ..o };
                texts.push((LabelText::new(id, t.centre, plain), o));
            }
            other => ignored.add(&other),
        }
    }
    ignored.warn(layer, warnings);

    // Magnitudes: attributes first, then --load-scale (point loads) or the labels.
    let mut values: Vec<Option<(LabelValue, Option<usize>)>> =
        items.iter().map(|i| i.given.map(|g| (LabelValue::Force(g), None))).collect();
    let mut leftover_texts: Vec<usize> = Vec::new();
    if let Some((scale, unit)) = options.load_scale {
        for (m, item) in values.iter_mut().zip(&items) {
            if m.is_none()
                && let (LoadShape::Segment(l), ItemKind::Point { .. }) = (item.shape, item.kind)
            {
                *m = Some((LabelValue::Force(LabelForce { value: l.length() * scale, unit: Some(unit) }), None));
            }
        }
    }
    let need: Vec<usize> = (0..items.len()).filter(|&i| values[i].is_none()).collect();
    if need.is_empty() {
        leftover_texts.extend(0..texts.len());
    } else {
        let geoms: Vec<LoadGeom> = need.iter().map(|&i| LoadGeom { id: i, shape: items[i].shape }).collect();
        let labels: Vec<LabelText> = texts.iter().map(|(t, _)| t.clone()).collect();
        let assignment = assign::assign(&geoms, &labels, AssignTolerances::default())
            .map_err(|e| ReadError::Label(label_message(&e, &items, &texts, layer)))?;
        for m in &assignment.matches {
            values[m.line] = Some((m.value, Some(m.label)));
        }
        leftover_texts.extend(assignment.leftovers.iter().map(|l| l.label));
    }
    if options.load_scale.is_some() && !leftover_texts.is_empty() {
        warnings.push(format!(
            "{} text(s) on {} not used: --load-scale reads point loads from their lines' lengths",
            leftover_texts.len(),
            layer
        ));
    } else {
        for &t in &leftover_texts {
            let (text, o) = &texts[t];
            warnings.push(format!("text '{}' ({o}) is not the label of any load and was ignored", text.text));
        }
    }
    // A point load needs a force, a distributed load a force per length.
    for (item, v) in items.iter().zip(&values) {
        let Some((value, label)) = v else { continue };
        let text = || label.map(|l| format!("'{}'", texts[l].0.text)).unwrap_or_default();
        match (item.kind, value) {
            (ItemKind::Point { .. }, LabelValue::Intensity(_)) => {
                return Err(ReadError::Label(format!(
                    "the label {} of the load line {} is a load per length, but the line is not horizontal: a point load's label is a force such as '85 kN'; draw a distributed load as a horizontal line",
                    text(),
                    item.origin
                )));
            }
            (ItemKind::Stretch { .. }, LabelValue::Force(_)) => {
                return Err(ReadError::Label(format!(
                    "the horizontal load line {} is a distributed load, but its label {} is a force: write a load per length such as '12 kN/m' (or '8..12 kN/m' from left to right)",
                    item.origin,
                    text()
                )));
            }
            _ => {}
        }
    }

    // The force unit: what the labels agree on, else kN.
    let written: Vec<ForceUnit> = values
        .iter()
        .flatten()
        .map(|(v, _)| match v {
            LabelValue::Force(f) => f.unit.unwrap_or(options.label_unit),
            LabelValue::Intensity(w) => w.force,
        })
        .collect();
    let (force_unit, force_source) = match options.force_unit {
        Some(u) => (u, "given with --force-unit".to_string()),
        None => match written.first() {
            Some(&first) if written.iter().all(|&u| u == first) => (first, "the unit of every label".to_string()),
            Some(_) => (ForceUnit::Kilonewton, "kN, as the labels use several units".to_string()),
            None => (ForceUnit::Kilonewton, "kN (default)".to_string()),
        },
    };
    if values.iter().flatten().any(|(v, _)| matches!(v, LabelValue::Force(f) if f.unit.is_none())) {
        warnings.push(format!(
            "some labels have no unit; they were read as {}: give --label-unit if not",
            options.label_unit
        ));
    }

    let mut loads = Vec::new();
    let mut reads = Vec::new();
    let mut distributed = Vec::new();
    let mut stretches = Vec::new();
    for (item, v) in items.iter().zip(&values) {
        // Every item got a value or the assignment returned an error.
        let Some((value, label)) = v else { continue };
        match (item.kind, value) {
            (ItemKind::Point { direction }, LabelValue::Force(f)) => {
                let value = f.value_in(force_unit, options.label_unit);
                let force = direction * value;
                let anchor = match item.shape {
                    LoadShape::Segment(l) => l.p0.midpoint(l.p1),
                    LoadShape::Point(p) => p,
                };
                let anchor = if force.x == 0.0 {
                    // An exactly vertical load: one x for the whole line.
                    if let LoadShape::Segment(l) = item.shape {
                        Point::new((l.p0.x + l.p1.x) / 2.0, anchor.y)
                    } else {
                        anchor
                    }
                } else {
                    anchor
                };
                loads.push(Load { anchor, force, origin: item.origin.clone() });
                reads.push(LoadRead {
                    origin: item.origin.clone(),
                    label: label.map(|l| texts[l].0.text.clone()),
                    label_origin: label.map(|l| texts[l].1.clone()),
                    value: f.value,
                    unit: f.unit.unwrap_or(options.label_unit),
                    force,
                    anchor,
                });
            }
            (ItemKind::Stretch { x0, x1 }, LabelValue::Intensity(w)) => {
                let (w0, w1) = w.in_units(force_unit, length);
                distributed.push(DistributedLoad { x0, x1, w0, w1, origin: item.origin.clone() });
                stretches.push(StretchRead {
                    origin: item.origin.clone(),
                    label: label.map(|l| texts[l].0.text.clone()),
                    written: (w.w0, w.w1),
                    force_unit: w.force,
                    length_unit: w.length,
                    x0,
                    x1,
                    w0,
                    w1,
                });
            }
            _ => {}
        }
    }

    Ok(LoadsRead { loads, reads, distributed, stretches, force_unit, force_source })
}

/// The text of a label: of a multi-line MTEXT, the one line that reads as
/// a force (the others are notes, such as "hanger load" above "30 kN");
/// otherwise all of it on one line.
fn label_line(plain: &str) -> String {
    let lines: Vec<String> =
        plain.lines().map(|l| l.split_whitespace().collect::<Vec<_>>().join(" ")).filter(|l| !l.is_empty()).collect();
    let forces: Vec<&String> = lines.iter().filter(|l| label::parse_label(l).is_ok()).collect();
    match forces.as_slice() {
        [one] if lines.len() > 1 => (*one).clone(),
        _ => lines.join(" "),
    }
}

/// A load line or block before its magnitude is known.
struct LoadItem {
    shape: LoadShape,
    kind: ItemKind,
    origin: Origin,
    /// A magnitude given by a block attribute.
    given: Option<LabelForce>,
}

/// A point load along a direction, or a distributed load over a stretch.
#[derive(Clone, Copy, Debug)]
enum ItemKind {
    /// Acting along this unit vector.
    Point { direction: Vec2 },
    /// Spread from x0 to x1.
    Stretch { x0: f64, x1: f64 },
}

fn is_horizontal(l: Line) -> bool {
    let d = l.p1 - l.p0;
    d.x != 0.0 && d.y.abs() <= VERTICAL * d.hypot()
}

/// A polyline's span as a horizontal line, when every piece is horizontal.
fn horizontal_extent(points: &[Point]) -> Option<Line> {
    let first = *points.first()?;
    let flat = points.windows(2).all(|w| is_horizontal(Line::new(w[0], w[1])) || w[0] == w[1]);
    let (lo, hi) = points.iter().fold((first.x, first.x), |(a, b), p| (a.min(p.x), b.max(p.x)));
    (flat && hi > lo).then(|| Line::new(Point::new(lo, first.y), Point::new(hi, first.y)))
}

fn is_vertical(l: Line) -> bool {
    let d = l.p1 - l.p0;
    d.y != 0.0 && d.x.abs() <= VERTICAL * d.hypot()
}

/// The unit vector a load line acts along: toward its lower end; a vertical
/// line straight down.
fn line_direction(l: Line) -> Vec2 {
    if is_vertical(l) {
        return Vec2::new(0.0, -1.0);
    }
    let (upper, lower) = if l.p0.y >= l.p1.y { (l.p0, l.p1) } else { (l.p1, l.p0) };
    let d = lower - upper;
    d / d.hypot()
}

/// Attribute tags that name a load's magnitude when several attributes read
/// as forces (our convention).
const LOAD_TAGS: [&str; 6] = ["LOAD", "FORCE", "P", "F", "W", "MAGNITUDE"];

fn attribute_force(attributes: &[drawn::Attribute], o: &Origin) -> Result<Option<LabelForce>, ReadError> {
    let found: Vec<(&drawn::Attribute, LabelForce)> = attributes
        .iter()
        .filter_map(|a| parse_force(mtext::plain_text(&a.value).trim()).ok().map(|f| (a, f)))
        .collect();
    match found.as_slice() {
        [] => Ok(None),
        [(_, f)] => Ok(Some(*f)),
        many => {
            let tagged: Vec<_> =
                many.iter().filter(|(a, _)| LOAD_TAGS.iter().any(|t| a.tag.eq_ignore_ascii_case(t))).collect();
            match tagged.as_slice() {
                [(_, f)] => Ok(Some(*f)),
                _ => Err(ReadError::Label(format!(
                    "the load block {o} has {} attributes that read as forces ({}); keep one, or tag the magnitude LOAD",
                    many.len(),
                    many.iter().map(|(a, _)| format!("{}={}", a.tag, a.value)).collect::<Vec<_>>().join(", ")
                ))),
            }
        }
    }
}

fn label_message(e: &AssignError, items: &[LoadItem], texts: &[(LabelText, Origin)], layer: &str) -> String {
    let line =
        |id: usize| items.get(id).map_or_else(|| format!("load {id}"), |i| format!("the load line {}", i.origin));
    let text = |id: usize| texts.get(id).map_or_else(|| format!("text {id}"), |(t, o)| format!("'{}' ({o})", t.text));
    match e {
        AssignError::Missing { line: l } => format!(
            "{} has no label; put a text such as '85 kN' beside it on layer {layer} (or give --load-scale to read magnitudes from line lengths)",
            line(*l)
        ),
        AssignError::Ambiguous { line: l, label, other_line, distance, other_distance } => format!(
            "the label {} is about as near to {} (distance {}) as to {} (distance {}); move it closer to the line it belongs to",
            text(*label),
            line(*l),
            fmt_num(*distance),
            line(*other_line),
            fmt_num(*other_distance)
        ),
        AssignError::TwoLabels { line: l, label, other_label, .. } => format!(
            "{} has two labels about as near: {} and {}; keep one beside the line",
            line(*l),
            text(*label),
            text(*other_label)
        ),
        AssignError::Unparsable { line: l, label, error } => {
            format!("the label {} of {} does not read as a load: {error}", text(*label), line(*l))
        }
    }
}

pub(crate) fn check_finite(d: &Drawn, o: &Origin) -> Result<(), ReadError> {
    for p in drawn::coordinates(d) {
        for v in [p.x, p.y] {
            if !v.is_finite() || v.abs() >= LIMIT {
                return Err(ReadError::Geometry {
                    origin: format!("entity {} on layer {}", o.handle.as_deref().unwrap_or("without handle"), o.layer),
                    problem: format!(
                        "a coordinate is {} (near {}); coordinates must be finite and below 1e12: fix or redraw the entity",
                        fmt_num(v),
                        fmt_xy(Point::new(clean(p.x), clean(p.y)))
                    ),
                });
            }
        }
    }
    Ok(())
}

fn clean(v: f64) -> f64 {
    if v.is_finite() { v } else { 0.0 }
}

/// Entity types passed over on a layer, counted for one warning.
#[derive(Default)]
pub(crate) struct Ignored(Vec<(String, usize)>);

impl Ignored {
    fn add(&mut self, d: &Drawn) {
        let kind = match d {
            Drawn::Other(k) => k.clone(),
            Drawn::Text(_) => "TEXT".into(),
            Drawn::Path(_) => "POLYLINE".into(),
            Drawn::Point(_) => "POINT".into(),
            Drawn::Circle(_) => "CIRCLE".into(),
            Drawn::Insert { .. } => "INSERT".into(),
            Drawn::Line(_) => "LINE".into(),
        };
        match self.0.iter_mut().find(|(k, _)| *k == kind) {
            Some((_, n)) => *n += 1,
            None => self.0.push((kind, 1)),
        }
    }

    fn warn(self, layer: &str, warnings: &mut Vec<String>) {
        if !self.0.is_empty() {
            let list: Vec<String> = self.0.iter().map(|(k, n)| format!("{n} {k}")).collect();
            warnings.push(format!("on layer {layer}, {} passed over (not used on this layer)", list.join(", ")));
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A minimal R12 drawing: entities only, no tables.
    fn drawing(entities: &str) -> String {
        format!(
            "0\nSECTION\n2\nHEADER\n9\n$ACADVER\n1\nAC1009\n0\nENDSEC\n0\nSECTION\n2\nENTITIES\n{entities}0\nENDSEC\n0\nEOF\n"
        )
    }

    fn point(x: f64, y: f64) -> String {
        format!("0\nPOINT\n8\nSUPPORTS\n10\n{x}\n20\n{y}\n")
    }

    fn line(layer: &str, a: (f64, f64), b: (f64, f64)) -> String {
        format!("0\nLINE\n8\n{layer}\n10\n{}\n20\n{}\n11\n{}\n21\n{}\n", a.0, a.1, b.0, b.1)
    }

    fn text(at: (f64, f64), s: &str) -> String {
        format!("0\nTEXT\n8\nLOADS\n10\n{}\n20\n{}\n40\n0.2\n1\n{s}\n", at.0, at.1)
    }

    fn read_str(dxf: &str, options: &ReadOptions) -> Result<Reading, ReadError> {
        let file = File::scan(dxf.as_bytes(), &scan_options(&options.layers, std::iter::empty())).expect("scans");
        read(&file, options)
    }

    fn two_loads(labels: [&str; 2]) -> String {
        drawing(
            &[
                point(0.0, 0.0),
                point(10.0, 0.0),
                line("LOADS", (3.0, 1.0), (3.0, 3.0)),
                text((3.2, 2.5), labels[0]),
                line("LOADS", (7.0, 1.0), (7.0, 2.0)),
                text((7.2, 1.5), labels[1]),
            ]
            .concat(),
        )
    }

    #[test]
    fn labels_without_a_unit_take_the_label_unit() {
        let options = ReadOptions { label_unit: ForceUnit::Kip, ..ReadOptions::default() };
        let r = read_str(&two_loads(["12", "3 kip"]), &options).unwrap();
        assert_eq!(r.structure.units().force, ForceUnit::Kip);
        assert_eq!(r.structure.loads()[0].force, Vec2::new(0.0, -12.0));
        assert!(r.warnings.iter().any(|w| w.contains("no unit")), "{:?}", r.warnings);
        // No $INSUNITS in R12: metres, said so.
        assert_eq!(r.structure.units().length, LengthUnit::Metre);
        assert!(r.warnings.iter().any(|w| w.contains("no $INSUNITS")));
    }

    #[test]
    fn mixed_label_units_give_kilonewtons() {
        let r = read_str(&two_loads(["12 kN", "900 lbf"]), &ReadOptions::default()).unwrap();
        assert_eq!(r.structure.units().force, ForceUnit::Kilonewton);
        // NIST SP 811 (2008): 1 lbf = 4.448 221 615 260 5 N.
        let w = -r.structure.loads()[1].force.y;
        assert!((w - 0.9 * 4.448_221_615_260_5).abs() < 1e-12, "{w}");
    }

    #[test]
    fn load_scale_reads_magnitudes_from_line_lengths() {
        let options = ReadOptions { load_scale: Some((10.0, ForceUnit::Kilonewton)), ..ReadOptions::default() };
        let r = read_str(&two_loads(["not a load", "neither"]), &options).unwrap();
        let w: Vec<f64> = r.structure.loads().iter().map(|l| -l.force.y).collect();
        assert_eq!(w, [20.0, 10.0]);
        assert!(
            r.warnings.iter().any(|w| w.contains("2 text(s) on LOADS not used")),
            "labels are ignored, and said so: {:?}",
            r.warnings
        );
    }

    #[test]
    fn an_inclined_line_acts_toward_its_lower_end() {
        let dxf = drawing(
            &[point(0.0, 0.0), point(10.0, 0.0), line("LOADS", (4.0, 1.0), (5.0, 3.0)), text((5.3, 2.5), "5 kN")]
                .concat(),
        );
        let r = read_str(&dxf, &ReadOptions::default()).unwrap();
        let f = r.structure.loads()[0].force;
        // Along (−1, −2)/√5 times 5 kN.
        assert!((f.x - -5.0 / 5f64.sqrt()).abs() < 1e-12 && (f.y - -10.0 / 5f64.sqrt()).abs() < 1e-12, "{f:?}");
    }

    #[test]
    fn a_vertical_support_line_is_a_tower_axis() {
        let dxf = drawing(
            &[
                line("SUPPORTS", (0.0, 0.0), (0.0, 12.0)),
                point(10.0, 3.0),
                line("LOADS", (5.0, 1.0), (5.0, 2.0)),
                text((5.2, 1.5), "5 kN"),
            ]
            .concat(),
        );
        let r = read_str(&dxf, &ReadOptions::default()).unwrap();
        assert!(
            matches!(r.structure.left(), Support::Axis { x, foot, top, .. } if *x == 0.0 && *foot == 0.0 && *top == 12.0)
        );
    }

    #[test]
    fn a_multiline_mtext_label_takes_its_force_line() {
        assert_eq!(label_line("hanger H4\n30 kN"), "30 kN");
        assert_eq!(label_line("30 kN\n45 kN"), "30 kN 45 kN");
        assert_eq!(label_line("  85   kN "), "85 kN");
    }

    #[test]
    fn the_sketch_is_one_chain_and_separate_pieces_are_named() {
        let base = [point(0.0, 0.0), point(10.0, 0.0), line("LOADS", (5.0, 1.0), (5.0, 2.0)), text((5.2, 1.5), "5 kN")];
        // Two LINEs meeting end to end (one reversed) are one sketch.
        let joined =
            [base.concat(), line("SKETCH", (0.0, 0.0), (5.0, -2.0)), line("SKETCH", (10.0, 0.0), (5.0, -2.0))].concat();
        let r = read_str(&drawing(&joined), &ReadOptions::default()).unwrap();
        let s = r.sketch.expect("a sketch");
        assert_eq!(s.points.len(), 3);
        assert_eq!(s.from.len(), 2);
        // Two apart: an error naming both.
        let apart =
            [base.concat(), line("SKETCH", (0.0, 0.0), (4.0, -2.0)), line("SKETCH", (6.0, -2.0), (10.0, 0.0))].concat();
        let e = read_str(&drawing(&apart), &ReadOptions::default()).unwrap_err().to_string();
        assert!(e.contains("2 pieces") && e.matches("SKETCH").count() >= 3, "{e}");
        // No sketch layer: no sketch; a renamed one must exist.
        assert!(read_str(&two_loads(["1 kN", "2 kN"]), &ReadOptions::default()).unwrap().sketch.is_none());
        let mut o = ReadOptions::default();
        o.layers.sketch = "IDEA".into();
        o.layers.sketch_required = true;
        let e = read_str(&two_loads(["1 kN", "2 kN"]), &o).unwrap_err().to_string();
        assert!(e.contains("IDEA") && e.contains("--layer sketch=NAME"), "{e}");
    }
}
