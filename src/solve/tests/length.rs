//! `--length S`: the thrust found from the profile's length, including the
//! hard cases (barely longer than the chord, much longer, part of the span
//! unloaded, with and without self-weight). Numbers not attributed are
//! invented.

use kurbo::Point;

use super::catenary::{bare, bisect};
use super::*;

/// Hicks, *Civil Engineering Formulas*, ch. 10, eqs. 10.81–10.87: the exact
/// length of the parabolic cable, S = (L/2)√(1 + (wL/2H)²) + (H/w)·asinh(wL/2H).
fn hicks_length(l: f64, w: f64, h: f64) -> f64 {
    let k = w * l / (2.0 * h);
    0.5 * l * k.hypot(1.0) + h / w * k.asinh()
}

fn uniform(l: f64, w: f64) -> Structure {
    spread(m_kn(), point(0.0, 0.0), point(l, 0.0), Vec::new(), vec![stretch(0.0, l, w, w)])
}

#[test]
fn barely_longer_than_the_chord() {
    // S = L(1 + 10⁻⁶). Hicks's series (ibid.) S/L − 1 = 8/3·n² − 32/5·n⁴ +
    // 256/7·n⁶ − …, n = f/L, is exact to ~n⁸ ≈ 10⁻²⁶ here and free of
    // cancellation: solved for n by bisection, H = wL/(8n).
    let (l, w) = (100.0, 10.0);
    let excess = 1e-6;
    let n = bisect(|n| 8.0 / 3.0 * n * n - 32.0 / 5.0 * n.powi(4) + 256.0 / 7.0 * n.powi(6) - excess, 0.0, 0.01);
    let h = w * l / (8.0 * n);
    let sol = solved(&uniform(l, w), Form::Cable, &[Condition::Length(l * (1.0 + excess))]);
    // The input S carries a rounding error of ~1e-16·S, i.e. ~1e-10 of the
    // excess S − L, which H inherits halved.
    near(sol.thrust, h, 1e-9, h);
    near(sol.profile_length - l, l * excess, 1e-9, l * excess);
    near(sol.sag.value, n * l, 1e-9, n * l);
    checks_within(&sol, 1e-12);
}

#[test]
fn much_longer_than_the_chord() {
    // S = 2L: a very deep parabola (H from Hicks's exact length by bisection).
    let (l, w, s) = (100.0, 10.0, 200.0);
    let h = bisect(|h| s - hicks_length(l, w, h), 1e-3, 1e6);
    let sol = solved(&uniform(l, w), Form::Cable, &[Condition::Length(s)]);
    near(sol.thrust, h, 1e-12, h);
    near(sol.profile_length, s, 1e-14, s);
    near(sol.sag.value, w * l * l / (8.0 * h), 1e-12, l);
    checks_within(&sol, 1e-12);
    // And a hundred times the chord.
    let h = bisect(|h| 100.0 * l - hicks_length(l, w, h), 1e-9, 1e6);
    let sol = solved(&uniform(l, w), Form::Cable, &[Condition::Length(100.0 * l)]);
    near(sol.thrust, h, 1e-11, h);
    checks_within(&sol, 1e-11);
}

#[test]
fn length_with_an_unloaded_half() {
    // 6 kN/m over the left 10 m of 20 m, level supports, S = 21 m. Shear
    // V(x) = 45 − 6x on the loaded half, −15 kN on the other (R_A = 45 kN), so
    // y' = −V/H: the loaded half is a parabola of length
    // (H/6)[½(p√(1 + p²) + asinh p)] from p = −45/H to 15/H, the rest straight,
    // 10·√(1 + (15/H)²) (calculus, common practice, no source).
    let st = spread(m_kn(), point(0.0, 0.0), point(20.0, 0.0), Vec::new(), vec![stretch(0.0, 10.0, 6.0, 6.0)]);
    let prim = |p: f64| 0.5 * (p * p.hypot(1.0) + p.asinh());
    let length = |h: f64| h / 6.0 * (prim(15.0 / h) - prim(-45.0 / h)) + 10.0 * (15.0 / h).hypot(1.0);
    let h = bisect(|h| 21.0 - length(h), 1e-3, 1e6);
    let sol = solved(&st, Form::Cable, &[Condition::Length(21.0)]);
    near(sol.thrust, h, 1e-12, h);
    near(sol.profile_length, 21.0, 1e-14, 21.0);
    checks_within(&sol, 1e-12);
}

