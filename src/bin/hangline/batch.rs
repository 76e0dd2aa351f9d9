//! Many drawings at once: folders, glob patterns or a job file, solved in
//! parallel (rayon), with a progress bar (indicatif) and a summary table.
//! One drawing's failure never stops the others.

use std::path::{Path, PathBuf};

use anyhow::{Context, Result, bail};
use clap::Parser;
use indicatif::{ProgressBar, ProgressStyle};
use rayon::prelude::*;
use serde::Serialize;

use crate::args::{Cli, Command, SolveArgs};
use crate::{default_output, solve_one};
use hangline::layout::nice::fmt_force;

/// True when the arguments ask for more than one drawing, or for a folder,
/// a pattern or a job file.
pub fn is_batch(a: &SolveArgs) -> bool {
    a.jobs.is_some() || a.input.len() != 1 || a.input.iter().any(|p| p.is_dir() || is_pattern(p))
}

fn is_pattern(p: &Path) -> bool {
    p.to_string_lossy().contains(['*', '?', '['])
}

/// One drawing to solve, with its options.
struct Task {
    input: PathBuf,
    args: SolveArgs,
}

/// How one drawing went, for the table and the JSON summary.
#[derive(Debug, Serialize)]
struct Row {
    drawing: String,
    /// `solved`, `failed` or `skipped`.
    result: &'static str,
    #[serde(skip_serializing_if = "Option::is_none")]
    output: Option<String>,
    #[serde(skip_serializing_if = "Option::is_none")]
    thrust: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    max_force: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    force_unit: Option<String>,
    warnings: usize,
    #[serde(skip_serializing_if = "Option::is_none")]
    reason: Option<String>,
}

fn skipped(drawing: &Path, reason: &str) -> Row {
    Row {
        drawing: drawing.display().to_string(),
        result: "skipped",
        output: None,
        thrust: None,
        max_force: None,
        force_unit: None,
        warnings: 0,
        reason: Some(reason.to_string()),
    }
}

fn is_dxf(p: &Path) -> bool {
    p.extension().is_some_and(|e| e.eq_ignore_ascii_case("dxf"))
}

/// The tool's own outputs are not inputs of a batch.
fn is_own_output(p: &Path) -> bool {
    p.file_stem().is_some_and(|s| s.to_string_lossy().ends_with("-hangline"))
}

/// The drawings a folder holds, sorted (sub-folders too with `recursive`).
fn folder(dir: &Path, recursive: bool, found: &mut Vec<PathBuf>) -> Result<()> {
    let mut entries: Vec<PathBuf> = std::fs::read_dir(dir)
        .with_context(|| format!("cannot read the folder {}", dir.display()))?
        .filter_map(|e| e.ok().map(|e| e.path()))
        .collect();
    entries.sort();
    for p in entries {
        if p.is_dir() {
            if recursive {
                folder(&p, recursive, found)?;
            }
        } else if is_dxf(&p) {
            found.push(p);
        }
    }
    Ok(())
}

/// Expands the command line's inputs: files, folders, patterns.
fn expand(a: &SolveArgs) -> Result<Vec<PathBuf>> {
    let mut found = Vec::new();
    for p in &a.input {
        if p.is_dir() {
            folder(p, a.recursive, &mut found)?;
        } else if is_pattern(p) {
            let pattern = p.to_string_lossy();
            let paths = glob::glob(&pattern).with_context(|| format!("'{pattern}' is not a valid pattern"))?;
            let mut matched: Vec<PathBuf> = paths.filter_map(Result::ok).filter(|p| p.is_file()).collect();
            matched.sort();
            if matched.is_empty() {
                bail!("no file matches '{pattern}'");
            }
            found.extend(matched);
        } else {
            found.push(p.clone());
        }
    }
    Ok(found)
}

