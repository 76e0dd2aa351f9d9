//! `--preview`: the picture is read back by an independent SVG/XML parser
//! (roxmltree, from crates.io) and compared with the JSON report.

use roxmltree::{Document, Node};
use serde_json::Value;

use crate::util::{fixture, hangline, json, root, temp};

/// The group with this id.
fn group<'a, 'i>(doc: &'a Document<'i>, id: &str) -> Node<'a, 'i> {
    doc.descendants()
        .find(|n| n.has_tag_name("g") && n.attribute("id") == Some(id))
        .unwrap_or_else(|| panic!("no group {id}"))
}

fn f(n: &Node<'_, '_>, a: &str) -> f64 {
    n.attribute(a).and_then(|v| v.parse().ok()).unwrap_or_else(|| panic!("no number {a} in {n:?}"))
}

/// "x,y x,y …" as points.
fn points(s: &str) -> Vec<(f64, f64)> {
    s.split_whitespace()
        .map(|p| {
            let (x, y) = p.split_once(',').expect("x,y");
            (x.parse().expect("x"), y.parse().expect("y"))
        })
        .collect()
}

fn texts(n: Node<'_, '_>) -> Vec<String> {
    n.descendants().filter(|t| t.has_tag_name("text")).map(|t| t.text().unwrap_or_default().to_string()).collect()
}

/// The footbridge fixture (ezdxf-made, `tools/fixtures/make_fixtures.py`)
/// with a 6 m sag: the picture's profile is the report's, its force
/// diagram has the pole and a ray parallel to every segment, and the
/// thrust in its notes is the report's as printed.
#[test]
fn the_preview_shows_the_reports_profile_diagram_and_numbers() {
    let dir = temp();
    let out = dir.path().join("o.dxf");
    let svg = dir.path().join("out.svg");
    let report = dir.path().join("r.json");
    let input = fixture("footbridge-m-r2018.dxf").display().to_string();
    let run = hangline(&[
        "solve",
        &input,
        "--sag",
        "6",
        "-o",
        &out.display().to_string(),
        "--preview",
        &svg.display().to_string(),
        "--report",
        &report.display().to_string(),
    ])
    .ok();
    assert!(run.stdout.contains("out.svg"), "the summary names the preview: {}", run.stdout);
    let r: Value = json(&report);
    let text = std::fs::read_to_string(&svg).expect("the preview is written");
    let doc = Document::parse(&text).expect("the preview parses as XML");
    let root_el = doc.root_element();
    assert!(root_el.has_tag_name(("http://www.w3.org/2000/svg", "svg")), "an SVG document");
    let vb: Vec<f64> =
        root_el.attribute("viewBox").expect("a viewBox").split(' ').map(|v| v.parse().unwrap()).collect();
    assert_eq!(vb.len(), 4);

    // The profile: one polyline on the profile layer, the report's nodes
    // with y negated (SVG's y points down), to the last bit.
    let profile = group(&doc, "role-profile");
    assert_eq!(profile.attribute("data-layer"), Some("HANGLINE-PROFILE"));
    let line = profile.descendants().find(|n| n.has_tag_name("polyline")).expect("a polyline");
    let drawn = points(line.attribute("points").expect("points"));
    let nodes: Vec<(f64, f64)> = r["nodes"]
        .as_array()
        .expect("nodes")
        .iter()
        .map(|n| (n["x"].as_f64().unwrap(), -n["y"].as_f64().unwrap()))
        .collect();
    assert_eq!(drawn, nodes);
    for (x, y) in &drawn {
        assert!(*x >= vb[0] && *x <= vb[0] + vb[2] && *y >= vb[1] && *y <= vb[1] + vb[3], "inside the viewBox");
    }

    // The force diagram: the pole, and from it a ray parallel to each
    // segment of the profile (the reciprocal figure's defining property).
    let diagram = group(&doc, "role-diagram");
    let pole = diagram.descendants().find(|n| n.has_tag_name("circle")).expect("the pole");
    let (px, py) = (f(&pole, "cx"), f(&pole, "cy"));
    let rays: Vec<(f64, f64)> = diagram
        .descendants()
        .filter(|n| n.has_tag_name("line"))
        .filter(|l| (f(l, "x2") - px).abs() < 1e-9 && (f(l, "y2") - py).abs() < 1e-9)
        .map(|l| (f(&l, "x1") - px, f(&l, "y1") - py))
        .collect();
    for w in nodes.windows(2) {
        let seg = (w[1].0 - w[0].0, w[1].1 - w[0].1);
        let parallel = rays.iter().any(|ray| {
            let cross = seg.0 * ray.1 - seg.1 * ray.0;
            cross.abs() <= 1e-9 * (seg.0.hypot(seg.1) * ray.0.hypot(ray.1))
        });
        assert!(parallel, "no ray parallel to the segment {w:?}");
    }
    assert!(texts(group(&doc, "role-bow")).iter().any(|t| t.contains("(pole)")), "the pole is lettered");

    // The notes: "H = … kN" equals the report's thrust to the digits shown.
    let notes = texts(group(&doc, "role-notes"));
    let line = notes.iter().find(|t| t.starts_with("H = ")).expect("the result line");
    let shown = line.trim_start_matches("H = ").split(' ').next().unwrap().replace(',', "");
    let unit = line.trim_start_matches("H = ").split(' ').nth(1).unwrap().trim_end_matches(';');
    assert_eq!(unit, r["units"]["force"].as_str().unwrap());
    let decimals = shown.split_once('.').map_or(0, |(_, d)| d.len()) as i32;
    let thrust = r["thrust"].as_f64().unwrap();
    let value: f64 = shown.parse().expect("a number");
    assert!((value - thrust).abs() <= 0.5 * 10f64.powi(-decimals) + 1e-12, "{value} shown, {thrust} reported");

    // The user's layers: both supports, and every load's label as read.
    let input = group(&doc, "input");
    let layers: Vec<&str> = input.children().filter_map(|n| n.attribute("data-layer")).collect();
    assert!(layers.contains(&"SUPPORTS") && layers.contains(&"LOADS") && layers.contains(&"DECK"), "{layers:?}");
    let shown = texts(input);
    for load in r["loads"].as_array().expect("loads") {
        let label = load["label"].as_str().expect("a label");
        assert!(shown.iter().any(|t| t == label), "label {label} not drawn");
    }
}

