//! The group-code/value pairs of a DXF file, ASCII or binary, read in place.
//!
//! A [`Pair`] borrows its value from the file's bytes and knows the byte span
//! it occupies, so that a writer can copy any run of the input unchanged.
//! Nothing is decoded until asked for: the scanner only looks at codes and
//! at the few values it needs.

use std::ops::Range;

use super::DxfError;

/// The sentinel that opens a binary DXF file (DXF reference, "Binary DXF Files").
pub const BINARY_SENTINEL: &[u8; 22] = b"AutoCAD Binary DXF\r\n\x1a\x00";

/// How the file stores its pairs.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Format {
    /// Text: a group code line, then a value line.
    Ascii,
    /// Binary, with 1-byte group codes (R12 and before) or 2-byte codes (R13 on).
    Binary {
        /// True when group codes take two bytes.
        wide_codes: bool,
    },
}

/// How a binary value of a group code is stored, after the binary DXF
/// layout of the DXF reference ("Group Code Value Types"), as written and
/// read by ezdxf 1.4.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Kind {
    /// Zero-terminated string.
    Text,
    /// 8-byte IEEE double.
    Double,
    /// 1-byte value (booleans, 290–299).
    Int8,
    /// 2-byte signed integer.
    Int16,
    /// 4-byte signed integer.
    Int32,
    /// 8-byte signed integer.
    Int64,
    /// Binary chunk: a length byte, then that many bytes (310–319, 1004).
    Chunk,
}

/// The storage kind of a group code (a table lookup: this is asked for
/// every pair of a binary file).
#[must_use]
#[inline]
pub fn kind_of(code: i32) -> Kind {
    usize::try_from(code).ok().and_then(|c| KINDS.get(c)).copied().unwrap_or(Kind::Text)
}

/// [`kind_by_range`] for every code from 0 to 1071.
static KINDS: [Kind; 1072] = {
    let mut table = [Kind::Text; 1072];
    let mut c = 0;
    while c < 1072 {
        table[c] = kind_by_range(c as i32);
        c += 1;
    }
    table
};

/// The storage kind of a group code, from the ranges of the DXF reference.
const fn kind_by_range(code: i32) -> Kind {
    match code {
        10..=59 | 110..=149 | 210..=239 | 460..=469 | 1010..=1059 => Kind::Double,
        60..=79 | 170..=179 | 270..=289 | 370..=389 | 400..=409 | 1060..=1070 => Kind::Int16,
        90..=99 | 420..=429 | 440..=459 | 1071 => Kind::Int32,
        160..=169 => Kind::Int64,
        290..=299 => Kind::Int8,
        310..=319 | 1004 => Kind::Chunk,
        _ => Kind::Text,
    }
}

/// One group code and its value, borrowed from the file.
#[derive(Clone, Copy, Debug)]
pub struct Pair<'a> {
    /// The group code.
    pub code: i32,
    /// The value's bytes: for ASCII the value line without its line end; for
    /// binary the stored bytes (a string without its terminator).
    pub raw: &'a [u8],
    /// Byte offset where the pair starts (its group code).
    pub start: usize,
    /// Byte offset just past the pair.
    pub end: usize,
    /// Byte span of the value itself.
    pub value: (usize, usize),
    binary: bool,
}

impl<'a> Pair<'a> {
    /// The value as a number, for numeric codes (or a numeric ASCII string).
    #[must_use]
    pub fn f64(&self) -> Option<f64> {
        if self.binary {
            match kind_of(self.code) {
                Kind::Double => self.raw.try_into().ok().map(f64::from_le_bytes),
                _ => self.i64().map(|v| v as f64),
            }
        } else {
            std::str::from_utf8(self.raw).ok()?.trim().parse().ok()
        }
    }

