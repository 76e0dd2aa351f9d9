//! Continuous loads — distributed loads, self-weight — and the length
//! conditions, for vertical loads.
//!
//! The funicular of vertical loads is y(x) = y_L + v·x + u·F(x), with C(x)
//! the load left of x, F(x) = ∫₀ˣ C, u = 1/Oₓ and v = O_y/Oₓ; its distance
//! from the chord is u·M(x), M the simple-beam moment (Beer & Johnston,
//! *Vector Mechanics for Engineers: Statics*, §7.8–7.9). [`super::loading`]
//! gives C, F and M in closed form for continuous loads, so every condition
//! but `--max-force` and the lengths stays linear in (y_L, v, u) exactly as
//! in [`super::linear`]: through points and supports use the continuous F,
//! `--level-at` the continuous C (the true tangent is level there), the sag
//! the largest M over continuous x (at the zero of the shear). `--max-force`
//! uses the extremes of O_y + C(x) — at the supports for downward loads.
//!
//! The drawn polygon has its nodes at panel points: the supports, the point
//! loads, the ends of the distributed loads, the zero-shear (sag) point,
//! every `--through` and `--level-at` x, and enough points between them that
//! each straight chord stays within the chord tolerance of the curve. The
//! load at a node is the sum of the lever-rule (simple-beam) reactions of the
//! loads of the panels on either side of it. The simple-beam moment of these
//! nodal loads at every panel point equals that of the continuous load, so
//! **every node lies exactly on the continuous funicular** (common practice,
//! no source). The halves at the two supports go straight into the supports
//! ([`Solution::at_supports`], included in the reactions, whose magnitudes
//! are then the true end forces).
//!
//! * Self-weight: [`super::selfweight`] iterates shape and load.
//! * `--length S`, `--unstressed-length S0`: the two other conditions are
//!   linear and leave the thrust free; the length is found by Brent's method
//!   on ρ = W/H (W the load, H the thrust) over a bracket from ρ = 0 (the
//!   straight profile, H → ∞) outward (R. P. Brent, *Algorithms for
//!   Minimization without Derivatives*, 1973, ch. 4).

use kurbo::{Point, Vec2};
use std::cell::RefCell;

use super::ask::{Cond, Namer};
use super::assemble::{closing_point, towers};
use super::beam::Beam;
use super::closed_form::{Lump, continuous_moments};
use super::construction::Polygon;
use super::dense::solve3;
use super::dependency;
use super::frame::{Frame, Params};
use super::gauss::Sum;
use super::linear::{Row, check_sign};
use super::loading::{Loading, Own, Stretch, breakpoints};
use super::maxforce;
use super::residual::{max_ray, relative, sag};
use super::roots::{brent_zero, golden_min};
use super::selfweight;
use super::types::{Checks, Form, NodeKind, Peak, Sag, Segment, Solution, SolveError, SolveOptions};
use crate::model::{Structure, fmt_num};

/// Most panels in a drawn profile (beyond the nodes the drawing fixes).
pub(crate) const MAX_PANELS: usize = 20_000;

/// A point of the drawn polygon that the problem fixes.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Mark {
    /// Local x.
    pub x: f64,
    /// The drawing's own x, where the drawing gives it.
    pub global: Option<f64>,
    /// What the node is.
    pub kind: NodeKind,
}

/// A solved funicular for given loads: pole, left height, and the second
/// solution of a two-root condition.
#[derive(Clone, Copy, Debug)]
pub(crate) struct Found {
    /// The funicular.
    pub params: Params,
    /// Another one meeting the same conditions, if any.
    pub other: Option<Params>,
}

/// Everything fixed about the problem.
pub(crate) struct Setup<'a> {
    /// The structure.
    pub structure: &'a Structure,
    /// The three conditions.
    pub conds: &'a [Cond],
    /// Names for messages.
    pub namer: &'a Namer,
    /// +1 cable, −1 arch.
    pub s: f64,
    /// Drawing x of the local origin (left support).
    pub x0: f64,
    /// Drawing y of the local origin.
    pub y0: f64,
    /// Span.
    pub span: f64,
    /// Point loads, local x, downward force.
    pub points: Vec<(f64, f64)>,
    /// Distributed loads, local.
    pub stretches: Vec<Stretch>,
    /// Self-weight per unit length, if any.
    pub q: Option<f64>,
    /// Axial stiffness, if any.
    pub ea: Option<f64>,
    /// Largest chord-to-curve distance of the drawing.
    pub chord_tol: f64,
    /// Options as given.
    pub options: SolveOptions,
    /// The length condition, if any.
    pub length: Option<Cond>,
}

