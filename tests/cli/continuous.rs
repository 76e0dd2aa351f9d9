//! Distributed loads and self-weight, end to end on drawings written by
//! ezdxf (fixtures/continuous/, made by tools/fixtures/make_continuous.py),
//! checked against the published closed forms.

use serde_json::Value;

use crate::util::{check_output, close, hangline, json, python_or_skip, root, temp};

fn drawing(name: &str) -> String {
    root().join("fixtures/continuous").join(name).display().to_string()
}

/// Solves a drawing with `args`; returns the report, or the failed run's
/// message (and asserts nothing was written).
fn solve(name: &str, args: &[&str]) -> Result<Value, String> {
    let dir = temp();
    let out = dir.path().join("o.dxf");
    let report = dir.path().join("r.json");
    let mut all = vec![
        "solve".to_string(),
        drawing(name),
        "-o".into(),
        out.display().to_string(),
        "--report".into(),
        report.display().to_string(),
        "-q".into(),
    ];
    all.extend(args.iter().map(|s| s.to_string()));
    let run = hangline(&all);
    if run.code == Some(0) {
        Ok(json(&report))
    } else {
        assert_eq!(run.code, Some(1), "{}", run.stderr);
        assert!(!out.exists() && !report.exists(), "no output after an error");
        Err(run.stderr)
    }
}

fn nodes(r: &Value) -> Vec<(f64, f64)> {
    r["nodes"]
        .as_array()
        .expect("nodes")
        .iter()
        .map(|n| (n["x"].as_f64().unwrap_or(f64::NAN), n["y"].as_f64().unwrap_or(f64::NAN)))
        .collect()
}

/// T. G. Hicks (ed.), *Civil Engineering Formulas*, ch. 10, eqs. 10.57–10.59
/// and 10.81–10.87 (also H. M. Irvine, *Cable Structures*, 1981, ch. 1):
/// a cable under w per horizontal length over a level span L with sag f has
/// H = wL²/(8f), T_max = √(H² + (wL/2)²) and length
/// S = (L/2)√(1 + (wL/2H)²) + (H/w)·asinh(wL/2H). Check case: L = 100 m,
/// f = 10 m, w = 10 kN/m → H = 1250 kN, T_max = 1346.291 kN, S = 102.60606 m.
#[test]
fn uniform_load_gives_the_parabola_in_every_version() {
    for (name, k) in [
        ("uniform-m-r12.dxf", 1.0),
        ("uniform-m-r2000.dxf", 1.0),
        ("uniform-m-r2013.dxf", 1.0),
        ("uniform-m-r2018.dxf", 1.0),
        ("uniform-m-r2018-bin.dxf", 1.0),
        ("uniform-mm-r2013.dxf", 1000.0),
    ] {
        let units: &[&str] = if name.contains("r12") { &["--units", "m"] } else { &[] };
        let sag = format!("{}", 10.0 * k);
        let mut args = vec!["--sag", sag.as_str()];
        args.extend_from_slice(units);
        let r = solve(name, &args).unwrap_or_else(|e| panic!("{name}: {e}"));
        let (w, l, f) = (10.0 / k, 100.0 * k, 10.0 * k);
        let h = w * l * l / (8.0 * f);
        assert!(close(r["thrust"].as_f64().unwrap_or(0.0), h, 1e-12, 0.0), "{name}: H {}", r["thrust"]);
        assert!((h - 1250.0).abs() < 1e-9, "{name}");
        let t_max = h.hypot(w * l / 2.0);
        assert!(close(r["peak"]["force"].as_f64().unwrap_or(0.0), t_max, 1e-9, 0.0), "{name}: {}", r["peak"]);
        assert_eq!(format!("{t_max:.3}"), "1346.291");
        let q = w * l / (2.0 * h);
        let s = l / 2.0 * q.hypot(1.0) + h / w * q.asinh();
        assert!(close(r["length"].as_f64().unwrap_or(0.0), s, 1e-9, 0.0), "{name}: S {}", r["length"]);
        assert_eq!(format!("{:.5}", s / k), "102.60606");
        // Every node on y = y_L − 4f·x(L − x)/L².
        for (x, y) in nodes(&r) {
            let want = 20.0 * k - 4.0 * f * x * (l - x) / (l * l);
            assert!((y - want).abs() <= 1e-9 * l, "{name}: node ({x}, {y}) vs {want}");
        }
        assert!(nodes(&r).len() > 10, "{name}: a smooth profile");
    }
}

