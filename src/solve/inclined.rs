//! Inclined loads: damped Newton's method on the three parameters
//! (Oₓ, O_y, y_L), with the residuals evaluated on the constructed polygon
//! and their exact Jacobian from the same construction run on dual numbers.
//!
//! Start: the vertical-component problem (each load's vertical component at
//! its anchor's x), solved exactly by [`super::linear`]. Should Newton's method
//! stall from there (steep loads), the horizontal components are brought in
//! gradually, τ·Pₓ with τ from 0 to 1, each problem started from the last
//! solution (continuation, or homotopy: Allgower & Georg, *Numerical
//! Continuation Methods*, 1990, ch. 1 — from memory).
//!
//! Damping: the full step is halved until the largest scaled residual
//! decreases and the pole stays on the form's side (Oₓ of the form's sign);
//! backtracking as in Dennis & Schnabel, *Numerical Methods for Unconstrained
//! Optimization and Nonlinear Equations*, 1983, §6.3 (from memory).
//!
//! Stopping test: iterate until (a) every residual is exactly zero, or
//! (b) the Newton step changes no parameter by more than 4ε of its scale,
//! or (c) no damped step lowers the largest scaled residual any more — the
//! round-off floor of the construction. Converged if the largest scaled
//! residual is then at most [`TOLERANCE`]; otherwise the next continuation
//! step is tried, and in the end no solution is reported.

use super::ask::{Cond, Namer};
use super::construction::{Broken, Polygon, construct};
use super::dense::solve3;
use super::frame::{Frame, Params};
use super::num::Dual;
use super::residual::{newton_scale, residual};
use super::types::SolveError;
use crate::model::{Load, fmt_num};

/// Largest scaled residual accepted once Newton's method has stopped.
pub(crate) const TOLERANCE: f64 = 1e-10;

const MAX_STEPS: usize = 60;
const MAX_HALVINGS: usize = 30;
/// A thrust this many times Σ|P| means the iteration is heading for a
/// straight profile: the conditions can only be approached, not met.
const RUNAWAY: f64 = 1e8;
/// Smallest continuation step in τ before giving up.
const MIN_DTAU: f64 = 1.0 / 4096.0;

/// Why Newton's method stopped short.
#[derive(Clone, Copy, Debug)]
pub(crate) enum Stall {
    /// The polygon could not be drawn at the start.
    Broken(Broken),
    /// The Jacobian was singular.
    Singular,
    /// The pole ran off toward an infinite thrust: a straight profile.
    Straight,
    /// The residual stayed above the tolerance.
    Residual { value: f64, steps: usize },
}

/// Scaled residuals at `p`, or `None` when the polygon cannot be drawn.
fn scaled(frame: &Frame, conds: &[Cond], p: &Params, s: f64) -> Option<[f64; 3]> {
    let poly = construct(frame, p.ox, p.oy, p.y_left).ok()?;
    let mut r = [0.0; 3];
    for (ri, c) in r.iter_mut().zip(conds) {
        *ri = residual(c, frame, &poly, s) / newton_scale(c, frame);
    }
    r.iter().all(|v| v.is_finite()).then_some(r)
}

fn largest(r: &[f64; 3]) -> f64 {
    r.iter().fold(0.0, |m, v| m.max(v.abs()))
}

/// Residuals and Jacobian (scaled rows, parameters scaled by `vs`).
fn linearise(
    frame: &Frame,
    conds: &[Cond],
    p: &Params,
    s: f64,
    vs: [f64; 3],
) -> Result<([f64; 3], [[f64; 3]; 3]), Broken> {
    let poly: Polygon<Dual> = construct(frame, Dual::var(p.ox, 0), Dual::var(p.oy, 1), Dual::var(p.y_left, 2))?;
    let mut r = [0.0; 3];
    let mut j = [[0.0; 3]; 3];
    for (i, c) in conds.iter().enumerate() {
        let d = residual(c, frame, &poly, s);
        let rs = newton_scale(c, frame);
        r[i] = d.v / rs;
        for k in 0..3 {
            j[i][k] = d.d[k] * vs[k] / rs;
        }
    }
    Ok((r, j))
}

