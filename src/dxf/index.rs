//! One pass over a DXF file that records where things are.

use std::collections::HashMap;
use std::ops::Range;
use std::sync::atomic::{AtomicUsize, Ordering};

use kurbo::{Affine, Point, Rect, Vec2};

use super::extents::Bounds;
use super::pairs::{Format, Kind, Pair, Pairs, kind_of};
use super::text::TextEncoding;
use super::{DxfError, Release};

/// What the caller wants kept from the scan.
#[derive(Clone, Debug)]
pub struct ScanOptions {
    /// Layers whose model-space entities are listed in [`File::entities`]
    /// (compared without regard to case, as DXF layer names are).
    pub keep_layers: Vec<String>,
    /// Layers whose entities do not count toward [`File::extents`].
    pub skip_extents_layers: Vec<String>,
    /// Layer-name prefixes treated as if listed in both `keep_layers` and
    /// `skip_extents_layers` (the tool's layers of design alternatives,
    /// whose names carry a value).
    pub keep_prefixes: Vec<String>,
    /// An ASCII ENTITIES section at least this long is scanned in two halves
    /// on two threads (default [`PARALLEL_FROM`]).
    pub parallel_from: usize,
}

impl Default for ScanOptions {
    fn default() -> Self {
        ScanOptions {
            keep_layers: Vec::new(),
            skip_extents_layers: Vec::new(),
            keep_prefixes: Vec::new(),
            parallel_from: PARALLEL_FROM,
        }
    }
}

/// A header variable: the `9 $NAME` pair and its value pairs.
#[derive(Clone, Debug, PartialEq)]
pub struct HeaderVar {
    /// The name, as written (with its `$`).
    pub name: String,
    /// Bytes from the `9` pair to the end of the last value pair.
    pub span: Range<usize>,
    /// Each value pair: its group code and the byte span of its value.
    pub values: Vec<(i32, Range<usize>)>,
}

/// An entry of a symbol table (LAYER, STYLE, DIMSTYLE, BLOCK_RECORD, …).
#[derive(Clone, Debug, PartialEq)]
pub struct Record {
    /// The entry's name (group code 2), decoded.
    pub name: String,
    /// Its handle (group code 5, or 105 for DIMSTYLE).
    pub handle: Option<u64>,
    /// Its flags (group code 70).
    pub flags: i64,
    /// Bytes of the whole entry.
    pub span: Range<usize>,
}

/// A symbol table.
#[derive(Clone, Debug, PartialEq)]
pub struct Table {
    /// The table's name (LAYER, LTYPE, STYLE, …), upper case.
    pub name: String,
    /// The table's own handle.
    pub handle: Option<u64>,
    /// The entry count in the table header (group code 70): value and span.
    pub count: Option<(i64, Range<usize>)>,
    /// The entries, in file order.
    pub records: Vec<Record>,
    /// Byte offset of the `0 ENDTAB` pair: new entries go here.
    pub end: usize,
}

impl Table {
    /// The entry named `name`, ignoring case.
    #[must_use]
    pub fn find(&self, name: &str) -> Option<&Record> {
        self.records.iter().find(|r| names_match(&r.name, name))
    }
}

/// A block definition in the BLOCKS section.
#[derive(Clone, Debug, PartialEq)]
pub struct BlockDef {
    /// The block's name, decoded.
    pub name: String,
    /// Handle of the BLOCK entity.
    pub handle: Option<u64>,
    /// Bytes from `0 BLOCK` to the end of its `ENDBLK`.
    pub span: Range<usize>,
}

/// A model-space entity on one of the kept layers, with the sub-entities
/// that belong to it (VERTEX … SEQEND after a POLYLINE, ATTRIB … SEQEND
/// after an INSERT).
#[derive(Clone, Debug, PartialEq)]
pub struct EntityRef {
    /// Entity type (group code 0), upper case.
    pub kind: String,
    /// Layer name as written.
    pub layer: String,
    /// Handle (group code 5), as written.
    pub handle: Option<String>,
    /// Bytes of the entity and its sub-entities.
    pub span: Range<usize>,
}

/// A scanned DXF file: the bytes and an index into them.
#[derive(Debug)]
pub struct File<'a> {
    /// The whole file.
    pub bytes: &'a [u8],
    /// ASCII or binary.
    pub format: Format,
    /// The release.
    pub release: Release,
    /// How strings are encoded.
    pub encoding: TextEncoding,
    /// The ASCII line end the file uses.
    pub line_end: &'static str,
    /// Header variables in file order.
    pub header: Vec<HeaderVar>,
    /// Byte offset of the HEADER section's `0 ENDSEC`.
    pub header_end: Option<usize>,
    /// Symbol tables in file order.
    pub tables: Vec<Table>,
    /// Block definitions in file order.
    pub blocks: Vec<BlockDef>,
    /// Byte offset of the BLOCKS section's `0 ENDSEC`.
    pub blocks_end: Option<usize>,
    /// Byte offset of the ENTITIES section's `0 SECTION`.
    pub entities_start: Option<usize>,
    /// Byte offset of the ENTITIES section's `0 ENDSEC`.
    pub entities_end: Option<usize>,
    /// Model-space entities on the kept layers.
    pub entities: Vec<EntityRef>,
    /// Model-space extents, from entity coordinates (an estimate: block
    /// contents are bounded by their definition points).
    pub extents: Bounds,
    /// The largest handle found anywhere in the file.
    pub max_handle: u64,
    /// Entities on kept layers that are in paper space (and so ignored).
    pub paper_space_kept: usize,
    /// Things worth telling the user about the file itself.
    pub warnings: Vec<String>,
}

/// True when two layer or table names are the same name (DXF names are
/// case-insensitive).
#[must_use]
pub fn names_match(a: &str, b: &str) -> bool {
    a.eq_ignore_ascii_case(b) || (!a.is_ascii() && a.to_uppercase() == b.to_uppercase())
}

/// True when a layer name as stored is one of `names` (ignoring case);
/// without decoding or allocating when the name is ASCII, as most are.
/// True when the layer's name starts with one of `prefixes` (ignoring case).
fn layer_prefixed(raw: &[u8], prefixes: &[String], encoding: TextEncoding) -> bool {
    if prefixes.is_empty() {
        return false;
    }
    let raw = raw.trim_ascii();
    if raw.is_ascii() {
        prefixes.iter().any(|n| raw.len() > n.len() && n.as_bytes().eq_ignore_ascii_case(&raw[..n.len()]))
    } else {
        let name = encoding.decode(raw).trim().to_uppercase();
        prefixes.iter().any(|n| name.len() > n.len() && name.starts_with(&n.to_uppercase()))
    }
}

