//! Many drawings at once: a folder with a broken drawing solves the rest
//! and reports the broken one; a job file gives each drawing its options.

use crate::util::{fixture, hangline, json, temp};

#[test]
fn a_folder_with_a_broken_drawing() {
    let dir = temp();
    let input = dir.path().join("sheets");
    std::fs::create_dir(&input).expect("mkdir");
    for name in ["footbridge-m-r2018.dxf", "footbridge-m-r2018-bin.dxf", "blockloads-m-r2018.dxf"] {
        std::fs::copy(fixture(name), input.join(name)).expect("copy");
    }
    std::fs::copy(fixture("bad/truncated.dxf"), input.join("broken.dxf")).expect("copy");
    std::fs::copy(fixture("footbridge-m-r2018.dxf"), input.join("earlier-hangline.dxf")).expect("copy");
    std::fs::write(input.join("notes.txt"), "not a drawing").expect("write");
    let out = dir.path().join("out");
    let summary = dir.path().join("summary.json");
    let run = hangline(&[
        "solve",
        &input.display().to_string(),
        "--sag",
        "3.5",
        "-o",
        &out.display().to_string(),
        "--summary",
        &summary.display().to_string(),
        "--threads",
        "2",
    ]);
    // One failure: exit code 1, and everything else done.
    assert_eq!(run.code, Some(1), "{}\n{}", run.stdout, run.stderr);
    assert!(run.stdout.contains("5 drawings: 3 solved, 1 failed, 1 skipped"), "{}", run.stdout);
    assert!(run.stdout.contains("truncated"), "the reason is shown: {}", run.stdout);
    for name in ["footbridge-m-r2018", "footbridge-m-r2018-bin", "blockloads-m-r2018"] {
        assert!(out.join(format!("{name}-hangline.dxf")).is_file(), "{name}");
    }
    assert!(!out.join("broken-hangline.dxf").exists());
    let rows = json(&summary);
    let rows = rows.as_array().expect("rows");
    assert_eq!(rows.len(), 5);
    let broken = rows.iter().find(|r| r["drawing"].as_str().is_some_and(|d| d.ends_with("broken.dxf"))).expect("row");
    assert_eq!(broken["result"], "failed");
    // The ASCII and binary copies of one drawing give one answer.
    let h: Vec<f64> = rows
        .iter()
        .filter(|r| r["drawing"].as_str().is_some_and(|d| d.contains("footbridge")))
        .filter_map(|r| r["thrust"].as_f64())
        .collect();
    assert_eq!(h.len(), 2);
    assert!((h[0] - h[1]).abs() < 1e-9 * h[0]);
}

#[test]
fn a_job_file_gives_each_drawing_its_options() {
    let dir = temp();
    for name in ["footbridge-m-r2018.dxf", "parabola-mm-r2013.dxf"] {
        std::fs::copy(fixture(name), dir.path().join(name)).expect("copy");
    }
    let jobs = dir.path().join("jobs.txt");
    std::fs::write(
        &jobs,
        "# invented revision list\nfootbridge-m-r2018.dxf --sag 4.5 --report fb.json\n\n\"parabola-mm-r2013.dxf\" --thrust 500 --report pa.json\n",
    )
    .expect("write");
    let run = hangline(&["solve", "--jobs", &jobs.display().to_string()]);
    assert_eq!(run.code, Some(0), "{}\n{}", run.stdout, run.stderr);
    assert!(run.stdout.contains("2 drawings: 2 solved, 0 failed, 0 skipped"), "{}", run.stdout);
    let fb = json(&dir.path().join("fb.json"));
    assert!((fb["sag"]["value"].as_f64().unwrap_or(0.0) - 4.5).abs() < 1e-9);
    let pa = json(&dir.path().join("pa.json"));
    assert!((pa["thrust"].as_f64().unwrap_or(0.0) - 500.0).abs() < 1e-9);
    // A bad line names itself.
    std::fs::write(&jobs, "footbridge-m-r2018.dxf --sag\n").expect("write");
    let run = hangline(&["solve", "--jobs", &jobs.display().to_string()]);
    assert_eq!(run.code, Some(1));
    assert!(run.stderr.contains("jobs.txt line 1"), "{}", run.stderr);
}
