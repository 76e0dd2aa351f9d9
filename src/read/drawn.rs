//! What one entity draws, in world coordinates: the reader's view of an
//! entity, free of group codes.

use kurbo::{Arc, BezPath, Line, Point, Shape as _, Vec2};

use super::spline;
use crate::dxf::{EntityRef, File, Pair, ocs_to_wcs};
use crate::model::Origin;

/// One attribute of an INSERT.
#[derive(Clone, Debug, PartialEq)]
pub struct Attribute {
    /// The attribute tag (group code 2).
    pub tag: String,
    /// Its value (group code 1), decoded.
    pub value: String,
}

/// A text's content and where it shows.
#[derive(Clone, Debug, PartialEq)]
pub struct Label {
    /// The stored string (formatting codes not yet stripped).
    pub raw: String,
    /// True for MTEXT (inline formatting codes), false for TEXT.
    pub mtext: bool,
    /// Estimated centre of the text as displayed.
    pub centre: Point,
}

/// The geometry of an entity, as far as the reader cares.
#[derive(Clone, Debug, PartialEq)]
pub enum Drawn {
    /// A POINT.
    Point(Point),
    /// A CIRCLE: its centre.
    Circle(Point),
    /// A block reference.
    Insert {
        /// Insertion point.
        at: Point,
        /// Rotation in degrees (world).
        rotation: f64,
        /// Attributes that follow it.
        attributes: Vec<Attribute>,
    },
    /// A LINE.
    Line(Line),
    /// A LWPOLYLINE, POLYLINE, ARC or SPLINE, flattened into straight pieces.
    Path(Vec<Point>),
    /// A TEXT or MTEXT.
    Text(Label),
    /// Anything else: the entity type.
    Other(String),
}

/// Average glyph width of a text font as a fraction of its height, for
/// estimating where a text's centre lies (common practice, no source).
const GLYPH_WIDTH: f64 = 0.6;

