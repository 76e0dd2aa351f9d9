//! The elastic catenary: a cable of weight q per unit *unstressed* length
//! and axial stiffness EA, after H. M. Irvine, *Cable Structures*, MIT
//! Press 1981, ch. 2 (the form of the equations from memory). They are
//! derived here from scratch and solved independently of the solver.
//!
//! Let s ∈ [0, L₀] be the unstressed arc length from the left support, H
//! the horizontal force and V the upward vertical force the left support
//! exerts on the cable (y upward). Equilibrium of the piece [0, s], whose
//! weight is q·s, gives the tension components (H, V − q·s), so
//! T(s) = √(H² + (V − q·s)²). Hooke's law stretches the element ds to
//! (1 + T/EA)·ds, which points along the tension:
//!
//!   dx/ds = (H/T)(1 + T/EA) = H/T + H/EA,
//!   dy/ds = −((V − q·s)/T)(1 + T/EA) = −(V − q·s)/T − (V − q·s)/EA.
//!
//! Integrating (∫ dσ/√(H² + σ²) = asinh(σ/H), ∫ σ dσ/√(H² + σ²) = √(H² + σ²)):
//!
//!   x(s) = H·s/EA + (H/q)·[asinh(V/H) − asinh((V − q·s)/H)],
//!   y(s) = −(V·s − q·s²/2)/EA − (H/q)·[√(1 + (V/H)²) − √(1 + ((V − q·s)/H)²)],
//!
//! which are Irvine's parametric equations of the elastic catenary. The
//! supports are at (0, 0) and (x(L₀), y(L₀)); the stretched length is
//! S = L₀ + (1/EA)·∫₀^L₀ T ds, with ∫ √(H² + σ²) dσ = ½(σ√(H² + σ²) +
//! H²·asinh(σ/H)). Numbers are invented.

use super::catenary::bare;
use super::*;

/// (x, y) of the elastic catenary at unstressed arc length `s`.
fn at(h: f64, v: f64, q: f64, ea: f64, s: f64) -> (f64, f64) {
    let w = v - q * s;
    let x = h * s / ea + h / q * ((v / h).asinh() - (w / h).asinh());
    let y = -(v * s - 0.5 * q * s * s) / ea - h / q * ((v / h).hypot(1.0) - (w / h).hypot(1.0));
    (x, y)
}

/// The stretched length of the whole cable.
fn stretched(h: f64, v: f64, q: f64, ea: f64, l0: f64) -> f64 {
    let prim = |sig: f64| 0.5 * (sig * sig.hypot(h) + h * h * (sig / h).asinh());
    l0 + (prim(v) - prim(v - q * l0)) / (q * ea)
}

/// H and V such that the cable of unstressed length `l0` ends at (l, dh):
/// Newton's method on the two end equations, the Jacobian by central
/// differences, the step halved until the residual falls.
fn solve_hv(l: f64, dh: f64, l0: f64, q: f64, ea: f64) -> (f64, f64) {
    let res = |h: f64, v: f64| {
        let (x, y) = at(h, v, q, ea, l0);
        (x - l, y - dh)
    };
    let norm = |r: (f64, f64)| r.0.hypot(r.1);
    let (mut h, mut v) = (q * l0, 0.5 * q * l0);
    for _ in 0..200 {
        let r = res(h, v);
        if norm(r) < 1e-14 * l {
            break;
        }
        let (dh_, dv) = (1e-7 * h, 1e-7 * q * l0);
        let (a, b) = (res(h + dh_, v), res(h - dh_, v));
        let (c, d) = (res(h, v + dv), res(h, v - dv));
        let j = [
            [(a.0 - b.0) / (2.0 * dh_), (c.0 - d.0) / (2.0 * dv)],
            [(a.1 - b.1) / (2.0 * dh_), (c.1 - d.1) / (2.0 * dv)],
        ];
        let det = j[0][0] * j[1][1] - j[0][1] * j[1][0];
        let sh = -(r.0 * j[1][1] - r.1 * j[0][1]) / det;
        let sv = -(j[0][0] * r.1 - j[1][0] * r.0) / det;
        let mut t = 1.0;
        while t > 1e-6 {
            let (hn, vn) = (h + t * sh, v + t * sv);
            if hn > 0.0 && norm(res(hn, vn)) < norm(r) {
                h = hn;
                v = vn;
                break;
            }
            t *= 0.5;
        }
    }
    (h, v)
}

