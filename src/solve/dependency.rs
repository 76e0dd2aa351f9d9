//! Naming conditions that fix the same thing or contradict each other, when
//! the linear system of [`super::linear`] is singular.
//!
//! Two rows fix the same thing when they are parallel; they then agree or
//! contradict according to their right-hand sides. When no two rows are
//! parallel the three together are dependent.

use super::ask::{Cond, Namer};
use super::beam::Beam;
use super::linear::Row;
use super::types::SolveError;
use crate::model::fmt_num;

/// Rows whose cross product is this small, relative to their lengths, are parallel.
const PARALLEL: f64 = 1e-10;

fn norm(a: [f64; 3]) -> f64 {
    a.iter().map(|v| v * v).sum::<f64>().sqrt()
}

fn cross(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
    [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]]
}

/// Whether the right-hand sides of parallel rows agree: with b = c·a, e_b = c·e_a.
fn consistent(ra: &Row, rb: &Row) -> bool {
    let c = ra.a.iter().zip(&rb.a).map(|(x, y)| x * y).sum::<f64>() / ra.a.iter().map(|x| x * x).sum::<f64>();
    (rb.e - c * ra.e).abs() <= 1e-9 * (1.0 + rb.e.abs() + (c * ra.e).abs())
}

/// No condition fixes a height: the profile could slide up and down.
pub(crate) fn no_height(conds: &[Cond], namer: &Namer) -> SolveError {
    SolveError::Dependent {
        list: namer.list(conds),
        problem: "fix only slopes and forces, not the height of the profile (it could slide up and down)".into(),
        advice: "replace one of them with --through X,Y, or draw a support as a point".into(),
    }
}

/// More than one `--max-force`.
pub(crate) fn several_max_force(conds: &[Cond], namer: &Namer) -> SolveError {
    let mf: Vec<&Cond> = conds.iter().filter(|c| matches!(c, Cond::MaxForce(_))).collect();
    SolveError::Dependent {
        list: namer.list(mf.iter().copied()),
        problem: "all fix the largest force".into(),
        advice: format!("keep one --max-force and replace the others with {}", namer.menu()),
    }
}

/// The thrust a condition implies, for conditions that fix only the thrust.
fn implied_thrust(c: &Cond, beam: &Beam) -> Option<f64> {
    match *c {
        Cond::Thrust(h) => Some(h),
        Cond::Sag(f) => Some(beam.m_max / f),
        _ => None,
    }
}

fn height_x(c: &Cond) -> Option<f64> {
    match *c {
        Cond::Left(p) | Cond::Right(p) | Cond::Through(p) => Some(p.x),
        _ => None,
    }
}

/// The message for two parallel rows, if `ra` and `rb` are parallel.
pub(crate) fn pair(ca: &Cond, cb: &Cond, ra: &Row, rb: &Row, beam: &Beam, namer: &Namer) -> Option<SolveError> {
    if norm(cross(ra.a, rb.a)) > PARALLEL * norm(ra.a) * norm(rb.a) {
        return None;
    }
    let agree = consistent(ra, rb);
    let list = namer.list([ca, cb]);
    let (problem, advice) = if let (Some(ha), Some(hb)) = (implied_thrust(ca, beam), implied_thrust(cb, beam)) {
        let problem = if agree {
            format!("both fix the thrust (each means a thrust of {})", namer.force(ha))
        } else {
            format!(
                "both fix the thrust but ask for different ones: {} from {}, {} from {}",
                namer.force(ha),
                namer.name(ca),
                namer.force(hb),
                namer.name(cb)
            )
        };
        (problem, "replace one with --through X,Y or --level-at X".to_string())
    } else if let (Some(x), Some(_)) = (height_x(ca), height_x(cb)) {
        let problem = if agree {
            format!("both fix the height at x = {}", fmt_num(x))
        } else {
            format!("ask for two different heights at x = {}", fmt_num(x))
        };
        (
            problem,
            format!(
                "move the --through point to another x, or replace it with --thrust H, {} F or --level-at X",
                namer.sag_flag()
            ),
        )
    } else if matches!((ca, cb), (Cond::LevelAt(_), Cond::LevelAt(_))) {
        (
            "both fix the slope of the same segment (no net load acts between them)".to_string(),
            format!("replace one with --through X,Y, --thrust H or {} F", namer.sag_flag()),
        )
    } else {
        let problem = if agree { "fix the same thing" } else { "contradict each other" };
        (problem.to_string(), format!("replace one with another of {}", namer.menu()))
    };
    Some(SolveError::Dependent { list, problem, advice })
}