    /// The value as an integer, for integer codes (or an integer ASCII string).
    #[must_use]
    pub fn i64(&self) -> Option<i64> {
        if self.binary {
            let r = self.raw;
            match kind_of(self.code) {
                Kind::Int8 => r.first().map(|&b| i64::from(b)),
                Kind::Int16 => r.try_into().ok().map(|b| i64::from(i16::from_le_bytes(b))),
                Kind::Int32 => r.try_into().ok().map(|b| i64::from(i32::from_le_bytes(b))),
                Kind::Int64 => r.try_into().ok().map(i64::from_le_bytes),
                _ => None,
            }
        } else {
            let s = std::str::from_utf8(self.raw).ok()?.trim();
            s.parse().ok().or_else(|| {
                // Some writers put integers as "1.0".
                let v: f64 = s.parse().ok()?;
                (v.fract() == 0.0 && v.abs() < 9e15).then_some(v as i64)
            })
        }
    }

    /// The value's bytes as a string value, with ASCII padding removed
    /// (trailing spaces and, for ASCII files, a trailing carriage return are
    /// already gone).
    #[must_use]
    pub fn bytes(&self) -> &'a [u8] {
        self.raw
    }

    /// True when the value equals `s` (exact bytes, after trimming surrounding
    /// blanks in ASCII files).
    #[must_use]
    pub fn is(&self, s: &str) -> bool {
        if self.binary { self.raw == s.as_bytes() } else { trim_ascii(self.raw) == s.as_bytes() }
    }

    /// The value as a number, quickly and to about one unit in the last
    /// place: for estimates only ([`approx_f64`]).
    #[must_use]
    pub fn approx_f64(&self) -> Option<f64> {
        if self.binary { self.f64() } else { approx_f64(self.raw) }
    }

    /// A hexadecimal handle value (codes 5, 105, 320–369, 390–399, 480–481).
    #[must_use]
    pub fn handle(&self) -> Option<u64> {
        parse_handle(self.raw)
    }

    /// A binary value of `code` as a number.
    #[must_use]
    pub fn typed_f64(code: i32, raw: &[u8]) -> Option<f64> {
        match kind_of(code) {
            Kind::Double => raw.try_into().ok().map(f64::from_le_bytes),
            _ => Pair::typed_i64(code, raw).map(|v| v as f64),
        }
    }

    /// A binary value of `code` as an integer.
    #[must_use]
    pub fn typed_i64(code: i32, r: &[u8]) -> Option<i64> {
        match kind_of(code) {
            Kind::Int8 => r.first().map(|&b| i64::from(b)),
            Kind::Int16 => r.try_into().ok().map(|b| i64::from(i16::from_le_bytes(b))),
            Kind::Int32 => r.try_into().ok().map(|b| i64::from(i32::from_le_bytes(b))),
            Kind::Int64 => r.try_into().ok().map(i64::from_le_bytes),
            _ => None,
        }
    }

    /// The byte range of the whole pair.
    #[must_use]
    pub fn span(&self) -> Range<usize> {
        self.start..self.end
    }
}

/// A hexadecimal handle (at most 16 digits, blanks around allowed).
#[must_use]
pub fn parse_handle(raw: &[u8]) -> Option<u64> {
    let t = raw.trim_ascii();
    if t.is_empty() || t.len() > 16 {
        return None;
    }
    let mut v: u64 = 0;
    for &c in t {
        let d = match c {
            b'0'..=b'9' => c - b'0',
            b'a'..=b'f' => c - b'a' + 10,
            b'A'..=b'F' => c - b'A' + 10,
            _ => return None,
        };
        v = (v << 4) | u64::from(d);
    }
    Some(v)
}

fn trim_ascii(b: &[u8]) -> &[u8] {
    b.trim_ascii()
}

/// Reads pairs one after another from `bytes`, starting at `pos`.
#[derive(Clone, Debug)]
pub struct Pairs<'a> {
    bytes: &'a [u8],
    pos: usize,
    format: Format,
    /// 1-based line number of the next group code line (ASCII only).
    line: usize,
}