/// The deck loads reach the hangers as simple-span reactions (the lever
/// rule; common practice, no source), computed here independently; the
/// cable then carries point loads, checked by the moment relation
/// (Beer & Johnston, *Vector Mechanics for Engineers: Statics*, §7.8–7.9).
#[test]
fn deck_loads_are_carried_to_the_hangers() {
    for name in ["deck-m-r2000.dxf", "deck-m-r2018-bin.dxf"] {
        let r = solve(name, &["--sag", "3"]).unwrap_or_else(|e| panic!("{name}: {e}"));
        // 6 kN/m on 0–18 m; 0.2→0.5 kip/ft on 18–30 m; hangers every 3 m.
        let kip_ft = 4.448_221_615_260_5 / 0.3048; // kN/m per kip/ft (NIST SP 811, 2008)
        let w = |x: f64| if x <= 18.0 { 6.0 } else { (0.2 + 0.3 * (x - 18.0) / 12.0) * kip_ft };
        let mut expected = [0.0; 11];
        for p in 0..10 {
            let (a, b) = (3.0 * p as f64, 3.0 * (p + 1) as f64);
            // Simpson on a linear piece is exact.
            let (wa, wm, wb) = (w(a + 1e-12), w((a + b) / 2.0), w(b - 1e-12));
            let total = (b - a) * (wa + 4.0 * wm + wb) / 6.0;
            let moment_about_a = (b - a) * (b - a) * (4.0 * wm * 0.5 + wb) / 6.0;
            expected[p + 1] += moment_about_a / (b - a);
            expected[p] += total - moment_about_a / (b - a);
        }
        let shares = r["hangers"].as_array().expect("shares");
        assert_eq!(shares.len(), 9, "{name}");
        for (k, sh) in shares.iter().enumerate() {
            let got = sh["load"].as_f64().unwrap_or(0.0);
            assert!((got - expected[k + 1]).abs() < 1e-9, "{name}: hanger {k}: {got} vs {}", expected[k + 1]);
        }
        assert!((r["to_supports"][0].as_f64().unwrap_or(0.0) - expected[0]).abs() < 1e-9, "{name}");
        assert!((r["to_supports"][1].as_f64().unwrap_or(0.0) - expected[10]).abs() < 1e-9, "{name}");
        // The 25 kN point load is at the hanger at 12 m: one load there.
        let at12 = r["loads"].as_array().expect("loads").iter().find(|l| l["node"]["x"] == 12.0).expect("x = 12");
        assert!((at12["magnitude"].as_f64().unwrap_or(0.0) - (25.0 + expected[4])).abs() < 1e-9, "{name}");
        assert!(r["checks"]["closed_form"].as_f64().is_some_and(|e| e <= 1e-9), "{name}");
        assert_eq!(r["distributed"].as_array().map(Vec::len), Some(2));
    }
}

/// Self-weight alone: the catenary. Beer & Johnston, §7.10 (and Hibbeler,
/// *Engineering Mechanics: Statics*, §7.4, section number from memory):
/// y = a·cosh(x/a) from the directrix, H = w·a, and for supports L apart
/// and h apart in height with a cable of length S,
/// √(S² − h²) = 2a·sinh(L/2a). Solved for a here by bisection.
#[test]
fn self_weight_alone_gives_the_catenary() {
    let (l, h, q, s) = (120.0_f64, 10.0_f64, 0.5_f64, 140.0_f64);
    let target = (s * s - h * h).sqrt();
    let (mut lo, mut hi) = (1.0, 1e6);
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if 2.0 * mid * (l / (2.0 * mid)).sinh() > target { lo = mid } else { hi = mid }
    }
    let a = 0.5 * (lo + hi);
    for name in ["bare-m-r2013.dxf", "bare-m-r2018-bin.dxf"] {
        let r =
            solve(name, &["--self-weight", "0.5 kN/m", "--length", "140"]).unwrap_or_else(|e| panic!("{name}: {e}"));
        let got = r["thrust"].as_f64().unwrap_or(0.0);
        assert!(close(got, q * a, 1e-9, 0.0), "{name}: H {got} vs {}", q * a);
        assert!(close(r["length"].as_f64().unwrap_or(0.0), s, 1e-9, 0.0), "{name}");
        assert!(r["iterations"].as_u64().is_some_and(|n| n > 0), "{name}");
        // Every node on one catenary: y = c + a·cosh((x − x₀)/a) through both supports.
        let pts = nodes(&r);
        let (x0, c) = {
            // From the two supports: a·(cosh((L − x₀)/a) − cosh(x₀/a)) = h.
            let (mut lo, mut hi) = (-10.0 * l, 10.0 * l);
            let g = |x0: f64| a * (((l - x0) / a).cosh() - (x0 / a).cosh()) - h;
            for _ in 0..300 {
                let mid = 0.5 * (lo + hi);
                if g(lo) * g(mid) <= 0.0 { hi = mid } else { lo = mid }
            }
            let x0 = 0.5 * (lo + hi);
            (x0, 40.0 - a * (x0 / a).cosh())
        };
        for (x, y) in &pts {
            let want = c + a * ((x - x0) / a).cosh();
            assert!((y - want).abs() <= 1e-9 * l, "{name}: ({x}, {y}) vs {want}");
        }
        // The largest tension is at the higher support: T = w·y above the directrix.
        let t_high = q * (50.0 - c);
        assert!(close(r["peak"]["force"].as_f64().unwrap_or(0.0), t_high, 1e-9, 0.0), "{name}: {}", r["peak"]);
    }
}

