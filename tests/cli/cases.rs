//! Solving the fixture drawings: the expectation files' cases, a published
//! worked example end to end, every condition type, and the closed form.

use serde_json::Value;

use crate::util::{case_args, close, expectations, fixture, hangline, json, read_args, temp};

/// Runs `solve` on a fixture with extra arguments and returns the report.
pub fn solve_report(name: &str, read: &[String], args: &[String]) -> Value {
    let dir = temp();
    let out = dir.path().join("out.dxf");
    let report = dir.path().join("report.json");
    let mut all: Vec<String> = vec!["solve".into(), fixture(&format!("{name}.dxf")).display().to_string()];
    all.extend(["-o".into(), out.display().to_string(), "--report".into(), report.display().to_string(), "-q".into()]);
    all.extend(read.iter().cloned());
    all.extend(args.iter().cloned());
    hangline(&all).ok();
    json(&report)
}

fn xy(v: &Value) -> (f64, f64) {
    match v {
        Value::Array(a) => (a[0].as_f64().unwrap_or(f64::NAN), a[1].as_f64().unwrap_or(f64::NAN)),
        _ => (v["x"].as_f64().unwrap_or(f64::NAN), v["y"].as_f64().unwrap_or(f64::NAN)),
    }
}

/// The nodes a report gives.
fn nodes(r: &Value) -> Vec<(f64, f64)> {
    r["nodes"].as_array().expect("nodes").iter().map(xy).collect()
}

/// The closed form of a funicular under vertical loads: the ordinate below
/// the chord is M(x)/H, M the simple-beam moment of the same loads over the
/// same span (Beer & Johnston, *Vector Mechanics for Engineers: Statics*,
/// §7.8–7.9, Prob. 7.114, "general cable theorem"); an arch stands M(x)/H
/// above its chord. Computed here from the report's loads and supports
/// alone, and compared with every node.
fn closed_form_error(r: &Value) -> f64 {
    let n = nodes(r);
    let (xl, yl) = n[0];
    let (xr, yr) = n[n.len() - 1];
    let span = xr - xl;
    let h = r["thrust"].as_f64().expect("thrust");
    let sign = if r["structure"] == "cable" { 1.0 } else { -1.0 };
    let loads: Vec<(f64, f64)> = r["loads"]
        .as_array()
        .expect("loads")
        .iter()
        .map(|l| (xy(&l["node"]).0, -l["force"]["y"].as_f64().expect("force")))
        .collect();
    let total_moment_about_right: f64 = loads.iter().map(|(x, w)| w * (xr - x)).sum();
    let left_reaction = total_moment_about_right / span;
    let moment = |x: f64| {
        left_reaction * (x - xl) - loads.iter().filter(|(xi, _)| *xi < x).map(|(xi, w)| w * (x - xi)).sum::<f64>()
    };
    n.iter()
        .map(|&(x, y)| {
            let chord = yl + (yr - yl) * (x - xl) / span;
            ((y - (chord - sign * moment(x) / h)) / span).abs()
        })
        .fold(0.0, f64::max)
}

fn all_vertical(r: &Value) -> bool {
    r["loads"].as_array().expect("loads").iter().all(|l| l["force"]["x"].as_f64() == Some(0.0))
}

