//! Inclined loads. Invented numbers.

use kurbo::{Affine, Point};

use super::super::ask::{Namer, gather};
use super::super::beam::Beam;
use super::super::frame::Frame;
use super::super::{inclined as newton_solver, linear};
use super::*;

const LOADS: [(f64, f64); 5] = [(4.0, 10.0), (9.0, 25.0), (13.0, 15.0), (20.0, 30.0), (26.0, 20.0)];

/// A vertical problem and the same problem turned by `angle` about the
/// origin: supports, loads (lines of action) and the through point.
fn pair(angle: f64, form: Form) -> (Solution, Solution, Affine) {
    let (a, b, rot, _) = pair_with(angle, form);
    (a, b, rot)
}

/// As [`pair`], also returning the turned structure.
fn pair_with(angle: f64, form: Form) -> (Solution, Solution, Affine, Structure) {
    let sign = form.sign();
    let (l, r, through) = ((0.0, 0.0), (30.0, -3.0), Point::new(15.0, -3.0 - 7.0 * sign));
    let flat = structure(m_kn(), point(l.0, l.1), point(r.0, r.1), down(&LOADS));
    let a = solved(&flat, form, &[Condition::Through(through)]);
    let rot = Affine::rotate(angle);
    let turn = |x: f64, y: f64| rot * Point::new(x, y);
    let loads: Vec<Load> = LOADS
        .iter()
        .map(|&(x, w)| {
            let at = turn(x, -5.0);
            let f = rot * Point::new(0.0, -w);
            inclined((at.x, at.y), (f.x, f.y))
        })
        .collect();
    let (pl, pr) = (turn(l.0, l.1), turn(r.0, r.1));
    let tilted = structure(m_kn(), point(pl.x, pl.y), point(pr.x, pr.y), loads);
    let b = solved(&tilted, form, &[Condition::Through(rot * through)]);
    (a, b, rot, tilted)
}

#[test]
fn parallel_inclined_loads_give_the_vertical_solution_turned() {
    // A rigid rotation of loads, supports and through point turns the whole
    // funicular and its force diagram (statics, common practice, no source).
    for angle_deg in [7.0_f64, -12.0, 25.0, 30.0, -35.0] {
        for form in [Form::Cable, Form::Arch] {
            let (a, b, rot) = pair(angle_deg.to_radians(), form);
            let turned: Vec<Point> = a.nodes.iter().map(|p| rot * *p).collect();
            same_nodes(&b, &turned, 1e-9);
            let pole = rot * a.pole;
            near(b.pole.x, pole.x, 1e-9, 150.0);
            near(b.pole.y, pole.y, 1e-9, 150.0);
            for (sa, sb) in a.segments.iter().zip(&b.segments) {
                near(sb.force, sa.force, 1e-9, 150.0);
            }
            assert!(b.checks.closed_form.is_none());
            checks_within(&b, 1e-10);
            assert!(b.warnings.is_empty(), "{:?}", b.warnings);
        }
    }
}

#[test]
fn inclined_loads_with_thrust_sag_and_max_force() {
    // Mixed vertical and inclined loads; each condition set is solved and
    // then checked on the constructed polygon.
    let loads = vec![
        inclined((5.0, -2.0), (3.0, -20.0)),
        Load::vertical(11.0, 35.0, origin(11.0, 0.0)),
        inclined((18.0, -4.0), (-6.0, -25.0)),
        inclined((24.0, -1.0), (2.0, -15.0)),
    ];
    let s = structure(m_kn(), point(0.0, 0.0), point(30.0, 2.0), loads);
    let sets = [
        vec![Condition::Thrust(80.0)],
        vec![Condition::Sag(4.0)],
        vec![Condition::MaxForce(120.0)],
        vec![Condition::LevelAt(9.0)],
    ];
    for c in sets {
        let sol = solved(&s, Form::Cable, &c);
        checks_within(&sol, 1e-10);
        // The vertical load's node is exactly on its line of action.
        assert_eq!(sol.nodes[2].x, 11.0);
        // Every node on its load's line of action.
        for (k, load) in s.loads().iter().enumerate() {
            let rel = sol.nodes[k + 1] - load.anchor;
            near(rel.cross(load.force) / load.magnitude(), 0.0, 1e-12, 30.0);
        }
        match c[0] {
            Condition::Thrust(h) => near(sol.thrust, h, 1e-12, h),
            Condition::Sag(f) => near(sol.sag.value, f, 1e-12, 30.0),
            Condition::MaxForce(t) => near(sol.max_force(), t, 1e-12, t),
            _ => {}
        }
    }
}

