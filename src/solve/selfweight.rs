//! Self-weight: a load that depends on the shape, found by iterating shape
//! and load to a fixed point.
//!
//! The span is cut into panels (see [`Setup::plan`]); each panel carries its
//! external load (exact) and its own weight, modelled as
//!
//! * a catenary segment where the panel carries self-weight alone (and no
//!   axial stiffness is given): the curve there is a catenary of parameter
//!   a = H/q through the two panel points, whose weight q·(arc length) and
//!   its x-centroid are known in closed form ([`Own::Catenary`]). A uniform
//!   self-weight alone therefore converges to the exact catenary, to
//!   round-off, whatever the number of panels;
//! * elsewhere (external load in the same panel, or an axial stiffness) the
//!   intensity g = q·√(1 + y'²) per horizontal length — divided by
//!   1 + T/EA with a stiffness, the weight being per unit *unstressed*
//!   length since the mass of the cable is conserved as it stretches — is
//!   sampled at the panel's five Gauss points ([`Own::Samples`]). At the
//!   fixed point this is five-point Gauss collocation of y'' = u·g(y'), of
//!   order 10 in the panel width at the panel points (Hairer, Nørsett &
//!   Wanner, *Solving Ordinary Differential Equations I*, §II.7 — from
//!   memory): with the panels of the chord tolerance its error is far below
//!   the round-off of the solve.
//!
//! One iteration: the panel loads are frozen, the three conditions solved
//! exactly for them ([`Setup::frozen`]), and the new shape gives new panel
//! loads. It stops when no panel load changes by more than
//! `iteration_tolerance` × the total load (nor the thrust by more than that
//! fraction). Plain iteration diverges for deep cables (the steep ends
//! attract more weight, which steepens them), so the iterates are
//! accelerated by Anderson's method ([`Anderson`]); a step that cannot be
//! solved is halved back toward the last good iterate.
//!
//! The panels come from a first estimate (the self-weight spread uniformly
//! along the chord, an exact parabola); once converged they are re-planned
//! from the converged shape, with a node at the zero-shear (sag) point, and
//! the iteration repeated from there until the panels need not change.

use std::cell::{Cell as Counter, RefCell};

use super::anderson::Anderson;
use super::ask::Cond;
use super::continuous::{Found, Plan, Setup};
use super::frame::Params;
use super::gauss::rule5;
use super::loading::{Cell, Loading, Own};
use super::types::SolveError;
use crate::model::fmt_num;

/// Differences Anderson's method remembers.
const DEPTH: usize = 8;
/// Re-plannings of the panels, at most.
const PASSES: usize = 5;
/// Halvings back toward the last good iterate, at most, in a row.
const BACKTRACKS: usize = 40;
/// Iterations of polishing after the tolerance is met, at most.
const POLISH: usize = 6;

/// A converged iteration.
#[derive(Clone, Debug)]
struct Converged {
    loading: Loading,
    found: Found,
    state: Vec<f64>,
    iterations: usize,
}

/// The iteration on one set of panels.
struct Model<'s, 'a> {
    setup: &'s Setup<'a>,
    base: Loading,
    catenary: Vec<bool>,
    offsets: Vec<usize>,
    len: usize,
    q: f64,
    wref: f64,
}

impl<'s, 'a> Model<'s, 'a> {
    fn new(setup: &'s Setup<'a>, plan: &Plan, q: f64) -> Model<'s, 'a> {
        let xs: Vec<f64> = plan.points.iter().map(|m| m.x).collect();
        let base = Loading::new(setup.span, xs, &setup.points, &setup.stretches, 0.0, (0.0, 1.0), |_| Own::None);
        let catenary: Vec<bool> = base.cells.iter().map(|c| setup.ea.is_none() && c.w0 == 0.0 && c.w1 == 0.0).collect();
        let mut offsets = Vec::with_capacity(catenary.len());
        let mut len = 1;
        for &c in &catenary {
            offsets.push(len);
            len += if c { 1 } else { 5 };
        }
        let wref = base.scale + q * setup.span;
        Model { setup, base, catenary, offsets, len, q, wref }
    }

