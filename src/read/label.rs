//! Reading a load's magnitude from its label, and quantities from the
//! command line.
//!
//! # The grammar (our own convention)
//!
//! A load label, after [`super::mtext`] has made it plain text, is
//!
//! ```text
//! [NAME ("=" | ":")] NUMBER [UNIT] ["."]
//! ```
//!
//! with any whitespace around the parts and nothing else:
//!
//! * `NAME` is a letter followed by letters, digits or `_` (`P`, `P1`,
//!   `W_left`, `P₁`); it is only a name and is not kept.
//! * `NUMBER` is an optional `+`, digits with an optional `.` and fraction
//!   (`85`, `12.5`, `.5`, `85.`), and an optional exponent (`1.2e3`). A
//!   decimal comma, thousands separators, fractions and formulas are
//!   refused with a message saying what to write instead.
//! * `UNIT` is a force unit as [`ForceUnit`]'s `FromStr` reads it (`N`,
//!   `kN`/`KN`, `MN`, `lbf`/`lb`/`lbs`, `kip`/`kips`). Without a unit the
//!   value is in the drawing's force unit, which the caller decides.
//! * A single `.` may end the label (`85 kN.`).
//!
//! Anything after the unit (`85 kN (service)`) is refused rather than
//! ignored: a note beside a number may change what it means, so the user is
//! asked to move it to a separate text.
//!
//! A label is a magnitude: negative and zero values are refused, and so is
//! anything not below [`LIMIT`] (1e12). The command-line forms
//! ([`parse_quantity_force`], [`parse_quantity_length`]) take the same
//! `NUMBER [UNIT] ["."]` without a name, also accept `-` (and U+2212 `−`),
//! and leave the range to the caller.

use std::fmt;
use std::str::FromStr;

use thiserror::Error;

use crate::model::LIMIT;
use crate::units::{ForceUnit, LengthUnit};

/// A load magnitude as its label gives it.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LabelForce {
    /// The magnitude as written (> 0, below [`LIMIT`]), in `unit`.
    pub value: f64,
    /// The unit written on the label, `None` when it has none.
    pub unit: Option<ForceUnit>,
}

impl LabelForce {
    /// The magnitude in `to`, reading a label without a unit as being in
    /// `default`.
    #[must_use]
    pub fn value_in(&self, to: ForceUnit, default: ForceUnit) -> f64 {
        self.value * self.unit.unwrap_or(default).factor_to(to)
    }
}

/// What kind of quantity a text was read as; it picks the units and the
/// example in messages.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum QuantityKind {
    /// A force (a load label, or a force on the command line).
    Force,
    /// A length (on the command line).
    Length,
    /// A force per length (a distributed load's label).
    Intensity,
}

impl QuantityKind {
    /// An example of a well-written value, for messages.
    #[must_use]
    pub fn example(self) -> &'static str {
        match self {
            QuantityKind::Force => "85 kN",
            QuantityKind::Length => "6 m",
            QuantityKind::Intensity => "12 kN/m",
        }
    }

    /// The accepted unit spellings, for messages.
    #[must_use]
    pub fn accepted_units(self) -> String {
        match self {
            QuantityKind::Force => {
                let symbols: Vec<&str> = ForceUnit::ALL.iter().map(|u| u.symbol()).collect();
                format!("{} (also KN, lb, lbs, kips)", symbols.join(", "))
            }
            QuantityKind::Length => {
                let symbols: Vec<&str> = LengthUnit::ALL.iter().map(|u| u.symbol()).collect();
                symbols.join(", ")
            }
            QuantityKind::Intensity => {
                "a force unit per length unit, such as kN/m, N/mm, kip/ft, lbf/in, or plf, klf".into()
            }
        }
    }
}

impl fmt::Display for QuantityKind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            QuantityKind::Force => "force",
            QuantityKind::Length => "length",
            QuantityKind::Intensity => "force-per-length",
        })
    }
}

