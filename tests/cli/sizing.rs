//! Member sizing on the command line: the report's keys, utilisation =
//! design force / resistance, the catalogue's units, and refusals.

use serde_json::Value;

use crate::util::{fixture, hangline, json, temp};

/// Solves `drawing` with `args` and returns the report's `sizing` and the
/// whole report.
fn sized(drawing: &str, args: &[&str]) -> (Value, Value) {
    let dir = temp();
    let out = dir.path().join("out.dxf");
    let report = dir.path().join("out.json");
    let mut all: Vec<String> = vec!["solve".into(), fixture(drawing).display().to_string()];
    all.extend(["-o".into(), out.display().to_string(), "--report".into(), report.display().to_string()]);
    all.extend(args.iter().map(|s| s.to_string()));
    let run = hangline(&all).ok();
    assert!(run.stdout.contains("sized   SIZING"), "{}", run.stdout);
    let r = json(&report);
    let drawn = std::fs::read_to_string(&out).expect("the output");
    assert!(drawn.contains("SIZING ("), "the sizing is in the drawing's notes");
    assert!(drawn.contains("the design code in force governs"), "the caution is in the drawing's notes");
    (r["sizing"].clone(), r)
}

fn num(v: &Value) -> f64 {
    v.as_f64().unwrap_or_else(|| panic!("a number: {v}"))
}

fn close(a: f64, b: f64, rel: f64) -> bool {
    (a - b).abs() <= rel * b.abs()
}

#[test]
fn a_catalogue_sizes_the_cable_and_every_segment_has_its_utilisation() {
    // fixtures/strands-a416-1860.csv holds ASTM A416/A416M-17, Table 1,
    // Grade 1860 strands. The B&J 7.116 cable (lb, ft) with a global factor
    // of 2.5 (invented for the test) needs a breaking force of 2.5 × its
    // largest force, well under the smallest strand: the 9.53 mm strand,
    // whose 102.3 kN the same table gives as 23 000 lbf.
    let (s, r) = sized(
        "bj7116-ft-r2000.dxf",
        &[
            "--through",
            "4,-3.6",
            "--catalogue",
            &fixture("strands-a416-1860.csv").display().to_string(),
            "--safety-factor",
            "2.5",
        ],
    );
    assert_eq!(s["format"], "global-factor");
    assert_eq!(s["factors"]["safety"], 2.5);
    assert_eq!(s["material"]["kind"], "catalogue");
    assert_eq!(s["material"]["sizes"], 4);
    assert_eq!(s["size"]["name"], "A416 9.53 mm");
    assert_eq!(s["size"]["line"], 5);
    assert_eq!(s["size"]["area_mm2"], 54.8);
    assert!(close(num(&s["size"]["breaking_force"]), 23_000.0, 2e-4), "{}", s["size"]);
    let resistance = num(&s["resistance"]);
    assert!(close(resistance, num(&s["size"]["breaking_force"]) / 2.5, 1e-12));
    // The governing force is the report's largest force.
    assert!(close(num(&s["governing"]["force"]), num(&r["max_force"]["value"]), 1e-12));
    assert_eq!(s["governing"]["name"], r["max_force"]["name"]);
    let segments = s["segments"].as_array().expect("segments");
    assert_eq!(segments.len(), r["segments"].as_array().expect("segments").len());
    for (seg, rs) in segments.iter().zip(r["segments"].as_array().expect("segments")) {
        assert_eq!(seg["name"], rs["name"]);
        assert!(close(num(&seg["design_force"]), num(&rs["force"]).abs(), 1e-12));
        assert!(close(num(&seg["utilisation"]), num(&seg["design_force"]) / resistance, 1e-12));
    }
    assert!(close(num(&s["utilisation"]), num(&s["governing"]["design_force"]) / resistance, 1e-12));
    assert_eq!(s["overloaded"], Value::Array(vec![]));
    assert!(s["caution"].as_str().is_some_and(|c| c.contains("code in force governs")));
}

#[test]
fn a_strength_gives_the_least_area_with_partial_factors() {
    // A = γ_F·N·γ_M / f_uk (EN 1993-1-1:2005, 6.2.3, eq. (6.6) in form), with
    // f_uk = 1860 MPa (ASTM A416/A416M-17, §1.1, Grade 1860) and the
    // factors 1.35 and 1.35 (EN 1990 γ_G and EN 1993-1-11 1.5·γ_R, both from
    // memory). Forces in kN: A [mm²] = 1.35 × 1.35 × N × 1000 / 1860.
    let (s, r) = sized(
        "footbridge-m-r2018.dxf",
        &["--sag", "6", "--strength", "1860 MPa", "--action-factor", "1.35", "--resistance-factor", "1.35"],
    );
    assert_eq!(s["format"], "partial-factors");
    assert_eq!(s["material"]["kind"], "strength");
    assert_eq!(s["material"]["megapascals"], 1860.0);
    let n = num(&r["max_force"]["value"]);
    let area = num(&s["size"]["area_mm2"]);
    assert!(close(area, 1.35 * 1.35 * n * 1000.0 / 1860.0, 1e-12), "{area}");
    assert!(close(num(&s["governing"]["design_force"]), 1.35 * n, 1e-12));
    assert!(close(num(&s["utilisation"]), 1.0, 1e-12));
    for seg in s["segments"].as_array().expect("segments") {
        assert!(close(num(&seg["utilisation"]), num(&seg["design_force"]) / num(&s["resistance"]), 1e-12));
        assert!(num(&seg["required_area_mm2"]) <= area * (1.0 + 1e-12));
    }
}