/// Reads an entity (with its sub-entities) into [`Drawn`], with `tolerance`
/// the largest chord error allowed when flattening arcs, bulges and splines.
pub fn drawn(file: &File<'_>, e: &EntityRef, tolerance: f64) -> Drawn {
    let mut pairs = file.pairs_in(&e.span);
    // Skip the entity's own 0 pair.
    pairs.next();
    let own: Vec<Pair<'_>> = pairs.by_ref().take_while(|p| p.code != 0).collect();
    let g = Codes(&own);
    let n = [g.f64(210).unwrap_or(0.0), g.f64(220).unwrap_or(0.0), g.f64(230).unwrap_or(1.0)];
    let ocs = |code: i32| ocs_to_wcs(n, [g.f64(code).unwrap_or(0.0), g.f64(code + 10).unwrap_or(0.0), 0.0]);
    let wcs = |code: i32| Point::new(g.f64(code).unwrap_or(0.0), g.f64(code + 10).unwrap_or(0.0));
    match e.kind.as_str() {
        "POINT" => Drawn::Point(wcs(10)),
        "CIRCLE" => Drawn::Circle(ocs(10)),
        "LINE" => Drawn::Line(Line::new(wcs(10), wcs(11))),
        "INSERT" => {
            let at = ocs(10);
            let mut rotation = g.f64(50).unwrap_or(0.0);
            if n[2] < 0.0 {
                // Mirrored extrusion: the block's x axis points the other way.
                rotation = 180.0 - rotation;
            }
            Drawn::Insert { at, rotation, attributes: attributes(file, e) }
        }
        "TEXT" => {
            let raw = file.text(g.raw(1).unwrap_or_default()).into_owned();
            let h = g.f64(40).unwrap_or(1.0).abs();
            let rot = g.f64(50).unwrap_or(0.0).to_radians();
            let width = GLYPH_WIDTH * h * g.f64(41).unwrap_or(1.0).abs() * raw.chars().count() as f64;
            let (h_align, v_align) = (g.i64(72).unwrap_or(0), g.i64(73).unwrap_or(0));
            let centre = if h_align == 0 && v_align == 0 {
                ocs(10) + rotate(Vec2::new(width / 2.0, h / 2.0), rot)
            } else if h_align == 3 || h_align == 5 {
                // Aligned or fit: the text runs between the two points.
                ocs(10).midpoint(ocs(11)) + rotate(Vec2::new(0.0, h / 2.0), rot)
            } else {
                let dx = match h_align {
                    0 => width / 2.0,
                    2 => -width / 2.0,
                    _ => 0.0,
                };
                let dy = match (h_align, v_align) {
                    (4, _) | (_, 2) => 0.0,
                    (_, 3) => -h / 2.0,
                    _ => h / 2.0,
                };
                ocs(11) + rotate(Vec2::new(dx, dy), rot)
            };
            Drawn::Text(Label { raw, mtext: false, centre })
        }
        "MTEXT" => {
            // The text may continue in group 3 chunks before group 1.
            let mut raw = String::new();
            for p in own.iter().filter(|p| p.code == 3) {
                raw.push_str(&file.text(p.raw));
            }
            raw.push_str(&file.text(g.raw(1).unwrap_or_default()));
            let h = g.f64(40).unwrap_or(1.0).abs();
            let dir = match (g.f64(11), g.f64(21)) {
                (Some(x), Some(y)) if x != 0.0 || y != 0.0 => y.atan2(x),
                _ => g.f64(50).unwrap_or(0.0).to_radians(),
            };
            let plain = crate::read::mtext::plain_mtext(&raw);
            let lines = plain.lines().count().max(1) as f64;
            let longest = plain.lines().map(|l| l.chars().count()).max().unwrap_or(0) as f64;
            let width = GLYPH_WIDTH * h * longest;
            let height = h * (1.0 + 1.6 * (lines - 1.0));
            let attach = g.i64(71).unwrap_or(1).clamp(1, 9) - 1;
            let dx = match attach % 3 {
                0 => width / 2.0,
                1 => 0.0,
                _ => -width / 2.0,
            };
            let dy = match attach / 3 {
                0 => -height / 2.0,
                1 => 0.0,
                _ => height / 2.0,
            };
            Drawn::Text(Label { raw, mtext: true, centre: wcs(10) + rotate(Vec2::new(dx, dy), dir) })
        }
        "LWPOLYLINE" => {
            let mut verts: Vec<(Point, f64)> = Vec::new();
            let elevation = g.f64(38).unwrap_or(0.0);
            let mut x = None;
            for p in &own {
                match p.code {
                    10 => x = p.f64(),
                    20 => {
                        if let Some(x) = x.take() {
                            let y = p.f64().unwrap_or(f64::NAN);
                            verts.push((ocs_to_wcs(n, [x, y, elevation]), 0.0));
                        }
                    }
                    42 => {
                        if let Some(last) = verts.last_mut() {
                            last.1 = p.f64().unwrap_or(0.0);
                        }
                    }
                    _ => {}
                }
            }
            let closed = g.i64(70).unwrap_or(0) & 1 == 1;
            // A mirrored OCS turns counter-clockwise arcs clockwise.
            let flip = if n[2] < 0.0 { -1.0 } else { 1.0 };
            Drawn::Path(flatten_bulges(&verts, closed, flip, tolerance))
        }
        "POLYLINE" => {
            let flags = g.i64(70).unwrap_or(0);
            let mut verts: Vec<(Point, f64)> = Vec::new();
            let mut sub = file.pairs_in(&e.span).peekable();
            while let Some(p) = sub.next() {
                if p.code == 0 && p.is("VERTEX") {
                    let mut v = Vec::new();
                    while let Some(q) = sub.next_if(|q| q.code != 0) {
                        v.push(q);
                    }
                    let vc = Codes(&v);
                    // Skip spline frame control points (flag 16).
                    if vc.i64(70).unwrap_or(0) & 16 != 0 {
                        continue;
                    }
                    let pt = [vc.f64(10).unwrap_or(0.0), vc.f64(20).unwrap_or(0.0), vc.f64(30).unwrap_or(0.0)];
                    let pt = if flags & (8 | 16 | 64) != 0 { Point::new(pt[0], pt[1]) } else { ocs_to_wcs(n, pt) };
                    verts.push((pt, vc.f64(42).unwrap_or(0.0)));
                }
            }
            let flip = if n[2] < 0.0 { -1.0 } else { 1.0 };
            Drawn::Path(flatten_bulges(&verts, flags & 1 == 1, flip, tolerance))
        }
        "ARC" => {
            let c = [g.f64(10).unwrap_or(0.0), g.f64(20).unwrap_or(0.0)];
            let r = g.f64(40).unwrap_or(0.0).abs();
            if !r.is_finite() {
                // No arc to flatten; the coordinate check refuses the point.
                return Drawn::Path(vec![ocs_to_wcs(n, [c[0] + r, c[1], 0.0])]);
            }
            // At most one turn, whatever the angles say.
            let a0 = g.f64(50).unwrap_or(0.0).rem_euclid(360.0).to_radians();
            let mut a1 = g.f64(51).unwrap_or(0.0).rem_euclid(360.0).to_radians();
            if a1 <= a0 {
                a1 += std::f64::consts::TAU;
            }
            let arc = Arc::new((c[0], c[1]), (r, r), a0, a1 - a0, 0.0);
            let tol = arc_tolerance(tolerance, r);
            let pts: Vec<Point> =
                flatten(&arc.into_path(tol), tol).into_iter().map(|p| ocs_to_wcs(n, [p.x, p.y, 0.0])).collect();
            Drawn::Path(pts)
        }
        "SPLINE" => Drawn::Path(spline::flatten(&spline_data(&own), tolerance)),
        other => Drawn::Other(other.to_string()),
    }
}