/// Why a label or value could not be read. Each message is one line: what
/// is wrong, then what to write instead. `text` is the input, trimmed.
#[derive(Clone, Debug, Error, PartialEq)]
pub enum LabelError {
    /// Nothing but whitespace.
    #[error("the text is empty: write a number and its unit, such as '{}'", .kind.example())]
    Empty {
        /// What was being read.
        kind: QuantityKind,
    },
    /// No number where one was expected.
    #[error("'{text}' is not a number: write a number and its unit, such as '{}'", .kind.example())]
    NotANumber {
        /// The text.
        text: String,
        /// What was being read.
        kind: QuantityKind,
    },
    /// A negative load.
    #[error("'{text}' is negative: a load label is a magnitude; the direction comes from the line: write {magnitude}")]
    Negative {
        /// The text.
        text: String,
        /// The same label without its minus sign.
        magnitude: String,
    },
    /// A zero load.
    #[error("'{text}' is zero: a load must be a positive force; write its magnitude, or delete the load line")]
    Zero {
        /// The text.
        text: String,
    },
    /// A unit that is not one of ours.
    #[error("'{unit}' in '{text}' is not a {kind} unit: use one of {}", .kind.accepted_units())]
    UnknownUnit {
        /// The text.
        text: String,
        /// The unit as written.
        unit: String,
        /// What was being read.
        kind: QuantityKind,
    },
    /// A comma inside the number.
    #[error("'{text}' has a comma in its number: write {instead} (a point before decimals, no thousands separators)")]
    CommaDecimal {
        /// The text.
        text: String,
        /// What to write instead, e.g. `12.5`, or `1.250 or 1250`.
        instead: String,
    },
    /// More than one number.
    #[error(
        "'{text}' holds more than one number: write one number (no spaces or separators inside it) and its unit, such as '{}'; give a sum as its total",
        .kind.example()
    )]
    SeveralNumbers {
        /// The text.
        text: String,
        /// What was being read.
        kind: QuantityKind,
    },
    /// Words after the unit.
    #[error(
        "'{text}' has '{rest}' after its number and unit: write only the number and unit, such as '{}', and put notes in a separate text",
        .kind.example()
    )]
    TrailingText {
        /// The text.
        text: String,
        /// What follows the unit.
        rest: String,
        /// What was being read.
        kind: QuantityKind,
    },
    /// Not finite, or not below [`LIMIT`].
    #[error("'{text}' is too large: values must be below 1e12; check the number and its unit")]
    TooLarge {
        /// The text.
        text: String,
    },
}

/// Reads a load label: `85 kN`, `P1 = 40kN`, `W: 12.5 kN`, `3.5 kips`,
/// `85` (no unit). See the [module documentation](self) for the grammar.
pub fn parse_force(text: &str) -> Result<LabelForce, LabelError> {
    let t = text.trim();
    let q = scan::<ForceUnit>(t, QuantityKind::Force, true)?;
    if q.value == 0.0 {
        return Err(LabelError::Zero { text: t.to_string() });
    }
    if q.value < 0.0 {
        let unit = q.unit.map(|u| format!(" {}", q.unit_text.unwrap_or(u.symbol()))).unwrap_or_default();
        return Err(LabelError::Negative {
            text: t.to_string(),
            magnitude: format!("{}{unit}", q.number.trim_start_matches(['-', '\u{2212}'])),
        });
    }
    Ok(LabelForce { value: q.value, unit: q.unit })
}

/// A distributed load's intensity as its label gives it: per unit of
/// horizontal length, `w0` at the stretch's left end and `w1` at its right
/// end (equal for a uniform load).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LabelIntensity {
    /// Intensity at the left end, as written (≥ 0).
    pub w0: f64,
    /// Intensity at the right end, as written (≥ 0; not both zero).
    pub w1: f64,
    /// The force unit written.
    pub force: ForceUnit,
    /// The length unit written.
    pub length: LengthUnit,
}

impl LabelIntensity {
    /// The intensities in `force` per `length`.
    #[must_use]
    pub fn in_units(&self, force: ForceUnit, length: LengthUnit) -> (f64, f64) {
        // w [F/L] = w · (F→force) / (L→length)
        let k = self.force.factor_to(force) / self.length.factor_to(length);
        (self.w0 * k, self.w1 * k)
    }
}

/// The separators of a range of two intensities (`8..12`, `8 - 12`,
/// `8 to 12`, `8–12`, `8…12`), longest first.
const RANGE: [&str; 3] = ["to", "-", "~"];