fn layer_in(raw: &[u8], names: &[String], encoding: TextEncoding) -> bool {
    let raw = raw.trim_ascii();
    if raw.is_ascii() {
        names.iter().any(|n| n.as_bytes().eq_ignore_ascii_case(raw))
    } else {
        let name = encoding.decode(raw);
        names.iter().any(|n| names_match(n, name.trim()))
    }
}

/// Reads pairs with one pair of look-ahead.
struct Cursor<'a> {
    pairs: Pairs<'a>,
    peeked: Option<Pair<'a>>,
    max_handle: u64,
}

impl<'a> Cursor<'a> {
    fn next(&mut self) -> Result<Option<Pair<'a>>, DxfError> {
        let p = match self.peeked.take() {
            Some(p) => Some(p),
            None => self.pairs.next_pair()?,
        };
        if let Some(p) = &p
            && (p.code == 5 || p.code == 105)
            && let Some(h) = p.handle()
        {
            self.max_handle = self.max_handle.max(h);
        }
        Ok(p)
    }

    fn peek(&mut self) -> Result<Option<&Pair<'a>>, DxfError> {
        if self.peeked.is_none() {
            self.peeked = self.pairs.next_pair()?;
        }
        Ok(self.peeked.as_ref())
    }

    /// Where the cursor is, for messages.
    fn location(&self) -> String {
        match &self.peeked {
            Some(p) => format!("byte {}", p.start),
            None => self.pairs.location(),
        }
    }

    /// The next pair, which must exist.
    fn expect(&mut self, what: &str) -> Result<Pair<'a>, DxfError> {
        self.next()?.ok_or_else(|| DxfError::Truncated {
            location: self.pairs.location(),
            detail: format!("the file ends where {what} should follow"),
        })
    }

    /// True when the next pair starts a new object (group code 0) or the file ends.
    fn at_object_end(&mut self) -> Result<bool, DxfError> {
        Ok(self.peek()?.is_none_or(|p| p.code == 0))
    }
}

fn structure(location: String, detail: impl Into<String>) -> DxfError {
    DxfError::Structure { location, detail: detail.into() }
}

impl<'a> File<'a> {
    /// Scans `bytes` as a DXF file.
    pub fn scan(bytes: &'a [u8], options: &ScanOptions) -> Result<File<'a>, DxfError> {
        if bytes.iter().all(u8::is_ascii_whitespace) {
            return Err(DxfError::Empty);
        }
        let pairs = Pairs::new(bytes)?;
        let format = pairs.format();
        let line_end =
            if format == Format::Ascii && memchr::memmem::find(&bytes[..bytes.len().min(4096)], b"\r\n").is_some() {
                "\r\n"
            } else {
                "\n"
            };
        let mut cur = Cursor { pairs, peeked: None, max_handle: 0 };
        let first = match cur.peek() {
            Ok(Some(p)) => *p,
            Ok(None) => return Err(DxfError::Empty),
            Err(DxfError::BadCode { text, .. }) => {
                return Err(DxfError::NotDxf { detail: format!("it starts with '{}'", printable(&text)) });
            }
            Err(e) => return Err(e),
        };
        if !(first.code == 0 && first.is("SECTION")) && first.code != 999 {
            return Err(DxfError::NotDxf {
                detail: format!("it starts with '{}'", printable(&String::from_utf8_lossy(first.raw))),
            });
        }
        let mut file = File {
            bytes,
            format,
            release: Release::R12,
            encoding: TextEncoding::fallback(),
            line_end,
            header: Vec::new(),
            header_end: None,
            tables: Vec::new(),
            blocks: Vec::new(),
            blocks_end: None,
            entities_start: None,
            entities_end: None,
            entities: Vec::new(),
            extents: Bounds::default(),
            max_handle: 0,
            paper_space_kept: 0,
            warnings: Vec::new(),
        };
        let mut scanner = Scanner { options, blocks: HashMap::new(), resolved: HashMap::new() };
        let mut saw_header = false;
        loop {
            let Some(p) = cur.next()? else {
                return Err(DxfError::Truncated {
                    location: cur.location(),
                    detail: "the end-of-file marker (0 EOF) is missing".into(),
                });
            };
            if p.code == 999 {
                continue;
            }
            if p.code != 0 {
                return Err(structure(
                    format!("byte {}", p.start),
                    format!("group code {} outside any section", p.code),
                ));
            }
            if p.is("EOF") {
                break;
            }
            if !p.is("SECTION") {
                return Err(structure(
                    format!("byte {}", p.start),
                    format!("'{}' outside any section", printable(&String::from_utf8_lossy(p.raw))),
                ));
            }
            let section_start = p.start;
            let name = cur.expect("a section name")?;
            if name.code != 2 {
                return Err(structure(format!("byte {}", name.start), "a section without a name (group code 2)"));
            }
            let name = String::from_utf8_lossy(name.raw).trim().to_ascii_uppercase();
            match name.as_str() {
                "HEADER" => {
                    file.header_end = Some(scan_header(&mut cur, &mut file)?);
                    saw_header = true;
                    file.settle_version()?;
                }
                "TABLES" => {
                    if !saw_header {
                        file.settle_version()?;
                        saw_header = true;
                    }
                    scan_tables(&mut cur, &mut file)?;
                }
                "BLOCKS" => {
                    if !saw_header {
                        file.settle_version()?;
                        saw_header = true;
                    }
                    file.blocks_end = Some(scanner.blocks(&mut cur, &mut file)?);
                }
                "ENTITIES" => {
                    if !saw_header {
                        file.settle_version()?;
                        saw_header = true;
                    }
                    file.entities_start = Some(section_start);
                    file.entities_end = Some(scanner.entities(&mut cur, &mut file)?);
                }
                _ => {
                    skip_section(&mut cur)?;
                }
            }
        }
        if !saw_header {
            file.settle_version()?;
        }
        if file.entities_end.is_none() {
            return Err(structure(cur.location(), "the drawing has no ENTITIES section"));
        }
        file.max_handle = cur.max_handle;
        Ok(file)
    }

    /// Settles the release and text encoding from the header variables.
    fn settle_version(&mut self) -> Result<(), DxfError> {
        match self.header_text("$ACADVER") {
            Some(v) => {
                self.release = Release::from_acadver(&v).ok_or(DxfError::Version { acadver: v.trim().to_string() })?;
            }
            None => {
                self.release = Release::R12;
                self.warnings.push("the drawing has no $ACADVER; read as R12".into());
            }
        }
        self.encoding = if self.release >= Release::R2007 {
            TextEncoding::Utf8
        } else {
            match self.header_text("$DWGCODEPAGE") {
                Some(cp) => TextEncoding::from_codepage(&cp).unwrap_or_else(|| {
                    self.warnings.push(format!("unknown $DWGCODEPAGE '{cp}'; text read as ANSI_1252"));
                    TextEncoding::fallback()
                }),
                None => TextEncoding::fallback(),
            }
        };
        Ok(())
    }

    /// The header variable `name` (with its `$`, any case).
    #[must_use]
    pub fn header_var(&self, name: &str) -> Option<&HeaderVar> {
        self.header.iter().find(|v| v.name.eq_ignore_ascii_case(name))
    }

    /// The pair at byte `at` (a pair start recorded by the scan).
    #[must_use]
    pub fn pair_at(&self, at: usize) -> Option<Pair<'a>> {
        Pairs::at(self.bytes, self.format, at).next_pair().ok().flatten()
    }

