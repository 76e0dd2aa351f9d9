//! Bad input: a one-line message that says what and where and what to do,
//! exit code 1, no output file, the input untouched, no panic.

use std::path::Path;

use crate::util::{fixture, hangline, temp};

/// Runs `solve` expecting failure; checks the common promises and returns
/// the message.
fn fails(input: &Path, args: &[&str]) -> String {
    let before = std::fs::read(input).ok();
    let dir = temp();
    let out = dir.path().join("out.dxf");
    let report = dir.path().join("out.json");
    let mut all: Vec<String> = vec!["solve".into(), input.display().to_string()];
    all.extend(["-o".into(), out.display().to_string(), "--report".into(), report.display().to_string()]);
    all.extend(args.iter().map(|s| s.to_string()));
    let run = hangline(&all);
    assert_eq!(run.code, Some(1), "{}: expected failure, got {:?}\n{}", input.display(), run.code, run.stderr);
    assert!(!run.stderr.contains("panicked"), "{}: {}", input.display(), run.stderr);
    let lines: Vec<&str> = run.stderr.lines().collect();
    assert_eq!(lines.len(), 1, "{}: one line expected:\n{}", input.display(), run.stderr);
    assert!(lines[0].starts_with("hangline: error: "), "{}", lines[0]);
    // Nothing written, not even a temporary file.
    let left: Vec<_> = std::fs::read_dir(dir.path()).expect("dir").collect();
    assert!(left.is_empty(), "{}: files left behind: {left:?}", input.display());
    assert_eq!(std::fs::read(input).ok(), before, "{}: input changed", input.display());
    lines[0].to_string()
}

/// Every drawing in fixtures/bad/ with the words its message must hold
/// (what is wrong, where, what to do).
#[test]
fn bad_drawings() {
    let cases: &[(&str, &[&str])] = &[
        ("empty.dxf", &["empty", "export"]),
        ("truncated.dxf", &["truncated", "line", "save"]),
        ("prose.dxf", &["not a DXF file", "Dear colleague", "export"]),
        ("png-magic.dxf", &["not a DXF file", "PNG"]),
        ("no-loads-layer.dxf", &["no layer named LOADS", "SUPPORTS", "--layer loads=NAME"]),
        ("loads-layer-empty.dxf", &["no loads found on layer LOADS", "draw each load"]),
        ("one-support.dxf", &["found 1 support", "need exactly 2", "entity 31", "(0, 0)"]),
        ("three-supports.dxf", &["found 3 support", "entity 33", "(10, 0)"]),
        ("same-x-supports.dxf", &["same x = 0", "entity 31", "entity 32", "move one"]),
        ("unlabelled-load.dxf", &["entity 35", "(5, 2)", "has no label", "85 kN"]),
        ("label-abc.dxf", &["'-abc kN'", "entity 36", "not a number"]),
        ("label-negative.dxf", &["'-5 kN'", "negative", "write 5 kN"]),
        ("label-zero.dxf", &["'0 kN'", "zero"]),
        ("label-bad-unit.dxf", &["'5 t'", "not a force unit", "kN"]),
        ("label-ambiguous.dxf", &["'20 kN'", "entity 33", "entity 34", "move it closer"]),
        ("nan-coordinate.dxf", &["entity 33", "NaN", "finite"]),
        ("huge-coordinate.dxf", &["entity 37", "1.000000e300", "below 1e12"]),
        ("load-outside-span.dxf", &["entity 37", "x = 12", "outside the span", "x = 0 to x = 10"]),
    ];
    let bad_dir = fixture("bad");
    let mut count = 0;
    for entry in std::fs::read_dir(&bad_dir).expect("fixtures/bad") {
        let path = entry.expect("entry").path();
        if path.extension().is_some_and(|e| e == "dxf") {
            let name = path.file_name().and_then(|n| n.to_str()).unwrap_or_default();
            let (_, words) =
                cases.iter().find(|(n, _)| *n == name).unwrap_or_else(|| panic!("no expectation for {name}"));
            let msg = fails(&path, &["--sag", "1"]);
            for w in *words {
                assert!(msg.contains(w), "{name}: '{w}' missing from: {msg}");
            }
            count += 1;
        }
    }
    assert_eq!(count, cases.len());
}

/// Conditions: too few, too many, dependent, contradictory, of the wrong
/// form, or met by no funicular.
#[test]
fn bad_conditions() {
    let bj = fixture("bj7116-ft-r2000.dxf");
    let m = fails(&bj, &[]);
    assert!(m.contains("2 condition(s) given") && m.contains("--through"), "{m}");
    let m = fails(&bj, &["--sag", "2", "--thrust", "800"]);
    assert!(m.contains("4 condition(s)"), "{m}");
    let m = fails(&bj, &["--through", "0,1"]);
    assert!(m.contains("left support") || m.contains("contradict"), "{m}");
    let m = fails(&bj, &["--rise", "2"]);
    assert!(m.contains("--rise is for an arch") && m.contains("--sag"), "{m}");
    let m = fails(&bj, &["--arch", "--sag", "2"]);
    assert!(m.contains("--sag is for a cable") && m.contains("--rise"), "{m}");
    // A cable cannot pass above its chord.
    let m = fails(&bj, &["--through", "4,1"]);
    assert!(m.contains("no cable") && m.contains("--arch"), "{m}");
    let m = fails(&bj, &["--max-force", "10"]);
    assert!(m.contains("--max-force 10 lbf") && m.contains("must be larger than"), "{m}");
    let m = fails(&bj, &["--level-at", "40"]);
    assert!(m.contains("--level-at") && m.contains("span"), "{m}");
    let m = fails(&bj, &["--through", "nan,2"]);
    assert!(m.contains("--through") && m.contains("finite"), "{m}");
    let m = fails(&bj, &["--sag", "-2"]);
    assert!(m.contains("--sag"), "{m}");
    let m = fails(&bj, &["--thrust", "12 kNm"]);
    assert!(m.contains("--thrust") && m.contains("kNm"), "{m}");
    let m = fails(&bj, &["--sag", "2", "--layer", "profile=LOADS"]);
    assert!(m.contains("both an input and an output layer"), "{m}");
}

/// A missing input file and an unwritable output folder.
#[test]
fn missing_files() {
    let m = fails(Path::new("no/such/drawing.dxf"), &["--sag", "1"]);
    assert!(m.contains("cannot read no/such/drawing.dxf"), "{m}");
    let run = hangline(&[
        "solve",
        &fixture("bj7116-ft-r2000.dxf").display().to_string(),
        "--sag",
        "2",
        "-o",
        "/no/such/dir/out.dxf",
    ]);
    assert_eq!(run.code, Some(1));
    assert!(run.stderr.contains("cannot create a file in /no/such/dir"), "{}", run.stderr);
}
