//! Distributed loads: the parabola against its published formulas, and
//! trapezoidal and partial loads against the closed form y = chord − M/H
//! computed here independently (Simpson's rule, exact for these integrands).
//! Numbers not attributed to a source are invented.

use kurbo::Point;

use super::*;
use crate::solve::NodeKind;

/// Exact length of a parabolic cable of span `l` under `w` per horizontal
/// length with thrust `h`: S = (L/2)√(1 + (wL/2H)²) + (H/w)·asinh(wL/2H)
/// (Hicks, *Civil Engineering Formulas*, ch. 10, eqs. 10.81–10.87).
fn hicks_length(l: f64, w: f64, h: f64) -> f64 {
    let k = w * l / (2.0 * h);
    0.5 * l * k.hypot(1.0) + h / w * k.asinh()
}

/// The series S = L(1 + 8/3·n² − 32/5·n⁴ + 256/7·n⁶), n = f/L (Hicks, ibid.).
fn hicks_series(l: f64, f: f64) -> f64 {
    let n = f / l;
    l * (1.0 + 8.0 / 3.0 * n * n - 32.0 / 5.0 * n.powi(4) + 256.0 / 7.0 * n.powi(6))
}

fn uniform(l: f64, w: f64, yr: f64) -> Structure {
    spread(m_kn(), point(0.0, 0.0), point(l, yr), Vec::new(), vec![stretch(0.0, l, w, w)])
}

#[test]
fn hicks_check_case() {
    // Hicks, Civil Engineering Formulas, ch. 10, eqs. 10.57–10.59 and
    // 10.81–10.87: L = 100 m, f = 10 m, w = 10 kN/m → H = wL²/(8f) = 1250 kN,
    // T_max = √(H² + (wL/2)²) = 1346.291 kN, S = 102.60606 m.
    let (l, f, w) = (100.0, 10.0, 10.0);
    let sol = solved(&uniform(l, w, 0.0), Form::Cable, &[Condition::Sag(f)]);
    near(sol.thrust, w * l * l / (8.0 * f), 1e-12, 1250.0);
    near(sol.thrust, 1250.0, 1e-12, 1250.0);
    near(sol.peak.force, 1346.291, 0.5e-3, 1.0);
    near(sol.peak.force, 1250f64.hypot(500.0), 1e-12, 1346.0);
    near(sol.profile_length, 102.60606, 0.5e-5, 1.0);
    near(sol.profile_length, hicks_length(l, w, 1250.0), 1e-13, l);
    // The largest force is at the supports: the reaction magnitude (Hicks,
    // eq. 10.59: V = wL/2 at each support).
    near(sol.reactions[0].hypot(), sol.peak.force, 1e-13, 1346.0);
    near(sol.reactions[1].hypot(), sol.peak.force, 1e-13, 1346.0);
    near(sol.reactions[0].y, 500.0, 1e-13, 500.0);
    near(sol.reactions[0].x, -1250.0, 1e-13, 1250.0);
    assert!(sol.peak.at == sol.nodes[0] || sol.peak.at == sol.nodes[sol.nodes.len() - 1]);
    // Every node on the parabola y = −4f·x(L − x)/L² (Hicks, ibid.).
    for p in &sol.nodes {
        near(p.y, -4.0 * f * p.x * (l - p.x) / (l * l), 1e-13, l);
    }
    // A node at the low point, with the sag there.
    assert_eq!(sol.sag.x, 50.0);
    near(sol.sag.value, f, 1e-13, l);
    // The drawn chords within the default tolerance (span/10 000) of the curve.
    let err = chord_error(&sol, |x| -4.0 * f * x * (l - x) / (l * l));
    assert!(err <= l / 10_000.0, "chord error {err}");
    assert!(err >= 0.2 * l / 10_000.0, "needlessly fine: chord error {err}");
    // Kinds: supports at the ends, panel points between.
    let n = sol.nodes.len();
    assert_eq!(sol.node_kinds[0], NodeKind::Support);
    assert_eq!(sol.node_kinds[n - 1], NodeKind::Support);
    assert!(sol.node_kinds[1..n - 1].iter().all(|k| *k == NodeKind::Panel));
    // Load bookkeeping: the interior nodal loads and the halves at the
    // supports add up to wL; the first half is w·h/2, h the first panel.
    let interior = -sol.load_line[sol.load_line.len() - 1].y;
    near(interior + sol.at_supports[0] + sol.at_supports[1], w * l, 1e-13, 1000.0);
    near(sol.at_supports[0], w * (sol.nodes[1].x - sol.nodes[0].x) / 2.0, 1e-13, 1000.0);
    assert_eq!(sol.load_line.len(), n - 1);
    checks_within(&sol, 1e-13);
    assert!(sol.warnings.is_empty(), "{:?}", sol.warnings);
    assert_eq!(sol.iterations, 0);
    assert_eq!(sol.unstressed_length, None);
}

