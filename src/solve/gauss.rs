//! Gauss–Legendre rules on [0, 1], and stable forms of the hyperbolic
//! expressions the catenary panels need.
//!
//! The abscissae and weights are the classical Gauss–Legendre ones
//! (Abramowitz & Stegun, *Handbook of Mathematical Functions*, 1964,
//! Table 25.4 — from memory), mapped from [−1, 1] to [0, 1]; the tests below
//! check that each rule integrates every polynomial up to degree 2n − 1
//! exactly, so a mistyped digit would show.

/// Five-point rule on [−1, 1]: abscissae ≥ 0 and their weights.
const X5: [f64; 3] = [0.0, 0.538_469_310_105_683_1, 0.906_179_845_938_664];
const W5: [f64; 3] = [0.568_888_888_888_888_9, 0.478_628_670_499_366_5, 0.236_926_885_056_189_1];

/// Eight-point rule on [−1, 1]: positive abscissae and their weights.
const X8: [f64; 4] = [0.183_434_642_495_649_8, 0.525_532_409_916_329, 0.796_666_477_413_626_7, 0.960_289_856_497_536_3];
const W8: [f64; 4] = [0.362_683_783_378_362, 0.313_706_645_877_887_3, 0.222_381_034_453_374_5, 0.101_228_536_290_376_3];

/// The five-point rule on [0, 1]: (abscissae ξᵢ, weights Wᵢ), Σ Wᵢ = 1.
pub(crate) fn rule5() -> ([f64; 5], [f64; 5]) {
    let x = [0.5 * (1.0 - X5[2]), 0.5 * (1.0 - X5[1]), 0.5, 0.5 * (1.0 + X5[1]), 0.5 * (1.0 + X5[2])];
    let w = [0.5 * W5[2], 0.5 * W5[1], 0.5 * W5[0], 0.5 * W5[1], 0.5 * W5[2]];
    (x, w)
}

/// The eight-point rule on [0, 1].
pub(crate) fn rule8() -> ([f64; 8], [f64; 8]) {
    let mut x = [0.0; 8];
    let mut w = [0.0; 8];
    for k in 0..4 {
        x[3 - k] = 0.5 * (1.0 - X8[k]);
        x[4 + k] = 0.5 * (1.0 + X8[k]);
        w[3 - k] = 0.5 * W8[k];
        w[4 + k] = 0.5 * W8[k];
    }
    (x, w)
}

/// The value at `t` ∈ [0, 1] of the polynomial of degree 4 taking the
/// values `g` at the five-point abscissae (Lagrange form; with five points
/// of small Lebesgue constant it is as accurate as the barycentric form).
pub(crate) fn interpolate5(g: &[f64; 5], t: f64) -> f64 {
    let (x, _) = rule5();
    let mut sum = 0.0;
    for j in 0..5 {
        let mut l = 1.0;
        for k in 0..5 {
            if k != j {
                l *= (t - x[k]) / (x[j] - x[k]);
            }
        }
        sum += g[j] * l;
    }
    sum
}

/// The integration matrix of the five-point collocation: row i gives
/// ∫₀^ξᵢ p(t) dt = Σⱼ S[i][j]·gⱼ for the interpolant p of the values gⱼ.
/// Each entry is a five-point quadrature of a Lagrange basis polynomial over
/// [0, ξᵢ], exact since the basis has degree 4. Computed once.
pub(crate) fn integration5() -> &'static [[f64; 5]; 5] {
    static S: std::sync::LazyLock<[[f64; 5]; 5]> = std::sync::LazyLock::new(build_integration5);
    &S
}

fn build_integration5() -> [[f64; 5]; 5] {
    let (x, w) = rule5();
    let mut s = [[0.0; 5]; 5];
    for (i, row) in s.iter_mut().enumerate() {
        for (j, entry) in row.iter_mut().enumerate() {
            let mut unit = [0.0; 5];
            unit[j] = 1.0;
            *entry = x[i] * (0..5).map(|k| w[k] * interpolate5(&unit, x[i] * x[k])).sum::<f64>();
        }
    }
    s
}

/// sinh d − d without cancellation (series below |d| = 1: terms to d²¹,
/// truncation under 1e-22 relative).
pub(crate) fn sinh_minus(d: f64) -> f64 {
    if d.abs() >= 1.0 {
        return d.sinh() - d;
    }
    let d2 = d * d;
    // d³/3! · (1 + d²/(4·5) (1 + d²/(6·7) (1 + …)))
    let mut acc = 1.0;
    for k in (2..=10).rev() {
        let n = (2 * k) as f64;
        acc = 1.0 + d2 / (n * (n + 1.0)) * acc;
    }
    d * d2 / 6.0 * acc
}

/// cosh d − 1 = 2 sinh²(d/2), without cancellation.
pub(crate) fn cosh_minus(d: f64) -> f64 {
    let s = (0.5 * d).sinh();
    2.0 * s * s
}

