//! Command-line arguments, parsed raw by clap and then checked into the
//! library's options before any work starts.

use std::path::PathBuf;

use anyhow::{Result, anyhow, bail};
use clap::{Args, Parser, Subcommand};
use kurbo::Point;

use hangline::arch::slice::Cuts;
use hangline::layout::{LayoutOptions, Role};
use hangline::pipeline::assess::{AssessJob, Live, Trial, UnitWeight, Voussoirs};
use hangline::pipeline::{ForceValue, Given, IntensityValue, Job, LengthValue};
use hangline::read::arch::{ArchLayers, ArchReadOptions};
use hangline::read::label::{parse_intensity, parse_quantity_force, parse_quantity_length};
use hangline::read::{InputLayers, ReadOptions};
use hangline::sizing::{Catalogue, Material, Safety, Spec, Strength};
use hangline::solve::Form;
use hangline::units::{ForceUnit, LengthUnit};
use hangline::write::OutputLayers;

const SOLVE_EXAMPLES: &str = "\
Examples:
  Cable through both supports with a 6 m sag:
    hangline solve bridge.dxf --sag 6 --report bridge.json
  One anchor and one tower axis: the low point level at x = 24, through (24, 3.5):
    hangline solve anchor-tower.dxf --level-at 24 --through 24,3.5
  Arch with a 9 m rise, written to another file:
    hangline solve arch.dxf --arch --rise 9 -o arch-funicular.dxf
  Towers whose height follows: give three conditions of your own:
    hangline solve towers.dxf --thrust \"450 kN\" --level-at 30 --through 30,4

Each fixed support point (POINT, CIRCLE or INSERT on the supports layer)
counts as one condition; a tower axis (vertical LINE) counts as none.
Exactly three conditions are needed in all.
Any one condition may take a list of values (--sag 4,6,8): one design
alternative per value, each on layers of its own, compared in a table.
A polyline on the SKETCH layer supplies the conditions left out: the
funicular nearest to it is found.";

const ASSESS_EXAMPLES: &str = "\
Examples:
  A stone arch 1.2 m wide, 22 kN/m3 masonry, 18 kN/m3 fill:
    hangline assess bridge.dxf --unit-weight \"22 kN/m3\" --width 1.2 --fill-weight \"18 kN/m3\"
  The load factor of a 60 kN axle load, at its worst place:
    hangline assess bridge.dxf --unit-weight \"22 kN/m3\" --live-load \"60 kN\" --report bridge.json
  A trial thrust line of 85 kN through the middle of both springings:
    hangline assess bridge.dxf --unit-weight \"22 kN/m3\" --thrust \"85 kN\" --thrust-at 0.5,0.5

The arch is read from its intrados and extrados (layers INTRADOS and
EXTRADOS), fill regions from FILL, point and distributed loads from LOADS.
The method assumes masonry with no tensile strength, unlimited compressive
strength and no sliding: an assessment aid, to be checked by a qualified
engineer under the local codes.";

/// The most design alternatives in one run (each is a set of layers).
const MAX_ALTERNATIVES: usize = 12;

const INSPECT_EXAMPLES: &str = "\
Examples:
  hangline inspect bridge.dxf
  hangline inspect bridge.dxf --json --layer loads=LASTEN";

/// Funicular cables and arches by graphic statics, on your own DXF drawing.
///
/// Reads supports, load lines with their labels and the deck from a layered
/// DXF drawing, finds the funicular (the shape that carries the loads in pure
/// tension or compression) and writes the drawing back with the profile, the
/// force diagram, forces and dimensions on layers of their own.
///
/// A preliminary design aid: results must be checked by a qualified engineer
/// under the local codes.
#[derive(Debug, Parser)]
#[command(name = "hangline", version, about, long_about)]
pub struct Cli {
    /// What to do.
    #[command(subcommand)]
    pub command: Command,
}

/// The subcommands.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Find the funicular and write the drawing back with it.
    #[command(after_help = SOLVE_EXAMPLES)]
    Solve(Box<SolveArgs>),
    /// Assess an existing arch: thrust lines inside its intrados and
    /// extrados, the range of thrust, hinges and margins.
    #[command(after_help = ASSESS_EXAMPLES)]
    Assess(Box<AssessArgs>),
    /// Show what the drawing holds (supports, loads, units) without solving.
    #[command(after_help = INSPECT_EXAMPLES)]
    Inspect(InspectArgs),
}

