//! Checks against published references.

use kurbo::Point;

use super::*;

/// Beer & Johnston, *Vector Mechanics for Engineers: Statics*, Prob. 7.116:
/// span 8 ft; 360, 720, 240 lb at x = 2, 4, 6 ft; right support 2.4 ft below
/// the left; the point at x = 4 ft is 3.6 ft below the left support.
fn book() -> Structure {
    structure(ft_lbf(), point(0.0, 0.0), point(8.0, -2.4), down(&[(2.0, 360.0), (4.0, 720.0), (6.0, 240.0)]))
}

/// The book case's nodes in closed form: y = chord − M/H with M = 1380, 2040,
/// 1260 lb·ft and H = 850 lb, i.e. depths 189/85 and 279/85 ft.
fn book_nodes() -> Vec<Point> {
    vec![
        Point::new(0.0, 0.0),
        Point::new(2.0, -189.0 / 85.0),
        Point::new(4.0, -3.6),
        Point::new(6.0, -279.0 / 85.0),
        Point::new(8.0, -2.4),
    ]
}

#[test]
fn book_cable_through_a_point() {
    let sol = solved(&book(), Form::Cable, &[Condition::Through(Point::new(4.0, -3.6))]);
    // Beer & Johnston, Prob. 7.116: H = 850 lb.
    near(sol.thrust, 850.0, 1e-9, 850.0);
    // Beer & Johnston, Prob. 7.116: depths below the left support 2.2235 ft at
    // x = 2 ft and 3.2824 ft at x = 6 ft (to the book's 4 decimals)...
    near(-sol.nodes[1].y, 2.2235, 0.5e-4, 1.0);
    near(-sol.nodes[3].y, 3.2824, 0.5e-4, 1.0);
    // ...and to the exact closed form y = chord − M/H (Beer & Johnston §7.8–7.9).
    same_nodes(&sol, &book_nodes(), 1e-12);
    // Beer & Johnston §7.8–7.9, Prob. 7.114: the higher support takes
    // V_beam + H·Δh/L = 690 + 850·2.4/8 = 945 lb; the lower 630 − 255 = 375 lb.
    near(sol.reactions[0].y, 945.0, 1e-12, 945.0);
    near(sol.reactions[1].y, 375.0, 1e-12, 945.0);
    near(sol.reactions[0].x, -850.0, 1e-12, 850.0);
    near(sol.reactions[1].x, 850.0, 1e-12, 850.0);
    // Cable: every segment in tension; string force T = H·√(1 + slope²) (ibid.).
    for (k, seg) in sol.segments.iter().enumerate() {
        let (a, b) = (sol.nodes[k], sol.nodes[k + 1]);
        let slope = (b.y - a.y) / (b.x - a.x);
        near(seg.force, 850.0 * slope.hypot(1.0), 1e-12, 1500.0);
    }
    // Sag: largest distance below the chord, at the middle load: 3.6 − 1.2 ft.
    near(sol.sag.value, 2.4, 1e-12, 8.0);
    assert_eq!(sol.sag.x, 4.0);
    checks_within(&sol, 1e-13);
    assert!(sol.warnings.is_empty(), "{:?}", sol.warnings);
    // Force diagram: load line 0, −360, −1080, −1320; pole (850, −945).
    assert_eq!(sol.load_line[3], Point::new(0.0, -1320.0));
    near(sol.pole.y, -945.0, 1e-12, 945.0);
    // Closing line parallel to the chord cuts the load line at the beam's left
    // reaction, 690 lb below a₀ (common practice, no source).
    let cp = sol.closing_point.unwrap();
    near(cp.x, 0.0, 1e-12, 1.0);
    near(cp.y, -690.0, 1e-12, 690.0);
    let kinds: Vec<&str> = sol.conditions.iter().map(|c| c.kind).collect();
    assert_eq!(kinds, ["left-support", "right-support", "through"]);
}

#[test]
fn book_cable_from_other_conditions() {
    // The same cable of Beer & Johnston, Prob. 7.116, described by other
    // condition sets that it meets: each must give the same nodes.
    let b = book();
    let h = 850.0;
    let t_max = 850f64.hypot(945.0); // first segment: (850, −945) lb
    let sets: Vec<Vec<Condition>> = vec![
        vec![Condition::Thrust(h)],
        vec![Condition::Sag(2.4)],
        vec![Condition::MaxForce(t_max)],
        vec![Condition::Through(Point::new(2.0, -189.0 / 85.0))],
        vec![Condition::Through(Point::new(7.0, -0.5 * (279.0 / 85.0 + 2.4)))],
    ];
    for c in sets {
        let sol = solved(&b, Form::Cable, &c);
        same_nodes(&sol, &book_nodes(), 1e-9);
        near(sol.thrust, h, 1e-9, h);
        checks_within(&sol, 1e-12);
        // This family has one root for the max-force (the other is at H < 0).
        assert!(sol.warnings.is_empty(), "{c:?}: {:?}", sol.warnings);
    }
}