#[test]
fn too_small_a_catalogue_reports_the_overloaded_segments() {
    // The footbridge's forces (about 250 to 280 kN) exceed the largest
    // A416 strand (260.7 kN, ASTM A416/A416M-17, Table 1) in some segments.
    let (s, _) = sized(
        "footbridge-m-r2018.dxf",
        &[
            "--sag",
            "6",
            "--catalogue",
            &fixture("strands-a416-1860.csv").display().to_string(),
            "--action-factor",
            "1",
            "--resistance-factor",
            "1",
        ],
    );
    assert_eq!(s["size"]["name"], "A416 15.24 mm");
    let over = s["overloaded"].as_array().expect("overloaded");
    assert!(!over.is_empty());
    for seg in s["segments"].as_array().expect("segments") {
        let listed = over.contains(&seg["name"]);
        assert_eq!(listed, num(&seg["utilisation"]) > 1.0, "{seg}");
    }
    assert!(s["warnings"][0].as_str().is_some_and(|w| w.contains("no size in")));
}

/// Runs `solve` expecting a one-line refusal; returns it.
fn refused(drawing: &str, args: &[&str]) -> String {
    let dir = temp();
    let out = dir.path().join("out.dxf");
    let mut all: Vec<String> = vec!["solve".into(), fixture(drawing).display().to_string()];
    all.extend(["-o".into(), out.display().to_string()]);
    all.extend(args.iter().map(|s| s.to_string()));
    let run = hangline(&all);
    assert_eq!(run.code, Some(1), "{}", run.stderr);
    assert!(!out.exists());
    let lines: Vec<&str> = run.stderr.lines().collect();
    assert_eq!(lines.len(), 1, "{}", run.stderr);
    lines[0].to_string()
}

#[test]
fn contradictions_and_bad_catalogues_are_refused() {
    let cat = fixture("strands-a416-1860.csv").display().to_string();
    let m = refused(
        "footbridge-m-r2018.dxf",
        &["--sag", "6", "--catalogue", &cat, "--safety-factor", "2", "--action-factor", "1.35"],
    );
    assert!(m.contains("--safety-factor") && m.contains("either"), "{m}");
    let m = refused(
        "footbridge-m-r2018.dxf",
        &["--sag", "6", "--strength", "1860 MPa", "--catalogue", &cat, "--safety-factor", "2"],
    );
    assert!(m.contains("keep one"), "{m}");
    let m = refused("footbridge-m-r2018.dxf", &["--sag", "6", "--strength", "1860 MPa"]);
    assert!(m.contains("--action-factor") && m.contains("--safety-factor"), "{m}");
    let m = refused("footbridge-m-r2018.dxf", &["--sag", "6", "--safety-factor", "2"]);
    assert!(m.contains("nothing to size"), "{m}");
    let m = refused("footbridge-m-r2018.dxf", &["--sag", "6", "--strength", "1860", "--safety-factor", "2"]);
    assert!(m.contains("--strength") && m.contains("unit"), "{m}");
    let m = refused("arch-m-r12.dxf", &["--arch", "--rise", "10", "--catalogue", &cat, "--safety-factor", "2"]);
    assert!(m.contains("no compression") && m.contains("--strength"), "{m}");
    let dir = temp();
    let bad = dir.path().join("bad.csv");
    std::fs::write(&bad, "name,breaking_force_kN\nS1,100\nS2,lots\n").expect("write");
    let m = refused(
        "footbridge-m-r2018.dxf",
        &["--sag", "6", "--catalogue", &bad.display().to_string(), "--safety-factor", "2"],
    );
    assert!(m.contains("bad.csv, line 3, column 'breaking_force_kN'") && m.contains("'lots' is not a number"), "{m}");
    let m = refused(
        "footbridge-m-r2018.dxf",
        &["--sag", "6", "--catalogue", &dir.path().join("missing.csv").display().to_string(), "--safety-factor", "2"],
    );
    assert!(m.contains("cannot read the catalogue") && m.contains("missing.csv"), "{m}");
}
