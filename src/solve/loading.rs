//! The continuous vertical load on the span, in local x (0 at the left
//! support, `span` at the right), and everything the solver needs of it in
//! closed form: the cumulative load C(x), its integral F(x) = ∫₀ˣ C, the
//! simple-beam moment M(x) = x·F(L)/L − F(x), the largest moment and where
//! the shear vanishes, the lever-rule split of a panel's load, and the
//! length of the funicular y = y_L + v·x + u·F(x).
//!
//! The span is cut at breakpoints (the supports, point loads, the ends of
//! the distributed loads, and with self-weight every panel point) into
//! cells; within a cell the load (downward, per horizontal length) is
//!
//! * a linear external part w₀ → w₁ (a trapezoid; zero in a gap), plus
//! * a self-weight part ([`Own`]): none; the self-weight of a catenary
//!   segment, q·cosh(z + (x − x_mid)/a) with a = Oₓ/q (the exact weight of a
//!   cable of weight q per length whose shape in the cell is a catenary); or
//!   the polynomial of degree 4 through samples at the five Gauss–Legendre
//!   points of the cell (five-point Gauss collocation of y'' = u·g(y'),
//!   the 5-stage Gauss Runge–Kutta method, of order 10 at the cell ends —
//!   Hairer, Nørsett & Wanner, *Solving Ordinary Differential Equations I*,
//!   §II.7 — from memory).
//!
//! Every integral of a cell is in closed form (trapezoid and catenary) or
//! exact for the polynomial (Gauss–Legendre quadrature of degree ≥ that of
//! the integrand), so C, F and the lever-rule splits carry no discretisation
//! error beyond that of the model itself. Point loads act at breakpoints,
//! where C jumps; F is continuous. Sums along the span are compensated
//! ([`Sum`]) so 20 000 cells lose no more than a few units of round-off.

use super::gauss::{Sum, beta_cosh_minus_sinh, cosh_minus, integration5, interpolate5, rule5, rule8, sinh_minus};
use super::roots::brent_zero;

/// A distributed load in local x: linear from `w0` at `x0` to `w1` at `x1`.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Stretch {
    /// Start.
    pub x0: f64,
    /// End (> `x0`).
    pub x1: f64,
    /// Intensity at `x0`.
    pub w0: f64,
    /// Intensity at `x1`.
    pub w1: f64,
}

impl Stretch {
    /// Intensity at `x` (exact at the ends).
    pub fn at(&self, x: f64) -> f64 {
        if x == self.x0 {
            self.w0
        } else if x == self.x1 {
            self.w1
        } else {
            self.w0 + (self.w1 - self.w0) * ((x - self.x0) / (self.x1 - self.x0))
        }
    }
}

/// The self-weight part of a cell's load.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) enum Own {
    /// None.
    None,
    /// q·cosh(z + (x − x_mid)/a) per horizontal length, sinh z = `sigma`:
    /// the weight of a catenary segment of parameter a (the loading's `a`).
    Catenary {
        /// sinh z: the catenary's slope at the cell's midpoint.
        sigma: f64,
    },
    /// Intensities at the cell's five Gauss–Legendre points (force per
    /// horizontal length); between them the polynomial of degree 4.
    Samples([f64; 5]),
}

/// One cell: the load between two consecutive breakpoints.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Cell {
    /// External intensity at the left end.
    pub w0: f64,
    /// External intensity at the right end.
    pub w1: f64,
    /// Self-weight.
    pub own: Own,
}

/// The load on the whole span, with its running integrals.
#[derive(Clone, Debug)]
pub(crate) struct Loading {
    /// Span.
    pub span: f64,
    /// Self-weight per unit length (0 without).
    pub q: f64,
    /// Catenary parameter a = Oₓ/q of the catenary cells (signed: negative
    /// for an arch; unused without them).
    pub a: f64,
    /// Breakpoints, sorted: 0, …, span.
    pub xs: Vec<f64>,
    /// Point load (downward positive) at each breakpoint.
    pub jumps: Vec<f64>,
    /// One cell between each two breakpoints.
    pub cells: Vec<Cell>,
    /// Load of each cell.
    pub totals: Vec<f64>,
    /// Lever-rule share of each cell's load at its left end.
    pub lefts: Vec<f64>,
    /// C just right of each breakpoint (after its point load).
    pub c_right: Vec<f64>,
    /// F at each breakpoint.
    pub f: Vec<f64>,
    /// Total load (net, downward positive).
    pub total: f64,
    /// Σ|point loads| + Σ cell loads: the scale of the forces (> 0 when
    /// anything is loaded).
    pub scale: f64,
}