/// Reads a distributed load's label: `12 kN/m`, `w = 12kN/m`,
/// `0.8 kip/ft`, `8..12 kN/m` or `8 - 12 kN/m` (linearly varying, left end
/// first), `500 plf`, `1.2 klf`. A unit per length is required.
pub fn parse_intensity(text: &str) -> Result<LabelIntensity, LabelError> {
    let t = text.trim();
    let kind = QuantityKind::Intensity;
    if t.is_empty() {
        return Err(LabelError::Empty { kind });
    }
    // "8..12" would read as "8." then ".12": make every range separator a word.
    let spaced = t.replace("..", " to ").replace(['\u{2026}', '\u{2013}'], " to ");
    let body = strip_name(&spaced);
    let not_a_number = || LabelError::NotANumber { text: t.to_string(), kind };
    let number = |s: &str| -> Result<(f64, String), LabelError> {
        let (n, rest) = split_number(s).ok_or_else(not_a_number)?;
        if let Some(instead) = comma_instead(n, rest) {
            return Err(LabelError::CommaDecimal { text: t.to_string(), instead });
        }
        let v: f64 = n.trim_start_matches('+').parse().map_err(|_| not_a_number())?;
        if !v.is_finite() || v.abs() >= LIMIT {
            return Err(LabelError::TooLarge { text: t.to_string() });
        }
        if v < 0.0 {
            return Err(LabelError::Negative { text: t.to_string(), magnitude: t.replacen('-', "", 1) });
        }
        Ok((v, rest.trim_start().to_string()))
    };
    let (w0, rest) = number(body)?;
    let (w1, rest) = match RANGE.iter().find_map(|sep| rest.strip_prefix(sep)) {
        Some(after) if split_number(after.trim_start()).is_some() => number(after.trim_start())?,
        _ => (w0, rest),
    };
    if w0 + w1 == 0.0 {
        return Err(LabelError::Zero { text: t.to_string() });
    }
    let rest = rest.trim();
    let rest = rest.strip_suffix('.').map_or(rest, str::trim_end);
    if rest.chars().any(|c| c.is_ascii_digit()) {
        return Err(LabelError::SeveralNumbers { text: t.to_string(), kind });
    }
    let (unit_text, after) = rest.split_once(char::is_whitespace).unwrap_or((rest, ""));
    if !after.trim().is_empty() {
        return Err(LabelError::TrailingText { text: t.to_string(), rest: after.trim().to_string(), kind });
    }
    let unknown = || LabelError::UnknownUnit { text: t.to_string(), unit: unit_text.to_string(), kind };
    if unit_text.is_empty() {
        return Err(unknown());
    }
    let (force, length) = match unit_text.to_ascii_lowercase().as_str() {
        "plf" => (ForceUnit::PoundForce, LengthUnit::Foot),
        "klf" => (ForceUnit::Kip, LengthUnit::Foot),
        _ => {
            let (f, l) = unit_text.split_once('/').ok_or_else(unknown)?;
            (
                f.trim().parse::<ForceUnit>().map_err(|_| unknown())?,
                l.trim().parse::<LengthUnit>().map_err(|_| unknown())?,
            )
        }
    };
    Ok(LabelIntensity { w0, w1, force, length })
}

/// What a label says: a force (a point load's) or a force per length (a
/// distributed load's).
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum LabelValue {
    /// A force, such as `85 kN`.
    Force(LabelForce),
    /// A force per length, such as `12 kN/m`.
    Intensity(LabelIntensity),
}

/// Reads a label as a force or, failing that, as a force per length; the
/// error is the one of the kind the text looks like (a `/` or `plf`/`klf`:
/// per length).
pub fn parse_label(text: &str) -> Result<LabelValue, LabelError> {
    match parse_force(text) {
        Ok(f) => Ok(LabelValue::Force(f)),
        Err(force_error) => match parse_intensity(text) {
            Ok(w) => Ok(LabelValue::Intensity(w)),
            Err(intensity_error) => {
                let lower = text.to_ascii_lowercase();
                if text.contains('/') || lower.contains("plf") || lower.contains("klf") || text.contains("..") {
                    Err(intensity_error)
                } else {
                    Err(force_error)
                }
            }
        },
    }
}

