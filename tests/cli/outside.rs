//! The output checked by an outside reader: ezdxf (PyPI, pinned in
//! tools/requirements.txt) loads it, its audit finds no errors, and every
//! input entity, handle, table entry and header variable is still there.

use std::path::Path;

use serde_json::Value;

use crate::util::{case_args, check_output, expectations, fixture, hangline, json, python_or_skip, read_args, temp};

fn solve_into(input: &Path, out: &Path, report: &Path, read: &[String], args: &[String]) {
    let mut all: Vec<String> = vec!["solve".into(), input.display().to_string(), "-q".into()];
    all.extend(["-o".into(), out.display().to_string(), "--report".into(), report.display().to_string()]);
    all.extend(read.iter().cloned());
    all.extend(args.iter().cloned());
    hangline(&all).ok();
}

/// Asserts what every output must satisfy, and that the drawn profile and
/// texts match the report.
fn assert_clean(name: &str, c: &Value, report: &Value) {
    assert_eq!(c["loaded"], true, "{name}: ezdxf could not load the output: {}", c["load_error"]);
    assert_eq!(c["audit_errors"], 0, "{name}: audit: {}", c["audit"]);
    assert_eq!(c["clean"], true, "{name}: {}", c["problems"]);
    assert_eq!(c["handles_kept"], true, "{name}");
    assert_eq!(c["tables_kept"], true, "{name}");
    assert_eq!(c["header_kept"], true, "{name}");
    assert_eq!(c["versions"]["input"], c["versions"]["output"], "{name}");
    assert_eq!(c["binary"]["input"], c["binary"]["output"], "{name}");
    assert!(c["missing"].as_array().is_some_and(Vec::is_empty), "{name}: {}", c["missing"]);
    let layers = &c["tool_layers"];
    // The profile: one polyline through the report's nodes.
    let polys = layers["HANGLINE-PROFILE"]["polylines"].as_array().expect("profile polylines");
    assert_eq!(polys.len(), 1, "{name}");
    let verts = polys[0]["vertices"].as_array().expect("vertices");
    let nodes = report["nodes"].as_array().expect("nodes");
    assert_eq!(verts.len(), nodes.len(), "{name}");
    for (v, n) in verts.iter().zip(nodes) {
        let (vx, vy) = (v[0].as_f64().expect("x"), v[1].as_f64().expect("y"));
        assert!((vx - n["x"].as_f64().expect("x")).abs() < 1e-9 * vx.abs().max(1.0), "{name}");
        assert!((vy - n["y"].as_f64().expect("y")).abs() < 1e-9 * vy.abs().max(1.0), "{name}");
    }
    // Dimensions with geometry blocks, measuring what the report says.
    let dims = layers["HANGLINE-DIMENSIONS"]["dimensions"].as_array().expect("dimensions");
    assert!(dims.len() >= 2, "{name}: span and sag at least");
    for d in dims {
        assert_eq!(d["block_exists"], true, "{name}: {d}");
        assert!(d["block_entities"].as_u64().unwrap_or(0) >= 4, "{name}: {d}");
    }
    let span = report["span"].as_f64().expect("span");
    assert!(
        dims.iter().any(|d| (d["measurement"].as_f64().unwrap_or(0.0) - span).abs() < 1e-9 * span),
        "{name}: no dimension measures the span {span}"
    );
    // The largest force is written on the drawing.
    let texts: Vec<String> = layers["HANGLINE-FORCES"]["texts"]
        .as_array()
        .expect("force texts")
        .iter()
        .filter_map(|t| t["plain"].as_str().map(String::from))
        .collect();
    let name_max = report["max_force"]["name"].as_str().expect("name");
    assert!(texts.iter().any(|t| t.starts_with(&format!("{name_max} "))), "{name}: {texts:?}");
    // The caution is on the drawing.
    let notes = layers["HANGLINE-NOTES"]["texts"].as_array().expect("notes");
    assert!(notes.iter().any(|t| t["plain"].as_str().is_some_and(|s| s.contains("qualified engineer"))), "{name}");
}

