//! Tests of [`super::solve`]: published references, invented cases, every
//! error path, and properties over random load sets.
//!
//! Numbers not taken from a cited source are invented for these tests.

mod errors;
mod inclined;
mod props;
mod references;
mod towers;

use kurbo::{Point, Vec2};

use super::{Condition, Form, Solution, SolveError, solve};
use crate::model::{Load, Origin, Structure, Support};
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
