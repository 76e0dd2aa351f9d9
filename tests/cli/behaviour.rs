//! How the command behaves around files: the input is protected, outputs
//! land whole, the report has its keys, inspect shows what was read.

use crate::util::{fixture, hangline, json, temp};

#[test]
fn the_input_is_never_overwritten_without_force() {
    let dir = temp();
    let input = dir.path().join("bridge.dxf");
    std::fs::copy(fixture("footbridge-m-r2018.dxf"), &input).expect("copy");
    let before = std::fs::read(&input).expect("read");
    let path = input.display().to_string();
    let run = hangline(&["solve", &path, "-o", &path, "--sag", "4.5"]);
    assert_eq!(run.code, Some(1));
    assert!(run.stderr.contains("is the input drawing") && run.stderr.contains("--force"), "{}", run.stderr);
    assert_eq!(std::fs::read(&input).expect("read"), before);
    // With --force the input is replaced, whole.
    hangline(&["solve", &path, "-o", &path, "--sag", "4.5", "--force", "-q"]).ok();
    let after = std::fs::read(&input).expect("read");
    assert!(after.len() > before.len() && after.starts_with(&before[..64]));
}

#[test]
fn the_default_output_sits_beside_the_input() {
    let dir = temp();
    let input = dir.path().join("bridge.dxf");
    std::fs::copy(fixture("footbridge-m-r2018.dxf"), &input).expect("copy");
    let run = hangline(&["solve", &input.display().to_string(), "--sag", "4.5"]).ok();
    let out = dir.path().join("bridge-hangline.dxf");
    assert!(out.exists(), "{}", run.stdout);
    assert!(run.stdout.contains("bridge-hangline.dxf"), "{}", run.stdout);
    assert!(run.stdout.contains("qualified engineer"), "the summary carries the caution");
    // Nothing else left in the folder.
    assert_eq!(std::fs::read_dir(dir.path()).expect("dir").count(), 2);
}

/// The report's keys that scripts rely on (issue #2, item 5).
#[test]
fn the_report_has_its_keys() {
    let dir = temp();
    let report = dir.path().join("r.json");
    let out = dir.path().join("o.dxf");
    hangline(&[
        "solve",
        &fixture("towers-m-r2000.dxf").display().to_string(),
        "-o",
        &out.display().to_string(),
        "--report",
        &report.display().to_string(),
        "--thrust",
        "500",
        "--level-at",
        "33",
        "--through",
        "33,8",
        "-q",
    ])
    .ok();
    let r = json(&report);
    assert_eq!(r["structure"], "cable");
    assert_eq!(r["units"]["length"], "m");
    assert_eq!(r["units"]["force"], "kN");
    assert!(r["thrust"].as_f64().is_some_and(|h| h > 0.0));
    let supports = r["supports"].as_array().expect("supports");
    assert_eq!(supports.len(), 2);
    assert!(supports[0]["x"].as_f64() < supports[1]["x"].as_f64(), "left to right");
    for s in supports {
        assert!(s["y"].is_f64() && s["reaction"]["x"].is_f64() && s["reaction"]["y"].is_f64());
        assert_eq!(s["kind"], "tower-axis");
    }
    let nodes = r["nodes"].as_array().expect("nodes");
    let segments = r["segments"].as_array().expect("segments");
    assert_eq!(segments.len() + 1, nodes.len());
    assert_eq!(nodes[0]["x"], supports[0]["x"]);
    assert_eq!(nodes[nodes.len() - 1]["x"], supports[1]["x"]);
    for s in segments {
        assert!(s["force"].as_f64().is_some_and(|f| f > 0.0) && s["length"].as_f64().is_some_and(|l| l > 0.0));
    }
    let kinds: Vec<&str> =
        r["conditions"].as_array().expect("conditions").iter().filter_map(|c| c["kind"].as_str()).collect();
    assert_eq!(kinds, ["through", "thrust", "level-at"]);
    assert_eq!(r["towers"].as_array().map(Vec::len), Some(2));
    assert!(r["caution"].as_str().is_some_and(|c| c.contains("qualified engineer")));
    // Reactions balance the loads (equilibrium of the whole).
    let sum_y: f64 = supports.iter().map(|s| s["reaction"]["y"].as_f64().unwrap_or(0.0)).sum::<f64>()
        + r["loads"].as_array().expect("loads").iter().map(|l| l["force"]["y"].as_f64().unwrap_or(0.0)).sum::<f64>();
    assert!(sum_y.abs() < 1e-9 * r["thrust"].as_f64().unwrap_or(1.0), "ΣV = {sum_y}");
}

