//! The reader for assessment: an existing arch's faces, its fill and its
//! loads, from a scanned drawing.
//!
//! By layer (names are defaults; each can be renamed):
//! * `INTRADOS`, `EXTRADOS`: the arch's lower and upper faces, each as one
//!   chain of LINE, ARC, LWPOLYLINE (with bulges), POLYLINE or SPLINE
//!   entities meeting end to end, from springing to springing;
//! * `FILL` (optional): closed polylines bounding the fill or spandrel
//!   walls over the arch (the part inside the arch is not counted twice);
//! * `LOADS` (optional): point and distributed loads, read as in the design
//!   path ([`super::read`]).

use kurbo::{Point, Rect};

use super::drawn::{self, Drawn, drawn};
use super::{
    DrawingLayers, Ignored, LoadRead, LoadsRead, ReadError, ReadOptions, StretchRead, check_finite, length_unit,
    read_loads,
};
use crate::dxf::{File, Format, Release, ScanOptions};
use crate::model::{DistributedLoad, Load, Origin, fmt_num, fmt_xy};
use crate::units::Units;

/// The layers an arch is read from.
#[derive(Clone, Debug, PartialEq)]
pub struct ArchLayers {
    /// The lower face.
    pub intrados: String,
    /// The upper face.
    pub extrados: String,
    /// Fill or spandrel regions.
    pub fill: String,
    /// True when the fill layer was named by the user (then it must exist).
    pub fill_required: bool,
    /// Point and distributed loads with their labels.
    pub loads: String,
}

impl Default for ArchLayers {
    fn default() -> Self {
        ArchLayers {
            intrados: "INTRADOS".into(),
            extrados: "EXTRADOS".into(),
            fill: "FILL".into(),
            fill_required: false,
            loads: "LOADS".into(),
        }
    }
}

/// How to read an arch: its layers, and the units and load options of the
/// design path (whose `layers` are not used here).
#[derive(Clone, Debug, Default, PartialEq)]
pub struct ArchReadOptions {
    /// Input layers.
    pub layers: ArchLayers,
    /// Units and load magnitudes, as in the design path.
    pub read: ReadOptions,
}

/// A face as read: the chained points, and the entities it came from.
pub type FaceRead = super::Chain;

/// Everything read from a drawing of an arch.
#[derive(Clone, Debug)]
pub struct ArchReading {
    /// The lower face.
    pub intrados: FaceRead,
    /// The upper face.
    pub extrados: FaceRead,
    /// Fill regions: closed outlines (first point repeated at the end), and where drawn.
    pub fill: Vec<(Vec<Point>, Origin)>,
    /// Point loads.
    pub loads: Vec<Load>,
    /// Point loads as read.
    pub load_reads: Vec<LoadRead>,
    /// Distributed loads.
    pub distributed: Vec<DistributedLoad>,
    /// Distributed loads as read.
    pub stretches: Vec<StretchRead>,
    /// Length and force units.
    pub units: Units,
    /// How the length unit was decided.
    pub length_source: String,
    /// How the force unit was decided.
    pub force_source: String,
    /// The drawing's model-space extents (without the tool's own layers).
    pub extents: Option<Rect>,
    /// The drawing's release.
    pub release: Release,
    /// True for binary DXF.
    pub binary: bool,
    /// The drawing's layers, from its LAYER table.
    pub layers: Vec<String>,
    /// Things the user should know.
    pub warnings: Vec<String>,
}

/// The scan options the arch reader needs, plus `extra` layers (the tool's
/// output layers, which the writer must see and the extents must skip).
#[must_use]
pub fn scan_options<'a>(layers: &ArchLayers, extra: impl Iterator<Item = &'a str>) -> ScanOptions {
    super::scan_layers(&[&layers.intrados, &layers.extrados, &layers.fill, &layers.loads], extra)
}