/// Sorted, de-duplicated breakpoints: 0, `span`, and every x of `extra`
/// inside the span.
pub(crate) fn breakpoints(span: f64, extra: impl IntoIterator<Item = f64>) -> Vec<f64> {
    let mut xs: Vec<f64> = std::iter::once(0.0)
        .chain(extra.into_iter().filter(|x| *x > 0.0 && *x < span))
        .chain(std::iter::once(span))
        .collect();
    xs.sort_by(f64::total_cmp);
    xs.dedup();
    xs
}

impl Loading {
    /// The loading with breakpoints `xs` (from [`breakpoints`], holding every
    /// point-load x and stretch end), point loads `points` (local x, downward
    /// W), distributed `stretches` (sorted, not overlapping) plus a uniform
    /// `extra` intensity everywhere, and the self-weight of cell i `own(i)`.
    pub fn new(
        span: f64,
        xs: Vec<f64>,
        points: &[(f64, f64)],
        stretches: &[Stretch],
        extra: f64,
        (q, a): (f64, f64),
        own: impl Fn(usize) -> Own,
    ) -> Loading {
        let n = xs.len().saturating_sub(1);
        let mut jumps = vec![0.0; xs.len()];
        for &(x, w) in points {
            let i = xs.partition_point(|&b| b < x);
            if let Some(j) = jumps.get_mut(i) {
                *j += w;
            }
        }
        let mut cells = Vec::with_capacity(n);
        let mut k = 0;
        for i in 0..n {
            let (xa, xb) = (xs[i], xs[i + 1]);
            while k < stretches.len() && stretches[k].x1 <= xa {
                k += 1;
            }
            let (w0, w1) = match stretches.get(k) {
                Some(s) if s.x0 <= xa && xb <= s.x1 => (s.at(xa), s.at(xb)),
                _ => (0.0, 0.0),
            };
            cells.push(Cell { w0: w0 + extra, w1: w1 + extra, own: own(i) });
        }
        Loading::from_cells(span, (q, a), xs, jumps, cells)
    }

    /// The loading of given cells and point loads at the breakpoints.
    pub fn from_cells(span: f64, (q, a): (f64, f64), xs: Vec<f64>, jumps: Vec<f64>, cells: Vec<Cell>) -> Loading {
        let n = cells.len();
        let mut l = Loading {
            span,
            q,
            a,
            xs,
            jumps,
            cells,
            totals: Vec::with_capacity(n),
            lefts: Vec::with_capacity(n),
            c_right: Vec::with_capacity(n + 1),
            f: Vec::with_capacity(n + 1),
            total: 0.0,
            scale: 0.0,
        };
        for i in 0..n {
            let (t, left) = l.whole(i);
            l.totals.push(t);
            l.lefts.push(left);
        }
        let (mut c, mut f, mut scale) = (Sum::default(), Sum::default(), Sum::default());
        for i in 0..n {
            c.add(l.jumps[i]);
            scale.add(l.jumps[i].abs());
            l.c_right.push(c.get());
            l.f.push(f.get());
            let h = l.h(i);
            // F(x_{i+1}) = F(x_i) + C_i·h + ∫(x_{i+1} − ξ)w dξ, the last being h·(left share).
            f.add(l.c_right[i] * h);
            f.add(h * l.lefts[i]);
            c.add(l.totals[i]);
            scale.add(l.totals[i].abs());
        }
        let last = l.jumps.last().copied().unwrap_or(0.0);
        c.add(last);
        scale.add(last.abs());
        l.c_right.push(c.get());
        l.f.push(f.get());
        l.total = c.get();
        l.scale = scale.get();
        l
    }

    /// Width of cell i.
    pub fn h(&self, i: usize) -> f64 {
        self.xs[i + 1] - self.xs[i]
    }

