//! The exact solve for vertical loads.
//!
//! With y(x) = y_L + v·x + u·F(x) (see [`super::beam`]) every condition but
//! `--max-force` is linear in (y_L, v, u):
//!
//! | condition            | equation                           |
//! |----------------------|------------------------------------|
//! | support or through   | y_L + v·x + u·F(x) = y             |
//! | level-at x           | v + u·Cₖ = 0 (k the segment at x)  |
//! | thrust H             | u = s/H                            |
//! | sag or rise f        | u = s·f/M_max                      |
//!
//! (s = +1 cable, −1 arch; the sag row because chord − y = u·M(x), M the
//! simple-beam moment — Beer & Johnston, *Vector Mechanics for Engineers:
//! Statics*, §7.8–7.9, Prob. 7.114.) The unknowns are scaled to
//! z = (y_L/L, v, u·W), W = Σ|Wⱼ|, so every coefficient is of order one, and
//! the 3 × 3 system is solved by partial pivoting.

use super::ask::{Cond, Namer};
use super::beam::Beam;
use super::dense::solve3;
use super::dependency;
use super::frame::{Frame, Params};
use super::maxforce;
use super::types::{Form, SolveError};

/// One linear condition: a·z = e.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Row {
    /// Coefficients of z = (y_L/L, v, u·W).
    pub a: [f64; 3],
    /// Right-hand side.
    pub e: f64,
}

/// What the vertical-load solve found.
#[derive(Clone, Debug)]
pub(crate) struct Found {
    /// The funicular's parameters.
    pub params: Params,
    /// A second funicular meeting the same conditions (`--max-force` only).
    pub other: Option<Params>,
}

/// The row of a linear condition; `None` for `--max-force`.
pub(crate) fn row(beam: &Beam, frame: &Frame, c: &Cond, s: f64) -> Option<Row> {
    let (l, w) = (beam.span, beam.w_scale);
    let height = |x: f64, y: f64| Row { a: [1.0, x / l, beam.f_at(x) / (w * l)], e: y / l };
    Some(match *c {
        Cond::Left(p) => Row { a: [1.0, 0.0, 0.0], e: (p.y - frame.y0) / l },
        Cond::Right(p) => Row { a: [1.0, 1.0, beam.f_right / (w * l)], e: (p.y - frame.y0) / l },
        Cond::Through(p) => height(p.x - frame.x0, p.y - frame.y0),
        Cond::LevelAt(x) => Row { a: [0.0, 1.0, beam.cum[beam.segment_at(x - frame.x0)] / w], e: 0.0 },
        Cond::Thrust(h) => Row { a: [0.0, 0.0, 1.0], e: s * w / h },
        Cond::Sag(f) => Row { a: [0.0, 0.0, 1.0], e: s * f * w / beam.m_max },
        Cond::MaxForce(_) | Cond::Length(_) | Cond::Unstressed(_) => return None,
    })
}

/// The pole and left height from z.
pub(crate) fn params(beam: &Beam, z: [f64; 3]) -> Params {
    let u = z[2] / beam.w_scale;
    let ox = 1.0 / u;
    Params { ox, oy: z[1] * ox, y_left: z[0] * beam.span }
}

/// Solves the vertical-load problem `beam` under `conds` (exactly three).
pub(crate) fn solve(beam: &Beam, frame: &Frame, conds: &[Cond], namer: &Namer) -> Result<Found, SolveError> {
    let s = namer.form.sign();
    if !conds.iter().any(Cond::fixes_height) {
        return Err(dependency::no_height(conds, namer));
    }
    if conds.iter().any(|c| matches!(c, Cond::Sag(_))) && (beam.m_max.is_nan() || beam.m_max <= 0.0) {
        return Err(SolveError::NoSolution {
            form: namer.form,
            list: namer.list(conds),
            reason: format!(
                "these loads push up on balance, so no {} lies on the {} side of its chord; replace {} with --thrust H",
                namer.form,
                if namer.form == Form::Arch { "upper" } else { "lower" },
                namer.sag_flag()
            ),
        });
    }
    let rows: Vec<(usize, Row)> =
        conds.iter().enumerate().filter_map(|(i, c)| row(beam, frame, c, s).map(|r| (i, r))).collect();
    match rows.as_slice() {
        [(_, r0), (_, r1), (_, r2)] => {
            let z = solve3([r0.a, r1.a, r2.a], [r0.e, r1.e, r2.e])
                .ok_or_else(|| dependency::explain(conds, &rows, beam, namer))?;
            check_sign(z[2], conds, namer)?;
            Ok(Found { params: params(beam, z), other: None })
        }
        [a, b] => {
            let Some(t) = conds.iter().find_map(|c| if let Cond::MaxForce(t) = c { Some(*t) } else { None }) else {
                return Err(dependency::several_max_force(conds, namer));
            };
            let pick = maxforce::solve(beam, [*a, *b], t, conds, namer)?;
            Ok(Found { params: params(beam, pick.z), other: pick.other.map(|z| params(beam, z)) })
        }
        _ => Err(dependency::several_max_force(conds, namer)),
    }
}

/// The solved u·W must have the form's sign: positive for a cable.
pub(crate) fn check_sign(z2: f64, conds: &[Cond], namer: &Namer) -> Result<(), SolveError> {
    let s = namer.form.sign();
    if s * z2 > 1e-12 {
        return Ok(());
    }
    let arch = namer.form == Form::Arch;
    let mut fixes = Vec::new();
    if let Some(c) = conds.iter().find(|c| matches!(c, Cond::Through(_))) {
        fixes.push(format!("move the {} point {} the chord", namer.name(c), if arch { "above" } else { "below" }));
    }
    if let Some(c) = conds.iter().find(|c| matches!(c, Cond::LevelAt(_))) {
        fixes.push(format!("move {} toward the {} support", namer.name(c), if arch { "higher" } else { "lower" }));
    }
    let fix = if fixes.is_empty() { String::new() } else { format!(", or {}", fixes.join(", or ")) };
    let reason = if s * z2 > -1e-12 {
        format!("they need a straight profile, which only an infinite thrust gives; change one of them{fix}")
    } else if arch {
        format!(
            "under these loads they give a profile hanging below the chord, in tension like a cable; drop --arch to get that cable{fix}"
        )
    } else {
        format!(
            "under these loads they give a profile standing above the chord, in compression like an arch; use --arch to get that arch{fix}"
        )
    };
    Err(SolveError::NoSolution { form: namer.form, list: namer.list(conds), reason })
}
