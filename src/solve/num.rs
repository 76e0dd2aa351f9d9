//! A scalar the construction can run on: plain `f64`, or a dual number that
//! carries the derivatives with respect to the three parameters
//! (Oₓ, O_y, y_L) alongside the value (forward-mode automatic
//! differentiation; Wengert, "A simple automatic derivative evaluation
//! program", Comm. ACM 7, 1964 — from memory).
//!
//! Running the one construction on duals gives Newton's method the exact
//! Jacobian of the constructed polygon, with no finite-difference step to tune.

use std::ops::{Add, Div, Mul, Neg, Sub};

/// What the construction needs of a number.
pub(crate) trait Num:
    Copy + Add<Output = Self> + Sub<Output = Self> + Mul<Output = Self> + Div<Output = Self> + Neg<Output = Self>
{
    /// A constant (zero derivatives).
    fn c(v: f64) -> Self;
    /// The value, without derivatives.
    fn v(self) -> f64;
    /// Square root.
    fn root(self) -> Self;
}

impl Num for f64 {
    fn c(v: f64) -> f64 {
        v
    }
    fn v(self) -> f64 {
        self
    }
    fn root(self) -> f64 {
        self.sqrt()
    }
}

/// A value with its gradient with respect to the three parameters.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Dual {
    /// The value.
    pub v: f64,
    /// ∂/∂Oₓ, ∂/∂O_y, ∂/∂y_L.
    pub d: [f64; 3],
}

impl Dual {
    /// The `i`-th parameter itself, with value `v`.
    pub fn var(v: f64, i: usize) -> Dual {
        let mut d = [0.0; 3];
        d[i] = 1.0;
        Dual { v, d }
    }

    fn map(self, o: Dual, f: impl Fn(f64, f64) -> f64) -> [f64; 3] {
        [f(self.d[0], o.d[0]), f(self.d[1], o.d[1]), f(self.d[2], o.d[2])]
    }
}

impl Add for Dual {
    type Output = Dual;
    fn add(self, o: Dual) -> Dual {
        Dual { v: self.v + o.v, d: self.map(o, |a, b| a + b) }
    }
}

impl Sub for Dual {
    type Output = Dual;
    fn sub(self, o: Dual) -> Dual {
        Dual { v: self.v - o.v, d: self.map(o, |a, b| a - b) }
    }
}

impl Mul for Dual {
    type Output = Dual;
    // The product rule: d(xy) = dx·y + x·dy.
    #[allow(clippy::suspicious_arithmetic_impl)]
    fn mul(self, o: Dual) -> Dual {
        let (x, y) = (self.v, o.v);
        Dual { v: x * y, d: self.map(o, |a, b| a * y + x * b) }
    }
}

impl Div for Dual {
    type Output = Dual;
    // The quotient rule: d(x/y) = (dx − (x/y)·dy)/y.
    #[allow(clippy::suspicious_arithmetic_impl)]
    fn div(self, o: Dual) -> Dual {
        let q = self.v / o.v;
        Dual { v: q, d: self.map(o, |a, b| (a - q * b) / o.v) }
    }
}

impl Neg for Dual {
    type Output = Dual;
    fn neg(self) -> Dual {
        Dual { v: -self.v, d: [-self.d[0], -self.d[1], -self.d[2]] }
    }
}

impl Num for Dual {
    fn c(v: f64) -> Dual {
        Dual { v, d: [0.0; 3] }
    }
    fn v(self) -> f64 {
        self.v
    }
    fn root(self) -> Dual {
        let r = self.v.sqrt();
        // d√x = dx / (2√x); at x = 0 the derivative is infinite, and the
        // callers only take roots of sums containing Oₓ² > 0.
        let k = if r > 0.0 { 0.5 / r } else { 0.0 };
        Dual { v: r, d: [self.d[0] * k, self.d[1] * k, self.d[2] * k] }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn derivatives_of_a_quotient_and_a_root() {
        // f(x, y) = √(x² + y²) / y at (3, 4): ∂f/∂x = x / (r y) = 3/20,
        // ∂f/∂y = y/(r y) − r/y² = 1/5 − 5/16 (calculus, common practice, no source).
        let x = Dual::var(3.0, 0);
        let y = Dual::var(4.0, 1);
        let f = (x * x + y * y).root() / y;
        assert!((f.v - 1.25).abs() < 1e-15);
        assert!((f.d[0] - 0.15).abs() < 1e-15);
        assert!((f.d[1] - (0.2 - 5.0 / 16.0)).abs() < 1e-15);
        assert_eq!(f.d[2], 0.0);
    }
}