/// How to read the drawing (shared by both subcommands).
#[derive(Debug, Args)]
pub struct ReadArgs {
    /// Rename a layer: ROLE=NAME, repeatable. Input roles: supports, loads,
    /// deck, hangers (hanger or post positions for distributed loads),
    /// sketch (the intended shape to follow);
    /// output roles: profile, hangers, diagram, forces, dimensions, bow,
    /// notes. (The input role `hangers` is renamed with `--layer
    /// hangers=NAME`; the output layer of the drawn hangers with `--layer
    /// hanger-lines=NAME`.)
    #[arg(long = "layer", value_name = "ROLE=NAME")]
    pub layers: Vec<String>,
    /// The drawing's length unit (mm, cm, dm, m, km, in, ft, yd), when
    /// $INSUNITS is missing (R12) or wrong. Without it and without
    /// $INSUNITS, metres are assumed.
    #[arg(long, value_name = "UNIT")]
    pub units: Option<String>,
    /// Force unit of the results (N, kN, MN, lbf, kip). Default: the labels'
    /// unit when they all agree, else kN.
    #[arg(long, value_name = "UNIT")]
    pub force_unit: Option<String>,
    /// Unit of labels written without one (default kN).
    #[arg(long, value_name = "UNIT")]
    pub label_unit: Option<String>,
    /// Take each load line's magnitude from its length: force per drawing
    /// unit, e.g. "10 kN" (labels are then ignored).
    #[arg(long, value_name = "FORCE", allow_hyphen_values = true)]
    pub load_scale: Option<String>,
}

/// `hangline solve`.
#[derive(Debug, Args)]
pub struct SolveArgs {
    /// The input drawing(s) (ASCII or binary DXF, R12 to R2018): files,
    /// folders (their .dxf files) or quoted glob patterns ("sheets/*.dxf").
    /// Several drawings are solved in parallel, each with the same options.
    #[arg(value_name = "INPUT", required_unless_present = "jobs")]
    pub input: Vec<PathBuf>,
    /// A job file: one drawing a line with its own options, e.g.
    /// `span-2.dxf --sag 4.5 --layer loads=LASTEN` (paths relative to the
    /// job file; # starts a comment). Options on the command line apply to
    /// every line that does not give its own.
    #[arg(long, value_name = "FILE")]
    pub jobs: Option<PathBuf>,
    /// The output drawing (default: INPUT-hangline.dxf beside the input);
    /// with several drawings, a folder for them.
    #[arg(short, long, value_name = "OUT.dxf")]
    pub output: Option<PathBuf>,
    /// Also write a JSON report; with several drawings, a folder for one
    /// report each (NAME-hangline.json).
    #[arg(long, value_name = "FILE.json")]
    pub report: Option<PathBuf>,
    /// Also write a calculation sheet a checker can follow: Markdown, or
    /// HTML when the name ends in .html (one drawing only).
    #[arg(long, value_name = "FILE.md")]
    pub sheet: Option<PathBuf>,
    /// Also draw a picture of the result (SVG): the drawing's supports,
    /// loads and deck with everything added, for a look without CAD; with
    /// several drawings, a folder for one each (NAME-hangline.svg).
    #[arg(long, value_name = "FILE.svg")]
    pub preview: Option<PathBuf>,
    /// With several drawings: look into sub-folders too.
    #[arg(long)]
    pub recursive: bool,
    /// With several drawings: how many to solve at once (default: one per core).
    #[arg(long, value_name = "N")]
    pub threads: Option<usize>,
    /// With several drawings: write the summary table as JSON too.
    #[arg(long, value_name = "FILE.json")]
    pub summary: Option<PathBuf>,
    /// Find an arch (compression, above the chord) instead of a cable.
    #[arg(long)]
    pub arch: bool,
    /// The profile passes through this point (drawing coordinates); repeatable.
    #[arg(long, value_name = "X,Y", allow_hyphen_values = true)]
    pub through: Vec<String>,
    /// The horizontal force at the left support, e.g. 450 or "450 kN".
    #[arg(long, value_name = "FORCE", allow_hyphen_values = true)]
    pub thrust: Option<String>,
    /// The cable's sag: the largest vertical distance from the chord between
    /// the supports to the profile, e.g. 6 or "6 m".
    #[arg(long, value_name = "LENGTH", allow_hyphen_values = true)]
    pub sag: Option<String>,
    /// The arch's rise above the chord between the supports (with --arch).
    #[arg(long, value_name = "LENGTH", allow_hyphen_values = true)]
    pub rise: Option<String>,
    /// The largest force in any segment.
    #[arg(long, value_name = "FORCE", allow_hyphen_values = true)]
    pub max_force: Option<String>,
    /// The profile is level (its low point, or an arch's crown) at this x.
    #[arg(long, value_name = "X", allow_hyphen_values = true)]
    pub level_at: Option<String>,
    /// The length of the profile between the supports (counts as one
    /// condition), e.g. 37.2 or "37.2 m".
    #[arg(long, value_name = "LENGTH", allow_hyphen_values = true)]
    pub length: Option<String>,
    /// The cable's unstressed length (a condition; needs
    /// --axial-stiffness): the length to cut.
    #[arg(long, value_name = "LENGTH", allow_hyphen_values = true)]
    pub unstressed_length: Option<String>,
    /// Self-weight per unit length of the profile, acting along it, e.g.
    /// "0.45 kN/m"; for an arch also as section area × unit weight, e.g.
    /// "0.96 m2 x 25 kN/m3". The shape and its weight are found together.
    #[arg(long, value_name = "WEIGHT", allow_hyphen_values = true)]
    pub self_weight: Option<String>,
    /// Axial stiffness EA of the cable, e.g. "150 MN": reports the
    /// unstressed length (with --self-weight, the weight is per unstressed
    /// length).
    #[arg(long, value_name = "FORCE", allow_hyphen_values = true)]
    pub axial_stiffness: Option<String>,
    /// Largest distance between the drawn profile and the exact curve where
    /// loads are continuous (default: span / 10,000).
    #[arg(long, value_name = "LENGTH", allow_hyphen_values = true)]
    pub chord_tolerance: Option<String>,
    /// Force diagram scale: force per drawing unit, e.g. "10 kN" (default:
    /// a round scale that fits).
    #[arg(long, value_name = "FORCE", allow_hyphen_values = true)]
    pub force_scale: Option<String>,
    /// Where to draw the top of the force diagram's load line (default:
    /// beside the drawing).
    #[arg(long, value_name = "X,Y", allow_hyphen_values = true)]
    pub diagram_at: Option<String>,
    /// Text height for annotations, drawing units (default: from the span).
    #[arg(long, value_name = "LENGTH", allow_hyphen_values = true)]
    pub text_height: Option<f64>,
    /// Size the members by area from a characteristic strength: the
    /// breaking strength of wire or strand, or the yield strength of a bar
    /// or an arch section, e.g. "1860 MPa" or "270 ksi". Needs your code's
    /// factors. Indicative only: the code in force governs.
    #[arg(long, value_name = "STRESS", allow_hyphen_values = true, help_heading = "Sizing the members")]
    pub strength: Option<String>,
    /// Size the cable from your CSV catalogue of sizes and their minimum
    /// breaking forces (columns: name, breaking_force_kN, optional area_mm2,
    /// diameter_mm, mass_kg_per_m). Needs your code's factors.
    #[arg(long, value_name = "FILE.csv", help_heading = "Sizing the members")]
    pub catalogue: Option<PathBuf>,
    /// Partial factor on the forces found (γ_F), e.g. 1.35; with
    /// --resistance-factor.
    #[arg(long, value_name = "FACTOR", allow_hyphen_values = true, help_heading = "Sizing the members")]
    pub action_factor: Option<String>,
    /// Partial factor dividing the characteristic resistance (γ_M; for
    /// tension components to EN 1993-1-11, 1.5·γ_R); with --action-factor.
    #[arg(long, value_name = "FACTOR", allow_hyphen_values = true, help_heading = "Sizing the members")]
    pub resistance_factor: Option<String>,
    /// A global factor of safety instead of partial factors: breaking
    /// force (or strength × area) ≥ this × the force found, e.g. 2.5.
    #[arg(long, value_name = "FACTOR", allow_hyphen_values = true, help_heading = "Sizing the members")]
    pub safety_factor: Option<String>,
    /// Allow the output to replace the input file.
    #[arg(long)]
    pub force: bool,
    /// Print nothing but errors.
    #[arg(short, long)]
    pub quiet: bool,
    /// Reading options.
    #[command(flatten)]
    pub read: ReadArgs,
}