#[test]
fn inspect_shows_what_was_read() {
    let f = fixture("footbridge-m-r2018.dxf").display().to_string();
    let run = hangline(&["inspect", &f]).ok();
    assert!(run.stdout.contains("lengths in m (from $INSUNITS = 6)"), "{}", run.stdout);
    assert!(run.stdout.contains("loads (layer LOADS): 7 point loads; 222.5 kN in all"), "{}", run.stdout);
    assert!(run.stdout.contains("label 'P = 40 kN' (entity 46)"), "{}", run.stdout);
    assert!(run.stdout.contains("LOADS (service)"), "the stray title is reported: {}", run.stdout);
    let run = hangline(&["inspect", &f, "--json"]).ok();
    let j: serde_json::Value = serde_json::from_str(&run.stdout).expect("json");
    assert_eq!(j["loads"].as_array().map(Vec::len), Some(7));
    assert_eq!(j["supports"][1]["y"], 15.0);
    assert_eq!(j["units"]["length"], "m");
}

#[test]
fn layers_can_be_renamed() {
    let dir = temp();
    let out = dir.path().join("o.dxf");
    let report = dir.path().join("r.json");
    let run = hangline(&[
        "solve",
        &fixture("bj7116-ft-r2000.dxf").display().to_string(),
        "-o",
        &out.display().to_string(),
        "--report",
        &report.display().to_string(),
        "--through",
        "4,-3.6",
        "--layer",
        "profile=SEIL",
        "--layer",
        "loads=LOADS",
    ])
    .ok();
    assert!(run.stdout.contains("H = 850.0 lbf"), "{}", run.stdout);
    let text = std::fs::read_to_string(&out).expect("ascii output");
    assert!(text.contains("\nSEIL\n") || text.contains("\nSEIL\r\n"), "the profile layer is renamed");
    // A missing input layer named on the command line is an error.
    let run = hangline(&["inspect", &fixture("bj7116-ft-r2000.dxf").display().to_string(), "--layer", "deck=FAHRBAHN"]);
    assert_eq!(run.code, Some(1));
    assert!(
        run.stderr.contains("no layer named FAHRBAHN") && run.stderr.contains("--layer deck=NAME"),
        "{}",
        run.stderr
    );
}

/// A second reader: the `dxf` crate (crates.io) loads an R2018 output and
/// finds the profile polyline on its layer. (It is used only here: it is
/// not lossless, so it never carries the user's drawing.)
#[test]
fn the_dxf_crate_reads_the_output() {
    let dir = temp();
    let out = dir.path().join("o.dxf");
    hangline(&[
        "solve",
        &fixture("blockloads-m-r2018.dxf").display().to_string(),
        "-o",
        &out.display().to_string(),
        "--sag",
        "3.5",
        "-q",
    ])
    .ok();
    let drawing = dxf::Drawing::load_file(&out).expect("the dxf crate loads the output");
    let profiles: Vec<_> = drawing.entities().filter(|e| e.common.layer == "HANGLINE-PROFILE").collect();
    assert_eq!(profiles.len(), 1);
    assert!(matches!(profiles[0].specific, dxf::entities::EntityType::LwPolyline(_)));
    assert!(drawing.layers().any(|l| l.name == "HANGLINE-FORCE-DIAGRAM"));
}

