//! Drawings for the benches, built in memory.
//!
//! A big drawing is the R2018 footbridge fixture (`fixtures/footbridge-m-r2018.dxf`,
//! seven loads on LOADS) with a survey background of an invented site
//! added `tiles` times: 200 layers (LAYER records), and per tile a contour
//! LWPOLYLINE, spot levels (POINT + TEXT), survey marks (INSERT of the
//! fixture's `SURVEYMARK` with two ATTRIBs and a SEQEND), a SOLID hatch with
//! a polyline path, an ANSI31 hatch with a line-and-arc edge path, a rendered
//! linear DIMENSION with its own `*D` block (BLOCK_RECORD and BLOCK), an
//! MTEXT note, LINEs, CIRCLEs and ARCs. Handles are fresh and unique,
//! `$HANDSEED` and the table counts are raised to match. Nothing is on the
//! layers hangline reads, so the structure read is the fixture's.
//!
//! [`to_binary`] writes the same pairs as binary DXF, so that the ASCII and
//! binary benches read the same drawing. Set `HANGLINE_BENCH_DUMP=DIR` to
//! have the generated drawings written there (to check them with ezdxf).
#![allow(dead_code)]

use std::fmt::Write as _;

/// The fixture the background is added to.
pub const FIXTURE: &str = include_str!(concat!(env!("CARGO_MANIFEST_DIR"), "/fixtures/footbridge-m-r2018.dxf"));

/// The sag the fixture is solved with in the benches (m), as in its expectations.
pub const SAG: f64 = 4.5;

/// Number of background layers.
pub const LAYERS: usize = 200;

/// One ASCII pair: group code, value, and the byte offset where the pair starts.
struct Pair<'a> {
    code: i32,
    value: &'a str,
    start: usize,
    value_start: usize,
}

/// The pairs of an ASCII DXF text (line ends `\n` or `\r\n`).
fn pairs(text: &str) -> Vec<Pair<'_>> {
    let mut out = Vec::new();
    let mut at = 0;
    let mut lines = text.split_inclusive('\n');
    while let (Some(code), Some(value)) = (lines.next(), lines.next()) {
        let start = at;
        let value_start = at + code.len();
        at = value_start + value.len();
        out.push(Pair {
            code: code.trim().parse().expect("a group code"),
            value: value.trim_end_matches(['\r', '\n']),
            start,
            value_start,
        });
    }
    out
}

/// A small deterministic generator (xorshift64*), so that the drawings are
/// the same on every run without a dependency.
pub struct Rng(u64);

impl Rng {
    /// A generator from a seed.
    pub fn new(seed: u64) -> Rng {
        Rng(seed.wrapping_mul(0x9E37_79B9_7F4A_7C15) | 1)
    }

    /// A number in [lo, hi).
    pub fn range(&mut self, lo: f64, hi: f64) -> f64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        let u = (self.0.wrapping_mul(0x2545_F491_4F6C_DD1D) >> 11) as f64 / (1u64 << 53) as f64;
        lo + (hi - lo) * u
    }
}

/// Writes pairs in the fixture's style: code right-aligned in three columns.
struct Out {
    text: String,
    next: u64,
}

impl Out {
    fn p(&mut self, code: i32, value: impl std::fmt::Display) {
        let _ = write!(self.text, "{code:>3}\n{value}\n");
    }

    fn xy(&mut self, code: i32, x: f64, y: f64) {
        self.p(code, x);
        self.p(code + 10, y);
        self.p(code + 20, 0.0);
    }

    fn handle(&mut self) -> String {
        let h = format!("{:X}", self.next);
        self.next += 1;
        h
    }

    /// `0 TYPE`, handle, owner, AcDbEntity, layer; returns the handle.
    fn entity(&mut self, kind: &str, owner: &str, layer: &str) -> String {
        let h = self.handle();
        self.p(0, kind);
        self.p(5, &h);
        self.p(330, owner);
        self.p(100, "AcDbEntity");
        self.p(8, layer);
        h
    }

    fn line(&mut self, owner: &str, layer: &str, a: (f64, f64), b: (f64, f64)) {
        self.entity("LINE", owner, layer);
        self.p(100, "AcDbLine");
        self.xy(10, a.0, a.1);
        self.xy(11, b.0, b.1);
    }

    fn point(&mut self, owner: &str, layer: &str, a: (f64, f64)) {
        self.entity("POINT", owner, layer);
        self.p(100, "AcDbPoint");
        self.xy(10, a.0, a.1);
    }

