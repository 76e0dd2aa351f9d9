//! `hangline assess` end to end on arches drawn by ezdxf (fixtures/arch/,
//! made by tools/fixtures/make_arches.py) and on the demo, checked against
//! published results and closed forms.

use serde_json::Value;

use crate::util::{check_output, close, hangline, json, python, root, temp};

fn drawing(name: &str) -> String {
    root().join("fixtures/arch").join(name).display().to_string()
}

/// Assesses a drawing with `args`; returns the report and what was printed,
/// or the failed run's message (and asserts nothing was written).
fn assess(path: &str, args: &[&str]) -> Result<(Value, String), String> {
    let dir = temp();
    let out = dir.path().join("o.dxf");
    let report = dir.path().join("r.json");
    let mut all =
        vec!["assess".to_string(), path.to_string(), "-o".into(), out.display().to_string(), "--report".into()];
    all.push(report.display().to_string());
    all.extend(args.iter().map(|s| s.to_string()));
    let run = hangline(&all);
    if run.code == Some(0) {
        assert!(out.exists(), "the drawing is written");
        Ok((json(&report), format!("{}{}", run.stdout, run.stderr)))
    } else {
        assert_eq!(run.code, Some(1), "{}", run.stderr);
        assert!(!out.exists() && !report.exists(), "no output after an error");
        assert_eq!(run.stderr.trim().lines().count(), 1, "one line: {}", run.stderr);
        Err(run.stderr)
    }
}

fn num(v: &Value) -> f64 {
    v.as_f64().unwrap_or(f64::NAN)
}

/// A parabolic ring under a uniform load per horizontal length: the thrust
/// line of H = wL²/(8f) is the centre line itself, at any thickness
/// (the funicular of a uniform load is a parabola: H. M. Irvine, *Cable
/// Structures*, 1981, ch. 1, inverted for the arch). With vertical joints
/// the force across each cut is the exact continuous one, so the line
/// crosses every joint at its middle. The least and greatest thrust lines
/// are the parabolas of rise f + t and f − t (intrados at the springings
/// to extrados at the crown, and the reverse): H = wL²/(8(f ± t)).
#[test]
fn a_parabola_under_uniform_load_carries_it_along_its_centre_line() {
    let (w, l, f, t) = (10.0, 12.0, 3.0, 0.4);
    for n in ["12", "24", "48"] {
        let h = w * l * l / (8.0 * f);
        let hs = format!("{h} kN");
        let (r, _) = assess(
            &drawing("weightless-parabola-m-r2000.dxf"),
            &["--unit-weight", "0 kN/m3", "--cuts", "vertical", "--voussoirs", n, "--thrust", &hs],
        )
        .unwrap_or_else(|e| panic!("{e}"));
        let crossings = r["trial"]["crossings"].as_array().expect("crossings");
        assert_eq!(crossings.len(), n.parse::<usize>().unwrap_or(0) + 1);
        // The SPLINE faces are flattened to 1e-6 of the drawing's size:
        // the centre line is known to that over the thickness.
        for (j, c) in crossings.iter().enumerate() {
            assert!((num(c) - 0.5).abs() < 1e-4, "n = {n}, joint {j}: {c}");
        }
        assert_eq!(r["trial"]["fits"], true);
        let (lo, hi) = (num(&r["thrust"]["min"]["horizontal"]), num(&r["thrust"]["max"]["horizontal"]));
        assert!(close(lo, w * l * l / (8.0 * (f + t)), 1e-5, 0.0), "n = {n}: least {lo}");
        assert!(close(hi, w * l * l / (8.0 * (f - t)), 1e-5, 0.0), "n = {n}: greatest {hi}");
        assert!(r["least_thickness"]["ratio"].as_f64().is_some_and(|x| x < 1e-3), "{}", r["least_thickness"]);
        assert_eq!(r["middle_third"], true);
    }
}

