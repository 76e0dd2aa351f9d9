//! Inputs that once made the tool panic or exhaust memory (found while
//! fuzzing; see tests/regressions/README.md): each must now end in a
//! result or a one-line error.

use crate::util::{hangline, root, temp};

#[test]
fn regression_inputs_end_cleanly() {
    let dir = root().join("tests/regressions");
    let mut count = 0;
    for entry in std::fs::read_dir(&dir).expect("tests/regressions") {
        let path = entry.expect("entry").path();
        if path.extension().is_none_or(|e| e != "dxf") {
            continue;
        }
        let out = temp();
        let run = hangline(&[
            "solve",
            &path.display().to_string(),
            "--sag",
            "1",
            "-o",
            &out.path().join("o.dxf").display().to_string(),
            "-q",
        ]);
        let name = path.display();
        assert!(run.code == Some(0) || run.code == Some(1), "{name}: exit {:?}\n{}", run.code, run.stderr);
        assert!(!run.stderr.contains("panicked"), "{name}: {}", run.stderr);
        if run.code == Some(1) {
            let errors: Vec<&str> = run.stderr.lines().filter(|l| l.starts_with("hangline: error:")).collect();
            assert_eq!(errors.len(), 1, "{name}: {}", run.stderr);
        }
        count += 1;
    }
    assert!(count >= 8, "only {count} regression inputs");
}
