//! `--max-force` with two linear conditions, for vertical loads.
//!
//! The two linear rows leave a one-parameter family z(λ). Segment forces are
//! |tₖ| = √(Oₓ² + (O_y + Cₖ)²) ≥ H, so the largest is fixed by the extreme
//! cumulative loads C_min, C_max and costs O(1) per evaluation.
//!
//! * When the rows leave u free, the family is parametrised by the thrust
//!   H = |Oₓ| ∈ (0, T]: then O_y is affine in H, and Φ(H) = H² +
//!   max(|O_y + C_max|, |O_y + C_min|)² is convex (a square plus the square of
//!   a non-negative convex function). So the largest force equals T at most
//!   twice, once on each side of Φ's minimum: the minimum is found by
//!   golden-section search, each side's root by Brent's method (Brent 1973,
//!   ch. 4). This brackets every root exactly, where a sampling grid could
//!   step over two close ones. The shallower (larger H) is returned.
//! * When the rows fix u (a thrust or a sag among them), only O_y is free;
//!   max(|O_y + C_max|, |O_y + C_min|) = √(T² − H²) is piecewise linear and
//!   its roots are written down directly: two slopes, or none.

use super::ask::{Cond, Namer};
use super::beam::Beam;
use super::dependency;
use super::linear::{Row, check_sign};
use super::roots::{brent_zero, golden_min};
use super::types::SolveError;
use crate::model::fmt_num;

/// The chosen member of the family, and the other one with the same largest force.
#[derive(Clone, Copy, Debug)]
pub(crate) struct Pick {
    /// z = (y_L/L, v, u·W) of the chosen funicular.
    pub z: [f64; 3],
    /// The second root, if any.
    pub other: Option<[f64; 3]>,
}

/// Solves rows `r` (with their condition indices) plus largest force `t`.
pub(crate) fn solve(
    beam: &Beam,
    r: [(usize, Row); 2],
    t: f64,
    conds: &[Cond],
    namer: &Namer,
) -> Result<Pick, SolveError> {
    let [(i1, r1), (i2, r2)] = r;
    if let Some(e) = dependency::pair(&conds[i1], &conds[i2], &r1, &r2, beam, namer) {
        return Err(e);
    }
    let (a1, a2) = (r1.a, r2.a);
    let scale = a1.iter().map(|v| v.abs()).fold(0.0, f64::max) * a2.iter().map(|v| v.abs()).fold(0.0, f64::max);
    let det = a1[0] * a2[1] - a2[0] * a1[1];
    if det.abs() > 1e-12 * scale {
        by_thrust(beam, r1, r2, det, t, conds, namer)
    } else {
        by_slope(beam, r1, r2, t, conds, namer)
    }
}

/// The rows leave u free: search over the thrust.
fn by_thrust(
    beam: &Beam,
    r1: Row,
    r2: Row,
    det: f64,
    t: f64,
    conds: &[Cond],
    namer: &Namer,
) -> Result<Pick, SolveError> {
    let (a1, a2, w, s) = (r1.a, r2.a, beam.w_scale, namer.form.sign());
    // Cramer on the first two columns: z1 = α + β·z2, z0 = γ + δ·z2.
    let alpha = (a1[0] * r2.e - a2[0] * r1.e) / det;
    let beta = (a2[0] * a1[2] - a1[0] * a2[2]) / det;
    let gamma = (a2[1] * r1.e - a1[1] * r2.e) / det;
    let delta = (a1[1] * a2[2] - a2[1] * a1[2]) / det;
    // With z2 = s·W/H and O_y = v·Oₓ = z1·s·H: O_y = s·α·H + β·W (s² = 1).
    let oy = |h: f64| s * alpha * h + beta * w;
    let largest = |h: f64| beam.max_force(h, oy(h));
    let g = |h: f64| largest(h) - t;
    // The minimiser of Φ lies below √Φ(T): Φ(H) ≥ H² everywhere.
    let h_top = largest(t);
    let h_min = golden_min(largest, 0.0, h_top);
    let g_min = g(h_min);
    let others = namer.list(conds.iter().filter(|c| !matches!(c, Cond::MaxForce(_))));
    if g_min > 1e-12 * t {
        let least = g_min + t;
        let reason = if h_min <= 1e-9 * h_top {
            format!(
                "every {} meeting {others} has a largest force above {} (approached as the thrust tends to zero); --max-force must be larger than that",
                namer.form,
                namer.force(least)
            )
        } else {
            format!(
                "the least largest force a {} meeting {others} can have is {} (at a thrust of {}); --max-force must be at least that",
                namer.form,
                namer.force(least),
                namer.force(h_min)
            )
        };
        return Err(SolveError::NoSolution { form: namer.form, list: namer.list(conds), reason });
    }
    let tol = 2.0 * f64::EPSILON * t;
    // Φ(T) > T² since the loads are not all zero; the right root is in [h_min, T].
    let h_right = if g_min >= -tol { h_min } else { brent_zero(g, h_min, t, g_min, g(t), tol) };
    let g0 = g(0.0);
    let h_left = if g0 > 0.0 && g_min < -tol { Some(brent_zero(g, 0.0, h_min, g0, g_min, tol)) } else { None };
    let z_of = |h: f64| {
        let z2 = s * w / h;
        [gamma + delta * z2, alpha + beta * z2, z2]
    };
    let other = h_left.filter(|&h| h > 0.0 && h < h_right * (1.0 - 1e-9)).map(z_of);
    Ok(Pick { z: z_of(h_right), other })
}