/// With an axial stiffness, the unstressed length is reported, and giving
/// it back as the condition returns the same cable (elastic catenary; the
/// solver's own tests compare it with Irvine, *Cable Structures*, 1981, ch. 2).
#[test]
fn the_unstressed_length_round_trips() {
    let r = solve("bare-m-r2013.dxf", &["--self-weight", "0.5 kN/m", "--sag", "20", "--axial-stiffness", "20 MN"])
        .expect("solves");
    let s0 = r["unstressed_length"].as_f64().expect("unstressed length");
    let s = r["length"].as_f64().expect("length");
    assert!(s0 < s && s0 > 0.99 * s, "{s0} vs {s}");
    let s0_text = format!("{s0:.15}");
    let back = solve(
        "bare-m-r2013.dxf",
        &["--self-weight", "0.5 kN/m", "--unstressed-length", &s0_text, "--axial-stiffness", "20 MN"],
    )
    .expect("solves");
    assert!(close(back["thrust"].as_f64().unwrap_or(0.0), r["thrust"].as_f64().unwrap_or(0.0), 1e-8, 0.0));
}

#[test]
fn bad_distributed_loads_and_lengths() {
    let e = solve("bad-overlap.dxf", &["--sag", "2"]).unwrap_err();
    assert!(e.contains("overlap from x = 8 to x = 10") && e.contains("one stretch per part"), "{e}");
    let e = solve("bad-bad-unit.dxf", &["--sag", "2"]).unwrap_err();
    assert!(e.contains("'5 kN/s'") && e.contains("kN/m"), "{e}");
    let e = solve("bad-force-on-stretch.dxf", &["--sag", "2"]).unwrap_err();
    assert!(e.contains("distributed load") && e.contains("'12 kN/m'"), "{e}");
    // A cable shorter than its chord.
    let e = solve("uniform-m-r2000.dxf", &["--length", "99.9"]).unwrap_err();
    assert!(e.contains("--length") && e.contains("chord"), "{e}");
    let e = solve("uniform-m-r2000.dxf", &["--length", "-3"]).unwrap_err();
    assert!(e.contains("--length") && e.contains("positive"), "{e}");
    let e = solve("uniform-m-r2000.dxf", &["--sag", "10", "--self-weight", "5 kN"]).unwrap_err();
    assert!(e.contains("--self-weight"), "{e}");
}

/// The outputs of continuous loads pass the outside reader too (ezdxf:
/// loads, audit clean, nothing of the input lost).
#[test]
fn continuous_outputs_pass_the_outside_reader() {
    let Some(py) = python_or_skip() else { return };
    for (name, args) in [
        ("uniform-m-r12.dxf", vec!["--sag", "10", "--units", "m"]),
        ("uniform-m-r2018-bin.dxf", vec!["--sag", "10"]),
        ("deck-m-r2000.dxf", vec!["--sag", "3"]),
        ("bare-m-r2013.dxf", vec!["--self-weight", "0.5 kN/m", "--length", "140"]),
    ] {
        let dir = temp();
        let out = dir.path().join("o.dxf");
        let mut all = vec!["solve".to_string(), drawing(name), "-o".into(), out.display().to_string(), "-q".into()];
        all.extend(args.iter().map(|s| s.to_string()));
        hangline(&all).ok();
        let c = check_output(&py, &root().join("fixtures/continuous").join(name), &out);
        assert_eq!(c["clean"], true, "{name}: {}", c["problems"]);
        assert_eq!(c["audit_errors"], 0, "{name}");
        assert!(c["tool_layers"]["HANGLINE-LOAD-DIAGRAM"]["counts"].is_object(), "{name}: the load diagram is drawn");
    }
}
