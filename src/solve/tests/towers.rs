//! Tower axes: support heights found from the shape. Invented numbers.

use kurbo::Point;

use super::*;

fn loads() -> Vec<Load> {
    down(&[(4.0, 30.0), (9.0, 50.0), (15.0, 40.0), (22.0, 60.0), (27.0, 20.0)])
}

#[test]
fn both_towers_found_from_thrust_level_point_and_through() {
    let s = structure(m_kn(), axis(0.0, -20.0, 0.0), axis(30.0, -20.0, 5.0), loads());
    let c = [Condition::Thrust(100.0), Condition::LevelAt(12.0), Condition::Through(Point::new(20.0, -8.0))];
    let sol = solved(&s, Form::Cable, &c);
    checks_within(&sol, 1e-13);
    near(sol.thrust, 100.0, 1e-14, 100.0);
    // Level in the segment from 9 to 15 m: the low point.
    let k = 2;
    assert_eq!((sol.nodes[k].x, sol.nodes[k + 1].x), (9.0, 15.0));
    near(sol.nodes[k].y, sol.nodes[k + 1].y, 1e-14, 30.0);
    near(sol.segments[k].vector.y, 0.0, 1e-14, 200.0);
    // Height by hand: to the right of the level segment the profile rises by
    // Σ (cumulative load beyond the low point)·Δx / H (common practice, no
    // source): from 15 to 20 m, 40·5/100 = 2 m above the low point.
    let low = sol.nodes[k].y;
    near(low, -8.0 - 2.0, 1e-13, 30.0);
    // Left of it the segments carry 50 and 80 kN vertically: the left end is
    // (50·5 + 80·4)/100 = 5.7 m above the low point; the right end rises
    // (40·7 + 100·5 + 120·3)/100 = 11.4 m.
    near(sol.nodes[0].y, low + 5.7, 1e-13, 30.0);
    near(sol.nodes[6].y, low + 11.4, 1e-13, 30.0);
    let found: Vec<usize> = sol.towers.iter().map(|t| t.side).collect();
    assert_eq!(found, [0, 1]);
    for t in &sol.towers {
        near(t.height, t.at.y + 20.0, 1e-14, 30.0);
    }
    assert!(sol.warnings.is_empty(), "{:?}", sol.warnings);
}

#[test]
fn tower_top_exceeded_is_a_warning() {
    // The right tower is drawn up to y = 5; a profile reaching higher is reported.
    let s = structure(m_kn(), point(0.0, 0.0), axis(30.0, -20.0, 5.0), loads());
    let sol = solved(&s, Form::Cable, &[Condition::Thrust(100.0), Condition::LevelAt(12.0)]);
    let t = sol.towers[0];
    // Left end at 0, low point 5.7 m below, right end 11.4 m above that: 5.7 m,
    // 0.7 m above the top at 5 m.
    near(t.at.y, 5.7, 1e-13, 30.0);
    near(t.above_top, 0.7, 1e-13, 30.0);
    let w = sol.warnings.join("\n");
    assert!(w.contains("right tower axis") && w.contains("above its drawn top") && w.contains("0.7 m above"), "{w}");
}

#[test]
fn towers_need_three_options() {
    let s = structure(m_kn(), axis(0.0, -20.0, 0.0), axis(30.0, -20.0, 5.0), loads());
    let (e, m) = failed(&s, Form::Cable, &[Condition::Thrust(100.0), Condition::LevelAt(12.0)]);
    assert!(matches!(e, SolveError::Count { given: 2, .. }));
    assert!(m.contains("(--thrust 100 kN and --level-at 12)"), "{m}");
    assert!(m.contains("Add one of --through X,Y, --thrust H, --sag F, --max-force T, --level-at X"), "{m}");
    assert!(m.contains("both supports are tower axes"), "{m}");
}