/// Every good fixture (R12, R2000, R2013, R2018; ASCII and binary; metres,
/// millimetres, feet), solved, then solved again from the tool's own output:
/// both outputs pass the checks, and the second replaces the first's layers
/// instead of adding to them.
#[test]
fn outputs_pass_the_outside_reader() {
    let Some(py) = python_or_skip() else { return };
    let mut checked = 0;
    for (name, e) in expectations() {
        let Some(case) = e["cases"].as_array().and_then(|c| c.first()) else { continue };
        let dir = temp();
        let input = fixture(&format!("{name}.dxf"));
        let (out1, rep1) = (dir.path().join("one.dxf"), dir.path().join("one.json"));
        let read = read_args(&e);
        let args = case_args(&case["args"]);
        solve_into(&input, &out1, &rep1, &read, &args);
        let r1 = json(&rep1);
        let c1 = check_output(&py, &input, &out1);
        assert_clean(&name, &c1, &r1);

        let (out2, rep2) = (dir.path().join("two.dxf"), dir.path().join("two.json"));
        solve_into(&out1, &out2, &rep2, &read, &args);
        let r2 = json(&rep2);
        assert_eq!(r1["nodes"], r2["nodes"], "{name}: solving the output again gives the same profile");
        let c2 = check_output(&py, &input, &out2);
        assert_clean(&format!("{name} (second run)"), &c2, &r2);
        for layer in c1["tool_layers"].as_object().expect("tool layers").keys() {
            assert_eq!(
                c1["tool_layers"][layer]["counts"], c2["tool_layers"][layer]["counts"],
                "{name}: {layer} must be replaced, not added to"
            );
        }
        assert_eq!(c1["new_blocks"].as_array().map(Vec::len), c2["new_blocks"].as_array().map(Vec::len), "{name}");
        checked += 1;
    }
    assert!(checked >= 12, "only {checked} fixtures checked");
}

/// A drawing whose header scales dimension measurements (`$DIMLFAC` = 100,
/// as ezdxf's default setup writes) gets dimensions whose text is the true
/// length written out, the same as their geometry blocks show; a drawing
/// with `$DIMLFAC` = 1 keeps `<>`, the measurement that follows an edit.
#[test]
fn dimensions_read_true_lengths_whatever_the_headers_scale() {
    let Some(py) = python_or_skip() else { return };
    for (input, read, args, literal) in [
        (crate::util::root().join("demo-drawings/ambermoor-footbridge.dxf"), vec![], vec!["--sag", "3.5"], true),
        (fixture("footbridge-m-r2018.dxf"), vec![], vec!["--sag", "4.5"], false),
    ] {
        let dir = temp();
        let (out, rep) = (dir.path().join("o.dxf"), dir.path().join("o.json"));
        let args: Vec<String> = args.into_iter().map(String::from).collect();
        solve_into(&input, &out, &rep, &read, &args);
        let report = json(&rep);
        let warned =
            report["warnings"].as_array().expect("warnings").iter().any(|w| w.to_string().contains("$DIMLFAC"));
        assert_eq!(warned, literal, "{}", input.display());
        let c = check_output(&py, &input, &out);
        let dims = c["tool_layers"]["HANGLINE-DIMENSIONS"]["dimensions"].as_array().expect("dimensions");
        assert!(dims.len() >= 2);
        for d in dims {
            let text = d["text"].as_str().expect("text");
            let shown = d["block_texts"][0].as_str().expect("block text");
            if literal {
                assert_eq!(text, shown, "{d}");
            } else {
                assert!(text.ends_with(" <>") && shown.starts_with(text.trim_end_matches("<>")), "{d}");
            }
        }
        let span = report["span"].as_f64().expect("span");
        let want = format!("span {span:.3}");
        assert!(dims.iter().any(|d| d["block_texts"][0] == want.as_str()), "{want}: {dims:?}");
    }
}