#[test]
fn book_cable_with_the_right_height_found() {
    // Right support as a tower axis: its height (−2.4 ft) must be found.
    let loads = down(&[(2.0, 360.0), (4.0, 720.0), (6.0, 240.0)]);
    let s = structure(ft_lbf(), point(0.0, 0.0), axis(8.0, -10.0, 0.0), loads);
    let sets: Vec<Vec<Condition>> = vec![
        vec![Condition::Through(Point::new(4.0, -3.6)), Condition::Through(Point::new(6.0, -279.0 / 85.0))],
        vec![Condition::Thrust(850.0), Condition::Through(Point::new(4.0, -3.6))],
        vec![Condition::Through(Point::new(8.0, -2.4)), Condition::Sag(2.4)],
    ];
    for c in sets {
        let sol = solved(&s, Form::Cable, &c);
        same_nodes(&sol, &book_nodes(), 1e-9);
        assert_eq!(sol.towers.len(), 1);
        let t = sol.towers[0];
        assert_eq!(t.side, 1);
        near(t.at.y, -2.4, 1e-9, 8.0);
        near(t.height, 7.6, 1e-9, 8.0);
        near(t.above_top, -2.4, 1e-9, 8.0);
        checks_within(&sol, 1e-12);
    }
}

#[test]
fn book_case_mirrored_is_an_arch() {
    // The book cable turned upside down (y → −y) is the funicular arch of the
    // same loads: H = 850 lb, every force the cable's force negated.
    let cable = solved(&book(), Form::Cable, &[Condition::Through(Point::new(4.0, -3.6))]);
    let s = structure(ft_lbf(), point(0.0, 0.0), point(8.0, 2.4), down(&[(2.0, 360.0), (4.0, 720.0), (6.0, 240.0)]));
    let arch = solved(&s, Form::Arch, &[Condition::Through(Point::new(4.0, 3.6))]);
    near(arch.thrust, 850.0, 1e-12, 850.0);
    let mirrored: Vec<Point> = cable.nodes.iter().map(|p| Point::new(p.x, -p.y)).collect();
    same_nodes(&arch, &mirrored, 1e-12);
    for (a, c) in arch.segments.iter().zip(&cable.segments) {
        assert!(a.force < 0.0);
        near(a.force, -c.force, 1e-12, 1500.0);
    }
    near(arch.sag.value, 2.4, 1e-12, 8.0);
    assert_eq!(arch.conditions[2].kind, "through");
    checks_within(&arch, 1e-13);
}

/// Equal loads `p` at equal spacing `sp`, `n` of them (odd), on supports at
/// heights `yl` and `yr`.
fn equal_loads(n: usize, p: f64, sp: f64, yl: f64, yr: f64) -> Structure {
    let loads: Vec<(f64, f64)> = (1..=n).map(|k| (k as f64 * sp, p)).collect();
    structure(m_kn(), point(0.0, yl), point((n + 1) as f64 * sp, yr), down(&loads))
}

#[test]
fn parabola_thrust_from_the_sag() {
    // Hicks, Civil Engineering Formulas, ch. 10, eq. 10.57ff: H = wL²/(8f); for
    // equal loads P at equal spacing s, w = P/s, with the sag at a vertex at
    // midspan (common practice). Invented: 9 loads of 12 kN every 2.5 m,
    // L = 25 m, f = 3 m → H = 4.8·625/24 = 125 kN.
    for (yl, yr) in [(0.0, 0.0), (10.0, 6.0), (-2.0, 7.5)] {
        let s = equal_loads(9, 12.0, 2.5, yl, yr);
        let sol = solved(&s, Form::Cable, &[Condition::Sag(3.0)]);
        let (w, l, f) = (12.0 / 2.5, 25.0, 3.0);
        near(sol.thrust, w * l * l / (8.0 * f), 1e-13, 125.0);
        near(sol.sag.x, 12.5, 0.0, 1.0);
        // Vertices on the parabola of the uniform load: y = chord − 4f·x(L − x)/L²
        // (Hicks, ibid.; common practice for the equal-load case).
        for p in &sol.nodes {
            let chord = yl + (yr - yl) * p.x / l;
            near(p.y, chord - 4.0 * f * p.x * (l - p.x) / (l * l), 1e-13, l);
        }
        checks_within(&sol, 1e-13);
    }
}

