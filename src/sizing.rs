//! Member sizing: the least size of cable or arch for the largest force, and
//! the utilisation of every segment, under the safety format of the user's
//! own code.
//!
//! Pure: no I/O. A catalogue arrives as CSV text with the name of its file
//! (for messages); the binary reads the file.
//!
//! # What is computed
//!
//! The forces are those the solver found (tension positive). With a
//! partial-factor format the design force is N_Ed = γ_F·|N| and the design
//! resistance N_Rd = R_k/γ_M; with a global factor of safety N_Ed = |N| and
//! N_Rd = R_k/SF. The utilisation of a segment is N_Ed/N_Rd of the size
//! chosen for the largest force along the profile.
//!
//! * **By strength** (a characteristic strength f per unit area: breaking
//!   strength f_uk of wire or strand, or yield strength f_y of a bar or an
//!   arch section), R_k = A·f, so the least area is A = N_Ed·γ_M/f — the form
//!   of EN 1993-1-1:2005, 6.2.3, eq. (6.6), N_pl,Rd = A·f_y/γ_M0.
//! * **By catalogue** (rows of a named size and its minimum breaking force
//!   F_uk), R_k = F_uk and the chosen size is the row of least breaking force
//!   whose N_Rd ≥ N_Ed.
//!
//! Buckling of compression members, fatigue, end fittings, bending at
//! saddles and clamps, and dynamic effects are not checked ([`CAUTION`]).
//! A strand carries no compression: a catalogue cannot size an arch.

use std::fmt;

use serde::Serialize;
use thiserror::Error;

use crate::model::fmt_num;
use crate::solve::Form;
use crate::units::{ForceUnit, StressUnit};

/// The caution that goes with every sizing, in reports and on drawings.
pub const CAUTION: &str = "Member sizing is indicative only: the design code in force governs. Buckling, fatigue, end fittings and anchorages, bending at saddles and clamps, and dynamic effects are not checked.";

/// Relative slack when comparing a design resistance with the design force,
/// so that a size whose resistance equals the force to the last digits of
/// round-off is accepted (our own choice: far below any tabulated precision).
const SLACK: f64 = 1e-12;

/// Why a sizing cannot be done as asked.
#[derive(Debug, Error, PartialEq)]
pub enum SizingError {
    /// A catalogue file that cannot be read as one.
    #[error("{at}: {problem}")]
    Catalogue {
        /// The file, and the line and column where known.
        at: String,
        /// What is wrong and what to do.
        problem: String,
    },
    /// A strength or a factor that cannot be right.
    #[error("{what} '{given}': {problem}")]
    BadValue {
        /// The option or quantity.
        what: String,
        /// As given.
        given: String,
        /// What is wrong and what to do.
        problem: String,
    },
    /// A catalogue of strands asked to size members in compression.
    #[error(
        "the catalogue {file} lists strands, which carry no compression, and an arch is in compression; size the arch by area with a yield or compressive strength instead (--strength)"
    )]
    Compression {
        /// The catalogue's file.
        file: String,
    },
}

/// A characteristic strength per unit area as the user wrote it.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Strength {
    /// The value.
    pub value: f64,
    /// Its unit.
    pub unit: StressUnit,
}

impl Strength {
    /// The strength in MPa (N/mm²).
    #[must_use]
    pub fn megapascals(&self) -> f64 {
        self.value * self.unit.megapascals()
    }

    /// Reads a strength such as `1860 MPa`, `1860 N/mm2`, `270 ksi`; the
    /// unit must be written.
    pub fn parse(text: &str) -> Result<Strength, SizingError> {
        let t = text.trim();
        let bad =
            |problem: &str| SizingError::BadValue { what: "strength".into(), given: t.into(), problem: problem.into() };
        let split =
            t.find(|c: char| !(c.is_ascii_digit() || matches!(c, '.' | '+' | '-' | 'e' | 'E'))).unwrap_or(t.len());
        // No stress unit begins with e or E, so the number ends where the
        // first other character is.
        let (number, unit) = t.split_at(split);
        let value: f64 = number
            .trim()
            .parse()
            .map_err(|_| bad("write a number and a unit of stress, e.g. \"1860 MPa\" or \"270 ksi\""))?;
        if unit.trim().is_empty() {
            return Err(bad("give its unit: MPa, N/mm2, GPa, psi or ksi, e.g. \"1860 MPa\""));
        }
        let unit: StressUnit = unit.trim().parse().map_err(|e: String| bad(&e))?;
        let s = Strength { value, unit };
        let mpa = s.megapascals();
        if !(mpa > 0.0 && mpa < 1e6) {
            return Err(bad("the strength must be positive and below 1,000,000 MPa"));
        }
        Ok(s)
    }
}