/// Reads a job file: one drawing a line, with its options.
fn job_file(path: &Path, defaults: &SolveArgs) -> Result<Vec<Task>> {
    let text = std::fs::read_to_string(path).with_context(|| format!("cannot read the job file {}", path.display()))?;
    let base = path.parent().unwrap_or(Path::new(""));
    let mut tasks = Vec::new();
    for (n, line) in text.lines().enumerate() {
        let line = line.trim();
        if line.is_empty() || line.starts_with('#') {
            continue;
        }
        let at = || format!("{} line {}", path.display(), n + 1);
        let words = shlex::split(line).with_context(|| format!("{}: unbalanced quotes", at()))?;
        let mut argv = vec!["hangline".to_string(), "solve".to_string()];
        argv.extend(words);
        let cli = Cli::try_parse_from(&argv).map_err(|e| {
            let first = e.to_string().lines().next().unwrap_or_default().trim_start_matches("error: ").to_string();
            anyhow::anyhow!("{}: {first}", at())
        })?;
        let Command::Solve(line_args) = cli.command else { bail!("{}: not a drawing with options", at()) };
        if line_args.input.len() != 1 {
            bail!("{}: give one drawing a line", at());
        }
        let mut args = line_args.or(defaults);
        let input = base.join(&line_args.input[0]);
        args.input = vec![input.clone()];
        args.output = line_args.output.as_ref().map(|o| base.join(o));
        args.report = line_args.report.as_ref().map(|r| base.join(r));
        if let Some(c) = &line_args.catalogue {
            args.catalogue = Some(base.join(c));
        }
        args.preview = line_args.preview.as_ref().map(|r| base.join(r));
        tasks.push(Task { input, args });
    }
    if tasks.is_empty() {
        bail!("the job file {} lists no drawing", path.display());
    }
    Ok(tasks)
}

/// A folder given for the outputs of a batch (created if need be).
fn out_folder(p: &Option<PathBuf>, what: &str) -> Result<Option<PathBuf>> {
    match p {
        Some(dir) => {
            if dir.is_file() {
                bail!("with several drawings, {what} names a folder, and {} is a file", dir.display());
            }
            std::fs::create_dir_all(dir).with_context(|| format!("cannot create the folder {}", dir.display()))?;
            Ok(Some(dir.clone()))
        }
        None => Ok(None),
    }
}

fn stem(p: &Path) -> String {
    p.file_stem().map_or_else(|| "drawing".into(), |s| s.to_string_lossy().into_owned())
}

/// Runs a batch; prints the table; true when nothing failed.
pub fn run(a: &SolveArgs) -> Result<bool> {
    let mut rows_skipped = Vec::new();
    let tasks: Vec<Task> = match &a.jobs {
        Some(jobs) => {
            if !a.input.is_empty() {
                bail!("give the drawings either on the command line or in --jobs, not both");
            }
            job_file(jobs, a)?
        }
        None => {
            let out_dir = out_folder(&a.output, "-o")?;
            let mut tasks = Vec::new();
            for input in expand(a)? {
                if is_own_output(&input) {
                    rows_skipped.push(skipped(&input, "the tool's own output"));
                    continue;
                }
                let mut args = a.or(a);
                args.input = vec![input.clone()];
                args.report = None;
                args.preview = None;
                args.output = out_dir.as_ref().map(|d| d.join(format!("{}-hangline.dxf", stem(&input))));
                tasks.push(Task { input, args });
            }
            tasks
        }
    };
    let report_dir = if a.jobs.is_none() { out_folder(&a.report, "--report")? } else { None };
    let preview_dir = if a.jobs.is_none() { out_folder(&a.preview, "--preview")? } else { None };
    let pool = rayon::ThreadPoolBuilder::new()
        .num_threads(a.threads.unwrap_or(0))
        .build()
        .context("cannot start the worker threads")?;
    let bar = ProgressBar::new(tasks.len() as u64);
    bar.set_style(
        ProgressStyle::with_template("{bar:40} {pos}/{len} drawings  {elapsed_precise}  {msg}")
            .unwrap_or_else(|_| ProgressStyle::default_bar()),
    );
    if a.quiet {
        bar.set_draw_target(indicatif::ProgressDrawTarget::hidden());
    }
    let rows: Vec<Row> = pool.install(|| {
        tasks
            .par_iter()
            .map(|t| {
                let row = solve_task(t, report_dir.as_deref(), preview_dir.as_deref());
                bar.set_message(t.input.display().to_string());
                bar.inc(1);
                row
            })
            .collect()
    });
    bar.finish_and_clear();
    let mut all: Vec<Row> = rows;
    all.extend(rows_skipped);
    print_table(&all, a.quiet);
    if let Some(path) = &a.summary {
        let text = serde_json::to_string_pretty(&all)?;
        std::fs::write(path, text + "\n").with_context(|| format!("cannot write {}", path.display()))?;
    }
    Ok(all.iter().all(|r| r.result != "failed"))
}

