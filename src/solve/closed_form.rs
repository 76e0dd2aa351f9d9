//! An independent check for vertical loads: the polygon's ordinates against
//! the closed form y(x) = chord(x) − s·M(x)/H, M the bending moment of a
//! simply supported beam carrying the same loads over the same span (Beer &
//! Johnston, *Vector Mechanics for Engineers: Statics*, §7.8–7.9 and
//! Prob. 7.114, the general cable theorem).
//!
//! M is computed the beam way — left reaction from moments about the right
//! support, then moments of the reaction and the loads left of the section —
//! and shares no code with the solver's F(x), so a slip in either shows.

use kurbo::Point;

use crate::model::Load;

/// Simple-beam moment at each x of `at` (sorted), for vertical `loads`
/// (sorted) on supports at `x_left` and `x_right`.
pub(crate) fn beam_moments(loads: &[Load], x_left: f64, x_right: f64, at: &[f64]) -> Vec<f64> {
    let span = x_right - x_left;
    // R_A·L = Σ Wⱼ·(x_R − xⱼ): moments about the right support.
    let r_left: f64 = loads.iter().map(|l| -l.force.y * (x_right - l.anchor.x)).sum::<f64>() / span;
    let (mut sum_w, mut sum_wx) = (0.0, 0.0);
    let mut next = 0;
    at.iter()
        .map(|&x| {
            // Loads strictly left of the section act on the free body.
            while next < loads.len() && loads[next].anchor.x < x {
                let w = -loads[next].force.y;
                sum_w += w;
                sum_wx += w * (loads[next].anchor.x - x_left);
                next += 1;
            }
            let lever = x - x_left;
            r_left * lever - (sum_w * lever - sum_wx)
        })
        .collect()
}

/// Largest |y − (chord − s·M/H)| over the nodes, divided by the span.
pub(crate) fn check(loads: &[Load], nodes: &[Point], thrust: f64, s: f64) -> f64 {
    let (first, last) = (nodes[0], nodes[nodes.len() - 1]);
    let span = last.x - first.x;
    let xs: Vec<f64> = nodes.iter().map(|n| n.x).collect();
    let m = beam_moments(loads, first.x, last.x, &xs);
    nodes
        .iter()
        .zip(&m)
        .map(|(n, m)| {
            let chord = first.y + (last.y - first.y) * (n.x - first.x) / span;
            (n.y - (chord - s * m / thrust)).abs() / span
        })
        .fold(0.0, f64::max)
}

/// A load whose resultant is all the continuous check needs: it lies left
/// of `to`, within a panel no section falls inside.
#[derive(Clone, Copy, Debug)]
pub(crate) struct Lump {
    /// Right end.
    pub to: f64,
    /// Resultant (downward positive).
    pub force: f64,
    /// x of the resultant.
    pub at: f64,
}

/// Simple-beam moments, the beam way, for continuous loads, in local x
/// (0 at the left support): point loads `(x, W)`, distributed `stretches`
/// (each a trapezoid, in closed form: the part left of a section has its
/// resultant ½(w₀ + wₓ)·ℓ and moment ℓ²(2w₀ + wₓ)/6 about the section —
/// statics, common practice, no source) and `lumps` (self-weight of panels,
/// by their resultants: valid at sections outside them). `at` sorted.
pub(crate) fn continuous_moments(
    points: &[(f64, f64)],
    stretches: &[super::loading::Stretch],
    lumps: &[Lump],
    span: f64,
    at: &[f64],
) -> Vec<f64> {
    // Every item by its right end: (right end, resultant, its x).
    let mut items: Vec<(f64, f64, f64)> = points.iter().map(|&(x, w)| (x, w, x)).collect();
    for s in stretches {
        let l = s.x1 - s.x0;
        let sum = s.w0 + s.w1;
        let bar = if sum == 0.0 { s.x0 + l / 2.0 } else { s.x0 + l * (s.w0 + 2.0 * s.w1) / (3.0 * sum) };
        items.push((s.x1, 0.5 * sum * l, bar));
    }
    items.extend(lumps.iter().map(|m| (m.to, m.force, m.at)));
    items.sort_by(|a, b| a.0.total_cmp(&b.0));
    // R_A·L = Σ P·(L − x̄): moments about the right support.
    let r_left: f64 = items.iter().map(|(_, p, bar)| p * (span - bar)).sum::<f64>() / span;
    let (mut sum_p, mut sum_px) = (0.0, 0.0);
    let (mut next, mut part) = (0, 0);
    at.iter()
        .map(|&x| {
            while next < items.len() && items[next].0 <= x {
                sum_p += items[next].1;
                sum_px += items[next].1 * items[next].2;
                next += 1;
            }
            while part < stretches.len() && stretches[part].x1 <= x {
                part += 1;
            }
            let partial = match stretches.get(part) {
                Some(s) if s.x0 < x => {
                    let l = x - s.x0;
                    l * l * (2.0 * s.w0 + s.at(x)) / 6.0
                }
                _ => 0.0,
            };
            r_left * x - (sum_p * x - sum_px) - partial
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::Origin;

    #[test]
    fn moments_of_the_book_case() {
        // Beer & Johnston, Vector Mechanics for Engineers: Statics, Prob. 7.116:
        // 360, 720, 240 lb at 2, 4, 6 ft, span 8 ft; by hand R_A = 690 lb and
        // M = 1380, 2040, 1260 lb·ft (statics, common practice).
        let o = Origin { layer: "L".into(), handle: None, at: Point::ZERO };
        let loads: Vec<Load> =
            [(2.0, 360.0), (4.0, 720.0), (6.0, 240.0)].iter().map(|&(x, w)| Load::vertical(x, w, o.clone())).collect();
        let m = beam_moments(&loads, 0.0, 8.0, &[0.0, 2.0, 4.0, 6.0, 8.0]);
        let want = [0.0, 1380.0, 2040.0, 1260.0, 0.0];
        for (a, b) in m.iter().zip(want) {
            assert!((a - b).abs() < 1e-12, "{m:?}");
        }
    }

    #[test]
    fn moments_of_a_partial_uniform_load() {
        // Invented: w = 2 over 0..4 of a 10 span, 5 at x = 6. By hand
        // (statics, common practice, no source): R_A = (8·8 + 5·4)/10 = 8.4;
        // M(2) = 16.8 − 4 = 12.8; M(4) = 33.6 − 16 = 17.6; M(6) = 50.4 − 8·4 = 18.4.
        let s = [super::super::loading::Stretch { x0: 0.0, x1: 4.0, w0: 2.0, w1: 2.0 }];
        let m = continuous_moments(&[(6.0, 5.0)], &s, &[], 10.0, &[0.0, 2.0, 4.0, 6.0, 10.0]);
        let want = [0.0, 12.8, 17.6, 18.4, 0.0];
        for (a, b) in m.iter().zip(want) {
            assert!((a - b).abs() < 1e-12, "{m:?}");
        }
    }
}