/// Compares a report with an expectation case.
fn compare(name: &str, r: &Value, case: &Value) {
    let e = &case["expect"];
    let tol = &case["tolerance"];
    let rel = tol["relative"].as_f64().unwrap_or(1e-6);
    let la = tol["length_absolute"].as_f64().unwrap_or(1e-6);
    let fa = tol["force_absolute"].as_f64().unwrap_or(1e-4);
    let what = format!("{name} {}", case["args"]);
    assert_eq!(r["structure"], e["form"], "{what}");
    let h = r["thrust"].as_f64().expect("thrust");
    assert!(close(h, e["thrust"].as_f64().expect("thrust"), rel, fa), "{what}: thrust {h} vs {}", e["thrust"]);
    let got = nodes(r);
    let want: Vec<(f64, f64)> = e["nodes"].as_array().expect("nodes").iter().map(xy).collect();
    assert_eq!(got.len(), want.len(), "{what}: node count");
    for (g, w) in got.iter().zip(&want) {
        assert!(close(g.0, w.0, rel, la) && close(g.1, w.1, rel, la), "{what}: node {g:?} vs {w:?}");
    }
    let key = if e["form"] == "arch" { "rise" } else { "sag" };
    let sag = r[key]["value"].as_f64().expect("sag");
    assert!(close(sag, e[key]["value"].as_f64().expect("sag"), rel, la), "{what}: {key} {sag}");
    let forces: Vec<f64> =
        r["segments"].as_array().expect("segments").iter().map(|s| s["force"].as_f64().unwrap_or(0.0)).collect();
    for (f, w) in forces.iter().zip(e["segment_force_magnitudes"].as_array().expect("forces")) {
        let w = w.as_f64().expect("force");
        assert!(close(f.abs(), w, rel, fa), "{what}: force {f} vs {w}");
        // Tension positive: a cable pulls, an arch pushes.
        assert_eq!(*f > 0.0, e["form"] == "cable", "{what}: sign of {f}");
    }
    let mf = r["max_force"]["value"].as_f64().expect("max force");
    assert!(close(mf, e["max_force"].as_f64().expect("max"), rel, fa), "{what}: max force");
    for (side, w) in e["reactions"].as_array().expect("reactions").iter().enumerate() {
        let g = xy(&r["supports"][side]["reaction"]);
        let w = xy(w);
        assert!(close(g.0, w.0, rel, fa) && close(g.1, w.1, rel, fa), "{what}: reaction {g:?} vs {w:?}");
    }
    let len = r["length"].as_f64().expect("length");
    assert!(close(len, e["length"].as_f64().expect("length"), rel, la), "{what}: length");
    if let Some(towers) = e["towers"].as_array() {
        let got = r["towers"].as_array().expect("towers");
        assert_eq!(got.len(), towers.len(), "{what}: towers");
        for (g, w) in got.iter().zip(towers) {
            assert_eq!(g["side"], w["side"], "{what}");
            let (gh, wh) = (g["height"].as_f64().expect("height"), w["height"].as_f64().expect("height"));
            assert!(close(gh, wh, rel, la), "{what}: tower height {gh} vs {wh}");
        }
    }
}

/// Every case of every expectation file: the tool's report agrees with the
/// independently computed expectation (tools/fixtures/statics.py, which
/// solves node equilibrium by Newton's method) within the file's tolerance.
#[test]
fn expectation_cases() {
    let mut count = 0;
    for (name, e) in expectations() {
        for case in e["cases"].as_array().into_iter().flatten() {
            let r = solve_report(&name, &read_args(&e), &case_args(&case["args"]));
            compare(&name, &r, case);
            if all_vertical(&r) {
                let err = closed_form_error(&r);
                assert!(err <= 1e-9, "{name} {}: closed form off by {err:e} of the span", case["args"]);
            }
            count += 1;
        }
    }
    assert!(count >= 25, "only {count} cases ran");
}

/// Beer & Johnston, *Vector Mechanics for Engineers: Statics*, Prob. 7.116
/// (editions 8–10): span 8 ft; 360, 720 and 240 lb at x = 2, 4, 6 ft; the
/// right support 2.4 ft below the left; the cable passes 3.6 ft below the
/// left support at x = 4 ft. Book answers: depths 2.22 ft and 3.28 ft at
/// x = 2 and 6 ft; H = M(4)/2.4 = 850 lb follows. Read from the drawing in
/// R12 (ASCII and binary, feet given with --units) and R2000 (ASCII and
/// binary, feet from $INSUNITS).
#[test]
fn beer_johnston_7_116_end_to_end() {
    for (name, read) in [
        ("bj7116-ft-r2000", vec![]),
        ("bj7116-ft-r2000-bin", vec![]),
        ("bj7116-ft-r12", vec!["--units".to_string(), "ft".to_string()]),
        ("bj7116-ft-r12-bin", vec!["--units".to_string(), "ft".to_string()]),
    ] {
        let r = solve_report(name, &read, &["--through".into(), "4,-3.6".into()]);
        assert_eq!(r["units"]["length"], "ft", "{name}");
        assert_eq!(r["units"]["force"], "lbf", "{name}");
        let h = r["thrust"].as_f64().expect("thrust");
        assert!((h - 850.0).abs() <= 850.0 * 1e-9, "{name}: H = {h}");
        let n = nodes(&r);
        // Depths below the left support, to the book's three figures.
        assert_eq!(format!("{:.2}", n[0].1 - n[1].1), "2.22", "{name}");
        assert_eq!(format!("{:.2}", n[0].1 - n[3].1), "3.28", "{name}");
        // And exactly: 189/85 and 279/85 ft from M(x)/H (common practice).
        assert!((n[0].1 - n[1].1 - 189.0 / 85.0).abs() < 1e-12, "{name}");
        assert!((n[0].1 - n[3].1 - 279.0 / 85.0).abs() < 1e-12, "{name}");
    }
}

