//! The calculation sheet: the report's numbers, the caution, Markdown or HTML.

use crate::util::{fixture, hangline, json, temp};

/// The sheet shows the thrust and every segment's force as the report
/// gives them (six significant decimals), and the caution; the HTML page
/// holds the same tables.
#[test]
fn the_sheet_follows_the_report() {
    let dir = temp();
    let out = dir.path().join("o.dxf");
    let report = dir.path().join("r.json");
    let md = dir.path().join("calc.md");
    let html = dir.path().join("calc.html");
    let input = fixture("footbridge-m-r2018.dxf").display().to_string();
    for sheet in [&md, &html] {
        hangline(&[
            "solve",
            &input,
            "--sag",
            "6",
            "-o",
            &out.display().to_string(),
            "--report",
            &report.display().to_string(),
            "--sheet",
            &sheet.display().to_string(),
            "-q",
        ])
        .ok();
    }
    let r = json(&report);
    let fmt = |v: f64| {
        let s = format!("{v:.6}");
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    };
    for path in [&md, &html] {
        let text = std::fs::read_to_string(path).expect("the sheet");
        let thrust = fmt(r["thrust"].as_f64().unwrap_or(f64::NAN));
        assert!(text.contains(&format!("H = {thrust} ")), "{}: H = {thrust}", path.display());
        for seg in r["segments"].as_array().expect("segments") {
            let f = fmt(seg["force"].as_f64().unwrap_or(f64::NAN));
            assert!(text.contains(&f), "{}: segment force {f}", path.display());
        }
        assert!(text.contains(r["caution"].as_str().unwrap_or("?")), "{}", path.display());
    }
    let page = std::fs::read_to_string(&html).expect("html");
    assert!(page.starts_with("<!DOCTYPE html>") && page.contains("<table>") && page.contains("</html>"));
    // The picture is inlined: the profile group with the report's first node
    // (y flipped, as the preview writes it).
    assert!(page.contains("<svg") && page.contains("id=\"role-profile\""), "the page carries its picture");
    // With --preview, the Markdown sheet links to the picture beside it.
    let svg = dir.path().join("look.svg");
    hangline(&[
        "solve",
        &input,
        "--sag",
        "6",
        "-o",
        &out.display().to_string(),
        "--preview",
        &svg.display().to_string(),
        "--sheet",
        &md.display().to_string(),
        "-q",
    ])
    .ok();
    let text = std::fs::read_to_string(&md).expect("the sheet");
    assert!(text.contains("](look.svg)") && svg.exists(), "{text}");
}

#[test]
fn a_sheet_is_for_one_drawing() {
    let dir = temp();
    let r = hangline(&[
        "solve",
        &fixture("footbridge-m-r2018.dxf").display().to_string(),
        &fixture("towers-m-r2000.dxf").display().to_string(),
        "--sag",
        "6",
        "-o",
        &dir.path().display().to_string(),
        "--sheet",
        &dir.path().join("s.md").display().to_string(),
    ]);
    assert_eq!(r.code, Some(1));
    assert!(r.stderr.contains("one drawing"), "{}", r.stderr);
}
