//! Self-weight alone: the catenary. The formulas are those of Beer &
//! Johnston, *Vector Mechanics for Engineers: Statics*, §7.10 (section
//! number from memory): y = a·cosh(x/a) from the directrix, a = H/w,
//! s = a·sinh(x/a), T = w·y, sag f = a(cosh(L/2a) − 1), length
//! S = 2a·sinh(L/2a), and for supports at different heights
//! √(S² − h²) = 2a·sinh(L/2a). Numbers not attributed are invented.

use kurbo::Point;

use super::*;
use crate::units::{ForceUnit, LengthUnit, Units};

/// The root of an increasing `g` on [lo, hi] by bisection, to round-off.
pub(super) fn bisect(g: impl Fn(f64) -> f64, mut lo: f64, mut hi: f64) -> f64 {
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if mid <= lo || mid >= hi {
            break;
        }
        if g(mid) > 0.0 {
            hi = mid;
        } else {
            lo = mid;
        }
    }
    0.5 * (lo + hi)
}

/// The catenary parameter of sag `f` on a level span `l`: f = a(cosh(L/2a) − 1),
/// decreasing in a; cosh t − 1 written 2·sinh²(t/2) to keep its digits when
/// the cable is flat.
pub(super) fn a_from_sag(l: f64, f: f64) -> f64 {
    bisect(|a| f - 2.0 * a * (l / (4.0 * a)).sinh().powi(2), l / 1000.0, 1e6 * l)
}

/// Self-weight `q` alone between supports (0, 0) and (l, yr).
pub(super) fn bare(units: Units, l: f64, yr: f64) -> Structure {
    spread(units, point(0.0, 0.0), point(l, yr), Vec::new(), Vec::new())
}

/// Checks a level-span catenary of parameter `a` against the closed forms:
/// nodes, thrust, end tension, length, all to `rel`.
#[track_caller]
pub(super) fn level_catenary(sol: &Solution, l: f64, q: f64, a: f64, s: f64, rel: f64) {
    let end = a * (l / (2.0 * a)).cosh();
    for p in &sol.nodes {
        // y = a·cosh((x − L/2)/a) − a·cosh(L/2a) below the supports (cable).
        near(p.y, s * (a * ((p.x - l / 2.0) / a).cosh() - end), rel, l);
    }
    near(sol.thrust, q * a, rel, q * a);
    // T = w·y at the supports, y from the directrix.
    near(sol.peak.force, q * end, rel, q * end);
    near(sol.reactions[0].hypot(), q * end, rel, q * end);
    near(sol.profile_length, 2.0 * a * (l / (2.0 * a)).sinh(), rel, l);
    near(sol.sag.value, 2.0 * a * (l / (4.0 * a)).sinh().powi(2), rel, l);
}

#[test]
fn catenary_from_its_sag() {
    let (l, f, q) = (100.0, 10.0, 0.8);
    let a = a_from_sag(l, f);
    let sol = solved_with(&bare(m_kn(), l, 0.0), Form::Cable, &[Condition::Sag(f)], &opts(Some(q), None));
    level_catenary(&sol, l, q, a, 1.0, 1e-12);
    assert!(sol.iterations >= 2 && sol.iterations < 40, "{}", sol.iterations);
    near(sol.sag.x, 50.0, 1e-13, l);
    // Load bookkeeping: nodal loads and the halves at the supports add up
    // to the weight q·S.
    let interior = -sol.load_line[sol.load_line.len() - 1].y;
    near(interior + sol.at_supports[0] + sol.at_supports[1], q * sol.profile_length, 1e-13, 100.0);
    checks_within(&sol, 1e-12);
    assert!(sol.warnings.is_empty(), "{:?}", sol.warnings);
    let err = chord_error(&sol, |x| a * ((x - l / 2.0) / a).cosh() - a * (l / (2.0 * a)).cosh());
    assert!(err <= l / 10_000.0, "chord error {err}");
}

#[test]
fn the_catenary_does_not_depend_on_the_panels() {
    // Coarse panels (chord tolerance L/20: a handful) and fine ones give the
    // same exact catenary.
    let (l, f, q) = (60.0, 15.0, 2.0);
    let a = a_from_sag(l, f);
    for tol in [3.0, 0.01, 1e-5] {
        let o = SolveOptions { self_weight: Some(q), chord_tolerance: Some(tol), ..SolveOptions::default() };
        let sol = solved_with(&bare(m_kn(), l, 0.0), Form::Cable, &[Condition::Sag(f)], &o);
        level_catenary(&sol, l, q, a, 1.0, 1e-12);
        checks_within(&sol, 1e-12);
        if tol == 3.0 {
            assert!(sol.nodes.len() < 20, "{}", sol.nodes.len());
        }
    }
}

