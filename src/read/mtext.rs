//! Plain text out of DXF text strings: MTEXT inline formatting and TEXT
//! control codes.
//!
//! Both functions take untrusted text and never fail: a code they do not
//! know, or one cut short, is kept as written, so that what the user wrote
//! still shows up in a message.
//!
//! Sources, beside each rule below:
//! * MTEXT format codes: Autodesk AutoCAD help, "Format Multiline Text in an
//!   Alternate Text Editor" (read): `\O…\o`, `\L…\l`, `\K…\k`, `\~`, `\\`,
//!   `\{…\}`, `\Cvalue;`, `\Ffile;`, `\fname;`, `\Hvalue;` / `\Hvaluex;`,
//!   `\S…^…;` (stacks at `/`, `#` or `^`), `\Tvalue;`, `\Qangle;`,
//!   `\Wvalue;`, `\Avalue;`, `\P`.
//! * `\cvalue;` (true colour), `\p…;` (paragraph properties), `\N` (column
//!   break) and `\X` (dimension-line break): from memory; the table above
//!   does not list them.
//! * Caret-encoded characters in MTEXT (`^J` line break, `^I` tab, `^M`
//!   ignored, `^ ` a caret): ezdxf documentation, "MTEXT Internals" (read).
//! * TEXT control codes `%%nnn`, `%%o`, `%%u`, `%%d`, `%%p`, `%%c`, `%%%`:
//!   Autodesk AutoCAD help, "Control Codes and Special Characters" (read);
//!   the Unicode equivalents `\U+00B0`, `\U+00B1`, `\U+2205` for the degree,
//!   plus/minus and diameter symbols: Autodesk .NET developer's guide, "Use
//!   Unicode Characters, Control Codes, and Special Characters" (read).

/// The degree sign `%%d` stands for.
const DEGREE: char = '\u{00B0}';
/// The plus/minus sign `%%p` stands for.
const PLUS_MINUS: char = '\u{00B1}';
/// The diameter symbol `%%c` stands for: U+2205, the code point Autodesk
/// names for it (`\U+2205`), so that both spellings read the same.
const DIAMETER: char = '\u{2205}';

/// Strips MTEXT inline formatting, leaving the text a reader sees.
///
/// * `\P` (paragraph), `\N` (column break), `\X` (dimension-line break) and
///   `^J` become `'\n'`; callers that want one line may replace or trim it.
/// * `\~` (non-breaking space) becomes a plain space; `^I` a tab; `^M` is
///   dropped; `^` followed by a space is a caret.
/// * `{` and `}` (grouping) are dropped; `\\`, `\{`, `\}` are the characters
///   themselves.
/// * `\f`, `\F`, `\H`, `\W`, `\Q`, `\T`, `\C`, `\c`, `\A`, `\p` are dropped
///   with their argument up to and including its `;`. Without a `;` only the
///   backslash and the letter are dropped and the argument stays as text
///   (our own choice: malformed input stays visible).
/// * `\L \l \O \o \K \k` (underline, overline, strike-through) are dropped.
/// * `\Sa^b;`, `\Sa/b;`, `\Sa#b;` (stacked text) become `a/b`; a space is put
///   before it when it follows a digit, so `1\S1/2;` reads `1 1/2`.
/// * `\U+XXXX` becomes that character (a surrogate pair written as two
///   escapes becomes one character; a lone surrogate becomes U+FFFD). A
///   small `\u+XXXX` is read the same way, as the DXF decoder reads it.
///   Escapes the decoder already resolved are plain characters here.
/// * `%%d`, `%%p`, `%%c` (in any case) become °, ±, ∅ as in TEXT; the other
///   TEXT control codes are kept as written.
/// * Any other `\X` is kept as `X`; a `\` at the very end is kept.
#[must_use]
pub fn plain_mtext(raw: &str) -> String {
    let mut out = String::with_capacity(raw.len());
    let mut cur = Cursor::new(raw);
    while let Some(c) = cur.next() {
        match c {
            '{' | '}' => {}
            '\\' => mtext_escape(&mut cur, &mut out),
            '^' => caret(&mut cur, &mut out),
            '%' if cur.rest.starts_with('%') => percent(&mut cur, &mut out, Codes::Mtext),
            _ => out.push(c),
        }
    }
    out
}

