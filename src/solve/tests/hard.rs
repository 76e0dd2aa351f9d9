//! Hard cases for the self-weight iteration: very flat and very deep
//! cables and arches, self-weight with an external load (against an
//! independent integration of the differential equation), and an iteration
//! stopped short. Invented numbers; catenary formulas as in `catenary.rs`
//! (Beer & Johnston, *Vector Mechanics for Engineers: Statics*, §7.10).

use std::time::{Duration, Instant};

use super::catenary::{a_from_sag, bare, bisect, level_catenary};
use super::*;

#[test]
fn very_flat_catenaries() {
    // f/L = 0.001 (and 0.0001): a = L²/(8f) nearly; converges in a few steps.
    for (l, f) in [(1000.0, 1.0), (500.0, 0.05)] {
        let a = a_from_sag(l, f);
        for form in [Form::Cable, Form::Arch] {
            let q = 0.2;
            let sol = solved_with(&bare(m_kn(), l, 0.0), form, &[Condition::Sag(f)], &opts(Some(q), None));
            level_catenary(&sol, l, q, a, form.sign(), 1e-12);
            assert!(sol.iterations <= 10, "{form} f/L = {}: {} iterations", f / l, sol.iterations);
            checks_within(&sol, 1e-12);
        }
    }
}

#[test]
fn very_deep_catenaries() {
    // f/L from 0.5 to 3: end slopes up to sinh(L/2a) ≈ 13; plain iteration
    // diverges here, the accelerated one converges.
    let l = 20.0;
    for ratio in [0.5, 1.0, 2.0, 3.0] {
        let f = ratio * l;
        let a = a_from_sag(l, f);
        for form in [Form::Cable, Form::Arch] {
            let q = 3.0;
            let t0 = Instant::now();
            let sol = solved_with(&bare(m_kn(), l, 0.0), form, &[Condition::Sag(f)], &opts(Some(q), None));
            level_catenary(&sol, l, q, a, form.sign(), 1e-11);
            checks_within(&sol, 1e-11);
            assert!(sol.iterations < 150, "{form} f/L = {ratio}: {} iterations", sol.iterations);
            assert!(t0.elapsed() < Duration::from_secs(20), "{:?}", t0.elapsed());
        }
    }
}

#[test]
fn deep_catenary_from_its_length_and_its_thrust() {
    // S = 3L and 10L: 2a·sinh(L/2a) = S by bisection.
    let (l, q) = (40.0, 2.0);
    for s in [3.0 * l, 10.0 * l] {
        let a = bisect(|a| s - 2.0 * a * (l / (2.0 * a)).sinh(), 0.1, 1e6);
        let sol = solved_with(&bare(m_kn(), l, 0.0), Form::Cable, &[Condition::Length(s)], &opts(Some(q), None));
        level_catenary(&sol, l, q, a, 1.0, 1e-11);
    }
    // A small thrust: a = H/q = L/8 (f/L ≈ 3.7).
    let a = l / 8.0;
    let sol = solved_with(&bare(m_kn(), l, 0.0), Form::Cable, &[Condition::Thrust(q * a)], &opts(Some(q), None));
    level_catenary(&sol, l, q, a, 1.0, 1e-11);
}

/// The profile from the left support by the classical fourth-order
/// Runge–Kutta method on y'' = (w(x) + q·√(1 + y'²))/H with y'(0) = `p0`
/// (Kutta 1901 — from memory), 200 000 steps; the heights at `xs`.
fn integrate(w: impl Fn(f64) -> f64, q: f64, h: f64, p0: f64, l: f64, xs: &[f64]) -> Vec<f64> {
    let n = 200_000;
    let dx = l / n as f64;
    let rhs = |x: f64, p: f64| (w(x) + q * p.hypot(1.0)) / h;
    let (mut y, mut p) = (0.0, p0);
    let mut out = Vec::with_capacity(xs.len());
    let mut next = 0;
    for k in 0..=n {
        let x = k as f64 * dx;
        while next < xs.len() && (xs[next] - x).abs() <= 0.5 * dx {
            // Nodes fall on grid points here (multiples of l/n).
            out.push(y);
            next += 1;
        }
        if k == n {
            break;
        }
        let k1 = (p, rhs(x, p));
        let k2 = (p + 0.5 * dx * k1.1, rhs(x + 0.5 * dx, p + 0.5 * dx * k1.1));
        let k3 = (p + 0.5 * dx * k2.1, rhs(x + 0.5 * dx, p + 0.5 * dx * k2.1));
        let k4 = (p + dx * k3.1, rhs(x + dx, p + dx * k3.1));
        y += dx / 6.0 * (k1.0 + 2.0 * k2.0 + 2.0 * k3.0 + k4.0);
        p += dx / 6.0 * (k1.1 + 2.0 * k2.1 + 2.0 * k3.1 + k4.1);
    }
    out
}

