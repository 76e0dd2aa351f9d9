//! Random structures and conditions straight into the solver.
//!
//! `arbitrary` builds two supports (points or tower axes), up to 40 loads
//! (vertical or inclined), up to four distributed loads (uniform or linear)
//! with up to 40 hanger positions, and up to four conditions, on a
//! centimetre grid within ±327 m and with forces (and intensities per metre)
//! from 0.01 to 655 force units, so that every case is one a drawing could
//! hold. The distributed loads are carried to the hangers as the pipeline
//! does ([`carry`]): what the hangers and supports receive must add up to
//! the distributed loads' resultants. The solver may refuse a case;
//! when it answers, its own self-check must show equilibrium at every node
//! (relative imbalance at most 1e-9) and every number it returns must be
//! finite.
#![no_main]

use arbitrary::Arbitrary;
use hangline::carry::carry;
use hangline::model::{DistributedLoad, Load, Origin, Structure, Support};
use hangline::solve::{Condition, Form, NodeKind, solve};
use hangline::units::{ForceUnit, LengthUnit, Units};
use kurbo::{Point, Vec2};
use libfuzzer_sys::fuzz_target;

#[derive(Arbitrary, Debug)]
enum Sup {
    /// A fixed point, in centimetres.
    Point(i16, i16),
    /// A tower axis: x, foot and height above the foot, in centimetres.
    Axis(i16, i16, u16),
}

#[derive(Arbitrary, Debug)]
struct LoadIn {
    /// Where along the span, in 1/65536 of it.
    along: u16,
    /// The anchor's y, in centimetres.
    y: i16,
    /// The magnitude, in hundredths.
    w: u16,
    /// The tilt from vertical, in tenths of a degree (0: vertical).
    tilt: i8,
}

#[derive(Arbitrary, Debug)]
struct StretchIn {
    /// Its ends along the span, in 1/65536 of it (either order).
    from: u16,
    to: u16,
    /// Intensities at its left and right ends, in hundredths per metre.
    w0: u16,
    w1: u16,
}

#[derive(Arbitrary, Debug)]
enum CondIn {
    Through(i16, i16),
    Thrust(u16),
    Sag(u16),
    MaxForce(u16),
    LevelAt(u16),
    Length(u16),
}

#[derive(Arbitrary, Debug)]
struct Input {
    left: Sup,
    right: Sup,
    loads: Vec<LoadIn>,
    stretches: Vec<StretchIn>,
    /// Hanger positions along the span, in 1/65536 of it.
    hangers: Vec<u16>,
    arch: bool,
    conds: Vec<CondIn>,
}

fn origin(at: Point) -> Origin {
    Origin { layer: "FUZZ".into(), handle: None, at }
}

fn support(s: &Sup) -> Support {
    match *s {
        Sup::Point(x, y) => {
            let at = Point::new(f64::from(x) / 100.0, f64::from(y) / 100.0);
            Support::Point { at, origin: origin(at) }
        }
        Sup::Axis(x, foot, h) => {
            let (x, foot) = (f64::from(x) / 100.0, f64::from(foot) / 100.0);
            let top = foot + f64::from(h) / 100.0;
            Support::Axis { x, foot, top, origin: origin(Point::new(x, top)) }
        }
    }
}