    fn text(&mut self, owner: &str, layer: &str, at: (f64, f64), height: f64, s: &str) {
        self.entity("TEXT", owner, layer);
        self.p(100, "AcDbText");
        self.xy(10, at.0, at.1);
        self.p(40, height);
        self.p(1, s);
        self.p(100, "AcDbText");
    }

    fn mtext(&mut self, owner: &str, layer: &str, at: (f64, f64), height: f64, s: &str) {
        self.entity("MTEXT", owner, layer);
        self.p(100, "AcDbMText");
        self.xy(10, at.0, at.1);
        self.p(40, height);
        self.p(71, 5);
        self.p(1, s);
    }

    fn solid(&mut self, owner: &str, layer: &str, p: [(f64, f64); 3]) {
        self.entity("SOLID", owner, layer);
        self.p(100, "AcDbTrace");
        self.xy(10, p[0].0, p[0].1);
        self.xy(11, p[1].0, p[1].1);
        self.xy(12, p[2].0, p[2].1);
        self.xy(13, p[2].0, p[2].1);
    }
}

/// Where the pieces of the background go in the fixture, and what it holds.
struct Frame {
    seed: u64,
    seed_span: std::ops::Range<usize>,
    layer_table: String,
    layer_count: (usize, std::ops::Range<usize>),
    layer_end: usize,
    record_table: String,
    record_count: (usize, std::ops::Range<usize>),
    record_end: usize,
    blocks_end: usize,
    entities_end: usize,
    model_space: String,
    next_d: usize,
}

fn frame(text: &str) -> Frame {
    let ps = pairs(text);
    let find = |from: usize, code: i32, value: &str| {
        (from..ps.len()).find(|&i| ps[i].code == code && ps[i].value == value).expect("in the fixture")
    };
    let span = |i: usize| ps[i].value_start..ps[i].value_start + ps[i].value.len();
    let hs = find(0, 9, "$HANDSEED") + 1;
    let table = |name: &str| {
        let mut i = 0;
        loop {
            i = find(i, 0, "TABLE");
            if ps[i + 1].value == name {
                break;
            }
            i += 1;
        }
        let handle = ps[i + 2].value.to_string();
        let count = (i..).find(|&j| ps[j].code == 70).expect("a count");
        let end = find(i, 0, "ENDTAB");
        (handle, (ps[count].value.trim().parse().expect("a count"), span(count)), ps[end].start)
    };
    let section_end = |name: &str| {
        let s = find(0, 2, name);
        ps[find(s, 0, "ENDSEC")].start
    };
    let (layer_table, layer_count, layer_end) = table("LAYER");
    let (record_table, record_count, record_end) = table("BLOCK_RECORD");
    let ents = find(0, 2, "ENTITIES");
    let model_space = ps[(ents..).find(|&j| ps[j].code == 330).expect("an owner")].value.to_string();
    let next_d = ps
        .iter()
        .filter(|p| p.code == 2)
        .filter_map(|p| p.value.strip_prefix("*D").and_then(|n| n.parse::<usize>().ok()))
        .max()
        .unwrap_or(0)
        + 1;
    Frame {
        seed: u64::from_str_radix(ps[hs].value.trim(), 16).expect("a hex handle seed"),
        seed_span: span(hs),
        layer_table,
        layer_count,
        layer_end,
        record_table,
        record_count,
        record_end,
        blocks_end: section_end("BLOCKS"),
        entities_end: section_end("ENTITIES"),
        model_space,
        next_d,
    }
}

/// The background layer names.
pub fn layer_names() -> Vec<String> {
    let disc = ["SV", "UT", "TP", "GE", "LS", "HW", "DR", "EL", "ST", "AN"];
    (0..LAYERS).map(|i| format!("{}-{:02}", disc[i % disc.len()], i / disc.len())).collect()
}

