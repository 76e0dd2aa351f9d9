//! Sizing checks. Published values name their source beside the check.

use super::*;

/// ASTM A416/A416M, *Standard Specification for Low-Relaxation, Seven-Wire
/// Steel Strand for Prestressed Concrete* (A416/A416M-17), Table 1,
/// Grade 1860 [270]: nominal diameter (mm), minimum breaking strength (kN),
/// steel area (mm²), mass (kg/1000 m).
const A416_GRADE_1860: &str = "\
# ASTM A416/A416M, Table 1, Grade 1860 [270] (published values)
name,breaking_force_kN,area_mm2,diameter_mm,mass_kg_per_m
9.53 mm,102.3,54.8,9.53,0.432
11.11 mm,137.9,74.2,11.11,0.582
12.70 mm,183.7,98.7,12.70,0.775
15.24 mm,260.7,140.0,15.24,1.102
";

fn members(forces: &[f64]) -> Vec<Member> {
    forces.iter().enumerate().map(|(k, f)| Member { name: format!("S{k}"), force: *f }).collect()
}

fn close(a: f64, b: f64, rel: f64) -> bool {
    (a - b).abs() <= rel * b.abs().max(1e-300)
}

fn partial(action: f64, resistance: f64) -> Safety {
    Safety::Partial { action, resistance }
}

#[test]
fn a416_strand_area_follows_from_its_grade_and_breaking_force() {
    // ASTM A416/A416M-17, §1.1: Grade 1860 has a minimum tensile strength
    // of 1860 MPa on the nominal area; Table 1: the 15.24 mm strand breaks
    // at no less than 260.7 kN and has 140.0 mm² of steel. With unit
    // factors the least area for 260.7 kN at 1860 MPa is 260.7e3/1860 =
    // 140.16 mm², the table's area to its rounding (0.2 %).
    let spec = Spec { material: Material::Strength(Strength::parse("1860 MPa").unwrap()), safety: partial(1.0, 1.0) };
    let s = size(&spec, Form::Cable, &members(&[260.7, 200.0]), 260.7, ForceUnit::Kilonewton).unwrap();
    let Size::Area { area_mm2 } = s.size else { panic!("an area") };
    assert!(close(area_mm2, 260.7e3 / 1860.0, 1e-12));
    assert!(close(area_mm2, 140.0, 2e-3), "{area_mm2}");
    // The same strand in the specification's inch-pound units: Grade 270,
    // 0.600 in, 58 600 lbf, 0.217 in² (same Table 1). 58.6 kip / 270 ksi
    // = 0.21704 in² = 140.02 mm².
    let spec = Spec { material: Material::Strength(Strength::parse("270 ksi").unwrap()), safety: partial(1.0, 1.0) };
    let s = size(&spec, Form::Cable, &members(&[58.6]), 58.6, ForceUnit::Kip).unwrap();
    let Size::Area { area_mm2 } = s.size else { panic!("an area") };
    assert!(close(area_mm2 / 645.16, 0.217, 1e-3), "{area_mm2}");
}