    /// The loading of state `x`: x₀ = Oₓ/W (the catenary parameter a = Oₓ/q),
    /// then per panel sinh z (catenary) or the five samples over q.
    fn loading(&self, x: &[f64]) -> Loading {
        let a = x[0] * self.wref / self.q;
        let cells = self
            .base
            .cells
            .iter()
            .enumerate()
            .map(|(i, c)| {
                let o = self.offsets[i];
                let own = if self.catenary[i] {
                    Own::Catenary { sigma: x[o] }
                } else {
                    Own::Samples([x[o], x[o + 1], x[o + 2], x[o + 3], x[o + 4]].map(|g| g * self.q))
                };
                Cell { w0: c.w0, w1: c.w1, own }
            })
            .collect();
        Loading::from_cells(self.setup.span, (self.q, a), self.base.xs.clone(), self.base.jumps.clone(), cells)
    }

    /// Own weight per horizontal length over q at slope `yp`: √(1 + y'²),
    /// over 1 + T/EA with a stiffness (T = Oₓ·√(1 + y'²), signed).
    fn weight(&self, yp: f64, ox: f64) -> Option<f64> {
        let r = yp.hypot(1.0);
        match self.setup.ea {
            None => Some(r),
            Some(ea) => {
                let den = 1.0 + ox * r / ea;
                (den > 0.0).then(|| r / den)
            }
        }
    }

    /// The next state: the weight of the shape `p` drawn on the loading `l`.
    fn update(&self, l: &Loading, p: &Params) -> Option<Vec<f64>> {
        let (v, u, ox) = (p.oy / p.ox, 1.0 / p.ox, p.ox);
        let a = ox / self.q;
        let mut out = vec![0.0; self.len];
        out[0] = ox / self.wref;
        for i in 0..l.cells.len() {
            let o = self.offsets[i];
            let h = l.h(i);
            if self.catenary[i] {
                // The catenary of parameter a through the panel's two new
                // nodes: Δy = 2a·sinh z·sinh(h/2a).
                let dy = h * (v + u * l.c_right[i]) + u * h * l.lefts[i];
                out[o] = dy / (2.0 * a * (h / (2.0 * a)).sinh());
            } else {
                let slopes = l.slopes5(i, v, u);
                for j in 0..5 {
                    out[o + j] = self.weight(slopes[j], ox)?;
                }
            }
        }
        out.iter().all(|v| v.is_finite()).then_some(out)
    }

    /// A first state from a shape `p` on another loading (other panels).
    fn init(&self, other: &Loading, p: &Params) -> Option<Vec<f64>> {
        let (v, u, ox) = (p.oy / p.ox, 1.0 / p.ox, p.ox);
        let a = ox / self.q;
        let (gx, _) = rule5();
        let mut out = vec![0.0; self.len];
        out[0] = ox / self.wref;
        for i in 0..self.base.cells.len() {
            let o = self.offsets[i];
            let (xa, xb) = (self.base.xs[i], self.base.xs[i + 1]);
            let h = xb - xa;
            if self.catenary[i] {
                let dy = v * h + u * (other.f_at(xb) - other.f_at(xa));
                out[o] = dy / (2.0 * a * (h / (2.0 * a)).sinh());
            } else {
                for j in 0..5 {
                    out[o + j] = self.weight(v + u * other.c_at(xa + gx[j] * h), ox)?;
                }
            }
        }
        out.iter().all(|v| v.is_finite()).then_some(out)
    }

