//! Anderson acceleration of a fixed-point iteration x ← G(x) (D. G. Anderson,
//! "Iterative procedures for nonlinear integral equations", J. ACM 12, 1965;
//! in the form of Walker & Ni, "Anderson acceleration for fixed-point
//! iterations", SIAM J. Numer. Anal. 49, 2011 — both from memory).
//!
//! With residuals fₖ = G(xₖ) − xₖ and the differences of the last m
//! iterates ΔXⱼ and residuals ΔFⱼ, γ minimises ‖fₖ − ΔF·γ‖₂ and the next
//! iterate is xₖ + fₖ − (ΔX + ΔF)·γ. The least-squares problem is solved by
//! modified Gram–Schmidt, dropping a column that is nearly dependent on the
//! others. Cost O(N·m²) per step for N unknowns.

use std::collections::VecDeque;

/// The acceleration's memory.
#[derive(Clone, Debug)]
pub(crate) struct Anderson {
    depth: usize,
    dx: VecDeque<Vec<f64>>,
    df: VecDeque<Vec<f64>>,
    last: Option<(Vec<f64>, Vec<f64>)>,
}

fn dot(a: &[f64], b: &[f64]) -> f64 {
    a.iter().zip(b).map(|(x, y)| x * y).sum()
}

impl Anderson {
    /// Remembers up to `depth` differences.
    pub fn new(depth: usize) -> Anderson {
        Anderson { depth, dx: VecDeque::new(), df: VecDeque::new(), last: None }
    }

    /// Forgets the history (after a step that went wrong).
    pub fn reset(&mut self) {
        self.dx.clear();
        self.df.clear();
        self.last = None;
    }

    /// The next iterate from `x` and `g` = G(x).
    pub fn next(&mut self, x: &[f64], g: &[f64]) -> Vec<f64> {
        let f: Vec<f64> = g.iter().zip(x).map(|(a, b)| a - b).collect();
        if let Some((xp, fp)) = self.last.take() {
            self.dx.push_back(x.iter().zip(&xp).map(|(a, b)| a - b).collect());
            self.df.push_back(f.iter().zip(&fp).map(|(a, b)| a - b).collect());
            if self.dx.len() > self.depth {
                self.dx.pop_front();
                self.df.pop_front();
            }
        }
        self.last = Some((x.to_vec(), f.clone()));
        if self.df.is_empty() {
            return g.to_vec();
        }
        // Modified Gram–Schmidt on the columns of ΔF (newest first, so an
        // old column is the one dropped when dependent).
        let mut q: Vec<Vec<f64>> = Vec::new();
        let mut r: Vec<Vec<f64>> = Vec::new();
        let mut kept: Vec<usize> = Vec::new();
        for j in (0..self.df.len()).rev() {
            let mut v = self.df[j].clone();
            let norm0 = dot(&v, &v).sqrt();
            let mut rj = Vec::with_capacity(q.len() + 1);
            for qi in &q {
                let c = dot(qi, &v);
                for (vk, qk) in v.iter_mut().zip(qi) {
                    *vk -= c * qk;
                }
                rj.push(c);
            }
            let norm = dot(&v, &v).sqrt();
            if !(norm > 1e-10 * norm0 && norm.is_finite()) {
                continue;
            }
            for vk in &mut v {
                *vk /= norm;
            }
            rj.push(norm);
            q.push(v);
            r.push(rj);
            kept.push(j);
        }
        if q.is_empty() {
            return g.to_vec();
        }
        // R γ = Qᵀ f, R upper triangular with column i in r[i].
        let rhs: Vec<f64> = q.iter().map(|qi| dot(qi, &f)).collect();
        let m = q.len();
        let mut gamma = vec![0.0; m];
        for i in (0..m).rev() {
            let mut s = rhs[i];
            for k in i + 1..m {
                s -= r[k][i] * gamma[k];
            }
            gamma[i] = s / r[i][i];
        }
        let mut out = g.to_vec();
        for (gi, &j) in gamma.iter().zip(&kept) {
            for ((o, a), b) in out.iter_mut().zip(&self.dx[j]).zip(&self.df[j]) {
                *o -= gi * (a + b);
            }
        }
        if out.iter().all(|v| v.is_finite()) { out } else { g.to_vec() }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn accelerates_a_diverging_linear_map() {
        // x ← A·x + b with A having an eigenvalue −1.5: plain iteration
        // diverges; Anderson acceleration solves the 3-dimensional linear
        // problem in a few steps (it is then a Krylov method). Invented map.
        let g = |x: &[f64]| vec![-1.5 * x[0] + 1.0, 0.5 * x[1] + 0.2 * x[0], 0.9 * x[2] - 0.3];
        let mut acc = Anderson::new(5);
        let mut x = vec![0.0, 0.0, 0.0];
        for _ in 0..12 {
            let gx = g(&x);
            x = acc.next(&x, &gx);
        }
        let want = [0.4, 0.16, -3.0];
        for (a, b) in x.iter().zip(want) {
            assert!((a - b).abs() < 1e-10, "{x:?}");
        }
    }
}