impl fmt::Display for Strength {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{} {}", fmt_num(self.value), self.unit)
    }
}

/// One size of a catalogue.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Strand {
    /// Its name as listed.
    pub name: String,
    /// Minimum (characteristic) breaking force F_uk, in newtons.
    pub breaking_force: f64,
    /// Metallic cross-section area, mm², if listed.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub area_mm2: Option<f64>,
    /// Nominal diameter, mm, if listed.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub diameter_mm: Option<f64>,
    /// Mass per length, kg/m, if listed.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub mass_kg_per_m: Option<f64>,
    /// Line of the file it came from.
    pub line: u64,
}

/// A catalogue of strand (or rope, or bar) sizes the user supplies.
///
/// CSV with a header row; `#` starts a comment line. Columns (names in any
/// case, in any order; other columns are ignored):
///
/// | column | meaning |
/// | --- | --- |
/// | `name` | the size's name (required) |
/// | `breaking_force_<UNIT>` | minimum breaking force in N, kN, MN, lbf or kip, e.g. `breaking_force_kN` (required, or the next two) |
/// | `breaking_force` + `force_unit` | the force, and its unit on each row |
/// | `area_mm2`, `area_cm2` or `area_in2` | metallic area (optional) |
/// | `diameter_mm` or `diameter_in` | nominal diameter (optional) |
/// | `mass_kg_per_m` or `mass_lb_per_ft` | mass per length (optional) |
#[derive(Clone, Debug, PartialEq)]
pub struct Catalogue {
    /// The file it was read from, as named in messages.
    pub file: String,
    /// Its rows, in the file's order.
    pub strands: Vec<Strand>,
}

/// Where a quantity's unit comes from.
enum UnitFrom {
    Header(ForceUnit),
    Column(usize),
}

