//! Following the designer's sketch: of the funiculars of the given loads that
//! meet the given conditions, the one nearest to a drawn shape.
//!
//! For vertical loads (point and distributed) every funicular is
//! y(x) = a + b·X − s·c·M₀(X), X = x − x_L, with M₀ the simple-beam moment of
//! the loads over the span, c = 1/H and s = +1 for a cable, −1 for an arch
//! (Beer & Johnston, *Vector Mechanics for Engineers: Statics*, §7.8–7.9).
//! This is linear in (a, b, c), and so are the conditions that may go with a
//! sketch: a fixed support or `--through` point (a height), `--thrust`
//! (c = 1/H) and `--level-at` (b − s·c·M₀′(X) = 0, M₀′ the beam's shear).
//!
//! The sketch is measured at its vertices — the points the drafter placed
//! (arcs, bulges and splines come flattened into vertices by the reader) —
//! each vertex between the supports' x counting once. The nearest funicular
//! minimises the sum of squared vertical deviations subject to the
//! conditions as equalities: the conditions are completed to a square system
//! by unit rows (the best-conditioned choice), which expresses (a, b, c) as a
//! point plus a combination of the free directions, and the reduced problem
//! is solved by Householder QR ([`super::dense::least_squares`]). The fit is
//! then turned into conditions of the normal solve — `--thrust 1/c` unless a
//! thrust is given, and points on the fitted curve above tower axes — so
//! the polygon, its checks, the layout and the report are those of any
//! solve.
//!
//! With three conditions already (fixed supports count) the sketch supplies
//! none and is only compared. Conditions that are not linear in (a, b, c)
//! (`--sag`, `--rise`, `--max-force`, the lengths), inclined loads and the
//! profile's own weight make the family nonlinear; with a sketch that has
//! to supply conditions they are refused.

use kurbo::Point;

use super::ask::{self, Cond, Namer};
use super::closed_form::continuous_moments;
use super::dense::{SINGULAR, least_squares, solve3};
use super::loading::Stretch;
use super::solve_with;
use super::types::{Condition, Form, SketchFit, Solution, SolveError, SolveOptions};
use crate::model::{Structure, Support, fmt_num};

/// Largest distance between the solved polygon's nodes and the fitted curve,
/// relative to the span, before a warning: both are exact, so anything above
/// round-off means a slip (our choice).
const AGREE: f64 = 1e-9;

