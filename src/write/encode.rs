//! Encoding the tool's shapes, table records and blocks as DXF pairs, as
//! each release expects them (DXF reference: "ENTITIES section",
//! "TABLES section", "BLOCKS section"; subclass markers and owner handles
//! from R13 on, LWPOLYLINE from R2000 on here).

use kurbo::Point;

use crate::dxf::{Encoder, Release};
use crate::layout::{DimStyle, HAlign, Shape, Text, VAlign};

/// Hands out handles from `$HANDSEED` on, or none when the drawing has none.
#[derive(Clone, Debug)]
pub struct Handles {
    next: Option<u64>,
    /// Set when the 64-bit handle space ran out.
    pub exhausted: bool,
}

impl Handles {
    /// Handles starting at `seed`; `None` for a drawing without handles.
    #[must_use]
    pub fn new(seed: Option<u64>) -> Handles {
        Handles { next: seed, exhausted: false }
    }

    /// The next handle, if the drawing uses handles. Past the last handle
    /// there is none: [`Handles::exhausted`] is set, and the caller refuses
    /// the output.
    pub fn take(&mut self) -> Option<u64> {
        let h = self.next?;
        match h.checked_add(1) {
            Some(n) => self.next = Some(n),
            None => self.exhausted = true,
        }
        Some(h)
    }

    /// The seed to store back in `$HANDSEED`.
    #[must_use]
    pub fn seed(&self) -> Option<u64> {
        self.next
    }
}

/// Writes entities and records for one release into an [`Encoder`].
pub struct Pen<'h> {
    /// Where the pairs go.
    pub enc: Encoder,
    /// The drawing's release.
    pub release: Release,
    /// The handle source.
    pub handles: &'h mut Handles,
    /// The exact name of the STANDARD text style, if the drawing has one.
    pub text_style: Option<String>,
}