impl Catalogue {
    /// Reads a catalogue from CSV `text`; `file` names it in messages.
    pub fn parse(text: &str, file: &str) -> Result<Catalogue, SizingError> {
        let err = |line: Option<u64>, column: Option<&str>, problem: String| {
            let mut at = file.to_string();
            if let Some(l) = line {
                at.push_str(&format!(", line {l}"));
            }
            if let Some(c) = column {
                at.push_str(&format!(", column '{c}'"));
            }
            SizingError::Catalogue { at, problem }
        };
        // The line of a position: the csv crate counts neither the comment
        // lines between records nor, in its byte offset, those just before
        // one; so count lines up to the offset, then step over comment and
        // blank lines.
        let line_of = |p: &csv::Position| {
            let mut at = usize::try_from(p.byte()).unwrap_or(usize::MAX).min(text.len());
            let mut line = text.as_bytes()[..at].iter().filter(|b| **b == b'\n').count() as u64 + 1;
            while let Some(rest) = text.get(at..) {
                let first = rest.split('\n').next().unwrap_or("");
                if !(first.starts_with('#') || first.trim().is_empty()) || first.len() == rest.len() {
                    break;
                }
                at += first.len() + 1;
                line += 1;
            }
            line
        };
        let csv_err = |e: &csv::Error| {
            let line = e.position().map(line_of);
            let problem = match e.kind() {
                csv::ErrorKind::UnequalLengths { expected_len, len, .. } => format!(
                    "{len} field(s) where the header has {expected_len}; give every row as many fields as the header (leave optional ones empty)"
                ),
                csv::ErrorKind::Utf8 { .. } => "not UTF-8 text; save the catalogue as UTF-8 CSV".into(),
                _ => format!("not readable as CSV ({e})"),
            };
            err(line, None, problem)
        };
        let mut reader =
            csv::ReaderBuilder::new().comment(Some(b'#')).trim(csv::Trim::All).from_reader(text.as_bytes());
        let headers = reader.headers().map_err(|e| csv_err(&e))?.clone();
        let names: Vec<String> = headers.iter().map(str::to_string).collect();
        let find = |wanted: &str| names.iter().position(|h| h.eq_ignore_ascii_case(wanted));
        let header_line =
            text.lines().position(|l| !l.trim().is_empty() && !l.starts_with('#')).map_or(1, |k| k as u64 + 1);
        let name_col = find("name").ok_or_else(|| {
            err(Some(header_line), None, "the header has no 'name' column; start the file with a header row such as name,breaking_force_kN,area_mm2".into())
        })?;
        // The breaking force and its unit.
        let (force_col, unit_from) = match find("breaking_force") {
            Some(c) => {
                let u = find("force_unit").ok_or_else(|| {
                    err(Some(header_line), Some("breaking_force"), "no 'force_unit' column gives its unit; add one, or name the column with its unit, e.g. breaking_force_kN".into())
                })?;
                (c, UnitFrom::Column(u))
            }
            None => {
                let prefix = "breaking_force_";
                let found = names.iter().enumerate().find(|(_, h)| {
                    h.len() > prefix.len()
                        && h.is_char_boundary(prefix.len())
                        && h[..prefix.len()].eq_ignore_ascii_case(prefix)
                });
                let Some((c, h)) = found else {
                    return Err(err(
                        Some(header_line),
                        None,
                        "the header has no breaking force column; add one named with its unit, e.g. breaking_force_kN"
                            .into(),
                    ));
                };
                let unit: ForceUnit = h[prefix.len()..].parse().map_err(|e: String| {
                    err(Some(header_line), Some(h), format!("{e} (name the column e.g. breaking_force_kN)"))
                })?;
                (c, UnitFrom::Header(unit))
            }
        };
        let optional = |choices: &[(&str, f64)]| -> Result<Option<(usize, f64)>, SizingError> {
            let found: Vec<(usize, f64)> = choices.iter().filter_map(|(n, f)| find(n).map(|c| (c, *f))).collect();
            match found.as_slice() {
                [] => Ok(None),
                [one] => Ok(Some(*one)),
                _ => Err(err(
                    Some(header_line),
                    None,
                    format!(
                        "the columns {} say the same thing; keep one",
                        choices.iter().map(|c| c.0).collect::<Vec<_>>().join(", ")
                    ),
                )),
            }
        };
        // Factors to mm², mm and kg/m: 1 in = 25.4 mm exactly; 1 lb =
        // 0.453 592 37 kg exactly, 1 ft = 0.3048 m exactly.
        let area = optional(&[("area_mm2", 1.0), ("area_cm2", 100.0), ("area_in2", 645.16)])?;
        let diameter = optional(&[("diameter_mm", 1.0), ("diameter_in", 25.4)])?;
        let mass = optional(&[("mass_kg_per_m", 1.0), ("mass_lb_per_ft", 0.453_592_37 / 0.3048)])?;

        let mut strands = Vec::new();
        for record in reader.records() {
            let record = record.map_err(|e| csv_err(&e))?;
            let line = record.position().map_or(0, line_of);
            let field = |c: usize| record.get(c).unwrap_or("");
            let number = |c: usize, what: &str, required: bool| -> Result<Option<f64>, SizingError> {
                let raw = field(c);
                if raw.is_empty() {
                    return if required {
                        Err(err(Some(line), Some(&names[c]), format!("the {what} is missing; every size needs one")))
                    } else {
                        Ok(None)
                    };
                }
                let v: f64 = raw.parse().map_err(|_| {
                    err(
                        Some(line),
                        Some(&names[c]),
                        format!("'{raw}' is not a number; write the {what} as a plain number, e.g. 183.7"),
                    )
                })?;
                if !(v > 0.0 && v.is_finite() && v < 1e12) {
                    return Err(err(
                        Some(line),
                        Some(&names[c]),
                        format!("the {what} must be a positive number below 1e12, not {raw}"),
                    ));
                }
                Ok(Some(v))
            };
            let name = field(name_col).to_string();
            if name.is_empty() {
                return Err(err(Some(line), Some(&names[name_col]), "the size has no name; name every row".into()));
            }
            let force = number(force_col, "breaking force", true)?.unwrap_or_default();
            let unit = match unit_from {
                UnitFrom::Header(u) => u,
                UnitFrom::Column(c) => field(c).parse().map_err(|e: String| err(Some(line), Some(&names[c]), e))?,
            };
            let scaled = |o: Option<(usize, f64)>, what: &str| -> Result<Option<f64>, SizingError> {
                match o {
                    Some((c, f)) => Ok(number(c, what, false)?.map(|v| v * f)),
                    None => Ok(None),
                }
            };
            strands.push(Strand {
                name,
                breaking_force: force * unit.newtons(),
                area_mm2: scaled(area, "area")?,
                diameter_mm: scaled(diameter, "diameter")?,
                mass_kg_per_m: scaled(mass, "mass per length")?,
                line,
            });
        }
        if strands.is_empty() {
            return Err(err(None, None, "lists no sizes; add one row per size under the header".into()));
        }
        Ok(Catalogue { file: file.to_string(), strands })
    }
}