/// Reads an arch from a scanned drawing.
pub fn read_arch(file: &File<'_>, options: &ArchReadOptions) -> Result<ArchReading, ReadError> {
    let layers = &options.layers;
    let drawing = DrawingLayers::new(file);
    let on = |name: &str| drawing.on(name);
    drawing.require("intrados", "intrados", &layers.intrados)?;
    drawing.require("extrados", "extrados", &layers.extrados)?;
    if layers.fill_required {
        drawing.require("fill", "fill", &layers.fill)?;
    }
    let mut warnings = drawing.warnings("the arch");

    let (length, length_source) = length_unit(file, &options.read, &mut warnings)?;
    let extents = file.extents.rect();
    let diagonal = extents.map_or(1.0, |r| r.width().hypot(r.height()));
    // Flattening: a chord error far below any joint's length.
    let tolerance = (diagonal * 1e-6).max(1e-9);
    // Ends closer than this are one point (snapped ends, round-off of arcs).
    let gap = (diagonal * 1e-7).max(1e-9);

    let mut face = |name: &str, layer: &str| -> Result<FaceRead, ReadError> {
        let mut pieces = Vec::new();
        let mut ignored = Ignored::default();
        for e in on(layer) {
            let d = drawn(file, e, tolerance);
            let o = drawn::origin(e, drawn::position(&d));
            check_finite(&d, &o)?;
            match d {
                Drawn::Line(l) if l.p0 != l.p1 => pieces.push((vec![l.p0, l.p1], o)),
                Drawn::Path(p) if p.len() >= 2 => pieces.push((p, o)),
                Drawn::Line(_) | Drawn::Path(_) => {
                    warnings.push(format!("{o}: a piece of the {name} without length was ignored"))
                }
                other => ignored.add(&other),
            }
        }
        ignored.warn(layer, &mut warnings);
        chain(name, layer, pieces, gap)
    };
    let intrados = face("intrados", &layers.intrados)?;
    let extrados = face("extrados", &layers.extrados)?;

    let mut fill = Vec::new();
    let mut ignored = Ignored::default();
    for e in on(&layers.fill) {
        let d = drawn(file, e, tolerance);
        let o = drawn::origin(e, drawn::position(&d));
        check_finite(&d, &o)?;
        match d {
            Drawn::Path(p) if p.len() >= 4 && p.first() == p.last() => fill.push((p, o)),
            Drawn::Path(_) => {
                return Err(ReadError::Geometry {
                    origin: o.to_string(),
                    problem: format!(
                        "a fill region on {} must be a closed polyline with at least three corners; close it (or move the entity off the layer)",
                        layers.fill
                    ),
                });
            }
            other => ignored.add(&other),
        }
    }
    ignored.warn(&layers.fill, &mut warnings);

    let LoadsRead { loads, mut reads, distributed, mut stretches, force_unit, force_source } =
        read_loads(file, &layers.loads, &options.read, length, tolerance, &mut warnings)?;
    reads.sort_by(|a, b| a.anchor.x.total_cmp(&b.anchor.x));
    stretches.sort_by(|a, b| a.x0.total_cmp(&b.x0));

    Ok(ArchReading {
        intrados,
        extrados,
        fill,
        loads,
        load_reads: reads,
        distributed,
        stretches,
        units: Units { length, force: force_unit },
        length_source,
        force_source,
        extents,
        release: file.release,
        binary: file.format != Format::Ascii,
        layers: drawing.table,
        warnings,
    })
}

