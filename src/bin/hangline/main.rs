//! The `hangline` command line: a thin layer over the library. It owns the
//! paths: reading the input, writing outputs to temporary files beside their
//! destinations and renaming them into place only when everything worked.

mod args;
mod batch;

use std::fs::File;
use std::io::{Read, Seek, SeekFrom, Write};
use std::path::{Path, PathBuf};
use std::process::ExitCode;

use anyhow::{Context, Result, bail};
use clap::Parser;

use args::{AssessArgs, Cli, Command, InspectArgs, SolveArgs};
use hangline::layout::assess::ASSESS_CAUTION;
use hangline::layout::nice::{fmt_force, fmt_length, member_name};
use hangline::layout::result_line;
use hangline::model::fmt_num;
use hangline::pipeline::assess::{AssessOutcome, prepare_assess};
use hangline::pipeline::{self, Job};
use hangline::report::assess::assess_report;
use hangline::report::{CAUTION, inspection, outcome_report};
use hangline::sheet::Picture;
use hangline::write::{Plan, Run};

fn main() -> ExitCode {
    let cli = Cli::parse();
    let result = match &cli.command {
        Command::Solve(a) => solve(a),
        Command::Assess(a) => assess(a),
        Command::Inspect(a) => inspect(a).map(|()| true),
    };
    match result {
        Ok(true) => ExitCode::SUCCESS,
        Ok(false) => ExitCode::from(1),
        Err(e) => {
            #[allow(clippy::print_stderr)]
            {
                eprintln!("hangline: error: {e:#}");
            }
            ExitCode::from(1)
        }
    }
}

#[allow(clippy::print_stdout)]
fn say(quiet: bool, line: &str) {
    if !quiet {
        println!("{line}");
    }
}

#[allow(clippy::print_stderr)]
fn warn(line: &str) {
    eprintln!("hangline: warning: {line}");
}

fn read_input(path: &Path) -> Result<Vec<u8>> {
    std::fs::read(path).with_context(|| format!("cannot read {}", path.display()))
}

/// What identifies a version of a file: its length and modification time.
type Stamp = (u64, Option<std::time::SystemTime>);

/// The input's current [`Stamp`].
fn file_stamp(f: &File) -> Result<Stamp> {
    let m = f.metadata().context("cannot read the input's metadata")?;
    Ok((m.len(), m.modified().ok()))
}

/// Opens the input, notes its version, and reads it whole.
fn open_input(path: &Path) -> Result<(File, Stamp, Vec<u8>)> {
    let mut f = File::open(path).with_context(|| format!("cannot read {}", path.display()))?;
    let stamp = file_stamp(&f)?;
    let mut bytes = Vec::with_capacity(usize::try_from(stamp.0).unwrap_or(0) + 1);
    f.read_to_end(&mut bytes).with_context(|| format!("cannot read {}", path.display()))?;
    Ok((f, stamp, bytes))
}

/// Writes the output: the unchanged runs copied from the input file by the
/// operating system (`copy_file_range` on Linux, through `std::io::copy`),
/// the new bytes written.
fn apply_plan(plan: &Plan, input: &File, out: &mut File) -> std::io::Result<()> {
    let mut reader = input;
    for run in plan.runs() {
        match run {
            Run::Copy(r) => {
                reader.seek(SeekFrom::Start(r.start as u64))?;
                let n = std::io::copy(&mut reader.take(r.len() as u64), out)?;
                if n != r.len() as u64 {
                    return Err(std::io::Error::new(std::io::ErrorKind::UnexpectedEof, "the input got shorter"));
                }
            }
            Run::Insert(b) => out.write_all(b)?,
        }
    }
    out.flush()
}

/// True when `a` and `b` name the same existing file.
fn same_file(a: &Path, b: &Path) -> bool {
    match (a.canonicalize(), b.canonicalize()) {
        (Ok(x), Ok(y)) => x == y,
        _ => false,
    }
}

/// INPUT-hangline.dxf beside the input.
pub fn default_output(input: &Path) -> PathBuf {
    let stem = input.file_stem().map_or_else(|| "drawing".into(), |s| s.to_string_lossy().into_owned());
    input.with_file_name(format!("{stem}-hangline.dxf"))
}