#[test]
fn catenary_from_its_thrust_and_a_through_point() {
    let (l, q, h) = (80.0, 1.5, 120.0);
    let a = h / q;
    let st = bare(m_kn(), l, 0.0);
    let sol = solved_with(&st, Form::Cable, &[Condition::Thrust(h)], &opts(Some(q), None));
    level_catenary(&sol, l, q, a, 1.0, 1e-12);
    let x = 17.0;
    let y = a * ((x - l / 2.0) / a).cosh() - a * (l / (2.0 * a)).cosh();
    let again = solved_with(&st, Form::Cable, &[Condition::Through(Point::new(x, y))], &opts(Some(q), None));
    level_catenary(&again, l, q, a, 1.0, 1e-11);
    assert!(again.nodes.iter().any(|p| p.x == x));
}

#[test]
fn catenary_arch() {
    // The catenary turned over carries its own weight in pure compression.
    let (l, f, q) = (30.0, 12.0, 25.0);
    let a = a_from_sag(l, f);
    let sol = solved_with(&bare(m_kn(), l, 0.0), Form::Arch, &[Condition::Sag(f)], &opts(Some(q), None));
    level_catenary(&sol, l, q, a, -1.0, 1e-12);
    assert!(sol.segments.iter().all(|g| g.force < 0.0));
    checks_within(&sol, 1e-12);
}

#[test]
fn worked_case_from_the_line_length() {
    // The catenary's length S = 2a·sinh(L/2a) and sag a(cosh(L/2a) − 1)
    // (Beer & Johnston, Vector Mechanics for Engineers: Statics, §7.10;
    // section from memory): a line 140 m long over a level 120 m span,
    // 3 kg/m with g = 9.81 m/s², has a = 61.4457 m, sag 31.6971 m,
    // T_max = w(a + sag) = 2741.2 N and H = wa = 1808.3 N.
    let units = Units { length: LengthUnit::Metre, force: ForceUnit::Newton };
    let (l, s, q) = (120.0, 140.0, 3.0 * 9.81);
    let sol = solved_with(&bare(units, l, 0.0), Form::Cable, &[Condition::Length(s)], &opts(Some(q), None));
    let a = sol.thrust / q;
    near(a, 61.4457, 0.5e-4, 1.0);
    near(sol.sag.value, 31.6971, 0.5e-4, 1.0);
    near(sol.peak.force, 2741.2, 0.05, 1.0);
    near(sol.thrust, 1808.3, 0.05, 1.0);
    // And to round-off, against S = 2a·sinh(L/2a) solved here by bisection.
    let a_exact = bisect(|a| s - 2.0 * a * (l / (2.0 * a)).sinh(), 1.0, 1e6);
    level_catenary(&sol, l, q, a_exact, 1.0, 1e-11);
    near(sol.profile_length, s, 1e-13, s);
    checks_within(&sol, 1e-11);
}

#[test]
fn supports_at_different_heights_from_the_length() {
    // √(S² − h²) = 2a·sinh(L/2a) (Beer & Johnston §7.10). Invented: span
    // 200 m, right support 50 m higher, 260 m of cable at 0.6 kN/m.
    let (l, dh, s, q) = (200.0, 50.0, 260.0, 0.6);
    let sol = solved_with(&bare(m_kn(), l, dh), Form::Cable, &[Condition::Length(s)], &opts(Some(q), None));
    let a = bisect(|a| (s * s - dh * dh).sqrt() - 2.0 * a * (l / (2.0 * a)).sinh(), 1.0, 1e6);
    near(sol.thrust, q * a, 1e-11, q * a);
    // The vertex: sinh((L/2 − x_m)/a) = h/(2a·sinh(L/2a)); then
    // y = a·cosh((x − x_m)/a) − a·cosh(x_m/a), through (0, 0).
    let xm = l / 2.0 - a * (dh / (2.0 * a * (l / (2.0 * a)).sinh())).asinh();
    for p in &sol.nodes {
        near(p.y, a * ((p.x - xm) / a).cosh() - a * (xm / a).cosh(), 1e-11, l);
    }
    // The higher support carries the largest force, T = w·y there.
    near(sol.peak.force, q * a * ((l - xm) / a).cosh(), 1e-11, 100.0);
    assert_eq!(sol.peak.at, Point::new(l, dh));
    near(sol.profile_length, s, 1e-13, s);
    checks_within(&sol, 1e-11);
}
