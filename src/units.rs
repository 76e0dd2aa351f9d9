//! Units of length and force, and the conversions between them.
//!
//! The model holds every length in the drawing's own unit and every force in
//! one force unit (see [`Units`]); conversion happens only at the edges, where
//! a label, a flag or a report uses another unit.

use std::fmt;
use std::str::FromStr;

use serde::Serialize;

/// A unit of length, as a drawing or a command-line value gives it.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize)]
pub enum LengthUnit {
    /// Millimetre.
    #[serde(rename = "mm")]
    Millimetre,
    /// Centimetre.
    #[serde(rename = "cm")]
    Centimetre,
    /// Decimetre.
    #[serde(rename = "dm")]
    Decimetre,
    /// Metre.
    #[serde(rename = "m")]
    Metre,
    /// Kilometre.
    #[serde(rename = "km")]
    Kilometre,
    /// International inch (25.4 mm exactly).
    #[serde(rename = "in")]
    Inch,
    /// International foot (0.3048 m exactly).
    #[serde(rename = "ft")]
    Foot,
    /// International yard (0.9144 m exactly).
    #[serde(rename = "yd")]
    Yard,
}

impl LengthUnit {
    /// Every unit, for help texts and parsing.
    pub const ALL: [LengthUnit; 8] = [
        LengthUnit::Millimetre,
        LengthUnit::Centimetre,
        LengthUnit::Decimetre,
        LengthUnit::Metre,
        LengthUnit::Kilometre,
        LengthUnit::Inch,
        LengthUnit::Foot,
        LengthUnit::Yard,
    ];

    /// Length of one of this unit in metres (exact by definition of each unit).
    #[must_use]
    pub fn metres(self) -> f64 {
        match self {
            LengthUnit::Millimetre => 0.001,
            LengthUnit::Centimetre => 0.01,
            LengthUnit::Decimetre => 0.1,
            LengthUnit::Metre => 1.0,
            LengthUnit::Kilometre => 1000.0,
            LengthUnit::Inch => 0.0254,
            LengthUnit::Foot => 0.3048,
            LengthUnit::Yard => 0.9144,
        }
    }

    /// The symbol used in reports and on drawings.
    #[must_use]
    pub fn symbol(self) -> &'static str {
        match self {
            LengthUnit::Millimetre => "mm",
            LengthUnit::Centimetre => "cm",
            LengthUnit::Decimetre => "dm",
            LengthUnit::Metre => "m",
            LengthUnit::Kilometre => "km",
            LengthUnit::Inch => "in",
            LengthUnit::Foot => "ft",
            LengthUnit::Yard => "yd",
        }
    }

    /// The unit a DXF `$INSUNITS` code names, if it is one of ours.
    ///
    /// Codes from the DXF reference, header variable `$INSUNITS`: 1 inches,
    /// 2 feet, 4 millimetres, 5 centimetres, 6 metres, 7 kilometres,
    /// 10 yards, 14 decimetres. 0 means "unitless" and gives `None`.
    #[must_use]
    pub fn from_insunits(code: i64) -> Option<LengthUnit> {
        match code {
            1 => Some(LengthUnit::Inch),
            2 => Some(LengthUnit::Foot),
            4 => Some(LengthUnit::Millimetre),
            5 => Some(LengthUnit::Centimetre),
            6 => Some(LengthUnit::Metre),
            7 => Some(LengthUnit::Kilometre),
            10 => Some(LengthUnit::Yard),
            14 => Some(LengthUnit::Decimetre),
            _ => None,
        }
    }

    /// Factor that turns a length in `self` into a length in `to`.
    #[must_use]
    pub fn factor_to(self, to: LengthUnit) -> f64 {
        if self == to { 1.0 } else { self.metres() / to.metres() }
    }
}

impl fmt::Display for LengthUnit {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.symbol())
    }
}

impl FromStr for LengthUnit {
    type Err = String;

    fn from_str(s: &str) -> Result<Self, Self::Err> {
        let t = s.trim();
        let unit = match t {
            "mm" => LengthUnit::Millimetre,
            "cm" => LengthUnit::Centimetre,
            "dm" => LengthUnit::Decimetre,
            "m" => LengthUnit::Metre,
            "km" => LengthUnit::Kilometre,
            "in" | "\"" => LengthUnit::Inch,
            "ft" | "'" => LengthUnit::Foot,
            "yd" => LengthUnit::Yard,
            _ => {
                return Err(format!("'{t}' is not a length unit; use one of mm, cm, dm, m, km, in, ft, yd"));
            }
        };
        Ok(unit)
    }
}