    /// F at the right support.
    pub fn f_last(&self) -> f64 {
        self.f.last().copied().unwrap_or(0.0)
    }

    /// The catenary cell's sinh z₀ and cosh z₀ at its left end, z₀ = z − h/(2a).
    fn cat_ends(&self, i: usize, sigma: f64) -> (f64, f64) {
        let z0 = sigma.asinh() - self.h(i) / (2.0 * self.a);
        (z0.sinh(), z0.cosh())
    }

    /// Load of cell i and its left share, in closed form.
    fn whole(&self, i: usize) -> (f64, f64) {
        let h = self.h(i);
        let c = &self.cells[i];
        let mut total = 0.5 * h * (c.w0 + c.w1);
        let mut left = h * (2.0 * c.w0 + c.w1) / 6.0;
        match c.own {
            Own::None => {}
            Own::Catenary { sigma } => {
                let (q, a) = (self.q, self.a);
                let b = h / (2.0 * a);
                let zeta = sigma.hypot(1.0);
                // ∫ q cosh(z + t/a) dt over [−h/2, h/2] = 2qa·cosh z·sinh β;
                // first moment about the middle 2qa²·sinh z·(β cosh β − sinh β).
                let p = 2.0 * q * a * zeta * b.sinh();
                total += p;
                left += 0.5 * p - q * a * sigma * beta_cosh_minus_sinh(b) / b;
            }
            Own::Samples(g) => {
                let (x, w) = rule5();
                for k in 0..5 {
                    total += h * w[k] * g[k];
                    left += h * w[k] * (1.0 - x[k]) * g[k];
                }
            }
        }
        (total, left)
    }

    /// ∫₀^τ of cell i's self-weight, and ∫₀^τ (τ − ξ)·(that) dξ.
    fn own_integrals(&self, i: usize, tau: f64) -> (f64, f64) {
        match self.cells[i].own {
            Own::None => (0.0, 0.0),
            Own::Catenary { sigma } => {
                let (q, a) = (self.q, self.a);
                let (sh, ch) = self.cat_ends(i, sigma);
                let d = tau / a;
                let cm = cosh_minus(d);
                (q * a * (sh * cm + ch * d.sinh()), q * a * a * (ch * cm + sh * sinh_minus(d)))
            }
            Own::Samples(g) => {
                let h = self.h(i);
                let (x, w) = rule5();
                let (mut cum, mut mom) = (0.0, 0.0);
                for k in 0..5 {
                    let p = interpolate5(&g, tau / h * x[k]);
                    cum += w[k] * p;
                    mom += w[k] * (1.0 - x[k]) * p;
                }
                (tau * cum, tau * tau * mom)
            }
        }
    }

    /// ∫₀^τ w and ∫₀^τ (τ − ξ) w dξ over cell i, τ from its left end.
    pub fn integrals(&self, i: usize, tau: f64) -> (f64, f64) {
        let c = &self.cells[i];
        let k = (c.w1 - c.w0) / self.h(i);
        let (oc, om) = self.own_integrals(i, tau);
        (c.w0 * tau + 0.5 * k * tau * tau + oc, 0.5 * c.w0 * tau * tau + k * tau * tau * tau / 6.0 + om)
    }

    /// The intensity of cell i at τ from its left end.
    #[cfg(test)]
    pub fn intensity(&self, i: usize, tau: f64) -> f64 {
        let c = &self.cells[i];
        let lin = c.w0 + (c.w1 - c.w0) * (tau / self.h(i));
        lin + match c.own {
            Own::None => 0.0,
            Own::Catenary { sigma } => {
                let (sh, ch) = self.cat_ends(i, sigma);
                let d = tau / self.a;
                self.q * (ch * d.cosh() + sh * d.sinh())
            }
            Own::Samples(g) => interpolate5(&g, tau / self.h(i)),
        }
    }

    /// The cell holding x and x's distance from its left end.
    pub fn locate(&self, x: f64) -> (usize, f64) {
        let n = self.cells.len();
        let i = self.xs.partition_point(|&b| b <= x).saturating_sub(1).min(n.saturating_sub(1));
        (i, x - self.xs[i])
    }

