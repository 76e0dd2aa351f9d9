//! Every error path: each message must name the conditions, with their
//! values in the structure's units, and say what to do. Invented numbers
//! unless a source is named.

use kurbo::Point;

use super::*;

/// The loads of Beer & Johnston, Prob. 7.116 (360, 720, 240 lb at 2, 4, 6 ft, span 8 ft).
fn book(left: Support, right: Support) -> Structure {
    structure(ft_lbf(), left, right, down(&[(2.0, 360.0), (4.0, 720.0), (6.0, 240.0)]))
}

fn both_points() -> Structure {
    book(point(0.0, 0.0), point(8.0, -2.4))
}

fn both_axes() -> Structure {
    book(axis(0.0, -10.0, 0.0), axis(8.0, -10.0, 0.0))
}

#[track_caller]
fn has(m: &str, parts: &[&str]) {
    for p in parts {
        assert!(m.contains(p), "missing {p:?} in: {m}");
    }
}

// ---- Count ----

#[test]
fn too_few_conditions_lists_them_and_the_options() {
    let (e, m) = failed(&both_points(), Form::Cable, &[]);
    assert!(matches!(e, SolveError::Count { given: 2, .. }));
    has(
        &m,
        &[
            "2 condition(s) given (left support (0, 0) and right support (8, -2.4))",
            "needs exactly 3",
            "Add one of --through X,Y, --thrust H, --sag F, --max-force T, --level-at X.",
        ],
    );
}

#[test]
fn too_few_for_an_arch_says_rise() {
    let s = book(point(0.0, 0.0), axis(8.0, 0.0, 5.0));
    let (_, m) = failed(&s, Form::Arch, &[]);
    has(
        &m,
        &["1 condition(s) given (left support (0, 0))", "Add two of", "--rise F", "the right support is a tower axis"],
    );
    assert!(!m.contains("--sag"), "{m}");
}

#[test]
fn none_at_all() {
    let (_, m) = failed(&both_axes(), Form::Cable, &[]);
    has(&m, &["0 condition(s) given (none)", "Add three of", "both supports are tower axes"]);
}

#[test]
fn too_many_conditions_says_which_to_drop() {
    let (e, m) = failed(&both_points(), Form::Cable, &[Condition::Thrust(850.0), Condition::Sag(2.4)]);
    assert!(matches!(e, SolveError::Count { given: 4, .. }));
    has(
        &m,
        &[
            "4 condition(s) given (left support (0, 0), right support (8, -2.4), --thrust 850 lbf and --sag 2.4 ft)",
            "Drop one of --thrust 850 lbf and --sag 2.4 ft, or draw a support as a tower axis",
        ],
    );
}

// ---- BadValue ----

#[test]
fn bad_values_are_named_with_their_units() {
    let s = both_points();
    let cases: Vec<(Condition, &[&str])> = vec![
        (Condition::Sag(-2.0), &["--sag -2 ft: the sag must be a positive length"]),
        (Condition::Thrust(0.0), &["--thrust 0 lbf: the thrust must be a positive force"]),
        (Condition::MaxForce(f64::NAN), &["--max-force NaN lbf: the largest segment force must be a positive force"]),
        (
            Condition::Through(Point::new(9.0, -1.0)),
            &[
                "--through 9,-1: the point's x must lie on the span, from x = 0 to x = 8; move the point between the supports",
            ],
        ),
        (
            Condition::Through(Point::new(3.0, f64::INFINITY)),
            &["--through 3,inf: the point must have finite coordinates"],
        ),
        (Condition::LevelAt(8.0), &["--level-at 8: x must lie strictly inside the span, from x = 0 to x = 8"]),
        (Condition::LevelAt(f64::NAN), &["--level-at NaN: x must be a finite number"]),
    ];
    for (c, parts) in cases {
        let (e, m) = failed(&s, Form::Cable, &[c]);
        assert!(matches!(e, SolveError::BadValue { .. }), "{m}");
        has(&m, parts);
    }
    let (_, m) = failed(&s, Form::Arch, &[Condition::Sag(0.0)]);
    has(&m, &["--rise 0 ft: the rise must be a positive length"]);
}

#[test]
fn level_point_on_a_load_vertical() {
    let (e, m) = failed(&both_points(), Form::Cable, &[Condition::LevelAt(4.0)]);
    assert!(matches!(e, SolveError::BadValue { .. }));
    has(
        &m,
        &[
            "--level-at 4: x = 4 is the node under the load at entity on layer T at (4, 0), where the slope jumps",
            "move x into a segment, between 2 and 4 or between 4 and 6",
        ],
    );
}

// ---- Dependent ----