/// Solves for continuous loads.
pub(crate) fn solve(
    structure: &Structure,
    conds: &[Cond],
    namer: &Namer,
    options: &SolveOptions,
) -> Result<Solution, SolveError> {
    let setup = Setup::new(structure, conds, namer, options)?;
    let mut warnings = Vec::new();
    let (loading, found, plan, iterations) = if setup.q.is_some() {
        selfweight::solve(&setup)?
    } else {
        let loading = setup.external();
        let found = setup.solve_loading(&loading, &mut warnings)?;
        let marks = setup.marks(Some(loading.m_max()));
        let plan = setup.plan(&marks, &loading, &found.params);
        (loading, found, plan, 0)
    };
    if let Some(other) = found.other {
        warnings.push(second_root(namer, &found.params, &other, "largest force", "--max-force"));
    }
    if let Some(w) = plan.warning.clone() {
        warnings.push(w);
    }
    setup.assemble(&loading, found.params, &plan.points, iterations, warnings)
}

/// The warning for a second funicular meeting the same conditions.
pub(crate) fn second_root(namer: &Namer, chosen: &Params, other: &Params, what: &str, flag: &str) -> String {
    format!(
        "a second, deeper {} has the same {what}, with a thrust of {}; this is the shallower one, with a thrust of {}. For the other, replace {flag} with --thrust {}",
        namer.form,
        namer.force(other.ox.abs()),
        namer.force(chosen.ox.abs()),
        fmt_num(other.ox.abs())
    )
}

