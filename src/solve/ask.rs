//! The three conditions: the structure's fixed supports plus the user's
//! options, checked one by one, counted, and named for messages with the
//! command-line spellings and the structure's units.

use kurbo::Point;

use super::types::{Condition, Form, SolveError, SolveOptions, UsedCondition};
use crate::model::{LIMIT, Structure, Support, fmt_num};
use crate::units::Units;

/// One of the three conditions that pick a funicular, in drawing coordinates.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) enum Cond {
    /// The left support is this fixed point.
    Left(Point),
    /// The right support is this fixed point.
    Right(Point),
    /// `--through`.
    Through(Point),
    /// `--thrust`.
    Thrust(f64),
    /// `--sag` (cable) or `--rise` (arch).
    Sag(f64),
    /// `--max-force`.
    MaxForce(f64),
    /// `--level-at`.
    LevelAt(f64),
    /// `--length`: the length of the profile.
    Length(f64),
    /// `--unstressed-length`: the unstressed length (needs an axial stiffness).
    Unstressed(f64),
}

impl From<Condition> for Cond {
    fn from(c: Condition) -> Cond {
        match c {
            Condition::Through(p) => Cond::Through(p),
            Condition::Thrust(h) => Cond::Thrust(h),
            Condition::Sag(f) => Cond::Sag(f),
            Condition::MaxForce(t) => Cond::MaxForce(t),
            Condition::LevelAt(x) => Cond::LevelAt(x),
            Condition::Length(l) => Cond::Length(l),
            Condition::UnstressedLength(l) => Cond::Unstressed(l),
        }
    }
}

impl Cond {
    /// True for the conditions that fix a height of the profile; without one
    /// the whole polygon could slide up and down.
    pub fn fixes_height(&self) -> bool {
        matches!(self, Cond::Left(_) | Cond::Right(_) | Cond::Through(_))
    }

    /// The condition as reported.
    pub fn used(&self, form: Form) -> UsedCondition {
        let (kind, point, value) = match *self {
            Cond::Left(p) => ("left-support", Some([p.x, p.y]), None),
            Cond::Right(p) => ("right-support", Some([p.x, p.y]), None),
            Cond::Through(p) => ("through", Some([p.x, p.y]), None),
            Cond::Thrust(h) => ("thrust", None, Some(h)),
            Cond::Sag(f) => (if form == Form::Arch { "rise" } else { "sag" }, None, Some(f)),
            Cond::MaxForce(t) => ("max-force", None, Some(t)),
            Cond::LevelAt(x) => ("level-at", None, Some(x)),
            Cond::Length(l) => ("length", None, Some(l)),
            Cond::Unstressed(l) => ("unstressed-length", None, Some(l)),
        };
        UsedCondition { kind, point, value }
    }
}

/// Names conditions and quantities the way the user typed them.
#[derive(Clone, Copy, Debug)]
pub(crate) struct Namer {
    /// Units of the structure.
    pub units: Units,
    /// Cable or arch (`--sag` or `--rise`).
    pub form: Form,
}

impl Namer {
    /// A force with its unit, e.g. `450 kN`.
    pub fn force(&self, v: f64) -> String {
        format!("{} {}", fmt_num(v), self.units.force.symbol())
    }

    /// A length with its unit, e.g. `2.5 m`.
    pub fn length(&self, v: f64) -> String {
        format!("{} {}", fmt_num(v), self.units.length.symbol())
    }

    /// The option that gives the sag or the rise.
    pub fn sag_flag(&self) -> &'static str {
        if self.form == Form::Arch { "--rise" } else { "--sag" }
    }

    /// One condition, e.g. `--thrust 450 kN` or `left support (0, 12)`.
    pub fn name(&self, c: &Cond) -> String {
        match *c {
            Cond::Left(p) => format!("left support ({}, {})", fmt_num(p.x), fmt_num(p.y)),
            Cond::Right(p) => format!("right support ({}, {})", fmt_num(p.x), fmt_num(p.y)),
            Cond::Through(p) => format!("--through {},{}", fmt_num(p.x), fmt_num(p.y)),
            Cond::Thrust(h) => format!("--thrust {}", self.force(h)),
            Cond::Sag(f) => format!("{} {}", self.sag_flag(), self.length(f)),
            Cond::MaxForce(t) => format!("--max-force {}", self.force(t)),
            Cond::LevelAt(x) => format!("--level-at {}", fmt_num(x)),
            Cond::Length(l) => format!("--length {}", self.length(l)),
            Cond::Unstressed(l) => format!("--unstressed-length {}", self.length(l)),
        }
    }

    /// The self-weight option, e.g. `--self-weight 0.5 kN/m`.
    pub fn self_weight(&self, q: f64) -> String {
        format!("--self-weight {} {}/{}", fmt_num(q), self.units.force.symbol(), self.units.length.symbol())
    }

    /// The axial stiffness option, e.g. `--axial-stiffness 2e5 kN`.
    pub fn stiffness(&self, ea: f64) -> String {
        format!("--axial-stiffness {}", self.force(ea))
    }

    /// Several conditions as `a, b and c` (`none` when empty).
    pub fn list<'a>(&self, cs: impl IntoIterator<Item = &'a Cond>) -> String {
        let names: Vec<String> = cs.into_iter().map(|c| self.name(c)).collect();
        match names.len() {
            0 => "none".to_string(),
            1 => names[0].clone(),
            k => format!("{} and {}", names[..k - 1].join(", "), names[k - 1]),
        }
    }

    /// The options that add a condition, spelled for this form.
    pub fn menu(&self) -> String {
        format!("--through X,Y, --thrust H, {} F, --max-force T, --level-at X", self.sag_flag())
    }
}