/// Reads a safety factor given on the command line.
fn parse_factor(s: &str, flag: &str) -> Result<f64> {
    let v: f64 =
        s.trim().parse().map_err(|_| anyhow!("{flag} '{s}' is not a number; give the factor, e.g. {flag} 1.35"))?;
    if !(v > 0.0 && v <= 100.0) {
        bail!("{flag} '{s}' must be a positive number of at most 100");
    }
    Ok(v)
}

/// `hangline assess`.
#[derive(Debug, Args)]
pub struct AssessArgs {
    /// The drawing of the arch (ASCII or binary DXF, R12 to R2018).
    #[arg(value_name = "INPUT")]
    pub input: PathBuf,
    /// The output drawing (default: INPUT-hangline.dxf beside the input).
    #[arg(short, long, value_name = "OUT.dxf")]
    pub output: Option<PathBuf>,
    /// Also write a JSON report.
    #[arg(long, value_name = "FILE.json")]
    pub report: Option<PathBuf>,
    /// Also draw a picture of the result (SVG): the arch's faces, fill and
    /// loads with everything added, for a look without CAD.
    #[arg(long, value_name = "FILE.svg")]
    pub preview: Option<PathBuf>,
    /// Unit weight of the masonry, e.g. "22 kN/m3" (or "140 pcf"); "0 kN/m3"
    /// for a weightless ring carrying only the drawn loads.
    #[arg(long, value_name = "WEIGHT", allow_hyphen_values = true)]
    pub unit_weight: String,
    /// Width of the arch out of the drawing's plane (default: 1 m).
    #[arg(long, value_name = "LENGTH", allow_hyphen_values = true)]
    pub width: Option<String>,
    /// Unit weight of the fill drawn on the fill layer, e.g. "18 kN/m3".
    #[arg(long, value_name = "WEIGHT", allow_hyphen_values = true)]
    pub fill_weight: Option<String>,
    /// Joints between voussoirs: radial (across the arch, the default) or
    /// vertical.
    #[arg(long, value_name = "KIND", default_value = "radial")]
    pub cuts: String,
    /// How many voussoirs (a number), or their size along the centre line
    /// (a length such as "0.3 m"). Default: 48.
    #[arg(long, value_name = "N|LENGTH")]
    pub voussoirs: Option<String>,
    /// Trace a trial thrust line of this horizontal thrust.
    #[arg(long, value_name = "FORCE", allow_hyphen_values = true)]
    pub thrust: Option<String>,
    /// Where the trial line crosses the left and right springings, as
    /// fractions of their depth from the intrados (default 0.5,0.5).
    #[arg(long, value_name = "A,B", requires = "thrust")]
    pub thrust_at: Option<String>,
    /// A live point load (acting down) whose collapse factor is wanted.
    #[arg(long, value_name = "FORCE", allow_hyphen_values = true)]
    pub live_load: Option<String>,
    /// The live load's x (default: every voussoir in turn, the worst
    /// reported).
    #[arg(long, value_name = "X", allow_hyphen_values = true, requires = "live_load")]
    pub live_at: Option<String>,
    /// Force polygon scale: force per drawing unit, e.g. "10 kN".
    #[arg(long, value_name = "FORCE", allow_hyphen_values = true)]
    pub force_scale: Option<String>,
    /// Where to draw the top of the force polygon (default: beside the drawing).
    #[arg(long, value_name = "X,Y", allow_hyphen_values = true)]
    pub diagram_at: Option<String>,
    /// Text height for annotations, drawing units (default: from the span).
    #[arg(long, value_name = "LENGTH", allow_hyphen_values = true)]
    pub text_height: Option<f64>,
    /// Rename a layer: ROLE=NAME, repeatable. Input roles: intrados,
    /// extrados, fill, loads; output roles: voussoirs, thrust-min,
    /// thrust-max, thrust-trial, thrust-limit, thrust-collapse, hinges,
    /// diagram, notes and the others of `solve`.
    #[arg(long = "layer", value_name = "ROLE=NAME")]
    pub layers: Vec<String>,
    /// The drawing's length unit (mm, cm, dm, m, km, in, ft, yd), when
    /// $INSUNITS is missing (R12) or wrong.
    #[arg(long, value_name = "UNIT")]
    pub units: Option<String>,
    /// Force unit of the results (N, kN, MN, lbf, kip). Default: the labels'
    /// unit when they all agree, else kN.
    #[arg(long, value_name = "UNIT")]
    pub force_unit: Option<String>,
    /// Unit of load labels written without one (default kN).
    #[arg(long, value_name = "UNIT")]
    pub label_unit: Option<String>,
    /// Allow the output to replace the input file.
    #[arg(long)]
    pub force: bool,
    /// Print nothing but errors.
    #[arg(short, long)]
    pub quiet: bool,
}

