//! Hostile input: each gives a clear error, or a warning and a correct
//! result, in bounded time and memory, and never a damaged output.
//! The drawings are built here as text (R12 ASCII, the simplest form).

use std::fmt::Write as _;

use crate::util::{hangline, json, temp};

/// An R12 drawing with two supports, `loads` labelled vertical loads of
/// 10 kN over a 100 m span, and `extra` entities and blocks.
fn drawing(version: &str, blocks: &str, extra: &str, loads: usize) -> String {
    let mut e = String::new();
    e.push_str("0\nPOINT\n5\n10\n8\nSUPPORTS\n10\n0.0\n20\n0.0\n");
    e.push_str("0\nPOINT\n5\n11\n8\nSUPPORTS\n10\n100.0\n20\n0.0\n");
    let step = 100.0 / (loads + 1) as f64;
    for k in 1..=loads {
        let x = k as f64 * step;
        let _ = write!(e, "0\nLINE\n8\nLOADS\n10\n{x}\n20\n5.0\n11\n{x}\n21\n6.0\n");
        let _ = write!(e, "0\nTEXT\n8\nLOADS\n10\n{}\n20\n5.5\n40\n{}\n1\n10 kN\n", x + step * 0.1, step * 0.05);
    }
    e.push_str(extra);
    format!(
        "0\nSECTION\n2\nHEADER\n9\n$ACADVER\n1\n{version}\n9\n$HANDSEED\n5\n20\n9\n$INSUNITS\n70\n6\n0\nENDSEC\n\
0\nSECTION\n2\nTABLES\n0\nTABLE\n2\nLAYER\n70\n1\n0\nLAYER\n2\n0\n70\n0\n62\n7\n6\nCONTINUOUS\n0\nENDTAB\n0\nENDSEC\n\
0\nSECTION\n2\nBLOCKS\n{blocks}0\nENDSEC\n0\nSECTION\n2\nENTITIES\n{e}0\nENDSEC\n0\nEOF\n"
    )
}

fn block(name: &str, inner: &str) -> String {
    format!("0\nBLOCK\n8\n0\n2\n{name}\n70\n0\n10\n0.0\n20\n0.0\n{inner}0\nENDBLK\n8\n0\n")
}

fn insert(name: &str, x: f64) -> String {
    format!("0\nINSERT\n8\n0\n2\n{name}\n10\n{x}\n20\n0.0\n")
}

/// Solves `text` (written to a file) with a sag of 10 m; returns the run
/// and the report, if any.
fn solve(text: &str) -> (crate::util::Run, Option<serde_json::Value>) {
    let dir = temp();
    let input = dir.path().join("in.dxf");
    std::fs::write(&input, text).expect("write");
    let out = dir.path().join("out.dxf");
    let report = dir.path().join("r.json");
    let run = hangline(&[
        "solve",
        &input.display().to_string(),
        "-o",
        &out.display().to_string(),
        "--report",
        &report.display().to_string(),
        "--sag",
        "10",
        "-q",
    ]);
    let r = report.exists().then(|| json(&report));
    if r.is_some() {
        // A second run on the output must read it again.
        let again = hangline(&["inspect", &out.display().to_string()]);
        assert_eq!(again.code, Some(0), "the output reads again: {}", again.stderr);
    }
    (run, r)
}

#[test]
fn deeply_nested_and_self_referencing_blocks() {
    // A chain 300 blocks deep, a block that inserts itself, and two that
    // insert each other: extents are bounded, the result is correct.
    let mut blocks = String::new();
    blocks.push_str(&block("B0", "0\nLINE\n8\n0\n10\n0.0\n20\n0.0\n11\n1.0\n21\n1.0\n"));
    for k in 1..300 {
        blocks.push_str(&block(&format!("B{k}"), &insert(&format!("B{}", k - 1), 0.5)));
    }
    blocks.push_str(&block("SELF", &insert("SELF", 1.0)));
    blocks.push_str(&block("PING", &insert("PONG", 1.0)));
    blocks.push_str(&block("PONG", &insert("PING", 1.0)));
    let extra = [insert("B299", 10.0), insert("SELF", 20.0), insert("PING", 30.0)].concat();
    let (run, r) = solve(&drawing("AC1009", &blocks, &extra, 9));
    assert_eq!(run.code, Some(0), "{}", run.stderr);
    let r = r.expect("report");
    // Nine 10 kN loads every 10 m, sag 10 m at midspan: H = M(50)/f with
    // M(50) = 45·50 − 10·(40 + 30 + 20 + 10) = 1250 kNm, so H = 125 kN
    // (the moment relation of Beer & Johnston, §7.8–7.9).
    assert!((r["thrust"].as_f64().unwrap_or(0.0) - 125.0).abs() < 1e-9, "{}", r["thrust"]);
    assert!(r["checks"]["closed_form"].as_f64().is_some_and(|e| e <= 1e-9));
}