/// What the members are made of.
#[derive(Clone, Debug, PartialEq)]
pub enum Material {
    /// A characteristic strength per unit area (f_uk or f_y): sizes by area.
    Strength(Strength),
    /// A catalogue of sizes with their minimum breaking forces.
    Catalogue(Catalogue),
}

/// The safety format of the user's code, with the user's factors.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Safety {
    /// Partial factors: N_Ed = γ_F·N, N_Rd = R_k/γ_M.
    Partial {
        /// γ_F, on the forces the tool found.
        action: f64,
        /// γ_M (or γ_R, or a product of factors), dividing the resistance.
        resistance: f64,
    },
    /// A global factor of safety: R_k/N ≥ SF.
    Global {
        /// SF.
        factor: f64,
    },
}

impl Safety {
    /// Checks each factor is a finite number above zero and not absurdly
    /// large (≤ 100).
    pub fn check(self) -> Result<Safety, SizingError> {
        let check = |what: &str, v: f64| {
            if v > 0.0 && v <= 100.0 {
                Ok(())
            } else {
                Err(SizingError::BadValue {
                    what: what.into(),
                    given: fmt_num(v),
                    problem: "a factor must be a positive number of at most 100".into(),
                })
            }
        };
        match self {
            Safety::Partial { action, resistance } => {
                check("action factor", action)?;
                check("resistance factor", resistance)?;
            }
            Safety::Global { factor } => check("safety factor", factor)?,
        }
        Ok(self)
    }

    /// The factor on the forces (1 for a global factor).
    #[must_use]
    pub fn on_actions(self) -> f64 {
        match self {
            Safety::Partial { action, .. } => action,
            Safety::Global { .. } => 1.0,
        }
    }

    /// The factor dividing the characteristic resistance.
    #[must_use]
    pub fn on_resistance(self) -> f64 {
        match self {
            Safety::Partial { resistance, .. } => resistance,
            Safety::Global { factor } => factor,
        }
    }
}

/// What to size with: the material and the safety format.
#[derive(Clone, Debug, PartialEq)]
pub struct Spec {
    /// The material.
    pub material: Material,
    /// The safety format and factors.
    pub safety: Safety,
}

/// The factors as reported.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct FactorsOut {
    /// γ_F (partial factors).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub action: Option<f64>,
    /// γ_M (partial factors).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub resistance: Option<f64>,
    /// SF (global factor).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub safety: Option<f64>,
}

/// The material as reported.
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "kebab-case")]
pub enum MaterialOut {
    /// By strength.
    Strength {
        /// As written.
        value: f64,
        /// Its unit.
        unit: StressUnit,
        /// In MPa.
        megapascals: f64,
    },
    /// By catalogue.
    Catalogue {
        /// The file.
        file: String,
        /// How many sizes it lists.
        sizes: usize,
    },
}