impl<'a> Pairs<'a> {
    /// Pairs of the whole file; detects the format from the binary sentinel.
    pub fn new(bytes: &'a [u8]) -> Result<Pairs<'a>, DxfError> {
        if bytes.starts_with(BINARY_SENTINEL) {
            let rest = &bytes[BINARY_SENTINEL.len()..];
            // The first pair is (0, "SECTION"): with 2-byte codes the second
            // byte is the code's high byte, 0; with 1-byte codes it is 'S'.
            let wide = match rest {
                [0, 0, b'S', ..] => true,
                [0, b'S', ..] => false,
                _ => return Err(DxfError::NotDxf { detail: "binary DXF sentinel not followed by a SECTION".into() }),
            };
            let pos = BINARY_SENTINEL.len();
            Ok(Pairs::new_at(bytes, Format::Binary { wide_codes: wide }, pos, 0))
        } else {
            Ok(Pairs::new_at(bytes, Format::Ascii, 0, 1))
        }
    }

    /// Pairs of a part of a file whose format is known, starting at byte `pos`.
    #[must_use]
    pub fn at(bytes: &'a [u8], format: Format, pos: usize) -> Pairs<'a> {
        Pairs::new_at(bytes, format, pos, 0)
    }

    fn new_at(bytes: &'a [u8], format: Format, pos: usize, line: usize) -> Pairs<'a> {
        let pos = pos.min(bytes.len());
        Pairs { bytes, pos, format, line }
    }

    /// The file's format.
    #[must_use]
    pub fn format(&self) -> Format {
        self.format
    }

    /// Where the next pair starts.
    #[must_use]
    pub fn position(&self) -> usize {
        self.pos
    }

    /// A description of where the reader is, for messages: a line number for
    /// ASCII files read from the start, else a byte offset.
    #[must_use]
    pub fn location(&self) -> String {
        if self.format == Format::Ascii && self.line > 0 {
            format!("line {}", self.line)
        } else {
            format!("byte {}", self.pos)
        }
    }

    /// The next pair, `Ok(None)` at the end of the bytes.
    #[inline(always)]
    pub fn next_pair(&mut self) -> Result<Option<Pair<'a>>, DxfError> {
        if self.pos >= self.bytes.len() {
            return Ok(None);
        }
        match self.format {
            Format::Ascii => self.next_ascii(),
            Format::Binary { wide_codes } => self.next_binary(wide_codes),
        }
    }

    /// Calls `f(code, value, end)` for each pair up to, not including, the
    /// next pair with group code 0 (or the end of the bytes), and leaves the
    /// reader at that pair. One tight loop with the pair's fields in
    /// registers: the scan of an entity's pairs, the hottest loop there is.
    #[inline]
    pub fn each_in_object<F: FnMut(i32, &'a [u8], usize)>(&mut self, mut f: F) -> Result<(), DxfError> {
        loop {
            let (pos, line) = (self.pos, self.line);
            match self.next_pair()? {
                None => return Ok(()),
                Some(p) if p.code == 0 => {
                    self.pos = pos;
                    self.line = line;
                    return Ok(());
                }
                Some(p) => f(p.code, p.raw, p.end),
            }
        }
    }

    #[inline(always)]
    fn next_line(&mut self) -> Option<(&'a [u8], usize)> {
        let bytes = self.bytes;
        if self.pos >= bytes.len() {
            return None;
        }
        let start = self.pos;
        let line_end = line_end(bytes, start);
        let next = (line_end + 1).min(bytes.len());
        let mut line = &bytes[start..line_end];
        if let [head @ .., b'\r'] = line {
            line = head;
        }
        self.pos = next;
        if self.line > 0 {
            self.line += 1;
        }
        Some((line, start))
    }

    #[inline(always)]
    fn next_ascii(&mut self) -> Result<Option<Pair<'a>>, DxfError> {
        let bytes = self.bytes;
        let start = self.pos;
        // Most writers pad codes to three characters: read those directly.
        if let Some((code, value_start)) = padded_code(bytes, start) {
            let nl = line_end(bytes, value_start);
            let raw = bytes[value_start..nl].trim_ascii_end();
            self.pos = (nl + 1).min(bytes.len());
            if nl == bytes.len() && value_start >= bytes.len() {
                return Err(DxfError::Truncated {
                    location: self.location(),
                    detail: format!("group code {code} has no value"),
                });
            }
            if self.line > 0 {
                self.line += 2;
            }
            return Ok(Some(Pair {
                code,
                raw,
                start,
                end: self.pos,
                value: (value_start, value_start + raw.len()),
                binary: false,
            }));
        }
        self.next_ascii_slow()
    }

    fn next_ascii_slow(&mut self) -> Result<Option<Pair<'a>>, DxfError> {
        let code_line_no = self.line;
        let Some((code_line, start)) = self.next_line() else { return Ok(None) };
        let code_text = code_line.trim_ascii();
        if code_text.is_empty() && self.pos >= self.bytes.len() {
            // A trailing blank line after EOF.
            return Ok(None);
        }
        let code = parse_code(code_text).ok_or_else(|| DxfError::BadCode {
            location: if code_line_no > 0 { format!("line {code_line_no}") } else { format!("byte {start}") },
            text: String::from_utf8_lossy(&code_text[..code_text.len().min(40)]).into_owned(),
        })?;
        let value_start = self.pos;
        let Some((raw, _)) = self.next_line() else {
            return Err(DxfError::Truncated {
                location: self.location(),
                detail: format!("group code {code} has no value"),
            });
        };
        // Strings may carry meaningful leading blanks; trailing blanks are padding.
        let raw = raw.trim_ascii_end();
        Ok(Some(Pair { code, raw, start, end: self.pos, value: (value_start, value_start + raw.len()), binary: false }))
    }