/// `hangline inspect`.
#[derive(Debug, Args)]
pub struct InspectArgs {
    /// The drawing to inspect.
    pub input: PathBuf,
    /// Print JSON instead of text.
    #[arg(long)]
    pub json: bool,
    /// Reading options.
    #[command(flatten)]
    pub read: ReadArgs,
}

fn parse_point(s: &str, flag: &str) -> Result<Point> {
    let parts: Vec<&str> = s.split(',').map(str::trim).collect();
    let [x, y] = parts.as_slice() else {
        bail!("{flag} '{s}' is not a point: write X,Y in drawing units, e.g. {flag} 24,3.5");
    };
    let num = |v: &str| -> Result<f64> {
        let n: f64 =
            v.parse().map_err(|_| anyhow!("{flag} '{s}': '{v}' is not a number; write X,Y, e.g. {flag} 24,3.5"))?;
        if !n.is_finite() || n.abs() >= 1e12 {
            bail!("{flag} '{s}': coordinates must be finite and below 1e12");
        }
        Ok(n)
    };
    Ok(Point::new(num(x)?, num(y)?))
}

fn parse_force(s: &str, flag: &str) -> Result<ForceValue> {
    let (value, unit) = parse_quantity_force(s).map_err(|e| anyhow!("{flag} {e}"))?;
    if !(value > 0.0 && value < 1e12) {
        bail!("{flag} '{s}' must be a positive force below 1e12");
    }
    Ok(ForceValue { value, unit })
}

fn parse_length(s: &str, flag: &str) -> Result<LengthValue> {
    let (value, unit) = parse_quantity_length(s).map_err(|e| anyhow!("{flag} {e}"))?;
    if !(value > 0.0 && value < 1e12) {
        bail!("{flag} '{s}' must be a positive length below 1e12");
    }
    Ok(LengthValue { value, unit })
}

/// A self-weight: a force per length ("0.45 kN/m"), or a section area
/// times a unit weight ("0.96 m2 x 25 kN/m3").
fn parse_self_weight(s: &str) -> Result<IntensityValue> {
    let flag = "--self-weight";
    let product = [" x ", " X ", "*", "\u{d7}"].iter().find_map(|sep| s.split_once(sep));
    if let Some((area, unit_weight)) = product {
        let (a, a_unit) = parse_power(area.trim(), 2, flag)?;
        let (g, g_force, g_unit) = parse_unit_weight(unit_weight.trim(), flag, false)?;
        // A [a_unit²] · γ [F/g_unit³] = A·(a_unit→g_unit)²·γ [F/g_unit]
        let w = a * a_unit.factor_to(g_unit).powi(2) * g;
        if !(w > 0.0 && w.is_finite()) {
            bail!("{flag} '{s}' must be a positive weight");
        }
        return Ok(IntensityValue { value: w, force: g_force, length: g_unit });
    }
    let w = parse_intensity(s).map_err(|e| anyhow!("{flag} {e}"))?;
    if w.w0 != w.w1 {
        bail!("{flag} '{s}': give one value per unit length, such as \"0.45 kN/m\"");
    }
    Ok(IntensityValue { value: w.w0, force: w.force, length: w.length })
}