/// Decodes the control codes of a TEXT (or ATTRIB) string.
///
/// * `%%d` → °, `%%p` → ±, `%%c` → ∅ (U+2205), `%%%` → `%`, in any case
///   (`%%D` too).
/// * `%%u`, `%%o` (underscore and overscore toggles) are dropped.
/// * `%%nnn`, exactly three decimal digits, is character number nnn
///   (taken as a Unicode code point, which is Latin-1 below 256).
/// * `\U+XXXX` becomes that character, as in [`plain_mtext`].
/// * Anything else, such as `%%x` or a lone `\`, is kept as written.
#[must_use]
pub fn plain_text(raw: &str) -> String {
    let mut out = String::with_capacity(raw.len());
    let mut cur = Cursor::new(raw);
    while let Some(c) = cur.next() {
        match c {
            '%' if cur.rest.starts_with('%') => percent(&mut cur, &mut out, Codes::Text),
            '\\' => match cur.rest.strip_prefix(['U', 'u']).and_then(unicode_escape) {
                Some((ch, rest)) => {
                    out.push(ch);
                    cur.rest = rest;
                }
                None => out.push('\\'),
            },
            _ => out.push(c),
        }
    }
    out
}

/// A read position in a string; it only ever moves forward by whole
/// characters, so it cannot split one.
struct Cursor<'a> {
    rest: &'a str,
}

impl<'a> Cursor<'a> {
    fn new(s: &'a str) -> Self {
        Cursor { rest: s }
    }

    fn next(&mut self) -> Option<char> {
        let mut chars = self.rest.chars();
        let c = chars.next()?;
        self.rest = chars.as_str();
        Some(c)
    }

    /// The text up to the next `;`, consuming both; `None` (and nothing
    /// consumed) when there is no `;`.
    fn take_argument(&mut self) -> Option<&'a str> {
        let (arg, rest) = self.rest.split_once(';')?;
        self.rest = rest;
        Some(arg)
    }
}

/// After a `\` in MTEXT.
fn mtext_escape(cur: &mut Cursor<'_>, out: &mut String) {
    let Some(code) = cur.next() else {
        out.push('\\');
        return;
    };
    match code {
        'P' | 'N' | 'X' => out.push('\n'),
        '~' => out.push(' '),
        '\\' | '{' | '}' => out.push(code),
        'L' | 'l' | 'O' | 'o' | 'K' | 'k' => {}
        'f' | 'F' | 'H' | 'W' | 'Q' | 'T' | 'C' | 'c' | 'A' | 'p' => {
            // Without its `;` the argument stays in the text (see the doc).
            let _ = cur.take_argument();
        }
        'S' => stack(cur, out),
        'U' | 'u' => match unicode_escape(cur.rest) {
            Some((ch, rest)) => {
                out.push(ch);
                cur.rest = rest;
            }
            None => out.push(code),
        },
        other => out.push(other),
    }
}

/// After `\S`: stacked text up to an unescaped `;` (or the end), written
/// with a `/` at the first of `^`, `/`, `#`.
fn stack(cur: &mut Cursor<'_>, out: &mut String) {
    if out.chars().next_back().is_some_and(|c| c.is_ascii_digit()) {
        out.push(' ');
    }
    let mut divided = false;
    while let Some(c) = cur.next() {
        match c {
            ';' => break,
            '\\' => {
                if let Some(escaped) = cur.next() {
                    out.push(escaped);
                }
            }
            '^' | '/' | '#' if !divided => {
                divided = true;
                out.push('/');
            }
            _ => out.push(c),
        }
    }
}

/// After a `^` in MTEXT.
fn caret(cur: &mut Cursor<'_>, out: &mut String) {
    let replacement = match cur.rest.chars().next() {
        Some('J') => Some("\n"),
        Some('I') => Some("\t"),
        Some('M') => Some(""),
        Some(' ') => Some("^"),
        _ => None,
    };
    match replacement {
        Some(s) => {
            out.push_str(s);
            let _ = cur.next();
        }
        None => out.push('^'),
    }
}

/// Which `%%` codes apply.
#[derive(Clone, Copy, PartialEq, Eq)]
enum Codes {
    /// TEXT: all of them.
    Text,
    /// MTEXT: the three symbols only.
    Mtext,
}