#[test]
fn elastic_catenary_from_its_unstressed_length() {
    // Span 100 m, right support 10 m lower, 105 m unstressed at 0.5 kN/m,
    // EA = 2 000 kN: about 1% strain.
    let (l, dh, l0, q, ea) = (100.0, -10.0, 105.0, 0.5, 2000.0);
    let (h, v) = solve_hv(l, dh, l0, q, ea);
    let (x, y) = at(h, v, q, ea, l0);
    assert!((x - l).abs() < 1e-12 && (y - dh).abs() < 1e-12, "{x} {y}");
    let st = bare(m_kn(), l, dh);
    let sol = solved_with(&st, Form::Cable, &[Condition::UnstressedLength(l0)], &opts(Some(q), Some(ea)));
    // Five-point collocation panels (order 10) and quadrature to round-off:
    // the figures agree far below 1e-9.
    near(sol.thrust, h, 1e-10, h);
    near(sol.reactions[0].y, v, 1e-10, q * l0);
    near(sol.reactions[1].y, q * l0 - v, 1e-10, q * l0);
    near(sol.unstressed_length.unwrap(), l0, 1e-13, l0);
    near(sol.profile_length, stretched(h, v, q, ea, l0), 1e-11, l0);
    assert!(sol.profile_length > l0 * 1.005, "{}", sol.profile_length);
    // The weight carried is q·L₀ (mass conserved), not q·S.
    near(sol.reactions[0].y + sol.reactions[1].y, q * l0, 1e-12, q * l0);
    // Every node on the elastic catenary: find s with x(s) = node x, compare y.
    for p in sol.nodes.iter().step_by(7) {
        let s = super::catenary::bisect(|s| at(h, v, q, ea, s).0 - p.x, 0.0, l0);
        near(p.y, at(h, v, q, ea, s).1, 1e-10, l);
    }
    checks_within(&sol, 1e-10);
    assert!(sol.iterations > 0);
}

#[test]
fn elastic_catenary_from_its_sag_reports_the_unstressed_length() {
    // Level span 50 m, sag 8 m, 1.2 kN/m, EA = 800 kN. The solver's H, V and
    // L₀ must close Irvine's equations at the right support.
    let (l, f, q, ea) = (50.0, 8.0, 1.2, 800.0);
    let sol = solved_with(&bare(m_kn(), l, 0.0), Form::Cable, &[Condition::Sag(f)], &opts(Some(q), Some(ea)));
    let l0 = sol.unstressed_length.unwrap();
    let (h, v) = (sol.thrust, sol.reactions[0].y);
    let (x, y) = at(h, v, q, ea, l0);
    near(x, l, 1e-10, l);
    near(y, 0.0, 1e-10, l);
    // Symmetric: each support carries half the weight q·L₀.
    near(v, 0.5 * q * l0, 1e-11, q * l0);
    // The low point at midspan: y(L₀/2) = −f.
    near(at(h, v, q, ea, 0.5 * l0).1, -f, 1e-10, l);
    checks_within(&sol, 1e-10);
}

#[test]
fn unstressed_length_needs_the_stiffness_and_room() {
    let st = bare(m_kn(), 100.0, 0.0);
    let (e, m) = failed_with(&st, Form::Cable, &[Condition::UnstressedLength(101.0)], &opts(Some(1.0), None));
    assert!(matches!(e, SolveError::BadValue { .. }));
    assert!(m.starts_with("--unstressed-length 101 m: the unstressed length needs the cable's axial stiffness"), "{m}");
    assert!(m.contains("add --axial-stiffness EA"), "{m}");
    // Far too short: reaching the supports takes a strain over 100%.
    let (_, m) = failed_with(&st, Form::Cable, &[Condition::UnstressedLength(40.0)], &opts(Some(1.0), Some(500.0)));
    assert!(m.contains("--unstressed-length 40 m is too short for these supports"), "{m}");
    assert!(m.contains("beyond --axial-stiffness 500 kN"), "{m}");
    let (_, m) = failed_with(&st, Form::Arch, &[Condition::UnstressedLength(120.0)], &opts(Some(1.0), Some(500.0)));
    assert!(m.contains("the unstressed length is for a cable; for an arch give --length S"), "{m}");
    let (_, m) = failed_with(&st, Form::Cable, &[Condition::Sag(5.0)], &opts(Some(1.0), Some(-3.0)));
    assert!(m.starts_with("--axial-stiffness -3 kN: the axial stiffness EA must be a positive force"), "{m}");
}

#[test]
fn a_taut_elastic_cable_shorter_than_its_chord() {
    // An unstressed length below the chord is a pretensioned cable: 99.9 m
    // over 100 m with EA = 10⁵ kN needs T ≈ EA·(100/99.9 − 1) ≈ 100 kN.
    let (l, l0, q, ea) = (100.0, 99.9, 0.05, 1.0e5);
    let (h, v) = solve_hv(l, 0.0, l0, q, ea);
    let sol =
        solved_with(&bare(m_kn(), l, 0.0), Form::Cable, &[Condition::UnstressedLength(l0)], &opts(Some(q), Some(ea)));
    near(sol.thrust, h, 1e-9, h);
    near(sol.reactions[0].y, v, 1e-9, q * l0);
    assert!(sol.thrust > 90.0 && sol.thrust < 110.0, "{}", sol.thrust);
}