/// Damped Newton's method on `frame` from `start`.
pub(crate) fn newton(frame: &Frame, conds: &[Cond], start: Params, s: f64) -> Result<Params, Stall> {
    let vs = [frame.force_scale, frame.force_scale, frame.span];
    let mut p = start;
    let (mut r, _) = linearise(frame, conds, &p, s, vs).map_err(Stall::Broken)?;
    let mut steps = 0;
    while steps < MAX_STEPS && largest(&r) > 0.0 {
        steps += 1;
        if p.ox.abs() > RUNAWAY * frame.force_scale {
            return Err(Stall::Straight);
        }
        let Ok((r0, j)) = linearise(frame, conds, &p, s, vs) else { break };
        let Some(dz) = solve3(j, [-r0[0], -r0[1], -r0[2]]) else { return Err(Stall::Singular) };
        let scale = [p.ox.abs().max(vs[0]), p.oy.abs().max(vs[1]), p.y_left.abs().max(vs[2])];
        if (0..3).all(|k| (dz[k] * vs[k]).abs() <= 4.0 * f64::EPSILON * scale[k]) {
            break;
        }
        let mut lambda = 1.0;
        let mut accepted = None;
        for _ in 0..MAX_HALVINGS {
            let q = Params {
                ox: p.ox + lambda * dz[0] * vs[0],
                oy: p.oy + lambda * dz[1] * vs[1],
                y_left: p.y_left + lambda * dz[2] * vs[2],
            };
            // Keep the pole on the form's side; a step that breaks the
            // construction counts as no decrease.
            let better =
                (s * q.ox > 0.0).then(|| scaled(frame, conds, &q, s)).flatten().filter(|rq| largest(rq) < largest(&r));
            if let Some(rq) = better {
                accepted = Some((q, rq));
                break;
            }
            lambda *= 0.5;
        }
        let Some((q, rq)) = accepted else { break };
        p = q;
        r = rq;
    }
    if largest(&r) > TOLERANCE {
        return Err(Stall::Residual { value: largest(&r), steps });
    }
    Ok(p)
}

/// Brings the horizontal load components in by steps of τ.
fn continuation(frame: &Frame, conds: &[Cond], start: Params, s: f64) -> Result<Params, Stall> {
    let mut p = newton(&frame.tilted(0.0), conds, start, s)?;
    let (mut tau, mut dtau) = (0.0, 0.25_f64);
    while tau < 1.0 {
        let next = (tau + dtau).min(1.0);
        let f = if next < 1.0 { frame.tilted(next) } else { frame.clone() };
        match newton(&f, conds, p, s) {
            Ok(q) => {
                p = q;
                tau = next;
                dtau *= 2.0;
            }
            Err(e) => {
                dtau *= 0.5;
                if dtau < MIN_DTAU {
                    return Err(e);
                }
            }
        }
    }
    Ok(p)
}

/// Solves for inclined loads from `start`. `conds` holds exactly three.
pub(crate) fn solve(
    frame: &Frame,
    loads: &[Load],
    conds: &[Cond],
    start: Params,
    namer: &Namer,
) -> Result<Params, SolveError> {
    let s = namer.form.sign();
    let stall = match newton(frame, conds, start, s) {
        Ok(p) => return Ok(p),
        Err(e) => e,
    };
    if let Ok(p) = continuation(frame, conds, start, s) {
        return Ok(p);
    }
    // The direct attempt's failure is the one to report: it started from the
    // user's own problem, not an intermediate one.
    let reason = match stall {
        Stall::Broken(b) => return Err(broken(b, loads, namer, conds)),
        Stall::Straight => format!(
            "only a straight profile with an infinite thrust comes near them (a {} must lie {} the chord between its supports); move a --through point or change a condition",
            namer.form,
            if s > 0.0 { "below" } else { "above" }
        ),
        Stall::Singular => "with these inclined loads the conditions do not fix a single funicular (their linearisation is singular); replace one of them".to_string(),
        Stall::Residual { value, steps } => format!(
            "Newton's method stalled with a residual of {} after {steps} steps, also when the loads' horizontal components were brought in gradually; the loads may be too steeply inclined for these conditions: draw them nearer vertical or change a condition",
            fmt_num(value)
        ),
    };
    Err(SolveError::NoSolution { form: namer.form, list: namer.list(conds), reason })
}

/// The message for a polygon that cannot be drawn.
pub(crate) fn broken(b: Broken, loads: &[Load], namer: &Namer, conds: &[Cond]) -> SolveError {
    let reason = match b {
        Broken::Parallel(k) => format!(
            "the segment reaching the load of {} runs parallel to its line of action; draw that load at another angle or change a condition",
            loads.get(k).map_or_else(|| format!("load {}", k + 1), |l| l.origin.to_string())
        ),
        Broken::LastVertical => {
            "the last segment would be vertical and never reach the right support; change a condition".to_string()
        }
    };
    SolveError::NoSolution { form: namer.form, list: namer.list(conds), reason }
}