/// At `%%…`, the cursor just past the first `%`.
fn percent(cur: &mut Cursor<'_>, out: &mut String, codes: Codes) {
    // `cur.rest` starts with the second '%'.
    let after = cur.rest.get(1..).unwrap_or("");
    let mut chars = after.chars();
    let code = chars.next();
    let symbol = match code.map(|c| c.to_ascii_lowercase()) {
        Some('d') => Some(Some(DEGREE)),
        Some('p') => Some(Some(PLUS_MINUS)),
        Some('c') => Some(Some(DIAMETER)),
        Some('u' | 'o') if codes == Codes::Text => Some(None),
        Some('%') if codes == Codes::Text => Some(Some('%')),
        _ => None,
    };
    if let Some(symbol) = symbol {
        out.extend(symbol);
        cur.rest = chars.as_str();
        return;
    }
    if codes == Codes::Text {
        if let Some((ch, rest)) = char_number(after) {
            out.push(ch);
            cur.rest = rest;
            return;
        }
    }
    // Not a code: keep the first '%'; the second is read as ordinary text.
    out.push('%');
}

/// `nnn` (exactly three ASCII digits) at the start of `s`, as a character.
fn char_number(s: &str) -> Option<(char, &str)> {
    let digits = s.get(..3)?;
    if !digits.bytes().all(|b| b.is_ascii_digit()) {
        return None;
    }
    let n: u32 = digits.parse().ok()?;
    Some((char::from_u32(n)?, s.get(3..)?))
}

/// `+XXXX` (four hex digits) at the start of `s`, the text just after
/// `\U`: the character and the rest. A high surrogate followed by
/// `\U+XXXX` with a low surrogate makes one character; any other surrogate
/// is U+FFFD.
fn unicode_escape(s: &str) -> Option<(char, &str)> {
    let (high, rest) = hex4(s.strip_prefix('+')?)?;
    if (0xD800..0xDC00).contains(&high) {
        if let Some((low, after)) = rest
            .strip_prefix('\\')
            .and_then(|r| r.strip_prefix(['U', 'u']))
            .and_then(|r| r.strip_prefix('+'))
            .and_then(hex4)
        {
            if (0xDC00..0xE000).contains(&low) {
                let code = 0x10000 + ((high - 0xD800) << 10) + (low - 0xDC00);
                return Some((char::from_u32(code).unwrap_or('\u{FFFD}'), after));
            }
        }
    }
    Some((char::from_u32(high).unwrap_or('\u{FFFD}'), rest))
}