#[test]
fn thrust_and_sag_both_fix_the_thrust() {
    let s = book(point(0.0, 0.0), axis(8.0, -10.0, 0.0));
    // Sag 2.4 ft means M_max/f = 2040/2.4 = 850 lb.
    let (e, m) = failed(&s, Form::Cable, &[Condition::Thrust(850.0), Condition::Sag(2.4)]);
    assert!(matches!(e, SolveError::Dependent { .. }));
    has(
        &m,
        &[
            "the conditions --thrust 850 lbf and --sag 2.4 ft both fix the thrust (each means a thrust of 850 lbf)",
            "replace one with --through X,Y or --level-at X",
        ],
    );
    let (_, m) = failed(&s, Form::Cable, &[Condition::Thrust(900.0), Condition::Sag(2.4)]);
    has(&m, &["ask for different ones: 900 lbf from --thrust 900 lbf, 850 lbf from --sag 2.4 ft", "replace one with"]);
}

#[test]
fn through_point_over_a_fixed_support() {
    let s = book(point(0.0, 0.0), axis(8.0, -10.0, 0.0));
    let (_, m) = failed(&s, Form::Cable, &[Condition::Through(Point::new(0.0, 1.0)), Condition::Thrust(850.0)]);
    has(
        &m,
        &[
            "the conditions left support (0, 0) and --through 0,1 ask for two different heights at x = 0",
            "move the --through point to another x, or replace it with --thrust H, --sag F or --level-at X",
        ],
    );
    let (_, m) = failed(&s, Form::Cable, &[Condition::Through(Point::new(0.0, 0.0)), Condition::Thrust(850.0)]);
    has(&m, &["both fix the height at x = 0"]);
}

#[test]
fn two_level_points_in_one_segment() {
    let (_, m) = failed(
        &both_axes(),
        Form::Cable,
        &[Condition::LevelAt(4.5), Condition::LevelAt(5.5), Condition::Through(Point::new(3.0, -2.0))],
    );
    has(
        &m,
        &[
            "the conditions --level-at 4.5 and --level-at 5.5 both fix the slope of the same segment",
            "replace one with --through X,Y, --thrust H or --sag F",
        ],
    );
}

#[test]
fn nothing_fixes_a_height() {
    let (_, m) = failed(
        &both_axes(),
        Form::Cable,
        &[Condition::Thrust(850.0), Condition::LevelAt(5.0), Condition::MaxForce(2000.0)],
    );
    has(
        &m,
        &[
            "the conditions --thrust 850 lbf, --level-at 5 and --max-force 2000 lbf fix only slopes and forces, not the height",
            "replace one of them with --through X,Y, or draw a support as a point",
        ],
    );
}

#[test]
fn two_max_forces() {
    let (_, m) = failed(
        &both_axes(),
        Form::Cable,
        &[Condition::MaxForce(2000.0), Condition::Through(Point::new(3.0, -2.0)), Condition::MaxForce(2100.0)],
    );
    has(
        &m,
        &[
            "the conditions --max-force 2000 lbf and --max-force 2100 lbf all fix the largest force",
            "keep one --max-force and replace the others with --through X,Y",
        ],
    );
}

#[test]
fn max_force_with_the_thrust_fixed_leaves_two_slopes() {
    // Beer & Johnston, Prob. 7.116 loads with H = 850 lb: the book's cable
    // leaves the left support at slope −945/850 and has largest force
    // √(850² + 945²); the mirror root O_y' = −(C_max + C_min) − O_y = −375 lb
    // (slope −375/850) has the same largest force.
    let s = book(point(0.0, 0.0), axis(8.0, -10.0, 0.0));
    let t = 850f64.hypot(945.0);
    let (e, m) = failed(&s, Form::Cable, &[Condition::Thrust(850.0), Condition::MaxForce(t)]);
    assert!(matches!(e, SolveError::Dependent { .. }));
    has(
        &m,
        &[
            "left support (0, 0), --thrust 850 lbf and --max-force 1271.",
            "allow two cables with that largest force, leaving the left support at slopes -0.441176 and -1.111765",
            "replace --max-force with --through X,Y or --level-at X to choose one",
        ],
    );
}

#[test]
fn three_conditions_that_leave_the_shape_free() {
    // 10 lbf down at 2 ft and 10 lbf up at 6 ft: the simple-beam moment is
    // zero at midspan, so every funicular crosses the chord there.
    let loads = vec![Load::vertical(2.0, 10.0, origin(2.0, 0.0)), inclined((6.0, 0.0), (0.0, 10.0))];
    let s = structure(ft_lbf(), point(0.0, 0.0), point(8.0, -2.0), loads);
    let (_, m) = failed(&s, Form::Cable, &[Condition::Through(Point::new(4.0, -1.0))]);
    has(
        &m,
        &[
            "the conditions left support (0, 0), right support (8, -2) and --through 4,-1 leave the funicular free",
            "replace one of them with another of --through X,Y",
        ],
    );
    let (_, m) = failed(&s, Form::Cable, &[Condition::Through(Point::new(4.0, -1.5))]);
    has(&m, &["contradict each other: no funicular meets all three"]);
}

// ---- NoSolution ----

