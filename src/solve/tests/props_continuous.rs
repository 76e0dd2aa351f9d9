//! Properties over random (invented) continuous loads: 1–5 distributed
//! loads of random intensities with random vertical point loads, random
//! support heights, cable or arch, sometimes a self-weight and an axial
//! stiffness. Each solution must be in equilibrium at every node and on the
//! closed form y = chord ∓ M(x)/H (Beer & Johnston, *Vector Mechanics for
//! Engineers: Statics*, §7.8–7.9), M computed here independently by
//! Simpson's rule when the loads are known beforehand (no self-weight); and
//! the same funicular must come back from the other conditions it meets
//! (through point, sag, length, unstressed length).

use proptest::prelude::*;

use super::*;

#[derive(Clone, Debug)]
struct Case {
    span: f64,
    y_left: f64,
    y_right: f64,
    ends: Vec<f64>,
    intensities: Vec<(f64, f64)>,
    points: Vec<(f64, f64)>,
    thrust_ratio: f64,
    arch: bool,
    through_at: f64,
    self_weight: Option<f64>,
    stiffness: Option<f64>,
}

fn case() -> impl Strategy<Value = Case> {
    (1usize..=5, 0usize..=6).prop_flat_map(|(k, n)| {
        (
            (5.0..200.0f64, -20.0..20.0f64, -20.0..20.0f64),
            prop::collection::vec(0.0..1.0f64, 2 * k),
            prop::collection::vec((0.0..50.0f64, 0.0..50.0f64), k),
            prop::collection::vec((0.01..0.99f64, 1.0..100.0f64), n),
            (0.1..3.0f64, any::<bool>(), 0.0..1.0f64),
            prop_oneof![3 => Just(None), 1 => (0.1..5.0f64).prop_map(Some)],
            prop_oneof![3 => Just(None), 1 => (50.0..1000.0f64).prop_map(Some)],
        )
            .prop_map(
                |((span, y_left, y_right), mut ends, intensities, points, (thrust_ratio, arch, through_at), sw, ea)| {
                    ends.sort_by(f64::total_cmp);
                    Case {
                        span,
                        y_left,
                        y_right,
                        ends,
                        intensities,
                        points,
                        thrust_ratio,
                        arch,
                        through_at,
                        self_weight: sw,
                        stiffness: ea,
                    }
                },
            )
    })
}

/// The stretches (x0, x1, w0, w1) of a case, or `None` when degenerate.
fn stretches(c: &Case) -> Option<Vec<(f64, f64, f64, f64)>> {
    let mut out = Vec::new();
    for (pair, (w0, w1)) in c.ends.chunks(2).zip(&c.intensities) {
        let (x0, x1) = (pair[0] * c.span, pair[1] * c.span);
        if x1 - x0 < 1e-3 * c.span || w0 + w1 < 1e-3 {
            return None;
        }
        out.push((x0, x1, *w0, *w1));
    }
    if out.windows(2).any(|w| w[1].0 < w[0].1) {
        return None;
    }
    Some(out)
}

/// Simpson's rule on [a, b] (exact for cubics).
fn simpson(f: impl Fn(f64) -> f64, a: f64, b: f64) -> f64 {
    (b - a) / 6.0 * (f(a) + 4.0 * f(0.5 * (a + b)) + f(b))
}

