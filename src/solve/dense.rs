//! A 3 × 3 linear solve by Gaussian elimination with partial pivoting
//! (Golub & Van Loan, *Matrix Computations*, §3.4 — from memory).

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
}