/// β·cosh β − sinh β without cancellation (series below |β| = 1:
/// Σₖ 2k·β^(2k+1)/(2k+1)!, terms to β²¹).
pub(crate) fn beta_cosh_minus_sinh(b: f64) -> f64 {
    if b.abs() >= 1.0 {
        return b * b.cosh() - b.sinh();
    }
    let b2 = b * b;
    // Term k: 2k·b^(2k+1)/(2k+1)!; ratio of term k+1 to term k:
    // (k+1)/k · b²/((2k+2)(2k+3)).
    let mut term = b * b2 / 3.0;
    let mut sum = term;
    for k in 1..10 {
        let kf = k as f64;
        term *= (kf + 1.0) / kf * b2 / ((2.0 * kf + 2.0) * (2.0 * kf + 3.0));
        sum += term;
    }
    sum
}

/// Neumaier's compensated sum (Neumaier, ZAMM 54, 1974 — from memory): a
/// running total whose error does not grow with the number of terms.
#[derive(Clone, Copy, Debug, Default)]
pub(crate) struct Sum {
    s: f64,
    c: f64,
}

impl Sum {
    /// Adds `v`.
    pub fn add(&mut self, v: f64) {
        let t = self.s + v;
        if self.s.abs() >= v.abs() {
            self.c += (self.s - t) + v;
        } else {
            self.c += (v - t) + self.s;
        }
        self.s = t;
    }

    /// The total.
    pub fn get(&self) -> f64 {
        self.s + self.c
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rules_are_exact_to_their_degree() {
        // ∫₀¹ t^k dt = 1/(k + 1), exact for k ≤ 2n − 1 (Gauss's theorem).
        let (x, w) = rule5();
        for k in 0..10 {
            let q: f64 = x.iter().zip(&w).map(|(t, wi)| wi * t.powi(k)).sum();
            assert!((q - 1.0 / (k as f64 + 1.0)).abs() < 2e-16, "5-point, degree {k}: {q}");
        }
        let (x, w) = rule8();
        for k in 0..16 {
            let q: f64 = x.iter().zip(&w).map(|(t, wi)| wi * t.powi(k)).sum();
            assert!((q - 1.0 / (k as f64 + 1.0)).abs() < 4e-16, "8-point, degree {k}: {q}");
        }
    }

    #[test]
    fn interpolation_and_integration_matrix() {
        // The interpolant of a quartic is the quartic; its integrals too.
        let p = |t: f64| 1.0 - 2.0 * t + 3.0 * t * t - 0.5 * t.powi(3) + 0.25 * t.powi(4);
        let pi = |t: f64| t - t * t + t.powi(3) - 0.125 * t.powi(4) + 0.05 * t.powi(5);
        let (x, _) = rule5();
        let g = x.map(p);
        for t in [0.0, 0.1, 0.37, 0.8, 1.0] {
            assert!((interpolate5(&g, t) - p(t)).abs() < 1e-14);
        }
        let s = integration5();
        for i in 0..5 {
            let v: f64 = (0..5).map(|j| s[i][j] * g[j]).sum();
            assert!((v - pi(x[i])).abs() < 1e-15, "{i}: {v} vs {}", pi(x[i]));
        }
    }

    #[test]
    fn stable_hyperbolics_match_the_direct_forms() {
        // The direct forms lose ~ε·(size of the cancelling terms); allow that.
        let e = 4.0 * f64::EPSILON;
        for d in [-3.0, -1.0, -0.999, -0.3, 0.02, 0.5, 0.999, 1.0, 2.5] {
            let f: f64 = d;
            let direct = f.sinh() - f;
            assert!((sinh_minus(f) - direct).abs() <= 1e-14 * direct.abs() + e * f.sinh().abs(), "{d}");
            let direct = f.cosh() - 1.0;
            assert!((cosh_minus(f) - direct).abs() <= 1e-14 * direct + e * f.cosh(), "{d}");
            let direct = f * f.cosh() - f.sinh();
            assert!((beta_cosh_minus_sinh(f) - direct).abs() <= 1e-14 * direct.abs() + e * (f * f.cosh()).abs(), "{d}");
        }
        // Small arguments against the series written out: d³/3! + d⁵/5! + d⁷/7! + d⁹/9!
        // and Σ 2k·β^(2k+1)/(2k+1)! = β³/3 + β⁵/30 + β⁷/840 + β⁹/45360 (Taylor).
        for d in [1e-6, 1e-3, 0.02, -0.05] {
            let f: f64 = d;
            let s = f.powi(3) / 6.0 + f.powi(5) / 120.0 + f.powi(7) / 5040.0 + f.powi(9) / 362_880.0;
            assert!((sinh_minus(f) - s).abs() <= 1e-15 * s.abs(), "{d}");
            let b = f.powi(3) / 3.0 + f.powi(5) / 30.0 + f.powi(7) / 840.0 + f.powi(9) / 45_360.0;
            assert!((beta_cosh_minus_sinh(f) - b).abs() <= 1e-15 * b.abs(), "{d}");
        }
    }

    #[test]
    fn compensated_sum_keeps_small_terms() {
        let mut s = Sum::default();
        s.add(1.0);
        for _ in 0..1000 {
            s.add(1e-17);
        }
        s.add(-1.0);
        // Summed naively the small terms vanish; compensated they keep all
        // but the round-off of their own sum.
        assert!((s.get() - 1e-14).abs() < 1e-26, "{}", s.get());
    }
}
