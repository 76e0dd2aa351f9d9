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
}