/// Unit and layout flags reach the report: forces in N, the force scale
/// and the diagram's place as given, magnitudes from line lengths.
#[test]
fn unit_and_layout_flags() {
    let dir = temp();
    let solve = |extra: &[&str]| {
        let report = dir.path().join("r.json");
        let mut args = vec![
            "solve".to_string(),
            fixture("footbridge-m-r2018.dxf").display().to_string(),
            "-o".into(),
            dir.path().join("o.dxf").display().to_string(),
            "--report".into(),
            report.display().to_string(),
            "-q".into(),
        ];
        args.extend(extra.iter().map(|s| s.to_string()));
        hangline(&args).ok();
        json(&report)
    };
    let kn = solve(&["--sag", "4.5"]);
    let n = solve(&["--sag", "4.5", "--force-unit", "N"]);
    assert_eq!(n["units"]["force"], "N");
    let (h_kn, h_n) = (kn["thrust"].as_f64().unwrap_or(0.0), n["thrust"].as_f64().unwrap_or(0.0));
    assert!((h_n - 1000.0 * h_kn).abs() < 1e-9 * h_n, "{h_n} vs {h_kn}");
    // A sag in millimetres on a drawing in metres.
    let mm = solve(&["--sag", "4500 mm"]);
    assert_eq!(mm["nodes"], kn["nodes"]);
    // A thrust in MN, the force scale and the diagram's place.
    let placed = solve(&["--thrust", "0.3 MN", "--force-scale", "25 kN", "--diagram-at", "100,-20"]);
    assert!((placed["thrust"].as_f64().unwrap_or(0.0) - 300.0).abs() < 1e-9);
    assert_eq!(placed["force_diagram"]["scale"], 25.0);
    assert_eq!(placed["force_diagram"]["at"]["x"], 100.0);
    assert_eq!(placed["force_diagram"]["at"]["y"], -20.0);
    // Every load line of this drawing is 1.5 m long: 15 kN each at 10 kN/m.
    let scaled = solve(&["--sag", "4.5", "--load-scale", "10 kN"]);
    for l in scaled["loads"].as_array().expect("loads") {
        assert!((l["magnitude"].as_f64().unwrap_or(0.0) - 15.0).abs() < 1e-9, "{l}");
    }
}

/// The README's first command (the demo) runs as written, on a copy of the
/// demo drawing: it writes the drawing and the report it promises, and the
/// report meets the sag it was asked for, with node equilibrium and the
/// closed form y = chord − M(x)/H (Beer & Johnston, *Vector Mechanics for
/// Engineers: Statics*, §7.9) held to round-off.
#[test]
fn the_readmes_first_command_runs() {
    let readme = std::fs::read_to_string(crate::util::root().join("README.md")).expect("README.md");
    let line =
        readme.lines().find_map(|l| l.strip_prefix("    cargo run --release -- ")).expect("the README's first command");
    let dir = temp();
    std::fs::create_dir(dir.path().join("demo-drawings")).expect("folder");
    let mut args: Vec<String> = Vec::new();
    for word in line.split_whitespace() {
        if let Some(name) = word.strip_prefix("demo-drawings/") {
            let copy = dir.path().join("demo-drawings").join(name);
            let original = crate::util::root().join("demo-drawings").join(name);
            if original.exists() {
                std::fs::copy(&original, &copy).expect("copy the demo drawing");
            }
            args.push(copy.display().to_string());
        } else {
            args.push(word.to_string());
        }
    }
    assert_eq!(args.first().map(String::as_str), Some("solve"), "{line}");
    let run = hangline(&args).ok();
    assert!(run.stdout.contains("qualified engineer"), "{}", run.stdout);
    let report_path = args.iter().skip_while(|a| *a != "--report").nth(1).expect("the demo writes a report");
    let report = json(std::path::Path::new(report_path));
    let sag = args.iter().skip_while(|a| *a != "--sag").nth(1).and_then(|s| s.parse::<f64>().ok()).expect("--sag");
    assert!((report["sag"]["value"].as_f64().expect("sag") - sag).abs() <= 1e-12 * sag, "{}", report["sag"]);
    for check in ["equilibrium", "closed_form", "conditions"] {
        let v = report["checks"][check].as_f64().expect("check");
        assert!(v <= 1e-12, "{check}: {v}");
    }
    let drawing = args[1].replace(".dxf", "-hangline.dxf");
    assert!(std::path::Path::new(&drawing).exists(), "{drawing} not written");
}