#[test]
fn hicks_series_agrees_to_its_truncation_order() {
    // Hicks, ibid.: the series truncated after n⁶ differs from the exact
    // length by O(n⁸): halving n divides the difference by about 2⁸.
    let (l, w) = (100.0, 10.0);
    let mut diffs = Vec::new();
    for f in [10.0, 5.0, 2.5] {
        let sol = solved(&uniform(l, w, 0.0), Form::Cable, &[Condition::Sag(f)]);
        let d = (sol.profile_length - hicks_series(l, f)).abs() / l;
        let n: f64 = f / l;
        assert!(d < 300.0 * n.powi(8), "f = {f}: {d:e}");
        diffs.push(d);
    }
    for pair in diffs.windows(2) {
        let ratio = pair[0] / pair[1];
        assert!((ratio / 256.0 - 1.0).abs() < 0.1, "ratio {ratio}");
    }
}

#[test]
fn parabola_between_supports_at_different_heights() {
    // The general cable theorem (Beer & Johnston, Vector Mechanics for
    // Engineers: Statics, §7.8–7.9): y = chord − M(x)/H, M = w·x(L − x)/2;
    // the higher support takes wL/2 + H·Δh/L. Invented: L = 100 m, right
    // support 20 m lower, w = 10 kN/m, through (30, −25).
    let (l, w, dh) = (100.0, 10.0, -20.0);
    let chord = |x: f64| dh * x / l;
    let y30 = -25.0;
    // From the through point: H = M(30)/(chord(30) − y30) = 10500/19.
    let h = w * 30.0 * 70.0 / 2.0 / (chord(30.0) - y30);
    let sol = solved(&uniform(l, w, dh), Form::Cable, &[Condition::Through(Point::new(30.0, y30))]);
    near(sol.thrust, h, 1e-12, h);
    for p in &sol.nodes {
        near(p.y, chord(p.x) - w * p.x * (l - p.x) / (2.0 * h), 1e-13, l);
    }
    assert!(sol.nodes.iter().any(|p| p.x == 30.0));
    near(sol.reactions[0].y, w * l / 2.0 - h * dh / l, 1e-12, 1000.0);
    near(sol.peak.force, h.hypot(w * l / 2.0 - h * dh / l), 1e-12, 1000.0);
    assert_eq!(sol.peak.at, Point::new(0.0, 0.0));
    near(sol.profile_length, hicks_like_length(l, dh, w, h), 1e-12, l);
    checks_within(&sol, 1e-13);
}

/// The length of y = c·x − w·x(L − x)/(2H) by the antiderivative of
/// √(1 + p²) in p = y' (calculus, common practice, no source): y' runs
/// linearly from p₀ = c − wL/(2H) to p₁ = c + wL/(2H), so
/// S = (H/w)·[½(p√(1 + p²) + asinh p)] from p₀ to p₁.
fn hicks_like_length(l: f64, dh: f64, w: f64, h: f64) -> f64 {
    let c = dh / l;
    let prim = |p: f64| 0.5 * (p * p.hypot(1.0) + p.asinh());
    h / w * (prim(c + w * l / (2.0 * h)) - prim(c - w * l / (2.0 * h)))
}

#[test]
fn parabolic_arch_under_a_uniform_load() {
    // Megson, Structural and Stress Analysis, "Arches" (from memory): a
    // parabolic arch under a uniform load has H = wL²/(8f) and no bending.
    let (l, f, w) = (40.0, 8.0, 5.0);
    let sol = solved(&uniform(l, w, 0.0), Form::Arch, &[Condition::Sag(f)]);
    near(sol.thrust, w * l * l / (8.0 * f), 1e-12, 125.0);
    for p in &sol.nodes {
        near(p.y, 4.0 * f * p.x * (l - p.x) / (l * l), 1e-13, l);
    }
    assert!(sol.segments.iter().all(|g| g.force < 0.0));
    near(sol.peak.force, 125f64.hypot(100.0), 1e-12, 160.0);
    assert!(sol.reactions[0].x > 0.0 && sol.reactions[0].y > 0.0);
    checks_within(&sol, 1e-13);
}

/// Invented: supports (0, 0) and (30, 5); 2 → 6 kN/m over 0–12 m, nothing
/// over 12–18 m but 15 kN at 15 m, 4 → 1 kN/m over 18–30 m.
fn mixed() -> Structure {
    spread(
        m_kn(),
        point(0.0, 0.0),
        point(30.0, 5.0),
        down(&[(15.0, 15.0)]),
        vec![stretch(0.0, 12.0, 2.0, 6.0), stretch(18.0, 30.0, 4.0, 1.0)],
    )
}