/// Four hex digits at the start of `s`, and the rest.
fn hex4(s: &str) -> Option<(u32, &str)> {
    let hex = s.get(..4)?;
    if !hex.bytes().all(|b| b.is_ascii_hexdigit()) {
        return None;
    }
    Some((u32::from_str_radix(hex, 16).ok()?, s.get(4..)?))
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    // Codes from the Autodesk AutoCAD help, "Format Multiline Text in an
    // Alternate Text Editor" (read); test strings are our own.

    #[test]
    fn paragraph_is_a_line_break() {
        assert_eq!(plain_mtext(r"P1\P85 kN"), "P1\n85 kN");
    }

    #[test]
    fn non_breaking_space_is_a_space() {
        assert_eq!(plain_mtext(r"85\~kN"), "85 kN");
    }

    #[test]
    fn braces_group_and_escaped_braces_stay() {
        assert_eq!(plain_mtext(r"{85} {kN}"), "85 kN");
        assert_eq!(plain_mtext(r"\{a\}"), "{a}");
        assert_eq!(plain_mtext(r"a\\b"), r"a\b");
    }

    #[test]
    fn font_codes_are_dropped_with_their_argument() {
        assert_eq!(plain_mtext(r"\fArial|b1|i0|c0|p34;85 kN"), "85 kN");
        assert_eq!(plain_mtext(r"\Fromans.shx;85 kN"), "85 kN");
    }

    #[test]
    fn size_and_shape_codes_are_dropped() {
        assert_eq!(plain_mtext(r"\H2.5;85 \H0.7x;kN"), "85 kN");
        assert_eq!(plain_mtext(r"\W1.2;8\Q15;5\T1.1; kN"), "85 kN");
    }

    #[test]
    fn colour_and_alignment_codes_are_dropped() {
        assert_eq!(plain_mtext(r"\C1;85 \c16711680;kN"), "85 kN");
        assert_eq!(plain_mtext(r"\A1;85 kN"), "85 kN");
        // \p (paragraph properties): from memory.
        assert_eq!(plain_mtext(r"\pxqc,i0.5;85 kN"), "85 kN");
    }

    #[test]
    fn line_toggles_are_dropped() {
        assert_eq!(plain_mtext(r"\L85\l \Ok\oN\K\k"), "85 kN");
    }

    #[test]
    fn stacking_reads_as_a_fraction() {
        assert_eq!(plain_mtext(r"\S3^4;"), "3/4");
        assert_eq!(plain_mtext(r"\S3/4;"), "3/4");
        assert_eq!(plain_mtext(r"\S3#4; in"), "3/4 in");
        assert_eq!(plain_mtext(r"1\S1/2;"), "1 1/2");
        assert_eq!(plain_mtext(r"\S+0.5^-0.5"), "+0.5/-0.5");
    }

    #[test]
    fn unicode_escapes_become_characters() {
        assert_eq!(plain_mtext(r"30\U+00B0"), "30°");
        assert_eq!(plain_mtext(r"\U+D83D\U+DE00"), "\u{1F600}");
        assert_eq!(plain_mtext(r"\U+D83Dx"), "\u{FFFD}x");
        assert_eq!(plain_mtext(r"\U+00G0"), "U+00G0");
        assert_eq!(plain_mtext(r"\u+00b0\U+D83D\u+de00"), "°\u{1F600}");
    }

    #[test]
    fn column_and_dimension_breaks_are_line_breaks() {
        // \N and \X: from memory.
        assert_eq!(plain_mtext(r"a\Nb\Xc"), "a\nb\nc");
    }

    #[test]
    fn caret_codes() {
        // ezdxf documentation, "MTEXT Internals" (read).
        assert_eq!(plain_mtext("a^Jb^Ic^Md^ e"), "a\nb\tcd^e");
        assert_eq!(plain_mtext("m^2"), "m^2");
    }

    #[test]
    fn unknown_codes_keep_their_letter_and_cut_codes_stay_visible() {
        assert_eq!(plain_mtext(r"\Z85"), "Z85");
        assert_eq!(plain_mtext("85 kN\\"), "85 kN\\");
        assert_eq!(plain_mtext(r"\H2.5 85 kN"), "2.5 85 kN");
    }

    #[test]
    fn symbol_codes_work_in_mtext_too() {
        assert_eq!(plain_mtext("45%%D"), "45°");
        assert_eq!(plain_mtext("%%u5"), "%%u5");
    }

    // TEXT codes: Autodesk AutoCAD help, "Control Codes and Special
    // Characters" (read).

    #[test]
    fn text_symbols() {
        assert_eq!(plain_text("30%%d"), "30°");
        assert_eq!(plain_text("%%p0.5"), "±0.5");
        assert_eq!(plain_text("%%C20"), "\u{2205}20");
        assert_eq!(plain_text("100%%%"), "100%");
    }

    #[test]
    fn text_toggles_are_dropped() {
        assert_eq!(plain_text("%%u85 kN%%U %%oP1%%o"), "85 kN P1");
    }

    #[test]
    fn text_character_numbers() {
        assert_eq!(plain_text("%%065%%177"), "A±");
        assert_eq!(plain_text("%%65"), "%%65");
    }

    #[test]
    fn text_unicode_and_unknown_codes() {
        assert_eq!(plain_text(r"5\U+00B0"), "5°");
        assert_eq!(plain_text(r"5\u+00b0"), "5°");
        assert_eq!(plain_text(r"\+0041"), r"\+0041");
        assert_eq!(plain_text(r"a\b"), r"a\b");
        assert_eq!(plain_text("%%x 50%"), "%%x 50%");
        assert_eq!(plain_text("%%"), "%%");
        assert_eq!(plain_text("%"), "%");
    }

    proptest! {
        #[test]
        fn never_panics(s in "\\PC*") {
            let _ = plain_mtext(&s);
            let _ = plain_text(&s);
        }

        #[test]
        fn never_panics_on_code_soup(s in "[\\\\{}^;%PpSUu+0-9A-Fa-fHLlkK/#~ ]{0,40}") {
            let _ = plain_mtext(&s);
            let _ = plain_text(&s);
        }

        #[test]
        fn plain_words_pass_through(s in "[A-Za-z0-9 .=:]{0,40}") {
            prop_assert_eq!(plain_mtext(&s), s.clone());
            prop_assert_eq!(plain_text(&s), s);
        }
    }
}