/// A temporary file in `dest`'s folder, to be renamed onto `dest`.
fn temp_beside(dest: &Path) -> Result<tempfile::NamedTempFile> {
    let dir = match dest.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => PathBuf::from("."),
    };
    tempfile::Builder::new()
        .prefix(".hangline-")
        .suffix(".tmp")
        .tempfile_in(&dir)
        .with_context(|| format!("cannot create a file in {}", dir.display()))
}

/// A drawing solved and written.
pub struct Done {
    /// What came of it.
    pub outcome: pipeline::Outcome,
    /// Where the drawing went.
    pub output: PathBuf,
}

/// Solves one drawing and writes its output (and report), each whole or not
/// at all.
pub fn solve_one(input: &Path, output: &Path, files: &Files, job: &Job, force: bool) -> Result<Done> {
    let input_name = input.display().to_string();
    let report_of = |o: &pipeline::Outcome| outcome_report(&input_name, o);
    let mut extras: Vec<Extra<'_, pipeline::Outcome>> = Vec::new();
    if let Some(path) = &files.report {
        extras.push(Extra { what: "report", path, make: Box::new(|o| json_bytes(&report_of(o))) });
    }
    let svg_of = |o: &pipeline::Outcome| {
        hangline::preview::svg(&hangline::preview::PreviewInput::solved(
            &input_name,
            &o.reading,
            &job.read.layers.deck,
            &o.additions,
            &job.layers,
        ))
    };
    if let Some(path) = &files.preview {
        picture_kind(path)?;
        extras.push(Extra { what: "preview", path, make: Box::new(move |o| picture(path, svg_of(o))) });
    }
    if let Some(path) = &files.sheet {
        let html = path.extension().is_some_and(|e| e.eq_ignore_ascii_case("html") || e.eq_ignore_ascii_case("htm"));
        let link = files.preview.as_deref().map(|p| link_from(path, p));
        extras.push(Extra {
            what: "calculation sheet",
            path,
            make: Box::new(move |o| {
                let r = report_of(o);
                let page = if html {
                    // The page carries its picture inline.
                    let svg = svg_of(o);
                    hangline::sheet::html(&r, Picture::Inline { svg: &svg, link: link.as_deref().unwrap_or("") })
                } else {
                    let picture = link.as_deref().map_or(Picture::None, Picture::Link);
                    hangline::sheet::markdown(&r, picture)
                };
                Ok(page.into_bytes())
            }),
        });
    }
    let outcome = process(input, output, force, |bytes| Ok(pipeline::prepare(bytes, job)?), extras)?;
    Ok(Done { outcome, output: output.to_path_buf() })
}

/// The files written besides the drawing.
#[derive(Clone, Debug, Default)]
pub struct Files {
    /// The JSON report.
    pub report: Option<PathBuf>,
    /// The calculation sheet (Markdown, or HTML by its extension).
    pub sheet: Option<PathBuf>,
    /// The preview picture (SVG, or PNG when built in).
    pub preview: Option<PathBuf>,
}

/// The kinds of preview picture, by the file name's extension.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
enum PictureKind {
    Svg,
    Png,
}

/// The kind of picture `path` asks for, or why it cannot be written.
fn picture_kind(path: &Path) -> Result<PictureKind> {
    match path.extension().and_then(|e| e.to_str()).map(str::to_ascii_lowercase).as_deref() {
        Some("svg") => Ok(PictureKind::Svg),
        Some("png") => Ok(PictureKind::Png),
        _ => bail!("--preview {}: give a file name ending in .svg or .png", path.display()),
    }
}

/// The preview's bytes in the kind its file name asks for.
fn picture(path: &Path, svg: String) -> Result<Vec<u8>> {
    match picture_kind(path)? {
        PictureKind::Svg => Ok(svg.into_bytes()),
        PictureKind::Png => png(&svg).with_context(|| format!("cannot draw {}", path.display())),
    }
}

