//! A 3 × 3 linear solve by Gaussian elimination with partial pivoting
//! (Golub & Van Loan, *Matrix Computations*, §3.4 — from memory), and a
//! small linear least-squares solve by Householder QR (ibid., §5.3.3 —
//! from memory).

/// A pivot smaller than this times the matrix's largest entry counts as zero.
/// The solver's systems are scaled so their entries are of order one.
pub(crate) const SINGULAR: f64 = 1e-12;

/// Solves `a·z = b`, or `None` when `a` is singular to working precision.
pub(crate) fn solve3(mut a: [[f64; 3]; 3], mut b: [f64; 3]) -> Option<[f64; 3]> {
    let big = a.iter().flatten().fold(0.0_f64, |m, v| m.max(v.abs()));
    if !(big > 0.0 && big.is_finite()) {
        return None;
    }
    for col in 0..3 {
        let piv = (col..3).max_by(|&i, &j| a[i][col].abs().total_cmp(&a[j][col].abs()))?;
        if a[piv][col].is_nan() || a[piv][col].abs() <= SINGULAR * big {
            return None;
        }
        a.swap(col, piv);
        b.swap(col, piv);
        let pivot = a[col];
        for row in col + 1..3 {
            let m = a[row][col] / pivot[col];
            for (v, p) in a[row].iter_mut().zip(pivot).skip(col) {
                *v -= m * p;
            }
            b[row] -= m * b[col];
        }
    }
    let mut z = [0.0; 3];
    for row in (0..3).rev() {
        let tail: f64 = (row + 1..3).map(|k| a[row][k] * z[k]).sum();
        z[row] = (b[row] - tail) / a[row][row];
    }
    Some(z)
}

/// Least squares: the `z` minimising ‖Σⱼ zⱼ·colsⱼ − rhs‖₂ for a few
/// columns (m ≤ rows), by Householder QR — no normal equations, so the
/// condition number is not squared. `None` when the columns are dependent
/// to working precision (a diagonal entry of R below [`SINGULAR`] times the
/// largest column norm).
pub(crate) fn least_squares(cols: &[Vec<f64>], rhs: &[f64]) -> Option<Vec<f64>> {
    let m = cols.len();
    let n = rhs.len();
    if m == 0 {
        return Some(Vec::new());
    }
    if n < m || cols.iter().any(|c| c.len() != n) {
        return None;
    }
    let mut a: Vec<Vec<f64>> = cols.to_vec();
    let mut b = rhs.to_vec();
    let big = a.iter().map(|c| c.iter().map(|v| v * v).sum::<f64>().sqrt()).fold(0.0, f64::max);
    if !(big > 0.0 && big.is_finite()) {
        return None;
    }
    let mut diag = vec![0.0; m];
    for k in 0..m {
        // Reflect column k's rows k.. onto −sign·‖·‖·e_k.
        let norm = a[k][k..].iter().map(|v| v * v).sum::<f64>().sqrt();
        if norm.is_nan() || norm <= SINGULAR * big {
            return None;
        }
        let alpha = if a[k][k] > 0.0 { -norm } else { norm };
        let mut v: Vec<f64> = a[k][k..].to_vec();
        v[0] -= alpha;
        let vv: f64 = v.iter().map(|x| x * x).sum();
        diag[k] = alpha;
        let reflect = |col: &mut [f64]| {
            let d: f64 = col.iter().zip(&v).map(|(c, v)| c * v).sum::<f64>() * 2.0 / vv;
            for (c, v) in col.iter_mut().zip(&v) {
                *c -= d * v;
            }
        };
        for col in a.iter_mut().skip(k + 1) {
            reflect(&mut col[k..]);
        }
        reflect(&mut b[k..]);
    }
    let mut z = vec![0.0; m];
    for k in (0..m).rev() {
        let tail: f64 = (k + 1..m).map(|j| a[j][k] * z[j]).sum();
        z[k] = (b[k] - tail) / diag[k];
    }
    z.iter().all(|v| v.is_finite()).then_some(z)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn solves_and_detects_singular() {
        // Invented system with solution (1, 2, 3); needs a row swap.
        let z = solve3([[0.0, 1.0, 1.0], [2.0, 0.0, 1.0], [1.0, 1.0, 0.0]], [5.0, 5.0, 3.0]).unwrap();
        assert!((z[0] - 1.0).abs() < 1e-15 && (z[1] - 2.0).abs() < 1e-15 && (z[2] - 3.0).abs() < 1e-15);
        assert!(solve3([[1.0, 2.0, 3.0], [2.0, 4.0, 6.0], [0.0, 0.0, 1.0]], [1.0, 2.0, 3.0]).is_none());
    }

    #[test]
    fn least_squares_fits_a_line() {
        // Points (0, 1), (1, 3), (2, 4), (3, 4): the normal equations by hand
        // (common practice, no source) give slope 1.0 and intercept 1.5.
        let ones = vec![1.0; 4];
        let xs = vec![0.0, 1.0, 2.0, 3.0];
        let z = least_squares(&[ones.clone(), xs.clone()], &[1.0, 3.0, 4.0, 4.0]).unwrap();
        assert!((z[0] - 1.5).abs() < 1e-14 && (z[1] - 1.0).abs() < 1e-14, "{z:?}");
        assert!(least_squares(&[ones.clone(), ones], &[1.0, 3.0, 4.0, 4.0]).is_none());
        assert!(least_squares(&[xs.clone(), xs.clone(), xs], &[1.0, 2.0]).is_none());
    }
}