/// The mixed case's loads: (x0, x1, w0, w1) and point loads (x, W).
const PIECES: [(f64, f64, f64, f64); 2] = [(0.0, 12.0, 2.0, 6.0), (18.0, 30.0, 4.0, 1.0)];
const POINTS: [(f64, f64); 1] = [(15.0, 15.0)];

/// Simpson's rule on [a, b] (exact for cubics).
fn simpson(f: impl Fn(f64) -> f64, a: f64, b: f64) -> f64 {
    (b - a) / 6.0 * (f(a) + 4.0 * f(0.5 * (a + b)) + f(b))
}

/// ∫ over the loads left of `x` of (c − ξ)·w(ξ) dξ, point loads included.
fn lever_sum(x: f64, c: f64) -> f64 {
    let mut sum = 0.0;
    for (x0, x1, w0, w1) in PIECES {
        let b = x1.min(x);
        if b > x0 {
            sum += simpson(|xi| (c - xi) * (w0 + (w1 - w0) * (xi - x0) / (x1 - x0)), x0, b);
        }
    }
    for (xj, wj) in POINTS {
        if xj < x {
            sum += (c - xj) * wj;
        }
    }
    sum
}

/// Simple-beam moment of the mixed loads on 30 m: R_A·x − Σ (x − ξ)·w.
fn mixed_moment(x: f64) -> f64 {
    let l = 30.0;
    let r_a = lever_sum(l, l) / l;
    r_a * x - lever_sum(x, x)
}

/// Shear just right of x (no point load at x).
fn mixed_shear(x: f64) -> f64 {
    let l = 30.0;
    lever_sum(l, l) / l - (lever_sum(x, x + 1.0) - lever_sum(x, x))
}

#[test]
fn trapezoids_and_a_point_load_against_the_closed_form() {
    let st = mixed();
    let h = 50.0;
    let sol = solved(&st, Form::Cable, &[Condition::Thrust(h)]);
    let chord = |x: f64| 5.0 * x / 30.0;
    for p in &sol.nodes {
        near(p.y, chord(p.x) - mixed_moment(p.x) / h, 1e-13, 30.0);
    }
    // Nodes at the load, the stretch ends, and the one at 15 m is the load's.
    for x in [12.0, 15.0, 18.0] {
        assert!(sol.nodes.iter().any(|p| p.x == x), "no node at {x}");
    }
    let k = sol.nodes.iter().position(|p| p.x == 15.0).unwrap();
    assert_eq!(sol.node_kinds[k], NodeKind::Load(0));
    // In the unloaded gap the profile is straight: a single segment each side of the load.
    assert_eq!(sol.nodes[k - 1].x, 12.0);
    assert_eq!(sol.nodes[k + 1].x, 18.0);
    // The reactions are the true end forces; the lower (left) support takes
    // V_A = R_A − H·Δh/L (Beer & Johnston, §7.8–7.9, Prob. 7.114).
    near(sol.reactions[0].y, lever_sum(30.0, 30.0) / 30.0 - h * 5.0 / 30.0, 1e-13, 100.0);
    near(sol.peak.force, sol.reactions[0].hypot().max(sol.reactions[1].hypot()), 1e-13, 100.0);
    checks_within(&sol, 1e-13);

    // The same cable from other conditions it meets.
    let through = Point::new(16.0, chord(16.0) - mixed_moment(16.0) / h);
    let (x_max, _) = (0..30_000)
        .map(|i| i as f64 * 1e-3)
        .map(|x| (x, mixed_moment(x)))
        .fold((0.0, 0.0), |a, b| if b.1 > a.1 { b } else { a });
    let sets = vec![
        vec![Condition::Through(through)],
        vec![Condition::MaxForce(sol.peak.force)],
        vec![Condition::Sag(sol.sag.value)],
    ];
    for c in sets {
        let again = solved(&st, Form::Cable, &c);
        near(again.thrust, h, 1e-11, h);
        checks_within(&again, 1e-12);
    }
    // The sag point is where the shear changes sign: here at the point load
    // (R_A = 51.5 kN; shear 3.5 kN left of it, −11.5 kN right of it).
    assert!((sol.sag.x - x_max).abs() < 2e-3, "{} vs {x_max}", sol.sag.x);
    assert_eq!(sol.sag.x, 15.0);
    near(mixed_shear(15.0), 3.5, 1e-13, 100.0);
}

#[test]
fn level_point_in_a_distributed_load() {
    // The tangent is level at x where the chord slope equals the shear over
    // H (y' = c − V(x)/H = 0): H = V(x)/c.
    let st = mixed();
    let x = 8.0;
    let h = mixed_shear(x) / (5.0 / 30.0);
    let sol = solved(&st, Form::Cable, &[Condition::LevelAt(x)]);
    near(sol.thrust, h, 1e-12, h);
    let k = sol.nodes.iter().position(|p| p.x == x).expect("a node at the level point");
    assert_eq!(sol.node_kinds[k], NodeKind::Panel);
    // The low point of the cable.
    let low = sol.nodes.iter().map(|p| p.y).fold(f64::INFINITY, f64::min);
    assert_eq!(low, sol.nodes[k].y);
    checks_within(&sol, 1e-13);
}