/// The chosen size.
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "kebab-case")]
pub enum Size {
    /// The least area, mm².
    Area {
        /// mm².
        area_mm2: f64,
    },
    /// A catalogue's row.
    Catalogue {
        /// Its name.
        name: String,
        /// Its minimum breaking force (report force unit).
        breaking_force: f64,
        /// mm², if listed.
        #[serde(skip_serializing_if = "Option::is_none")]
        area_mm2: Option<f64>,
        /// mm, if listed.
        #[serde(skip_serializing_if = "Option::is_none")]
        diameter_mm: Option<f64>,
        /// kg/m, if listed.
        #[serde(skip_serializing_if = "Option::is_none")]
        mass_kg_per_m: Option<f64>,
        /// Its line in the catalogue.
        line: u64,
    },
}

/// The force the size was chosen for.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Governing {
    /// Index of the segment with the largest force.
    pub segment: usize,
    /// Its name.
    pub name: String,
    /// The largest force magnitude along the profile (with continuous
    /// loads, at a support and above every segment's).
    pub force: f64,
    /// N_Ed for it.
    pub design_force: f64,
}

/// One segment's check.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SegmentCheck {
    /// Its name.
    pub name: String,
    /// Axial force, tension positive.
    pub force: f64,
    /// N_Ed = γ_F·|force|.
    pub design_force: f64,
    /// N_Ed / N_Rd of the chosen size.
    pub utilisation: f64,
    /// The least area for this segment alone (by strength), mm².
    #[serde(skip_serializing_if = "Option::is_none")]
    pub required_area_mm2: Option<f64>,
}

/// The result of a sizing; forces in the structure's force unit.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Sizing {
    /// `partial-factors` or `global-factor`.
    pub format: &'static str,
    /// The factors used.
    pub factors: FactorsOut,
    /// The material.
    pub material: MaterialOut,
    /// The force the size was chosen for.
    pub governing: Governing,
    /// The chosen size.
    pub size: Size,
    /// N_Rd of the chosen size.
    pub resistance: f64,
    /// The largest utilisation (of the governing force).
    pub utilisation: f64,
    /// Names of the segments whose utilisation exceeds 1.
    pub overloaded: Vec<String>,
    /// Each segment, left to right.
    pub segments: Vec<SegmentCheck>,
    /// Things the user should know.
    pub warnings: Vec<String>,
    /// The caution.
    pub caution: &'static str,
}

/// A segment to size: its name and axial force (tension positive).
#[derive(Clone, Debug, PartialEq)]
pub struct Member {
    /// Its name.
    pub name: String,
    /// Axial force, tension positive, in `unit`.
    pub force: f64,
}