/// Explains a singular system of three rows (`rows` holds each row with the
/// index of its condition in `conds`).
pub(crate) fn explain(conds: &[Cond], rows: &[(usize, Row)], beam: &Beam, namer: &Namer) -> SolveError {
    for (i, (ci, ri)) in rows.iter().enumerate() {
        for (cj, rj) in &rows[i + 1..] {
            if let Some(e) = pair(&conds[*ci], &conds[*cj], ri, rj, beam, namer) {
                return e;
            }
        }
    }
    // Three rows, no two parallel, yet singular: one is a combination of the
    // others. The left null vector w (wᵀA = 0) is the cross product of two
    // columns; the system is consistent when w·e = 0.
    let a: Vec<[f64; 3]> = rows.iter().map(|(_, r)| r.a).collect();
    let e: Vec<f64> = rows.iter().map(|(_, r)| r.e).collect();
    let agree = if let [r0, r1, r2] = a.as_slice() {
        let cols = [[r0[0], r1[0], r2[0]], [r0[1], r1[1], r2[1]], [r0[2], r1[2], r2[2]]];
        let ws = [cross(cols[0], cols[1]), cross(cols[1], cols[2]), cross(cols[0], cols[2])];
        let w = ws.into_iter().max_by(|p, q| norm(*p).total_cmp(&norm(*q))).unwrap_or([0.0; 3]);
        let we: f64 = w.iter().zip(&e).map(|(x, y)| x * y).sum();
        we.abs() <= 1e-9 * norm(w) * (1.0 + e.iter().map(|v| v.abs()).sum::<f64>())
    } else {
        true
    };
    let problem = if agree {
        "leave the funicular free: every funicular that meets two of them meets the third"
    } else {
        "contradict each other: no funicular meets all three"
    };
    SolveError::Dependent {
        list: namer.list(conds),
        problem: problem.into(),
        advice: format!("replace one of them with another of {}", namer.menu()),
    }
}

#[cfg(test)]
mod tests {
    use kurbo::{Point, Vec2};

    use super::*;
    use crate::solve::frame::Frame;
    use crate::solve::types::Form;
    use crate::units::{ForceUnit, LengthUnit, Units};

    #[test]
    fn parallel_rows_of_unrelated_kinds_get_the_general_message() {
        // No two kinds of condition give parallel rows in practice; this is
        // the fallback's message, on made-up rows.
        let frame = Frame {
            x0: 0.0,
            y0: 0.0,
            span: 10.0,
            anchors: vec![Vec2::new(5.0, 0.0)],
            forces: vec![Vec2::new(0.0, -10.0)],
            load_line: vec![Vec2::ZERO, Vec2::new(0.0, -10.0)],
            vertical: true,
            force_scale: 10.0,
        };
        let beam = Beam::new(&frame);
        let namer =
            Namer { units: Units { length: LengthUnit::Metre, force: ForceUnit::Kilonewton }, form: Form::Arch };
        let (a, b) = (Cond::LevelAt(3.0), Cond::Through(Point::new(4.0, 1.0)));
        let r = Row { a: [0.0, 1.0, 0.5], e: 0.0 };
        let m = pair(&a, &b, &r, &Row { e: 1.0, ..r }, &beam, &namer).unwrap().to_string();
        assert!(m.contains("the conditions --level-at 3 and --through 4,1 contradict each other"), "{m}");
        assert!(m.contains("replace one with another of --through X,Y, --thrust H, --rise F"), "{m}");
        let m = pair(&a, &b, &r, &r, &beam, &namer).unwrap().to_string();
        assert!(m.contains("fix the same thing"), "{m}");
        assert!(pair(&a, &b, &r, &Row { a: [1.0, 0.0, 0.0], e: 0.0 }, &beam, &namer).is_none());
    }
}