    /// Iterates from `x` to the fixed point; `thrust` stands in for a length
    /// condition. Once the change falls below the tolerance the iteration
    /// goes on, at most [`POLISH`] more times, while the change still halves:
    /// where the loads barely change the shape (a steep cable of given
    /// thrust, whose weight grows almost in step with its slopes) the error
    /// can exceed the last change, and this takes it down to round-off.
    fn converge(&self, mut x: Vec<f64>, thrust: Option<f64>) -> Result<Converged, SolveError> {
        let setup = self.setup;
        let (tol, max) = (setup.options.iteration_tolerance, setup.options.max_iterations);
        let mut acc = Anderson::new(DEPTH);
        let mut good: Option<Vec<f64>> = None;
        let mut least = f64::INFINITY;
        let mut last_change = f64::NAN;
        let mut backtracks = 0;
        // The best converged iterate: (change, its loading, its state), and
        // the iteration that first met the tolerance.
        let mut met: Option<(f64, Loading, Vec<f64>)> = None;
        let mut met_at = 0;
        let mut taken = 0;
        for it in 1..=max {
            taken = it;
            let l = self.loading(&x);
            let step = match setup.frozen(&l, thrust) {
                Ok(f) => self.update(&l, &f.params).ok_or(None),
                Err(e) => Err(Some(e)),
            };
            let g = match step {
                Ok(g) => g,
                Err(e) => {
                    if met.is_some() {
                        break;
                    }
                    // Halve back toward the last good iterate; at the start
                    // there is none, and the error is the problem's own.
                    let Some(prev) = good.as_ref() else {
                        return Err(e.unwrap_or_else(|| self.crushed(&l)));
                    };
                    backtracks += 1;
                    if backtracks > BACKTRACKS {
                        return Err(e.unwrap_or_else(|| self.crushed(&l)));
                    }
                    x = x.iter().zip(prev).map(|(a, b)| 0.5 * (a + b)).collect();
                    acc.reset();
                    continue;
                }
            };
            backtracks = 0;
            let lg = self.loading(&g);
            let loads = lg.totals.iter().zip(&l.totals).map(|(a, b)| (a - b).abs()).fold(0.0, f64::max) / l.scale;
            let change = loads.max((g[0] - x[0]).abs() / g[0].abs());
            match &met {
                Some((c, ..)) if change < 0.5 * c => met = Some((change, lg, g.clone())),
                Some(_) => break,
                None if change <= tol => {
                    met = Some((change, lg, g.clone()));
                    met_at = it;
                }
                None => {}
            }
            if met.is_some() && it >= met_at + POLISH {
                break;
            }
            last_change = change;
            if change > 100.0 * least {
                // The acceleration went astray: start afresh from here.
                acc.reset();
            }
            least = least.min(change);
            good = Some(x.clone());
            x = acc.next(&x, &g);
        }
        if let Some((_, lg, g)) = met {
            let found = setup.frozen(&lg, thrust)?;
            return Ok(Converged { loading: lg, found: Found { other: None, ..found }, state: g, iterations: taken });
        }
        Err(SolveError::NoSolution {
            form: setup.namer.form,
            list: setup.namer.list(setup.conds),
            reason: format!(
                "the self-weight iteration did not settle in {max} iterations (the panel loads still changed by {} of the total load); allow more iterations or a looser iteration tolerance, or check {}",
                fmt_num(last_change),
                setup.namer.self_weight(self.q)
            ),
        })
    }

    /// The error for a force that reaches the axial stiffness (an arch
    /// crushed by its own weight). Without a stiffness, the shape overflowed instead.
    fn crushed(&self, l: &Loading) -> SolveError {
        let setup = self.setup;
        match setup.ea {
            Some(ea) => setup.crushed(ea, (l.a * self.q).abs()),
            None => SolveError::NoSolution {
                form: setup.namer.form,
                list: setup.namer.list(setup.conds),
                reason: format!(
                    "with {} the profile grows too deep to compute (its slopes overflow); ask for a shallower one (a larger thrust or a smaller sag)",
                    setup.namer.self_weight(self.q)
                ),
            },
        }
    }
}

