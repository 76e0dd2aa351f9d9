//! Text values: the drawing's encoding, and `\U+XXXX` escapes.
//!
//! From the DXF reference: before R2007 (AC1021) strings are in the code page
//! named by `$DWGCODEPAGE`, with characters outside it written as `\U+XXXX`;
//! from R2007 on they are UTF-8.

use std::borrow::Cow;

use encoding_rs::Encoding;

/// How the drawing's strings are stored.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum TextEncoding {
    /// UTF-8 (R2007 and later).
    Utf8,
    /// A legacy single- or double-byte code page (before R2007).
    Legacy(&'static Encoding),
}

impl TextEncoding {
    /// The encoding of a `$DWGCODEPAGE` name such as `ANSI_1252`, or `None`
    /// when the name is unknown.
    #[must_use]
    pub fn from_codepage(name: &str) -> Option<TextEncoding> {
        let n = name.trim().to_ascii_uppercase();
        let label = match n.as_str() {
            "ANSI_874" => "windows-874",
            "ANSI_932" | "DOS932" => "shift_jis",
            "ANSI_936" => "gbk",
            "ANSI_949" => "euc-kr",
            "ANSI_950" => "big5",
            "ANSI_1250" => "windows-1250",
            "ANSI_1251" => "windows-1251",
            "ANSI_1252" | "ISO8859-1" | "ANSI" => "windows-1252",
            "ANSI_1253" => "windows-1253",
            "ANSI_1254" => "windows-1254",
            "ANSI_1255" => "windows-1255",
            "ANSI_1256" => "windows-1256",
            "ANSI_1257" => "windows-1257",
            "ANSI_1258" => "windows-1258",
            "DOS866" => "ibm866",
            "UTF8" | "UTF-8" => return Some(TextEncoding::Utf8),
            _ => return None,
        };
        Encoding::for_label(label.as_bytes()).map(TextEncoding::Legacy)
    }

    /// The default legacy encoding when `$DWGCODEPAGE` is missing or unknown.
    #[must_use]
    pub fn fallback() -> TextEncoding {
        TextEncoding::Legacy(encoding_rs::WINDOWS_1252)
    }

    /// Decodes a stored string and resolves `\U+XXXX` escapes.
    #[must_use]
    pub fn decode<'a>(&self, raw: &'a [u8]) -> Cow<'a, str> {
        let text: Cow<'a, str> = if raw.is_ascii() {
            // ASCII is ASCII in every code page we accept; no copy.
            Cow::Borrowed(std::str::from_utf8(raw).unwrap_or_default())
        } else {
            match self {
                TextEncoding::Utf8 => String::from_utf8_lossy(raw),
                TextEncoding::Legacy(enc) => enc.decode_without_bom_handling(raw).0,
            }
        };
        if text.contains("\\U+") || text.contains("\\u+") { Cow::Owned(unescape_unicode(&text)) } else { text }
    }

    /// Encodes a string for the file: UTF-8 as is; for a legacy code page,
    /// every non-ASCII character as a `\U+XXXX` escape (valid in any code
    /// page, and what the DXF reference prescribes for characters outside it).
    #[must_use]
    pub fn encode(&self, s: &str) -> Vec<u8> {
        match self {
            TextEncoding::Utf8 => s.as_bytes().to_vec(),
            TextEncoding::Legacy(_) => {
                let mut out = String::with_capacity(s.len());
                for c in s.chars() {
                    if c.is_ascii() {
                        out.push(c);
                    } else {
                        let mut buf = [0u16; 2];
                        for unit in c.encode_utf16(&mut buf) {
                            out.push_str(&format!("\\U+{unit:04X}"));
                        }
                    }
                }
                out.into_bytes()
            }
        }
    }
}

/// Replaces `\U+XXXX` escapes by their characters (surrogate pairs joined).
#[must_use]
pub fn unescape_unicode(s: &str) -> String {
    let mut units: Vec<u16> = Vec::with_capacity(s.len());
    let b = s.as_bytes();
    let mut i = 0;
    let mut out = String::with_capacity(s.len());
    let flush = |units: &mut Vec<u16>, out: &mut String| {
        out.extend(char::decode_utf16(units.drain(..)).map(|r| r.unwrap_or('\u{FFFD}')));
    };
    while i < b.len() {
        if b[i] == b'\\'
            && i + 7 <= b.len()
            && (b[i + 1] == b'U' || b[i + 1] == b'u')
            && b[i + 2] == b'+'
            && let Some(v) = std::str::from_utf8(&b[i + 3..i + 7]).ok().and_then(|h| u16::from_str_radix(h, 16).ok())
        {
            units.push(v);
            i += 7;
            continue;
        }
        flush(&mut units, &mut out);
        // Copy one whole UTF-8 character.
        let len = utf8_len(b[i]);
        out.push_str(s.get(i..i + len).unwrap_or("\u{FFFD}"));
        i += len.max(1);
    }
    flush(&mut units, &mut out);
    out
}

fn utf8_len(first: u8) -> usize {
    match first {
        0x00..=0x7F => 1,
        0xC0..=0xDF => 2,
        0xE0..=0xEF => 3,
        _ => 4,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn legacy_code_page_decodes() {
        let e = TextEncoding::from_codepage("ANSI_1252").unwrap();
        assert_eq!(e.decode(b"Br\xfccke"), "Brücke");
        let cyr = TextEncoding::from_codepage("ansi_1251").unwrap();
        assert_eq!(cyr.decode(b"\xcc\xee\xf1\xf2"), "Мост");
    }

    #[test]
    fn unicode_escapes_resolve() {
        assert_eq!(TextEncoding::Utf8.decode(br"Br\U+00FCcke \U+00D8 12"), "Brücke Ø 12");
        // A character outside the BMP as a surrogate pair.
        assert_eq!(unescape_unicode(r"\U+D83D\U+DE00"), "😀");
        assert_eq!(unescape_unicode(r"\U+12"), r"\U+12");
    }

    #[test]
    fn encode_escapes_before_r2007() {
        let e = TextEncoding::fallback();
        assert_eq!(e.encode("Ø 12 kN"), br"\U+00D8 12 kN".to_vec());
        assert_eq!(TextEncoding::Utf8.encode("Ø"), "Ø".as_bytes().to_vec());
    }
}