    /// C just right of x (a point load at x included).
    pub fn c_at(&self, x: f64) -> f64 {
        if x >= self.span {
            return self.total;
        }
        let (i, tau) = self.locate(x);
        if tau <= 0.0 {
            return self.c_right[i];
        }
        self.c_right[i] + self.integrals(i, tau).0
    }

    /// C just left of x (a point load at x left out).
    pub fn c_left(&self, x: f64) -> f64 {
        if x >= self.span {
            return self.total - self.jumps.last().copied().unwrap_or(0.0);
        }
        let (i, tau) = self.locate(x);
        if tau <= 0.0 {
            return self.c_right[i] - self.jumps[i];
        }
        self.c_right[i] + self.integrals(i, tau).0
    }

    /// F(x) = ∫₀ˣ C.
    pub fn f_at(&self, x: f64) -> f64 {
        if x >= self.span {
            return self.f_last();
        }
        let (i, tau) = self.locate(x);
        if tau <= 0.0 {
            return self.f[i];
        }
        self.f[i] + self.c_right[i] * tau + self.integrals(i, tau).1
    }

    /// The simple-beam moment M(x) = x·F(L)/L − F(x).
    pub fn moment(&self, x: f64) -> f64 {
        x * (self.f_last() / self.span) - self.f_at(x)
    }

    /// Where in cell i the cumulative load from its left end reaches `r`
    /// (0 < r < the cell's load; the intensity is ≥ 0, so it is monotone).
    fn reach(&self, i: usize, r: f64) -> f64 {
        let h = self.h(i);
        let c = &self.cells[i];
        let k = (c.w1 - c.w0) / h;
        let tau = match c.own {
            // w₀τ + kτ²/2 = r, the root of the stable form (no cancellation).
            Own::None if k == 0.0 => r / c.w0,
            Own::None => 2.0 * r / (c.w0 + (c.w0 * c.w0 + 2.0 * k * r).max(0.0).sqrt()),
            // qa(sinh(z₀ + τ/a) − sinh z₀) = r.
            Own::Catenary { sigma } if c.w0 == 0.0 && c.w1 == 0.0 => {
                let (sh, _) = self.cat_ends(i, sigma);
                let z0 = sigma.asinh() - h / (2.0 * self.a);
                self.a * ((sh + r / (self.q * self.a)).asinh() - z0)
            }
            _ => {
                let g = |t: f64| self.integrals(i, t).0 - r;
                brent_zero(g, 0.0, h, -r, self.totals[i] - r, 0.0)
            }
        };
        if tau.is_finite() { tau.clamp(0.0, h) } else { 0.5 * h }
    }

    /// The largest simple-beam moment (≥ 0) and its x: the greatest of M at
    /// the breakpoints and at each zero of the shear F(L)/L − C(x) inside a
    /// cell (C is monotone within a cell, so there is at most one).
    pub fn m_max(&self) -> (f64, f64) {
        let r = self.f_last() / self.span;
        let mut best = (0.0, 0.0);
        for (x, f) in self.xs.iter().zip(&self.f) {
            let m = x * r - f;
            if m > best.1 {
                best = (*x, m);
            }
        }
        for i in 0..self.cells.len() {
            let v0 = r - self.c_right[i];
            let v1 = v0 - self.totals[i];
            if v0 > 0.0 && v1 < 0.0 {
                let x = self.xs[i] + self.reach(i, v0);
                let m = self.moment(x);
                if m > best.1 {
                    best = (x, m);
                }
            }
        }
        best
    }

    /// The least and largest values of C over the span, with their x: at
    /// breakpoints, either side of a point load (C is monotone within cells).
    pub fn c_extremes(&self) -> ((f64, f64), (f64, f64)) {
        let mut lo = (0.0, 0.0);
        let mut hi = (0.0, 0.0);
        for (k, x) in self.xs.iter().enumerate() {
            let right = self.c_right[k];
            for c in [right - self.jumps[k], right] {
                if c < lo.0 {
                    lo = (c, *x);
                }
                if c > hi.0 {
                    hi = (c, *x);
                }
            }
        }
        (lo, hi)
    }