/// Finds the funicular of `structure`'s loads nearest to the `sketch` (its
/// vertices in drawing coordinates, in either direction) that meets
/// `conditions` and the fixed supports, and solves it as [`solve_with`] does.
///
/// When the conditions and fixed supports are fewer than three, the sketch
/// supplies the rest by least squares of the vertical deviations at its
/// vertices between the supports; when they are three, the solve is the
/// usual one and the sketch is only compared (a warning says so). Either
/// way [`Solution::sketch`] holds the deviations.
///
/// # Errors
///
/// Those of [`solve_with`], and [`SolveError::Sketch`] when no vertex lies
/// on the span or too few to fix what is free, when the sketch must supply
/// conditions but a condition, an inclined load or the self-weight makes
/// the family nonlinear, or when the nearest funicular bends the wrong way
/// for the form asked (or is straight).
pub fn follow_sketch(
    structure: &Structure,
    form: Form,
    conditions: &[Condition],
    sketch: &[Point],
    options: &SolveOptions,
) -> Result<Solution, SolveError> {
    let namer = Namer { units: structure.units(), form };
    let local = Local::new(structure, form);
    let used = local.used(sketch)?;
    let fixed = [structure.left(), structure.right()].iter().filter(|s| s.fixed_point().is_some()).count();
    if fixed + conditions.len() >= 3 {
        let mut sol = solve_with(structure, form, conditions, options)?;
        let ys = profile_at(structure, &sol, &local, options, &used);
        let fit = deviations(&used, &ys, Vec::new(), false);
        sol.warnings.push(format!(
            "the conditions are three already, so the sketch was only compared with the profile (rms {}, largest {} at x = {}); drop a condition to let the sketch supply it",
            namer.length(fit.rms),
            namer.length(fit.max),
            fmt_num(fit.at.x)
        ));
        sol.sketch = Some(fit);
        return Ok(sol);
    }

    ask::check_options(&namer, options)?;
    let user: Vec<Cond> = conditions.iter().map(|c| Cond::from(*c)).collect();
    for c in &user {
        ask::check_value(structure, &namer, c)?;
    }
    refuse_nonlinear(structure, &namer, &user, options)?;
    if local.w == 0.0 {
        return Err(SolveError::Sketch {
            problem: "there are no loads to find a funicular of; draw the loads (a sketch alone gives no shape)".into(),
        });
    }

    // The conditions as rows of z = (a/L, b, c·W): fixed supports first.
    let mut conds: Vec<Cond> = Vec::new();
    if let Some(p) = structure.left().fixed_point() {
        conds.push(Cond::Left(p));
    }
    if let Some(p) = structure.right().fixed_point() {
        conds.push(Cond::Right(p));
    }
    conds.extend(user.iter().copied());
    let rows: Vec<([f64; 3], f64)> = conds.iter().map(|c| local.row(c)).collect();
    let z = local.fit(&rows, &used, &namer, &conds)?;
    let s = form.sign();
    // z₂ = W/H: positive for the form asked.
    if z[2] <= 1e-9 {
        return Err(wrong_way(form, z[2]));
    }

    // The fit as conditions of the normal solve.
    let mut basis: Vec<[f64; 3]> = Vec::new();
    for (a, _) in &rows {
        independent(&mut basis, *a);
    }
    let mut candidates: Vec<Cond> = Vec::new();
    if !user.iter().any(|c| matches!(c, Cond::Thrust(_))) {
        candidates.push(Cond::Thrust(local.w / z[2]));
    }
    let on_curve = |x_local: f64| {
        let m = local.moments(&[x_local])[0];
        Point::new(local.x0 + x_local, local.y0 + local.l * (z[0] + z[1] * x_local / local.l) - s * z[2] * m / local.w)
    };
    if matches!(structure.left(), Support::Axis { .. }) {
        candidates.push(Cond::Through(on_curve(0.0)));
    }
    if matches!(structure.right(), Support::Axis { .. }) {
        candidates.push(Cond::Through(on_curve(local.l)));
    }
    candidates.push(Cond::Through(on_curve(local.l / 2.0)));
    let mut supplied: Vec<Cond> = Vec::new();
    for c in candidates {
        if conds.len() + supplied.len() == 3 {
            break;
        }
        if independent(&mut basis, local.row(&c).0) {
            supplied.push(c);
        }
    }
    let all: Vec<Condition> = conditions.iter().copied().chain(supplied.iter().map(|c| condition(*c))).collect();
    let mut sol = solve_with(structure, form, &all, options)?;

    // The polygon's nodes lie on the fitted curve.
    let xs: Vec<f64> = sol.nodes.iter().map(|p| (p.x - local.x0).clamp(0.0, local.l)).collect();
    let fitted = local.curve(z, &xs);
    let stray = sol.nodes.iter().zip(&fitted).map(|(p, y)| (p.y - y).abs()).fold(0.0, f64::max) / local.l;
    if stray > AGREE {
        sol.warnings.push(format!(
            "the profile strays from the curve fitted to the sketch by {} of the span; treat the result with care",
            fmt_num(stray)
        ));
    }
    let xs: Vec<f64> = used.iter().map(|(x, _)| *x).collect();
    let ys = local.curve(z, &xs);
    sol.sketch = Some(deviations(&used, &ys, supplied.iter().map(|c| c.used(form)).collect(), true));
    Ok(sol)
}

/// The problem in local coordinates: X from the left support, heights from
/// its point (or an axis's foot), loads as the simple beam sees them.
struct Local {
    x0: f64,
    y0: f64,
    l: f64,
    s: f64,
    /// Point loads (X, W), W downward positive (vertical components).
    points: Vec<(f64, f64)>,
    /// Distributed loads, local.
    stretches: Vec<Stretch>,
    /// Σ|W| + Σ distributed totals: the force scale.
    w: f64,
}