#[test]
fn partial_load_leaves_a_straight_stretch() {
    // Zero load on the right half: the cable is straight there. Invented:
    // 6 kN/m over the left 10 m of 20 m, level supports, sag 2 m.
    let st = spread(m_kn(), point(0.0, 0.0), point(20.0, 0.0), Vec::new(), vec![stretch(0.0, 10.0, 6.0, 6.0)]);
    let sol = solved(&st, Form::Cable, &[Condition::Sag(2.0)]);
    // R_A = 45 kN, zero shear at 7.5 m, M_max = 45·7.5 − 3·7.5² = 168.75 kN·m.
    near(sol.thrust, 168.75 / 2.0, 1e-13, 100.0);
    assert_eq!(sol.sag.x, 7.5);
    let k = sol.nodes.iter().position(|p| p.x == 10.0).unwrap();
    assert_eq!(k, sol.nodes.len() - 2, "a single segment over the unloaded half");
    checks_within(&sol, 1e-13);
}

#[test]
fn unstressed_length_of_a_parabola() {
    // ∫ ds/(1 + T/EA) with T = H·√(1 + y'²), against the midpoint rule on
    // 400 000 steps (error ~1e-11 relative). Invented: L = 60 m, w = 8 kN/m,
    // sag 6 m, EA = 50 000 kN.
    let (l, w, f, ea) = (60.0, 8.0, 6.0, 5.0e4);
    let o = opts(None, Some(ea));
    let sol = solved_with(&uniform(l, w, 0.0), Form::Cable, &[Condition::Sag(f)], &o);
    let h = w * l * l / (8.0 * f);
    let n = 400_000;
    let dx = l / n as f64;
    let mut s0 = 0.0;
    for k in 0..n {
        let x = (k as f64 + 0.5) * dx;
        let slope = -4.0 * f * (l - 2.0 * x) / (l * l);
        let r = slope.hypot(1.0);
        s0 += r / (1.0 + h * r / ea) * dx;
    }
    let got = sol.unstressed_length.unwrap();
    near(got, s0, 1e-10, l);
    assert!(got < sol.profile_length);
}

#[test]
fn unstressed_length_of_a_polygon() {
    // Point loads only: S0 = Σ ℓ/(1 + T/EA), each segment's force constant.
    let st = structure(m_kn(), point(0.0, 0.0), point(8.0, -2.4), down(&[(2.0, 360.0), (4.0, 720.0), (6.0, 240.0)]));
    let ea = 1.0e5;
    let sol = solved_with(&st, Form::Cable, &[Condition::Thrust(850.0)], &opts(None, Some(ea)));
    let want: f64 = sol.segments.iter().map(|g| g.length / (1.0 + g.force / ea)).sum();
    assert_eq!(sol.unstressed_length, Some(want));
    assert_eq!(sol.node_kinds.len(), 5);
}

#[test]
fn a_tight_chord_tolerance_is_capped_with_a_warning() {
    let o = SolveOptions { chord_tolerance: Some(1e-9), ..SolveOptions::default() };
    let sol = solved_with(&uniform(100.0, 10.0, 0.0), Form::Cable, &[Condition::Sag(10.0)], &o);
    assert!(sol.nodes.len() <= 20_003, "{}", sol.nodes.len());
    assert!(sol.nodes.len() >= 19_000, "{}", sol.nodes.len());
    let w = sol.warnings.join("\n");
    assert!(
        w.contains("would take 100000 panels; the drawing has 20000") && w.contains("give a larger chord tolerance"),
        "{w}"
    );
    checks_within(&sol, 1e-12);
    near(sol.thrust, 1250.0, 1e-12, 1250.0);
}

#[test]
fn inclined_point_loads_with_distributed_loads_are_refused() {
    let st = spread(
        m_kn(),
        point(0.0, 0.0),
        point(20.0, 0.0),
        vec![inclined((5.0, -1.0), (1.0, -10.0))],
        vec![stretch(0.0, 10.0, 6.0, 6.0)],
    );
    let (_, m) = failed(&st, Form::Cable, &[Condition::Sag(2.0)]);
    assert!(
        m.contains("no cable meets the conditions left support (0, 0), right support (20, 0) and --sag 2 m"),
        "{m}"
    );
    assert!(m.contains("the distributed load of entity on layer T at (0, 0) needs vertical point loads"), "{m}");
    assert!(m.contains("is inclined; draw it vertical"), "{m}");
}