#[test]
fn point_loads_only_the_polygon_has_the_length() {
    // Beer & Johnston, Prob. 7.116's loads (360, 720, 240 lb at 2, 4, 6 ft on
    // 8 ft, right support 2.4 ft lower), asked for a cable 9 ft long.
    let st = structure(ft_lbf(), point(0.0, 0.0), point(8.0, -2.4), down(&[(2.0, 360.0), (4.0, 720.0), (6.0, 240.0)]));
    let sol = solved(&st, Form::Cable, &[Condition::Length(9.0)]);
    let polygon: f64 = sol.segments.iter().map(|g| g.length).sum();
    near(polygon, 9.0, 1e-13, 9.0);
    near(sol.profile_length, 9.0, 1e-13, 9.0);
    assert_eq!(sol.nodes.len(), 5);
    checks_within(&sol, 1e-12);
    // The book's own cable (H = 850 lb) has its own length; asked for it, the
    // search gives H = 850 lb back.
    let book = solved(&st, Form::Cable, &[Condition::Thrust(850.0)]);
    let again = solved(&st, Form::Cable, &[Condition::Length(book.profile_length)]);
    near(again.thrust, 850.0, 1e-11, 850.0);
}

#[test]
fn arch_from_its_length() {
    let (l, w) = (40.0, 5.0);
    let h = 125.0; // rise 8 m: H = wL²/(8f) (Megson, "Arches" — from memory)
    let s = hicks_length(l, w, h);
    let sol = solved(&uniform(l, w), Form::Arch, &[Condition::Length(s)]);
    near(sol.thrust, h, 1e-12, h);
    near(sol.sag.value, 8.0, 1e-12, l);
    assert!(sol.segments.iter().all(|g| g.force < 0.0));
}

#[test]
fn length_with_a_tower_axis_and_a_through_point() {
    // Left support and the low point fixed, right support a tower axis: the
    // length picks the cable. The level parabola of the Hicks check case
    // (L = 100 m, w = 10 kN/m, f = 10 m, S = 102.60606 m) meets them.
    let st =
        spread(m_kn(), point(0.0, 0.0), axis(100.0, -50.0, 50.0), Vec::new(), vec![stretch(0.0, 100.0, 10.0, 10.0)]);
    let s = hicks_length(100.0, 10.0, 1250.0);
    let c = [Condition::Through(Point::new(50.0, -10.0)), Condition::Length(s)];
    let sol = solved(&st, Form::Cable, &c);
    near(sol.thrust, 1250.0, 1e-11, 1250.0);
    near(sol.towers[0].at.y, 0.0, 1e-11, 100.0);
    checks_within(&sol, 1e-11);
}

#[test]
fn length_with_self_weight_and_a_partial_load() {
    // Self-weight 0.4 kN/m with 3 kN/m over the middle third of 90 m, right
    // support 12 m higher, 100 m of cable: the length is met, and the same
    // cable comes back from its thrust.
    let st = spread(m_kn(), point(0.0, 0.0), point(90.0, 12.0), Vec::new(), vec![stretch(30.0, 60.0, 3.0, 3.0)]);
    let o = opts(Some(0.4), None);
    let sol = solved_with(&st, Form::Cable, &[Condition::Length(100.0)], &o);
    near(sol.profile_length, 100.0, 1e-12, 100.0);
    checks_within(&sol, 1e-11);
    let again = solved_with(&st, Form::Cable, &[Condition::Thrust(sol.thrust)], &o);
    near(again.profile_length, 100.0, 1e-11, 100.0);
    same_nodes(&again, &sol.nodes, 1e-11);
}