#[cfg(test)]
mod tests {
    use kurbo::{Point, Vec2};

    use super::*;
    use crate::model::Origin;
    use crate::solve::types::Form;
    use crate::units::{ForceUnit, LengthUnit, Units};

    // These paths are out of reach of the public function for well-posed
    // input (the vertical start rejects such conditions first), so the inner
    // function is called directly. Invented numbers.

    fn setup() -> (Frame, Vec<Load>, Namer) {
        let o = Origin { layer: "L".into(), handle: Some("2A".into()), at: Point::new(5.0, -1.0) };
        let loads = vec![Load { anchor: Point::new(5.0, -1.0), force: Vec2::new(2.0, -10.0), origin: o }];
        let load_line = vec![Vec2::ZERO, loads[0].force];
        let frame = Frame {
            x0: 0.0,
            y0: 0.0,
            span: 10.0,
            anchors: vec![Vec2::new(5.0, -1.0)],
            forces: vec![loads[0].force],
            load_line,
            vertical: false,
            force_scale: loads[0].magnitude(),
        };
        let namer =
            Namer { units: Units { length: LengthUnit::Metre, force: ForceUnit::Kilonewton }, form: Form::Cable };
        (frame, loads, namer)
    }

    #[test]
    fn singular_linearisation_is_reported() {
        let (frame, loads, namer) = setup();
        let p = Point::new(0.0, 0.0);
        let conds = [Cond::Left(p), Cond::Through(p), Cond::Thrust(20.0)];
        let start = Params { ox: 20.0, oy: -5.0, y_left: 1.0 };
        let m = solve(&frame, &loads, &conds, start, &namer).unwrap_err().to_string();
        assert!(
            m.contains("no cable meets the conditions left support (0, 0), --through 0,0 and --thrust 20 kN"),
            "{m}"
        );
        assert!(m.contains("do not fix a single funicular") && m.contains("replace one of them"), "{m}");
    }

    #[test]
    fn drifting_to_a_straight_profile_is_reported() {
        // A cable cannot pass 5 m above the chord of level supports: Newton's
        // method heads for the straight chord, with an unbounded thrust.
        let (frame, loads, namer) = setup();
        let conds =
            [Cond::Left(Point::new(0.0, 0.0)), Cond::Right(Point::new(10.0, 0.0)), Cond::Through(Point::new(5.0, 5.0))];
        let start = Params { ox: 20.0, oy: -5.0, y_left: 0.0 };
        let m = solve(&frame, &loads, &conds, start, &namer).unwrap_err().to_string();
        assert!(m.contains("left support (0, 0), right support (10, 0) and --through 5,5"), "{m}");
        assert!(m.contains("only a straight profile with an infinite thrust comes near them"), "{m}");
        assert!(m.contains("a cable must lie below the chord") && m.contains("move a --through point"), "{m}");
    }

    #[test]
    fn stalled_newton_is_reported() {
        // No cable between these supports has a largest force as small as
        // 5 kN under a 10 kN load: the iteration stalls at the least one.
        let (frame, loads, namer) = setup();
        let conds = [Cond::Left(Point::new(0.0, 0.0)), Cond::Right(Point::new(10.0, 0.0)), Cond::MaxForce(5.0)];
        let start = Params { ox: 20.0, oy: -5.0, y_left: 0.0 };
        let m = solve(&frame, &loads, &conds, start, &namer).unwrap_err().to_string();
        assert!(m.contains("left support (0, 0), right support (10, 0) and --max-force 5 kN"), "{m}");
        assert!(
            m.contains("Newton's method stalled") && m.contains("draw them nearer vertical or change a condition"),
            "{m}"
        );
    }

    #[test]
    fn undrawable_polygons_are_reported() {
        let (_, loads, namer) = setup();
        let conds = [Cond::Thrust(20.0), Cond::Sag(1.0), Cond::Left(Point::new(0.0, 0.0))];
        let m = broken(Broken::Parallel(0), &loads, &namer, &conds).to_string();
        assert!(m.contains("--thrust 20 kN, --sag 1 m and left support (0, 0)"), "{m}");
        assert!(m.contains("the load of entity 2A on layer L at (5, -1) runs parallel to its line of action"), "{m}");
        assert!(m.contains("draw that load at another angle or change a condition"), "{m}");
        let m = broken(Broken::LastVertical, &loads, &namer, &conds).to_string();
        assert!(m.contains("never reach the right support; change a condition"), "{m}");
    }
}
