//! Helpers: run the binary, find fixtures, run the outside reader.

use std::path::{Path, PathBuf};
use std::process::Command;
use std::sync::OnceLock;

use serde_json::Value;

/// What a run printed and returned.
pub struct Run {
    pub code: Option<i32>,
    pub stdout: String,
    pub stderr: String,
}

impl Run {
    /// Asserts success and returns self.
    #[track_caller]
    pub fn ok(self) -> Run {
        assert_eq!(self.code, Some(0), "hangline failed:\nstdout: {}\nstderr: {}", self.stdout, self.stderr);
        self
    }
}

/// Runs the hangline binary.
pub fn hangline<S: AsRef<std::ffi::OsStr>>(args: &[S]) -> Run {
    let out = Command::new(env!("CARGO_BIN_EXE_hangline")).args(args).output().expect("the binary runs");
    Run {
        code: out.status.code(),
        stdout: String::from_utf8_lossy(&out.stdout).into_owned(),
        stderr: String::from_utf8_lossy(&out.stderr).into_owned(),
    }
}

/// The repository root.
pub fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

/// A file in fixtures/.
pub fn fixture(name: &str) -> PathBuf {
    root().join("fixtures").join(name)
}

/// A fresh temporary folder.
pub fn temp() -> tempfile::TempDir {
    tempfile::tempdir().expect("a temporary folder")
}

/// Reads a JSON file.
pub fn json(path: &Path) -> Value {
    let text = std::fs::read_to_string(path).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
    serde_json::from_str(&text).unwrap_or_else(|e| panic!("{}: {e}", path.display()))
}

/// The expectation files of the good fixtures, by name.
pub fn expectations() -> Vec<(String, Value)> {
    let mut out = Vec::new();
    for entry in std::fs::read_dir(root().join("fixtures")).expect("fixtures/") {
        let path = entry.expect("an entry").path();
        let name = path.file_name().and_then(|n| n.to_str()).unwrap_or_default().to_string();
        if let Some(stem) = name.strip_suffix(".expect.json") {
            out.push((stem.to_string(), json(&path)));
        }
    }
    out.sort_by(|a, b| a.0.cmp(&b.0));
    assert!(out.len() >= 10, "the fixtures' expectation files are missing");
    out
}

/// The command-line arguments of an expectation case.
pub fn case_args(args: &Value) -> Vec<String> {
    let mut out = Vec::new();
    let Some(map) = args.as_object() else { return out };
    for (k, v) in map {
        match (k.as_str(), v) {
            ("arch", Value::Bool(true)) => out.push("--arch".into()),
            ("through", Value::Array(p)) => {
                out.push("--through".into());
                out.push(format!("{},{}", p[0], p[1]));
            }
            (key, v) => {
                out.push(format!("--{key}"));
                out.push(v.to_string());
            }
        }
    }
    out
}

/// The read options of an expectation file as arguments.
pub fn read_args(expect: &Value) -> Vec<String> {
    let mut out = Vec::new();
    if let Some(u) = expect["read_options"]["units"].as_str() {
        out.push("--units".into());
        out.push(u.into());
    }
    out
}

/// The Python that has ezdxf, if any. When `HANGLINE_PYTHON` names one (the
/// README's test command does) or `CI` is set, its absence fails the test
/// instead of skipping it: the outside checks must run there.
pub fn python() -> Option<PathBuf> {
    static FOUND: OnceLock<Option<PathBuf>> = OnceLock::new();
    let found = FOUND.get_or_init(|| {
        let candidates: Vec<PathBuf> = std::env::var_os("HANGLINE_PYTHON")
            .map(PathBuf::from)
            .into_iter()
            .chain([root().join(".venv/bin/python")])
            .collect();
        candidates.into_iter().find(|p| {
            Command::new(p).args(["-c", "import ezdxf"]).output().map(|o| o.status.success()).unwrap_or(false)
        })
    });
    // The README's test command names the reader (HANGLINE_PYTHON), and CI
    // sets CI: either way a missing reader fails the checks, never skips them.
    let required = std::env::var_os("HANGLINE_PYTHON").is_some()
        || std::env::var("CI").is_ok_and(|v| !v.is_empty() && v != "false");
    if found.is_none() && required {
        panic!(
            "ezdxf is needed for the outside-reader checks (HANGLINE_PYTHON or CI is set): \
             run the README's test command, which installs it"
        );
    }
    found.clone()
}

/// The Python that has ezdxf, or `None` after saying on stderr that the
/// check is skipped (only where [`python`] allows skipping at all).
pub fn python_or_skip() -> Option<PathBuf> {
    let found = python();
    if found.is_none() {
        eprintln!("skipped: no Python with ezdxf (run the README's test command)");
    }
    found
}

/// Runs the outside checker (ezdxf) on an output drawing and its input.
pub fn check_output(py: &Path, input: &Path, output: &Path) -> Value {
    let out = Command::new(py)
        .arg(root().join("tests/outside/check_output.py"))
        .arg(input)
        .arg(output)
        .output()
        .expect("python runs");
    assert!(out.status.success(), "checker failed: {}", String::from_utf8_lossy(&out.stderr));
    serde_json::from_slice(&out.stdout).expect("the checker prints JSON")
}

/// Relative difference, safe at zero.
pub fn close(a: f64, b: f64, rel: f64, abs: f64) -> bool {
    (a - b).abs() <= abs.max(rel * a.abs().max(b.abs()))
}