#[test]
fn catalogue_choice_under_en_1993_1_11_format() {
    // EN 1993-1-11:2006 (Eurocode 3, design of structures with tension
    // components), 6.3: F_Rd = F_uk / (1.5·γ_R) with γ_R = 0.90 — from
    // memory (the clause could not be checked here), so γ_M = 1.35.
    // EN 1990:2002, Table A1.2(B): γ_G = 1.35 on permanent actions — from
    // memory. Strand data: ASTM A416/A416M-17, Table 1 (above).
    //
    // N = 100 kN → N_Ed = 135 kN; a strand needs F_uk ≥ 1.35 × 135 =
    // 182.25 kN: the 11.11 mm strand (137.9 kN) does not do, the 12.70 mm
    // (183.7 kN) does, with N_Rd = 183.7/1.35 = 136.07 kN and a utilisation
    // of 135/136.07 = 0.9921.
    let c = Catalogue::parse(A416_GRADE_1860, "a416.csv").unwrap();
    assert_eq!(c.strands.len(), 4);
    let spec = Spec { material: Material::Catalogue(c), safety: partial(1.35, 1.35) };
    let s = size(&spec, Form::Cable, &members(&[80.0, 100.0, 90.0]), 100.0, ForceUnit::Kilonewton).unwrap();
    let Size::Catalogue { name, breaking_force, area_mm2, line, .. } = &s.size else { panic!("a strand") };
    assert_eq!(name, "12.70 mm");
    assert_eq!(*line, 5);
    assert!(close(*breaking_force, 183.7, 1e-12));
    assert_eq!(*area_mm2, Some(98.7));
    assert!(close(s.resistance, 183.7 / 1.35, 1e-12));
    assert!(close(s.utilisation, 135.0 / (183.7 / 1.35), 1e-12));
    assert!(close(s.utilisation, 0.9921, 1e-4));
    assert_eq!(s.governing.segment, 1);
    assert!(close(s.governing.design_force, 135.0, 1e-12));
    // Every segment: utilisation = γ_F·|N| / N_Rd.
    for (seg, n) in s.segments.iter().zip([80.0, 100.0, 90.0]) {
        assert!(close(seg.utilisation, 1.35 * n / (183.7 / 1.35), 1e-12));
    }
    assert!(s.overloaded.is_empty());
    assert_eq!(s.format, "partial-factors");
}

#[test]
fn a_size_whose_resistance_equals_the_force_is_enough() {
    // The 15.24 mm strand of ASTM A416/A416M-17, Table 1 (260.7 kN) at
    // exactly its breaking force, unit factors: it is chosen, utilisation 1.
    let c = Catalogue::parse(A416_GRADE_1860, "a416.csv").unwrap();
    let spec = Spec { material: Material::Catalogue(c), safety: partial(1.0, 1.0) };
    let s = size(&spec, Form::Cable, &members(&[260.7]), 260.7, ForceUnit::Kilonewton).unwrap();
    let Size::Catalogue { name, .. } = &s.size else { panic!("a strand") };
    assert_eq!(name, "15.24 mm");
    assert!(close(s.utilisation, 1.0, 1e-12));
    assert!(s.overloaded.is_empty());
}

#[test]
fn arch_area_by_yield_strength() {
    // EN 1993-1-1:2005, 6.2.4, eq. (6.10): N_c,Rd = A·f_y/γ_M0 for class 1–3
    // sections; γ_M0 = 1.00 recommended (6.1(1), note 2B) — from memory.
    // f_y = 355 MPa, S355 up to 40 mm (EN 1993-1-1, Table 3.1) — from memory.
    // N = −710 kN, γ_F = 1.35: A = 1.35 × 710e3 / 355 = 2700 mm².
    let spec = Spec { material: Material::Strength(Strength::parse("355 N/mm2").unwrap()), safety: partial(1.35, 1.0) };
    let s = size(&spec, Form::Arch, &members(&[-700.0, -710.0]), 710.0, ForceUnit::Kilonewton).unwrap();
    let Size::Area { area_mm2 } = s.size else { panic!("an area") };
    assert!(close(area_mm2, 2700.0, 1e-12));
    assert!(close(s.utilisation, 1.0, 1e-12));
    assert!(close(s.segments[0].utilisation, 700.0 / 710.0, 1e-12));
    assert!(close(s.segments[0].required_area_mm2.unwrap(), 1.35 * 700e3 / 355.0, 1e-12));
    assert!(s.warnings.iter().any(|w| w.contains("buckling")), "{:?}", s.warnings);
}