/// Rasterises the SVG preview (resvg), with the system's fonts. Without
/// any font the picture is drawn without its texts, and a warning says so.
#[cfg(feature = "png")]
fn png(svg: &str) -> Result<Vec<u8>> {
    use resvg::{tiny_skia, usvg};
    let mut options = usvg::Options::default();
    options.fontdb_mut().load_system_fonts();
    if options.fontdb.is_empty() {
        warn("no fonts found on this system: the PNG preview is drawn without its texts (the SVG has them)");
    }
    let tree = usvg::Tree::from_str(svg, &options).context("the picture is not valid SVG")?;
    let size = tree.size().to_int_size();
    let mut pixmap = tiny_skia::Pixmap::new(size.width(), size.height())
        .ok_or_else(|| anyhow::anyhow!("the picture has no size ({}×{})", size.width(), size.height()))?;
    resvg::render(&tree, tiny_skia::Transform::default(), &mut pixmap.as_mut());
    pixmap.encode_png().context("cannot encode the PNG")
}

/// Without the `png` feature, PNG previews are refused.
#[cfg(not(feature = "png"))]
fn png(_svg: &str) -> Result<Vec<u8>> {
    bail!("this hangline was built without PNG previews (cargo feature png); give a .svg file")
}

/// The sheet's link to the preview: its path relative to the sheet's
/// folder when they share one, else as given.
fn link_from(sheet: &Path, preview: &Path) -> String {
    match (sheet.parent(), preview.parent(), preview.file_name()) {
        (Some(a), Some(b), Some(name)) if a == b => name.to_string_lossy().into_owned(),
        _ => preview.display().to_string(),
    }
}

/// How an extra file's bytes are made from the outcome.
pub type MakeBytes<'a, T> = Box<dyn Fn(&T) -> Result<Vec<u8>> + 'a>;

/// A file written with the drawing: what it is, where, and its bytes from
/// the outcome.
pub struct Extra<'a, T> {
    /// In words, for messages.
    pub what: &'static str,
    /// Where it goes.
    pub path: &'a Path,
    /// Its content.
    pub make: MakeBytes<'a, T>,
}

fn json_bytes<S: serde::Serialize>(value: &S) -> Result<Vec<u8>> {
    let mut v = serde_json::to_vec_pretty(value).context("cannot write the report")?;
    v.push(b'\n');
    Ok(v)
}

/// Runs `work` on the input's bytes and writes the output drawing from its
/// plan, and the extra files, each to a temporary file renamed into place
/// only when everything worked.
fn process<T>(
    input: &Path,
    output: &Path,
    force: bool,
    work: impl FnOnce(&[u8]) -> Result<(T, Plan)>,
    extras: Vec<Extra<'_, T>>,
) -> Result<T> {
    if output.is_dir() {
        bail!("the output {} is a folder; give a file name", output.display());
    }
    if same_file(output, input) && !force {
        bail!("the output {} is the input drawing; give another -o, or --force to replace the input", output.display());
    }
    for (k, e) in extras.iter().enumerate() {
        if e.path.is_dir() {
            bail!("the {} {} is a folder; give a file name", e.what, e.path.display());
        }
        if same_file(e.path, input) || e.path == output {
            bail!("the {} {} would overwrite a drawing; give it another name", e.what, e.path.display());
        }
        if extras[..k].iter().any(|o| o.path == e.path) {
            bail!("the {} and another output are both {}; give each its own name", e.what, e.path.display());
        }
    }
    let input_name = input.display().to_string();
    let (input_file, stamp, bytes) = open_input(input)?;
    let (outcome, plan) = work(&bytes).with_context(|| input_name.clone())?;

    let mut temp = temp_beside(output)?;
    apply_plan(&plan, &input_file, temp.as_file_mut()).with_context(|| format!("cannot write {}", output.display()))?;
    if file_stamp(&input_file)? != stamp {
        bail!("{input_name} changed while it was being processed; nothing was written: run again");
    }
    let mut temps = Vec::new();
    for e in &extras {
        let mut t = temp_beside(e.path)?;
        let bytes = (e.make)(&outcome)?;
        t.as_file_mut().write_all(&bytes).with_context(|| format!("cannot write the {}", e.what))?;
        temps.push((t, e.path));
    }
    temp.persist(output).with_context(|| format!("cannot write {}", output.display()))?;
    for (t, path) in temps {
        t.persist(path).with_context(|| format!("cannot write {}", path.display()))?;
    }
    Ok(outcome)
}