    fn value_pair(&self, name: &str, code: Option<i32>) -> Option<Pair<'a>> {
        let var = self.header_var(name)?;
        let (_, span) = var.values.iter().find(|(c, _)| code.is_none_or(|k| k == *c))?;
        // Re-read the pair so that typed access works in both formats.
        let mut pairs = Pairs::at(self.bytes, self.format, var.span.start);
        while let Ok(Some(p)) = pairs.next_pair() {
            if p.value.0 == span.start {
                return Some(p);
            }
            if p.start >= var.span.end {
                break;
            }
        }
        None
    }

    /// A header variable's first value as text.
    #[must_use]
    pub fn header_text(&self, name: &str) -> Option<String> {
        let p = self.value_pair(name, None)?;
        Some(self.encoding.decode(p.raw).into_owned())
    }

    /// A header variable's value with group code `code` as a number.
    #[must_use]
    pub fn header_f64(&self, name: &str, code: i32) -> Option<f64> {
        self.value_pair(name, Some(code))?.f64()
    }

    /// A header variable's first value as an integer.
    #[must_use]
    pub fn header_i64(&self, name: &str) -> Option<i64> {
        self.value_pair(name, None)?.i64()
    }

    /// The symbol table `name` (LAYER, STYLE, …).
    #[must_use]
    pub fn table(&self, name: &str) -> Option<&Table> {
        self.tables.iter().find(|t| t.name.eq_ignore_ascii_case(name))
    }

    /// Decodes a string value of this file.
    #[must_use]
    pub fn text(&self, raw: &'a [u8]) -> std::borrow::Cow<'a, str> {
        self.encoding.decode(raw)
    }

    /// The pairs of a span of the file (an entity, a record, …).
    #[must_use]
    pub fn pairs_in(&self, span: &Range<usize>) -> SpanPairs<'a> {
        SpanPairs { pairs: Pairs::at(self.bytes, self.format, span.start), end: span.end }
    }
}

/// The pairs inside a byte span; stops quietly at the span's end or at a
/// damaged pair (the scan already read the same bytes without error).
pub struct SpanPairs<'a> {
    pairs: Pairs<'a>,
    end: usize,
}

impl<'a> Iterator for SpanPairs<'a> {
    type Item = Pair<'a>;

    fn next(&mut self) -> Option<Pair<'a>> {
        if self.pairs.position() >= self.end {
            return None;
        }
        self.pairs.next_pair().ok().flatten()
    }
}

fn printable(s: &str) -> String {
    let t: String = s.chars().take(40).map(|c| if c.is_control() { '?' } else { c }).collect();
    t.trim().to_string()
}

fn skip_section(cur: &mut Cursor<'_>) -> Result<usize, DxfError> {
    loop {
        let p = cur.expect("the rest of a section (0 ENDSEC)")?;
        if p.code == 0 && p.is("ENDSEC") {
            return Ok(p.start);
        }
        if p.code == 0 && p.is("EOF") {
            return Err(DxfError::Truncated {
                location: format!("byte {}", p.start),
                detail: "a section has no ENDSEC".into(),
            });
        }
    }
}

fn scan_header(cur: &mut Cursor<'_>, file: &mut File<'_>) -> Result<usize, DxfError> {
    loop {
        let p = cur.expect("the rest of the HEADER section")?;
        match p.code {
            0 if p.is("ENDSEC") => return Ok(p.start),
            0 => return Err(structure(format!("byte {}", p.start), "an object inside the HEADER section")),
            9 => {
                let name = String::from_utf8_lossy(p.raw).trim().to_string();
                let mut var = HeaderVar { name, span: p.start..p.end, values: Vec::new() };
                while let Some(next) = cur.peek()? {
                    if next.code == 9 || next.code == 0 {
                        break;
                    }
                    let v = cur.expect("a header value")?;
                    var.values.push((v.code, v.value.0..v.value.1));
                    var.span.end = v.end;
                }
                file.header.push(var);
            }
            _ => {} // a stray value; kept in the bytes, ignored here
        }
    }
}

fn scan_tables(cur: &mut Cursor<'_>, file: &mut File<'_>) -> Result<(), DxfError> {
    loop {
        let p = cur.expect("the rest of the TABLES section")?;
        if p.code != 0 {
            continue;
        }
        if p.is("ENDSEC") {
            return Ok(());
        }
        if !p.is("TABLE") {
            if p.is("EOF") {
                return Err(DxfError::Truncated {
                    location: format!("byte {}", p.start),
                    detail: "TABLES has no ENDSEC".into(),
                });
            }
            return Err(structure(
                format!("byte {}", p.start),
                format!("'{}' in TABLES outside a TABLE", printable(&String::from_utf8_lossy(p.raw))),
            ));
        }
        let mut table = Table { name: String::new(), handle: None, count: None, records: Vec::new(), end: 0 };
        while !cur.at_object_end()? {
            let v = cur.expect("a table header value")?;
            match v.code {
                2 if table.name.is_empty() => table.name = String::from_utf8_lossy(v.raw).trim().to_ascii_uppercase(),
                5 if table.handle.is_none() => table.handle = v.handle(),
                70 if table.count.is_none() => table.count = v.i64().map(|c| (c, v.value.0..v.value.1)),
                _ => {}
            }
        }
        loop {
            let r = cur.expect("the rest of a table (0 ENDTAB)")?;
            if r.code != 0 {
                return Err(structure(format!("byte {}", r.start), "a table value outside a table entry"));
            }
            if r.is("ENDTAB") {
                table.end = r.start;
                // Skip whatever follows ENDTAB up to the next object.
                while !cur.at_object_end()? {
                    cur.expect("a value")?;
                }
                break;
            }
            if r.is("ENDSEC") || r.is("EOF") {
                return Err(structure(format!("byte {}", r.start), format!("table {} has no ENDTAB", table.name)));
            }
            let mut rec = Record { name: String::new(), handle: None, flags: 0, span: r.start..r.end };
            let mut got_name = false;
            while !cur.at_object_end()? {
                let v = cur.expect("a table entry value")?;
                match v.code {
                    2 if !got_name => {
                        rec.name = file.encoding.decode(v.raw).trim().to_string();
                        got_name = true;
                    }
                    5 | 105 if rec.handle.is_none() => rec.handle = v.handle(),
                    70 => rec.flags = v.i64().unwrap_or(0),
                    _ => {}
                }
                rec.span.end = v.end;
            }
            table.records.push(rec);
        }
        file.tables.push(table);
    }
}