/// Reads a force given on the command line: `450 kN`, `450kN`, `450`.
///
/// The value is signed and may be zero; the caller checks its range. The
/// unit is `None` when none is written.
pub fn parse_quantity_force(text: &str) -> Result<(f64, Option<ForceUnit>), LabelError> {
    let q = scan::<ForceUnit>(text.trim(), QuantityKind::Force, false)?;
    Ok((q.value, q.unit))
}

/// Reads a length given on the command line: `6 m`, `6000mm`, `20 ft`, `6`.
///
/// The value is signed and may be zero; the caller checks its range. The
/// unit is `None` when none is written.
pub fn parse_quantity_length(text: &str) -> Result<(f64, Option<LengthUnit>), LabelError> {
    let q = scan::<LengthUnit>(text.trim(), QuantityKind::Length, false)?;
    Ok((q.value, q.unit))
}

/// A number and unit read from a text.
struct Scanned<'a, U> {
    value: f64,
    /// The number as written, sign included.
    number: &'a str,
    unit: Option<U>,
    /// The unit as written.
    unit_text: Option<&'a str>,
}

/// Reads `[NAME (=|:)] NUMBER [UNIT] [.]` from trimmed text `t`; the name
/// only when `named`.
fn scan<U: FromStr>(t: &str, kind: QuantityKind, named: bool) -> Result<Scanned<'_, U>, LabelError> {
    if t.is_empty() {
        return Err(LabelError::Empty { kind });
    }
    let body = if named { strip_name(t) } else { t };
    let not_a_number = || LabelError::NotANumber { text: t.to_string(), kind };

    let (number, rest) = split_number(body).ok_or_else(not_a_number)?;
    if let Some(instead) = comma_instead(number, rest) {
        return Err(LabelError::CommaDecimal { text: t.to_string(), instead });
    }
    let unsigned = number.trim_start_matches(['+', '-', '\u{2212}']);
    let magnitude: f64 = unsigned.parse().map_err(|_| not_a_number())?;
    if !magnitude.is_finite() || magnitude >= LIMIT {
        return Err(LabelError::TooLarge { text: t.to_string() });
    }
    let value = if unsigned.len() < number.len() && !number.starts_with('+') { -magnitude } else { magnitude };

    let rest = rest.trim();
    let rest = rest.strip_suffix('.').map_or(rest, str::trim_end);
    if rest.chars().any(|c| c.is_ascii_digit()) {
        return Err(LabelError::SeveralNumbers { text: t.to_string(), kind });
    }
    if rest.is_empty() {
        return Ok(Scanned { value, number, unit: None, unit_text: None });
    }
    let (unit_text, after) = rest.split_once(char::is_whitespace).unwrap_or((rest, ""));
    let unit = unit_text.parse::<U>().map_err(|_| LabelError::UnknownUnit {
        text: t.to_string(),
        unit: unit_text.to_string(),
        kind,
    })?;
    let after = after.trim();
    if !after.is_empty() {
        return Err(LabelError::TrailingText { text: t.to_string(), rest: after.to_string(), kind });
    }
    Ok(Scanned { value, number, unit: Some(unit), unit_text: Some(unit_text) })
}

/// `t` without a leading `NAME =` or `NAME :`; `t` itself when it has none.
fn strip_name(t: &str) -> &str {
    let mut chars = t.char_indices();
    if !chars.next().is_some_and(|(_, c)| c.is_alphabetic()) {
        return t;
    }
    let end = chars.find(|&(_, c)| !(c.is_alphanumeric() || c == '_')).map_or(t.len(), |(i, _)| i);
    let after = t.get(end..).unwrap_or("").trim_start();
    match after.strip_prefix(['=', ':']) {
        Some(rest) => rest.trim_start(),
        None => t,
    }
}

/// Splits `s` into a leading number (sign, digits, fraction, exponent) and
/// the rest; `None` when it does not start with one.
fn split_number(s: &str) -> Option<(&str, &str)> {
    let b = s.as_bytes();
    let mut i = 0;
    if s.starts_with('\u{2212}') {
        i = '\u{2212}'.len_utf8();
    } else if matches!(b.first(), Some(b'+' | b'-')) {
        i = 1;
    }
    let digits = |from: usize| b.iter().skip(from).take_while(|c| c.is_ascii_digit()).count();
    let int = digits(i);
    i += int;
    let mut frac = 0;
    if b.get(i) == Some(&b'.') {
        frac = digits(i + 1);
        if int > 0 || frac > 0 {
            i += 1 + frac;
        }
    }
    if int == 0 && frac == 0 {
        return None;
    }
    if matches!(b.get(i), Some(b'e' | b'E')) {
        let sign = usize::from(matches!(b.get(i + 1), Some(b'+' | b'-')));
        let exp = digits(i + 1 + sign);
        if exp > 0 {
            i += 1 + sign + exp;
        }
    }
    // Every index above stops at an ASCII byte or the end: a char boundary.
    Some((s.get(..i)?, s.get(i..)?))
}