impl<'a> Setup<'a> {
    fn new(
        structure: &'a Structure,
        conds: &'a [Cond],
        namer: &'a Namer,
        options: &SolveOptions,
    ) -> Result<Setup<'a>, SolveError> {
        let x0 = structure.left().x();
        let y0 = match structure.left() {
            crate::model::Support::Point { at, .. } => at.y,
            crate::model::Support::Axis { foot, .. } => *foot,
        };
        let span = structure.span();
        let length = conds.iter().copied().find(|c| matches!(c, Cond::Length(_) | Cond::Unstressed(_)));
        if let Some(l) = structure.loads().iter().find(|l| !l.is_vertical()) {
            let what = if let Some(d) = structure.distributed().first() {
                format!("the distributed load of {}", d.origin)
            } else if let Some(q) = options.self_weight {
                namer.self_weight(q)
            } else {
                length.map_or_else(|| "a length condition".to_string(), |c| namer.name(&c))
            };
            return Err(SolveError::NoSolution {
                form: namer.form,
                list: namer.list(conds),
                reason: format!(
                    "{what} needs vertical point loads, and the load of {} is inclined; draw it vertical, or solve without continuous loads and length conditions",
                    l.origin
                ),
            });
        }
        let points = structure.loads().iter().map(|l| (l.anchor.x - x0, -l.force.y)).collect();
        let stretches = structure
            .distributed()
            .iter()
            .map(|d| Stretch { x0: d.x0 - x0, x1: d.x1 - x0, w0: d.w0, w1: d.w1 })
            .collect();
        let setup = Setup {
            structure,
            conds,
            namer,
            s: namer.form.sign(),
            x0,
            y0,
            span,
            points,
            stretches,
            q: options.self_weight,
            ea: options.axial_stiffness,
            chord_tol: options.chord_tolerance.unwrap_or(span / 10_000.0),
            options: *options,
            length,
        };
        if !structure.has_loads() && setup.q.is_none() {
            return Err(SolveError::NoSolution {
                form: namer.form,
                list: namer.list(conds),
                reason: "there are no loads; draw loads, or give the profile's own weight with --self-weight q".into(),
            });
        }
        Ok(setup)
    }

    /// The external loads alone, exact, with `extra` per horizontal length
    /// added everywhere.
    pub fn external_plus(&self, extra: f64) -> Loading {
        let xs = breakpoints(
            self.span,
            self.points.iter().map(|p| p.0).chain(self.stretches.iter().flat_map(|s| [s.x0, s.x1])),
        );
        Loading::new(self.span, xs, &self.points, &self.stretches, extra, (0.0, 1.0), |_| Own::None)
    }

    /// The external loads alone, exact.
    pub fn external(&self) -> Loading {
        self.external_plus(0.0)
    }

    /// Solves the conditions on a fixed loading: directly, or through the
    /// length search.
    pub fn solve_loading(&self, loading: &Loading, warnings: &mut Vec<String>) -> Result<Found, SolveError> {
        match self.length {
            None => self.frozen(loading, None),
            Some(c) => {
                let ea = self.ea;
                let measure = |h: f64| -> Result<(Params, f64), SolveError> {
                    let p = self.frozen(loading, Some(h))?.params;
                    let (s, s0) = loading.lengths(p.oy / p.ox, 1.0 / p.ox, p.ox, ea);
                    Ok((p, if matches!(c, Cond::Unstressed(_)) { s0 } else { s }))
                };
                let (p, other) = self.by_length(c, loading.scale, measure)?;
                if let Some(o) = other {
                    warnings.push(second_root(self.namer, &p, &o, "length", &self.namer.name(&c)));
                }
                Ok(Found { params: p, other: None })
            }
        }
    }

    /// The synthetic beam the shared helpers (`maxforce`, `dependency`) read.
    fn beam(&self, l: &Loading, m_max: f64) -> Beam {
        let ((lo, _), (hi, _)) = l.c_extremes();
        Beam {
            xs: Vec::new(),
            ws: Vec::new(),
            span: self.span,
            cum: vec![lo, hi],
            c_min: lo,
            c_max: hi,
            f_right: l.f_last(),
            m_max,
            w_scale: l.scale,
        }
    }

    /// The row of a linear condition (z = (y_L/L, v, u·W)); `None` for the others.
    fn row(&self, l: &Loading, m_max: f64, c: &Cond) -> Option<Row> {
        let (span, w, s) = (self.span, l.scale, self.s);
        let height = |x: f64, y: f64| Row { a: [1.0, x / span, l.f_at(x) / (w * span)], e: y / span };
        Some(match *c {
            Cond::Left(p) => Row { a: [1.0, 0.0, 0.0], e: (p.y - self.y0) / span },
            Cond::Right(p) => Row { a: [1.0, 1.0, l.f_last() / (w * span)], e: (p.y - self.y0) / span },
            Cond::Through(p) => height(p.x - self.x0, p.y - self.y0),
            Cond::LevelAt(x) => Row { a: [0.0, 1.0, l.c_at(x - self.x0) / w], e: 0.0 },
            Cond::Thrust(h) => Row { a: [0.0, 0.0, 1.0], e: s * w / h },
            Cond::Sag(f) => Row { a: [0.0, 0.0, 1.0], e: s * f * w / m_max },
            Cond::MaxForce(_) | Cond::Length(_) | Cond::Unstressed(_) => return None,
        })
    }

    fn params(&self, l: &Loading, z: [f64; 3]) -> Params {
        let ox = l.scale / z[2];
        Params { ox, oy: z[1] * ox, y_left: z[0] * self.span }
    }

    /// Solves the three conditions for the loading `l`, exactly; `thrust`
    /// stands in for the length condition during the length search.
    pub fn frozen(&self, l: &Loading, thrust: Option<f64>) -> Result<Found, SolveError> {
        let work: Vec<Cond> = self
            .conds
            .iter()
            .map(|c| match c {
                Cond::Length(_) | Cond::Unstressed(_) => Cond::Thrust(thrust.unwrap_or(f64::NAN)),
                _ => *c,
            })
            .collect();
        let namer = self.namer;
        if !work.iter().any(Cond::fixes_height) {
            return Err(dependency::no_height(self.conds, namer));
        }
        if !(l.scale > 0.0 && l.scale.is_finite()) {
            return Err(SolveError::NoSolution {
                form: namer.form,
                list: namer.list(self.conds),
                reason: "there are no loads; draw loads, or give the profile's own weight with --self-weight q".into(),
            });
        }
        let (_, m_max) = l.m_max();
        if work.iter().any(|c| matches!(c, Cond::Sag(_))) && (m_max.is_nan() || m_max <= 0.0) {
            return Err(SolveError::NoSolution {
                form: namer.form,
                list: namer.list(self.conds),
                reason: format!(
                    "these loads push up on balance, so no {} lies on the {} side of its chord; replace {} with --thrust H",
                    namer.form,
                    if namer.form == Form::Arch { "upper" } else { "lower" },
                    namer.sag_flag()
                ),
            });
        }
        let beam = self.beam(l, m_max);
        let rows: Vec<(usize, Row)> =
            work.iter().enumerate().filter_map(|(i, c)| self.row(l, m_max, c).map(|r| (i, r))).collect();
        match rows.as_slice() {
            [(_, r0), (_, r1), (_, r2)] => {
                let z = solve3([r0.a, r1.a, r2.a], [r0.e, r1.e, r2.e])
                    .ok_or_else(|| dependency::explain(&work, &rows, &beam, namer))?;
                check_sign(z[2], &work, namer)?;
                Ok(Found { params: self.params(l, z), other: None })
            }
            [a, b] => {
                let Some(t) = work.iter().find_map(|c| if let Cond::MaxForce(t) = c { Some(*t) } else { None }) else {
                    return Err(dependency::several_max_force(&work, namer));
                };
                let pick = maxforce::solve(&beam, [*a, *b], t, &work, namer)?;
                Ok(Found { params: self.params(l, pick.z), other: pick.other.map(|z| self.params(l, z)) })
            }
            _ => Err(dependency::several_max_force(&work, namer)),
        }
    }

    /// The conditions other than the length one.
    fn others(&self) -> Vec<Cond> {
        self.conds.iter().copied().filter(|c| !matches!(c, Cond::Length(_) | Cond::Unstressed(_))).collect()
    }

    /// Checks that the two other conditions leave exactly the thrust free,
    /// and returns the length of the straight profile they allow (H → ∞).
    fn length_family(&self, lc: &Cond, l: &Loading) -> Result<f64, SolveError> {
        let namer = self.namer;
        let others = self.others();
        let list = namer.list(self.conds);
        if others.len() != 2 {
            let lengths: Vec<Cond> =
                self.conds.iter().copied().filter(|c| matches!(c, Cond::Length(_) | Cond::Unstressed(_))).collect();
            return Err(SolveError::Dependent {
                list: namer.list(&lengths),
                problem: "all fix the length".into(),
                advice: format!("keep one of them and replace the others with {}", namer.menu()),
            });
        }
        if let Some(c) = others.iter().find(|c| matches!(c, Cond::MaxForce(_))) {
            return Err(SolveError::Dependent {
                list,
                problem: format!(
                    "hold two conditions, {} and {}, that each need a search",
                    namer.name(c),
                    namer.name(lc)
                ),
                advice: format!(
                    "replace {} with --through X,Y or --level-at X (with both supports drawn as points, the length alone fixes the thrust)",
                    namer.name(c)
                ),
            });
        }
        if let Some(c) = others.iter().find(|c| matches!(c, Cond::Thrust(_) | Cond::Sag(_))) {
            return Err(SolveError::Dependent {
                list,
                problem: format!(
                    "fix the thrust twice over: {} fixes it, and {} with one height fixed would leave only the slope to choose, with two profiles of that length",
                    namer.name(c),
                    namer.name(lc)
                ),
                advice: format!(
                    "drop {} and fix a second height instead (draw both supports as points, or add --through X,Y)",
                    namer.name(c)
                ),
            });
        }
        let (_, m_max) = l.m_max();
        let beam = self.beam(l, m_max);
        let rows: Vec<(usize, Row)> =
            self.conds.iter().enumerate().filter_map(|(i, c)| self.row(l, m_max, c).map(|r| (i, r))).collect();
        let [(ia, ra), (ib, rb)] = rows.as_slice() else {
            return Err(dependency::several_max_force(self.conds, namer));
        };
        if !self.conds.iter().any(Cond::fixes_height) {
            return Err(dependency::no_height(self.conds, namer));
        }
        if let Some(e) = dependency::pair(&self.conds[*ia], &self.conds[*ib], ra, rb, &beam, namer) {
            return Err(e);
        }
        let z = solve3([ra.a, rb.a, [0.0, 0.0, 1.0]], [ra.e, rb.e, 0.0]).ok_or_else(|| SolveError::Dependent {
            list: namer.list(self.conds),
            problem: format!(
                "leave the profile free: {} and {} do not fix its height and slope",
                namer.name(&self.conds[*ia]),
                namer.name(&self.conds[*ib])
            ),
            advice: format!("replace one of them with --through X,Y or {}", namer.menu()),
        })?;
        Ok(self.span * z[1].hypot(1.0))
    }

    /// Finds the thrust at which `measure` (the length or the unstressed
    /// length of the funicular with that thrust) equals the condition `lc`.
    /// `scale` is the force the search variable ρ = scale/H refers to.
    /// Returns the chosen funicular and, when two have that length, the other.
    pub fn by_length(
        &self,
        lc: Cond,
        scale: f64,
        measure: impl FnMut(f64) -> Result<(Params, f64), SolveError>,
    ) -> Result<(Params, Option<Params>), SolveError> {
        let namer = self.namer;
        let (target, unstressed) = match lc {
            Cond::Length(l) => (l, false),
            Cond::Unstressed(l) => (l, true),
            _ => return Err(dependency::several_max_force(self.conds, namer)),
        };
        let straight = self.length_family(&lc, &self.external_plus(self.q.unwrap_or(0.0)))?;
        let both = self.conds.iter().any(|c| matches!(c, Cond::Left(_)))
            && self.conds.iter().any(|c| matches!(c, Cond::Right(_)));
        let form = namer.form;
        // ρ = 0 is the straight profile: its length, or an unstressed length of 0 (H → ∞).
        let g0 = if unstressed { -target } else { straight - target };
        if !unstressed && both && g0 >= 0.0 {
            let article = if form == Form::Arch { "an" } else { "a" };
            return Err(SolveError::NoSolution {
                form,
                list: namer.list(self.conds),
                reason: format!(
                    "{article} {form} between these supports must be longer than the chord, {}; give a longer --length",
                    namer.length(straight)
                ),
            });
        }
        let measure = RefCell::new(measure);
        let failure: RefCell<Option<SolveError>> = RefCell::new(None);
        let last: RefCell<Option<(f64, Params)>> = RefCell::new(None);
        let g = |rho: f64| -> f64 {
            if rho <= 0.0 {
                return g0;
            }
            if failure.borrow().is_some() {
                return 0.0;
            }
            match (measure.borrow_mut())(scale / rho) {
                Ok((p, m)) => {
                    *last.borrow_mut() = Some((rho, p));
                    m - target
                }
                Err(e) => {
                    *failure.borrow_mut() = Some(e);
                    0.0
                }
            }
        };
        let fail = |failure: &RefCell<Option<SolveError>>| failure.borrow_mut().take();
        // Bracket: from ρ = 1 outward by factors of 4. A trial that cannot be
        // solved (with self-weight, a profile too deep for the iteration)
        // is backed off from: the next trial lies between it and the last
        // one that worked, geometrically.
        let (mut good, mut bad) = (0.0_f64, f64::INFINITY);
        let mut hi = 1.0;
        let mut g_hi;
        let mut steps = 0;
        loop {
            steps += 1;
            g_hi = g(hi);
            let failed = fail(&failure);
            if failed.is_none() && g_hi > 0.0 {
                break;
            }
            if steps > 80 || (failed.is_some() && good > 0.0 && bad / good < 1.0 + 1e-9) {
                return Err(failed.unwrap_or_else(|| SolveError::NoSolution {
                    form,
                    list: namer.list(self.conds),
                    reason: format!(
                        "even with a thrust of {} the {form} is not that long; check the length and its unit",
                        namer.force(scale / hi)
                    ),
                }));
            }
            if failed.is_some() {
                bad = hi;
            } else {
                good = hi;
            }
            hi = match (good > 0.0, bad.is_finite()) {
                (true, true) => (good * bad).sqrt(),
                (false, true) => bad / 4.0,
                _ => 4.0 * good,
            };
        }
        let tol = 0.0;
        let (root, other) = if g0 < 0.0 {
            (brent_zero(g, 0.0, hi, g0, g_hi, tol), None)
        } else {
            // The length is convex in ρ here (the straight profile is not the
            // shortest): the least length, then a root either side of it.
            let lo = golden_min(g, 0.0, hi);
            let g_lo = g(lo);
            if let Some(e) = fail(&failure) {
                return Err(e);
            }
            if g_lo > 0.0 {
                let what = if unstressed { "unstressed length" } else { "length" };
                let others = namer.list(&self.others());
                return Err(SolveError::NoSolution {
                    form,
                    list: namer.list(self.conds),
                    reason: format!(
                        "the shortest {form} meeting {others} has a {what} of {}; give a longer one",
                        namer.length(g_lo + target)
                    ),
                });
            }
            let shallow = if g0 == 0.0 { 0.0 } else { brent_zero(g, 0.0, lo, g0, g_lo, tol) };
            let deep = brent_zero(g, lo, hi, g_lo, g_hi, tol);
            (shallow, Some(deep))
        };
        if let Some(e) = fail(&failure) {
            return Err(e);
        }
        if root <= 0.0 {
            return Err(SolveError::NoSolution {
                form,
                list: namer.list(self.conds),
                reason: "only a straight profile, with an infinite thrust, has that length; give a longer one".into(),
            });
        }
        let other_params = match other {
            Some(d) if d > root * (1.0 + 1e-9) => {
                g(d);
                let p = last.borrow().map(|(_, p)| p);
                if let Some(e) = fail(&failure) {
                    return Err(e);
                }
                p
            }
            _ => None,
        };
        // The last evaluation may not be at the root: evaluate there once more.
        if last.borrow().is_none_or(|(r, _)| r != root) || other_params.is_some() {
            g(root);
        }
        if let Some(e) = fail(&failure) {
            return Err(e);
        }
        let chosen = last.borrow().map(|(_, p)| p);
        chosen.map(|p| (p, other_params)).ok_or_else(|| SolveError::NoSolution {
            form,
            list: namer.list(self.conds),
            reason: "the length search found nothing; check the length".into(),
        })
    }

    /// The points the drawing must have a node at: supports, point loads,
    /// ends of distributed loads, through and level-at points, and the
    /// zero-shear point `(x, M)` when the moment there is positive.
    pub fn marks(&self, zero_shear: Option<(f64, f64)>) -> Vec<Mark> {
        let mut marks = vec![
            Mark { x: 0.0, global: Some(self.structure.left().x()), kind: NodeKind::Support },
            Mark { x: self.span, global: Some(self.structure.right().x()), kind: NodeKind::Support },
        ];
        for (k, l) in self.structure.loads().iter().enumerate() {
            marks.push(Mark { x: l.anchor.x - self.x0, global: Some(l.anchor.x), kind: NodeKind::Load(k) });
        }
        for d in self.structure.distributed() {
            for x in [d.x0, d.x1] {
                marks.push(Mark { x: x - self.x0, global: Some(x), kind: NodeKind::Panel });
            }
        }
        for c in self.conds {
            let x = match *c {
                Cond::Through(p) => p.x,
                Cond::LevelAt(x) => x,
                _ => continue,
            };
            marks.push(Mark { x: (x - self.x0).clamp(0.0, self.span), global: Some(x), kind: NodeKind::Panel });
        }
        if let Some((x, m)) = zero_shear {
            if m > 0.0 && x > 0.0 && x < self.span {
                let near = marks.iter().any(|k| (k.x - x).abs() <= 1e-12 * self.span);
                if !near {
                    marks.push(Mark { x, global: None, kind: NodeKind::Panel });
                }
            }
        }
        let rank = |k: &NodeKind| match k {
            NodeKind::Support => 0,
            NodeKind::Load(_) => 1,
            NodeKind::Panel => 2,
        };
        marks.sort_by(|a, b| a.x.total_cmp(&b.x).then(rank(&a.kind).cmp(&rank(&b.kind))));
        marks.dedup_by(|b, a| a.x == b.x);
        marks
    }

    /// Largest external intensity over [a, b] (within one stretch or gap).
    fn ext_max(&self, a: f64, b: f64) -> f64 {
        let k = self.stretches.partition_point(|s| s.x1 <= a);
        match self.stretches.get(k) {
            Some(s) if s.x0 <= a && b <= s.x1 => s.at(a).max(s.at(b)),
            _ => 0.0,
        }
    }

    /// The panels of the drawing: each interval between marks cut into equal
    /// panels so that a chord strays from the curve by at most the chord
    /// tolerance. For a panel of width h where the profile has slope y' and
    /// y'' = u·g (g the load per horizontal length), the chord's distance
    /// from the arc is about h²·y''/(8√(1 + y'²)) (the chord of length
    /// h√(1 + y'²) of an arc of curvature y''/(1 + y'²)^(3/2) — common
    /// practice, no source); bounded here by the largest intensity over the
    /// interval and the least slope. With self-weight the slope may also
    /// change by at most about half of max(1, |y'|) per panel, which keeps
    /// the five-point collocation well inside its accuracy.
    pub fn plan(&self, marks: &[Mark], l: &Loading, p: &Params) -> Plan {
        let (v, u) = (p.oy / p.ox, 1.0 / p.ox);
        let q = self.q.unwrap_or(0.0);
        let mut counts = Vec::with_capacity(marks.len());
        let mut kappas = Vec::with_capacity(marks.len());
        for w in marks.windows(2) {
            let (a, b) = (w[0].x, w[1].x);
            let len = b - a;
            let (sa, sb) = (v + u * l.c_at(a), v + u * l.c_left(b));
            let least = if sa * sb <= 0.0 { 0.0 } else { sa.abs().min(sb.abs()) };
            let kappa = u.abs() * (self.ext_max(a, b) / least.hypot(1.0) + q);
            let mut n = (len * (kappa / (8.0 * self.chord_tol)).sqrt()).ceil();
            if q > 0.0 {
                // |Δy'| ≤ ½·max(1, |y'|) per panel: with y'' = u·(w + q·√(1 + y'²))
                // that holds for h ≤ 1/(2|u|·(w/max(1, |y'|) + √2·q)).
                let w = self.ext_max(a, b) / least.max(1.0);
                n = n.max((2.0 * len * u.abs() * (w + std::f64::consts::SQRT_2 * q)).ceil());
            }
            let n = if n.is_finite() { n.clamp(1.0, 1e9) } else { 1.0 };
            counts.push(n);
            kappas.push(kappa);
        }
        let needed: f64 = counts.iter().sum();
        let intervals = counts.len() as f64;
        let mut warning = None;
        let mut capped = false;
        if needed > MAX_PANELS as f64 && needed > intervals {
            let room = (MAX_PANELS as f64).max(intervals);
            let factor = room / needed;
            for n in &mut counts {
                *n = (*n * factor).floor().max(1.0);
            }
            let used: f64 = counts.iter().sum();
            let reached = marks
                .windows(2)
                .zip(&counts)
                .zip(&kappas)
                .map(|((w, n), k)| {
                    let h = (w[1].x - w[0].x) / n;
                    h * h * k / 8.0
                })
                .fold(0.0, f64::max);
            capped = true;
            warning = Some(format!(
                "a chord tolerance of {} would take {} panels; the drawing has {} (its nodes lie on the exact curve, its straight chords within about {} of it): give a larger chord tolerance to silence this",
                self.namer.length(self.chord_tol),
                fmt_num(needed),
                fmt_num(used),
                self.namer.length(reached)
            ));
        }
        let mut points = Vec::with_capacity(counts.iter().sum::<f64>() as usize + 1);
        for (w, n) in marks.windows(2).zip(&counts) {
            points.push(w[0]);
            let (a, b) = (w[0].x, w[1].x);
            let n = *n as usize;
            for j in 1..n {
                points.push(Mark { x: a + (b - a) * (j as f64 / n as f64), global: None, kind: NodeKind::Panel });
            }
        }
        if let Some(last) = marks.last() {
            points.push(*last);
        }
        Plan { points, counts, capped, warning }
    }

    /// The reported solution for the loading `l` and funicular `p`, drawn
    /// with nodes at `panels`.
    pub fn assemble(
        &self,
        l: &Loading,
        p: Params,
        panels: &[Mark],
        iterations: usize,
        mut warnings: Vec<String>,
    ) -> Result<Solution, SolveError> {
        let namer = self.namer;
        let s = self.s;
        let m = panels.len() - 1;
        // Nodal loads: lever-rule shares of each panel's load, and point loads.
        let mut nodal = vec![0.0; m + 1];
        let mut cell = 0;
        let mut brk = 0;
        for (j, w) in panels.windows(2).enumerate() {
            let (a, b) = (w[0].x, w[1].x);
            while cell + 1 < l.cells.len() && l.xs[cell + 1] <= a {
                cell += 1;
            }
            let (left, right) = l.shares(cell, a - l.xs[cell], b - l.xs[cell]);
            nodal[j] += left;
            nodal[j + 1] += right;
        }
        for (j, mk) in panels.iter().enumerate() {
            while brk < l.xs.len() && l.xs[brk] < mk.x {
                brk += 1;
            }
            if brk < l.xs.len() && l.xs[brk] == mk.x {
                nodal[j] += l.jumps[brk];
            }
        }
        let at_supports = [nodal[0], nodal[m]];
        // The force diagram of the interior nodal loads, and the polygon drawn from it.
        let pole = Vec2::new(p.ox, p.oy + at_supports[0]);
        let mut rays = Vec::with_capacity(m);
        let mut ty = Sum::default();
        ty.add(pole.y);
        rays.push([p.ox, ty.get()]);
        let mut load_line = vec![Point::ZERO];
        let mut a = Sum::default();
        for &nk in &nodal[1..m] {
            ty.add(nk);
            rays.push([p.ox, ty.get()]);
            a.add(-nk);
            load_line.push(Point::new(0.0, a.get()));
        }
        let mut ys = Vec::with_capacity(m + 1);
        let mut y = Sum::default();
        y.add(p.y_left);
        ys.push(p.y_left);
        for (k, w) in panels.windows(2).enumerate() {
            y.add(rays[k][1] * ((w[1].x - w[0].x) / rays[k][0]));
            ys.push(y.get());
        }
        let poly = Polygon { nodes: panels.iter().zip(&ys).map(|(mk, y)| [mk.x, *y]).collect(), rays };
        let nodes: Vec<Point> = poly
            .nodes
            .iter()
            .zip(panels)
            .enumerate()
            .map(|(k, (v, mk))| {
                let mut pt = Point::new(mk.global.unwrap_or(v[0] + self.x0), v[1] + self.y0);
                if k == 0 {
                    pt = self.structure.left().fixed_point().unwrap_or(Point::new(self.structure.left().x(), pt.y));
                } else if k == m {
                    pt = self.structure.right().fixed_point().unwrap_or(Point::new(self.structure.right().x(), pt.y));
                }
                pt
            })
            .collect();
        let rays_v: Vec<Vec2> = poly.rays.iter().map(|t| Vec2::new(t[0], t[1])).collect();
        let segments: Vec<Segment> = rays_v
            .iter()
            .zip(nodes.windows(2))
            .map(|(t, w)| Segment { force: s * t.hypot(), length: (w[1] - w[0]).hypot(), vector: *t })
            .collect();
        let reactions = [-rays_v[0] + Vec2::new(0.0, at_supports[0]), rays_v[m - 1] + Vec2::new(0.0, at_supports[1])];
        let thrust = p.ox.abs();
        let (k_sag, sag_value) = sag(&poly, s);
        let (first, last) = (nodes[0], nodes[m]);
        let at = nodes[k_sag];
        let chord_y = first.y + (last.y - first.y) * (at.x - first.x) / (last.x - first.x);
        let towers = towers(self.structure, first, last, namer, &mut warnings);
        // The true largest force: |(Oₓ, O_y + C)| is largest where C is extreme.
        let ((lo, x_lo), (hi, x_hi)) = l.c_extremes();
        let (c_peak, x_peak) = if (p.oy + lo).abs() >= (p.oy + hi).abs() { (lo, x_lo) } else { (hi, x_hi) };
        let k_peak = panels.partition_point(|mk| mk.x < x_peak).min(m);
        let peak = Peak { force: p.ox.hypot(p.oy + c_peak), at: nodes[k_peak] };
        let (v, u) = (p.oy / p.ox, 1.0 / p.ox);
        let (profile_length, unstressed) = l.lengths(v, u, p.ox, self.ea);
        let unstressed_length = self.ea.map(|_| unstressed);
        if let Some(ea) = self.ea {
            let strain = s * peak.force / ea;
            if strain <= -1.0 || strain >= 1.0 {
                return Err(self.crushed(ea, peak.force));
            }
        }
        let frame = Frame {
            x0: self.x0,
            y0: self.y0,
            span: self.span,
            anchors: Vec::new(),
            forces: Vec::new(),
            load_line: Vec::new(),
            vertical: true,
            force_scale: l.scale,
        };
        let conditions = self
            .conds
            .iter()
            .map(|c| match *c {
                Cond::MaxForce(t) => (peak.force - t).abs() / t,
                Cond::LevelAt(x) => {
                    let t = p.oy + l.c_at(x - self.x0);
                    t.abs() / p.ox.hypot(t)
                }
                Cond::Length(t) => (profile_length - t).abs() / t,
                Cond::Unstressed(t) => (unstressed - t).abs() / t,
                _ => relative(c, &frame, &poly, s),
            })
            .fold(0.0, f64::max);
        let xs: Vec<f64> = panels.iter().map(|mk| mk.x).collect();
        let checks = Checks {
            equilibrium: equilibrium(&poly, &nodal, s, l.scale),
            closed_form: Some(self.closed_form(l, &poly, &xs, thrust)),
            conditions,
        };
        warnings.extend(checks.warning());
        let pole = Point::new(pole.x, pole.y);
        let n_line = load_line.len() - 1;
        Ok(Solution {
            form: namer.form,
            closing_point: closing_point(pole, load_line[0], load_line[n_line], last - first),
            load_line,
            pole,
            max_segment: max_ray(&poly),
            nodes,
            segments,
            reactions,
            thrust,
            sag: Sag { value: sag_value, x: at.x, chord_y, profile_y: at.y },
            towers,
            conditions: self.conds.iter().map(|c| c.used(namer.form)).collect(),
            node_kinds: panels.iter().map(|mk| mk.kind).collect(),
            profile_length,
            unstressed_length,
            iterations,
            peak,
            at_supports,
            checks,
            warnings,
            sketch: None,
        })
    }

    /// The error for a force beyond the axial stiffness.
    pub fn crushed(&self, ea: f64, force: f64) -> SolveError {
        let namer = self.namer;
        let reason = if let Some(c) = self.conds.iter().find(|c| matches!(c, Cond::Unstressed(_))) {
            format!(
                "{} is too short for these supports: stretching it to reach them takes a force of {}, beyond {} (a strain over 100%); give a longer unstressed length",
                namer.name(c),
                namer.force(force),
                namer.stiffness(ea)
            )
        } else {
            format!(
                "its largest force, {}, reaches {}: the axial strain would exceed 100%; check the stiffness and its unit",
                namer.force(force),
                namer.stiffness(ea)
            )
        };
        SolveError::NoSolution { form: namer.form, list: namer.list(self.conds), reason }
    }

    /// Largest |y − (chord − s·M/H)| over the nodes, divided by the span, M
    /// from [`continuous_moments`] (the loads' resultants, the beam way).
    fn closed_form(&self, l: &Loading, poly: &Polygon<f64>, xs: &[f64], thrust: f64) -> f64 {
        let lumps: Vec<Lump> = (0..l.cells.len())
            .filter(|&i| l.cells[i].own != Own::None)
            .filter_map(|i| {
                let c = &l.cells[i];
                let h = l.h(i);
                let force = l.totals[i] - 0.5 * h * (c.w0 + c.w1);
                let left = l.lefts[i] - h * (2.0 * c.w0 + c.w1) / 6.0;
                (force != 0.0).then(|| Lump { to: l.xs[i + 1], force, at: l.xs[i] + h * (force - left) / force })
            })
            .collect();
        let m = continuous_moments(&self.points, &self.stretches, &lumps, self.span, xs);
        let nodes = &poly.nodes;
        let (first, last) = (nodes[0], nodes[nodes.len() - 1]);
        nodes
            .iter()
            .zip(&m)
            .map(|(n, m)| {
                let chord = first[1] + (last[1] - first[1]) * (n[0] - first[0]) / self.span;
                (n[1] - (chord - self.s * m / thrust)).abs() / self.span
            })
            .fold(0.0, f64::max)
    }
}

/// The panel points of a drawing.
#[derive(Clone, Debug)]
pub(crate) struct Plan {
    /// Every node, left to right.
    pub points: Vec<Mark>,
    /// Panels in each interval between marks.
    pub counts: Vec<f64>,
    /// True when the panel limit coarsened the drawing.
    pub capped: bool,
    /// The warning when it did.
    pub warning: Option<String>,
}

/// Largest node imbalance over the scale of the loads, each segment's force
/// taken along the drawn segment (as in `assemble`).
fn equilibrium(poly: &Polygon<f64>, nodal: &[f64], s: f64, scale: f64) -> f64 {
    let force = |k: usize| {
        let (a, b) = (poly.nodes[k], poly.nodes[k + 1]);
        let d = Vec2::new(b[0] - a[0], b[1] - a[1]);
        let t = Vec2::new(poly.rays[k][0], poly.rays[k][1]);
        if d.hypot() > 0.0 { s * t.hypot() * d / d.hypot() } else { t }
    };
    let m = poly.rays.len();
    (1..m).map(|k| (force(k) - force(k - 1) + Vec2::new(0.0, -nodal[k])).hypot() / scale).fold(0.0, f64::max)
}