impl Pen<'_> {
    fn modern(&self) -> bool {
        self.release.has_subclasses()
    }

    /// Opens an entity: type, handle, owner, common subclass, layer, colour.
    fn head(&mut self, kind: &str, owner: Option<u64>, layer: &str, colour: Option<i16>) -> Option<u64> {
        self.enc.text(0, kind);
        let h = self.handles.take();
        if let Some(h) = h {
            self.enc.handle(5, h);
        }
        if self.modern() {
            if let Some(o) = owner {
                self.enc.handle(330, o);
            }
            self.enc.text(100, "AcDbEntity");
        }
        self.enc.text(8, layer);
        if let Some(c) = colour {
            self.enc.int(62, i64::from(c));
        }
        h
    }

    fn subclass(&mut self, name: &str) {
        if self.modern() {
            self.enc.text(100, name);
        }
    }

    /// Writes one shape as an entity owned by `owner` (a block record handle).
    /// A dimension needs its block name, given by the caller.
    pub fn shape(&mut self, shape: &Shape, owner: Option<u64>, layer: &str, colour: Option<i16>, block: Option<&str>) {
        match shape {
            Shape::Line(l) => {
                self.head("LINE", owner, layer, colour);
                self.subclass("AcDbLine");
                self.enc.point(10, l.p0).point(11, l.p1);
            }
            Shape::Polyline { points, closed } => self.polyline(points, *closed, owner, layer, colour),
            Shape::Circle { center, radius } => {
                self.head("CIRCLE", owner, layer, colour);
                self.subclass("AcDbCircle");
                self.enc.point(10, *center).real(40, *radius);
            }
            Shape::Solid(p) => {
                self.head("SOLID", owner, layer, colour);
                self.subclass("AcDbTrace");
                self.enc.point(10, p[0]).point(11, p[1]).point(12, p[2]).point(13, p[2]);
            }
            Shape::Text(t) => self.text(t, owner, layer, colour),
            Shape::Dimension(d) => {
                self.head("DIMENSION", owner, layer, colour);
                self.subclass("AcDbDimension");
                self.enc.text(2, block.unwrap_or_default()).text(3, DIM_STYLE_NAME);
                self.enc.point(10, d.line_at).point(11, d.text_at);
                // 32: the block is this dimension's own; 128: text placed by us.
                self.enc.int(70, if d.text_moved { 32 | 128 } else { 32 });
                if self.modern() {
                    self.enc.int(71, 5);
                }
                if self.release >= Release::R2000 {
                    self.enc.real(42, d.measurement);
                }
                self.enc.text(1, &d.override_text);
                self.subclass("AcDbAlignedDimension");
                self.enc.point(13, d.p1).point(14, d.p2);
                self.enc.real(50, d.angle);
                self.subclass("AcDbRotatedDimension");
            }
        }
    }

    fn polyline(&mut self, points: &[Point], closed: bool, owner: Option<u64>, layer: &str, colour: Option<i16>) {
        let flags = i64::from(closed);
        if self.release >= Release::R2000 {
            self.head("LWPOLYLINE", owner, layer, colour);
            self.subclass("AcDbPolyline");
            self.enc.int(90, points.len() as i64).int(70, flags);
            for p in points {
                self.enc.real(10, p.x).real(20, p.y);
            }
            return;
        }
        let me = self.head("POLYLINE", owner, layer, colour);
        self.subclass("AcDb2dPolyline");
        self.enc.int(66, 1).point(10, Point::ORIGIN).int(70, flags);
        for p in points {
            self.head("VERTEX", me, layer, colour);
            self.subclass("AcDbVertex");
            self.subclass("AcDb2dVertex");
            self.enc.point(10, *p).int(70, 0);
        }
        self.head("SEQEND", me, layer, colour);
    }

    fn text(&mut self, t: &Text, owner: Option<u64>, layer: &str, colour: Option<i16>) {
        self.head("TEXT", owner, layer, colour);
        self.subclass("AcDbText");
        let h = match t.h {
            HAlign::Left => 0,
            HAlign::Center => 1,
            HAlign::Right => 2,
        };
        let v = match t.v {
            VAlign::Baseline => 0,
            VAlign::Bottom => 1,
            VAlign::Middle => 2,
            VAlign::Top => 3,
        };
        self.enc.point(10, t.at).real(40, t.height).text(1, &t.content);
        if t.rotation != 0.0 {
            self.enc.real(50, t.rotation);
        }
        if let Some(style) = self.text_style.clone() {
            self.enc.text(7, &style);
        }
        if h != 0 {
            self.enc.int(72, h);
        }
        if h != 0 || v != 0 {
            self.enc.point(11, t.at);
        }
        self.subclass("AcDbText");
        if v != 0 {
            self.enc.int(73, v);
        }
    }

    /// A LAYER table record.
    pub fn layer_record(
        &mut self,
        table: Option<u64>,
        name: &str,
        colour: i16,
        linetype: &str,
        plot_style: Option<u64>,
    ) {
        self.enc.text(0, "LAYER");
        if let Some(h) = self.handles.take() {
            self.enc.handle(5, h);
        }
        if self.modern() {
            if let Some(t) = table {
                self.enc.handle(330, t);
            }
            self.enc.text(100, "AcDbSymbolTableRecord").text(100, "AcDbLayerTableRecord");
        }
        self.enc.text(2, name).int(70, 0).int(62, i64::from(colour)).text(6, linetype);
        if self.release >= Release::R2000 {
            self.enc.int(370, -3);
            if let Some(p) = plot_style {
                self.enc.handle(390, p);
            }
        }
    }

    /// The DIMSTYLE record for the tool's dimensions.
    pub fn dim_style_record(&mut self, table: Option<u64>, s: &DimStyle) {
        self.enc.text(0, "DIMSTYLE");
        if let Some(h) = self.handles.take() {
            self.enc.handle(105, h);
        }
        if self.modern() {
            if let Some(t) = table {
                self.enc.handle(330, t);
            }
            self.enc.text(100, "AcDbSymbolTableRecord").text(100, "AcDbDimStyleTableRecord");
        }
        self.enc.text(2, DIM_STYLE_NAME).int(70, 0);
        self.enc
            .real(40, 1.0) // DIMSCALE
            .real(41, s.arrow) // DIMASZ
            .real(42, s.ext_offset) // DIMEXO
            .real(43, s.text_height * 1.5) // DIMDLI
            .real(44, s.ext_extend) // DIMEXE
            .real(140, s.text_height) // DIMTXT
            .real(141, 0.0) // DIMCEN
            // DIMLFAC 1: the user's header may scale measurements ($DIMLFAC),
            // but the tool's dimensions give true lengths.
            .real(144, 1.0) // DIMLFAC
            .real(147, s.gap) // DIMGAP
            .int(73, 0) // DIMTIH
            .int(74, 0) // DIMTOH
            .int(77, 1) // DIMTAD: text above the line
            .int(78, 8); // DIMZIN: no trailing zeros
        if self.modern() {
            self.enc.int(271, s.decimals); // DIMDEC
        }
    }

    /// A BLOCK_RECORD table record (R13 on); returns its handle.
    pub fn block_record(&mut self, table: Option<u64>, name: &str) -> Option<u64> {
        self.enc.text(0, "BLOCK_RECORD");
        let h = self.handles.take();
        if let Some(h) = h {
            self.enc.handle(5, h);
        }
        if let Some(t) = table {
            self.enc.handle(330, t);
        }
        self.enc.text(100, "AcDbSymbolTableRecord").text(100, "AcDbBlockTableRecord").text(2, name);
        self.enc.handle(340, 0);
        h
    }

    /// A whole anonymous block: BLOCK, its shapes on layer 0 with colour
    /// BYBLOCK (so they take the dimension's layer and colour), ENDBLK.
    pub fn block(&mut self, name: &str, record: Option<u64>, shapes: &[Shape]) {
        self.head("BLOCK", record, "0", None);
        self.subclass("AcDbBlockBegin");
        self.enc.text(2, name).int(70, 1).point(10, Point::ORIGIN).text(3, name).text(1, "");
        for s in shapes {
            self.shape(s, record, "0", Some(0), None);
        }
        self.head("ENDBLK", record, "0", None);
        self.subclass("AcDbBlockEnd");
    }
}

/// The name of the dimension style the tool declares for its dimensions.
pub const DIM_STYLE_NAME: &str = "HANGLINE";