#[test]
fn a_catalogue_cannot_size_an_arch() {
    let c = Catalogue::parse(A416_GRADE_1860, "a416.csv").unwrap();
    let spec = Spec { material: Material::Catalogue(c), safety: partial(1.35, 1.35) };
    let e = size(&spec, Form::Arch, &members(&[-10.0]), 10.0, ForceUnit::Kilonewton).unwrap_err();
    assert!(e.to_string().contains("a416.csv") && e.to_string().contains("--strength"), "{e}");
}

#[test]
fn global_factor_of_safety() {
    // Utilisation = SF·N / F_uk (our own definition of the global format;
    // the factor 2.2 is invented for the test).
    let c = Catalogue::parse(A416_GRADE_1860, "a416.csv").unwrap();
    let spec = Spec { material: Material::Catalogue(c), safety: Safety::Global { factor: 2.2 } };
    let s = size(&spec, Form::Cable, &members(&[60.0, 50.0]), 60.0, ForceUnit::Kilonewton).unwrap();
    // 2.2 × 60 = 132 kN ≤ 137.9 kN: the 11.11 mm strand.
    let Size::Catalogue { name, .. } = &s.size else { panic!("a strand") };
    assert_eq!(name, "11.11 mm");
    assert!(close(s.utilisation, 2.2 * 60.0 / 137.9, 1e-12));
    assert!(close(s.governing.design_force, 60.0, 1e-12));
    assert_eq!(s.format, "global-factor");
    assert_eq!(s.factors.safety, Some(2.2));
}

#[test]
fn the_largest_force_along_the_profile_governs() {
    // With continuous loads the force at a support exceeds every segment's.
    let spec = Spec { material: Material::Strength(Strength::parse("1000 MPa").unwrap()), safety: partial(1.0, 1.0) };
    let s = size(&spec, Form::Cable, &members(&[90.0, 95.0]), 100.0, ForceUnit::Kilonewton).unwrap();
    let Size::Area { area_mm2 } = s.size else { panic!("an area") };
    assert!(close(area_mm2, 100.0, 1e-12));
    assert!(close(s.segments[1].utilisation, 0.95, 1e-12));
}

#[test]
fn too_small_a_catalogue_shows_its_largest_size_as_overloaded() {
    let c = Catalogue::parse(A416_GRADE_1860, "a416.csv").unwrap();
    let spec = Spec { material: Material::Catalogue(c), safety: partial(1.0, 1.0) };
    let s = size(&spec, Form::Cable, &members(&[300.0, 200.0]), 300.0, ForceUnit::Kilonewton).unwrap();
    let Size::Catalogue { name, .. } = &s.size else { panic!("a strand") };
    assert_eq!(name, "15.24 mm");
    assert_eq!(s.overloaded, vec!["S0".to_string()]);
    assert!(s.utilisation > 1.0);
    assert!(s.warnings[0].contains("a416.csv"), "{:?}", s.warnings);
    assert!(summary_lines(&s, ForceUnit::Kilonewton).iter().any(|l| l.starts_with("OVERLOADED")));
}

#[test]
fn units_in_a_column_and_in_the_header() {
    let text = "Name,Breaking_Force,Force_Unit,Area_in2\nA,20,kip,0.1\nB,100,kN,\n";
    let c = Catalogue::parse(text, "c.csv").unwrap();
    assert!(close(c.strands[0].breaking_force, 20.0 * 4_448.221_615_260_5, 1e-12));
    assert!(close(c.strands[0].area_mm2.unwrap(), 64.516, 1e-12));
    assert_eq!(c.strands[1].area_mm2, None);
    assert_eq!(c.strands[1].breaking_force, 100e3);
    let text = "name,breaking_force_MN,diameter_in,mass_lb_per_ft,supplier\nX,1.5,1,1,acme\n";
    let c = Catalogue::parse(text, "c.csv").unwrap();
    assert_eq!(c.strands[0].breaking_force, 1.5e6);
    assert_eq!(c.strands[0].diameter_mm, Some(25.4));
    // 1 lb/ft = 0.45359237 kg / 0.3048 m = 1.488 164 kg/m.
    assert!(close(c.strands[0].mass_kg_per_m.unwrap(), 1.488_164, 1e-6));
}