/// The structure's fixed supports followed by the user's conditions, each
/// checked, and exactly three of them (default options).
#[cfg(test)]
pub(crate) fn gather(structure: &Structure, form: Form, given: &[Condition]) -> Result<Vec<Cond>, SolveError> {
    gather_with(structure, form, given, &SolveOptions::default())
}

/// Checks the options: a self-weight and an axial stiffness must be positive
/// forces (per length), the tolerances positive, at least one iteration.
pub(crate) fn check_options(namer: &Namer, options: &SolveOptions) -> Result<(), SolveError> {
    if let Some(q) = options.self_weight {
        if !(number_ok(q) && q > 0.0) {
            return Err(SolveError::BadValue {
                condition: namer.self_weight(q),
                problem: "the self-weight must be a positive force per unit length of the profile; give it without a sign, or leave it out".into(),
            });
        }
    }
    if let Some(ea) = options.axial_stiffness {
        if !(number_ok(ea) && ea > 0.0) {
            return Err(SolveError::BadValue {
                condition: namer.stiffness(ea),
                problem:
                    "the axial stiffness EA must be a positive force (Young's modulus times the cross-section area)"
                        .into(),
            });
        }
    }
    if let Some(t) = options.chord_tolerance {
        if !(number_ok(t) && t > 0.0) {
            return Err(SolveError::BadValue {
                condition: format!("chord tolerance {}", namer.length(t)),
                problem: "the chord tolerance must be a positive length: how far the drawn chords may stray from the exact curve".into(),
            });
        }
    }
    let it = options.iteration_tolerance;
    if !(it.is_finite() && it > 0.0 && it < 1.0) {
        return Err(SolveError::BadValue {
            condition: format!("iteration tolerance {}", fmt_num(it)),
            problem: "the iteration tolerance must be a fraction between 0 and 1 of the total load (1e-13 by default)"
                .into(),
        });
    }
    if options.max_iterations == 0 {
        return Err(SolveError::BadValue {
            condition: "max iterations 0".into(),
            problem: "at least one self-weight iteration is needed (200 by default)".into(),
        });
    }
    Ok(())
}

/// The structure's fixed supports followed by the user's conditions, each
/// checked against the structure and the options, and exactly three of them.
pub(crate) fn gather_with(
    structure: &Structure,
    form: Form,
    given: &[Condition],
    options: &SolveOptions,
) -> Result<Vec<Cond>, SolveError> {
    let namer = Namer { units: structure.units(), form };
    let mut conds = Vec::with_capacity(given.len() + 2);
    if let Some(p) = structure.left().fixed_point() {
        conds.push(Cond::Left(p));
    }
    if let Some(p) = structure.right().fixed_point() {
        conds.push(Cond::Right(p));
    }
    for g in given {
        let c = Cond::from(*g);
        check_value(structure, &namer, &c)?;
        if let Cond::Unstressed(_) = c {
            if options.axial_stiffness.is_none() {
                return Err(bad(
                    &namer,
                    &c,
                    "the unstressed length needs the cable's axial stiffness: add --axial-stiffness EA (a force), or give --length S for the length as it hangs".into(),
                ));
            }
            if form == Form::Arch {
                return Err(bad(
                    &namer,
                    &c,
                    "the unstressed length is for a cable; for an arch give --length S, its length under load".into(),
                ));
            }
        }
        conds.push(c);
    }
    if conds.len() != 3 {
        return Err(count_error(structure, &namer, &conds));
    }
    Ok(conds)
}

fn number_ok(v: f64) -> bool {
    v.is_finite() && v.abs() < LIMIT
}