/// What a SPLINE's own group codes say (see [`spline::SplineData`]).
fn spline_data(own: &[Pair<'_>]) -> spline::SplineData {
    let g = Codes(own);
    let mut s =
        spline::SplineData { degree: g.i64(71).unwrap_or(3), flags: g.i64(70).unwrap_or(0), ..Default::default() };
    let (mut cx, mut fx, mut t0, mut t1) = (None, None, None, None);
    let y = |p: &Pair<'_>| p.f64().unwrap_or(f64::NAN);
    for p in own.iter().take_while(|p| p.code < 1000) {
        match p.code {
            40 => s.knots.push(p.f64().unwrap_or(f64::NAN)),
            41 => s.weights.push(p.f64().unwrap_or(f64::NAN)),
            10 => cx = p.f64(),
            20 => {
                if let Some(x) = cx.take() {
                    s.control.push(Point::new(x, y(p)));
                }
            }
            11 => fx = p.f64(),
            21 => {
                if let Some(x) = fx.take() {
                    s.fit.push(Point::new(x, y(p)));
                }
            }
            12 => t0 = p.f64(),
            22 => s.start_tangent = t0.take().map(|x| Vec2::new(x, y(p))),
            13 => t1 = p.f64(),
            23 => s.end_tangent = t1.take().map(|x| Vec2::new(x, y(p))),
            _ => {}
        }
    }
    s
}

/// A warning for an entity that is read only approximately: a SPLINE given
/// by fit points alone (see [`spline`]'s doc); `None` for anything else.
#[must_use]
pub fn approximate(file: &File<'_>, e: &EntityRef) -> Option<String> {
    if e.kind != "SPLINE" {
        return None;
    }
    let own: Vec<Pair<'_>> = file.pairs_in(&e.span).skip(1).take_while(|p| p.code != 0).collect();
    spline::is_fit_only(&spline_data(&own)).then(|| {
        format!(
            "the SPLINE{} on layer {} has fit points only; it is read as the smooth cubic through them, which may differ slightly near its ends from the curve your CAD program shows: to be exact, convert it to control points and save again",
            e.handle.as_ref().map(|h| format!(" {h}")).unwrap_or_default(),
            e.layer
        )
    })
}

fn attributes(file: &File<'_>, e: &EntityRef) -> Vec<Attribute> {
    let mut out = Vec::new();
    let mut pairs = file.pairs_in(&e.span).peekable();
    pairs.next();
    while let Some(p) = pairs.next() {
        if p.code == 0 && p.is("ATTRIB") {
            let mut tag = String::new();
            let mut value = String::new();
            while let Some(q) = pairs.next_if(|q| q.code != 0) {
                match q.code {
                    2 => tag = file.text(q.raw).trim().to_string(),
                    1 => value = file.text(q.raw).into_owned(),
                    _ => {}
                }
            }
            out.push(Attribute { tag, value });
        }
    }
    out
}

fn rotate(v: Vec2, angle: f64) -> Vec2 {
    let (s, c) = angle.sin_cos();
    Vec2::new(v.x * c - v.y * s, v.x * s + v.y * c)
}

/// Straight pieces of a polyline with bulges (bulge = tan(θ/4) of the arc's
/// included angle θ, negative clockwise — DXF reference, LWPOLYLINE 42).
fn flatten_bulges(verts: &[(Point, f64)], closed: bool, flip: f64, tolerance: f64) -> Vec<Point> {
    let mut out = Vec::new();
    let count = if closed { verts.len() } else { verts.len().saturating_sub(1) };
    if let Some(first) = verts.first() {
        out.push(first.0);
    }
    for i in 0..count {
        let (a, bulge) = verts[i];
        let b = verts[(i + 1) % verts.len()].0;
        let bulge = bulge * flip;
        if bulge == 0.0 || !bulge.is_finite() || a == b {
            out.push(b);
            continue;
        }
        let theta = 4.0 * bulge.atan();
        let chord = b - a;
        let d = chord.hypot();
        let r = d / (2.0 * (theta / 2.0).sin());
        if !r.is_finite() {
            // A bulge too small for its chord (straight to within round-off),
            // or a chord of infinite length: no arc to flatten.
            out.push(b);
            continue;
        }
        // Centre: from the chord's midpoint along its left normal.
        let m = a.midpoint(b);
        let normal = Vec2::new(-chord.y, chord.x) / d;
        let h = r * (theta / 2.0).cos();
        let c = m + normal * h;
        let start = (a - c).atan2();
        let arc = Arc::new(c, (r.abs(), r.abs()), start, theta, 0.0);
        let tol = arc_tolerance(tolerance, r.abs());
        let pts = flatten(&arc.into_path(tol), tol);
        out.extend(pts.into_iter().skip(1));
        // Land exactly on the vertex.
        if let Some(last) = out.last_mut() {
            *last = b;
        }
    }
    out
}

/// The chord tolerance for an arc of radius `r`: the drawing's, but never
/// finer than 2·10⁻⁶ of the radius, which bounds a full turn to about 1,600
/// pieces whatever the radius (an arc of absurd radius must not exhaust
/// memory).
fn arc_tolerance(tolerance: f64, r: f64) -> f64 {
    let t = tolerance.max(r * 2e-6);
    if t.is_finite() && t > 0.0 { t } else { 1.0 }
}

/// The points of a path flattened to straight pieces within `tolerance`.
fn flatten(path: &BezPath, tolerance: f64) -> Vec<Point> {
    let mut pts = Vec::new();
    kurbo::flatten(path, tolerance, |el| match el {
        kurbo::PathEl::MoveTo(p) | kurbo::PathEl::LineTo(p) => pts.push(p),
        _ => {}
    });
    pts
}

/// Looks up group codes among an entity's own pairs.
struct Codes<'p, 'a>(&'p [Pair<'a>]);

