//! One-dimensional root finding and minimisation.
//!
//! * [`brent_zero`]: Brent's method — bisection safeguarding secant steps and
//!   inverse quadratic interpolation — after R. P. Brent, *Algorithms for
//!   Minimization without Derivatives*, Prentice-Hall, 1973, ch. 4. It never
//!   leaves its bracket and converges superlinearly on smooth functions.
//! * [`golden_min`]: golden-section search for the minimum of a unimodal
//!   function (Kiefer, "Sequential minimax search for a maximum", Proc. AMS 4,
//!   1953 — from memory; Brent 1973, ch. 5, uses it as the safe step).

/// A zero of `f` in `[a, b]`, given `f(a)` and `f(b)` of opposite signs (or
/// one of them zero), to within `tol` plus a few units of round-off.
pub(crate) fn brent_zero(f: impl Fn(f64) -> f64, a: f64, b: f64, fa: f64, fb: f64, tol: f64) -> f64 {
    let (mut a, mut b, mut fa, mut fb) = (a, b, fa, fb);
    if fa == 0.0 {
        return a;
    }
    // c is the other end of the bracket [b, c]; b is the best estimate so far.
    let (mut c, mut fc) = (a, fa);
    let (mut d, mut e) = (b - a, b - a);
    for _ in 0..200 {
        if (fb > 0.0) == (fc > 0.0) && fb != 0.0 {
            // b and c on the same side: the bracket is [a, b].
            c = a;
            fc = fa;
            d = b - a;
            e = d;
        }
        if fc.abs() < fb.abs() {
            a = b;
            b = c;
            c = a;
            fa = fb;
            fb = fc;
            fc = fa;
        }
        let tol1 = 2.0 * f64::EPSILON * b.abs() + 0.5 * tol;
        let xm = 0.5 * (c - b);
        if xm.abs() <= tol1 || fb == 0.0 {
            return b;
        }
        if e.abs() >= tol1 && fa.abs() > fb.abs() {
            // Try interpolation: secant when only two points differ, else
            // inverse quadratic through (a, fa), (b, fb), (c, fc).
            let s = fb / fa;
            let (mut p, mut q);
            if a == c {
                p = 2.0 * xm * s;
                q = 1.0 - s;
            } else {
                let qa = fa / fc;
                let r = fb / fc;
                p = s * (2.0 * xm * qa * (qa - r) - (b - a) * (r - 1.0));
                q = (qa - 1.0) * (r - 1.0) * (s - 1.0);
            }
            if p > 0.0 {
                q = -q;
            } else {
                p = -p;
            }
            // Accept the step only if it stays well inside the bracket and
            // shrinks faster than the step before last; else bisect.
            if 2.0 * p < (3.0 * xm * q - (tol1 * q).abs()).min((e * q).abs()) {
                e = d;
                d = p / q;
            } else {
                d = xm;
                e = d;
            }
        } else {
            d = xm;
            e = d;
        }
        a = b;
        fa = fb;
        b += if d.abs() > tol1 { d } else { tol1.copysign(xm) };
        fb = f(b);
    }
    b
}

/// The minimiser of a unimodal `f` on `[a, b]` by golden-section search, to
/// a relative width of about 1e-13 of the interval.
pub(crate) fn golden_min(f: impl Fn(f64) -> f64, a: f64, b: f64) -> f64 {
    // 1/φ, φ the golden ratio: each step keeps one interior point.
    const R: f64 = 0.618_033_988_749_894_9;
    let (mut a, mut b) = (a, b);
    let width0 = (b - a).abs();
    let mut x1 = b - R * (b - a);
    let mut x2 = a + R * (b - a);
    let (mut f1, mut f2) = (f(x1), f(x2));
    for _ in 0..200 {
        if (b - a).abs() <= 1e-13 * width0 {
            break;
        }
        if f1 <= f2 {
            b = x2;
            x2 = x1;
            f2 = f1;
            x1 = b - R * (b - a);
            f1 = f(x1);
        } else {
            a = x1;
            x1 = x2;
            f1 = f2;
            x2 = a + R * (b - a);
            f2 = f(x2);
        }
    }
    if f1 <= f2 { x1 } else { x2 }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn brent_finds_the_cube_root_of_two() {
        let f = |x: f64| x * x * x - 2.0;
        let r = brent_zero(f, 0.0, 2.0, f(0.0), f(2.0), 0.0);
        assert!((r - 2f64.cbrt()).abs() < 4.0 * f64::EPSILON, "{r}");
    }

    #[test]
    fn brent_on_a_kinked_function_and_a_root_at_an_end() {
        // A piecewise-linear function with a kink, like the largest force:
        // max(|x − 1|, |x + 1|/2) = 3 at x = 4 on [1, 10].
        let f = |x: f64| (x - 1.0).abs().max(0.5 * (x + 1.0).abs()) - 3.0;
        let r = brent_zero(f, 1.0, 10.0, f(1.0), f(10.0), 0.0);
        assert!((r - 4.0).abs() < 1e-14, "{r}");
        assert_eq!(brent_zero(f, 4.0, 10.0, 0.0, f(10.0), 0.0), 4.0);
    }

    #[test]
    fn golden_section_finds_a_kinked_minimum() {
        let f = |x: f64| (x - 0.3).abs() + 0.1 * x * x;
        let m = golden_min(f, -5.0, 5.0);
        assert!((m - 0.3).abs() < 1e-11, "{m}");
    }
}