fn bad(namer: &Namer, c: &Cond, problem: String) -> SolveError {
    SolveError::BadValue { condition: namer.name(c), problem }
}

/// Checks one user condition's value against the structure.
pub(crate) fn check_value(structure: &Structure, namer: &Namer, c: &Cond) -> Result<(), SolveError> {
    let (xl, xr) = (structure.left().x(), structure.right().x());
    let span_text = format!("from x = {} to x = {}", fmt_num(xl), fmt_num(xr));
    match *c {
        Cond::Thrust(h) if !(number_ok(h) && h > 0.0) => Err(bad(
            namer,
            c,
            "the thrust must be a positive force (the horizontal pull at the supports); give it without a sign".into(),
        )),
        Cond::Sag(f) if !(number_ok(f) && f > 0.0) => Err(bad(
            namer,
            c,
            format!(
                "the {} must be a positive length: the largest vertical distance between the chord and the profile",
                &namer.sag_flag()[2..]
            ),
        )),
        Cond::MaxForce(t) if !(number_ok(t) && t > 0.0) => Err(bad(
            namer,
            c,
            "the largest segment force must be a positive force (a magnitude, without a sign)".into(),
        )),
        Cond::Through(p) if !(number_ok(p.x) && number_ok(p.y)) => {
            Err(bad(namer, c, "the point must have finite coordinates".into()))
        }
        Cond::Through(p) if p.x < xl || p.x > xr => Err(bad(
            namer,
            c,
            format!("the point's x must lie on the span, {span_text}; move the point between the supports"),
        )),
        Cond::LevelAt(x) if !number_ok(x) => Err(bad(namer, c, "x must be a finite number".into())),
        Cond::LevelAt(x) if x <= xl || x >= xr => Err(bad(
            namer,
            c,
            format!("x must lie strictly inside the span, {span_text}; the profile is level in a segment between them"),
        )),
        Cond::LevelAt(x) if structure.all_vertical() => level_at_node(structure, namer, c, x),
        Cond::Length(l) | Cond::Unstressed(l) if !(number_ok(l) && l > 0.0) => Err(bad(
            namer,
            c,
            "the length must be a positive length, measured along the profile from support to support".into(),
        )),
        _ => Ok(()),
    }
}

/// For vertical loads the nodes sit on the loads' verticals, where the slope
/// jumps: a level point asked exactly there belongs to no segment.
fn level_at_node(structure: &Structure, namer: &Namer, c: &Cond, x: f64) -> Result<(), SolveError> {
    let xs: Vec<f64> = std::iter::once(structure.left().x())
        .chain(structure.loads().iter().map(|l| l.anchor.x))
        .chain(std::iter::once(structure.right().x()))
        .collect();
    // Loads are sorted and strictly inside the span (Structure::new), so xs is sorted.
    let i = xs.partition_point(|&v| v < x);
    if i == 0 || i >= xs.len() - 1 || xs[i] != x {
        return Ok(());
    }
    Err(bad(
        namer,
        c,
        format!(
            "x = {} is the node under the load at {}, where the slope jumps; move x into a segment, between {} and {} or between {} and {}",
            fmt_num(x),
            structure.loads()[i - 1].origin,
            fmt_num(xs[i - 1]),
            fmt_num(x),
            fmt_num(x),
            fmt_num(xs[i + 1]),
        ),
    ))
}

fn count_word(k: usize) -> &'static str {
    match k {
        1 => "one",
        2 => "two",
        3 => "three",
        _ => "some",
    }
}

/// Builds the message for too few or too many conditions.
fn count_error(structure: &Structure, namer: &Namer, conds: &[Cond]) -> SolveError {
    let given = conds.len();
    let mut advice = if given < 3 {
        format!("Add {} of {}.", count_word(3 - given), namer.menu())
    } else {
        let options: Vec<&Cond> = conds.iter().filter(|c| !matches!(c, Cond::Left(_) | Cond::Right(_))).collect();
        format!(
            "Drop {} of {}, or draw a support as a tower axis (a vertical line) so that its height is found.",
            count_word(given - 3),
            namer.list(options)
        )
    };
    let axes: Vec<&str> = [("left", structure.left()), ("right", structure.right())]
        .into_iter()
        .filter(|(_, s)| matches!(s, Support::Axis { .. }))
        .map(|(side, _)| side)
        .collect();
    if !axes.is_empty() {
        let which = if axes.len() == 2 {
            "both supports are tower axes".to_string()
        } else {
            format!("the {} support is a tower axis", axes[0])
        };
        advice.push_str(&format!(" ({which}: a tower's height is found, so it does not count.)"));
    }
    SolveError::Count { given, list: namer.list(conds), advice }
}