fuzz_target!(|input: Input| {
    let supports = vec![support(&input.left), support(&input.right)];
    let (x0, x1) = (supports[0].x().min(supports[1].x()), supports[0].x().max(supports[1].x()));
    let span = x1 - x0;
    let loads: Vec<Load> = input
        .loads
        .iter()
        .take(40)
        .map(|l| {
            let x = x0 + span * f64::from(l.along) / 65536.0;
            let at = Point::new(x, f64::from(l.y) / 100.0);
            let w = f64::from(l.w) / 100.0;
            let a = f64::from(l.tilt).to_radians() / 10.0;
            let force = if l.tilt == 0 { Vec2::new(0.0, -w) } else { Vec2::new(w * a.sin(), -w * a.cos()) };
            Load { anchor: at, force, origin: origin(at) }
        })
        .collect();
    let along = |a: u16| x0 + span * f64::from(a) / 65536.0;
    let distributed: Vec<DistributedLoad> = input
        .stretches
        .iter()
        .take(4)
        .map(|d| {
            let (a, b) = (along(d.from.min(d.to)), along(d.from.max(d.to)));
            let at = Point::new((a + b) / 2.0, 0.0);
            DistributedLoad {
                x0: a,
                x1: b,
                w0: f64::from(d.w0) / 100.0,
                w1: f64::from(d.w1) / 100.0,
                origin: origin(at),
            }
        })
        .collect();
    let hangers: Vec<(f64, Origin)> =
        input.hangers.iter().take(40).map(|&h| (along(h), origin(Point::new(along(h), 0.0)))).collect();
    let units = Units { length: LengthUnit::Metre, force: ForceUnit::Kilonewton };
    let Ok(given) = Structure::new(units, supports, loads, distributed, None, "SUPPORTS") else { return };
    if !given.has_loads() {
        return;
    }
    let carried = carry(&given, &hangers);
    if !carried.shares.is_empty() {
        // Nothing is lost or made on the way to the hangers.
        let resultant: f64 = given.distributed().iter().map(DistributedLoad::total).sum();
        let received: f64 =
            carried.shares.iter().map(|s| s.load).sum::<f64>() + carried.to_supports.iter().sum::<f64>();
        assert!(
            (received - resultant).abs() <= 1e-9 * resultant.max(1e-300),
            "carried {received} of {resultant}: {given:?} hangers {hangers:?}"
        );
    }
    let structure = carried.structure;
    let conditions: Vec<Condition> = input
        .conds
        .iter()
        .take(4)
        .map(|c| match *c {
            CondIn::Through(x, y) => Condition::Through(Point::new(f64::from(x) / 100.0, f64::from(y) / 100.0)),
            CondIn::Thrust(h) => Condition::Thrust(f64::from(h) / 100.0),
            CondIn::Sag(f) => Condition::Sag(f64::from(f) / 100.0),
            CondIn::MaxForce(t) => Condition::MaxForce(f64::from(t) / 100.0),
            CondIn::LevelAt(a) => Condition::LevelAt(along(a)),
            CondIn::Length(l) => Condition::Length(f64::from(l) / 100.0),
        })
        .collect();
    let form = if input.arch { Form::Arch } else { Form::Cable };
    let Ok(sol) = solve(&structure, form, &conditions) else { return };
    let c = sol.checks;
    // The self-check measures each node's imbalance with the segment forces
    // taken along the drawn segments, over the total load. A segment a few
    // millimetres long among coordinates of hundreds of metres, carrying a
    // force a thousand times the load, has a direction good to about 1e-11
    // and so cannot meet 1e-9 (the first input this target found). Hence:
    // above 1e-9 the solution must say so (the solver's own warning), and
    // measured against the largest segment force the imbalance must stay at
    // round-off level: a wrong pole or polygon is off by the loads. (Two
    // inclined loads drawn on one line meet the polygon at one node; the
    // round-off segment between them gave an imbalance of 3 % at c731c53:
    // tests/regressions/solve-coincident-inclined-loads.bin.)
    if c.equilibrium > 1e-9 {
        assert!(
            sol.warnings.iter().any(|w| w.contains("self-checks are looser")),
            "equilibrium {:e} without a warning for {structure:?} {form} {conditions:?}",
            c.equilibrium
        );
    }
    let total: f64 = structure.loads().iter().map(|l| l.magnitude()).sum::<f64>()
        + structure.distributed().iter().map(DistributedLoad::total).sum::<f64>();
    let scale = (sol.max_force() / total).max(1.0);
    assert!(
        c.equilibrium <= 1e-6 * scale,
        "equilibrium {:e} (largest force {}, total load {total}) for {structure:?} {form} {conditions:?}",
        c.equilibrium,
        sol.max_force()
    );
    assert!(sol.thrust.is_finite() && sol.pole.x.is_finite() && sol.pole.y.is_finite(), "{sol:?}");
    assert!(sol.nodes.iter().all(|p| p.x.is_finite() && p.y.is_finite()), "nodes {:?}", sol.nodes);
    assert!(sol.segments.iter().all(|s| s.force.is_finite() && s.length.is_finite()), "{:?}", sol.segments);
    // One kind per node, supports at both ends, and each point load at
    // exactly one node (panel points may come between them).
    assert_eq!(sol.node_kinds.len(), sol.nodes.len(), "{:?}", sol.node_kinds);
    assert_eq!(sol.node_kinds.first(), Some(&NodeKind::Support));
    assert_eq!(sol.node_kinds.last(), Some(&NodeKind::Support));
    for k in 0..structure.loads().len() {
        let at = sol.node_kinds.iter().filter(|n| **n == NodeKind::Load(k)).count();
        assert_eq!(at, 1, "load {k} at {at} nodes: {:?}", sol.node_kinds);
    }
});