/// A number with a length unit raised to `power` ("0.96 m2", "0.96 m²").
fn parse_power(s: &str, power: u8, flag: &str) -> Result<(f64, LengthUnit)> {
    let superscript = if power == 2 { '\u{b2}' } else { '\u{b3}' };
    let digit = char::from(b'0' + power);
    let t = s.trim_end_matches([digit, superscript]);
    if t.len() == s.len() {
        bail!("{flag}: '{s}' needs a unit to the power {power}, such as 'm{power}'");
    }
    let (v, unit) = parse_quantity_length(t).map_err(|e| anyhow!("{flag} {e}"))?;
    let unit = unit.ok_or_else(|| anyhow!("{flag}: '{s}' needs a unit, such as 'm{power}'"))?;
    if !(v > 0.0 && v.is_finite()) {
        bail!("{flag}: '{s}' must be positive");
    }
    Ok((v, unit))
}

/// A unit weight ("25 kN/m3", "150 pcf").
fn parse_unit_weight(s: &str, flag: &str, allow_zero: bool) -> Result<(f64, ForceUnit, LengthUnit)> {
    if let Some(v) = s.strip_suffix("pcf") {
        let v: f64 = v.trim().parse().map_err(|_| anyhow!("{flag}: '{s}' is not a unit weight"))?;
        return Ok((v, ForceUnit::PoundForce, LengthUnit::Foot));
    }
    let (number, per) =
        s.split_once('/').ok_or_else(|| anyhow!("{flag}: '{s}' is not a unit weight; write it as '25 kN/m3'"))?;
    let (v, force) = parse_quantity_force(number.trim()).map_err(|e| anyhow!("{flag} {e}"))?;
    let force = force.ok_or_else(|| anyhow!("{flag}: '{s}' needs a force unit, such as '25 kN/m3'"))?;
    let (_, length) = parse_power(&format!("1 {}", per.trim()), 3, flag)?;
    if !((v > 0.0 || (allow_zero && v == 0.0)) && v.is_finite()) {
        bail!("{flag}: '{s}' must be {}", if allow_zero { "zero or positive" } else { "positive" });
    }
    Ok((v, force, length))
}

fn parse_unit<T: std::str::FromStr<Err = String>>(s: &str, flag: &str) -> Result<T> {
    s.parse::<T>().map_err(|e| anyhow!("{flag}: {e}"))
}

/// Reads `--layer ROLE=NAME` specs: `input` takes an input role (and says
/// whether it knew it); the others rename output layers.
fn layer_specs(
    specs: &[String],
    input_roles: &str,
    example: &str,
    mut input: impl FnMut(&str, &str) -> bool,
) -> Result<OutputLayers> {
    let mut output = OutputLayers::default();
    for spec in specs {
        let (role, name) = spec
            .split_once('=')
            .ok_or_else(|| anyhow!("--layer '{spec}' must be ROLE=NAME, e.g. --layer {example}"))?;
        let (role, name) = (role.trim().to_ascii_lowercase(), name.trim());
        if name.is_empty() {
            bail!("--layer '{spec}': the layer name is empty");
        }
        if input(&role, name) {
            continue;
        }
        let role = Role::ALL.iter().find(|r| r.key() == role).ok_or_else(|| {
            anyhow!(
                "--layer '{spec}': unknown role '{role}'; roles are {input_roles}, {}",
                Role::ALL.iter().map(|r| r.key()).collect::<Vec<_>>().join(", ")
            )
        })?;
        output.set(*role, name);
    }
    Ok(output)
}

/// An error when an output layer is also an input layer, or two output
/// roles share a layer.
fn distinct(output: &OutputLayers, inputs: &[&String]) -> Result<()> {
    for out in output.all() {
        if inputs.iter().any(|i| hangline::dxf::names_match(i, out)) {
            bail!(
                "--layer: '{out}' is both an input and an output layer; the tool replaces its output layers on every run, so give them different names"
            );
        }
    }
    let mut outs: Vec<&str> = output.all().collect();
    outs.sort_by_key(|n| n.to_uppercase());
    if outs.windows(2).any(|w| hangline::dxf::names_match(w[0], w[1])) {
        bail!("--layer: two output roles share one layer; give each its own");
    }
    Ok(())
}

