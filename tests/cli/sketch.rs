//! Following a sketch end to end: the fixture's SKETCH polyline lies on the
//! funicular of thrust 250 kN (invented; its vertices computed from
//! y = chord − M(x)/H, Beer & Johnston, *Vector Mechanics for Engineers:
//! Statics*, §7.8–7.9), so the thrust it supplies is 250 kN and the
//! deviations are round-off.

use crate::cases::solve_report;
use crate::util::{fixture, hangline, temp};

#[test]
fn the_sketch_supplies_the_thrust() {
    let r = solve_report("sketch-m-r2018", &[], &[]);
    let h = r["thrust"].as_f64().expect("thrust");
    assert!((h - 250.0).abs() <= 1e-9 * 250.0, "H = {h}");
    let s = &r["sketch"];
    assert_eq!(s["mode"], "fitted");
    assert_eq!(s["points_used"], 21);
    assert!(s["rms"].as_f64().expect("rms") <= 1e-9 && s["max"].as_f64().expect("max") <= 1e-9, "{s}");
    assert!(s["at"]["x"].is_f64() && s["at"]["y"].is_f64(), "{s}");
    assert_eq!(s["conditions_supplied"][0]["kind"], "thrust");
    assert!(r["conditions"].as_array().expect("conditions").iter().any(|c| c["kind"] == "thrust"));
}

#[test]
fn with_three_conditions_the_sketch_is_only_compared() {
    let r = solve_report("sketch-m-r2018", &[], &["--thrust".into(), "250".into()]);
    assert_eq!(r["sketch"]["mode"], "compared");
    assert!(r["sketch"]["max"].as_f64().expect("max") <= 1e-9);
    assert!(
        r["warnings"]
            .as_array()
            .expect("warnings")
            .iter()
            .any(|w| w.as_str().is_some_and(|w| w.contains("only compared")))
    );
}

#[test]
fn a_renamed_sketch_layer_must_exist_and_a_sag_makes_three() {
    let dir = temp();
    let out = dir.path().join("out.dxf");
    let input = fixture("sketch-m-r2018.dxf").display().to_string();
    let run = hangline(&["solve", &input, "-o", &out.display().to_string(), "--layer", "sketch=IDEA"]);
    assert_eq!(run.code, Some(1));
    assert!(run.stderr.contains("IDEA") && run.stderr.contains("--layer sketch=NAME"), "{}", run.stderr);
    // Both supports fixed plus --sag: three conditions, so it is compared, not refused.
    let run = hangline(&["solve", &input, "-o", &out.display().to_string(), "--sag", "3", "-q"]);
    assert_eq!(run.code, Some(0), "{}", run.stderr);
}