/// A unit of force.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize)]
pub enum ForceUnit {
    /// Newton.
    #[serde(rename = "N")]
    Newton,
    /// Kilonewton.
    #[serde(rename = "kN")]
    Kilonewton,
    /// Meganewton.
    #[serde(rename = "MN")]
    Meganewton,
    /// Pound-force: 0.45359237 kg × 9.80665 m/s² = 4.4482216152605 N exactly.
    #[serde(rename = "lbf")]
    PoundForce,
    /// Kip: 1000 lbf.
    #[serde(rename = "kip")]
    Kip,
}

impl ForceUnit {
    /// Every unit, for help texts.
    pub const ALL: [ForceUnit; 5] =
        [ForceUnit::Newton, ForceUnit::Kilonewton, ForceUnit::Meganewton, ForceUnit::PoundForce, ForceUnit::Kip];

    /// One of this unit in newtons.
    ///
    /// The pound-force is exact by definition (NIST SP 811, 2008, appendix B:
    /// 1 lbf = 4.448 221 615 260 5 N).
    #[must_use]
    pub fn newtons(self) -> f64 {
        match self {
            ForceUnit::Newton => 1.0,
            ForceUnit::Kilonewton => 1.0e3,
            ForceUnit::Meganewton => 1.0e6,
            ForceUnit::PoundForce => 4.448_221_615_260_5,
            ForceUnit::Kip => 4_448.221_615_260_5,
        }
    }

    /// The symbol used in reports and on drawings.
    #[must_use]
    pub fn symbol(self) -> &'static str {
        match self {
            ForceUnit::Newton => "N",
            ForceUnit::Kilonewton => "kN",
            ForceUnit::Meganewton => "MN",
            ForceUnit::PoundForce => "lbf",
            ForceUnit::Kip => "kip",
        }
    }

    /// Factor that turns a force in `self` into a force in `to`.
    #[must_use]
    pub fn factor_to(self, to: ForceUnit) -> f64 {
        if self == to { 1.0 } else { self.newtons() / to.newtons() }
    }
}

impl fmt::Display for ForceUnit {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.symbol())
    }
}

impl FromStr for ForceUnit {
    type Err = String;

    /// Accepts the spellings engineers write on drawings: `N`, `kN`, `MN`,
    /// `lbf`/`lb`/`lbs`, `kip`/`kips`. The case of `kN` and `lbf` is not
    /// significant; `MN` must keep its capital M (a small m would be milli).
    fn from_str(s: &str) -> Result<Self, Self::Err> {
        let t = s.trim();
        let unit = match t {
            "N" | "n" => ForceUnit::Newton,
            "MN" => ForceUnit::Meganewton,
            _ => match t.to_ascii_lowercase().as_str() {
                "kn" => ForceUnit::Kilonewton,
                "lbf" | "lb" | "lbs" => ForceUnit::PoundForce,
                "kip" | "kips" => ForceUnit::Kip,
                _ => {
                    return Err(format!("'{t}' is not a force unit; use one of N, kN, MN, lbf, kip"));
                }
            },
        };
        Ok(unit)
    }
}

/// A unit of stress (strength), for member sizing.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize)]
pub enum StressUnit {
    /// Megapascal, the same as newton per square millimetre.
    #[serde(rename = "MPa")]
    Megapascal,
    /// Gigapascal.
    #[serde(rename = "GPa")]
    Gigapascal,
    /// Pound-force per square inch.
    #[serde(rename = "psi")]
    Psi,
    /// Kip per square inch (1000 psi).
    #[serde(rename = "ksi")]
    Ksi,
}

impl StressUnit {
    /// One of this unit in megapascals (N/mm²).
    ///
    /// 1 psi = 1 lbf / (0.0254 m)² = 4.448 221 615 260 5 N / 645.16 mm²
    /// = 0.006 894 757 293 168 361 MPa, exact by the definitions of the
    /// pound-force (NIST SP 811, 2008, appendix B) and the inch.
    #[must_use]
    pub fn megapascals(self) -> f64 {
        match self {
            StressUnit::Megapascal => 1.0,
            StressUnit::Gigapascal => 1.0e3,
            StressUnit::Psi => 4.448_221_615_260_5 / 645.16,
            StressUnit::Ksi => 4_448.221_615_260_5 / 645.16,
        }
    }