    /// The lever-rule shares (left end, right end) of the load between τa
    /// and τb in cell i.
    pub fn shares(&self, i: usize, ta: f64, tb: f64) -> (f64, f64) {
        let h = self.h(i);
        if ta <= 0.0 && tb >= h {
            return (self.lefts[i], self.totals[i] - self.lefts[i]);
        }
        let c = &self.cells[i];
        let hp = tb - ta;
        let (wa, wb) = (c.w0 + (c.w1 - c.w0) * (ta / h), c.w0 + (c.w1 - c.w0) * (tb / h));
        let (mut left, mut right) = (hp * (2.0 * wa + wb) / 6.0, hp * (wa + 2.0 * wb) / 6.0);
        if c.own != Own::None {
            let ((ca, ma), (cb, mb)) = (self.own_integrals(i, ta), self.own_integrals(i, tb));
            let p = cb - ca;
            // ∫ (τb − ξ) w dξ over [τa, τb].
            let m = mb - ma - ca * hp;
            left += m / hp;
            right += p - m / hp;
        }
        (left, right)
    }

    /// The profile's slope y' = v + u·C at the five Gauss points of cell i,
    /// C from this loading.
    pub fn slopes5(&self, i: usize, v: f64, u: f64) -> [f64; 5] {
        let h = self.h(i);
        let c = &self.cells[i];
        let (x, _) = rule5();
        let own: [f64; 5] = match c.own {
            Own::Samples(g) => {
                let s = integration5();
                let mut out = [0.0; 5];
                for (o, row) in out.iter_mut().zip(s) {
                    *o = h * row.iter().zip(&g).map(|(a, b)| a * b).sum::<f64>();
                }
                out
            }
            _ => x.map(|t| self.own_integrals(i, t * h).0),
        };
        let k = (c.w1 - c.w0) / h;
        let mut out = [0.0; 5];
        for j in 0..5 {
            let t = x[j] * h;
            out[j] = v + u * (self.c_right[i] + c.w0 * t + 0.5 * k * t * t + own[j]);
        }
        out
    }