/// Equal loads P at equal spacing s with the sag f taken at the middle
/// vertex lie on the parabola of the uniform load w = P/s, with
/// H = wL²/(8f): T. G. Hicks (ed.), *Civil Engineering Formulas*, ch. 10,
/// eq. 10.57 (the discrete case: common practice, no source). The fixture
/// (millimetres) has 7 × 50 kN every 3000 mm on a 24000 mm span.
#[test]
fn parabola_thrust_wl2_over_8f() {
    for name in ["parabola-mm-r2013", "parabola-mm-r2013-bin"] {
        let r = solve_report(name, &[], &["--sag".into(), "2400".into()]);
        let (w, l, f) = (50.0 / 3000.0, 24000.0, 2400.0);
        let h = r["thrust"].as_f64().expect("thrust");
        assert!((h - w * l * l / (8.0 * f)).abs() <= 1e-9 * h, "{name}: H = {h}");
        // Every vertex on y = y_L − 4f·x(L − x)/L².
        let n = nodes(&r);
        let (x0, y0) = n[0];
        for (x, y) in &n {
            let u = x - x0;
            assert!((y - (y0 - 4.0 * f * u * (l - u) / (l * l))).abs() <= 1e-9 * l, "{name}: node ({x}, {y})");
        }
    }
}

/// Every condition type reaches the same funicular, on drawings in every
/// version and unit: taking the thrust, the largest force and a node of a
/// solution found by its sag as conditions gives it back; `--level-at`
/// makes its segment level. Every result also agrees with the closed form.
#[test]
fn every_condition_type_agrees() {
    let fixtures = [
        ("footbridge-m-r2018", 4.5, false),
        ("footbridge-m-r2018-bin", 4.5, false),
        ("footbridge-mm-r2013", 4500.0, false),
        ("parabola-mm-r2013", 2400.0, false),
        ("bj7116-ft-r2000", 2.4, false),
        ("bj7116-ft-r12", 2.4, false),
        ("arch-m-r12", 10.0, true),
    ];
    let expect = expectations();
    for (name, sag, arch) in fixtures {
        let e = &expect.iter().find(|(n, _)| n == name).expect("expectation").1;
        let read = read_args(e);
        let form: Vec<String> = if arch { vec!["--arch".into()] } else { vec![] };
        let with = |extra: &[String]| {
            let mut a = form.clone();
            a.extend(extra.iter().cloned());
            solve_report(name, &read, &a)
        };
        let key = if arch { "--rise" } else { "--sag" };
        let base = with(&[key.into(), sag.to_string()]);
        let base_nodes = nodes(&base);
        let span = base["span"].as_f64().expect("span");
        let same = |r: &Value, what: &str| {
            for (a, b) in nodes(r).iter().zip(&base_nodes) {
                assert!((a.1 - b.1).abs() <= 1e-9 * span, "{name} {what}: {a:?} vs {b:?}");
            }
            let err = closed_form_error(r);
            assert!(err <= 1e-9, "{name} {what}: closed form off by {err:e}");
        };
        same(&base, key);
        let h = base["thrust"].as_f64().expect("thrust");
        same(&with(&["--thrust".into(), format!("{h:.17}")]), "--thrust");
        let mid = base_nodes[base_nodes.len() / 2];
        same(&with(&["--through".into(), format!("{:.17},{:.17}", mid.0, mid.1)]), "--through");
        let t = base["max_force"]["value"].as_f64().expect("max force");
        let by_force = with(&["--max-force".into(), format!("{t:.17}")]);
        if by_force["warnings"].as_array().is_none_or(|w| w.is_empty()) {
            same(&by_force, "--max-force");
        } else {
            // Two funiculars carry that force; the shallower was taken.
            assert!(by_force["thrust"].as_f64().expect("thrust") >= h * (1.0 - 1e-9), "{name}");
        }
        // Level in a segment: with both supports fixed this sets H = Q/slope
        // of the chord (Q the beam shear there), so only segments where the
        // shear has the chord's sense can be level; try each.
        let mut levelled = 0;
        for k in 1..base_nodes.len() - 2 {
            let level_x = (base_nodes[k].0 + base_nodes[k + 1].0) / 2.0;
            let mut args: Vec<String> = form.clone();
            args.extend(["--level-at".to_string(), level_x.to_string()]);
            let dir = temp();
            let report = dir.path().join("r.json");
            let mut all: Vec<String> = vec!["solve".into(), fixture(&format!("{name}.dxf")).display().to_string()];
            all.extend(["-o".into(), dir.path().join("o.dxf").display().to_string(), "-q".into()]);
            all.extend(["--report".into(), report.display().to_string()]);
            all.extend(read.iter().cloned());
            all.extend(args);
            let run = hangline(&all);
            if run.code != Some(0) {
                assert!(run.stderr.contains("--level-at"), "{name}: {}", run.stderr);
                continue;
            }
            let level = json(&report);
            let ln = nodes(&level);
            assert!(
                (ln[k].1 - ln[k + 1].1).abs() <= 1e-9 * span,
                "{name}: --level-at {level_x} gave {:?} {:?}",
                ln[k],
                ln[k + 1]
            );
            assert!(closed_form_error(&level) <= 1e-9, "{name} --level-at");
            assert_eq!(level["conditions"].as_array().map(Vec::len), Some(3), "{name}");
            levelled += 1;
        }
        let inclined_chord = (base_nodes[0].1 - base_nodes[base_nodes.len() - 1].1).abs() > 1e-9 * span;
        assert!(!inclined_chord || levelled > 0, "{name}: no segment could be levelled");
    }
}