/// When `rest` goes on with `,digits` right after `number`: what to write
/// instead.
fn comma_instead(number: &str, rest: &str) -> Option<String> {
    if !rest.starts_with(',') || !rest.chars().nth(1).is_some_and(|c| c.is_ascii_digit()) {
        return None;
    }
    let tail_len = rest.char_indices().find(|&(_, c)| !(c.is_ascii_digit() || c == ',')).map_or(rest.len(), |(i, _)| i);
    let tail = rest.get(..tail_len).unwrap_or("");
    let groups: Vec<&str> = tail.split(',').skip(1).collect();
    let whole = format!("{number}{tail}");
    let mut options = Vec::new();
    if groups.len() == 1 && !number.contains('.') {
        options.push(whole.replace(',', "."));
    }
    if !number.contains('.') && groups.iter().all(|g| g.len() == 3) {
        options.push(whole.replace(',', ""));
    }
    if options.is_empty() {
        options.push("the number with a decimal point and no commas".to_string());
    }
    Some(options.join(" or "))
}

#[cfg(test)]
mod intensity_tests {
    use super::*;

    #[test]
    fn intensities_read_in_their_usual_forms() {
        let w = parse_intensity("w = 12 kN/m").unwrap();
        assert_eq!((w.w0, w.w1, w.force, w.length), (12.0, 12.0, ForceUnit::Kilonewton, LengthUnit::Metre));
        let w = parse_intensity("12kN/m").unwrap();
        assert_eq!((w.w0, w.w1), (12.0, 12.0));
        let w = parse_intensity("0.8 kip/ft").unwrap();
        assert_eq!((w.force, w.length), (ForceUnit::Kip, LengthUnit::Foot));
        let w = parse_intensity("8..12 kN/m").unwrap();
        assert_eq!((w.w0, w.w1), (8.0, 12.0));
        let w = parse_intensity("q: 0 - 4.5 kN/m").unwrap();
        assert_eq!((w.w0, w.w1), (0.0, 4.5));
        let w = parse_intensity("8 to 12 kN/m").unwrap();
        assert_eq!((w.w0, w.w1), (8.0, 12.0));
        let w = parse_intensity("500 plf").unwrap();
        assert_eq!((w.force, w.length), (ForceUnit::PoundForce, LengthUnit::Foot));
    }

    #[test]
    fn intensities_convert_to_the_drawing_units() {
        // 12 kN/m on a drawing in millimetres: 0.012 kN per mm.
        let w = parse_intensity("12 kN/m").unwrap();
        let (a, b) = w.in_units(ForceUnit::Kilonewton, LengthUnit::Millimetre);
        assert!((a - 0.012).abs() < 1e-15 && (b - 0.012).abs() < 1e-15);
        // 1 kip/ft = 4448.2216152605 N / 0.3048 m = 14593.9029... N/m (NIST SP 811, 2008, exact factors).
        let w = parse_intensity("1 kip/ft").unwrap();
        let (a, _) = w.in_units(ForceUnit::Newton, LengthUnit::Metre);
        assert!((a - 4448.2216152605 / 0.3048).abs() < 1e-9);
    }