#[test]
fn parabola_arch_rise() {
    // The same loads as an arch with rise f: H = wL²/(8f) (Megson, Structural
    // and Stress Analysis, "Arches" — from memory). 7 loads of 20 kN every 5 m,
    // L = 40 m, f = 8 m → H = 4·1600/64 = 100 kN.
    let s = equal_loads(7, 20.0, 5.0, 3.0, 1.0);
    let sol = solved(&s, Form::Arch, &[Condition::Sag(8.0)]);
    near(sol.thrust, 100.0, 1e-13, 100.0);
    assert!(sol.segments.iter().all(|g| g.force < 0.0));
    assert_eq!(sol.conditions[2].kind, "rise");
    near(sol.sag.profile_y - sol.sag.chord_y, 8.0, 1e-13, 40.0);
}

#[test]
fn arch_central_point_load() {
    // Megson, Structural and Stress Analysis, "Arches" (from memory): central
    // point load on a three-hinged arch, H = PL/(4f). Invented: P = 100 kN,
    // L = 20 m, f = 4 m → H = 125 kN.
    let s = structure(m_kn(), point(0.0, 0.0), point(20.0, 0.0), down(&[(10.0, 100.0)]));
    let sol = solved(&s, Form::Arch, &[Condition::Sag(4.0)]);
    near(sol.thrust, 125.0, 1e-14, 125.0);
    near(sol.nodes[1].y, 4.0, 1e-14, 20.0);
    // Both halves carry −√(125² + 50²) kN, compression.
    for g in &sol.segments {
        near(g.force, -(125f64.hypot(50.0)), 1e-14, 200.0);
    }
    near(sol.max_force(), 125f64.hypot(50.0), 1e-14, 200.0);
    // Arch: the supports push inward and up on the arch.
    assert!(sol.reactions[0].x > 0.0 && sol.reactions[1].x < 0.0);
    near(sol.reactions[0].y, 50.0, 1e-14, 50.0);
    checks_within(&sol, 1e-14);
}

#[test]
fn three_hinged_arch_thrust_is_crown_moment_over_rise() {
    // Megson, Structural and Stress Analysis, "Arches" (from memory): H = M₀/f,
    // M₀ the simple-beam moment at the crown hinge. Invented: 60 kN at 5 m and
    // 40 kN at 12 m on 20 m, crown hinge at (10, 5): R_A = 61 kN,
    // M₀ = 610 − 300 = 310 kN·m → H = 62 kN. The funicular through the hinge
    // is the thrust line of that arch.
    let s = structure(m_kn(), point(0.0, 0.0), point(20.0, 0.0), down(&[(5.0, 60.0), (12.0, 40.0)]));
    let sol = solved(&s, Form::Arch, &[Condition::Through(Point::new(10.0, 5.0))]);
    near(sol.thrust, 62.0, 1e-13, 62.0);
    checks_within(&sol, 1e-13);
}

#[test]
fn max_force_with_two_roots_takes_the_shallower() {
    // The book's loads on supports (0, 0) and (8, +2.4) (invented variation of
    // Beer & Johnston, Prob. 7.116): the family has O_y = 0.3·H − 690 lb, so
    // with T = 680 lb the largest force is T where
    //   1.09·H² − 414·H + 13700 = 0 (first segment largest, H < 100) and
    //   1.09·H² + 378·H − 65500 = 0 (last segment largest, H > 100).
    let s = structure(ft_lbf(), point(0.0, 0.0), point(8.0, 2.4), down(&[(2.0, 360.0), (4.0, 720.0), (6.0, 240.0)]));
    let deep = (414.0 - (414.0f64 * 414.0 - 4.0 * 1.09 * 13700.0).sqrt()) / 2.18;
    let shallow = (-378.0 + (378.0f64 * 378.0 + 4.0 * 1.09 * 65500.0).sqrt()) / 2.18;
    let sol = solved(&s, Form::Cable, &[Condition::MaxForce(680.0)]);
    near(sol.thrust, shallow, 1e-12, shallow);
    near(sol.max_force(), 680.0, 1e-12, 680.0);
    assert_eq!(sol.max_segment, 3);
    assert_eq!(sol.warnings.len(), 1, "{:?}", sol.warnings);
    let w = &sol.warnings[0];
    assert!(w.contains(&format!("with a thrust of {} lbf", crate::model::fmt_num(deep))), "{w}");
    assert!(w.contains("replace --max-force with --thrust"), "{w}");
    // The deeper one, asked for by its thrust, has the same largest force.
    let other = solved(&s, Form::Cable, &[Condition::Thrust(deep)]);
    near(other.max_force(), 680.0, 1e-12, 680.0);
    assert_eq!(other.max_segment, 0);
    checks_within(&sol, 1e-12);
}