#[test]
fn length_errors_name_the_chord_and_the_conditions() {
    let st = uniform(100.0, 10.0);
    let (e, m) = failed(&st, Form::Cable, &[Condition::Length(99.0)]);
    assert!(matches!(e, SolveError::NoSolution { .. }));
    assert!(
        m.contains("no cable meets the conditions left support (0, 0), right support (100, 0) and --length 99 m"),
        "{m}"
    );
    assert!(
        m.contains("a cable between these supports must be longer than the chord, 100 m; give a longer --length"),
        "{m}"
    );
    let (_, m) = failed(&st, Form::Arch, &[Condition::Length(100.0)]);
    assert!(m.contains("an arch between these supports must be longer than the chord, 100 m"), "{m}");
    let (_, m) = failed(&st, Form::Cable, &[Condition::Length(-5.0)]);
    assert!(m.starts_with("--length -5 m: the length must be a positive length"), "{m}");
    let tower =
        spread(m_kn(), point(0.0, 0.0), axis(100.0, -50.0, 50.0), Vec::new(), vec![stretch(0.0, 100.0, 10.0, 10.0)]);
    let (e, m) = failed(&tower, Form::Cable, &[Condition::Thrust(100.0), Condition::Length(120.0)]);
    assert!(matches!(e, SolveError::Dependent { .. }));
    assert!(m.contains("--thrust 100 kN fixes it, and --length 120 m with one height fixed"), "{m}");
    assert!(m.contains("drop --thrust 100 kN and fix a second height instead"), "{m}");
    let (_, m) = failed(&tower, Form::Cable, &[Condition::MaxForce(2000.0), Condition::Length(120.0)]);
    assert!(m.contains("--max-force 2000 kN and --length 120 m, that each need a search"), "{m}");
    let o = opts(None, Some(1e5));
    let (_, m) = failed_with(&tower, Form::Cable, &[Condition::Length(110.0), Condition::UnstressedLength(109.0)], &o);
    assert!(m.contains("the conditions --length 110 m and --unstressed-length 109 m all fix the length"), "{m}");
}

#[test]
fn a_barely_longer_catenary() {
    // Self-weight alone, S = L(1 + 10⁻⁶): 2a·sinh(L/2a) = S, written as
    // sinh(k)/k = 1 + 10⁻⁶ with k = L/2a and solved by bisection on the
    // series sinh(k)/k − 1 = k²/6 + k⁴/120 + k⁶/5040 (+ k⁸/362880: 1e-20 here).
    let (l, q) = (100.0, 0.3);
    let k = bisect(|k| k * k / 6.0 + k.powi(4) / 120.0 + k.powi(6) / 5040.0 - 1e-6, 0.0, 0.1);
    let a = l / (2.0 * k);
    let sol =
        solved_with(&bare(m_kn(), l, 0.0), Form::Cable, &[Condition::Length(l * (1.0 + 1e-6))], &opts(Some(q), None));
    near(sol.thrust, q * a, 1e-9, q * a);
    near(sol.profile_length - l, l * 1e-6, 1e-9, l * 1e-6);
    checks_within(&sol, 1e-11);
}

#[test]
fn a_very_long_cable_with_self_weight() {
    // Found by the property test: 390 m of cable over a 5 m span (78 times
    // the chord) with self-weight and a triangular load. The search for the
    // thrust first tries thrusts too small for the self-weight iteration
    // (deeper than the answer) and must back off from them.
    let st = spread(
        m_kn(),
        point(0.0, 0.0),
        point(5.0, 0.0),
        Vec::new(),
        vec![stretch(1.524_393_5, 2.602_128_8, 0.0, 20.38)],
    );
    let o = opts(Some(1.81), None);
    let sol = solved_with(&st, Form::Cable, &[Condition::Length(390.0)], &o);
    near(sol.profile_length, 390.0, 1e-12, 390.0);
    checks_within(&sol, 1e-10);
}