/// Joins the pieces of a face end to end into one chain.
///
/// A face must be one open chain: every piece meets the next at an end
/// (within `gap`), and no three ends meet at one point.
pub(crate) fn chain(
    name: &str,
    layer: &str,
    mut pieces: Vec<(Vec<Point>, Origin)>,
    gap: f64,
) -> Result<FaceRead, ReadError> {
    let Some((first, origin)) = pieces.pop() else {
        return Err(ReadError::Geometry {
            origin: format!("layer {layer}"),
            problem: format!(
                "there is no {name} on it; draw the {name} as LINE, ARC, LWPOLYLINE, POLYLINE or SPLINE from springing to springing"
            ),
        });
    };
    let mut points = first;
    let mut from = vec![origin];
    let near = |a: Point, b: Point| (a - b).hypot() <= gap;
    // Round-off of arcs' ends (5.6e-16 for 0) would only distract.
    let shown =
        |p: Point| fmt_xy(Point::new(if p.x.abs() < gap { 0.0 } else { p.x }, if p.y.abs() < gap { 0.0 } else { p.y }));
    while !pieces.is_empty() {
        let (head, tail) = (points[0], points[points.len() - 1]);
        // The piece that continues the chain at either end.
        let found = pieces.iter().enumerate().find_map(|(i, (p, _))| {
            let (a, b) = (p[0], p[p.len() - 1]);
            if near(tail, a) {
                Some((i, true, false))
            } else if near(tail, b) {
                Some((i, true, true))
            } else if near(head, b) {
                Some((i, false, false))
            } else if near(head, a) {
                Some((i, false, true))
            } else {
                None
            }
        });
        let Some((i, at_tail, reverse)) = found else {
            let (p, o) = &pieces[0];
            return Err(ReadError::Geometry {
                origin: o.to_string(),
                problem: format!(
                    "this piece of the {name} does not meet the rest, whose ends are at ({}) and ({}) (it runs from ({}) to ({})); the {name} must be one chain of pieces meeting end to end: close the gap",
                    shown(head),
                    shown(tail),
                    shown(p[0]),
                    shown(p[p.len() - 1])
                ),
            });
        };
        let (mut p, o) = pieces.swap_remove(i);
        if reverse {
            p.reverse();
        }
        if at_tail {
            points.extend_from_slice(&p[1..]);
            from.push(o);
        } else {
            p.pop();
            p.extend_from_slice(&points);
            points = p;
            from.insert(0, o);
        }
    }
    if points.len() >= 3 && near(points[0], points[points.len() - 1]) {
        return Err(ReadError::Geometry {
            origin: from[0].to_string(),
            problem: format!(
                "the {name} on layer {layer} closes on itself (total length {}); draw the intrados and extrados as two open curves from springing to springing",
                fmt_num(points.windows(2).map(|w| (w[1] - w[0]).hypot()).sum::<f64>())
            ),
        });
    }
    Ok(FaceRead { points, from })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn o(h: &str) -> Origin {
        Origin { layer: "INTRADOS".into(), handle: Some(h.into()), at: Point::ZERO }
    }

    #[test]
    fn pieces_in_any_order_and_direction_chain_into_one_face() {
        let pieces = vec![
            (vec![Point::new(2.0, 1.0), Point::new(1.0, 1.5)], o("B")),
            (vec![Point::new(0.0, 0.0), Point::new(1.0, 1.5)], o("A")),
            (vec![Point::new(2.0, 1.0), Point::new(3.0, 0.0)], o("C")),
        ];
        let f = chain("intrados", "INTRADOS", pieces, 1e-9).unwrap();
        let xs: Vec<f64> = f.points.iter().map(|p| p.x).collect();
        assert!(xs == [0.0, 1.0, 2.0, 3.0] || xs == [3.0, 2.0, 1.0, 0.0], "{xs:?}");
        assert_eq!(f.from.len(), 3);
    }

    #[test]
    fn a_gap_is_an_error_naming_the_stray_piece() {
        let pieces = vec![
            (vec![Point::new(0.0, 0.0), Point::new(1.0, 1.0)], o("A")),
            (vec![Point::new(1.5, 1.0), Point::new(3.0, 0.0)], o("B")),
        ];
        let e = chain("intrados", "INTRADOS", pieces, 1e-9).unwrap_err().to_string();
        assert!(e.contains("does not meet the rest") && e.contains("entity A"), "{e}");
    }

    #[test]
    fn a_closed_face_is_an_error() {
        let pieces =
            vec![(vec![Point::new(0.0, 0.0), Point::new(1.0, 1.0), Point::new(2.0, 0.0), Point::ZERO], o("A"))];
        let e = chain("extrados", "EXTRADOS", pieces, 1e-9).unwrap_err().to_string();
        assert!(e.contains("closes on itself"), "{e}");
    }
}
