//! Following a sketch: a sketch drawn on an exact funicular is recovered to
//! round-off, a noisy one within a bound of the noise, and what cannot be
//! fitted is refused.

use kurbo::Point;

use super::super::follow_sketch;
use super::*;

/// Simple-beam moment of Beer & Johnston, *Vector Mechanics for Engineers:
/// Statics*, Prob. 7.116 (360, 720, 240 lb at 2, 4, 6 ft on 8 ft), by hand
/// (statics, common practice): R_A = 690 lb, M linear between
/// M(2) = 1380, M(4) = 2040, M(6) = 1260 lb·ft.
fn book_moment(x: f64) -> f64 {
    let r_a = 690.0;
    r_a * x
        - [(2.0, 360.0), (4.0, 720.0), (6.0, 240.0)]
            .iter()
            .filter(|(xj, _)| *xj < x)
            .map(|(xj, w)| w * (x - xj))
            .sum::<f64>()
}

fn book_loads() -> Vec<Load> {
    down(&[(2.0, 360.0), (4.0, 720.0), (6.0, 240.0)])
}

/// `count` points evenly from `x0` to `x1` on `y`.
fn sampled(x0: f64, x1: f64, count: usize, y: impl Fn(f64) -> f64) -> Vec<Point> {
    (0..count)
        .map(|k| {
            let x = x0 + (x1 - x0) * k as f64 / (count - 1) as f64;
            Point::new(x, y(x))
        })
        .collect()
}

/// Pseudo-random numbers in [−1, 1] from a fixed seed: the linear
/// congruential generator of Numerical Recipes (Press et al., 2nd ed. 1992,
/// §7.1, a = 1664525, c = 1013904223, m = 2³² — from memory); any fixed
/// sequence would do.
fn noise(count: usize, seed: u32) -> Vec<f64> {
    let mut s = seed;
    (0..count)
        .map(|_| {
            s = s.wrapping_mul(1_664_525).wrapping_add(1_013_904_223);
            2.0 * f64::from(s) / f64::from(u32::MAX) - 1.0
        })
        .collect()
}

fn followed(s: &Structure, form: Form, c: &[Condition], sketch: &[Point], o: &SolveOptions) -> Solution {
    match follow_sketch(s, form, c, sketch, o) {
        Ok(sol) => sol,
        Err(e) => panic!("expected a solution, got: {e}"),
    }
}

fn refused(s: &Structure, form: Form, c: &[Condition], sketch: &[Point]) -> String {
    match follow_sketch(s, form, c, sketch, &SolveOptions::default()) {
        Ok(sol) => panic!("expected an error, got nodes {:?}", sol.nodes),
        Err(e) => e.to_string(),
    }
}

fn max_node_error(sol: &Solution, y: impl Fn(f64) -> f64) -> f64 {
    sol.nodes.iter().map(|p| (p.y - y(p.x)).abs()).fold(0.0, f64::max)
}

#[test]
fn an_exact_sketch_between_fixed_supports_is_recovered() {
    // Closed form y = chord − M(x)/H for a cable (Beer & Johnston, §7.8–7.9,
    // the general cable theorem) with the book's loads; supports and H = 850 lb
    // invented.
    let h = 850.0;
    let y = |x: f64| 1.0 * x / 8.0 - book_moment(x) / h;
    let s = structure(ft_lbf(), point(0.0, 0.0), point(8.0, 1.0), book_loads());
    let sketch = sampled(0.0, 8.0, 33, y);
    let sol = followed(&s, Form::Cable, &[], &sketch, &SolveOptions::default());
    assert!((sol.thrust - h).abs() <= 1e-10 * h, "H {}", sol.thrust);
    assert!(max_node_error(&sol, y) <= 1e-10 * 8.0, "{:?}", sol.nodes);
    let fit = sol.sketch.as_ref().unwrap();
    assert!(fit.fitted && fit.points_used == 33 && fit.max <= 1e-10 * 8.0, "{fit:?}");
    assert_eq!(fit.conditions_supplied.len(), 1);
    assert_eq!(fit.conditions_supplied[0].kind, "thrust");
    assert!(!sol.warnings.iter().any(|w| w.contains("strays")), "{:?}", sol.warnings);
}

#[test]
fn an_exact_arch_sketch_drawn_right_to_left_is_recovered() {
    // As above for an arch, y = chord + M(x)/H (the same theorem, compression);
    // the vertices listed from right to left.
    let h = 1200.0;
    let y = |x: f64| 0.5 - 0.25 * x / 8.0 + book_moment(x) / h;
    let s = structure(ft_lbf(), point(0.0, 0.5), point(8.0, 0.25), book_loads());
    let mut sketch = sampled(0.0, 8.0, 17, y);
    sketch.reverse();
    let sol = followed(&s, Form::Arch, &[], &sketch, &SolveOptions::default());
    assert!((sol.thrust - h).abs() <= 1e-10 * h, "H {}", sol.thrust);
    assert!(max_node_error(&sol, y) <= 1e-10 * 8.0);
}