    #[test]
    fn bad_intensities_say_what_to_write() {
        for (text, want) in [
            ("12", "not a force-per-length unit"),
            ("12 kN", "not a force-per-length unit"),
            ("12 kN/s", "not a force-per-length unit"),
            ("-3 kN/m", "negative"),
            ("0 kN/m", "zero"),
            ("12,5 kN/m", "12.5"),
            ("abc kN/m", "not a number"),
            ("12 kN/m uniform", "after its number and unit"),
        ] {
            let e = parse_intensity(text).unwrap_err().to_string();
            assert!(e.contains(want), "{text}: {e}");
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    // The label grammar is our own convention; the test labels are invented.

    fn force(t: &str) -> (f64, Option<ForceUnit>) {
        let f = parse_force(t).unwrap_or_else(|e| panic!("{t:?}: {e}"));
        (f.value, f.unit)
    }

    const KN: Option<ForceUnit> = Some(ForceUnit::Kilonewton);

    #[test]
    fn accepted_forms() {
        assert_eq!(force("85 kN"), (85.0, KN));
        assert_eq!(force("85kN"), (85.0, KN));
        assert_eq!(force("12.5kN"), (12.5, KN));
        assert_eq!(force("P = 40 kN"), (40.0, KN));
        assert_eq!(force("P1=40kN"), (40.0, KN));
        assert_eq!(force("W: 12 kN"), (12.0, KN));
        assert_eq!(force("W_left : 12 kN"), (12.0, KN));
        assert_eq!(force("P\u{2081} = 7 kN"), (7.0, KN));
        assert_eq!(force("F = 1.2e3 N"), (1200.0, Some(ForceUnit::Newton)));
        assert_eq!(force("+40 kN"), (40.0, KN));
        assert_eq!(force("40 KN"), (40.0, KN));
        assert_eq!(force("3.5 kips"), (3.5, Some(ForceUnit::Kip)));
        assert_eq!(force("900 lbf"), (900.0, Some(ForceUnit::PoundForce)));
        assert_eq!(force("900 lb"), (900.0, Some(ForceUnit::PoundForce)));
        assert_eq!(force("0.5 MN"), (0.5, Some(ForceUnit::Meganewton)));
        assert_eq!(force("85"), (85.0, None));
        assert_eq!(force(".5 kN"), (0.5, KN));
        assert_eq!(force("85."), (85.0, None));
    }

    #[test]
    fn whitespace_and_a_final_period_are_allowed() {
        assert_eq!(force("  85 kN \n"), (85.0, KN));
        assert_eq!(force("85 kN."), (85.0, KN));
        assert_eq!(force("85kN ."), (85.0, KN));
        assert_eq!(force("P1 =\n85\tkN"), (85.0, KN));
    }

    #[test]
    fn unit_conversion_of_a_label() {
        let f = parse_force("2 MN").unwrap();
        assert_eq!(f.value_in(ForceUnit::Kilonewton, ForceUnit::Newton), 2000.0);
        let bare = parse_force("7").unwrap();
        assert_eq!(bare.value_in(ForceUnit::Kilonewton, ForceUnit::Kilonewton), 7.0);
    }

    #[test]
    fn empty() {
        assert_eq!(parse_force("  "), Err(LabelError::Empty { kind: QuantityKind::Force }));
        let m = parse_force("").unwrap_err().to_string();
        assert!(m.contains("empty") && m.contains("85 kN"), "{m}");
    }

    #[test]
    fn not_a_number() {
        for t in ["-abc kN", "abc", "P = ", "P 40 kN", "kN 40", ".", "= 5 kN"] {
            assert!(matches!(parse_force(t), Err(LabelError::NotANumber { .. })), "{t}");
        }
    }

    #[test]
    fn negative() {
        let e = parse_force("-5 kN").unwrap_err();
        assert_eq!(e, LabelError::Negative { text: "-5 kN".into(), magnitude: "5 kN".into() });
        let m = e.to_string();
        assert!(m.contains("a load label is a magnitude; the direction comes from the line"), "{m}");
        assert!(m.ends_with("write 5 kN"), "{m}");
        assert!(matches!(parse_force("P = \u{2212}3"), Err(LabelError::Negative { .. })));
    }

    #[test]
    fn zero() {
        for t in ["0 kN", "0", "-0 kN", "0.000"] {
            assert!(matches!(parse_force(t), Err(LabelError::Zero { .. })), "{t}");
        }
    }

    #[test]
    fn unknown_unit_lists_the_accepted_ones() {
        for t in ["5 kNm", "5 t", "5 kN/m", "5 mN", "5 %"] {
            assert!(matches!(parse_force(t), Err(LabelError::UnknownUnit { .. })), "{t}");
        }
        let m = parse_force("5 t").unwrap_err().to_string();
        assert!(m.contains("'t'") && m.contains("N, kN, MN, lbf, kip"), "{m}");
    }

    #[test]
    fn comma_decimal() {
        let e = parse_force("12,5 kN").unwrap_err();
        assert_eq!(e, LabelError::CommaDecimal { text: "12,5 kN".into(), instead: "12.5".into() });
        assert!(e.to_string().contains("write 12.5"));
        let e = parse_force("1,250 kN").unwrap_err();
        assert!(matches!(&e, LabelError::CommaDecimal { instead, .. } if instead == "1.250 or 1250"));
        let e = parse_force("1,250,000 N").unwrap_err();
        assert!(matches!(&e, LabelError::CommaDecimal { instead, .. } if instead == "1250000"));
        let e = parse_force("1.5,25 kN").unwrap_err();
        assert!(matches!(&e, LabelError::CommaDecimal { instead, .. } if instead.contains("decimal point")));
    }

    #[test]
    fn several_numbers() {
        for t in ["40 kN + 5 kN", "40+5 kN", "85 000 kN", "2 x 40 kN", "40 kN 2"] {
            assert!(matches!(parse_force(t), Err(LabelError::SeveralNumbers { .. })), "{t}");
        }
    }

    #[test]
    fn trailing_text_is_refused() {
        let e = parse_force("85 kN (service)").unwrap_err();
        assert_eq!(
            e,
            LabelError::TrailingText {
                text: "85 kN (service)".into(),
                rest: "(service)".into(),
                kind: QuantityKind::Force
            }
        );
    }

    #[test]
    fn too_large() {
        for t in ["1e13 kN", "1e12", "1e999 N", "999999999999999 kN"] {
            assert!(matches!(parse_force(t), Err(LabelError::TooLarge { .. })), "{t}");
        }
        assert!(parse_force("9.99e11 N").is_ok());
    }

    #[test]
    fn messages_are_one_line() {
        for t in ["", "abc", "-5 kN", "0", "5 t", "12,5", "1+2", "5 kN x", "1e20"] {
            let m = parse_force(t).unwrap_err().to_string();
            assert!(!m.contains('\n'), "{m}");
        }
    }

    #[test]
    fn command_line_lengths() {
        assert_eq!(parse_quantity_length("6 m"), Ok((6.0, Some(LengthUnit::Metre))));
        assert_eq!(parse_quantity_length("6000mm"), Ok((6000.0, Some(LengthUnit::Millimetre))));
        assert_eq!(parse_quantity_length("20 ft"), Ok((20.0, Some(LengthUnit::Foot))));
        assert_eq!(parse_quantity_length("6"), Ok((6.0, None)));
        assert_eq!(parse_quantity_length("-1.5 m"), Ok((-1.5, Some(LengthUnit::Metre))));
        assert_eq!(parse_quantity_length("0"), Ok((0.0, None)));
        let m = parse_quantity_length("6 M").unwrap_err().to_string();
        assert!(m.contains("not a length unit") && m.contains("mm, cm, dm, m, km, in, ft, yd"), "{m}");
        assert!(matches!(parse_quantity_length("L = 6 m"), Err(LabelError::NotANumber { .. })));
        let m = parse_quantity_length("x").unwrap_err().to_string();
        assert!(m.contains("'6 m'"), "{m}");
    }

    #[test]
    fn command_line_forces() {
        assert_eq!(parse_quantity_force("450 kN"), Ok((450.0, KN)));
        assert_eq!(parse_quantity_force("450"), Ok((450.0, None)));
        assert_eq!(parse_quantity_force("1.5e3N"), Ok((1500.0, Some(ForceUnit::Newton))));
        assert!(matches!(parse_quantity_force("450 kg"), Err(LabelError::UnknownUnit { .. })));
    }

    proptest! {
        #[test]
        fn never_panics(s in "\\PC*") {
            let _ = parse_force(&s);
            let _ = parse_quantity_length(&s);
        }

        #[test]
        fn never_panics_near_the_grammar(s in "[ Pa-z_=:+\\-\u{2212}0-9.,eE]{0,20}") {
            let _ = parse_force(&s);
        }

        #[test]
        fn written_numbers_read_back(v in 1e-6f64..1e11) {
            let f = parse_force(&format!("P = {v} kN")).unwrap();
            prop_assert_eq!(f.value, v);
            prop_assert_eq!(f.unit, KN);
        }
    }
}