    #[inline(always)]
    fn next_binary(&mut self, wide: bool) -> Result<Option<Pair<'a>>, DxfError> {
        let bytes = self.bytes;
        let start = self.pos;
        let truncated =
            |what: &str| DxfError::Truncated { location: format!("byte {start}"), detail: what.to_string() };
        let mut p = start;
        let code = if wide {
            let b = bytes.get(p..p + 2).ok_or_else(|| truncated("a group code is cut off"))?;
            p += 2;
            i32::from(i16::from_le_bytes([b[0], b[1]]))
        } else {
            let b = *bytes.get(p).ok_or_else(|| truncated("a group code is cut off"))?;
            p += 1;
            if b == 255 {
                let e = bytes.get(p..p + 2).ok_or_else(|| truncated("a group code is cut off"))?;
                p += 2;
                i32::from(i16::from_le_bytes([e[0], e[1]]))
            } else {
                i32::from(b)
            }
        };
        let (value_start, value_end, next) = match kind_of(code) {
            Kind::Text => {
                let rest = bytes.get(p..).unwrap_or_default();
                let n = memchr::memchr(0, rest).ok_or_else(|| truncated("a string value has no terminator"))?;
                (p, p + n, p + n + 1)
            }
            Kind::Chunk => {
                let n = usize::from(*bytes.get(p).ok_or_else(|| truncated("a binary chunk is cut off"))?);
                (p + 1, p + 1 + n, p + 1 + n)
            }
            k => {
                let n = match k {
                    Kind::Int8 => 1,
                    Kind::Int16 => 2,
                    Kind::Int32 => 4,
                    _ => 8,
                };
                (p, p + n, p + n)
            }
        };
        if value_end > bytes.len() {
            return Err(truncated("a value is cut off"));
        }
        self.pos = next;
        Ok(Some(Pair {
            code,
            raw: &bytes[value_start..value_end],
            start,
            end: next,
            value: (value_start, value_end),
            binary: true,
        }))
    }
}