fn solve_task(t: &Task, report_dir: Option<&Path>, preview_dir: Option<&Path>) -> Row {
    let drawing = t.input.display().to_string();
    let result = t.args.job().and_then(|job| {
        let output = t.args.output.clone().unwrap_or_else(|| default_output(&t.input));
        let report =
            t.args.report.clone().or_else(|| report_dir.map(|d| d.join(format!("{}-hangline.json", stem(&t.input)))));
        let preview =
            t.args.preview.clone().or_else(|| preview_dir.map(|d| d.join(format!("{}-hangline.svg", stem(&t.input)))));
        let files = crate::Files { report: report.clone(), sheet: None, preview };
        solve_one(&t.input, &output, &files, &job, t.args.force)
    });
    match result {
        Ok(done) => {
            let s = &done.outcome.solution;
            let u = done.outcome.reading.structure.units();
            Row {
                drawing,
                result: "solved",
                output: Some(done.output.display().to_string()),
                thrust: Some(s.thrust),
                max_force: Some(s.max_force()),
                force_unit: Some(u.force.to_string()),
                warnings: done.outcome.reading.warnings.len() + s.warnings.len(),
                reason: None,
            }
        }
        Err(e) => Row {
            drawing,
            result: "failed",
            output: None,
            thrust: None,
            max_force: None,
            force_unit: None,
            warnings: 0,
            reason: Some(format!("{e:#}")),
        },
    }
}

#[allow(clippy::print_stdout)]
fn print_table(rows: &[Row], quiet: bool) {
    let width = rows.iter().map(|r| r.drawing.chars().count()).max().unwrap_or(7).clamp(7, 60);
    if !quiet {
        println!("{:<width$}  {:<7}  {:>12}  {:>14}  output or reason", "drawing", "result", "H", "largest force");
    }
    for r in rows {
        if quiet && r.result != "failed" {
            continue;
        }
        let unit = r.force_unit.as_deref().and_then(|u| u.parse().ok());
        let f = |v: Option<f64>| match (v, unit) {
            (Some(v), Some(u)) => fmt_force(v, u),
            _ => String::new(),
        };
        let tail = match (&r.output, &r.reason) {
            (Some(o), _) if r.warnings > 0 => format!("{o} ({} warnings)", r.warnings),
            (Some(o), _) => o.clone(),
            (None, Some(why)) => why.clone(),
            _ => String::new(),
        };
        println!("{:<width$}  {:<7}  {:>12}  {:>14}  {tail}", r.drawing, r.result, f(r.thrust), f(r.max_force));
    }
    let count = |what: &str| rows.iter().filter(|r| r.result == what).count();
    if !quiet || count("failed") > 0 {
        println!(
            "{} drawings: {} solved, {} failed, {} skipped",
            rows.len(),
            count("solved"),
            count("failed"),
            count("skipped")
        );
    }
}