/// The fixture with `tiles` tiles of survey background, as ASCII DXF.
pub fn drawing(tiles: usize) -> String {
    let f = frame(FIXTURE);
    let names = layer_names();
    let mut rng = Rng::new(20_240_611);
    let mut layers = Out { text: String::new(), next: f.seed };
    for (i, name) in names.iter().enumerate() {
        layers.p(0, "LAYER");
        let h = layers.handle();
        layers.p(5, h);
        layers.p(330, &f.layer_table);
        layers.p(100, "AcDbSymbolTableRecord");
        layers.p(100, "AcDbLayerTableRecord");
        layers.p(2, name);
        layers.p(70, 0);
        layers.p(62, 1 + (i * 37) % 254);
        layers.p(6, "Continuous");
    }
    let mut records = Out { text: String::new(), next: layers.next };
    let mut blocks = Out { text: String::new(), next: 0 };
    let mut ents = Out { text: String::new(), next: 0 };
    let ms = f.model_space.as_str();
    let layer = |rng: &mut Rng| names[(rng.range(0.0, LAYERS as f64) as usize).min(LAYERS - 1)].as_str();
    for k in 0..tiles {
        let (ox, oy) = ((k % 40) as f64 * 120.0 - 40.0, -((k / 40) as f64) * 90.0 - 30.0);
        let at = |rng: &mut Rng| (ox + rng.range(0.0, 110.0), oy + rng.range(0.0, 80.0));

        // The dimension's block record, block and entity share handles made here.
        let d_name = format!("*D{}", f.next_d + k);
        let rec = records.handle();
        records.p(0, "BLOCK_RECORD");
        records.p(5, &rec);
        records.p(330, &f.record_table);
        records.p(100, "AcDbSymbolTableRecord");
        records.p(100, "AcDbBlockTableRecord");
        records.p(2, &d_name);
        records.p(340, 0);
        records.p(70, 0);
        records.p(280, 1);
        records.p(281, 0);
        blocks.next = records.next;
        let (a, b) = (at(&mut rng), rng.range(8.0, 25.0));
        let (dy, y) = (a.1 - 4.0, a.1);
        blocks.entity("BLOCK", &rec, "0");
        blocks.p(100, "AcDbBlockBegin");
        blocks.p(2, &d_name);
        blocks.p(70, 1);
        blocks.xy(10, 0.0, 0.0);
        blocks.p(3, &d_name);
        blocks.p(1, "");
        blocks.line(&rec, "0", (a.0, y - 0.15), (a.0, dy - 0.15));
        blocks.line(&rec, "0", (a.0 + b, y - 0.15), (a.0 + b, dy - 0.15));
        blocks.line(&rec, "0", (a.0, dy), (a.0 + b, dy));
        blocks.solid(&rec, "0", [(a.0, dy), (a.0 + 0.25, dy + 0.04), (a.0 + 0.25, dy - 0.04)]);
        blocks.solid(&rec, "0", [(a.0 + b, dy), (a.0 + b - 0.25, dy + 0.04), (a.0 + b - 0.25, dy - 0.04)]);
        blocks.mtext(&rec, "0", (a.0 + b / 2.0, dy + 0.3), 0.35, &format!("{b:.2}"));
        for p in [(a.0, dy), (a.0, y), (a.0 + b, y)] {
            blocks.point(&rec, "Defpoints", p);
        }
        let end = blocks.handle();
        blocks.p(0, "ENDBLK");
        blocks.p(5, end);
        blocks.p(330, &rec);
        blocks.p(100, "AcDbEntity");
        blocks.p(8, "0");
        blocks.p(100, "AcDbBlockEnd");
        records.next = blocks.next;
        ents.next = blocks.next;

        let l = layer(&mut rng);
        ents.entity("DIMENSION", ms, l);
        ents.p(100, "AcDbDimension");
        ents.p(280, 0);
        ents.p(2, &d_name);
        ents.p(3, "Standard");
        ents.xy(10, a.0, dy);
        ents.xy(11, a.0 + b / 2.0, dy + 0.3);
        ents.p(70, 32);
        ents.p(71, 5);
        ents.p(1, "<>");
        ents.p(100, "AcDbAlignedDimension");
        ents.xy(13, a.0, y);
        ents.xy(14, a.0 + b, y);
        ents.p(50, 0.0);
        ents.p(100, "AcDbRotatedDimension");

        // A contour.
        let base = oy + rng.range(5.0, 75.0);
        ents.entity("LWPOLYLINE", ms, layer(&mut rng));
        ents.p(100, "AcDbPolyline");
        ents.p(90, 40);
        ents.p(70, 0);
        ents.p(43, 0.0);
        for j in 0..40 {
            ents.p(10, ox + j as f64 * 110.0 / 39.0);
            ents.p(20, base + 3.0 * (j as f64 * 0.3).sin() + rng.range(-0.2, 0.2));
        }
        // Spot levels.
        for _ in 0..12 {
            let p = at(&mut rng);
            ents.point(ms, "SV-08", p);
            ents.text(ms, "SV-08", (p.0 + 0.2, p.1 + 0.2), 0.4, &format!("+{:.2}", rng.range(4.0, 31.0)));
        }
        // Survey marks with their attributes.
        for m in 0..4 {
            let l = layer(&mut rng);
            let p = at(&mut rng);
            let ins = ents.entity("INSERT", ms, l);
            ents.p(100, "AcDbBlockReference");
            ents.p(66, 1);
            ents.p(2, "SURVEYMARK");
            ents.xy(10, p.0, p.1);
            for (tag, value, dy) in
                [("ID", format!("SM{k}-{m}"), 0.1), ("LEVEL", format!("{:.3}", rng.range(4.0, 31.0)), -0.3)]
            {
                ents.entity("ATTRIB", &ins, l);
                ents.p(100, "AcDbText");
                ents.xy(10, p.0 + 0.3, p.1 + dy);
                ents.p(40, 0.25);
                ents.p(1, value);
                ents.p(100, "AcDbAttribute");
                ents.p(280, 0);
                ents.p(2, tag);
                ents.p(70, 0);
            }
            ents.entity("SEQEND", &ins, l);
        }
        // A pond (SOLID, polyline path) and a planting bed (ANSI31, line and arc edges).
        let (p, w, h) = (at(&mut rng), rng.range(3.0, 9.0), rng.range(2.0, 6.0));
        ents.entity("HATCH", ms, layer(&mut rng));
        hatch_head(&mut ents, "SOLID", true);
        ents.p(92, 3);
        ents.p(72, 0);
        ents.p(73, 1);
        ents.p(93, 4);
        for (x, y) in [(p.0, p.1), (p.0 + w, p.1), (p.0 + w, p.1 + h), (p.0, p.1 + h)] {
            ents.p(10, x);
            ents.p(20, y);
        }
        hatch_tail(&mut ents, false);
        let (p, half, r) = (at(&mut rng), rng.range(2.0, 6.0), rng.range(1.0, 3.0));
        ents.entity("HATCH", ms, layer(&mut rng));
        hatch_head(&mut ents, "ANSI31", false);
        ents.p(92, 1);
        ents.p(93, 4);
        for (kind, (x0, y0), (x1, y1)) in [
            (1, (p.0 - half, p.1 - r), (p.0 + half, p.1 - r)),
            (2, (p.0 + half, p.1), (270.0, 90.0)),
            (1, (p.0 + half, p.1 + r), (p.0 - half, p.1 + r)),
            (2, (p.0 - half, p.1), (90.0, 270.0)),
        ] {
            ents.p(72, kind);
            ents.p(10, x0);
            ents.p(20, y0);
            if kind == 1 {
                ents.p(11, x1);
                ents.p(21, y1);
            } else {
                ents.p(40, r);
                ents.p(50, x1);
                ents.p(51, y1);
                ents.p(73, 1);
            }
        }
        hatch_tail(&mut ents, true);
        // A note.
        let p = at(&mut rng);
        ents.mtext(
            ms,
            "AN-02",
            p,
            0.5,
            &format!("{{\\fArial|b1;NOTE {k}}}\\PLevels in metres above the site datum.\\PSheet {k} (invented)."),
        );
        // Kerbs, bollards, radii.
        for _ in 0..6 {
            let (a, t, len) = (at(&mut rng), rng.range(0.0, std::f64::consts::TAU), rng.range(2.0, 12.0));
            ents.line(ms, layer(&mut rng), a, (a.0 + len * t.cos(), a.1 + len * t.sin()));
        }
        for _ in 0..4 {
            let c = at(&mut rng);
            ents.entity("CIRCLE", ms, layer(&mut rng));
            ents.p(100, "AcDbCircle");
            ents.xy(10, c.0, c.1);
            ents.p(40, rng.range(0.1, 0.6));
        }
        for _ in 0..3 {
            let c = at(&mut rng);
            ents.entity("ARC", ms, layer(&mut rng));
            ents.p(100, "AcDbCircle");
            ents.xy(10, c.0, c.1);
            ents.p(40, rng.range(1.0, 8.0));
            ents.p(100, "AcDbArc");
            ents.p(50, rng.range(0.0, 360.0));
            ents.p(51, rng.range(0.0, 360.0));
        }
        records.next = ents.next;
    }

    // Splice: later positions first, so earlier offsets stay valid.
    let mut edits: Vec<(std::ops::Range<usize>, String)> = vec![
        (f.seed_span.clone(), format!("{:X}", records.next)),
        (f.layer_count.1.clone(), format!("{}", f.layer_count.0 + LAYERS)),
        (f.layer_end..f.layer_end, layers.text),
        (f.record_count.1.clone(), format!("{}", f.record_count.0 + tiles)),
        (f.record_end..f.record_end, records.text),
        (f.blocks_end..f.blocks_end, blocks.text),
        (f.entities_end..f.entities_end, ents.text),
    ];
    edits.sort_by_key(|e| std::cmp::Reverse(e.0.start));
    let mut out = FIXTURE.to_string();
    for (range, text) in edits {
        out.replace_range(range, &text);
    }
    out
}