/// A wrong extension is refused before any work, and nothing is written.
#[test]
fn a_preview_of_an_unknown_kind_is_refused() {
    let dir = temp();
    let out = dir.path().join("o.dxf");
    let pic = dir.path().join("out.gif");
    let input = fixture("footbridge-m-r2018.dxf").display().to_string();
    let run = hangline(&[
        "solve",
        &input,
        "--sag",
        "6",
        "-o",
        &out.display().to_string(),
        "--preview",
        &pic.display().to_string(),
    ]);
    assert_eq!(run.code, Some(1));
    assert_eq!(run.stderr.trim().lines().count(), 1, "{}", run.stderr);
    assert!(run.stderr.contains(".svg"), "{}", run.stderr);
    assert!(!out.exists() && !pic.exists());
}

/// `assess --preview`: the arch's faces and the least thrust line.
#[test]
fn an_assessment_has_a_preview_too() {
    let dir = temp();
    let svg = dir.path().join("arch.svg");
    // An invented stone arch (tools/demo/).
    let drawing = root().join("demo-drawings/wrenfield-bridge.dxf");
    hangline(&[
        "assess",
        &drawing.display().to_string(),
        "-o",
        &dir.path().join("o.dxf").display().to_string(),
        "--unit-weight",
        "22 kN/m3",
        "--fill-weight",
        "18 kN/m3",
        "--preview",
        &svg.display().to_string(),
        "-q",
    ])
    .ok();
    let text = std::fs::read_to_string(&svg).expect("the preview is written");
    let doc = Document::parse(&text).expect("the preview parses as XML");
    let min = group(&doc, "role-thrust-min");
    assert!(min.descendants().any(|n| n.has_tag_name("polyline")), "the least thrust line");
    let input = group(&doc, "input");
    let layers: Vec<&str> = input.children().filter_map(|n| n.attribute("data-layer")).collect();
    assert!(layers.contains(&"INTRADOS") && layers.contains(&"EXTRADOS"), "{layers:?}");
}

/// `--preview FILE.png`: a PNG of the SVG's size in pixels, on white, with
/// the profile's magenta (ACI 6) in it; decoded by tiny-skia.
#[cfg(feature = "png")]
#[test]
fn a_png_preview_is_the_picture_rasterised() {
    let dir = temp();
    let png = dir.path().join("out.png");
    let input = fixture("footbridge-m-r2018.dxf").display().to_string();
    let run = hangline(&[
        "solve",
        &input,
        "--sag",
        "6",
        "-o",
        &dir.path().join("o.dxf").display().to_string(),
        "--preview",
        &png.display().to_string(),
    ])
    .ok();
    assert!(run.stdout.contains("out.png"), "{}", run.stdout);
    let bytes = std::fs::read(&png).expect("the PNG is written");
    // The PNG signature (ISO/IEC 15948, 5.2).
    assert!(bytes.starts_with(b"\x89PNG\r\n\x1a\n"));
    let pixmap = resvg::tiny_skia::Pixmap::decode_png(&bytes).expect("a PNG tiny-skia decodes");
    assert_eq!(pixmap.width().max(pixmap.height()), 1600);
    let pixels = pixmap.pixels();
    let white = pixels.iter().filter(|p| (p.red(), p.green(), p.blue()) == (255, 255, 255)).count();
    assert!(white > pixels.len() / 2, "a white background");
    let magenta = pixels.iter().filter(|p| p.red() > 200 && p.green() < 60 && p.blue() > 200).count();
    assert!(magenta > 100, "the profile is drawn ({magenta} magenta pixels)");
}

/// A batch writes one preview per drawing into the folder given.
#[test]
fn a_batch_writes_a_preview_per_drawing() {
    let dir = temp();
    for name in ["a.dxf", "b.dxf"] {
        std::fs::copy(fixture("footbridge-m-r2018.dxf"), dir.path().join(name)).expect("copy");
    }
    let pictures = dir.path().join("pictures");
    hangline(&[
        "solve",
        &dir.path().join("a.dxf").display().to_string(),
        &dir.path().join("b.dxf").display().to_string(),
        "--sag",
        "6",
        "--preview",
        &pictures.display().to_string(),
        "-q",
    ])
    .ok();
    for name in ["a-hangline.svg", "b-hangline.svg"] {
        let text = std::fs::read_to_string(pictures.join(name)).expect("a preview per drawing");
        Document::parse(&text).expect("parses");
    }
}