/// Loads given as blocks with an attribute, one of them rotated: the
/// attribute value is the magnitude, the rotation turns the line of action.
#[test]
fn block_loads_are_read_with_their_attributes() {
    let r = solve_report("blockloads-m-r2018", &[], &["--sag".into(), "3.5".into()]);
    let loads = r["loads"].as_array().expect("loads");
    let mags: Vec<f64> = loads.iter().map(|l| l["magnitude"].as_f64().expect("magnitude")).collect();
    assert!(mags.contains(&50.0), "0.05 MN read as 50 kN: {mags:?}");
    assert!(loads.iter().any(|l| l["force"]["x"].as_f64() != Some(0.0)), "the rotated block's load is inclined");
    assert!(r["checks"]["equilibrium"].as_f64().expect("check") <= 1e-9);
}

/// One invented cable drawn by ezdxf in R12, R2000, R2013 and R2018, each in
/// metres and millimetres (anchors at different heights, unequal loads at
/// unequal spacing): every condition type solves on every one of the eight,
/// agrees with the closed form y = chord(x) − M(x)/H to 1e-9 of the span
/// (Beer & Johnston, *Vector Mechanics for Engineers: Statics*, §7.9), and
/// the eight give the same answer (millimetres = metres × 1000).
#[test]
fn every_version_and_unit_gives_the_same_funicular() {
    let expect = expectations();
    let mut seen = std::collections::BTreeSet::new();
    let mut kinds = std::collections::BTreeSet::new();
    let mut reference: Vec<Vec<(f64, f64, f64)>> = Vec::new();
    for (name, e) in expect.iter().filter(|(n, _)| n.starts_with("hollinyard-")) {
        let scale: f64 = match e["units"]["intended_length"].as_str() {
            Some("m") => 1.0,
            Some("mm") => 1e-3,
            other => panic!("{name}: unit {other:?}"),
        };
        seen.insert((e["dxf_version"].as_str().unwrap_or_default().to_string(), scale.to_bits()));
        let cases = e["cases"].as_array().expect("cases");
        let mut results = Vec::new();
        for case in cases {
            let args = case_args(&case["args"]);
            kinds.extend(args.iter().filter(|a| a.starts_with("--")).cloned());
            let r = solve_report(name, &read_args(e), &args);
            let err = closed_form_error(&r);
            assert!(err <= 1e-9, "{name} {}: closed form off by {err:e} of the span", case["args"]);
            let h = r["thrust"].as_f64().expect("thrust");
            results.push(nodes(&r).into_iter().map(|(x, y)| (x * scale, y * scale, h)).collect::<Vec<_>>());
        }
        if reference.is_empty() {
            reference = results;
            continue;
        }
        for (got, want) in results.iter().flatten().zip(reference.iter().flatten()) {
            assert!((got.0 - want.0).abs() <= 1e-9 * 36.0, "{name}: {got:?} vs {want:?}");
            assert!((got.1 - want.1).abs() <= 1e-9 * 36.0, "{name}: {got:?} vs {want:?}");
            assert!((got.2 - want.2).abs() <= 1e-9 * want.2, "{name}: H {} vs {}", got.2, want.2);
        }
    }
    assert_eq!(seen.len(), 8, "four versions × two units expected: {seen:?}");
    for k in ["--sag", "--thrust", "--through", "--max-force", "--level-at", "--arch", "--rise"] {
        assert!(kinds.contains(k), "no case uses {k}");
    }
}