/// Geometry gathered from one object's pairs, for the extents.
#[derive(Default)]
struct ObjectScan<'a> {
    kind: &'a [u8],
    layer: &'a [u8],
    handle: Option<&'a [u8]>,
    name: &'a [u8],
    paper: bool,
    attribs_follow: bool,
    local: Bounds,
    mirrored: bool,
    insert_at: Option<Point>,
    scale: (f64, f64),
    rotation: f64,
    radius: f64,
}

/// The entity types whose 11…16 codes are points (not vectors).
fn extra_points(kind: &[u8]) -> bool {
    matches!(kind, b"LINE" | b"SOLID" | b"TRACE" | b"3DFACE" | b"DIMENSION" | b"SPLINE" | b"ARC_DIMENSION")
}

/// Entity types whose points are in their object coordinate system.
fn in_ocs(kind: &[u8]) -> bool {
    matches!(
        kind,
        b"CIRCLE"
            | b"ARC"
            | b"TEXT"
            | b"ATTRIB"
            | b"ATTDEF"
            | b"SOLID"
            | b"TRACE"
            | b"INSERT"
            | b"LWPOLYLINE"
            | b"HATCH"
    )
}

/// Reads one object (the `0` pair already taken) up to the next `0` pair.
fn scan_object<'a>(cur: &mut Cursor<'a>, head: &Pair<'a>) -> Result<(ObjectScan<'a>, usize), DxfError> {
    let mut o = ObjectScan { kind: head.raw, scale: (1.0, 1.0), ..ObjectScan::default() };
    let points_extra = extra_points(head.raw);
    let is_hatch = head.raw == b"HATCH";
    let mut skipped_elevation = false;
    let mut pending: [f64; 7] = [f64::NAN; 7];
    let mut in_xdata = false;
    let mut end = head.end;
    let mut extrusion_z = 1.0;
    // A pair the cursor already looked at comes first.
    let mut pending_pair = cur.peeked.take();
    if let Some(p) = pending_pair.take_if(|p| p.code == 0) {
        cur.peeked = Some(p);
        return Ok((o, end));
    }
    let binary = cur.pairs.format() != Format::Ascii;
    let number = |raw: &[u8], code: i32| -> Option<f64> {
        if binary { Pair::typed_f64(code, raw) } else { super::pairs::approx_f64(raw) }
    };
    let integer = |raw: &[u8], code: i32| -> Option<i64> {
        if binary { Pair::typed_i64(code, raw) } else { std::str::from_utf8(raw).ok()?.trim().parse().ok() }
    };
    let mut max_handle = 0u64;
    let mut visit = |code: i32, raw: &'a [u8], pair_end: usize| {
        end = pair_end;
        if in_xdata || code >= 1000 {
            in_xdata = true;
            return;
        }
        match code {
            8 => o.layer = raw,
            5 => {
                o.handle = Some(raw);
                if let Some(h) = super::pairs::parse_handle(raw) {
                    max_handle = max_handle.max(h);
                }
            }
            2 => o.name = raw,
            67 => o.paper = integer(raw, code) == Some(1),
            66 => o.attribs_follow = integer(raw, code) == Some(1),
            40 => o.radius = number(raw, code).unwrap_or(0.0),
            41 => o.scale.0 = number(raw, code).unwrap_or(1.0),
            42 => o.scale.1 = number(raw, code).unwrap_or(1.0),
            50 => o.rotation = number(raw, code).unwrap_or(0.0),
            230 => extrusion_z = number(raw, code).unwrap_or(1.0),
            10..=16 if code == 10 || points_extra => {
                pending[(code - 10) as usize] = number(raw, code).unwrap_or(f64::NAN);
            }
            20..=26 => {
                let i = (code - 20) as usize;
                let x = pending[i];
                if !x.is_nan() {
                    pending[i] = f64::NAN;
                    let y = number(raw, code).unwrap_or(f64::NAN);
                    if is_hatch && !skipped_elevation {
                        // HATCH's first point is its elevation point (0, 0, z).
                        skipped_elevation = true;
                    } else {
                        let pt = Point::new(x, y);
                        if i == 0 && o.insert_at.is_none() {
                            o.insert_at = Some(pt);
                        }
                        o.local.add(pt);
                    }
                }
            }
            _ => {}
        }
    };
    if let Some(p) = pending_pair {
        visit(p.code, p.raw, p.end);
    }
    cur.pairs.each_in_object(&mut visit)?;
    cur.max_handle = cur.max_handle.max(max_handle);
    o.mirrored = extrusion_z < 0.0 && in_ocs(o.kind);
    if matches!(o.kind, b"CIRCLE" | b"ARC")
        && let (Some(c), r) = (o.insert_at, o.radius.abs())
    {
        o.local.add(c - Vec2::new(r, r));
        o.local.add(c + Vec2::new(r, r));
    }
    Ok((o, end))
}

/// A block definition being read.
struct OpenBlock {
    name: String,
    start: usize,
    handle: Option<u64>,
    base: Point,
    bounds: Bounds,
    nested: Vec<(String, Affine)>,
}

/// Scanner state that lives across sections: block extents.
struct Scanner<'o> {
    options: &'o ScanOptions,
    /// Per block (upper-case name): its own bounds relative to its base
    /// point, and the inserts it holds.
    blocks: HashMap<String, (Bounds, Vec<(String, Affine)>)>,
    resolved: HashMap<String, Bounds>,
}