impl Local {
    fn new(structure: &Structure, form: Form) -> Local {
        let x0 = structure.left().x();
        let y0 = match structure.left() {
            Support::Point { at, .. } => at.y,
            Support::Axis { foot, .. } => *foot,
        };
        let points: Vec<(f64, f64)> = structure.loads().iter().map(|l| (l.anchor.x - x0, -l.force.y)).collect();
        let stretches: Vec<Stretch> = structure
            .distributed()
            .iter()
            .map(|d| Stretch { x0: d.x0 - x0, x1: d.x1 - x0, w0: d.w0, w1: d.w1 })
            .collect();
        let w = points.iter().map(|p| p.1.abs()).sum::<f64>()
            + structure.distributed().iter().map(|d| d.total()).sum::<f64>();
        Local { x0, y0, l: structure.span(), s: form.sign(), points, stretches, w }
    }

    /// The sketch's vertices on the span as (X, vertex), sorted by X.
    fn used(&self, sketch: &[Point]) -> Result<Vec<(f64, Point)>, SolveError> {
        // Ends snapped to a support may miss its x by round-off (our choice).
        let slack = 1e-9 * self.l;
        let mut used: Vec<(f64, Point)> = sketch
            .iter()
            .filter(|p| p.x >= self.x0 - slack && p.x <= self.x0 + self.l + slack)
            .map(|p| ((p.x - self.x0).clamp(0.0, self.l), *p))
            .collect();
        used.sort_by(|a, b| a.0.total_cmp(&b.0));
        if used.is_empty() {
            return Err(SolveError::Sketch {
                problem: format!(
                    "none of its {} vertices lies between the supports (x = {} to {}); draw the sketch from support to support",
                    sketch.len(),
                    fmt_num(self.x0),
                    fmt_num(self.x0 + self.l)
                ),
            });
        }
        Ok(used)
    }

    /// Simple-beam moments at sorted local `xs`.
    fn moments(&self, xs: &[f64]) -> Vec<f64> {
        continuous_moments(&self.points, &self.stretches, &[], self.l, xs)
    }

    /// Simple-beam shear just right of local x: the left reaction less the
    /// loads left of x (statics, common practice, no source).
    fn shear(&self, x: f64) -> f64 {
        let mut moment = 0.0;
        let mut left = 0.0;
        for &(xj, wj) in &self.points {
            moment += wj * (self.l - xj);
            if xj <= x {
                left += wj;
            }
        }
        for s in &self.stretches {
            let total = 0.5 * (s.w0 + s.w1) * (s.x1 - s.x0);
            let sum = s.w0 + s.w1;
            let bar =
                if sum == 0.0 { 0.5 * (s.x0 + s.x1) } else { s.x0 + (s.x1 - s.x0) * (s.w0 + 2.0 * s.w1) / (3.0 * sum) };
            moment += total * (self.l - bar);
            if x > s.x0 {
                let to = x.min(s.x1);
                left += 0.5 * (s.w0 + s.at(to)) * (to - s.x0);
            }
        }
        moment / self.l - left
    }

    /// A condition's row a·z = e, z = (a/L, b, c·W).
    fn row(&self, c: &Cond) -> ([f64; 3], f64) {
        let (l, w, s) = (self.l, self.w, self.s);
        let height = |p: Point| {
            let x = (p.x - self.x0).clamp(0.0, l);
            let m = self.moments(&[x])[0];
            ([1.0, x / l, -s * m / (w * l)], (p.y - self.y0) / l)
        };
        match *c {
            Cond::Left(p) | Cond::Right(p) | Cond::Through(p) => height(p),
            Cond::Thrust(h) => ([0.0, 0.0, 1.0], w / h),
            Cond::LevelAt(x) => ([0.0, 1.0, -s * self.shear(x - self.x0) / w], 0.0),
            // Refused before any row is asked for (refuse_nonlinear).
            Cond::Sag(_) | Cond::MaxForce(_) | Cond::Length(_) | Cond::Unstressed(_) => ([0.0; 3], 0.0),
        }
    }

    /// The curve's drawing y at sorted local `xs`.
    fn curve(&self, z: [f64; 3], xs: &[f64]) -> Vec<f64> {
        let m = self.moments(xs);
        xs.iter()
            .zip(&m)
            .map(|(x, m)| self.y0 + self.l * (z[0] + z[1] * x / self.l) - self.s * z[2] * m / self.w)
            .collect()
    }

