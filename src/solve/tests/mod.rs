//! Tests of [`super::solve`] and [`super::solve_with`]: published
//! references, invented cases, every error path, and properties over random
//! load sets.
//!
//! Numbers not taken from a cited source are invented for these tests.

mod catenary;
mod distributed;
mod elastic;
mod errors;
mod hard;
mod inclined;
mod length;
mod props;
mod props_continuous;
mod references;
mod sketch;
mod towers;

use kurbo::{Point, Vec2};

use super::{Condition, Form, Solution, SolveError, SolveOptions, solve, solve_with};
use crate::model::{DistributedLoad, Load, Origin, Structure, Support};
use crate::units::{ForceUnit, LengthUnit, Units};

pub(super) fn origin(x: f64, y: f64) -> Origin {
    Origin { layer: "T".into(), handle: None, at: Point::new(x, y) }
}

pub(super) fn point(x: f64, y: f64) -> Support {
    Support::Point { at: Point::new(x, y), origin: origin(x, y) }
}

pub(super) fn axis(x: f64, foot: f64, top: f64) -> Support {
    Support::Axis { x, foot, top, origin: origin(x, foot) }
}

/// Downward loads `(x, w)`.
pub(super) fn down(loads: &[(f64, f64)]) -> Vec<Load> {
    loads.iter().map(|&(x, w)| Load::vertical(x, w, origin(x, 0.0))).collect()
}

/// A load with force `f` whose line of action passes through `anchor`.
pub(super) fn inclined(anchor: (f64, f64), f: (f64, f64)) -> Load {
    Load { anchor: Point::new(anchor.0, anchor.1), force: Vec2::new(f.0, f.1), origin: origin(anchor.0, anchor.1) }
}

pub(super) fn ft_lbf() -> Units {
    Units { length: LengthUnit::Foot, force: ForceUnit::PoundForce }
}

pub(super) fn m_kn() -> Units {
    Units { length: LengthUnit::Metre, force: ForceUnit::Kilonewton }
}

pub(super) fn structure(units: Units, left: Support, right: Support, loads: Vec<Load>) -> Structure {
    Structure::new(units, vec![left, right], loads, Vec::new(), None, "SUPPORTS").expect("test structure is valid")
}

/// A structure with distributed loads too.
pub(super) fn spread(
    units: Units,
    left: Support,
    right: Support,
    loads: Vec<Load>,
    distributed: Vec<DistributedLoad>,
) -> Structure {
    Structure::new(units, vec![left, right], loads, distributed, None, "SUPPORTS").expect("test structure is valid")
}

/// A distributed load from `w0` at `x0` to `w1` at `x1`.
pub(super) fn stretch(x0: f64, x1: f64, w0: f64, w1: f64) -> DistributedLoad {
    DistributedLoad { x0, x1, w0, w1, origin: origin(x0, 0.0) }
}

/// Options with a self-weight and an axial stiffness.
pub(super) fn opts(self_weight: Option<f64>, axial_stiffness: Option<f64>) -> SolveOptions {
    SolveOptions { self_weight, axial_stiffness, ..SolveOptions::default() }
}

pub(super) fn solved_with(s: &Structure, form: Form, c: &[Condition], o: &SolveOptions) -> Solution {
    match solve_with(s, form, c, o) {
        Ok(sol) => sol,
        Err(e) => panic!("expected a solution, got: {e}"),
    }
}

pub(super) fn failed_with(s: &Structure, form: Form, c: &[Condition], o: &SolveOptions) -> (SolveError, String) {
    match solve_with(s, form, c, o) {
        Ok(sol) => panic!("expected an error, got nodes {:?}", &sol.nodes[..sol.nodes.len().min(5)]),
        Err(e) => {
            let m = e.to_string();
            (e, m)
        }
    }
}

/// Largest distance, measured square to the chord, between each drawn
/// segment and the curve `y(x)` it spans (sampled at 64 points per segment).
pub(super) fn chord_error(sol: &Solution, y: impl Fn(f64) -> f64) -> f64 {
    let mut worst = 0.0f64;
    for w in sol.nodes.windows(2) {
        let (a, b) = (w[0], w[1]);
        let d = b - a;
        let len = d.hypot();
        for k in 1..64 {
            let x = a.x + (b.x - a.x) * k as f64 / 64.0;
            let p = Point::new(x, y(x));
            worst = worst.max(((p - a).cross(d) / len).abs());
        }
    }
    worst
}

pub(super) fn solved(s: &Structure, form: Form, c: &[Condition]) -> Solution {
    match solve(s, form, c) {
        Ok(sol) => sol,
        Err(e) => panic!("expected a solution, got: {e}"),
    }
}

pub(super) fn failed(s: &Structure, form: Form, c: &[Condition]) -> (SolveError, String) {
    match solve(s, form, c) {
        Ok(sol) => panic!("expected an error, got nodes {:?}", sol.nodes),
        Err(e) => {
            let m = e.to_string();
            (e, m)
        }
    }
}

/// |a − b| ≤ rel·scale.
#[track_caller]
pub(super) fn near(a: f64, b: f64, rel: f64, scale: f64) {
    assert!((a - b).abs() <= rel * scale, "{a} vs {b} (difference {:e}, allowed {:e})", (a - b).abs(), rel * scale);
}

/// Every node of `a` within `rel`·span of the same node of `b`.
#[track_caller]
pub(super) fn same_nodes(a: &Solution, b: &[Point], rel: f64) {
    assert_eq!(a.nodes.len(), b.len());
    let span = b[b.len() - 1].x - b[0].x;
    for (p, q) in a.nodes.iter().zip(b) {
        near(p.x, q.x, rel, span);
        near(p.y, q.y, rel, span);
    }
}

/// The self-checks all within `tol`.
#[track_caller]
pub(super) fn checks_within(s: &Solution, tol: f64) {
    let c = &s.checks;
    assert!(c.equilibrium <= tol, "equilibrium {:e}", c.equilibrium);
    assert!(c.closed_form.unwrap_or(0.0) <= tol, "closed form {:e}", c.closed_form.unwrap_or(0.0));
    assert!(c.conditions <= tol, "conditions {:e}", c.conditions);
}