/// Sizes the members of a funicular of `form`: `members` left to right,
/// `largest` the largest force magnitude along the profile (≥ each
/// member's), all in `unit`.
pub fn size(spec: &Spec, form: Form, members: &[Member], largest: f64, unit: ForceUnit) -> Result<Sizing, SizingError> {
    let safety = spec.safety.check()?;
    let to_n = unit.newtons();
    let gamma_f = safety.on_actions();
    let gamma_m = safety.on_resistance();
    let (segment, _) = members
        .iter()
        .enumerate()
        .fold((0, f64::NEG_INFINITY), |best, (k, m)| if m.force.abs() > best.1 { (k, m.force.abs()) } else { best });
    let largest = members.iter().map(|m| m.force.abs()).fold(largest.abs(), f64::max);
    let design = gamma_f * largest;
    let mut warnings = Vec::new();
    let (size, resistance, material) = match &spec.material {
        Material::Strength(s) => {
            let f = s.megapascals();
            let area = design * to_n * gamma_m / f;
            if form == Form::Arch {
                warnings.push(
                    "the arch's area is sized for its axial force alone: buckling and bending are not checked, so the area is a lower bound".to_string(),
                );
            }
            (
                Size::Area { area_mm2: area },
                design,
                MaterialOut::Strength { value: s.value, unit: s.unit, megapascals: f },
            )
        }
        Material::Catalogue(c) => {
            if form == Form::Arch {
                return Err(SizingError::Compression { file: c.file.clone() });
            }
            let mut rows: Vec<&Strand> = c.strands.iter().collect();
            rows.sort_by(|a, b| a.breaking_force.total_cmp(&b.breaking_force));
            let need = design * to_n;
            let chosen = rows.iter().find(|s| s.breaking_force / gamma_m >= need * (1.0 - SLACK)).copied();
            let strand = match chosen {
                Some(s) => s,
                None => {
                    let biggest = rows[rows.len() - 1];
                    warnings.push(format!(
                        "no size in {} carries the design force {} {unit}: the largest, {}, is shown and is overloaded; use several strands or a catalogue with larger sizes",
                        c.file,
                        fmt_num(design),
                        biggest.name
                    ));
                    biggest
                }
            };
            (
                Size::Catalogue {
                    name: strand.name.clone(),
                    breaking_force: strand.breaking_force / to_n,
                    area_mm2: strand.area_mm2,
                    diameter_mm: strand.diameter_mm,
                    mass_kg_per_m: strand.mass_kg_per_m,
                    line: strand.line,
                },
                strand.breaking_force / gamma_m / to_n,
                MaterialOut::Catalogue { file: c.file.clone(), sizes: c.strands.len() },
            )
        }
    };
    let segments: Vec<SegmentCheck> = members
        .iter()
        .map(|m| {
            let design_force = gamma_f * m.force.abs();
            SegmentCheck {
                name: m.name.clone(),
                force: m.force,
                design_force,
                utilisation: design_force / resistance,
                required_area_mm2: match &spec.material {
                    Material::Strength(s) => Some(design_force * to_n * gamma_m / s.megapascals()),
                    Material::Catalogue(_) => None,
                },
            }
        })
        .collect();
    let overloaded = segments.iter().filter(|s| s.utilisation > 1.0 + SLACK).map(|s| s.name.clone()).collect();
    let (format, factors) = match safety {
        Safety::Partial { action, resistance } => {
            ("partial-factors", FactorsOut { action: Some(action), resistance: Some(resistance), safety: None })
        }
        Safety::Global { factor } => {
            ("global-factor", FactorsOut { action: None, resistance: None, safety: Some(factor) })
        }
    };
    Ok(Sizing {
        format,
        factors,
        material,
        governing: Governing {
            segment,
            name: members.get(segment).map(|m| m.name.clone()).unwrap_or_default(),
            force: largest,
            design_force: design,
        },
        size,
        resistance,
        utilisation: design / resistance,
        overloaded,
        segments,
        warnings,
        caution: CAUTION,
    })
}

/// A few lines for the drawing's notes and the command's summary: the
/// chosen size, the largest utilisation, the factors.
#[must_use]
pub fn summary_lines(s: &Sizing, unit: ForceUnit) -> Vec<String> {
    let factors = match (s.factors.action, s.factors.resistance, s.factors.safety) {
        (Some(a), Some(r), _) => format!("action factor {}, resistance factor {}", fmt_num(a), fmt_num(r)),
        (_, _, Some(sf)) => format!("global safety factor {}", fmt_num(sf)),
        _ => String::new(),
    };
    let size = match &s.size {
        Size::Area { area_mm2 } => format!("least area {} mm2", fmt_3(*area_mm2)),
        Size::Catalogue { name, breaking_force, .. } => {
            format!("size {name} (breaking force {} {unit})", fmt_3(*breaking_force))
        }
    };
    let mut lines = vec![format!(
        "SIZING ({factors}): {size}; design force {} {unit}, resistance {} {unit}, largest utilisation {:.2}",
        fmt_3(s.governing.design_force),
        fmt_3(s.resistance),
        s.utilisation
    )];
    if !s.overloaded.is_empty() {
        lines.push(format!("OVERLOADED: {}", s.overloaded.join(", ")));
    }
    lines.push(CAUTION.to_string());
    lines
}

/// A number to about four significant figures, without trailing zeros.
fn fmt_3(v: f64) -> String {
    let digits = if v.abs() >= 1000.0 {
        0
    } else if v.abs() >= 100.0 {
        1
    } else if v.abs() >= 10.0 {
        2
    } else {
        3
    };
    let s = format!("{v:.digits$}");
    if s.contains('.') { s.trim_end_matches('0').trim_end_matches('.').to_string() } else { s }
}

#[cfg(test)]
mod tests;