/// The transform an INSERT applies to its block's points (block base at
/// the origin): scale, then rotate, then move to the insertion point.
fn insert_transform(o: &ObjectScan<'_>) -> Affine {
    let at = o.insert_at.unwrap_or(Point::ORIGIN);
    let mut a = Affine::translate(at.to_vec2())
        * Affine::rotate(o.rotation.to_radians())
        * Affine::scale_non_uniform(o.scale.0, o.scale.1);
    if o.mirrored {
        a = Affine::FLIP_X * a;
    }
    a
}

impl Scanner<'_> {
    fn blocks(&mut self, cur: &mut Cursor<'_>, file: &mut File<'_>) -> Result<usize, DxfError> {
        let mut current: Option<OpenBlock> = None;
        loop {
            let p = cur.expect("the rest of the BLOCKS section")?;
            if p.code != 0 {
                return Err(structure(format!("byte {}", p.start), "a value outside any block entity"));
            }
            if p.is("ENDSEC") {
                if current.is_some() {
                    return Err(structure(format!("byte {}", p.start), "a BLOCK without ENDBLK"));
                }
                return Ok(p.start);
            }
            if p.is("EOF") {
                return Err(DxfError::Truncated {
                    location: format!("byte {}", p.start),
                    detail: "BLOCKS has no ENDSEC".into(),
                });
            }
            let (o, end) = scan_object(cur, &p)?;
            match o.kind {
                b"BLOCK" => {
                    let name = file.encoding.decode(o.name).trim().to_string();
                    let base = o.insert_at.unwrap_or(Point::ORIGIN);
                    let handle = o
                        .handle
                        .and_then(|h| std::str::from_utf8(h).ok())
                        .and_then(|h| u64::from_str_radix(h.trim(), 16).ok());
                    current = Some(OpenBlock {
                        name,
                        start: p.start,
                        handle,
                        base,
                        bounds: Bounds::default(),
                        nested: Vec::new(),
                    });
                }
                b"ENDBLK" => {
                    let Some(OpenBlock { name, start, handle, base, bounds, nested }) = current.take() else {
                        return Err(structure(format!("byte {}", p.start), "ENDBLK without BLOCK"));
                    };
                    let shift = Affine::translate(-base.to_vec2());
                    let mut own = Bounds::default();
                    if let Some(r) = bounds.rect() {
                        own.add_rect(shift.transform_rect_bbox(r));
                    }
                    let nested = nested.into_iter().map(|(n, a)| (n, shift * a)).collect();
                    self.blocks.insert(name.to_uppercase(), (own, nested));
                    file.blocks.push(BlockDef { name, handle, span: start..end });
                }
                kind => {
                    if let Some(OpenBlock { bounds, nested, .. }) = current.as_mut() {
                        if kind == b"INSERT" {
                            let n = file.encoding.decode(o.name).trim().to_uppercase();
                            nested.push((n, insert_transform(&o)));
                        } else {
                            add_local(bounds, &o);
                        }
                    }
                }
            }
        }
    }

    /// The bounds of block `name` in its own coordinates, nested blocks
    /// included; cycles and nesting deeper than 32 levels are cut off.
    fn block_bounds(&mut self, name: &str, depth: usize) -> Bounds {
        if let Some(b) = self.resolved.get(name) {
            return *b;
        }
        let Some((own, nested)) = self.blocks.get(name).cloned() else { return Bounds::default() };
        // Mark before recursing so that a self-reference ends here.
        self.resolved.insert(name.to_string(), own);
        let mut total = own;
        if depth < 32 {
            for (child, a) in nested {
                if let Some(r) = self.block_bounds(&child, depth + 1).rect() {
                    total.add_rect(a.transform_rect_bbox(r));
                }
            }
        }
        self.resolved.insert(name.to_string(), total);
        total
    }

    /// Resolves every block's bounds, so that the entities can be scanned
    /// with read-only access (from two threads).
    fn resolve_all(&mut self) {
        let names: Vec<String> = self.blocks.keys().cloned().collect();
        for n in names {
            self.block_bounds(&n, 0);
        }
    }

    /// The ENTITIES section from the cursor on (after its name); returns the
    /// byte offset of its `0 ENDSEC`. Large ASCII sections are split at an
    /// entity boundary and scanned on two threads.
    fn entities<'a>(&mut self, cur: &mut Cursor<'a>, file: &mut File<'a>) -> Result<usize, DxfError> {
        self.resolve_all();
        let body = match cur.peek()? {
            Some(p) => p.start,
            None => cur.pairs.position(),
        };
        let ctx = EntityContext { options: self.options, blocks: &self.resolved, encoding: file.encoding };
        let bytes = file.bytes;
        let parallel = bytes.len() - body >= self.options.parallel_from;
        let (part, end) = match file.format {
            // ASCII: the middle entity boundary is found at once, by its lines.
            Format::Ascii if parallel => match ascii_section_end(bytes, body)
                .and_then(|end| ascii_entity_boundary(bytes, body + (end - body) / 2, end))
            {
                Some(mid) => {
                    let (first, second) = std::thread::scope(|scope| {
                        let second =
                            scope.spawn(|| scan_entities(Pairs::at(bytes, file.format, mid), Stop::None, &ctx));
                        let first = scan_entities(Pairs::at(bytes, file.format, body), Stop::At(mid), &ctx);
                        (first, second.join())
                    });
                    let (second, end) = second.map_err(|_| structure(format!("byte {mid}"), "the scan failed"))??;
                    let (mut first, _) = first?;
                    first.append(second);
                    (first, Some(end))
                }
                None => (scan_entities_cursor(cur, Stop::None, &ctx)?.0, None),
            },
            // Binary: the second thread skims the pairs to a boundary a
            // little past the middle (skimming is quicker than scanning) and
            // publishes it, then scans from there; the first scans from the
            // start up to it, waiting for it only if it gets there first.
            Format::Binary { wide_codes } if parallel => {
                let target = body + (bytes.len() - body) * 57 / 100;
                let boundary = AtomicUsize::new(UNKNOWN);
                let (first, second) = std::thread::scope(|scope| {
                    let second = scope.spawn(|| {
                        let found = binary_entity_boundary(bytes, wide_codes, body, target);
                        boundary.store(found.unwrap_or(NO_SPLIT), Ordering::Release);
                        found.map(|mid| scan_entities(Pairs::at(bytes, file.format, mid), Stop::None, &ctx))
                    });
                    let stop = Stop::Published { from: target, boundary: &boundary };
                    let first = scan_entities(Pairs::at(bytes, file.format, body), stop, &ctx);
                    (first, second.join())
                });
                let second = second.map_err(|_| structure(format!("byte {target}"), "the scan failed"))?;
                let (mut first, first_end) = first?;
                match second {
                    Some(result) => {
                        let (second, end) = result?;
                        first.append(second);
                        (first, Some(end))
                    }
                    None => (first, Some(first_end)),
                }
            }
            _ => (scan_entities_cursor(cur, Stop::None, &ctx)?.0, None),
        };
        // After a split scan, carry on after the ENDSEC pair it ended at.
        let end = match end {
            Some(end) => {
                cur.peeked = None;
                cur.pairs = Pairs::at(bytes, file.format, end);
                cur.next()?;
                end
            }
            None => part.end,
        };
        cur.max_handle = cur.max_handle.max(part.max_handle);
        file.entities.extend(part.entities);
        file.extents.merge(part.extents);
        file.paper_space_kept += part.paper_space_kept;
        Ok(end)
    }
}

