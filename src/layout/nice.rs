//! Round numbers, number formats and Bow's notation letters.

use crate::units::{ForceUnit, LengthUnit};

/// The steps of a round scale within a decade (common drafting practice, no source).
const STEPS: [f64; 4] = [1.0, 2.0, 2.5, 5.0];

/// The smallest round number (1, 2, 2.5 or 5 × 10ᵏ) not below `v` (> 0).
#[must_use]
pub fn round_up(v: f64) -> f64 {
    if !(v.is_finite() && v > 0.0) {
        return 1.0;
    }
    let decade = 10f64.powf(v.log10().floor());
    for k in [decade, decade * 10.0] {
        for s in STEPS {
            let r = s * k;
            if r >= v * (1.0 - 1e-12) {
                return r;
            }
        }
    }
    10.0 * decade
}

/// The largest round number (1, 2, 2.5 or 5 × 10ᵏ) not above `v` (> 0).
#[must_use]
pub fn round_down(v: f64) -> f64 {
    if !(v.is_finite() && v > 0.0) {
        return 1.0;
    }
    let decade = 10f64.powf(v.log10().floor());
    let mut best = decade / 10.0 * 5.0;
    for k in [decade / 10.0, decade] {
        for s in STEPS {
            let r = s * k;
            if r <= v * (1.0 + 1e-12) {
                best = r;
            }
        }
    }
    best
}

/// Decimal places that show a length to about a millimetre.
#[must_use]
pub fn length_decimals(unit: LengthUnit) -> usize {
    match unit {
        LengthUnit::Millimetre => 0,
        LengthUnit::Centimetre | LengthUnit::Inch => 1,
        LengthUnit::Decimetre => 2,
        LengthUnit::Metre | LengthUnit::Foot | LengthUnit::Yard => 3,
        LengthUnit::Kilometre => 6,
    }
}

/// A length with the decimals of its unit.
#[must_use]
pub fn fmt_length(v: f64, unit: LengthUnit) -> String {
    let s = format!("{:.*}", length_decimals(unit), v);
    if s.starts_with('-') && s.trim_start_matches(['-', '0', '.']).is_empty() { s[1..].to_string() } else { s }
}

/// A force to four significant figures (at least no decimals), with its unit.
#[must_use]
pub fn fmt_force(v: f64, unit: ForceUnit) -> String {
    let a = v.abs();
    let decimals = if a >= 1000.0 {
        0
    } else if a >= 100.0 {
        1
    } else if a >= 10.0 {
        2
    } else {
        3
    };
    format!("{v:.decimals$} {unit}")
}

/// Bow's notation letter of space `k` (0 → A, 25 → Z, 26 → AA, …).
#[must_use]
pub fn space_letter(k: usize) -> String {
    let mut n = k + 1;
    let mut out = Vec::new();
    while n > 0 {
        n -= 1;
        out.push(b'A' + (n % 26) as u8);
        n /= 26;
    }
    out.reverse();
    String::from_utf8(out).unwrap_or_default()
}

/// The name of the member between spaces `a` and `b`: "AE", or "AA-AB" when
/// either letter is doubled.
#[must_use]
pub fn member_name(a: usize, b: usize) -> String {
    let (x, y) = (space_letter(a), space_letter(b));
    if x.len() == 1 && y.len() == 1 { format!("{x}{y}") } else { format!("{x}-{y}") }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn round_scales() {
        assert_eq!(round_up(7.3), 10.0);
        assert_eq!(round_up(2.1), 2.5);
        assert_eq!(round_up(0.0042), 0.005);
        assert_eq!(round_up(20.0), 20.0);
        assert_eq!(round_down(7.3), 5.0);
        assert_eq!(round_down(2.4), 2.0);
        assert_eq!(round_down(0.9), 0.5);
        assert_eq!(round_down(100.0), 100.0);
    }

    #[test]
    fn letters() {
        assert_eq!(space_letter(0), "A");
        assert_eq!(space_letter(25), "Z");
        assert_eq!(space_letter(26), "AA");
        assert_eq!(space_letter(27), "AB");
        assert_eq!(member_name(0, 4), "AE");
        assert_eq!(member_name(26, 30), "AA-AE");
    }

    #[test]
    fn formats() {
        assert_eq!(fmt_force(412.345, ForceUnit::Kilonewton), "412.3 kN");
        assert_eq!(fmt_force(-1234.6, ForceUnit::Kilonewton), "-1235 kN");
        assert_eq!(fmt_length(6.0, LengthUnit::Metre), "6.000");
        assert_eq!(fmt_length(6000.4, LengthUnit::Millimetre), "6000");
        assert_eq!(fmt_length(-0.0001, LengthUnit::Metre), "0.000");
    }
}