/// Where the line starting at `from` ends (its `\n`, or the end of the
/// bytes). DXF lines are mostly a few bytes long, so a plain loop over the
/// first bytes beats setting up a vector search; longer lines get one.
#[inline]
fn line_end(bytes: &[u8], from: usize) -> usize {
    let near = (from + 16).min(bytes.len());
    if let Some(i) = bytes.get(from..near).and_then(|b| b.iter().position(|&c| c == b'\n')) {
        return from + i;
    }
    memchr::memchr(b'\n', bytes.get(near..).unwrap_or_default()).map_or(bytes.len(), |i| near + i)
}

/// A code line of exactly three characters (right-aligned digits) and its
/// line end, as AutoCAD and ezdxf write them: the code and where its value
/// line starts. Anything else is left to the general path.
#[inline]
fn padded_code(bytes: &[u8], at: usize) -> Option<(i32, usize)> {
    let w = bytes.get(at..at + 4)?;
    let next = match w[3] {
        b'\n' => at + 4,
        b'\r' if bytes.get(at + 4) == Some(&b'\n') => at + 5,
        _ => return None,
    };
    let mut code = 0i32;
    let mut digits = 0;
    for &c in &w[..3] {
        match c {
            b' ' if digits == 0 => {}
            b'0'..=b'9' => {
                code = code * 10 + i32::from(c - b'0');
                digits += 1;
            }
            _ => return None,
        }
    }
    (digits > 0).then_some((code, next))
}

/// A group code from its (trimmed) line: an optional sign and at most four
/// digits, in the range the DXF reference uses (−5 to 1071).
#[inline]
fn parse_code(t: &[u8]) -> Option<i32> {
    let (neg, digits) = match t {
        [b'-', rest @ ..] => (true, rest),
        [b'+', rest @ ..] => (false, rest),
        _ => (false, t),
    };
    if digits.is_empty() || digits.len() > 4 {
        return None;
    }
    let mut v: i32 = 0;
    for &d in digits {
        if !d.is_ascii_digit() {
            return None;
        }
        v = v * 10 + i32::from(d - b'0');
    }
    let v = if neg { -v } else { v };
    (-5..=1071).contains(&v).then_some(v)
}