    /// The least-squares z under the condition rows as equalities.
    fn fit(
        &self,
        rows: &[([f64; 3], f64)],
        used: &[(f64, Point)],
        namer: &Namer,
        conds: &[Cond],
    ) -> Result<[f64; 3], SolveError> {
        let k = rows.len();
        // Complete the conditions with unit rows into the best-conditioned
        // square system S; then z = S⁻¹(e, t) for free t.
        let mut best: Option<(f64, [[f64; 3]; 3])> = None;
        for free in subsets(3 - k) {
            let mut m = [[0.0; 3]; 3];
            for (i, (a, _)) in rows.iter().enumerate() {
                m[i] = *a;
            }
            for (i, &j) in free.iter().enumerate() {
                m[k + i][j] = 1.0;
            }
            let d = det(&m).abs();
            if best.is_none_or(|(b, _)| d > b) {
                best = Some((d, m));
            }
        }
        let Some((_, m)) = best.filter(|(d, _)| *d > SINGULAR) else {
            return Err(SolveError::Dependent {
                list: namer.list(conds),
                problem: "fix the same thing".into(),
                advice: "drop one of them (the sketch supplies what is left free)".into(),
            });
        };
        let mut e = [0.0; 3];
        for (i, (_, v)) in rows.iter().enumerate() {
            e[i] = *v;
        }
        let singular = || SolveError::Sketch { problem: "its conditions could not be completed; drop one".into() };
        let z0 = solve3(m, e).ok_or_else(singular)?;
        let dirs: Vec<[f64; 3]> = (k..3)
            .map(|i| {
                let mut t = [0.0; 3];
                t[i] = 1.0;
                solve3(m, t).ok_or_else(singular)
            })
            .collect::<Result<_, _>>()?;
        let xs: Vec<f64> = used.iter().map(|(x, _)| *x).collect();
        let ms = self.moments(&xs);
        let a: Vec<[f64; 3]> =
            xs.iter().zip(&ms).map(|(x, mm)| [1.0, x / self.l, -self.s * mm / (self.w * self.l)]).collect();
        let dot = |r: &[f64; 3], v: &[f64; 3]| r[0] * v[0] + r[1] * v[1] + r[2] * v[2];
        let cols: Vec<Vec<f64>> = dirs.iter().map(|d| a.iter().map(|r| dot(r, d)).collect()).collect();
        let rhs: Vec<f64> = a.iter().zip(used).map(|(r, (_, p))| (p.y - self.y0) / self.l - dot(r, &z0)).collect();
        let t = least_squares(&cols, &rhs).ok_or_else(|| SolveError::Sketch {
            problem: format!(
                "its {} vertices between the supports cannot fix the {} thing(s) the conditions leave free; draw the sketch with vertices spread along the span",
                used.len(),
                3 - k
            ),
        })?;
        let mut z = z0;
        for (d, t) in dirs.iter().zip(&t) {
            for (zi, di) in z.iter_mut().zip(d) {
                *zi += t * di;
            }
        }
        Ok(z)
    }
}

/// The index sets of size `n` of {0, 1, 2}.
fn subsets(n: usize) -> Vec<Vec<usize>> {
    match n {
        0 => vec![vec![]],
        1 => vec![vec![0], vec![1], vec![2]],
        2 => vec![vec![0, 1], vec![0, 2], vec![1, 2]],
        _ => vec![vec![0, 1, 2]],
    }
}

fn det(m: &[[f64; 3]; 3]) -> f64 {
    m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0])
        + m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0])
}

/// Adds `row` to the orthonormal `basis` when it is independent of it.
fn independent(basis: &mut Vec<[f64; 3]>, row: [f64; 3]) -> bool {
    let norm = |v: &[f64; 3]| (v[0] * v[0] + v[1] * v[1] + v[2] * v[2]).sqrt();
    let scale = norm(&row);
    let mut v = row;
    for b in basis.iter() {
        let d = v[0] * b[0] + v[1] * b[1] + v[2] * b[2];
        for (vi, bi) in v.iter_mut().zip(b) {
            *vi -= d * bi;
        }
    }
    let n = norm(&v);
    if n.is_nan() || n <= 1e-9 * scale {
        return false;
    }
    basis.push([v[0] / n, v[1] / n, v[2] / n]);
    true
}