/// ∫ over the loads left of `x` of (c − ξ)·w(ξ) dξ, point loads included.
fn lever_sum(pieces: &[(f64, f64, f64, f64)], points: &[(f64, f64)], x: f64, c: f64) -> f64 {
    let mut sum = 0.0;
    for &(x0, x1, w0, w1) in pieces {
        let b = x1.min(x);
        if b > x0 {
            sum += simpson(|xi| (c - xi) * (w0 + (w1 - w0) * (xi - x0) / (x1 - x0)), x0, b);
        }
    }
    for &(xj, wj) in points {
        if xj < x {
            sum += (c - xj) * wj;
        }
    }
    sum
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 160, ..ProptestConfig::default() })]

    #[test]
    fn random_continuous_loads(c in case()) {
        let Some(pieces) = stretches(&c) else { return Ok(()) };
        let mut xs: Vec<f64> = c.points.iter().map(|p| p.0 * c.span).collect();
        xs.sort_by(f64::total_cmp);
        if xs.windows(2).any(|w| w[1] - w[0] < 1e-3 * c.span) {
            return Ok(());
        }
        let points: Vec<(f64, f64)> = c.points.iter().map(|p| (p.0 * c.span, p.1)).collect();
        let form = if c.arch { Form::Arch } else { Form::Cable };
        let s = form.sign();
        let st = spread(
            m_kn(),
            point(0.0, c.y_left),
            point(c.span, c.y_right),
            down(&points),
            pieces.iter().map(|&(x0, x1, w0, w1)| stretch(x0, x1, w0, w1)).collect(),
        );
        let total: f64 = pieces.iter().map(|p| 0.5 * (p.2 + p.3) * (p.1 - p.0)).sum::<f64>()
            + points.iter().map(|p| p.1).sum::<f64>();
        // The thrust scaled by every load, the self-weight of the chord included.
        let h = c.thrust_ratio * (total + c.self_weight.unwrap_or(0.0) * c.span);
        // An axial stiffness of 50 to 1000 times the thrust: strains of 0.1% to a few %.
        let o = opts(c.self_weight, c.stiffness.map(|k| k * h));
        let sol = solve_with(&st, form, &[Condition::Thrust(h)], &o);
        let sol = match sol {
            Ok(sol) => sol,
            Err(e) => { prop_assert!(false, "{e}"); return Ok(()); }
        };
        prop_assert!(sol.checks.equilibrium <= 1e-9, "equilibrium {:e}", sol.checks.equilibrium);
        prop_assert!(sol.checks.closed_form.is_some_and(|e| e <= 1e-9), "closed form {:?}", sol.checks.closed_form);
        prop_assert!(sol.checks.conditions <= 1e-9, "conditions {:e}", sol.checks.conditions);
        prop_assert!((sol.thrust - h).abs() <= 1e-12 * h);
        let (first, last) = (sol.nodes[0], sol.nodes[sol.nodes.len() - 1]);
        if c.self_weight.is_none() {
            // The closed form, computed here.
            let r_a = lever_sum(&pieces, &points, c.span, c.span) / c.span;
            for p in &sol.nodes {
                let m = r_a * p.x - lever_sum(&pieces, &points, p.x, p.x);
                let chord = first.y + (last.y - first.y) * p.x / c.span;
                prop_assert!((p.y - (chord - s * m / h)).abs() <= 1e-9 * c.span, "{p:?}: {}", chord - s * m / h);
            }
            // The reactions are the true end forces: vertical parts add up to the load.
            prop_assert!((sol.reactions[0].y + sol.reactions[1].y - total).abs() <= 1e-9 * total);
        }
        // The same funicular from other conditions it meets.
        let k = ((c.through_at * (sol.nodes.len() - 2) as f64) as usize + 1).min(sol.nodes.len() - 2);
        let through = sol.nodes[k];
        let mut conds = vec![Condition::Through(through), Condition::Sag(sol.sag.value), Condition::Length(sol.profile_length)];
        if let (Some(s0), Form::Cable) = (sol.unstressed_length, form) {
            conds.push(Condition::UnstressedLength(s0));
        }
        for cond in conds {
            let again = match solve_with(&st, form, &[cond], &o) {
                Ok(a) => a,
                Err(e) => { prop_assert!(false, "{cond:?}: {e}"); return Ok(()); }
            };
            prop_assert!((again.thrust - h).abs() <= 1e-8 * h, "{cond:?}: {} vs {h}", again.thrust);
            prop_assert!(again.checks.equilibrium <= 1e-9 && again.checks.closed_form.is_some_and(|e| e <= 1e-9));
        }
    }
}