impl<'a> Codes<'_, 'a> {
    fn find(&self, code: i32) -> Option<&Pair<'a>> {
        // XDATA (1000+) never shadows an entity's own codes: it comes last.
        self.0.iter().take_while(|p| p.code < 1000).find(|p| p.code == code)
    }

    fn f64(&self, code: i32) -> Option<f64> {
        self.find(code)?.f64()
    }

    fn i64(&self, code: i32) -> Option<i64> {
        self.find(code)?.i64()
    }

    fn raw(&self, code: i32) -> Option<&'a [u8]> {
        self.find(code).map(|p| p.raw)
    }
}

/// A representative position of a drawn item, for messages.
#[must_use]
pub fn position(d: &Drawn) -> Point {
    match d {
        Drawn::Point(p) | Drawn::Circle(p) => *p,
        Drawn::Insert { at, .. } => *at,
        Drawn::Line(l) => l.p0.midpoint(l.p1),
        Drawn::Path(p) => p.first().copied().unwrap_or(Point::ORIGIN),
        Drawn::Text(t) => t.centre,
        Drawn::Other(_) => Point::ORIGIN,
    }
}

/// The origin record of an entity, for messages.
#[must_use]
pub fn origin(e: &EntityRef, at: Point) -> Origin {
    Origin { layer: e.layer.clone(), handle: e.handle.clone(), at }
}