    /// The symbol used in reports and on drawings.
    #[must_use]
    pub fn symbol(self) -> &'static str {
        match self {
            StressUnit::Megapascal => "MPa",
            StressUnit::Gigapascal => "GPa",
            StressUnit::Psi => "psi",
            StressUnit::Ksi => "ksi",
        }
    }
}

impl fmt::Display for StressUnit {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.symbol())
    }
}

impl FromStr for StressUnit {
    type Err = String;

    /// `MPa`, `N/mm2` (or `N/mm²`), `GPa`, `psi`, `ksi`. The case of `MPa`
    /// and `GPa` must be kept (a small m would be milli); `psi` and `ksi`
    /// may be written in any case.
    fn from_str(s: &str) -> Result<Self, Self::Err> {
        let t = s.trim();
        let unit = match t {
            "MPa" | "N/mm2" | "N/mm²" | "N/mm^2" => StressUnit::Megapascal,
            "GPa" => StressUnit::Gigapascal,
            _ => match t.to_ascii_lowercase().as_str() {
                "psi" => StressUnit::Psi,
                "ksi" => StressUnit::Ksi,
                _ => return Err(format!("'{t}' is not a unit of stress; use one of MPa, N/mm2, GPa, psi, ksi")),
            },
        };
        Ok(unit)
    }
}

/// The one length unit and the one force unit every model quantity is in.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
pub struct Units {
    /// Unit of every coordinate and length (the drawing's own unit).
    pub length: LengthUnit,
    /// Unit of every force.
    pub force: ForceUnit,
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn pound_force_is_exact_by_definition() {
        // NIST SP 811 (2008), appendix B.9: 1 lbf = 4.448 221 615 260 5 N;
        // it is 0.453 592 37 kg × 9.806 65 m/s² (both exact by definition).
        let derived = 0.453_592_37_f64 * 9.806_65;
        assert!((ForceUnit::PoundForce.newtons() - derived).abs() < 1e-15);
        assert_eq!(ForceUnit::Kip.factor_to(ForceUnit::PoundForce), 1000.0);
    }

    #[test]
    fn foot_and_inch_are_exact() {
        // International yard and pound agreement (1959): 1 ft = 0.3048 m.
        assert!((LengthUnit::Foot.factor_to(LengthUnit::Inch) - 12.0).abs() < 1e-13);
        assert_eq!(LengthUnit::Metre.factor_to(LengthUnit::Millimetre), 1000.0);
    }

    #[test]
    fn insunits_codes_follow_the_dxf_reference() {
        assert_eq!(LengthUnit::from_insunits(4), Some(LengthUnit::Millimetre));
        assert_eq!(LengthUnit::from_insunits(6), Some(LengthUnit::Metre));
        assert_eq!(LengthUnit::from_insunits(0), None);
    }

    #[test]
    fn stress_units() {
        // 1 ksi = 1000 lbf/in² = 6.894 757 MPa (NIST SP 811, 2008, appendix
        // B.9 lists 1 kip/in² = 6.894 757 E+06 Pa).
        assert!((StressUnit::Ksi.megapascals() - 6.894_757).abs() < 1e-6);
        assert!((StressUnit::Psi.megapascals() * 1000.0 - StressUnit::Ksi.megapascals()).abs() < 1e-12);
        assert_eq!("N/mm2".parse::<StressUnit>(), Ok(StressUnit::Megapascal));
        assert_eq!("KSI".parse::<StressUnit>(), Ok(StressUnit::Ksi));
        assert!("mpa".parse::<StressUnit>().is_err());
    }

    #[test]
    fn force_unit_spellings() {
        assert_eq!("kN".parse::<ForceUnit>(), Ok(ForceUnit::Kilonewton));
        assert_eq!("KN".parse::<ForceUnit>(), Ok(ForceUnit::Kilonewton));
        assert_eq!("MN".parse::<ForceUnit>(), Ok(ForceUnit::Meganewton));
        assert!("mN".parse::<ForceUnit>().is_err());
        assert_eq!("kips".parse::<ForceUnit>(), Ok(ForceUnit::Kip));
    }
}