/// The units `--units`, `--force-unit` and `--label-unit` give: the
/// drawing's length unit, the results' force unit, and the unit of labels
/// written without one (kN unless given).
fn units_given(
    units: Option<&str>,
    force_unit: Option<&str>,
    label_unit: Option<&str>,
) -> Result<(Option<LengthUnit>, Option<ForceUnit>, ForceUnit)> {
    Ok((
        units.map(|u| parse_unit::<LengthUnit>(u, "--units")).transpose()?,
        force_unit.map(|u| parse_unit::<ForceUnit>(u, "--force-unit")).transpose()?,
        label_unit.map_or(Ok(ForceUnit::Kilonewton), |u| parse_unit(u, "--label-unit"))?,
    ))
}

/// The layout `--diagram-at` and `--text-height` ask for, and the force
/// diagram's scale as `--force-scale` gives it.
fn layout_given(
    force_scale: Option<&str>,
    diagram_at: Option<&str>,
    text_height: Option<f64>,
) -> Result<(LayoutOptions, Option<ForceValue>)> {
    if let Some(h) = text_height
        && !(h > 0.0 && h.is_finite())
    {
        bail!("--text-height must be a positive length in drawing units");
    }
    let force_scale = force_scale.map(|s| parse_force(s, "--force-scale")).transpose()?;
    let diagram_at = diagram_at.map(|s| parse_point(s, "--diagram-at")).transpose()?;
    Ok((LayoutOptions { diagram_at, text_height, ..LayoutOptions::default() }, force_scale))
}

impl ReadArgs {
    /// These options, with `defaults` filling what they leave out (layer
    /// renamings add up; a line's own rename of a role wins).
    pub fn or(&self, defaults: &ReadArgs) -> ReadArgs {
        let mut layers = defaults.layers.clone();
        layers.extend(self.layers.iter().cloned());
        ReadArgs {
            layers,
            units: self.units.clone().or_else(|| defaults.units.clone()),
            force_unit: self.force_unit.clone().or_else(|| defaults.force_unit.clone()),
            label_unit: self.label_unit.clone().or_else(|| defaults.label_unit.clone()),
            load_scale: self.load_scale.clone().or_else(|| defaults.load_scale.clone()),
        }
    }

    /// Checks the reading options; also returns the output layer names.
    pub fn options(&self) -> Result<(ReadOptions, OutputLayers)> {
        let mut input = InputLayers::default();
        let output =
            layer_specs(&self.layers, "supports, loads, deck, hangers, sketch", "loads=LASTEN", |role, name| {
                match role {
                    "supports" => input.supports = name.into(),
                    "loads" => input.loads = name.into(),
                    "deck" => {
                        input.deck = name.into();
                        input.deck_required = true;
                    }
                    "hangers" => {
                        input.hangers = name.into();
                        input.hangers_required = true;
                    }
                    "sketch" => {
                        input.sketch = name.into();
                        input.sketch_required = true;
                    }
                    _ => return false,
                }
                true
            })?;
        distinct(&output, &[&input.supports, &input.loads, &input.deck, &input.hangers, &input.sketch])?;
        let (length_unit, force_unit, label_unit) =
            units_given(self.units.as_deref(), self.force_unit.as_deref(), self.label_unit.as_deref())?;
        let load_scale = match &self.load_scale {
            Some(s) => {
                let f = parse_force(s, "--load-scale")?;
                Some((f.value, f.unit.unwrap_or(label_unit)))
            }
            None => None,
        };
        Ok((ReadOptions { layers: input, length_unit, force_unit, label_unit, load_scale }, output))
    }
}

impl SolveArgs {
    /// A job line's options, with the command line's filling what the line
    /// leaves out.
    pub fn or(&self, defaults: &SolveArgs) -> SolveArgs {
        let pick = |a: &Option<String>, b: &Option<String>| a.clone().or_else(|| b.clone());
        SolveArgs {
            input: self.input.clone(),
            jobs: None,
            output: self.output.clone(),
            report: self.report.clone(),
            sheet: None,
            preview: self.preview.clone(),
            recursive: false,
            threads: None,
            summary: None,
            arch: self.arch || defaults.arch,
            through: if self.through.is_empty() { defaults.through.clone() } else { self.through.clone() },
            thrust: pick(&self.thrust, &defaults.thrust),
            sag: pick(&self.sag, &defaults.sag),
            rise: pick(&self.rise, &defaults.rise),
            max_force: pick(&self.max_force, &defaults.max_force),
            level_at: pick(&self.level_at, &defaults.level_at),
            length: pick(&self.length, &defaults.length),
            unstressed_length: pick(&self.unstressed_length, &defaults.unstressed_length),
            self_weight: pick(&self.self_weight, &defaults.self_weight),
            axial_stiffness: pick(&self.axial_stiffness, &defaults.axial_stiffness),
            chord_tolerance: pick(&self.chord_tolerance, &defaults.chord_tolerance),
            force_scale: pick(&self.force_scale, &defaults.force_scale),
            diagram_at: pick(&self.diagram_at, &defaults.diagram_at),
            text_height: self.text_height.or(defaults.text_height),
            // A line's own material or factors replace the command line's
            // whole, so that the two never mix into a contradiction.
            strength: if self.has_material() { self.strength.clone() } else { defaults.strength.clone() },
            catalogue: if self.has_material() { self.catalogue.clone() } else { defaults.catalogue.clone() },
            action_factor: if self.has_factors() { self.action_factor.clone() } else { defaults.action_factor.clone() },
            resistance_factor: if self.has_factors() {
                self.resistance_factor.clone()
            } else {
                defaults.resistance_factor.clone()
            },
            safety_factor: if self.has_factors() { self.safety_factor.clone() } else { defaults.safety_factor.clone() },
            force: self.force || defaults.force,
            quiet: true,
            read: self.read.or(&defaults.read),
        }
    }

