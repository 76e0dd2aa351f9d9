//! Writing new pairs in the input file's own format and encoding.

use kurbo::Point;

use super::index::File;
use super::pairs::{Format, Kind, kind_of};
use super::text::TextEncoding;

/// Builds the bytes of new pairs the way the input file stores its own:
/// ASCII or binary (1- or 2-byte group codes), its line end, its encoding.
#[derive(Clone, Debug)]
pub struct Encoder {
    format: Format,
    encoding: TextEncoding,
    line_end: &'static str,
    buf: Vec<u8>,
}

impl Encoder {
    /// An encoder for additions to `file`.
    #[must_use]
    pub fn for_file(file: &File<'_>) -> Encoder {
        Encoder::new(file.format, file.encoding, file.line_end)
    }

    /// An encoder for the given format.
    #[must_use]
    pub fn new(format: Format, encoding: TextEncoding, line_end: &'static str) -> Encoder {
        Encoder { format, encoding, line_end, buf: Vec::new() }
    }

    fn code(&mut self, code: i32) {
        match self.format {
            Format::Ascii => {
                self.buf.extend_from_slice(format!("{code:>3}").as_bytes());
                self.buf.extend_from_slice(self.line_end.as_bytes());
            }
            Format::Binary { wide_codes: true } => {
                self.buf.extend_from_slice(&(code as i16).to_le_bytes());
            }
            Format::Binary { wide_codes: false } => {
                if (0..255).contains(&code) {
                    self.buf.push(code as u8);
                } else {
                    self.buf.push(255);
                    self.buf.extend_from_slice(&(code as i16).to_le_bytes());
                }
            }
        }
    }

    fn line(&mut self, s: &[u8]) {
        self.buf.extend_from_slice(s);
        self.buf.extend_from_slice(self.line_end.as_bytes());
    }

    /// A string value (any code whose kind is text).
    pub fn text(&mut self, code: i32, s: &str) -> &mut Self {
        debug_assert_eq!(kind_of(code), Kind::Text, "group code {code} is not a string");
        self.code(code);
        let bytes = self.value_text(s);
        match self.format {
            Format::Ascii => self.line(&bytes),
            Format::Binary { .. } => {
                self.buf.extend_from_slice(&bytes);
                self.buf.push(0);
            }
        }
        self
    }

    /// A real value.
    pub fn real(&mut self, code: i32, v: f64) -> &mut Self {
        debug_assert_eq!(kind_of(code), Kind::Double, "group code {code} is not a real");
        self.code(code);
        match self.format {
            Format::Ascii => {
                let s = format_real(v);
                self.line(s.as_bytes());
            }
            Format::Binary { .. } => self.buf.extend_from_slice(&v.to_le_bytes()),
        }
        self
    }

    /// An integer value, stored in the width its group code takes.
    pub fn int(&mut self, code: i32, v: i64) -> &mut Self {
        self.code(code);
        let bytes = self.value_int(code, v);
        match self.format {
            Format::Ascii => self.line(&bytes),
            Format::Binary { .. } => self.buf.extend_from_slice(&bytes),
        }
        self
    }

    /// A handle (hexadecimal string).
    pub fn handle(&mut self, code: i32, h: u64) -> &mut Self {
        self.text(code, &format!("{h:X}"))
    }

    /// A 2D point as codes `code`, `code + 10`, `code + 20` (z = 0).
    pub fn point(&mut self, code: i32, p: Point) -> &mut Self {
        self.real(code, p.x).real(code + 10, p.y).real(code + 20, 0.0)
    }

    /// The bytes of a string value alone (no code, no terminator), to
    /// replace an existing value in place.
    #[must_use]
    pub fn value_text(&self, s: &str) -> Vec<u8> {
        self.encoding.encode(s)
    }

    /// The bytes of an integer value alone, in the width `code` takes.
    #[must_use]
    pub fn value_int(&self, code: i32, v: i64) -> Vec<u8> {
        match self.format {
            Format::Ascii => format!("{v:>6}").into_bytes(),
            Format::Binary { .. } => match kind_of(code) {
                Kind::Int8 => vec![v as u8],
                Kind::Int16 => (v as i16).to_le_bytes().to_vec(),
                Kind::Int32 => (v as i32).to_le_bytes().to_vec(),
                _ => v.to_le_bytes().to_vec(),
            },
        }
    }

    /// Takes the bytes built so far.
    pub fn take(&mut self) -> Vec<u8> {
        std::mem::take(&mut self.buf)
    }

    /// True when nothing has been built since the last [`Encoder::take`].
    #[must_use]
    pub fn is_empty(&self) -> bool {
        self.buf.is_empty()
    }
}

/// Shortest text that reads back as exactly `v`, always with a decimal point.
#[must_use]
pub fn format_real(v: f64) -> String {
    if v == 0.0 || !v.is_finite() {
        return "0.0".into();
    }
    let s = format!("{v}");
    if s.contains('.') || s.contains('e') { s } else { format!("{s}.0") }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::dxf::Pairs;

    #[test]
    fn ascii_pairs_read_back() {
        let mut e = Encoder::new(Format::Ascii, TextEncoding::Utf8, "\r\n");
        e.text(0, "LINE").real(10, 0.1 + 0.2).int(70, 5).handle(5, 0x2AF);
        let bytes = e.take();
        let mut p = Pairs::new(&bytes).unwrap();
        assert!(p.next_pair().unwrap().unwrap().is("LINE"));
        assert_eq!(p.next_pair().unwrap().unwrap().f64(), Some(0.1 + 0.2));
        assert_eq!(p.next_pair().unwrap().unwrap().i64(), Some(5));
        assert_eq!(p.next_pair().unwrap().unwrap().handle(), Some(0x2AF));
    }

    #[test]
    fn binary_pairs_read_back() {
        for wide in [true, false] {
            let mut e = Encoder::new(Format::Binary { wide_codes: wide }, TextEncoding::Utf8, "\n");
            e.text(0, "SECTION").real(10, -2.5).int(70, 300).int(290, 1).text(1000, "x");
            let mut bytes = crate::dxf::BINARY_SENTINEL.to_vec();
            bytes.extend(e.take());
            let mut p = Pairs::new(&bytes).unwrap();
            assert_eq!(p.format(), Format::Binary { wide_codes: wide });
            assert!(p.next_pair().unwrap().unwrap().is("SECTION"));
            assert_eq!(p.next_pair().unwrap().unwrap().f64(), Some(-2.5));
            assert_eq!(p.next_pair().unwrap().unwrap().i64(), Some(300));
            assert_eq!(p.next_pair().unwrap().unwrap().i64(), Some(1));
            let x = p.next_pair().unwrap().unwrap();
            assert_eq!((x.code, x.raw), (1000, &b"x"[..]));
        }
    }

    #[test]
    fn reals_keep_a_decimal_point() {
        assert_eq!(format_real(12.0), "12.0");
        assert_eq!(format_real(-0.0), "0.0");
        assert_eq!(format_real(1.5e-7), "0.00000015");
    }
}