fn condition(c: Cond) -> Condition {
    match c {
        Cond::Thrust(h) => Condition::Thrust(h),
        // Only thrusts and points are supplied.
        Cond::Through(p) | Cond::Left(p) | Cond::Right(p) => Condition::Through(p),
        Cond::Sag(f) => Condition::Sag(f),
        Cond::MaxForce(t) => Condition::MaxForce(t),
        Cond::LevelAt(x) => Condition::LevelAt(x),
        Cond::Length(l) => Condition::Length(l),
        Cond::Unstressed(l) => Condition::UnstressedLength(l),
    }
}

/// Refuses what makes the family of funiculars nonlinear in (a, b, c).
fn refuse_nonlinear(
    structure: &Structure,
    namer: &Namer,
    user: &[Cond],
    options: &SolveOptions,
) -> Result<(), SolveError> {
    let fix = "give three conditions in all (fixed supports count), and the sketch is only compared";
    if let Some(c) =
        user.iter().find(|c| matches!(c, Cond::Sag(_) | Cond::MaxForce(_) | Cond::Length(_) | Cond::Unstressed(_)))
    {
        return Err(SolveError::Sketch {
            problem: format!(
                "it cannot supply conditions together with {}, which is not linear in the funicular's parameters; replace it with --thrust, --through or --level-at, or {fix}",
                namer.name(c)
            ),
        });
    }
    if let Some(q) = options.self_weight {
        return Err(SolveError::Sketch {
            problem: format!(
                "it cannot supply conditions with {}: the load then depends on the shape; {fix}",
                namer.self_weight(q)
            ),
        });
    }
    if let Some(l) = structure.loads().iter().find(|l| !l.is_vertical()) {
        return Err(SolveError::Sketch {
            problem: format!(
                "it cannot supply conditions when a load is inclined (the load at {}); draw the loads vertical, or {fix}",
                l.origin
            ),
        });
    }
    Ok(())
}

/// The error for a fit that bends the wrong way (or not at all).
fn wrong_way(form: Form, z2: f64) -> SolveError {
    let problem = if z2.abs() <= 1e-9 {
        "it is straight: only an infinite thrust fits it; draw the sag or rise you intend".to_string()
    } else if form == Form::Cable {
        "it bends the wrong way for a cable: the funicular nearest to it stands above its chord, in compression; give --arch for an arch, or redraw the sketch hanging below the supports".to_string()
    } else {
        "it bends the wrong way for an arch: the funicular nearest to it hangs below its chord, in tension; drop --arch for a cable, or redraw the sketch standing above the supports".to_string()
    };
    SolveError::Sketch { problem }
}

/// The solved profile's y at each used vertex: the closed form from the
/// solution's ends and thrust for vertical loads without self-weight, else
/// the polygon's (straight between nodes).
fn profile_at(
    structure: &Structure,
    sol: &Solution,
    local: &Local,
    options: &SolveOptions,
    used: &[(f64, Point)],
) -> Vec<f64> {
    let (first, last) = (sol.nodes[0], sol.nodes[sol.nodes.len() - 1]);
    if structure.all_vertical() && options.self_weight.is_none() && local.w > 0.0 {
        let xs: Vec<f64> = used.iter().map(|(x, _)| *x).collect();
        let m = local.moments(&xs);
        return xs
            .iter()
            .zip(&m)
            .map(|(x, m)| first.y + (last.y - first.y) * x / local.l - local.s * m / sol.thrust)
            .collect();
    }
    used.iter()
        .map(|(_, p)| {
            let i = sol.nodes.partition_point(|n| n.x < p.x).clamp(1, sol.nodes.len() - 1);
            let (a, b) = (sol.nodes[i - 1], sol.nodes[i]);
            if b.x == a.x { b.y } else { a.y + (b.y - a.y) * (p.x - a.x) / (b.x - a.x) }
        })
        .collect()
}

/// The deviations of the used vertices from the profile's `ys`.
fn deviations(
    used: &[(f64, Point)],
    ys: &[f64],
    conditions_supplied: Vec<super::UsedCondition>,
    fitted: bool,
) -> SketchFit {
    let mut sum = 0.0;
    let (mut max, mut at) = (0.0, used[0].1);
    for ((_, p), y) in used.iter().zip(ys) {
        let d = (p.y - y).abs();
        sum += d * d;
        if d > max {
            max = d;
            at = *p;
        }
    }
    SketchFit { points_used: used.len(), rms: (sum / used.len() as f64).sqrt(), max, at, conditions_supplied, fitted }
}