#[test]
fn many_loads_and_many_tiny_entities_on_the_loads_layer() {
    // 5,000 labelled loads and 50,000 stray points on LOADS.
    let mut extra = String::with_capacity(3_000_000);
    for k in 0..50_000 {
        let _ = write!(extra, "0\nPOINT\n8\nLOADS\n10\n{}\n20\n-5.0\n", f64::from(k) * 0.002);
    }
    let (run, r) = solve(&drawing("AC1009", "", &extra, 5_000));
    assert_eq!(run.code, Some(0), "{}", run.stderr);
    assert!(run.stderr.contains("50000 POINT passed over"), "{}", run.stderr);
    let r = r.expect("report");
    assert_eq!(r["nodes"].as_array().map(Vec::len), Some(5_002));
    assert!(r["checks"]["equilibrium"].as_f64().is_some_and(|e| e <= 1e-9));
}

#[test]
fn colliding_handles_get_no_new_collision() {
    // Two entities share handle 2F, and $HANDSEED (20) is below it.
    let extra = "0\nLINE\n5\n2F\n8\nGRID\n10\n0.0\n20\n-9.0\n11\n9.0\n21\n-9.0\n\
0\nLINE\n5\n2F\n8\nGRID\n10\n0.0\n20\n-8.0\n11\n9.0\n21\n-8.0\n";
    let dir = temp();
    let input = dir.path().join("in.dxf");
    std::fs::write(&input, drawing("AC1009", "", extra, 3)).expect("write");
    let out = dir.path().join("out.dxf");
    hangline(&["solve", &input.display().to_string(), "-o", &out.display().to_string(), "--sag", "10", "-q"]).ok();
    let text = std::fs::read_to_string(&out).expect("ascii");
    // Every handle the tool wrote is above 2F.
    let lines: Vec<&str> = text.lines().collect();
    let input_len = std::fs::read_to_string(&input).expect("ascii").lines().count();
    let mut new_handles = 0;
    for w in lines.windows(2) {
        if w[0].trim() == "5"
            && let Ok(h) = u64::from_str_radix(w[1].trim(), 16)
            && h != 0x2F
            && h > 0x11
        {
            assert!(h > 0x2F, "new handle {h:X} collides with the range in use");
            new_handles += 1;
        }
    }
    assert!(new_handles > 20 && lines.len() > input_len);
}

#[test]
fn nan_and_infinity_away_from_the_structure_are_ignored() {
    let extra = "0\nLINE\n8\nGRID\n10\nnan\n20\n0.0\n11\ninf\n21\n1e300\n";
    let (run, r) = solve(&drawing("AC1009", "", extra, 3));
    assert_eq!(run.code, Some(0), "{}", run.stderr);
    // The force diagram is placed by the finite extents, not at infinity.
    let at = &r.expect("report")["force_diagram"]["at"];
    assert!(at["x"].as_f64().is_some_and(|x| x.is_finite() && x < 1000.0), "{at}");
}

#[test]
fn infinity_on_a_load_line_is_an_error() {
    let extra = "0\nLINE\n5\n77\n8\nLOADS\n10\n50.0\n20\n-inf\n11\n50.0\n21\n1.0\n0\nTEXT\n8\nLOADS\n10\n50.5\n20\n0.5\n40\n0.2\n1\n5 kN\n";
    let (run, _) = solve(&drawing("AC1009", "", extra, 2));
    assert_eq!(run.code, Some(1));
    assert!(run.stderr.contains("entity 77") && run.stderr.contains("finite"), "{}", run.stderr);
}

#[test]
fn a_wrong_version_is_a_clear_error() {
    for v in ["AC1006", "AC9999", "hello"] {
        let (run, r) = solve(&drawing(v, "", "", 3));
        assert_eq!(run.code, Some(1), "{v}");
        assert!(r.is_none());
        assert!(run.stderr.contains(&format!("'{v}'")) && run.stderr.contains("R12 to R2018"), "{}", run.stderr);
    }
}
