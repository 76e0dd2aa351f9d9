//! Design alternatives: a condition given as a list.

use serde_json::Value;

use crate::util::{check_output, fixture, hangline, json, python, temp};

fn run(args: &[&str]) -> (Value, std::path::PathBuf, tempfile::TempDir) {
    let dir = temp();
    let out = dir.path().join("o.dxf");
    let report = dir.path().join("r.json");
    let mut all: Vec<String> = vec!["solve".into(), fixture("footbridge-m-r2018.dxf").display().to_string()];
    all.extend(args.iter().map(|s| s.to_string()));
    all.extend(["-o".into(), out.display().to_string(), "--report".into(), report.display().to_string()]);
    hangline(&all).ok();
    (json(&report), out, dir)
}

/// Each alternative equals a single run with that value, node for node
/// (the check; our own invariant), and the output keeps every
/// input entity with one set of layers per alternative (ezdxf reads it).
#[test]
fn each_alternative_equals_a_single_run() {
    let (r, out, _dir) = run(&["--sag", "4,6,8.5"]);
    let alts = r["alternatives"].as_array().expect("alternatives");
    assert_eq!(alts.len(), 3);
    for (alt, sag) in alts.iter().zip(["4", "6", "8.5"]) {
        let (single, _, _d) = run(&["--sag", sag]);
        assert_eq!(alt["thrust"], single["thrust"], "sag {sag}");
        let nodes: Vec<&Value> = single["nodes"].as_array().expect("nodes").iter().collect();
        let alt_nodes: Vec<&Value> = alt["nodes"].as_array().expect("nodes").iter().collect();
        assert_eq!(alt_nodes, nodes, "sag {sag}");
        assert_eq!(alt["length"], single["length"]);
    }
    // The main keys describe the first alternative.
    assert_eq!(r["thrust"], alts[0]["thrust"]);
    // A shallower cable pulls harder (common practice, no source).
    let h: Vec<f64> = alts.iter().map(|a| a["thrust"].as_f64().unwrap_or(0.0)).collect();
    assert!(h[0] > h[1] && h[1] > h[2], "{h:?}");
    if let Some(py) = python() {
        let c = check_output(&py, &fixture("footbridge-m-r2018.dxf"), &out);
        assert_eq!(c["clean"], true, "{}", c["problems"]);
        for layer in ["HANGLINE-PROFILE-SAG-4", "HANGLINE-PROFILE-SAG-6", "HANGLINE-PROFILE-SAG-8_5", "HANGLINE-NOTES"]
        {
            assert!(c["tool_layers"][layer]["counts"].is_object(), "{layer}: {}", c["tool_layers"]);
        }
    }
}

/// A second run with other values replaces the first run's alternatives.
#[test]
fn a_second_run_replaces_the_alternatives_of_the_first() {
    let (_, first, dir) = run(&["--thrust", "300,400"]);
    let second = dir.path().join("second.dxf");
    let r = hangline(&["solve", &first.display().to_string(), "--sag", "5", "-o", &second.display().to_string(), "-q"])
        .ok();
    assert!(!r.stderr.contains("error"), "{}", r.stderr);
    let text = std::fs::read_to_string(&second).expect("output");
    assert_eq!(count_entities_on(&text, "HANGLINE-PROFILE-THRUST-300"), 0);
    assert_eq!(count_entities_on(&text, "HANGLINE-PROFILE-THRUST-400"), 0);
    assert!(count_entities_on(&text, "HANGLINE-PROFILE") > 0);
}

/// Entities (not layer records) on `layer` in an ASCII drawing.
fn count_entities_on(text: &str, layer: &str) -> usize {
    let lines: Vec<&str> = text.lines().map(str::trim).collect();
    let mut n = 0;
    let mut in_entities = false;
    for w in lines.windows(2) {
        if w[0] == "2" && w[1] == "ENTITIES" {
            in_entities = true;
        }
        if in_entities && w[0] == "8" && w[1].eq_ignore_ascii_case(layer) {
            n += 1;
        }
    }
    n
}

#[test]
fn one_list_at_a_time() {
    let r = hangline(&[
        "solve",
        &fixture("footbridge-m-r2018.dxf").display().to_string(),
        "--sag",
        "4,6",
        "--thrust",
        "300,400",
    ]);
    assert_eq!(r.code, Some(1));
    assert!(r.stderr.contains("one condition at a time"), "{}", r.stderr);
}