/// Solves with self-weight: the converged loading, the funicular, the
/// panels, and the iterations taken.
pub(crate) fn solve(setup: &Setup) -> Result<(Loading, Found, Plan, usize), SolveError> {
    let q = setup.q.unwrap_or(0.0);
    // First estimate: the self-weight spread along the chord, q·√(1 + c²) per
    // horizontal length — exact for a straight profile.
    let c0 = match (setup.structure.left().fixed_point(), setup.structure.right().fixed_point()) {
        (Some(a), Some(b)) => (b.y - a.y) / setup.span,
        _ => 0.0,
    };
    let mut base_l = setup.external_plus(q * c0.hypot(1.0));
    let mut base_p = setup.solve_loading(&base_l, &mut Vec::new())?.params;
    let mut zero_shear = base_l.m_max();
    let mut iterations = 0;
    let mut result = None;
    for _ in 0..PASSES {
        let marks = setup.marks(Some(zero_shear));
        let plan = setup.plan(&marks, &base_l, &base_p);
        let model = Model::new(setup, &plan, q);
        let start = model.init(&base_l, &base_p).ok_or_else(|| model.crushed(&base_l))?;
        let c = match setup.length {
            None => model.converge(start, None)?,
            Some(lc) => by_length(setup, &model, lc, start, &mut iterations)?,
        };
        iterations += c.iterations;
        // Are the panels right for the converged shape: a node at the
        // zero-shear point, and no interval wanting more panels?
        let (xs, m) = c.loading.m_max();
        let sag_ok = m <= 0.0 || plan.points.iter().any(|mk| (mk.x - xs).abs() <= 1e-9 * setup.span);
        let again = setup.plan(&marks, &c.loading, &c.found.params);
        let enough = plan.capped || again.counts.iter().zip(&plan.counts).all(|(n, have)| *n <= (1.1 * have).ceil());
        let done = sag_ok && enough;
        base_p = c.found.params;
        zero_shear = (xs, m);
        base_l = c.loading.clone();
        result = Some((c, plan));
        if done {
            break;
        }
    }
    let Some((c, plan)) = result else {
        return Err(SolveError::NoSolution {
            form: setup.namer.form,
            list: setup.namer.list(setup.conds),
            reason: "the self-weight iteration did not start".into(),
        });
    };
    Ok((c.loading, c.found, plan, iterations))
}

/// The length search with the iteration nested in each trial thrust, each
/// trial starting from the last converged state.
fn by_length(
    setup: &Setup,
    model: &Model,
    lc: Cond,
    start: Vec<f64>,
    iterations: &mut usize,
) -> Result<Converged, SolveError> {
    let warm = RefCell::new(start);
    let count = Counter::new(0);
    let kept: RefCell<Option<Converged>> = RefCell::new(None);
    let unstressed = matches!(lc, Cond::Unstressed(_));
    let measure = |h: f64| -> Result<(Params, f64), SolveError> {
        let c = model.converge(warm.borrow().clone(), Some(h))?;
        count.set(count.get() + c.iterations);
        warm.borrow_mut().clone_from(&c.state);
        let p = c.found.params;
        let (s, s0) = c.loading.lengths(p.oy / p.ox, 1.0 / p.ox, p.ox, setup.ea);
        *kept.borrow_mut() = Some(c);
        Ok((p, if unstressed { s0 } else { s }))
    };
    let (p, _) = setup.by_length(lc, model.wref, measure)?;
    *iterations += count.get();
    let found = kept.borrow_mut().take();
    match found {
        Some(mut c) if c.found.params == p => {
            // The trial iterations are counted above; the caller adds these.
            c.iterations = 0;
            Ok(c)
        }
        _ => Err(SolveError::NoSolution {
            form: setup.namer.form,
            list: setup.namer.list(setup.conds),
            reason: "the length search lost its last solution".into(),
        }),
    }
}