/// Runs `f` with a spinner on the terminal (none when quiet or when stderr
/// is not a terminal), so that a long run shows it is working; the
/// spinner is cleared before the summary is printed.
fn with_spinner<T>(quiet: bool, message: &str, f: impl FnOnce() -> T) -> T {
    let bar = if quiet { indicatif::ProgressBar::hidden() } else { indicatif::ProgressBar::new_spinner() };
    bar.set_message(message.to_string());
    bar.enable_steady_tick(std::time::Duration::from_millis(120));
    let out = f();
    bar.finish_and_clear();
    out
}

/// The line saying what was written.
fn wrote_line(output: &Path, sum: &hangline::write::Summary, also: &[Option<&Path>]) -> String {
    let mut wrote = format!(
        "wrote   {} ({} entities added{}{})",
        output.display(),
        sum.added,
        if sum.new_layers.is_empty() { String::new() } else { format!(", {} layers", sum.new_layers.len()) },
        if sum.replaced > 0 { format!(", {} from an earlier run replaced", sum.replaced) } else { String::new() }
    );
    for path in also.iter().flatten() {
        wrote.push_str(&format!(" and {}", path.display()));
    }
    wrote
}

/// `hangline assess`: one arch.
fn assess(a: &AssessArgs) -> Result<bool> {
    let job = a.job()?;
    let input = &a.input;
    let output = a.output.clone().unwrap_or_else(|| default_output(input));
    let input_name = input.display().to_string();
    let mut extras: Vec<Extra<'_, AssessOutcome>> = Vec::new();
    if let Some(path) = &a.report {
        extras.push(Extra {
            what: "report",
            path,
            make: Box::new(|o: &AssessOutcome| {
                json_bytes(&assess_report(&input_name, &o.reading, &o.assessment, &job))
            }),
        });
    }
    if let Some(path) = &a.preview {
        picture_kind(path)?;
        extras.push(Extra {
            what: "preview",
            path,
            make: Box::new(|o: &AssessOutcome| {
                let view =
                    hangline::preview::PreviewInput::assessed(&input_name, &o.reading, &o.additions, &job.layers);
                picture(path, hangline::preview::svg(&view))
            }),
        });
    }
    let outcome = with_spinner(a.quiet, &format!("assessing {input_name}"), || {
        process(input, &output, a.force, |bytes| Ok(prepare_assess(bytes, &job)?), extras)
    })?;
    let q = a.quiet;
    let r = &outcome.reading;
    let s = &outcome.assessment;
    let u = r.units;
    for w in r.warnings.iter().chain(&s.warnings) {
        warn(w);
    }
    let o = &s.outline;
    say(
        q,
        &format!(
            "read    {input_name} ({}, {}; lengths in {}, forces in {}): arch of span {}, rise {}, {} thick at the crown; {} fill region(s), {} point and {} distributed load(s)",
            r.release.name(),
            if r.binary { "binary" } else { "ASCII" },
            u.length,
            u.force,
            fmt_length(o.span(), u.length),
            fmt_length(o.rise(), u.length),
            fmt_length(o.crown_thickness(), u.length),
            r.fill.len(),
            r.loads.len(),
            r.distributed.len()
        ),
    );
    let total: f64 = s.sliced.ring.blocks.iter().flatten().map(|l| -l.force.y).sum();
    say(
        q,
        &format!(
            "sliced  into {} voussoirs ({} joints), {} of load in all",
            s.sliced.ring.blocks.len(),
            match job.cuts {
                hangline::arch::slice::Cuts::Radial => "radial",
                hangline::arch::slice::Cuts::Vertical => "vertical",
            },
            fmt_force(total, u.force)
        ),
    );
    for n in hangline::pipeline::assess::notes(s, u) {
        say(q, &format!("found   {n}"));
    }
    if let Some(t) = &s.trial {
        let outside = t.crossings.iter().filter(|c| c.is_none_or(|c| !(0.0..=1.0).contains(&c.position))).count();
        say(
            q,
            &format!(
                "trial   thrust {}: {}",
                fmt_force(t.horizontal, u.force),
                if outside == 0 {
                    "inside the arch at every joint".to_string()
                } else {
                    format!("outside the arch at {outside} of {} joints", t.crossings.len())
                }
            ),
        );
    }
    say(q, &wrote_line(&output, &outcome.summary, &[a.report.as_deref(), a.preview.as_deref()]));
    say(q, &format!("caution {ASSESS_CAUTION}"));
    Ok(true)
}