#[test]
fn horizontal_load_components_larger_than_the_thrust() {
    // 30 kN pulling right at the first load, with a thrust of 20 kN: the next
    // segment would have to push.
    let loads = vec![inclined((3.0, -1.0), (30.0, -10.0)), inclined((7.0, -1.0), (-2.0, -10.0))];
    let s = structure(m_kn(), point(0.0, 0.0), point(10.0, 0.0), loads);
    let (e, m) = failed(&s, Form::Cable, &[Condition::Thrust(20.0)]);
    assert!(matches!(e, SolveError::NoSolution { .. }), "{m}");
    assert!(
        m.contains("no cable meets the conditions left support (0, 0), right support (10, 0) and --thrust 20 kN"),
        "{m}"
    );
    assert!(
        m.contains("horizontal components of the loads left of it add up to 30 kN, more than the thrust of 20 kN"),
        "{m}"
    );
    assert!(m.contains("give a larger thrust (a larger --thrust or a smaller --sag)"), "{m}");
}

#[test]
fn loads_meeting_the_profile_out_of_order() {
    // Two steep lines of action that cross above the span: the profile meets
    // them in the reverse order of their anchors.
    let loads = vec![inclined((4.0, -1.0), (8.0, -10.0)), inclined((6.0, -1.0), (-8.0, -10.0))];
    let s = structure(m_kn(), point(0.0, -4.0), point(10.0, -4.0), loads);
    let (_, m) = failed(&s, Form::Cable, &[Condition::Thrust(60.0)]);
    assert!(m.contains("out of order") && m.contains("move one of them or draw them nearer vertical"), "{m}");
    assert!(m.contains("--thrust 60 kN"), "{m}");
}

#[test]
fn load_meeting_the_profile_outside_the_span() {
    // A line of action that crosses the profile 2 m beyond the right support.
    let loads = vec![inclined((12.0, 0.0), (1.0, -10.0))];
    let s = structure(m_kn(), point(0.0, 0.0), point(10.0, 0.0), loads);
    let (_, m) = failed(&s, Form::Cable, &[Condition::Thrust(50.0)]);
    assert!(m.contains("outside the span from x = 0 to x = 10") && m.contains("move that load"), "{m}");
}

#[test]
fn inclined_max_force_with_two_roots_warns_of_the_other() {
    // The loads of the two-root case in `references`, each tilted a little.
    let loads = vec![
        inclined((2.0, -1.0), (15.0, -360.0)),
        inclined((4.0, -1.5), (-20.0, -720.0)),
        inclined((6.0, -1.0), (10.0, -240.0)),
    ];
    let s = structure(ft_lbf(), point(0.0, 0.0), point(8.0, 2.4), loads);
    let sol = solved(&s, Form::Cable, &[Condition::MaxForce(680.0)]);
    near(sol.max_force(), 680.0, 1e-12, 680.0);
    checks_within(&sol, 1e-10);
    assert_eq!(sol.warnings.len(), 1, "{:?}", sol.warnings);
    assert!(sol.warnings[0].contains("a second, deeper cable has the same largest force"), "{:?}", sol.warnings);
}

#[test]
fn steep_loads_are_reached_by_continuation() {
    // Turned by 30°, the cable of `pair` is out of reach of Newton's method
    // started from the vertical-component problem; bringing the horizontal
    // components in by steps finds it (and it is the turned solution).
    let (a, b, rot, tilted) = pair_with(30f64.to_radians(), Form::Cable);
    let turned: Vec<Point> = a.nodes.iter().map(|p| rot * *p).collect();
    same_nodes(&b, &turned, 1e-9);
    let through = rot * Point::new(15.0, -10.0);
    let conds = gather(&tilted, Form::Cable, &[Condition::Through(through)]).unwrap();
    let namer = Namer { units: tilted.units(), form: Form::Cable };
    let frame = Frame::new(&tilted);
    let start = linear::solve(&Beam::new(&frame), &frame, &conds, &namer).unwrap().params;
    assert!(newton_solver::newton(&frame, &conds, start, 1.0).is_err());
}