#[test]
fn deep_cable_with_self_weight_and_a_uniform_load() {
    // w = 2 kN/m over the span and q = 1 kN/m of cable, f/L = 0.5: the
    // panels carry both (collocation). Checked against the differential
    // equation integrated from the solver's left slope and thrust.
    let (l, w, q, f) = (50.0, 2.0, 1.0, 25.0);
    let o = SolveOptions { self_weight: Some(q), chord_tolerance: Some(0.05), ..SolveOptions::default() };
    let st = spread(m_kn(), point(0.0, 0.0), point(l, 0.0), Vec::new(), vec![stretch(0.0, l, w, w)]);
    let sol = solved_with(&st, Form::Cable, &[Condition::Sag(f)], &o);
    checks_within(&sol, 1e-11);
    let p0 = sol.reactions[0].y / sol.reactions[0].x;
    // Compare at nodes that fall on the integration grid (x a multiple of l/200 000).
    let picks: Vec<(f64, f64)> = sol
        .nodes
        .iter()
        .filter(|p| ((p.x / l) * 200_000.0 - ((p.x / l) * 200_000.0).round()).abs() < 1e-6)
        .map(|p| (p.x, p.y))
        .collect();
    assert!(picks.len() >= 3, "{}", picks.len());
    let xs: Vec<f64> = picks.iter().map(|p| p.0).collect();
    let ys = integrate(|_| w, q, sol.thrust, p0, l, &xs);
    for ((x, y), z) in picks.iter().zip(&ys) {
        assert!((y - z).abs() <= 1e-9 * l, "x = {x}: {y} vs {z}");
    }
    // Symmetric: the low point at midspan, each support half the weight.
    near(sol.sag.x, 25.0, 1e-12, l);
    near(sol.reactions[0].y, 0.5 * (w * l + q * sol.profile_length), 1e-11, 100.0);
}

#[test]
fn an_iteration_cut_short_is_reported() {
    let o = SolveOptions { self_weight: Some(1.0), max_iterations: 2, ..SolveOptions::default() };
    let (e, m) = failed_with(&bare(m_kn(), 20.0, 0.0), Form::Cable, &[Condition::Sag(20.0)], &o);
    assert!(matches!(e, SolveError::NoSolution { .. }));
    assert!(
        m.contains("no cable meets the conditions left support (0, 0), right support (20, 0) and --sag 20 m"),
        "{m}"
    );
    assert!(m.contains("the self-weight iteration did not settle in 2 iterations"), "{m}");
    assert!(
        m.contains(
            "of the total load); allow more iterations or a looser iteration tolerance, or check --self-weight 1 kN/m"
        ),
        "{m}"
    );
}

#[test]
fn self_weight_alone_needs_three_conditions() {
    let (e, m) = failed_with(&bare(m_kn(), 20.0, 0.0), Form::Cable, &[], &opts(Some(1.0), None));
    assert!(matches!(e, SolveError::Count { given: 2, .. }), "{m}");
    let (_, m) = failed_with(&bare(m_kn(), 20.0, 0.0), Form::Cable, &[Condition::Sag(2.0)], &opts(Some(0.0), None));
    assert!(m.starts_with("--self-weight 0 kN/m: the self-weight must be a positive force per unit length"), "{m}");
    let (_, m) = failed(&bare(m_kn(), 20.0, 0.0), Form::Cable, &[Condition::Sag(2.0)]);
    assert!(m.contains("there are no loads; draw loads, or give the profile's own weight with --self-weight q"), "{m}");
}

#[test]
fn an_arch_crushed_by_its_own_weight() {
    // EA far below the thrust of the arch's own weight.
    let o = opts(Some(10.0), Some(50.0));
    let (_, m) = failed_with(&bare(m_kn(), 20.0, 0.0), Form::Arch, &[Condition::Sag(2.0)], &o);
    assert!(m.contains("no arch meets"), "{m}");
    assert!(m.contains("--axial-stiffness 50 kN"), "{m}");
}

#[test]
fn many_panels_stay_cheap() {
    // The panel limit reached with self-weight and a distributed load
    // (collocation in every panel): still quick.
    let o = SolveOptions { self_weight: Some(0.5), chord_tolerance: Some(1e-9), ..SolveOptions::default() };
    let st =
        spread(m_kn(), point(0.0, 0.0), point(100.0, 10.0), down(&[(30.0, 20.0)]), vec![stretch(10.0, 90.0, 2.0, 5.0)]);
    let t0 = Instant::now();
    let sol = solved_with(&st, Form::Cable, &[Condition::Sag(12.0)], &o);
    assert!(sol.nodes.len() > 19_000, "{}", sol.nodes.len());
    assert!(sol.warnings.iter().any(|w| w.contains("give a larger chord tolerance")), "{:?}", sol.warnings);
    checks_within(&sol, 1e-10);
    assert!(t0.elapsed() < Duration::from_secs(60), "{:?}", t0.elapsed());
}