/// The force diagram sits beside the drawing, clear of everything: its box
/// (ezdxf's, tests/outside/boxes.py) meets neither the input's model space
/// nor the tool's other additions (the profile, hangers, forces,
/// dimensions, load diagram and notes), on every fixture.
#[test]
fn the_force_diagram_overlaps_nothing() {
    let Some(py) = python_or_skip() else { return };
    let apart = |a: &Value, b: &Value| {
        let v = |x: &Value, i: usize| x[i].as_f64().expect("box");
        v(a, 2) < v(b, 0) || v(b, 2) < v(a, 0) || v(a, 3) < v(b, 1) || v(b, 3) < v(a, 1)
    };
    let mut checked = 0;
    for (name, e) in expectations() {
        let Some(case) = e["cases"].as_array().and_then(|c| c.first()) else { continue };
        let dir = temp();
        let input = fixture(&format!("{name}.dxf"));
        let (out, rep) = (dir.path().join("o.dxf"), dir.path().join("o.json"));
        solve_into(&input, &out, &rep, &read_args(&e), &case_args(&case["args"]));
        let run = std::process::Command::new(&py)
            .arg(crate::util::root().join("tests/outside/boxes.py"))
            .args([&input, &out])
            .output()
            .expect("python runs");
        let boxes: Value = serde_json::from_slice(&run.stdout)
            .unwrap_or_else(|_| panic!("{name}: {}", String::from_utf8_lossy(&run.stderr)));
        let diagram = &boxes["layers"]["HANGLINE-FORCE-DIAGRAM"];
        assert!(diagram.is_array(), "{name}: no force diagram: {boxes}");
        assert!(apart(diagram, &boxes["input"]), "{name}: the diagram {diagram} meets the drawing {}", boxes["input"]);
        for layer in ["PROFILE", "HANGERS", "FORCES", "DIMENSIONS", "LOAD-DIAGRAM", "NOTES"] {
            let other = &boxes["layers"][format!("HANGLINE-{layer}")];
            if other.is_array() {
                assert!(apart(diagram, other), "{name}: the diagram {diagram} meets {layer} {other}");
            }
        }
        checked += 1;
    }
    assert!(checked >= 20, "only {checked} fixtures checked");
}

/// Text the tool adds is written in the version's encoding (DXF reference,
/// group codes and strings: `\U+XXXX` escapes before R2007, UTF-8 from
/// R2007): a layer name with `Ä` is escaped in an R2000 output, which stays
/// ASCII, and is plain UTF-8 in an R2018 one. ezdxf finds the notes on that
/// layer in both; its ordinary reader leaves escapes in names as written,
/// so the name is compared after ezdxf's own `decode_dxf_unicode`.
#[test]
fn added_text_is_in_the_versions_encoding() {
    let Some(py) = python_or_skip() else { return };
    for (name, escaped) in [("hollinyard-m-r2000", true), ("hollinyard-m-r2018", false)] {
        let dir = temp();
        let input = fixture(&format!("{name}.dxf"));
        let (out, rep) = (dir.path().join("o.dxf"), dir.path().join("o.json"));
        let args: Vec<String> = ["--sag", "3.2", "--layer", "notes=NOTIZEN-Ä"].into_iter().map(String::from).collect();
        solve_into(&input, &out, &rep, &[], &args);
        let bytes = std::fs::read(&out).expect("output");
        let text = String::from_utf8_lossy(&bytes);
        if escaped {
            assert!(bytes.is_ascii(), "{name}: an R2000 output must be ASCII");
            assert!(text.contains("NOTIZEN-\\U+00C4"), "{name}");
        } else {
            assert!(text.contains("NOTIZEN-Ä") && !text.contains("\\U+00C4"), "{name}");
        }
        let script = "import sys, json, ezdxf\n\
            d = ezdxf.readfile(sys.argv[1])\n\
            print(json.dumps(sorted({ezdxf.decode_dxf_unicode(e.dxf.layer) for e in d.modelspace().query('TEXT')})))";
        let run = std::process::Command::new(&py).args(["-c", script]).arg(&out).output().expect("python runs");
        let layers: Value = serde_json::from_slice(&run.stdout)
            .unwrap_or_else(|_| panic!("{name}: {}", String::from_utf8_lossy(&run.stderr)));
        assert!(
            layers.as_array().is_some_and(|l| l.iter().any(|n| n == "NOTIZEN-Ä")),
            "{name}: no text on NOTIZEN-Ä: {layers}"
        );
        let c = check_output(&py, &input, &out);
        assert_eq!(c["audit_errors"], 0, "{name}: {}", c["audit"]);
    }
}