#[test]
fn an_exact_sketch_between_tower_axes_fixes_all_three() {
    // Uniform load w on span L: the parabola y = a + b·x − w·x(L − x)/(2H)
    // (Irvine, Cable Structures, 1981, ch. 1). Invented: w = 12 kN/m,
    // L = 60 m, H = 900 kN, a = 20 m, b = −0.05.
    let (w, l, h, a, b) = (12.0, 60.0, 900.0, 20.0, -0.05);
    let y = |x: f64| a + b * x - w * x * (l - x) / (2.0 * h);
    let s = spread(m_kn(), axis(0.0, 0.0, 25.0), axis(l, 0.0, 25.0), vec![], vec![stretch(0.0, l, w, w)]);
    let sketch = sampled(0.0, l, 41, y);
    let sol = followed(&s, Form::Cable, &[], &sketch, &SolveOptions::default());
    assert!((sol.thrust - h).abs() <= 1e-10 * h, "H {}", sol.thrust);
    assert!(max_node_error(&sol, y) <= 1e-10 * l, "largest node error {}", max_node_error(&sol, y));
    assert_eq!(sol.towers.len(), 2);
    assert!((sol.towers[0].height - a).abs() <= 1e-10 * l && (sol.towers[1].height - y(l)).abs() <= 1e-10 * l);
    let kinds: Vec<&str> = sol.sketch.as_ref().unwrap().conditions_supplied.iter().map(|c| c.kind).collect();
    assert_eq!(kinds, ["thrust", "through", "through"]);
}

#[test]
fn a_level_point_with_the_sketch_is_kept() {
    // Tower axes, uniform load, and --level-at 25 (of 60): the parabola
    // through the sketch's fit with its vertex at x = 25 (Irvine 1981, ch. 1:
    // y′ = b − w(L − 2x)/(2H) = 0). The sketch is the parabola of the
    // previous test, whose vertex is elsewhere, so the fit is a compromise;
    // the level point must hold exactly.
    let (w, l, h, a, b) = (12.0, 60.0, 900.0, 20.0, -0.05);
    let y = |x: f64| a + b * x - w * x * (l - x) / (2.0 * h);
    let s = spread(m_kn(), axis(0.0, 0.0, 25.0), axis(l, 0.0, 25.0), vec![], vec![stretch(0.0, l, w, w)]);
    let sketch = sampled(0.0, l, 41, y);
    let sol = followed(&s, Form::Cable, &[Condition::LevelAt(25.0)], &sketch, &SolveOptions::default());
    let low = sol.nodes.iter().copied().min_by(|p, q| p.y.total_cmp(&q.y)).unwrap();
    assert!((low.x - 25.0).abs() <= 1e-9 * l, "lowest node at {low:?}");
    let fit = sol.sketch.as_ref().unwrap();
    assert!(fit.rms > 0.0 && fit.conditions_supplied.len() == 2, "{fit:?}");
}

#[test]
fn a_noisy_sketch_between_fixed_supports_is_recovered_within_the_noise() {
    // Uniform load between fixed supports: y = chord − w·x(L − x)/(2H)
    // (Irvine 1981, ch. 1), one free parameter c = 1/H multiplying
    // φ(x) = w·x(L − x)/2. The least-squares error at x is
    // φ(x)·Σφᵢeᵢ/Σφᵢ², at most ε·max φ·Σ|φᵢ|/Σφᵢ² for |eᵢ| ≤ ε (our
    // derivation; ≈ 1.25 ε for points spread evenly).
    let (w, l, h, eps) = (12.0, 60.0, 900.0, 0.05);
    let y = |x: f64| 2.0 * x / l - w * x * (l - x) / (2.0 * h);
    let s = spread(m_kn(), point(0.0, 0.0), point(l, 2.0), vec![], vec![stretch(0.0, l, w, w)]);
    let e = noise(101, 7);
    let sketch: Vec<Point> =
        sampled(0.0, l, 101, y).iter().zip(&e).map(|(p, e)| Point::new(p.x, p.y + eps * e)).collect();
    let phi: Vec<f64> = sketch.iter().map(|p| w * p.x * (l - p.x) / 2.0).collect();
    let bound =
        eps * (w * l * l / 8.0) * phi.iter().map(|v| v.abs()).sum::<f64>() / phi.iter().map(|v| v * v).sum::<f64>();
    assert!(bound < 1.3 * eps, "{bound}");
    let sol = followed(&s, Form::Cable, &[], &sketch, &SolveOptions::default());
    let err = max_node_error(&sol, y);
    assert!(err <= bound, "fitted nodes stray {err} from the true curve; bound {bound}");
    let fit = sol.sketch.as_ref().unwrap();
    assert!(fit.rms <= eps && fit.max <= 2.0 * eps, "{fit:?}");
}