/// Parses a decimal number quickly and approximately (to about one unit in
/// the last place); for estimates such as extents only. Falls back to the
/// exact parser on anything unusual.
#[must_use]
pub fn approx_f64(b: &[u8]) -> Option<f64> {
    let b = b.trim_ascii();
    let (neg, rest) = match b {
        [b'-', r @ ..] => (true, r),
        [b'+', r @ ..] => (false, r),
        _ => (false, b),
    };
    let mut mantissa: u64 = 0;
    let mut digits = 0;
    let mut scale: i32 = 0;
    let mut seen_point = false;
    let mut i = 0;
    while i < rest.len() {
        let c = rest[i];
        if c.is_ascii_digit() {
            if digits < 18 {
                mantissa = mantissa * 10 + u64::from(c - b'0');
                digits += 1;
                if seen_point {
                    scale -= 1;
                }
            } else if !seen_point {
                scale += 1;
            }
        } else if c == b'.' && !seen_point {
            seen_point = true;
        } else {
            break;
        }
        i += 1;
    }
    if i < rest.len() || i == 0 {
        // An exponent, junk or nothing: the exact parser decides.
        return std::str::from_utf8(b).ok()?.parse().ok();
    }
    const POW10: [f64; 19] =
        [1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18];
    let m = mantissa as f64;
    let v = if scale >= 0 {
        m * POW10.get(scale as usize).copied().unwrap_or(f64::INFINITY)
    } else {
        m / POW10.get((-scale) as usize).copied().unwrap_or(f64::INFINITY)
    };
    Some(if neg { -v } else { v })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ascii_pairs_with_crlf_and_padding() {
        let src = b"  0\r\nSECTION\r\n  2\r\nHEADER\r\n 10\r\n1.5  \r\n";
        let mut p = Pairs::new(src).unwrap();
        let a = p.next_pair().unwrap().unwrap();
        assert_eq!((a.code, a.raw), (0, &b"SECTION"[..]));
        assert_eq!(a.span(), 0..14);
        let b = p.next_pair().unwrap().unwrap();
        assert!(b.is("HEADER"));
        let c = p.next_pair().unwrap().unwrap();
        assert_eq!(c.f64(), Some(1.5));
        assert!(p.next_pair().unwrap().is_none());
    }

    #[test]
    fn ascii_missing_value_is_truncation() {
        let mut p = Pairs::new(b"0\nSECTION\n2\n").unwrap();
        p.next_pair().unwrap();
        let e = p.next_pair().unwrap_err();
        assert!(matches!(e, DxfError::Truncated { .. }), "{e}");
    }

    #[test]
    fn ascii_bad_code_names_the_line() {
        let mut p = Pairs::new(b"0\nSECTION\nhello\nx\n").unwrap();
        p.next_pair().unwrap();
        let e = p.next_pair().unwrap_err().to_string();
        assert!(e.contains("line 3"), "{e}");
    }

    #[test]
    fn approximate_numbers_are_close() {
        for t in
            ["0", "12.5", "-3.25", "1234567.891", ".5", "7.", "1e-3", "-2.5E+4", "0.000001", "123456789012345678901"]
        {
            let exact: f64 = t.parse().unwrap();
            let fast = approx_f64(t.as_bytes()).unwrap();
            assert!((fast - exact).abs() <= 4.0 * f64::EPSILON * exact.abs(), "{t}: {fast} vs {exact}");
        }
        assert_eq!(approx_f64(b"nan").map(f64::is_nan), Some(true));
        assert_eq!(approx_f64(b"x1"), None);
        assert_eq!(parse_code(b"1071"), Some(1071));
        assert_eq!(parse_code(b"-1"), Some(-1));
        assert_eq!(parse_code(b"10000"), None);
        assert_eq!(parse_code(b"1x"), None);
    }

    #[test]
    fn binary_wide_codes() {
        let mut src = BINARY_SENTINEL.to_vec();
        src.extend_from_slice(&[0, 0]);
        src.extend_from_slice(b"SECTION\0");
        src.extend_from_slice(&[10, 0]);
        src.extend_from_slice(&2.5f64.to_le_bytes());
        src.extend_from_slice(&[70, 0, 7, 0]);
        let mut p = Pairs::new(&src).unwrap();
        assert_eq!(p.format(), Format::Binary { wide_codes: true });
        assert!(p.next_pair().unwrap().unwrap().is("SECTION"));
        assert_eq!(p.next_pair().unwrap().unwrap().f64(), Some(2.5));
        assert_eq!(p.next_pair().unwrap().unwrap().i64(), Some(7));
    }

    #[test]
    fn binary_narrow_codes_with_escape() {
        let mut src = BINARY_SENTINEL.to_vec();
        src.push(0);
        src.extend_from_slice(b"SECTION\0");
        src.extend_from_slice(&[255, 0xE8, 0x03]); // 1000
        src.extend_from_slice(b"x\0");
        let mut p = Pairs::new(&src).unwrap();
        p.next_pair().unwrap();
        let x = p.next_pair().unwrap().unwrap();
        assert_eq!(x.code, 1000);
        assert_eq!(x.raw, b"x");
    }

    #[test]
    fn binary_cut_value_is_truncation() {
        let mut src = BINARY_SENTINEL.to_vec();
        src.extend_from_slice(&[0, 0]);
        src.extend_from_slice(b"SECTION\0");
        src.extend_from_slice(&[10, 0, 1, 2]);
        let mut p = Pairs::new(&src).unwrap();
        p.next_pair().unwrap();
        assert!(matches!(p.next_pair(), Err(DxfError::Truncated { .. })));
    }
}