/// Default of [`ScanOptions::parallel_from`]: smaller sections are scanned
/// on one thread (a thread costs more than it saves on small drawings).
pub const PARALLEL_FROM: usize = 8 << 20;

/// What the entity scan needs, shared read-only between threads.
struct EntityContext<'o> {
    options: &'o ScanOptions,
    blocks: &'o HashMap<String, Bounds>,
    encoding: TextEncoding,
}

/// What a part of the ENTITIES section gave.
#[derive(Default)]
struct EntitiesPart {
    /// Where the part ended (its ENDSEC, or the split).
    end: usize,
    entities: Vec<EntityRef>,
    extents: Bounds,
    max_handle: u64,
    paper_space_kept: usize,
}

impl EntitiesPart {
    fn append(&mut self, other: EntitiesPart) {
        self.entities.extend(other.entities);
        self.extents.merge(other.extents);
        self.max_handle = self.max_handle.max(other.max_handle);
        self.paper_space_kept += other.paper_space_kept;
    }
}

/// Where a part of the ENTITIES section ends.
#[derive(Clone, Copy)]
enum Stop<'s> {
    /// At its ENDSEC.
    None,
    /// At this entity boundary.
    At(usize),
    /// At a boundary another thread publishes, no earlier than `from`.
    Published { from: usize, boundary: &'s AtomicUsize },
}

/// Values of the published boundary before it is known, and when there is none.
const UNKNOWN: usize = usize::MAX;
const NO_SPLIT: usize = usize::MAX - 1;

fn scan_entities<'a>(
    pairs: Pairs<'a>,
    stop: Stop<'_>,
    ctx: &EntityContext<'_>,
) -> Result<(EntitiesPart, usize), DxfError> {
    let mut cur = Cursor { pairs, peeked: None, max_handle: 0 };
    let (mut part, end) = scan_entities_cursor(&mut cur, stop, ctx)?;
    part.max_handle = part.max_handle.max(cur.max_handle);
    Ok((part, end))
}

/// Scans entities up to `0 ENDSEC` (whose offset is returned) or up to the
/// entity boundary `stop` names (returned).
fn scan_entities_cursor(
    cur: &mut Cursor<'_>,
    stop: Stop<'_>,
    ctx: &EntityContext<'_>,
) -> Result<(EntitiesPart, usize), DxfError> {
    let mut part = EntitiesPart::default();
    let mut stop = stop;
    // The entity group in progress: (index in part.entities if kept, or
    // usize::MAX; whether sub-entities may follow).
    let mut open: Option<(usize, bool)> = None;
    let mut name_buf = [0u8; 64];
    loop {
        let next = cur.peek()?.map(|p| p.start);
        match (stop, next) {
            (Stop::At(at), Some(start)) if start >= at => {
                part.end = at;
                return Ok((part, at));
            }
            (Stop::Published { from, boundary }, Some(start)) if start >= from => {
                let mut at = boundary.load(Ordering::Acquire);
                while at == UNKNOWN {
                    std::thread::yield_now();
                    at = boundary.load(Ordering::Acquire);
                }
                stop = if at == NO_SPLIT { Stop::None } else { Stop::At(at) };
                continue;
            }
            _ => {}
        }
        let p = cur.expect("the rest of the ENTITIES section")?;
        if p.code != 0 {
            return Err(structure(format!("byte {}", p.start), "a value outside any entity"));
        }
        if p.is("ENDSEC") {
            part.end = p.start;
            return Ok((part, p.start));
        }
        if p.is("EOF") {
            return Err(DxfError::Truncated {
                location: format!("byte {}", p.start),
                detail: "ENTITIES has no ENDSEC".into(),
            });
        }
        let (o, end) = scan_object(cur, &p)?;
        let is_sub = matches!(o.kind, b"VERTEX" | b"ATTRIB" | b"SEQEND");
        if let Some((idx, true)) = open
            && is_sub
        {
            if idx != usize::MAX {
                part.entities[idx].span.end = end;
            }
            if o.kind == b"SEQEND" {
                open = None;
            }
            continue;
        }
        let prefixed = layer_prefixed(o.layer, &ctx.options.keep_prefixes, ctx.encoding);
        let on_kept_layer = prefixed || layer_in(o.layer, &ctx.options.keep_layers, ctx.encoding);
        let kept = !o.paper && on_kept_layer;
        if o.paper && on_kept_layer {
            part.paper_space_kept += 1;
        }
        let follows = o.kind == b"POLYLINE" || (o.kind == b"INSERT" && o.attribs_follow);
        let idx = if kept {
            part.entities.push(EntityRef {
                kind: String::from_utf8_lossy(o.kind).trim().to_ascii_uppercase(),
                layer: ctx.encoding.decode(o.layer).trim().to_string(),
                handle: o.handle.map(|h| String::from_utf8_lossy(h).trim().to_string()),
                span: p.start..end,
            });
            part.entities.len() - 1
        } else {
            usize::MAX
        };
        open = Some((idx, follows));
        let skip_extents = o.paper || prefixed || layer_in(o.layer, &ctx.options.skip_extents_layers, ctx.encoding);
        if !skip_extents && !matches!(o.kind, b"XLINE" | b"RAY" | b"VIEWPORT") {
            if o.kind == b"INSERT" {
                let a = insert_transform(&o);
                if let Some(r) = block_lookup(ctx, o.name, &mut name_buf).and_then(|b| b.rect()) {
                    part.extents.add_rect(a.transform_rect_bbox(r));
                }
                if let Some(at) = o.insert_at {
                    part.extents.add(at);
                }
            } else {
                add_local(&mut part.extents, &o);
            }
        }
    }
}