    /// Length of the profile y = y_L + v·x + u·F(x) and, with an axial
    /// stiffness `ea` and horizontal force `ox` (signed: tension > 0), its
    /// unstressed length ∫ ds/(1 + T/EA), T = Oₓ·√(1 + y'²).
    ///
    /// The length is the chord plus ∫ (√(1 + y'²) − √(1 + c²)) dx, c the
    /// chord's slope, the difference written as (y' − c)(y' + c)/(√(1 + y'²) +
    /// √(1 + c²)) with y' − c = −u·(F(L)/L − C): no cancellation, so a
    /// profile barely longer than its chord is measured to full precision.
    /// Eight-point Gauss–Legendre on sub-intervals of each cell across which
    /// y' changes by at most a quarter of max(1, |y'|): the integrands are
    /// analytic with their nearest singularities (y' = ±i) at least four
    /// sub-interval half-widths away, so the rule's error is below 1e-16
    /// relative (Trefethen, *Approximation Theory and Approximation
    /// Practice*, 2013, ch. 19 — from memory).
    pub fn lengths(&self, v: f64, u: f64, ox: f64, ea: Option<f64>) -> (f64, f64) {
        let r = self.f_last() / self.span;
        let c = v + u * r;
        let root_c = c.hypot(1.0);
        let (x8, w8) = rule8();
        let (mut excess, mut unstressed) = (Sum::default(), Sum::default());
        for i in 0..self.cells.len() {
            let h = self.h(i);
            let s0 = v + u * self.c_right[i];
            let s1 = s0 + u * self.totals[i];
            let slow = if s0 * s1 <= 0.0 { 0.0 } else { s0.abs().min(s1.abs()) };
            let pieces = ((s1 - s0).abs() / (0.25 * slow.max(1.0))).ceil().clamp(1.0, 4096.0) as usize;
            let hp = h / pieces as f64;
            for p in 0..pieces {
                let ta = p as f64 * hp;
                for k in 0..8 {
                    let t = ta + x8[k] * hp;
                    let cum = if self.totals[i] == 0.0 { 0.0 } else { self.integrals(i, t).0 };
                    let d = -u * (r - self.c_right[i] - cum);
                    let yp = c + d;
                    let root = yp.hypot(1.0);
                    excess.add(w8[k] * hp * d * (yp + c) / (root + root_c));
                    if let Some(ea) = ea {
                        unstressed.add(w8[k] * hp * root / (1.0 + ox * root / ea));
                    }
                }
            }
        }
        (self.span * root_c + excess.get(), unstressed.get())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn uniform(span: f64, w: f64) -> Loading {
        let s = [Stretch { x0: 0.0, x1: span, w0: w, w1: w }];
        Loading::new(span, breakpoints(span, []), &[], &s, 0.0, (0.0, 1.0), |_| Own::None)
    }

    #[test]
    fn uniform_load_moments() {
        // Simple beam, uniform w: M(x) = w·x(L − x)/2, largest wL²/8 at L/2
        // (statics, common practice, no source). Invented: L = 12, w = 3.
        let l = uniform(12.0, 3.0);
        assert_eq!(l.total, 36.0);
        assert_eq!(l.m_max(), (6.0, 54.0));
        for x in [0.0, 1.5, 7.25, 12.0] {
            assert!((l.moment(x) - 1.5 * x * (12.0 - x)).abs() < 1e-13, "{x}");
            assert!((l.c_at(x) - 3.0 * x).abs() < 1e-14);
        }
    }

    #[test]
    fn triangle_zero_shear_and_shares() {
        // A triangle 0 → w over L: R_A = wL/6, zero shear at x = L/√3,
        // M_max = wL²/(9√3) (statics, common practice, no source).
        let s = [Stretch { x0: 0.0, x1: 9.0, w0: 0.0, w1: 4.0 }];
        let l = Loading::new(9.0, breakpoints(9.0, [3.0]), &[], &s, 0.0, (0.0, 1.0), |_| Own::None);
        let (x, m) = l.m_max();
        assert!((x - 9.0 / 3f64.sqrt()).abs() < 1e-14, "{x}");
        assert!((m - 4.0 * 81.0 / (9.0 * 3f64.sqrt())).abs() < 1e-13, "{m}");
        // Shares of the part from 3 to 9 (intensities 4/3 → 4): h(2wa + wb)/6.
        let (a, b) = l.shares(1, 0.0, 6.0);
        assert!((a - 6.0 * (8.0 / 3.0 + 4.0) / 6.0).abs() < 1e-14 && (b - 6.0 * (4.0 / 3.0 + 8.0) / 6.0).abs() < 1e-14);
    }

    #[test]
    fn catenary_cell_matches_direct_integrals() {
        // One catenary cell q·cosh(z + t/a) against sums by the midpoint rule
        // on 200 000 steps (invented: q = 2, a = 3, h = 4, sinh z = 0.7).
        let (q, a, h, sigma) = (2.0f64, 3.0f64, 4.0f64, 0.7f64);
        let cells = vec![Cell { w0: 0.0, w1: 0.0, own: Own::Catenary { sigma } }];
        let l = Loading::from_cells(h, (q, a), vec![0.0, h], vec![0.0, 0.0], cells);
        let z = sigma.asinh();
        let n = 200_000;
        let dt = h / n as f64;
        let (mut p, mut m, mut cum_half, mut mom_half) = (0.0, 0.0, 0.0, 0.0);
        for k in 0..n {
            let t = (k as f64 + 0.5) * dt;
            let g = q * (z + (t - h / 2.0) / a).cosh();
            p += g * dt;
            m += (h - t) * g * dt;
            if t < 1.3 {
                cum_half += g * dt;
                mom_half += (1.3 - t) * g * dt;
            }
        }
        assert!((l.totals[0] - p).abs() < 1e-9 * p);
        assert!((l.lefts[0] * h - m).abs() < 1e-9 * m);
        let n13 = (1.3 / dt).round() * dt;
        assert!((n13 - 1.3).abs() < 1e-12);
        let (c, mo) = l.integrals(0, 1.3);
        assert!((c - cum_half).abs() < 1e-8 * p && (mo - mom_half).abs() < 1e-8 * m);
        let g = q * (z + (1.3 - h / 2.0) / a).cosh();
        assert!((l.intensity(0, 1.3) - g).abs() < 1e-14 * g);
        // Where the cumulative load reaches half the cell's load.
        let t = l.reach(0, 0.5 * p);
        assert!((l.integrals(0, t).0 - 0.5 * p).abs() < 1e-13 * p);
    }
}