/// A three-hinged arch: the thrust line through the springing and crown
/// hinges has H = M₀/f, M₀ the simple-beam moment at the crown hinge and f
/// its height above the springing hinges (common practice; e.g. S. P.
/// Timoshenko and D. H. Young, *Theory of Structures*, 1965, from memory).
/// Here M₀ = wL²/8 + P·a·(L − L/2)/L with w = 10 kN/m, L = 12 m, P = 20 kN
/// at a = 3 m: 180 + 30 = 210 kN·m; f = 3 m, so H = 70 kN.
#[test]
fn the_three_hinged_line_has_the_closed_form_thrust() {
    let (r, _) = assess(
        &drawing("three-hinged-m-r2000.dxf"),
        &["--unit-weight", "0 kN/m3", "--cuts", "vertical", "--voussoirs", "24", "--thrust", "70 kN"],
    )
    .unwrap_or_else(|e| panic!("{e}"));
    let c = r["trial"]["crossings"].as_array().expect("crossings");
    // Springings and crown (joint 12 of 24, at x = 6) on the centre line.
    for j in [0, 12, 24] {
        assert!((num(&c[j]) - 0.5).abs() < 1e-4, "joint {j}: {}", c[j]);
    }
    // Elsewhere it is not: the point load bends it off the centre line.
    assert!(c.iter().any(|p| (num(p) - 0.5).abs() > 0.05), "{c:?}");
    let (lo, hi) = (num(&r["thrust"]["min"]["horizontal"]), num(&r["thrust"]["max"]["horizontal"]));
    assert!(lo < 70.0 && 70.0 < hi, "{lo} < 70 < {hi}");
    assert_eq!(r["loads"].as_array().map(Vec::len), Some(1));
}

/// A complete semicircle drawn at the least thickness published for its own
/// weight, t/R = 0.1075 (A. Milankovitch, 1907, from memory; quoted by
/// J. Ochsendorf, PhD thesis, Cambridge, 2002): its thrust line just fits —
/// the least-thickness ratio is 1 to within the slicing (2e-4 on t/R at 576
/// voussoirs, the tolerance), the least and greatest thrust meet,
/// and the haunch hinges lie about 54.5° from the crown (Cocchetti & Rizzi,
/// Frattura ed Integrità Strutturale 51, 2020, for the centre-line model;
/// within a few voussoirs here).
#[test]
fn a_semicircle_at_its_published_least_thickness_just_holds() {
    let (r, _) = assess(&drawing("limit-semicircle-m-r2018.dxf"), &["--unit-weight", "20 kN/m3", "--voussoirs", "576"])
        .unwrap_or_else(|e| panic!("{e}"));
    let ratio = num(&r["least_thickness"]["ratio"]);
    let t_over_r = 0.1075 * ratio;
    assert!((t_over_r - 0.1075).abs() < 2e-4, "t/R = {t_over_r}");
    let (lo, hi) = (num(&r["thrust"]["min"]["horizontal"]), num(&r["thrust"]["max"]["horizontal"]));
    assert!(close(lo, hi, 1e-3, 0.0), "{lo} vs {hi}");
    let hinges = r["thrust"]["min"]["hinges"].as_array().expect("hinges");
    let haunch = hinges.iter().find(|h| h["face"] == "intrados").expect("a haunch hinge");
    let (x, y) = (num(&haunch["at"]["x"]), num(&haunch["at"]["y"]));
    let from_crown = x.abs().atan2(y).to_degrees();
    assert!((from_crown - 54.5).abs() < 1.5, "{from_crown}°");
    assert!(hinges.iter().any(|h| h["face"] == "extrados"), "a crown hinge");
}