/// The bounds of the block an INSERT names, without allocating for the
/// usual short ASCII names.
fn block_lookup(ctx: &EntityContext<'_>, raw: &[u8], buf: &mut [u8; 64]) -> Option<Bounds> {
    let raw = raw.trim_ascii();
    if raw.is_ascii() && raw.len() <= buf.len() {
        let upper = &mut buf[..raw.len()];
        upper.copy_from_slice(raw);
        upper.make_ascii_uppercase();
        let key = std::str::from_utf8(upper).ok()?;
        ctx.blocks.get(key).copied()
    } else {
        ctx.blocks.get(&ctx.encoding.decode(raw).trim().to_uppercase()).copied()
    }
}

/// The offset of the `0` line of the `0 ENDSEC` pair that ends the section
/// whose body starts at `from`, in ASCII DXF. A line `ENDSEC` after a line
/// reading `0` can only be that pair: were the `0` a value, the next line
/// would be a group code, and group codes are numbers.
fn ascii_section_end(bytes: &[u8], from: usize) -> Option<usize> {
    let finder = memchr::memmem::Finder::new(b"ENDSEC");
    let mut at = from;
    while let Some(i) = finder.find(&bytes[at..]) {
        let pos = at + i;
        at = pos + 6;
        let line_start = pos == 0 || bytes[pos - 1] == b'\n';
        let rest = &bytes[pos + 6..];
        let line_end = rest.first().is_none_or(|&c| c == b'\n' || c == b'\r' || c == b' ');
        if !(line_start && line_end) || pos < 2 {
            continue;
        }
        // The line before.
        let prev_end = pos - 1;
        let prev_start = bytes[..prev_end].iter().rposition(|&c| c == b'\n').map_or(0, |k| k + 1);
        if bytes[prev_start..prev_end].trim_ascii() == b"0" && prev_start >= from {
            return Some(prev_start);
        }
    }
    None
}

/// Where to split a binary ENTITIES section starting at `body`: the first
/// entity (not a sub-entity) at or past `target`, found by
/// skimming the pairs — each code's value has a known size, or ends at a
/// zero byte for strings — without reading any value. Binary values can
/// hold any bytes, so unlike ASCII no pattern can be searched for. `None`
/// when the section ends first (or the bytes are damaged: the full scan
/// will say where).
fn binary_entity_boundary(bytes: &[u8], wide: bool, body: usize, target: usize) -> Option<usize> {
    let mut pos = body;
    loop {
        let start = pos;
        let code = if wide {
            let b = bytes.get(pos..pos + 2)?;
            pos += 2;
            i32::from(i16::from_le_bytes([b[0], b[1]]))
        } else {
            let b = *bytes.get(pos)?;
            pos += 1;
            if b == 255 {
                let e = bytes.get(pos..pos + 2)?;
                pos += 2;
                i32::from(i16::from_le_bytes([e[0], e[1]]))
            } else {
                i32::from(b)
            }
        };
        let value = pos;
        pos += match kind_of(code) {
            Kind::Text => memchr::memchr(0, bytes.get(pos..)?)? + 1,
            Kind::Chunk => 1 + usize::from(*bytes.get(pos)?),
            Kind::Int8 => 1,
            Kind::Int16 => 2,
            Kind::Int32 => 4,
            Kind::Double | Kind::Int64 => 8,
        };
        if code == 0 {
            let name = bytes.get(value..pos - 1)?;
            if name == b"ENDSEC" || name == b"EOF" {
                return None;
            }
            if start >= target && !matches!(name, b"VERTEX" | b"ATTRIB" | b"SEQEND") {
                return Some(start);
            }
        }
    }
}

/// The start of the first entity at or after `from` (and before `end`)
/// that is not a sub-entity (VERTEX, ATTRIB, SEQEND), in ASCII DXF: a line
/// reading `0` followed by a line that is not a number is a `0` pair, for
/// the same reason as in [`ascii_section_end`].
fn ascii_entity_boundary(bytes: &[u8], from: usize, end: usize) -> Option<usize> {
    // Start at a line start.
    let mut at = from + memchr::memchr(b'\n', &bytes[from..end])? + 1;
    while at < end {
        let l1_end = at + memchr::memchr(b'\n', &bytes[at..end])?;
        let l2_start = l1_end + 1;
        let l2_end = l2_start + memchr::memchr(b'\n', bytes.get(l2_start..end)?)?;
        let first = bytes[at..l1_end].trim_ascii();
        let second = bytes[l2_start..l2_end].trim_ascii();
        if first == b"0"
            && !second.is_empty()
            && !second.iter().all(|c| c.is_ascii_digit() || *c == b'-' || *c == b'+' || *c == b'.')
            && !matches!(second, b"VERTEX" | b"ATTRIB" | b"SEQEND" | b"ENDSEC")
        {
            return Some(at);
        }
        at = l1_end + 1;
    }
    None
}