/// `hangline solve`: one drawing in detail, or many in a batch. Returns
/// whether everything asked for was solved.
fn solve(a: &SolveArgs) -> Result<bool> {
    if batch::is_batch(a) {
        if a.sheet.is_some() {
            bail!("--sheet is for one drawing at a time; give one INPUT (or run the drawings one by one)");
        }
        return batch::run(a);
    }
    let input = &a.input[0];
    let job = a.job()?;
    let output = a.output.clone().unwrap_or_else(|| default_output(input));
    let files = Files { report: a.report.clone(), sheet: a.sheet.clone(), preview: a.preview.clone() };
    let done = with_spinner(a.quiet, &format!("solving {}", input.display()), || {
        solve_one(input, &output, &files, &job, a.force)
    })?;
    let input_name = input.display().to_string();
    let outcome = &done.outcome;
    let r = &outcome.reading;
    let s = &outcome.solution;
    let st = &r.structure;
    let u = st.units();
    for w in r.warnings.iter().chain(&s.warnings) {
        warn(w);
    }
    let q = a.quiet;
    let total: f64 = st.loads().iter().map(|l| l.magnitude()).sum::<f64>()
        + st.distributed().iter().map(hangline::model::DistributedLoad::total).sum::<f64>();
    let spread =
        if st.distributed().is_empty() { String::new() } else { format!(", {} distributed", st.distributed().len()) };
    say(
        q,
        &format!(
            "read    {input_name} ({}, {}; lengths in {}, forces in {}): 2 supports, {} point loads{spread} ({} in all){}",
            r.release.name(),
            if r.binary { "binary" } else { "ASCII" },
            u.length,
            u.force,
            st.loads().len(),
            fmt_force(total, u.force),
            if st.deck().is_some() { ", deck" } else { "" }
        ),
    );
    let carried = &outcome.carried;
    if !carried.shares.is_empty() {
        let to_hangers: f64 = carried.shares.iter().map(|s| s.load).sum();
        say(
            q,
            &format!(
                "carried the distributed loads to {} hangers ({}), {} and {} straight into the supports",
                carried.shares.len(),
                fmt_force(to_hangers, u.force),
                fmt_force(carried.to_supports[0], u.force),
                fmt_force(carried.to_supports[1], u.force)
            ),
        );
    }
    let conds: Vec<String> = s
        .conditions
        .iter()
        .map(|c| {
            let text = match (c.point, c.value) {
                (Some(p), _) => format!("{} ({}, {})", c.kind, fmt_num(p[0]), fmt_num(p[1])),
                (None, Some(v)) => format!("{} {}", c.kind, fmt_num(v)),
                _ => c.kind.to_string(),
            };
            let supplied = s.sketch.as_ref().is_some_and(|f| f.conditions_supplied.contains(c));
            if supplied { format!("{text} (from the sketch)") } else { text }
        })
        .collect();
    say(q, &format!("solved  {} with {}", s.form, conds.join(", ")));
    if outcome.alternatives.is_empty() {
        say(q, &format!("        {}", result_line(&carried.structure, s)));
    } else {
        say(
            q,
            &format!(
                "        {} alternatives, each on layers of its own (NAME-<condition>-<value>):",
                outcome.alternatives.len()
            ),
        );
        for alt in &outcome.alternatives {
            say(
                q,
                &format!(
                    "        {} ({}): {}",
                    alt.given.words(),
                    alt.name,
                    result_line(&carried.structure, &alt.solution)
                ),
            );
        }
    }
    for t in &s.towers {
        say(
            q,
            &format!(
                "        {} tower: the profile meets its axis at y = {}, {} {} above its foot",
                if t.side == 0 { "left" } else { "right" },
                fmt_length(t.at.y, u.length),
                fmt_length(t.height, u.length),
                u.length
            ),
        );
    }
    if let Some(sz) = &outcome.sizing {
        for w in &sz.warnings {
            warn(w);
        }
        for (i, line) in hangline::sizing::summary_lines(sz, u.force).iter().enumerate() {
            say(q, &format!("{}{line}", if i == 0 { "sized   " } else { "        " }));
        }
    }
    say(q, &wrote_line(&output, &outcome.summary, &[a.report.as_deref(), a.preview.as_deref(), a.sheet.as_deref()]));
    say(q, &format!("caution {CAUTION}"));
    Ok(true)
}