/// Every coordinate of a drawn item, to check that they are finite.
#[must_use]
pub fn coordinates(d: &Drawn) -> Vec<Point> {
    match d {
        Drawn::Point(p) | Drawn::Circle(p) => vec![*p],
        Drawn::Insert { at, .. } => vec![*at],
        Drawn::Line(l) => vec![l.p0, l.p1],
        Drawn::Path(p) => p.clone(),
        Drawn::Text(t) => vec![t.centre],
        Drawn::Other(_) => Vec::new(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::dxf::ScanOptions;

    fn off_chord(q: Point, a: Point, b: Point) -> f64 {
        let ab = b - a;
        let t = if ab.hypot2() > 0.0 { ((q - a).dot(ab) / ab.hypot2()).clamp(0.0, 1.0) } else { 0.0 };
        (q - (a + ab * t)).hypot()
    }

    fn distance(q: Point, line: &[Point]) -> f64 {
        line.windows(2).map(|w| off_chord(q, w[0], w[1])).fold(f64::INFINITY, f64::min)
    }

    /// One spline: its handle, our points, ezdxf's points, what it is.
    type Read = (String, Vec<Point>, Vec<Point>, String);

    /// The splines of a fixture drawing read by us, with ezdxf's flattening
    /// of each from the JSON file beside it: (handle, ours, ezdxf's, what).
    fn splines(name: &str, tolerance: f64) -> (f64, Vec<Read>) {
        let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("fixtures/arch");
        let bytes = std::fs::read(dir.join(format!("{name}.dxf"))).unwrap();
        let json: serde_json::Value =
            serde_json::from_slice(&std::fs::read(dir.join(format!("{name}.points.json"))).unwrap()).unwrap();
        let options = ScanOptions { keep_layers: vec!["INTRADOS".into(), "EXTRADOS".into()], ..ScanOptions::default() };
        let file = File::scan(&bytes, &options).unwrap();
        let mut out = Vec::new();
        for e in file.entities.iter().filter(|e| e.kind == "SPLINE") {
            let handle = e.handle.clone().unwrap();
            let theirs = &json["splines"][&handle];
            let pts: Vec<Point> = theirs["points"]
                .as_array()
                .unwrap()
                .iter()
                .map(|p| Point::new(p[0].as_f64().unwrap(), p[1].as_f64().unwrap()))
                .collect();
            let what = theirs["kind"].as_str().or(theirs["layer"].as_str()).unwrap().to_string();
            let Drawn::Path(ours) = drawn(&file, e, tolerance) else { panic!("SPLINE {handle} not read as a path") };
            out.push((handle, ours, pts, what));
        }
        (json["flattening"].as_f64().unwrap(), out)
    }

    /// Ours against ezdxf's evaluation (ezdxf 1.4.5, an independent reader):
    /// every point ezdxf puts on the curve lies within our tolerance of our
    /// polyline, and every point of ours within ezdxf's flattening distance
    /// of its polyline (our points lie on the curve). Round-off margin: the
    /// JSON's 12 significant digits.
    fn agree(name: &str, tolerance: f64, skip: &[&str]) -> usize {
        let (theirs_tol, found) = splines(name, tolerance);
        let margin = 1e-9;
        let mut checked = 0;
        for (handle, ours, theirs, what) in found {
            if skip.contains(&what.as_str()) {
                continue;
            }
            let a = theirs.iter().map(|q| distance(*q, &ours)).fold(0.0, f64::max);
            let b = ours.iter().map(|q| distance(*q, &theirs)).fold(0.0, f64::max);
            assert!(a <= tolerance + margin, "{name} SPLINE {handle} ({what}): ezdxf's points {a} from ours");
            assert!(b <= theirs_tol + margin, "{name} SPLINE {handle} ({what}): our points {b} from ezdxf's");
            assert!((ours[0] - theirs[0]).hypot() < margin, "{name} SPLINE {handle} ({what}): start");
            assert!((ours[ours.len() - 1] - theirs[theirs.len() - 1]).hypot() < margin, "{handle}: end");
            checked += 1;
        }
        checked
    }

    #[test]
    fn splines_agree_with_ezdxf() {
        assert_eq!(agree("parabolic-m-r2018", 1e-3, &[]), 2);
        assert_eq!(agree("spline-kinds-m-r2018", 1e-3, &["fit points only"]), 4);
    }

    /// The parabolic faces are exact parabolas y = h(1 − 4x²/L²) (the
    /// generator builds them by degree elevation and knot insertion, which
    /// do not move a curve): every point we read lies on the closed form.
    #[test]
    fn parabolic_faces_are_on_the_closed_form() {
        let (_, found) = splines("parabolic-m-r2018", 1e-4);
        for (handle, ours, _, what) in found {
            let (l, h) = if what == "INTRADOS" { (10.0, 3.5) } else { (11.0, 4.1) };
            for p in &ours {
                let y = h * (1.0 - 4.0 * p.x * p.x / (l * l));
                assert!((p.y - y).abs() < 1e-9, "SPLINE {handle}: {p:?} off the parabola by {}", p.y - y);
            }
        }
    }

    /// A fit-point spline with no end tangents: we use natural ends, ezdxf
    /// its own end conditions. Measured with ezdxf 1.4.5: its curve lies
    /// within 9.8·10⁻⁴ of our polyline flattened to 10⁻³, i.e. within the
    /// flattening; the bound allows a further 10⁻³ of difference in the
    /// curves (our choice).
    #[test]
    fn fit_point_spline_is_close_to_ezdxf() {
        let (_, found) = splines("spline-kinds-m-r2018", 1e-3);
        let (_, ours, theirs, _) = found.into_iter().find(|f| f.3 == "fit points only").unwrap();
        let a = theirs.iter().map(|q| distance(*q, &ours)).fold(0.0, f64::max);
        assert!(a < 2e-3, "fit-point spline: ezdxf's curve up to {a} from ours");
    }
}

/// The arch fixtures read by [`drawn`] and cut by [`crate::arch::slice`]:
/// the two stages together against closed forms.
#[cfg(test)]
mod arch_fixtures {
    use super::*;
    use crate::arch::LoadKind;
    use crate::arch::outline::Outline;
    use crate::arch::slice::{Cuts, Division, SliceOptions, slice};
    use crate::dxf::ScanOptions;
    use std::f64::consts::PI;

    /// The paths on each of INTRADOS, EXTRADOS and FILL, in drawing order.
    fn faces(name: &str, tolerance: f64) -> [Vec<Vec<Point>>; 3] {
        let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("fixtures/arch").join(name);
        let bytes = std::fs::read(path).unwrap();
        let layers = ["INTRADOS", "EXTRADOS", "FILL"];
        let options = ScanOptions { keep_layers: layers.map(String::from).to_vec(), ..ScanOptions::default() };
        let file = File::scan(&bytes, &options).unwrap();
        layers.map(|layer| {
            file.entities
                .iter()
                .filter(|e| e.layer == layer)
                .filter_map(|e| match drawn(&file, e, tolerance) {
                    Drawn::Path(p) => Some(p),
                    _ => None,
                })
                .collect()
        })
    }

    /// The semicircular ring (ARCs): half an annulus, π(R_e² − R_i²)/2, and
    /// fill to the road, 11.2 × 5.2 − πR_e²/2 (elementary geometry), each to
    /// within what flattening to `tol` can cut off (chord error × length).
    #[test]
    fn semicircle_from_arcs() {
        let tol = 1e-4;
        let [i, e, fill] = faces("semicircle-m-r2018.dxf", tol);
        let o = Outline::new(i[0].clone(), e[0].clone()).unwrap();
        let (ri, re) = (4.0, 4.6);
        let ring = PI * (re * re - ri * ri) / 2.0;
        let slack = tol * PI * (ri + re);
        assert!((o.area() - ring).abs() <= slack, "ring {} vs {ring}", o.area());
        let options = SliceOptions {
            cuts: Cuts::Radial,
            division: Division::Count(9),
            weight_per_area: 1.0,
            fill_weight_per_area: 1.0,
        };
        let s = slice(&o, &fill, &[], &[], &options).unwrap();
        assert_eq!(s.warnings.len(), 1);
        assert!(s.warnings[0].contains("area 10.4 "), "{}", s.warnings[0]);
        let total = |kind| total_of(&s, kind);
        let expect = 11.2 * 5.2 - PI * re * re / 2.0;
        // Fill beyond the extrados' x-range (|x| > 4.6, 2 × 1 × 5.2) is not counted.
        let expect_counted = expect - 2.0 * 5.2;
        assert!((total(LoadKind::OwnWeight) - o.area()).abs() < 1e-9);
        assert!((total(LoadKind::Fill) - expect_counted).abs() <= 2.0 * slack, "fill {}", total(LoadKind::Fill));
        let s = slice(&o, &fill, &[], &[], &SliceOptions { cuts: Cuts::Vertical, ..options }).unwrap();
        assert!((total_of(&s, LoadKind::Fill) - expect_counted).abs() <= 2.0 * slack);
    }

    fn total_of(s: &crate::arch::slice::Sliced, kind: LoadKind) -> f64 {
        s.ring.blocks.iter().flatten().filter(|l| l.kind == kind).map(|l| -l.force.y).sum()
    }

    /// The segmental ring (bulges): an annular sector of angle 2·asin(4/5)
    /// about (0, −3), (θ/2)(R_e² − R_i²) (elementary geometry); its
    /// springing lines and every joint point at the centre, to within the
    /// flattening (the faces' polylines have chords of their own, so their
    /// arc-length fractions pair up to about the chord error).
    #[test]
    fn segmental_from_bulges() {
        let tol = 1e-4;
        let [i, e, _] = faces("segmental-m-r2013.dxf", tol);
        let o = Outline::new(i[0].clone(), e[0].clone()).unwrap();
        let theta = 2.0 * (0.8f64).asin();
        let (ri, re) = (5.0, 5.6);
        let expect = theta / 2.0 * (re * re - ri * ri);
        assert!((o.area() - expect).abs() <= tol * theta * (ri + re), "{} vs {expect}", o.area());
        assert!((o.span() - 8.0).abs() < 1e-9 && (o.rise() - 2.0).abs() < 1e-9);
        assert!((o.crown_thickness() - 0.6).abs() < 1e-9);
        let centre = Point::new(0.0, -3.0);
        for k in 0..=16 {
            let j = o.joint_at(k as f64 / 16.0);
            let (a, b) = (j.intrados - centre, j.extrados - centre);
            let off = a.cross(b).abs() / b.hypot();
            assert!(off <= 2.0 * tol, "joint {k} is {off} off the radius: {j:?}");
        }
    }
}