fn add_local(bounds: &mut Bounds, o: &ObjectScan<'_>) {
    if let Some(r) = o.local.rect() {
        if o.mirrored {
            bounds.add_rect(Rect::new(-r.x1, r.y0, -r.x0, r.y1));
        } else {
            bounds.add_rect(r);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const MINI: &str = "0\nSECTION\n2\nHEADER\n9\n$ACADVER\n1\nAC1009\n9\n$HANDSEED\n5\n20\n9\n$EXTMIN\n10\n0.0\n20\n0.0\n0\nENDSEC\n\
0\nSECTION\n2\nTABLES\n0\nTABLE\n2\nLAYER\n70\n1\n0\nLAYER\n2\n0\n70\n0\n62\n7\n6\nCONTINUOUS\n0\nENDTAB\n0\nENDSEC\n\
0\nSECTION\n2\nBLOCKS\n0\nBLOCK\n8\n0\n2\nARROW\n70\n0\n10\n1.0\n20\n0.0\n0\nLINE\n8\n0\n10\n1.0\n20\n0.0\n11\n1.0\n21\n-2.0\n0\nENDBLK\n8\n0\n0\nENDSEC\n\
0\nSECTION\n2\nENTITIES\n0\nLINE\n5\n1A\n8\nloads\n10\n2.0\n20\n5.0\n11\n2.0\n21\n9.0\n0\nPOLYLINE\n5\n1B\n8\nDECK\n66\n1\n0\nVERTEX\n8\nDECK\n10\n0.0\n20\n1.0\n0\nVERTEX\n8\nDECK\n10\n10.0\n20\n1.0\n0\nSEQEND\n8\nDECK\n\
0\nINSERT\n8\nX\n2\nARROW\n10\n20.0\n20\n0.0\n0\nCIRCLE\n8\nS\n10\n-5.0\n20\n0.0\n40\n1.0\n0\nENDSEC\n0\nEOF\n";

    fn opts() -> ScanOptions {
        ScanOptions { keep_layers: vec!["LOADS".into(), "deck".into()], ..ScanOptions::default() }
    }

    #[test]
    fn two_threads_find_what_one_finds() {
        // Many copies of the entities, so the split falls among them.
        let body_at = MINI.find("0\nSECTION\n2\nENTITIES\n").unwrap() + "0\nSECTION\n2\nENTITIES\n".len();
        let end_at = MINI.rfind("0\nENDSEC").unwrap();
        let big = format!("{}{}{}", &MINI[..body_at], MINI[body_at..end_at].repeat(50), &MINI[end_at..]);
        let one = File::scan(big.as_bytes(), &opts()).unwrap();
        let two = File::scan(big.as_bytes(), &ScanOptions { parallel_from: 0, ..opts() }).unwrap();
        assert_eq!(one.entities, two.entities);
        assert_eq!(one.extents, two.extents);
        assert_eq!(one.max_handle, two.max_handle);
        assert_eq!(one.entities_end, two.entities_end);
        assert_eq!(one.entities.len(), 100);
    }

    #[test]
    fn a_binary_section_splits_at_an_entity() {
        use crate::dxf::{Encoder, TextEncoding};
        let mut e = Encoder::new(Format::Binary { wide_codes: true }, TextEncoding::Utf8, "\n");
        e.text(0, "SECTION").text(2, "ENTITIES");
        for k in 0..40 {
            e.text(0, "LINE")
                .text(8, "LOADS")
                .real(10, f64::from(k))
                .real(20, 0.0)
                .real(11, f64::from(k))
                .real(21, 1.0);
            e.text(0, "POLYLINE").text(8, "X").int(66, 1).text(0, "VERTEX").real(10, 0.0).text(0, "SEQEND");
        }
        e.text(0, "ENDSEC").text(0, "EOF");
        let mut bytes = crate::dxf::BINARY_SENTINEL.to_vec();
        bytes.extend(e.take());
        let body = crate::dxf::BINARY_SENTINEL.len() + 2 + 8 + 2 + 9;
        let split = binary_entity_boundary(&bytes, true, body, body + (bytes.len() - body) / 2).unwrap();
        assert!(split > body + (bytes.len() - body) / 2 - 1);
        let mut p = Pairs::at(&bytes, Format::Binary { wide_codes: true }, split);
        let head = p.next_pair().unwrap().unwrap();
        assert!(head.code == 0 && (head.is("LINE") || head.is("POLYLINE")), "{:?}", head.raw);
        let opts = ScanOptions { keep_layers: vec!["LOADS".into()], ..ScanOptions::default() };
        let one = File::scan(&bytes, &opts).unwrap();
        let two = File::scan(&bytes, &ScanOptions { parallel_from: 0, ..opts }).unwrap();
        assert_eq!(one.entities, two.entities);
        assert_eq!(one.entities.len(), 40);
    }

    #[test]
    fn section_ends_and_boundaries_are_found_by_their_lines() {
        let text = b"0\nSECTION\n2\nENTITIES\n0\nTEXT\n1\n0\n70\n0\n1\nENDSEC\n0\nLINE\n8\n0\n0\nENDSEC\n0\nEOF\n";
        let body = 22;
        // A text reading ENDSEC after a value 0 is not the end.
        let end = ascii_section_end(text, body).unwrap();
        assert_eq!(&text[end..end + 8], b"0\nENDSEC");
        assert_eq!(end, text.len() - "0\nENDSEC\n0\nEOF\n".len());
        // The boundary after the TEXT is the LINE, not the value lines reading 0.
        let b = ascii_entity_boundary(text, body + 2, end).unwrap();
        assert_eq!(&text[b..b + 6], b"0\nLINE");
    }

    #[test]
    fn scans_sections_tables_and_kept_entities() {
        let f = File::scan(MINI.as_bytes(), &opts()).unwrap();
        assert_eq!(f.release, Release::R12);
        assert_eq!(f.header_text("$HANDSEED").as_deref(), Some("20"));
        let layers = f.table("LAYER").unwrap();
        assert_eq!(layers.records.len(), 1);
        assert_eq!(layers.count.as_ref().map(|c| c.0), Some(1));
        assert_eq!(f.entities.len(), 2);
        assert_eq!(f.entities[0].kind, "LINE");
        assert_eq!(f.entities[0].handle.as_deref(), Some("1A"));
        // The POLYLINE's span runs through its SEQEND.
        let poly = &f.entities[1];
        let text = &MINI[poly.span.clone()];
        assert!(text.starts_with("0\nPOLYLINE") && text.trim_end().ends_with("SEQEND\n8\nDECK"), "{text}");
        assert_eq!(f.max_handle, 0x20, "$HANDSEED counts too");
    }

    #[test]
    fn extents_cover_blocks_circles_and_lines() {
        let f = File::scan(MINI.as_bytes(), &opts()).unwrap();
        let r = f.extents.rect().unwrap();
        // Circle at −5 with radius 1; the block's line runs 2 below its base,
        // inserted at x = 20.
        assert_eq!((r.x0, r.x1), (-6.0, 20.0));
        assert_eq!((r.y0, r.y1), (-2.0, 9.0));
    }

    #[test]
    fn a_missing_eof_is_truncation() {
        let cut = &MINI[..MINI.len() - 6];
        assert!(matches!(File::scan(cut.as_bytes(), &opts()), Err(DxfError::Truncated { .. })));
        let cut = &MINI[..MINI.find("CIRCLE").unwrap()];
        assert!(matches!(File::scan(cut.as_bytes(), &opts()), Err(DxfError::Truncated { .. })));
    }

    #[test]
    fn prose_is_not_dxf() {
        let e = File::scan(b"Dear engineer,\nplease find the drawing attached.\n", &opts()).unwrap_err();
        assert!(matches!(e, DxfError::NotDxf { .. }), "{e}");
        assert!(matches!(File::scan(b"", &opts()), Err(DxfError::Empty)));
        let png = b"\x89PNG\r\n\x1a\n\0\0\0\rIHDR";
        assert!(matches!(File::scan(png, &opts()), Err(DxfError::NotDxf { .. })));
    }

    #[test]
    fn an_unknown_version_is_refused() {
        let s = MINI.replace("AC1009", "AC1006");
        assert!(matches!(File::scan(s.as_bytes(), &opts()), Err(DxfError::Version { .. })));
    }
}