#[allow(clippy::print_stdout)]
fn inspect(a: &InspectArgs) -> Result<()> {
    let (options, layers) = a.read.options()?;
    let bytes = read_input(&a.input)?;
    let name = a.input.display().to_string();
    let reading = pipeline::inspect(&bytes, &options, &layers).with_context(|| name.clone())?;
    let ins = inspection(&name, &reading);
    if a.json {
        println!("{}", serde_json::to_string_pretty(&ins)?);
        return Ok(());
    }
    let u = ins.units;
    println!(
        "drawing {name}: {} {}; lengths in {} ({}); forces in {} ({})",
        ins.input.version,
        if ins.input.binary { "binary" } else { "ASCII" },
        u.length,
        ins.input.length_unit_from,
        u.force,
        ins.input.force_unit_from
    );
    println!("layers  {}", ins.layers.join(", "));
    println!("supports (layer {}):", options.layers.supports);
    for (s, side) in ins.supports.iter().zip(["left ", "right"]) {
        let what = match (s.y, s.axis) {
            (Some(y), _) => format!("point       ({}, {})", s.x, y),
            (None, Some([f, t])) => format!("tower axis  x = {} (foot {f}, top {t}): height found by solving", s.x),
            _ => String::new(),
        };
        println!("  {side}  {what}   entity {}", s.handle.as_deref().unwrap_or("-"));
    }
    println!(
        "loads (layer {}): {} point loads; {} in all{}",
        options.layers.loads,
        ins.loads.len(),
        fmt_force(ins.total_load, u.force),
        if ins.distributed.is_empty() { "" } else { ", distributed loads included" }
    );
    for (k, l) in ins.loads.iter().enumerate() {
        let dir = if l.force.x == 0.0 {
            "down".to_string()
        } else {
            format!("{:.1}° from vertical", l.force.x.atan2(-l.force.y).to_degrees())
        };
        let label = match (&l.label, &l.label_handle) {
            (Some(t), Some(h)) => format!("label '{t}' (entity {h})"),
            (Some(t), None) => format!("label '{t}'"),
            (None, _) => "magnitude from attribute or line length".into(),
        };
        println!(
            "  {:>3}  {}  at ({}, {})  {} {}  {label}  entity {}",
            k + 1,
            member_name(k, k + 1),
            fmt_length(l.at.x, u.length),
            fmt_length(l.at.y, u.length),
            fmt_force(l.magnitude, u.force),
            dir,
            l.handle.as_deref().unwrap_or("-")
        );
    }
    if !ins.distributed.is_empty() {
        println!("distributed loads (layer {}): {}", options.layers.loads, ins.distributed.len());
        for d in &ins.distributed {
            println!(
                "       from x = {} to {}: {} ({} in all){}  entity {}",
                fmt_length(d.x0, u.length),
                fmt_length(d.x1, u.length),
                d.written,
                fmt_force(d.total, u.force),
                d.label.as_ref().map(|l| format!("  label '{l}'")).unwrap_or_default(),
                d.handle.as_deref().unwrap_or("-")
            );
        }
        if ins.shares.is_empty() {
            println!("       no hanger positions: carried by the cable or arch directly (continuous funicular)");
        } else {
            println!(
                "       carried to {} hanger positions (simple spans between them; layer {} and the point loads):",
                ins.shares.len(),
                options.layers.hangers
            );
            for sh in &ins.shares {
                println!("         x = {}: {}", fmt_length(sh.x, u.length), fmt_force(sh.load, u.force));
            }
            println!(
                "         into the supports: {} left, {} right",
                fmt_force(ins.to_supports[0], u.force),
                fmt_force(ins.to_supports[1], u.force)
            );
        }
    }
    if ins.deck_segments > 0 {
        println!("deck (layer {}): {} segments", options.layers.deck, ins.deck_segments);
    } else {
        println!("deck (layer {}): none", options.layers.deck);
    }
    for w in &ins.warnings {
        println!("warning: {w}");
    }
    Ok(())
}