/// The demo: slices, both extreme thrust lines, hinges, margins and the
/// live load's factor reach the report, and ezdxf reads the output with
/// every input entity kept and the tool's layers present.
#[test]
fn the_demo_arch_is_assessed_and_drawn() {
    let demo = root().join("demo-drawings/wrenfield-bridge.dxf");
    let dir = temp();
    let out = dir.path().join("o.dxf");
    let report = dir.path().join("r.json");
    let run = hangline(&[
        "assess",
        &demo.display().to_string(),
        "-o",
        &out.display().to_string(),
        "--report",
        &report.display().to_string(),
        "--unit-weight",
        "22 kN/m3",
        "--fill-weight",
        "18 kN/m3",
        "--width",
        "1.2",
        "--live-load",
        "80 kN",
    ])
    .ok();
    assert!(run.stdout.contains("caution"), "{}", run.stdout);
    let r = json(&report);
    let (lo, hi) = (num(&r["thrust"]["min"]["horizontal"]), num(&r["thrust"]["max"]["horizontal"]));
    assert!(lo > 0.0 && lo < hi, "{lo} {hi}");
    assert!(r["thrust"]["min"]["hinges"].as_array().is_some_and(|h| h.len() >= 3));
    assert!(num(&r["least_thickness"]["geometric_factor"]) > 1.0);
    assert_eq!(r["voussoirs"].as_array().map(Vec::len), Some(48));
    // The loads add up: masonry, fill and the surfacing (6.5 kN/m over the
    // extrados' x-range).
    let sum = |key: &str| r["voussoirs"].as_array().map_or(0.0, |v| v.iter().map(|b| num(&b[key])).sum::<f64>());
    let area = num(&r["arch"]["area"]);
    assert!(close(sum("own_weight"), area * 22.0 * 1.2, 1e-9, 0.0), "{} vs {}", sum("own_weight"), area * 26.4);
    assert!(sum("fill") > 0.0 && sum("applied") > 0.0);
    let live = &r["live_load"];
    assert!(num(&live["factor"]) > 1.0, "{live}");
    assert!(live["collapse"]["hinges"].as_array().is_some_and(|h| h.len() >= 4), "a mechanism");
    assert_eq!(live["sweep"].as_array().map(Vec::len), Some(48));
    // The least factor of the sweep is the one reported.
    let least =
        live["sweep"].as_array().into_iter().flatten().filter_map(|s| s["factor"].as_f64()).fold(f64::MAX, f64::min);
    assert_eq!(least, num(&live["factor"]));
    assert!(r["caution"].as_str().is_some_and(|c| c.contains("qualified engineer")));
    if let Some(py) = python() {
        let c = check_output(&py, &demo, &out);
        assert_eq!(c["clean"], true, "{}", c["problems"]);
        assert_eq!(c["audit_errors"], 0);
        for layer in ["HANGLINE-VOUSSOIRS", "HANGLINE-THRUST-MIN", "HANGLINE-THRUST-MAX", "HANGLINE-HINGES"] {
            assert!(c["tool_layers"][layer]["counts"].is_object(), "{layer}: {}", c["tool_layers"]);
        }
    }
}

/// Bad geometry: one line naming the fault and where, exit 1, no output.
#[test]
fn bad_arches_are_refused_with_the_place_of_the_fault() {
    let cases = [
        ("bad-crossing-faces.dxf", vec!["cross", "(-3.8"]),
        ("bad-open-extrados.dxf", vec!["does not meet the rest", "EXTRADOS", "close the gap"]),
    ];
    for (name, words) in cases {
        let e = assess(&drawing(name), &["--unit-weight", "20 kN/m3"]).expect_err(name);
        for w in words {
            assert!(e.contains(w), "{name}: '{w}' not in {e}");
        }
    }
    let e = assess(&drawing("semicircle-m-r2018.dxf"), &["--unit-weight", "20 kN/m3", "--layer", "intrados=SOFFIT"])
        .expect_err("no such layer");
    assert!(e.contains("SOFFIT") && e.contains("--layer intrados=NAME"), "{e}");
    let e =
        assess(&drawing("semicircle-m-r2018.dxf"), &["--unit-weight", "20 kN/m3"]).expect_err("fill needs a weight");
    assert!(e.contains("--fill-weight"), "{e}");
}

/// An arch too thin for any thrust line: not an error but a result, said
/// loudly — a semicircle of t/R = 0.05 needs about 0.1075/0.05 = 2.15 times
/// its thickness (Milankovitch 1907, from memory).
#[test]
fn an_arch_too_thin_is_reported_as_not_standing() {
    let (r, printed) = assess(&drawing("bad-too-thin.dxf"), &["--unit-weight", "20 kN/m3", "--voussoirs", "288"])
        .unwrap_or_else(|e| panic!("{e}"));
    assert!(r["thrust"]["min"].is_null() && r["thrust"]["max"].is_null());
    let ratio = num(&r["least_thickness"]["ratio"]);
    assert!((ratio - 0.1075 / 0.05).abs() < 0.01, "{ratio}");
    assert_eq!(r["least_thickness"]["stands"], false);
    assert!(printed.contains("no thrust line fits inside the arch"), "{printed}");
}