#[test]
fn point_above_the_chord_needs_an_arch() {
    let (e, m) = failed(&both_points(), Form::Cable, &[Condition::Through(Point::new(4.0, 1.0))]);
    assert!(matches!(e, SolveError::NoSolution { form: Form::Cable, .. }));
    has(
        &m,
        &[
            "no cable meets the conditions left support (0, 0), right support (8, -2.4) and --through 4,1",
            "standing above the chord",
            "use --arch to get that arch, or move the --through 4,1 point below the chord",
        ],
    );
    let s = book(point(0.0, 0.0), point(8.0, 2.4));
    let (_, m) = failed(&s, Form::Arch, &[Condition::Through(Point::new(4.0, -1.0))]);
    has(&m, &["no arch meets", "drop --arch to get that cable, or move the --through 4,-1 point above the chord"]);
}

#[test]
fn level_point_on_the_wrong_side() {
    // Supports 0 and −2.4 ft: the low point of a cable cannot be left of the
    // first load with this drop.
    let (_, m) = failed(&both_points(), Form::Cable, &[Condition::LevelAt(1.0)]);
    has(&m, &["--level-at 1", "move --level-at 1 toward the lower support"]);
}

#[test]
fn two_level_points_need_a_straight_profile() {
    let s = book(point(0.0, 0.0), axis(8.0, -10.0, 0.0));
    let (_, m) = failed(&s, Form::Cable, &[Condition::LevelAt(3.0), Condition::LevelAt(5.0)]);
    has(
        &m,
        &[
            "left support (0, 0), --level-at 3 and --level-at 5",
            "they need a straight profile, which only an infinite thrust gives; change one of them",
        ],
    );
}

#[test]
fn max_force_below_what_the_family_can_reach() {
    // Book loads, supports (0, 0) and (8, +2.4): O_y = 0.3·H − 690 lb, so the
    // largest force is √(H² + max(690 − 0.3H, 630 + 0.3H)²), least at the
    // kink H = 100 lb: √(100² + 660²) = 667.5327 lb (algebra on the book's numbers).
    let s = book(point(0.0, 0.0), point(8.0, 2.4));
    let (e, m) = failed(&s, Form::Cable, &[Condition::MaxForce(600.0)]);
    assert!(matches!(e, SolveError::NoSolution { .. }));
    has(
        &m,
        &[
            "no cable meets the conditions left support (0, 0), right support (8, 2.4) and --max-force 600 lbf",
            "the least largest force a cable meeting left support (0, 0) and right support (8, 2.4) can have is 667.53",
            "(at a thrust of 100 lbf); --max-force must be at least that",
        ],
    );
    // Supports (0, 0) and (8, −2.4): O_y = −0.3·H − 690, the least is 690 lb as H → 0.
    let (_, m) = failed(&both_points(), Form::Cable, &[Condition::MaxForce(600.0)]);
    has(
        &m,
        &["has a largest force above 690 lbf (approached as the thrust tends to zero)", "must be larger than that"],
    );
}

#[test]
fn max_force_below_the_fixed_thrust() {
    let s = book(point(0.0, 0.0), axis(8.0, -10.0, 0.0));
    let (_, m) = failed(&s, Form::Cable, &[Condition::Thrust(850.0), Condition::MaxForce(800.0)]);
    has(
        &m,
        &[
            "left support (0, 0) and --thrust 850 lbf fix the thrust at 850 lbf, and every segment carries at least the thrust",
            "--max-force must be at least that",
        ],
    );
    // With H = 850 the vertical components span 0 … 1320 lb: at best ±660 lb,
    // so the least largest force is √(850² + 660²) = 1076.1505 lb.
    let (_, m) = failed(&s, Form::Cable, &[Condition::Thrust(850.0), Condition::MaxForce(900.0)]);
    has(&m, &["the largest force is at least 1076.15", "--max-force must be at least that"]);
}

#[test]
fn sag_under_loads_that_push_up() {
    let loads = vec![inclined((3.0, 0.0), (0.0, 10.0)), inclined((5.0, 0.0), (0.0, 10.0))];
    let s = structure(m_kn(), point(0.0, 0.0), point(8.0, 0.0), loads);
    let (_, m) = failed(&s, Form::Cable, &[Condition::Sag(1.0)]);
    has(&m, &["--sag 1 m", "push up on balance", "replace --sag with --thrust H"]);
}

#[test]
fn max_force_with_a_through_point_over_a_support() {
    let s = book(point(0.0, 0.0), axis(8.0, -10.0, 0.0));
    let (e, m) = failed(&s, Form::Cable, &[Condition::Through(Point::new(0.0, 0.0)), Condition::MaxForce(1500.0)]);
    assert!(matches!(e, SolveError::Dependent { .. }));
    has(
        &m,
        &[
            "left support (0, 0) and --through 0,0 both fix the height at x = 0",
            "move the --through point to another x",
        ],
    );
}