    fn has_material(&self) -> bool {
        self.strength.is_some() || self.catalogue.is_some()
    }

    fn has_factors(&self) -> bool {
        self.action_factor.is_some() || self.resistance_factor.is_some() || self.safety_factor.is_some()
    }

    /// Checks the sizing options (reading the catalogue, if one is given).
    pub fn sizing(&self) -> Result<Option<Spec>> {
        if !self.has_material() {
            if self.has_factors() {
                bail!(
                    "safety factors were given but nothing to size: add --strength (e.g. \"1860 MPa\") or --catalogue FILE.csv"
                );
            }
            return Ok(None);
        }
        let material = match (&self.strength, &self.catalogue) {
            (Some(_), Some(_)) => bail!("--strength and --catalogue both give the material; keep one"),
            (Some(s), None) => Material::Strength(Strength::parse(s).map_err(|e| anyhow!("--strength: {e}"))?),
            (None, Some(path)) => {
                let text = std::fs::read_to_string(path)
                    .map_err(|e| anyhow!("cannot read the catalogue {}: {e}", path.display()))?;
                Material::Catalogue(Catalogue::parse(&text, &path.display().to_string())?)
            }
            (None, None) => return Ok(None),
        };
        let safety = match (&self.action_factor, &self.resistance_factor, &self.safety_factor) {
            (None, None, Some(sf)) => Safety::Global { factor: parse_factor(sf, "--safety-factor")? },
            (Some(a), Some(r), None) => Safety::Partial {
                action: parse_factor(a, "--action-factor")?,
                resistance: parse_factor(r, "--resistance-factor")?,
            },
            (_, _, Some(_)) => bail!(
                "--safety-factor is a global factor and cannot go with --action-factor or --resistance-factor; give either the global factor or the two partial factors"
            ),
            (None, None, None) => bail!(
                "sizing needs your code's factors: --action-factor and --resistance-factor (partial factors), or --safety-factor (a global factor)"
            ),
            (Some(_), None, None) => {
                bail!("--action-factor needs --resistance-factor as well (e.g. 1.35 for strands to EN 1993-1-11)")
            }
            (None, Some(_), None) => {
                bail!("--resistance-factor needs --action-factor as well (e.g. 1.35 on permanent actions to EN 1990)")
            }
        };
        Ok(Some(Spec { material, safety }))
    }

    /// Checks everything into a job.
    pub fn job(&self) -> Result<Job> {
        let (read, layers) = self.read.options()?;
        let mut given = Vec::new();
        for t in &self.through {
            let p = parse_point(t, "--through")?;
            given.push(Given::Through(p.x, p.y));
        }
        // Each condition may take a list of values (one condition at a
        // time): one design alternative per value.
        let mut alternatives: Vec<Given> = Vec::new();
        let mut listed: Option<&str> = None;
        let mut take = |flag: &'static str,
                        value: &Option<String>,
                        parse: &dyn Fn(&str) -> Result<Given>,
                        given: &mut Vec<Given>|
         -> Result<()> {
            let Some(v) = value else { return Ok(()) };
            let pieces: Vec<&str> = v.split(',').map(str::trim).collect();
            if pieces.len() == 1 {
                given.push(parse(pieces[0])?);
                return Ok(());
            }
            if let Some(other) = listed {
                bail!("{other} and {flag} both give lists; give a list of values for one condition at a time");
            }
            listed = Some(flag);
            for p in pieces {
                if p.is_empty() {
                    bail!(
                        "{flag} '{v}': an empty value in the list; write values separated by commas, e.g. {flag} 4,6,8"
                    );
                }
                alternatives.push(parse(p)?);
            }
            Ok(())
        };
        take("--thrust", &self.thrust, &|s| Ok(Given::Thrust(parse_force(s, "--thrust")?)), &mut given)?;
        take("--sag", &self.sag, &|s| Ok(Given::Sag(parse_length(s, "--sag")?)), &mut given)?;
        take("--rise", &self.rise, &|s| Ok(Given::Rise(parse_length(s, "--rise")?)), &mut given)?;
        take("--max-force", &self.max_force, &|s| Ok(Given::MaxForce(parse_force(s, "--max-force")?)), &mut given)?;
        take(
            "--level-at",
            &self.level_at,
            &|s| {
                let x: f64 = s.trim().parse().map_err(|_| {
                    anyhow!("--level-at '{s}' is not a number: give the x in drawing units, e.g. --level-at 24")
                })?;
                if !x.is_finite() {
                    bail!("--level-at '{s}' must be a finite x");
                }
                Ok(Given::LevelAt(x))
            },
            &mut given,
        )?;
        take("--length", &self.length, &|s| Ok(Given::Length(parse_length(s, "--length")?)), &mut given)?;
        take(
            "--unstressed-length",
            &self.unstressed_length,
            &|s| Ok(Given::UnstressedLength(parse_length(s, "--unstressed-length")?)),
            &mut given,
        )?;
        if alternatives.len() > MAX_ALTERNATIVES {
            bail!("{} alternatives given; give at most {MAX_ALTERNATIVES}", alternatives.len());
        }
        let (layout, force_scale) =
            layout_given(self.force_scale.as_deref(), self.diagram_at.as_deref(), self.text_height)?;
        let self_weight = self.self_weight.as_deref().map(parse_self_weight).transpose()?;
        let axial_stiffness =
            self.axial_stiffness.as_deref().map(|s| parse_force(s, "--axial-stiffness")).transpose()?;
        let chord_tolerance =
            self.chord_tolerance.as_deref().map(|s| parse_length(s, "--chord-tolerance")).transpose()?;
        Ok(Job {
            read,
            form: if self.arch { Form::Arch } else { Form::Cable },
            given,
            layout,
            force_scale,
            layers,
            self_weight,
            axial_stiffness,
            chord_tolerance,
            alternatives,
            sizing: self.sizing()?,
        })
    }
}