fn hatch_head(o: &mut Out, pattern: &str, solid: bool) {
    o.p(100, "AcDbHatch");
    o.xy(10, 0.0, 0.0);
    o.p(210, 0.0);
    o.p(220, 0.0);
    o.p(230, 1.0);
    o.p(2, pattern);
    o.p(70, i32::from(solid));
    o.p(71, 0);
    o.p(91, 1);
}

fn hatch_tail(o: &mut Out, pattern: bool) {
    o.p(97, 0);
    o.p(75, 1);
    o.p(76, 1);
    if pattern {
        o.p(52, 0.0);
        o.p(41, 0.5);
        o.p(77, 0);
        o.p(78, 1);
        o.p(53, 45.0);
        o.p(43, 0.0);
        o.p(44, 0.0);
        o.p(45, -0.3535533906);
        o.p(46, 0.3535533906);
        o.p(79, 0);
    }
    o.p(98, 0);
}

/// How many tiles make an ASCII drawing of about `bytes`.
pub fn tiles_for(bytes: usize) -> usize {
    let one = drawing(1).len();
    let per_tile = drawing(2).len() - one;
    bytes.saturating_sub(one) / per_tile + 1
}

/// The same pairs as binary DXF (R13 on: two-byte group codes), value types
/// after the DXF reference's group code ranges (as ezdxf writes them).
pub fn to_binary(ascii: &str) -> Vec<u8> {
    let mut out = Vec::with_capacity(ascii.len());
    out.extend_from_slice(b"AutoCAD Binary DXF\r\n\x1a\x00");
    for p in pairs(ascii) {
        if p.code == 999 {
            continue;
        }
        let code = u16::try_from(p.code).expect("a group code");
        let v = p.value.trim();
        let int = || v.parse::<i64>().expect("an integer");
        match p.code {
            310..=319 | 1004 => {
                let bytes: Vec<u8> =
                    (0..v.len()).step_by(2).map(|i| u8::from_str_radix(&v[i..i + 2], 16).expect("hex")).collect();
                for chunk in bytes.chunks(127) {
                    out.extend_from_slice(&code.to_le_bytes());
                    out.push(u8::try_from(chunk.len()).expect("a short chunk"));
                    out.extend_from_slice(chunk);
                }
                continue;
            }
            _ => out.extend_from_slice(&code.to_le_bytes()),
        }
        match p.code {
            10..=59 | 110..=149 | 210..=239 | 460..=469 | 1010..=1059 => {
                out.extend_from_slice(&v.parse::<f64>().expect("a number").to_le_bytes());
            }
            60..=79 | 170..=179 | 270..=289 | 370..=389 | 400..=409 | 1060..=1070 => {
                out.extend_from_slice(&i16::try_from(int()).expect("16 bits").to_le_bytes());
            }
            90..=99 | 420..=429 | 440..=459 | 1071 => {
                out.extend_from_slice(&i32::try_from(int()).expect("32 bits").to_le_bytes());
            }
            160..=169 => out.extend_from_slice(&int().to_le_bytes()),
            290..=299 => out.push(u8::try_from(int()).expect("a byte")),
            _ => {
                out.extend_from_slice(p.value.as_bytes());
                out.push(0);
            }
        }
    }
    out
}

/// Writes `bytes` to `$HANGLINE_BENCH_DUMP/name` when that variable is set.
pub fn dump(name: &str, bytes: &[u8]) {
    if let Some(dir) = std::env::var_os("HANGLINE_BENCH_DUMP") {
        let path = std::path::Path::new(&dir).join(name);
        std::fs::write(&path, bytes).unwrap_or_else(|e| panic!("writing {}: {e}", path.display()));
    }
}

/// Sizes of the benches' drawings (ASCII bytes) and their labels.
pub const SIZES: [(usize, &str); 3] = [(1 << 20, "1MiB"), (4 << 20, "4MiB"), (16 << 20, "16MiB")];

/// The drawings of [`SIZES`]: label, ASCII text, binary bytes.
pub fn drawings() -> Vec<(&'static str, String, Vec<u8>)> {
    SIZES
        .iter()
        .map(|&(bytes, label)| {
            let ascii = drawing(tiles_for(bytes));
            let binary = to_binary(&ascii);
            dump(&format!("bench-{label}.dxf"), ascii.as_bytes());
            dump(&format!("bench-{label}-bin.dxf"), &binary);
            (label, ascii, binary)
        })
        .collect()
}