#[test]
fn a_noisy_sketch_between_tower_axes_is_recovered_within_the_noise() {
    // Three free parameters (a, b, c): the fitted value at x weights the
    // noise by the least-squares kernel of {1, x, φ(x)} — for φ a parabola
    // the quadratic kernel, whose absolute weights sum to at most ≈ 2.17 at
    // the ends of the span (∫₀¹|30t² − 36t + 9| dt from the orthonormal
    // shifted Legendre polynomials; our derivation). Bound: 2.2 ε.
    let (w, l, h, a, b, eps) = (12.0, 60.0, 900.0, 20.0, -0.05, 0.05);
    let y = |x: f64| a + b * x - w * x * (l - x) / (2.0 * h);
    let s = spread(m_kn(), axis(0.0, 0.0, 25.0), axis(l, 0.0, 25.0), vec![], vec![stretch(0.0, l, w, w)]);
    for seed in [1, 2, 3, 4] {
        let e = noise(201, seed);
        let sketch: Vec<Point> =
            sampled(0.0, l, 201, y).iter().zip(&e).map(|(p, e)| Point::new(p.x, p.y + eps * e)).collect();
        let sol = followed(&s, Form::Cable, &[], &sketch, &SolveOptions::default());
        let err = max_node_error(&sol, y);
        assert!(err <= 2.2 * eps, "seed {seed}: fitted nodes stray {err} from the true curve");
        assert!(sol.sketch.as_ref().unwrap().rms <= eps);
    }
}

#[test]
fn three_conditions_only_compare() {
    // The book's case with --thrust 850 lb: three conditions, so the profile
    // is the usual solve and the sketch (the exact curve raised 0.1 ft) is
    // measured against it: every deviation 0.1.
    let y = |x: f64| x / 8.0 - book_moment(x) / 850.0 + 0.1;
    let s = structure(ft_lbf(), point(0.0, 0.0), point(8.0, 1.0), book_loads());
    let sketch = sampled(0.0, 8.0, 9, y);
    let sol = followed(&s, Form::Cable, &[Condition::Thrust(850.0)], &sketch, &SolveOptions::default());
    let fit = sol.sketch.as_ref().unwrap();
    assert!(!fit.fitted && fit.conditions_supplied.is_empty());
    assert!((fit.rms - 0.1).abs() < 1e-12 && (fit.max - 0.1).abs() < 1e-12, "{fit:?}");
    assert!(sol.warnings.iter().any(|w| w.contains("only compared")), "{:?}", sol.warnings);
}

#[test]
fn a_sketch_bent_the_wrong_way_is_refused() {
    let y = |x: f64| x / 8.0 + book_moment(x) / 850.0;
    let s = structure(ft_lbf(), point(0.0, 0.0), point(8.0, 1.0), book_loads());
    let m = refused(&s, Form::Cable, &[], &sampled(0.0, 8.0, 9, y));
    assert!(m.contains("wrong way for a cable") && m.contains("--arch"), "{m}");
    let m = refused(&s, Form::Cable, &[], &sampled(0.0, 8.0, 9, |x| x / 8.0));
    assert!(m.contains("straight"), "{m}");
}

#[test]
fn nonlinear_conditions_inclined_loads_and_self_weight_are_refused() {
    let y = |x: f64| 20.0 - x * (60.0 - x) / 150.0;
    let sketch = sampled(0.0, 60.0, 21, y);
    let s = spread(m_kn(), axis(0.0, 0.0, 25.0), axis(60.0, 0.0, 25.0), vec![], vec![stretch(0.0, 60.0, 12.0, 12.0)]);
    let m = refused(&s, Form::Cable, &[Condition::Sag(6.0)], &sketch);
    assert!(m.contains("--sag 6 m") && m.contains("not linear"), "{m}");
    let m = refused(&s, Form::Cable, &[Condition::MaxForce(2000.0)], &sketch);
    assert!(m.contains("--max-force"), "{m}");
    let o = SolveOptions { self_weight: Some(0.5), ..SolveOptions::default() };
    let e = follow_sketch(&s, Form::Cable, &[], &sketch, &o).unwrap_err().to_string();
    assert!(e.contains("--self-weight"), "{e}");
    let t = structure(m_kn(), point(0.0, 20.0), point(60.0, 20.0), vec![inclined((30.0, 10.0), (3.0, -40.0))]);
    let m = refused(&t, Form::Cable, &[], &sketch);
    assert!(m.contains("inclined"), "{m}");
}

#[test]
fn a_sketch_off_the_span_or_too_sparse_is_refused() {
    let s = structure(ft_lbf(), point(0.0, 0.0), point(8.0, 1.0), book_loads());
    let m = refused(&s, Form::Cable, &[], &[Point::new(10.0, 0.0), Point::new(12.0, -1.0)]);
    assert!(m.contains("between the supports"), "{m}");
    // Tower axes leave three things free; two vertices cannot fix them.
    let t = structure(ft_lbf(), axis(0.0, 0.0, 5.0), axis(8.0, 0.0, 5.0), book_loads());
    let m = refused(&t, Form::Cable, &[], &[Point::new(1.0, 0.0), Point::new(5.0, -1.0)]);
    assert!(m.contains("cannot fix"), "{m}");
}