impl AssessArgs {
    /// Checks everything into an assessment job.
    pub fn job(&self) -> Result<AssessJob> {
        let mut input = ArchLayers::default();
        let output =
            layer_specs(&self.layers, "intrados, extrados, fill, loads", "intrados=ARCH-SOFFIT", |role, name| {
                match role {
                    "intrados" => input.intrados = name.into(),
                    "extrados" => input.extrados = name.into(),
                    "fill" => {
                        input.fill = name.into();
                        input.fill_required = true;
                    }
                    "loads" => input.loads = name.into(),
                    _ => return false,
                }
                true
            })?;
        distinct(&output, &[&input.intrados, &input.extrados, &input.fill, &input.loads])?;
        let (length_unit, force_unit, label_unit) =
            units_given(self.units.as_deref(), self.force_unit.as_deref(), self.label_unit.as_deref())?;
        let read =
            ReadOptions { layers: InputLayers::default(), length_unit, force_unit, label_unit, load_scale: None };
        // Zero is allowed: a weightless ring carrying only the drawn loads.
        let weight = |s: &str, flag: &str| -> Result<UnitWeight> {
            let (value, force, length) = parse_unit_weight(s.trim(), flag, true)?;
            Ok(UnitWeight { value, force, length })
        };
        let unit_weight = weight(&self.unit_weight, "--unit-weight")?;
        let fill_weight = self.fill_weight.as_deref().map(|s| weight(s, "--fill-weight")).transpose()?;
        let width = match &self.width {
            Some(s) => parse_length(s, "--width")?,
            None => LengthValue { value: 1.0, unit: Some(LengthUnit::Metre) },
        };
        let cuts = match self.cuts.trim().to_ascii_lowercase().as_str() {
            "radial" => Cuts::Radial,
            "vertical" => Cuts::Vertical,
            other => bail!("--cuts '{other}': give radial or vertical"),
        };
        let voussoirs = match self.voussoirs.as_deref().map(str::trim) {
            None => Voussoirs::Count(hangline::pipeline::assess::DEFAULT_VOUSSOIRS),
            Some(s) => match s.parse::<usize>() {
                Ok(n) if (1..=10_000).contains(&n) => Voussoirs::Count(n),
                Ok(_) => bail!("--voussoirs {s}: give between 1 and 10000 voussoirs"),
                Err(_) => Voussoirs::Size(parse_length(s, "--voussoirs")?),
            },
        };
        let trial = match &self.thrust {
            Some(t) => {
                let thrust = parse_force(t, "--thrust")?;
                let (left, right) = match &self.thrust_at {
                    Some(s) => {
                        let p = parse_point(s, "--thrust-at")?;
                        (p.x, p.y)
                    }
                    None => (0.5, 0.5),
                };
                Some(Trial { thrust, left, right })
            }
            None => None,
        };
        let live = match &self.live_load {
            Some(l) => {
                let load = parse_force(l, "--live-load")?;
                let at = match &self.live_at {
                    Some(s) => {
                        let x: f64 = s.trim().parse().map_err(|_| {
                            anyhow!("--live-at '{s}' is not a number: give the x in drawing units, e.g. --live-at 4.5")
                        })?;
                        if !x.is_finite() {
                            bail!("--live-at '{s}' must be a finite x");
                        }
                        Some(x)
                    }
                    None => None,
                };
                Some(Live { load, at })
            }
            None => None,
        };
        let (layout, force_scale) =
            layout_given(self.force_scale.as_deref(), self.diagram_at.as_deref(), self.text_height)?;
        Ok(AssessJob {
            read: ArchReadOptions { layers: input, read },
            unit_weight,
            width,
            fill_weight,
            cuts,
            voussoirs,
            trial,
            live,
            layout,
            force_scale,
            layers: output,
        })
    }
}