#[test]
fn catalogue_errors_name_the_file_line_and_column() {
    let cases: [(&str, &str); 9] = [
        ("breaking_force_kN\n10\n", "c.csv, line 1: the header has no 'name' column"),
        ("name,area_mm2\nA,10\n", "c.csv, line 1: the header has no breaking force column"),
        ("name,breaking_force\nA,10\n", "c.csv, line 1, column 'breaking_force': no 'force_unit' column"),
        ("name,breaking_force_kg\nA,10\n", "c.csv, line 1, column 'breaking_force_kg': 'kg' is not a force unit"),
        ("name,breaking_force_kN\nA,10\nB,abc\n", "c.csv, line 3, column 'breaking_force_kN': 'abc' is not a number"),
        (
            "name,breaking_force_kN\n# comment\nA,-10\n",
            "c.csv, line 3, column 'breaking_force_kN': the breaking force must be a positive number",
        ),
        ("name,breaking_force_kN,area_mm2\nA,10,1\nB,20\n", "c.csv, line 3: 2 field(s) where the header has 3"),
        ("name,breaking_force_kN\n", "c.csv: lists no sizes"),
        (
            "name,breaking_force_kN,area_mm2,area_in2\nA,1,1,1\n",
            "c.csv, line 1: the columns area_mm2, area_cm2, area_in2 say the same thing",
        ),
    ];
    for (text, start) in cases {
        let e = Catalogue::parse(text, "c.csv").unwrap_err().to_string();
        assert!(e.starts_with(start), "{text:?}: {e}");
        assert!(!e.contains('\n'), "{e}");
    }
    let e = Catalogue::parse("name,breaking_force_kN\n,10\n", "c.csv").unwrap_err().to_string();
    assert!(e.starts_with("c.csv, line 2, column 'name': the size has no name"), "{e}");
    let e = Catalogue::parse("name,breaking_force,force_unit\nA,10,kg\n", "c.csv").unwrap_err().to_string();
    assert!(e.starts_with("c.csv, line 2, column 'force_unit': 'kg' is not a force unit"), "{e}");
}

#[test]
fn strengths_and_factors() {
    let s = Strength::parse("270 ksi").unwrap();
    // 270 ksi = 1861.58 MPa; A416 rounds it to 1860 (ASTM A416/A416M-17, §1.1).
    assert!(close(s.megapascals(), 1861.584, 1e-6));
    assert_eq!(Strength::parse("1.86 GPa").unwrap().megapascals(), 1860.0);
    for bad in ["1860", "abc MPa", "-5 MPa", "0 MPa", "1860 mpa", "1860 kN"] {
        assert!(Strength::parse(bad).is_err(), "{bad}");
    }
    assert!(Strength::parse("1860").unwrap_err().to_string().contains("give its unit"));
    assert!(partial(0.0, 1.0).check().is_err());
    assert!(partial(1.35, f64::NAN).check().is_err());
    assert!(Safety::Global { factor: 1e3 }.check().is_err());
    assert!(Safety::Global { factor: 2.5 }.check().is_ok());
}

#[test]
fn summary_lines_carry_the_size_and_the_caution() {
    let c = Catalogue::parse(A416_GRADE_1860, "a416.csv").unwrap();
    let spec = Spec { material: Material::Catalogue(c), safety: partial(1.35, 1.35) };
    let s = size(&spec, Form::Cable, &members(&[100.0]), 100.0, ForceUnit::Kilonewton).unwrap();
    let lines = summary_lines(&s, ForceUnit::Kilonewton);
    assert!(lines[0].contains("size 12.70 mm") && lines[0].contains("utilisation 0.99"), "{lines:?}");
    assert_eq!(lines.last().map(String::as_str), Some(CAUTION));
}