/// The rows fix u: only the end slopes are free.
fn by_slope(beam: &Beam, r1: Row, r2: Row, t: f64, conds: &[Cond], namer: &Namer) -> Result<Pick, SolveError> {
    let (a1, a2, w, s) = (r1.a, r2.a, beam.w_scale, namer.form.sign());
    // A combination w of the rows with zero y_L and v coefficients isolates z2.
    let m = if a1[0].abs() + a2[0].abs() > 0.0 { [a2[0], -a1[0]] } else { [a2[1], -a1[1]] };
    let z2 = (m[0] * r1.e + m[1] * r2.e) / (m[0] * a1[2] + m[1] * a2[2]);
    check_sign(z2, conds, namer)?;
    let h = s * w / z2;
    let list = namer.list(conds);
    let fixers = namer.list(conds.iter().filter(|c| !matches!(c, Cond::MaxForce(_))));
    if t < h * (1.0 - 1e-12) {
        return Err(SolveError::NoSolution {
            form: namer.form,
            list,
            reason: format!(
                "{fixers} fix the thrust at {}, and every segment carries at least the thrust; --max-force must be at least that",
                namer.force(h)
            ),
        });
    }
    // max(|O_y + C_max|, |O_y + C_min|) = d: a V with its vertex at O_y = mid.
    let d = (t * t - h * h).max(0.0).sqrt();
    let half = 0.5 * (beam.c_max - beam.c_min);
    let mid = -0.5 * (beam.c_max + beam.c_min);
    if d < half * (1.0 - 1e-12) {
        return Err(SolveError::NoSolution {
            form: namer.form,
            list,
            reason: format!(
                "with the thrust of {} that {fixers} fix, the largest force is at least {}; --max-force must be at least that",
                namer.force(h),
                namer.force(h.hypot(half))
            ),
        });
    }
    if d > half * (1.0 + 1e-12) {
        let ox = s * h;
        return Err(SolveError::Dependent {
            list,
            problem: format!(
                "allow two {}s with that largest force, leaving the left support at slopes {} and {}",
                namer.form,
                fmt_num((d - beam.c_max) / ox),
                fmt_num((-d - beam.c_min) / ox)
            ),
            advice: "replace --max-force with --through X,Y or --level-at X to choose one".into(),
        });
    }
    // The single (tangent) root: O_y = mid, v = O_y/Oₓ.
    let z1 = mid / (s * h);
    let (r, a) = if a1[0].abs() >= a2[0].abs() { (r1, a1) } else { (r2, a2) };
    if a[0] == 0.0 {
        return Err(dependency::no_height(conds, namer));
    }
    Ok(Pick { z: [(r.e - a[1] * z1 - a[2] * z2) / a[0], z1, z2], other: None })
}
