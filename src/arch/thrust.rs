//! Thrust lines through a [`super::Ring`]: given, least and greatest, least thickness, load factor.
//!
//! # The statics
//!
//! Let `R = (H, V)` be the left reaction (the force the left abutment exerts
//! on the arch) and `M₀` its moment about the origin: `M₀ = a × R` for any
//! point `a` on its line of action, with `p × q = p.x q.y − p.y q.x`.
//! Block `k` carries the loads `F_ki` applied at `a_ki`. The part of the arch
//! left of joint `j` (the blocks `k < j`) pushes on the part to its right with
//!
//! ```text
//! S_j = R + D_j,        D_j = Σ_{k<j} Σ_i F_ki,
//! M_j = M₀ + m_j,       m_j = Σ_{k<j} Σ_i a_ki × F_ki,
//! ```
//!
//! where `M_j` is the moment of `S_j` about the origin, so the line of action
//! of `S_j` is the set of points `p` with
//!
//! ```text
//! f_j(p) = p × S_j − M_j = −p.y H + p.x V − M₀ + (p × D_j − m_j) = 0.
//! ```
//!
//! `f_j` is affine in `p` and linear in the unknowns `(H, V, M₀)`. Along the
//! joint, `p(s) = i + s (e − i)` from the intrados `i` (`s = 0`) to the
//! extrados `e` (`s = 1`), `f_j(p(s)) = (1 − s) f_j(i) + s f_j(e)`, so the
//! centre of pressure is at
//!
//! ```text
//! s_j = f_j(i) / (f_j(i) − f_j(e)),     f_j(i) − f_j(e) = −(e − i) × S_j = N_j ℓ_j,
//! ```
//!
//! `N_j` being the component of `S_j` normal to the joint (positive when the
//! left part pushes on the right one) and `ℓ_j` the joint's length. The
//! centre of pressure lies within the joint *and* the joint is in compression
//! iff
//!
//! ```text
//! f_j(i) ≥ 0   and   f_j(e) ≤ 0,
//! ```
//!
//! two inequalities linear in `(H, V, M₀)`. A thrust line fits in the ring
//! iff `(H, V, M₀)` meets all `2 (n + 1)` of them: the feasible set is a
//! convex polyhedron. Minimising or maximising `H` over it is a linear
//! programme, which the simplex method solves exactly at a vertex; the
//! constraints active there are the joints where the line touches a face, the
//! hinges of the mechanism. That is why this module uses linear programming
//! (the `microlp` crate) rather than a search over trial lines.
//!
//! Each row is divided by the joint's length, so that its value is the
//! position along the joint times the normal force; lengths are scaled by the
//! ring's size and forces by its total load before solving, and every result
//! is scaled back.
//!
//! The hypotheses are those of limit analysis for masonry: no tension, no
//! crushing, no sliding. Only the first enters the constraints above.

use kurbo::{Point, Vec2};
use microlp::{ComparisonOp, OptimizationDirection, Problem, SolveOptions, Variable};

use super::{BlockLoad, Crossing, Face, Hinge, Joint, Ring, ThrustLine};

/// How close to a face, as a fraction of the joint's length, a centre of
/// pressure must be for the joint to count as a hinge.
pub const HINGE_TOLERANCE: f64 = 1e-7;

/// Coefficients of a programme's row below this fraction of the row's
/// largest are round-off of a zero, and set to zero.
const ROUND_OFF: f64 = 1e-13;

/// The least normal force across a joint, as a fraction of the total load,
/// that the programmes accept: well above the solver's feasibility
/// tolerance ([`FEASIBILITY`]), so that a centre of pressure is always
/// defined and placed to within `FEASIBILITY / COMPRESSION_MARGIN` of a
/// joint's length at worst (a joint whose force nearly runs along it).
pub const COMPRESSION_MARGIN: f64 = 1e-6;

/// The solver's feasibility tolerance on each row (a position along a
/// joint times the normal force, as a fraction of the total load).
pub const FEASIBILITY: f64 = 1e-10;

/// The largest thickness ratio [`least_thickness`] tries before giving up.
pub const MAX_RATIO: f64 = 1e3;

/// The relative precision of the ratio found by [`least_thickness`].
pub const RATIO_PRECISION: f64 = 1e-10;

/// Why no thrust line could be found.
#[derive(Debug, thiserror::Error, PartialEq)]
pub enum ThrustError {
    /// The ring breaks one of its invariants.
    #[error("the arch is malformed: {reason}; re-slice it from its outline")]
    Malformed {
        /// What is wrong.
        reason: String,
    },
    /// A number in the input is NaN or infinite.
    #[error("{what} is not a finite number; check the drawing and the loads")]
    NotFinite {
        /// Which number.
        what: String,
    },
    /// The loads add up to nothing, so no thrust is defined.
    #[error("the arch carries no load; give it its own weight or some applied loads")]
    NoLoad,
    /// A given horizontal thrust is zero or negative.
    #[error(
        "the horizontal thrust {horizontal} is not positive; an arch's thrust pushes outward, give a value above 0"
    )]
    NonPositiveThrust {
        /// The thrust given.
        horizontal: f64,
    },
    /// The springing points given lie on one vertical, so the thrust cannot
    /// be found from them.
    #[error("the two springing points lie on one vertical; choose points apart horizontally")]
    VerticalSpan,
    /// The three points given do not determine a thrust line.
    #[error(
        "the three points given lie on one line or do not define a thrust; choose a crown point off the springing chord"
    )]
    Indeterminate,
    /// A live-load list does not match the ring's blocks.
    #[error("{live} live-load lists were given for {blocks} voussoirs; give one list per voussoir")]
    LiveMismatch {
        /// The number of voussoirs.
        blocks: usize,
        /// The number of lists given.
        live: usize,
    },
    /// No thrust line fits.
    #[error("no thrust line fits inside the arch under these loads{}; make the arch thicker, or change its shape or its loads", needed_text(*.needed))]
    NoFit {
        /// The least thickness ratio that would hold a thrust line (every
        /// joint scaled about its middle, loads kept), where it was found.
        needed: Option<f64>,
    },
    /// The linear-programming solver failed.
    #[error("the linear-programming solver failed ({reason}); check the arch for near-duplicate or extreme joints")]
    Solver {
        /// The solver's message.
        reason: String,
    },
}

fn needed_text(needed: Option<f64>) -> String {
    match needed {
        Some(ratio) => format!(" (it would need the arch {ratio:.4} times as thick)"),
        None => format!(" (not even at {MAX_RATIO} times its thickness)"),
    }
}

/// The least and greatest horizontal thrust of the thrust lines that fit.
#[derive(Clone, Debug, PartialEq)]
pub struct ThrustRange {
    /// The thrust line of least horizontal thrust (the passive state).
    pub min: ThrustLine,
    /// The thrust line of greatest horizontal thrust (the active state), or
    /// `None` when the thrust can grow without bound (a flat arch).
    pub max: Option<ThrustLine>,
}

/// The thinnest arch on the same centre line that holds a thrust line.
#[derive(Clone, Debug, PartialEq)]
pub struct Thinnest {
    /// The least ratio `λ*` of the thickness to the ring's: above 1 the ring
    /// as drawn holds no thrust line; `1 / λ*` is the geometric factor of
    /// safety.
    pub ratio: f64,
    /// A thrust line that fits the scaled joints, its crossings and hinges
    /// measured on them.
    pub line: ThrustLine,
    /// The ring's joints scaled by `ratio` about their mid-points.
    pub joints: Vec<Joint>,
}

/// The factor on a live load at which the arch becomes a mechanism.
#[derive(Clone, Debug, PartialEq)]
pub struct LoadFactor {
    /// The largest factor `α` such that a thrust line fits under the dead
    /// load plus `α` times the live load; `None` when no factor is too large.
    pub factor: Option<f64>,
    /// The thrust line at that factor, with its hinges; `None` with `factor`.
    pub line: Option<ThrustLine>,
}

/// The thrust line with horizontal thrust `horizontal` through the points at
/// positions `left` along the first joint and `right` along the last
/// (0 at the intrados, 1 at the extrados, ½ in the middle).
///
/// With `a` the left point and `b` the right one, `M₀ = a × R` and
/// `f_n(b) = 0` give `V (b.x − a.x) = (b.y − a.y) H − b × D_n + m_n`. The line
/// need not fit: crossings outside `[0, 1]` show where it leaves the arch.
pub fn through(ring: &Ring, horizontal: f64, left: f64, right: f64) -> Result<ThrustLine, ThrustError> {
    let model = Model::new(ring, None)?;
    check_thrust(horizontal)?;
    finite(left, "the left position")?;
    finite(right, "the right position")?;
    let h = horizontal / model.force;
    let a = model.joints[0].at(left);
    let b = model.joints[model.joints.len() - 1].at(right);
    let n = model.joints.len() - 1;
    let dx = b.x - a.x;
    if dx.abs() <= 1e-12 {
        return Err(ThrustError::VerticalSpan);
    }
    let v = ((b.y - a.y) * h - cross(b.to_vec2(), model.dead.sum[n]) + model.dead.moment[n]) / dx;
    let m0 = cross(a.to_vec2(), Vec2::new(h, v));
    Ok(model.trace(&model.dead, &model.joints, Unknowns { h, v, m0 }))
}

/// The thrust line through three points: at position `left` along the first
/// joint, `position` along joint `joint`, and `right` along the last — the
/// thrust line of a three-hinged arch with its hinges there.
///
/// The three conditions `f_0(a) = 0`, `f_joint(c) = 0`, `f_n(b) = 0` are
/// linear in `(H, V, M₀)` and solved directly.
pub fn through_three(
    ring: &Ring,
    left: f64,
    joint: usize,
    position: f64,
    right: f64,
) -> Result<ThrustLine, ThrustError> {
    let model = Model::new(ring, None)?;
    finite(left, "the left position")?;
    finite(position, "the crown position")?;
    finite(right, "the right position")?;
    let n = model.joints.len() - 1;
    if joint == 0 || joint >= n {
        return Err(ThrustError::Malformed {
            reason: format!("the crown joint {joint} is not between the springings (1 to {})", n.saturating_sub(1)),
        });
    }
    // Each row: −p.y H + p.x V − M₀ = −(p × D_j − m_j).
    let row = |j: usize, p: Point| ([-p.y, p.x, -1.0], -(cross(p.to_vec2(), model.dead.sum[j]) - model.dead.moment[j]));
    let rows = [
        row(0, model.joints[0].at(left)),
        row(joint, model.joints[joint].at(position)),
        row(n, model.joints[n].at(right)),
    ];
    let x = solve3(&rows).ok_or(ThrustError::Indeterminate)?;
    if x[0].is_nan() || x[0] <= 0.0 {
        return Err(ThrustError::NonPositiveThrust { horizontal: x[0] * model.force });
    }
    Ok(model.trace(&model.dead, &model.joints, Unknowns { h: x[0], v: x[1], m0: x[2] }))
}

/// The least and greatest horizontal thrust of the thrust lines that fit in
/// the ring, each with its line and hinges.
///
/// Two linear programmes over `(H, V, M₀)` (see the module's doc): minimise
/// `H`, then maximise it. A ring that holds no thrust line gives
/// [`ThrustError::NoFit`] with the thickness ratio it would need.
pub fn thrust_range(ring: &Ring) -> Result<ThrustRange, ThrustError> {
    let model = Model::new(ring, None)?;
    let Some(low) = model.solve(1.0, Goal::MinThrust)? else {
        return Err(model.no_fit());
    };
    let min = model.trace(&model.dead, &model.joints, low);
    let max = model.solve(1.0, Goal::MaxThrust)?.map(|high| model.trace(&model.dead, &model.joints, high));
    Ok(ThrustRange { min, max })
}

/// A thrust line that fits in the ring (the one of least thrust), or `None`
/// when none does.
///
/// Cheap enough to call at every trial thickness of a search that re-slices
/// the arch each time (so that the loads follow the thickness).
pub fn fits(ring: &Ring) -> Result<Option<ThrustLine>, ThrustError> {
    let model = Model::new(ring, None)?;
    Ok(model.solve(1.0, Goal::MinThrust)?.map(|x| model.trace(&model.dead, &model.joints, x)))
}

/// A thrust line (the one of least thrust) within the middle third of every
/// joint, or `None` when none is.
///
/// The rule that a section with its centre of pressure in the middle third
/// is wholly in compression is common practice, no source. The crossings are
/// measured on the ring's own joints, so they lie in `[1/3, 2/3]`; a hinge
/// is reported only where the line touches a face, so none is.
pub fn middle_third(ring: &Ring) -> Result<Option<ThrustLine>, ThrustError> {
    let model = Model::new(ring, None)?;
    Ok(model.solve(1.0 / 3.0, Goal::MinThrust)?.map(|x| model.trace(&model.dead, &model.joints, x)))
}

/// The least thickness: the least ratio `λ` such that a thrust line fits in
/// the ring with every joint scaled by `λ` about its mid-point, the loads
/// held as they are.
///
/// A thrust line fits the scaled joints iff `f_j(p_j(½ − λ/2)) ≥ 0` and
/// `f_j(p_j(½ + λ/2)) ≤ 0` for every `j`: linear in `(H, V, M₀)` for a given
/// `λ`, bilinear otherwise. So `λ` is found by bisection, each trial a
/// linear programme that maximises a common slack `σ` of all the rows: the
/// trial fits iff `σ* ≥ 0`, a test that does not depend on the solver's
/// feasibility tolerance. Every trial's line also fits the joints scaled by
/// `max_j 2 |s_j − ½|`, which tightens the upper end of the bracket.
///
/// Above 1, the ring as drawn holds no thrust line: that is a result, not an
/// error. Where the thickness changes the loads (own weight), call
/// [`fits`] on re-sliced rings instead.
pub fn least_thickness(ring: &Ring) -> Result<Thinnest, ThrustError> {
    let model = Model::new(ring, None)?;
    let (ratio, x) = model.least_ratio()?;
    let joints: Vec<Joint> = model.joints.iter().map(|j| j.scaled(ratio)).collect();
    let line = model.trace(&model.dead, &joints, x);
    let joints = joints.iter().map(|j| model.unscale_joint(j)).collect();
    Ok(Thinnest { ratio, line, joints })
}

/// The largest factor `α` on the live loads such that a thrust line fits
/// under `ring.blocks` plus `α` times `live` (one list per voussoir).
///
/// With the live loads' running sums `L_j` and moments `l_j`,
/// `S_j = R + D_j + α L_j` and `M_j = M₀ + m_j + α l_j`, so the rows stay
/// linear in `(H, V, M₀, α)` and one linear programme maximises `α`. Its
/// line has the hinges of the mechanism (four, in general). The dead load
/// alone must fit ([`ThrustError::NoFit`] otherwise).
pub fn load_factor(ring: &Ring, live: &[Vec<BlockLoad>]) -> Result<LoadFactor, ThrustError> {
    if live.len() != ring.blocks.len() {
        return Err(ThrustError::LiveMismatch { blocks: ring.blocks.len(), live: live.len() });
    }
    let model = Model::new(ring, Some(live))?;
    if model.solve(1.0, Goal::MinThrust)?.is_none() {
        return Err(model.no_fit());
    }
    let Some(live_loads) = &model.live else {
        return Ok(LoadFactor { factor: None, line: None });
    };
    let Some((x, alpha)) = model.max_factor()? else {
        return Ok(LoadFactor { factor: None, line: None });
    };
    let combined = model.dead.plus(live_loads, alpha);
    let line = model.trace(&combined, &model.joints, x);
    Ok(LoadFactor { factor: Some(alpha * model.force / model.live_force), line: Some(line) })
}

// ---------------------------------------------------------------------------

fn cross(a: Vec2, b: Vec2) -> f64 {
    a.x * b.y - a.y * b.x
}

fn finite(x: f64, what: &str) -> Result<(), ThrustError> {
    if x.is_finite() { Ok(()) } else { Err(ThrustError::NotFinite { what: what.to_string() }) }
}

fn check_thrust(horizontal: f64) -> Result<(), ThrustError> {
    finite(horizontal, "the horizontal thrust")?;
    if horizontal > 0.0 { Ok(()) } else { Err(ThrustError::NonPositiveThrust { horizontal }) }
}

/// Solves a 3×3 system by Gaussian elimination with partial pivoting.
fn solve3(rows: &[([f64; 3], f64); 3]) -> Option<[f64; 3]> {
    let mut a = [[0.0; 4]; 3];
    for (r, (c, b)) in a.iter_mut().zip(rows) {
        *r = [c[0], c[1], c[2], *b];
    }
    let scale = a.iter().flat_map(|r| r[..3].iter()).fold(0.0f64, |m, v| m.max(v.abs()));
    for col in 0..3 {
        let pivot = (col..3).max_by(|&p, &q| a[p][col].abs().total_cmp(&a[q][col].abs()))?;
        if a[pivot][col].abs() <= 1e-12 * scale {
            return None;
        }
        a.swap(col, pivot);
        for r in col + 1..3 {
            let k = a[r][col] / a[col][col];
            let pivot_row = a[col];
            for (x, p) in a[r].iter_mut().zip(pivot_row).skip(col) {
                *x -= k * p;
            }
        }
    }
    let mut x = [0.0; 3];
    for r in (0..3).rev() {
        let tail: f64 = (r + 1..3).map(|c| a[r][c] * x[c]).sum();
        x[r] = (a[r][3] - tail) / a[r][r];
    }
    x.iter().all(|v| v.is_finite()).then_some(x)
}

/// The unknowns of a thrust line, in the scaled units.
#[derive(Clone, Copy, Debug)]
struct Unknowns {
    h: f64,
    v: f64,
    m0: f64,
}

/// A set of loads as running sums over the blocks, in the scaled units.
#[derive(Clone, Debug)]
struct Loads {
    /// `D_j`, j = 0..=n.
    sum: Vec<Vec2>,
    /// `m_j`, j = 0..=n.
    moment: Vec<f64>,
    /// Each block's resultant force and moment about the origin.
    block: Vec<(Vec2, f64)>,
    /// A point of each block (the mean of its load points, or of its joint
    /// ends when it has none), to place a vertex when its load is nil.
    centre: Vec<Point>,
}

impl Loads {
    fn new(blocks: &[Vec<BlockLoad>], frame: &Frame, joints: &[Joint]) -> Loads {
        let mut sum = vec![Vec2::ZERO];
        let mut moment = vec![0.0];
        let mut block = Vec::with_capacity(blocks.len());
        let mut centre = Vec::with_capacity(blocks.len());
        for (k, loads) in blocks.iter().enumerate() {
            let mut f = Vec2::ZERO;
            let mut m = 0.0;
            let mut mean = Vec2::ZERO;
            for load in loads {
                let a = frame.point(load.at);
                let force = load.force / frame.force;
                f += force;
                m += cross(a.to_vec2(), force);
                mean += a.to_vec2();
            }
            let c = if loads.is_empty() {
                let (l, r) = (joints[k], joints[k + 1]);
                ((l.intrados.to_vec2() + l.extrados.to_vec2() + r.intrados.to_vec2() + r.extrados.to_vec2()) * 0.25)
                    .to_point()
            } else {
                (mean / loads.len() as f64).to_point()
            };
            block.push((f, m));
            centre.push(c);
            sum.push(sum[k] + f);
            moment.push(moment[k] + m);
        }
        Loads { sum, moment, block, centre }
    }

    /// These loads plus `factor` times `other`.
    fn plus(&self, other: &Loads, factor: f64) -> Loads {
        Loads {
            sum: self.sum.iter().zip(&other.sum).map(|(a, b)| *a + *b * factor).collect(),
            moment: self.moment.iter().zip(&other.moment).map(|(a, b)| a + b * factor).collect(),
            block: self.block.iter().zip(&other.block).map(|(a, b)| (a.0 + b.0 * factor, a.1 + b.1 * factor)).collect(),
            centre: self.centre.clone(),
        }
    }
}

/// The scaling: lengths about `origin` in units of `length`, forces in units
/// of `force` (the total dead load, or the live one when there is none).
#[derive(Clone, Copy, Debug)]
struct Frame {
    origin: Point,
    length: f64,
    force: f64,
}

impl Frame {
    fn point(&self, p: Point) -> Point {
        ((p - self.origin) / self.length).to_point()
    }
    fn unpoint(&self, p: Point) -> Point {
        self.origin + p.to_vec2() * self.length
    }
}

/// What a linear programme optimises.
#[derive(Clone, Copy, Debug, PartialEq)]
enum Goal {
    MinThrust,
    MaxThrust,
    /// Maximise the common slack of every row (see [`least_thickness`]).
    MaxSlack,
}

/// A ring in the scaled units, ready for the programmes.
struct Model {
    frame: Frame,
    /// Scaled joints.
    joints: Vec<Joint>,
    dead: Loads,
    /// The live loads scaled by `live_force`, when there are any.
    live: Option<Loads>,
    /// Force units: `force` for the dead load, `live_force` for the live.
    force: f64,
    live_force: f64,
}

impl Model {
    fn new(ring: &Ring, live: Option<&[Vec<BlockLoad>]>) -> Result<Model, ThrustError> {
        let n = ring.blocks.len();
        if ring.joints.len() != n + 1 || n == 0 {
            return Err(ThrustError::Malformed {
                reason: format!(
                    "{} joints for {} voussoirs, need one more joint than voussoirs and at least one voussoir",
                    ring.joints.len(),
                    n
                ),
            });
        }
        for (j, joint) in ring.joints.iter().enumerate() {
            for (p, face) in [(joint.intrados, "intrados"), (joint.extrados, "extrados")] {
                if !(p.x.is_finite() && p.y.is_finite()) {
                    return Err(ThrustError::NotFinite { what: format!("the {face} end of joint {j}") });
                }
            }
        }
        let check_loads = |blocks: &[Vec<BlockLoad>], what: &str| -> Result<f64, ThrustError> {
            let mut total = 0.0;
            for (k, loads) in blocks.iter().enumerate() {
                for load in loads {
                    if ![load.at.x, load.at.y, load.force.x, load.force.y].iter().all(|v| v.is_finite()) {
                        return Err(ThrustError::NotFinite { what: format!("a {what} on voussoir {k}") });
                    }
                    total += load.force.hypot();
                }
            }
            if total.is_finite() {
                Ok(total)
            } else {
                Err(ThrustError::NotFinite { what: format!("the total {what}") })
            }
        };
        let dead_total = check_loads(&ring.blocks, "load")?;
        let live_total = match live {
            Some(live) => check_loads(live, "live load")?,
            None => 0.0,
        };
        let (mut lo, mut hi) =
            (Point::new(f64::INFINITY, f64::INFINITY), Point::new(f64::NEG_INFINITY, f64::NEG_INFINITY));
        for p in ring.joints.iter().flat_map(|j| [j.intrados, j.extrados]) {
            lo = Point::new(lo.x.min(p.x), lo.y.min(p.y));
            hi = Point::new(hi.x.max(p.x), hi.y.max(p.y));
        }
        let length = (hi.x - lo.x).max(hi.y - lo.y);
        if !(length.is_finite() && length > 0.0) {
            return Err(ThrustError::NotFinite { what: "the arch's size".into() });
        }
        for (j, joint) in ring.joints.iter().enumerate() {
            if joint.length() <= 1e-12 * length {
                return Err(ThrustError::Malformed { reason: format!("joint {j} has no length") });
            }
        }
        let force = if dead_total > 0.0 { dead_total } else { live_total };
        if force.is_nan() || force <= 0.0 {
            return Err(ThrustError::NoLoad);
        }
        let frame = Frame { origin: lo.midpoint(hi), length, force };
        let joints: Vec<Joint> = ring
            .joints
            .iter()
            .map(|j| Joint { intrados: frame.point(j.intrados), extrados: frame.point(j.extrados) })
            .collect();
        let dead = Loads::new(&ring.blocks, &frame, &joints);
        let live = match live {
            Some(live) if live_total > 0.0 => Some(Loads::new(live, &Frame { force: live_total, ..frame }, &joints)),
            _ => None,
        };
        Ok(Model { frame, joints, dead, live, force, live_force: live_total })
    }

    fn unscale_joint(&self, j: &Joint) -> Joint {
        Joint { intrados: self.frame.unpoint(j.intrados), extrados: self.frame.unpoint(j.extrados) }
    }

    /// The rows of joint `j` with its ends at positions `½ ∓ ratio/2`, each
    /// as `(coefficients of H, V, M₀, α; constant)` of a quantity that must
    /// be `≥ 0`, divided by the joint's length: the two ends, then the
    /// normal force less [`COMPRESSION_MARGIN`] (so that no force runs along
    /// a joint, where the centre of pressure is undefined).
    fn rows(&self, j: usize, ratio: f64) -> [([f64; 4], f64); 3] {
        let joint = self.joints[j];
        let inv = 1.0 / joint.length();
        let side = |p: Point, sign: f64| {
            let mut coef = [-p.y, p.x, -1.0, 0.0];
            let mut constant = cross(p.to_vec2(), self.dead.sum[j]) - self.dead.moment[j];
            if let Some(live) = &self.live {
                coef[3] = cross(p.to_vec2(), live.sum[j]) - live.moment[j];
            }
            for c in &mut coef {
                *c *= sign * inv;
            }
            constant *= sign * inv;
            (coef, constant)
        };
        // N = −(u × S_j) with u the joint's unit direction.
        let u = (joint.extrados - joint.intrados) * inv;
        let mut normal = ([u.y, -u.x, 0.0, 0.0], -cross(u, self.dead.sum[j]) - COMPRESSION_MARGIN);
        if let Some(live) = &self.live {
            normal.0[3] = -cross(u, live.sum[j]);
        }
        let mut rows = [side(joint.at(0.5 - 0.5 * ratio), 1.0), side(joint.at(0.5 + 0.5 * ratio), -1.0), normal];
        // Round-off leaves 1e-17 where a coefficient is zero (the x of a
        // crown joint's direction): such entries make the simplex's pivots
        // ill-conditioned, so they are zeroed.
        for (coef, constant) in &mut rows {
            let largest = coef.iter().chain(std::iter::once(&*constant)).fold(0.0f64, |m, c| m.max(c.abs()));
            for c in coef.iter_mut().chain(std::iter::once(constant)) {
                if c.abs() <= ROUND_OFF * largest {
                    *c = 0.0;
                }
            }
        }
        rows
    }

    /// Solves a programme over `(H, V, M₀)` on the joints scaled by `ratio`:
    /// `None` when infeasible (or, for [`Goal::MaxThrust`], unbounded).
    fn solve(&self, ratio: f64, goal: Goal) -> Result<Option<Unknowns>, ThrustError> {
        Ok(self.programme(ratio, goal)?.map(|(x, _)| x))
    }

    /// As [`Model::solve`], returning the optimum too.
    fn programme(&self, ratio: f64, goal: Goal) -> Result<Option<(Unknowns, f64)>, ThrustError> {
        let direction = match goal {
            Goal::MinThrust => OptimizationDirection::Minimize,
            Goal::MaxThrust | Goal::MaxSlack => OptimizationDirection::Maximize,
        };
        let mut problem = Problem::new(direction);
        let thrust_cost = if goal == Goal::MaxSlack { 0.0 } else { 1.0 };
        let h = problem.add_var(thrust_cost, (0.0, f64::INFINITY));
        let v = problem.add_var(0.0, (f64::NEG_INFINITY, f64::INFINITY));
        let m = problem.add_var(0.0, (f64::NEG_INFINITY, f64::INFINITY));
        let slack = (goal == Goal::MaxSlack).then(|| problem.add_var(1.0, (f64::NEG_INFINITY, 1.0)));
        for j in 0..self.joints.len() {
            for (row, (c, constant)) in self.rows(j, ratio).into_iter().enumerate() {
                let mut terms: Vec<(Variable, f64)> = vec![(h, c[0]), (v, c[1]), (m, c[2])];
                if let Some(s) = slack.filter(|_| row < 2) {
                    terms.push((s, -1.0));
                }
                problem.add_constraint(terms.as_slice(), ComparisonOp::Ge, -constant);
            }
        }
        match problem.solve_with(options()) {
            Ok(outcome) => {
                let solution = outcome.into_solution().map_err(|e| ThrustError::Solver { reason: format!("{e:?}") })?;
                let x = Unknowns { h: solution.var_value(h), v: solution.var_value(v), m0: solution.var_value(m) };
                Ok(Some((x, solution.objective())))
            }
            Err(microlp::Error::Infeasible) => Ok(None),
            Err(microlp::Error::Unbounded) if goal == Goal::MaxThrust => Ok(None),
            Err(e) => Err(ThrustError::Solver { reason: e.to_string() }),
        }
    }

    /// Maximises the live-load factor (scaled): `None` when unbounded.
    fn max_factor(&self) -> Result<Option<(Unknowns, f64)>, ThrustError> {
        let mut problem = Problem::new(OptimizationDirection::Maximize);
        let h = problem.add_var(0.0, (0.0, f64::INFINITY));
        let v = problem.add_var(0.0, (f64::NEG_INFINITY, f64::INFINITY));
        let m = problem.add_var(0.0, (f64::NEG_INFINITY, f64::INFINITY));
        let alpha = problem.add_var(1.0, (0.0, f64::INFINITY));
        for j in 0..self.joints.len() {
            for (c, constant) in self.rows(j, 1.0) {
                problem.add_constraint(
                    [(h, c[0]), (v, c[1]), (m, c[2]), (alpha, c[3])].as_slice(),
                    ComparisonOp::Ge,
                    -constant,
                );
            }
        }
        match problem.solve_with(options()) {
            Ok(outcome) => {
                let solution = outcome.into_solution().map_err(|e| ThrustError::Solver { reason: format!("{e:?}") })?;
                let x = Unknowns { h: solution.var_value(h), v: solution.var_value(v), m0: solution.var_value(m) };
                Ok(Some((x, solution.var_value(alpha))))
            }
            Err(microlp::Error::Unbounded) => Ok(None),
            Err(e) => Err(ThrustError::Solver { reason: e.to_string() }),
        }
    }

    /// The ratio `2 |s_j − ½|` the line `x` needs at every joint, or `None`
    /// when a joint is not in compression.
    fn needed_ratio(&self, x: Unknowns) -> Option<f64> {
        let r = Vec2::new(x.h, x.v);
        let mut worst: f64 = 0.0;
        for (j, joint) in self.joints.iter().enumerate() {
            let s = r + self.dead.sum[j];
            let m = x.m0 + self.dead.moment[j];
            let normal = -cross(joint.extrados - joint.intrados, s);
            if normal.is_nan() || normal <= 0.0 {
                return None;
            }
            let mid = cross(joint.at(0.5).to_vec2(), s) - m;
            worst = worst.max(2.0 * mid.abs() / normal);
        }
        worst.is_finite().then_some(worst)
    }

    /// The least thickness ratio and a line that fits at it.
    fn least_ratio(&self) -> Result<(f64, Unknowns), ThrustError> {
        let trial = |ratio: f64| -> Result<(bool, Unknowns), ThrustError> {
            let (x, slack) = self.programme(ratio, Goal::MaxSlack)?.ok_or(ThrustError::NoFit { needed: None })?;
            Ok((slack >= 0.0, x))
        };
        // Every trial's line fits at its own needed ratio: an upper bound.
        let tighten = |hi: &mut f64, lo: f64, x: Unknowns| {
            if let Some(r) = self.needed_ratio(x).filter(|r| *r < *hi) {
                *hi = r.max(lo);
            }
        };
        let (zero, x0) = trial(0.0)?;
        if zero {
            return Ok((0.0, x0));
        }
        // The bracket: lo does not fit, hi does.
        let (mut lo, mut hi) = (0.0, 1.0);
        loop {
            let (ok, x) = trial(hi)?;
            if ok {
                tighten(&mut hi, lo, x);
                break;
            }
            lo = hi;
            let mut next = 2.0 * hi;
            tighten(&mut next, lo, x);
            if next <= lo {
                next = 2.0 * hi;
            }
            hi = next;
            if hi > MAX_RATIO {
                return Err(ThrustError::NoFit { needed: None });
            }
        }
        while hi - lo > RATIO_PRECISION * hi {
            let mid = 0.5 * (lo + hi);
            let (ok, x) = trial(mid)?;
            if ok {
                hi = mid;
            } else {
                lo = mid;
            }
            tighten(&mut hi, lo, x);
        }
        // A vertex at hi: the line of the mechanism about to form.
        let x = match self.solve(hi, Goal::MinThrust)? {
            Some(x) => x,
            None => trial(hi)?.1,
        };
        Ok((hi, x))
    }

    fn no_fit(&self) -> ThrustError {
        match self.least_ratio() {
            Ok((ratio, _)) => ThrustError::NoFit { needed: Some(ratio) },
            Err(e @ ThrustError::Solver { .. }) => e,
            Err(_) => ThrustError::NoFit { needed: None },
        }
    }

    /// The thrust line of the unknowns `x` under `loads`, its crossings
    /// measured on `joints` (scaled units), in the ring's units.
    fn trace(&self, loads: &Loads, joints: &[Joint], x: Unknowns) -> ThrustLine {
        let r = Vec2::new(x.h, x.v);
        let n = joints.len() - 1;
        let forces: Vec<Vec2> = loads.sum.iter().map(|d| r + *d).collect();
        let moments: Vec<f64> = loads.moment.iter().map(|m| x.m0 + m).collect();
        let mut crossings = Vec::with_capacity(n + 1);
        let mut hinges = Vec::new();
        for (j, joint) in joints.iter().enumerate() {
            let s = forces[j];
            let d = joint.extrados - joint.intrados;
            let fi = cross(joint.intrados.to_vec2(), s) - moments[j];
            let g = cross(d, s);
            if g.abs() <= 1e-12 * s.hypot() * d.hypot() || s.hypot() == 0.0 {
                crossings.push(None);
                continue;
            }
            let position = -fi / g;
            let at = joint.at(position);
            crossings.push(Some(Crossing { at: self.frame.unpoint(at), position }));
            if position.abs() <= HINGE_TOLERANCE {
                hinges.push(Hinge { joint: j, face: Face::Intrados, at: self.frame.unpoint(joint.intrados) });
            } else if (position - 1.0).abs() <= HINGE_TOLERANCE {
                hinges.push(Hinge { joint: j, face: Face::Extrados, at: self.frame.unpoint(joint.extrados) });
            }
        }
        // Where no crossing exists, the nearest point of the line to the
        // joint's middle stands in for it.
        let on_line = |j: usize, near: Point| project(near, forces[j], moments[j]);
        let first = crossings[0].map(|c| self.frame.point(c.at)).unwrap_or_else(|| on_line(0, joints[0].at(0.5)));
        let last = crossings[n].map(|c| self.frame.point(c.at)).unwrap_or_else(|| on_line(n, joints[n].at(0.5)));
        let mut polygon = Vec::with_capacity(n + 2);
        polygon.push(first);
        for k in 0..n {
            let (a, b) = (forces[k], forces[k + 1]);
            let det = cross(a, b);
            let vertex = if det.abs() > 1e-14 * a.hypot() * b.hypot() {
                // a × p = ... : p.x a.y − p.y a.x = M_k, p.x b.y − p.y b.x = M_{k+1}.
                let (mk, ml) = (moments[k], moments[k + 1]);
                Point::new((ml * a.x - mk * b.x) / det, (ml * a.y - mk * b.y) / det)
            } else {
                on_line(k, loads.centre[k])
            };
            polygon.push(vertex);
        }
        polygon.push(last);
        let polygon = polygon.into_iter().map(|p| self.frame.unpoint(p)).collect();
        let unforce = |v: Vec2| v * self.force;
        ThrustLine {
            horizontal: x.h * self.force,
            left: unforce(r),
            right: unforce(-forces[n]),
            forces: forces.iter().map(|f| unforce(*f)).collect(),
            crossings,
            polygon,
            hinges,
        }
    }
}

/// The solver's options: the defaults with a tighter feasibility tolerance.
fn options() -> SolveOptions {
    let mut options = SolveOptions::default();
    options.tolerances.feasibility = FEASIBILITY;
    options
}

/// The point nearest `q` on the line `p × s = m` (or `q` when `s` is nil).
fn project(q: Point, s: Vec2, m: f64) -> Point {
    let norm2 = s.hypot2();
    if norm2 == 0.0 {
        return q;
    }
    let e = cross(q.to_vec2(), s) - m;
    q - Vec2::new(s.y, -s.x) * (e / norm2)
}

#[cfg(test)]
#[allow(clippy::print_stdout)] // the figures, shown with --nocapture
mod tests {
    use super::*;
    use crate::arch::LoadKind;
    use std::f64::consts::PI;

    fn load(at: Point, force: Vec2) -> BlockLoad {
        BlockLoad { at, force, kind: LoadKind::OwnWeight }
    }

    /// A semicircular ring of centre-line radius 1 and thickness `t`, cut
    /// into `n` radial voussoirs. With `true_weight` false, each voussoir
    /// weighs its centre-line arc length (w = 1 per unit length) at the arc's
    /// centroid; with it true, its area (unit density) at the centroid of its
    /// annular sector.
    fn semicircle(n: usize, t: f64, true_weight: bool) -> Ring {
        let step = PI / n as f64;
        let (ri, re) = (1.0 - 0.5 * t, 1.0 + 0.5 * t);
        let dir = |a: f64| Vec2::new(a.cos(), a.sin());
        let joints = (0..=n)
            .map(|j| {
                let a = PI - j as f64 * step;
                Joint { intrados: (dir(a) * ri).to_point(), extrados: (dir(a) * re).to_point() }
            })
            .collect();
        let chord = (0.5 * step).sin() / (0.5 * step);
        let blocks = (0..n)
            .map(|k| {
                let mid = PI - (k as f64 + 0.5) * step;
                let (radius, weight) = if true_weight {
                    ((2.0 / 3.0) * (re.powi(3) - ri.powi(3)) / (re * re - ri * ri) * chord, step * t)
                } else {
                    (chord, step)
                };
                vec![load((dir(mid) * radius).to_point(), Vec2::new(0.0, -weight))]
            })
            .collect();
        Ring { joints, blocks }
    }

    /// The angle from the crown of joint `j` of [`semicircle`]`(n, ..)`, in degrees.
    fn from_crown(n: usize, j: usize) -> f64 {
        (90.0 - j as f64 * 180.0 / n as f64).abs()
    }

    /// A parabolic ring over span `l`, rise `f`, vertical thickness `t`, cut
    /// by `n` vertical joints, with the loads `load(x_centre, width)`.
    fn parabola(l: f64, f: f64, t: f64, n: usize, weight: impl Fn(f64, f64) -> f64) -> Ring {
        let y = |x: f64| 4.0 * f * x * (l - x) / (l * l);
        let dx = l / n as f64;
        let joints = (0..=n)
            .map(|k| {
                let x = k as f64 * dx;
                Joint { intrados: Point::new(x, y(x) - 0.5 * t), extrados: Point::new(x, y(x) + 0.5 * t) }
            })
            .collect();
        let blocks = (0..n)
            .map(|k| {
                let xc = (k as f64 + 0.5) * dx;
                vec![load(Point::new(xc, y(xc)), Vec2::new(0.0, -weight(xc, dx)))]
            })
            .collect();
        Ring { joints, blocks }
    }

    #[test]
    fn heyman_circular_arch_converges() {
        // Cocchetti & Rizzi, "Non-symmetrical collapse mode of circular
        // arches" / "Heyman's circular arch problem", Frattura ed Integrità
        // Strutturale 51 (2020), eq. 4, as quoted with this task (the paper
        // itself not consulted): t/R = 0.107426, haunch hinge 54.4963° from
        // the crown, H/(wR) = 0.621772, w the weight per unit centre-line
        // length and R the centre-line radius.
        let t0 = 0.2;
        let mut rows = Vec::new();
        for n in [18, 36, 72, 144, 288, 576, 1152] {
            let thinnest = least_thickness(&semicircle(n, t0, false)).unwrap();
            let ratio = thinnest.ratio * t0;
            let haunch: Vec<f64> = thinnest
                .line
                .hinges
                .iter()
                .filter(|h| h.face == Face::Intrados && h.joint < n / 2)
                .map(|h| from_crown(n, h.joint))
                .collect();
            let hinges: Vec<(usize, Face)> = thinnest.line.hinges.iter().map(|h| (h.joint, h.face)).collect();
            let h = thinnest.line.horizontal;
            rows.push((n, ratio, haunch, h, hinges));
        }
        println!("   N      t/R         haunch hinge (deg from crown)   H/(wR)");
        for (n, ratio, haunch, h, hinges) in &rows {
            println!("{n:5}  {ratio:.7}  {haunch:?}  {h:.7}  ({} hinges)", hinges.len());
        }
        let errors: Vec<f64> = rows.iter().map(|r| (r.1 - 0.107426).abs()).collect();
        let (_, ratio, haunch, h, _) = rows.last().unwrap();
        assert!((ratio - 0.107426).abs() < 2e-4, "t/R {ratio}");
        assert!(errors.windows(2).all(|w| w[1] <= w[0] + 1e-9), "t/R does not converge: {errors:?}");
        let step = 180.0 / 1152.0;
        assert!(haunch.iter().any(|a| (a - 54.4963).abs() <= step), "haunch {haunch:?}");
        assert!((h - 0.621772).abs() < 1e-3, "H/(wR) {h}");
    }

    #[test]
    fn milankovitch_true_voussoir_weight() {
        // The true voussoir weight, the thickness found self-consistently (the
        // ring rebuilt at each trial thickness). Milankovitch (1907), as
        // quoted by Ochsendorf (2002) and Makris & Alexakis (2013):
        // t/R ≈ 0.1075, from memory. Heyman, "The safety of masonry arches",
        // Int. J. Mech. Sci. 11 (1969): t/R ≈ 0.106, below it, from memory.
        let n = 576;
        let (mut lo, mut hi) = (0.09, 0.13);
        assert!(fits(&semicircle(n, lo, true)).unwrap().is_none());
        assert!(fits(&semicircle(n, hi, true)).unwrap().is_some());
        while hi - lo > 1e-7 {
            let mid = 0.5 * (lo + hi);
            if fits(&semicircle(n, mid, true)).unwrap().is_some() {
                hi = mid;
            } else {
                lo = mid;
            }
        }
        println!("true voussoir weight, N = {n}: t/R = {hi:.7} (Milankovitch 0.1075, Heyman 0.106)");
        assert!((hi - 0.1075).abs() < 1e-4, "t/R {hi}");
        assert!(0.106 < hi);
    }

    #[test]
    fn parabola_under_uniform_load_is_its_own_thrust_line() {
        // A parabola is the funicular of a load uniform per horizontal length,
        // with H = wL²/(8f): any statics text, e.g. H. M. Irvine, "Cable
        // Structures" (1981), ch. 1, for the cable. Loads at strip centres give
        // the uniform load's moments exactly at the strip edges.
        let (l, f, w) = (12.0, 3.0, 2.5);
        for n in [8, 20, 51] {
            let ring = parabola(l, f, 0.6, n, |_, dx| w * dx);
            let h = w * l * l / (8.0 * f);
            let line = through(&ring, h, 0.5, 0.5).unwrap();
            for c in &line.crossings {
                let c = c.unwrap();
                assert!((c.position - 0.5).abs() < 1e-12, "position {}", c.position);
            }
            assert!((line.left.y - w * l / 2.0).abs() < 1e-9 * w * l);
            let range = thrust_range(&ring).unwrap();
            let max = range.max.as_ref().unwrap().horizontal;
            println!("parabola N = {n}: H min {:.6} ≤ wL²/8f {h:.6} ≤ H max {max:.6}", range.min.horizontal);
            assert!(range.min.horizontal <= h && h <= max);
            assert!(range.min.fits(1e-7) && range.max.unwrap().fits(1e-7));
            assert!(!range.min.hinges.is_empty());
            let centred = middle_third(&ring).unwrap().unwrap();
            assert!(centred.crossings.iter().all(|c| c.unwrap().position > 1.0 / 3.0 - 1e-7));
            assert!(centred.crossings.iter().all(|c| c.unwrap().position < 2.0 / 3.0 + 1e-7));
            // The centre line carries the load: no thickness is needed.
            assert!(least_thickness(&ring).unwrap().ratio < 1e-9);
            if n % 2 == 0 {
                // With a joint at the crown, the least and greatest thrusts are
                // those of the parabolas of rise f + t and f − t (vertical
                // thickness t), the same source.
                assert!((range.min.horizontal - w * l * l / (8.0 * (f + 0.6))).abs() < 1e-9 * h);
                assert!((max - w * l * l / (8.0 * (f - 0.6))).abs() < 1e-9 * h);
            }
        }
    }

    #[test]
    fn three_hinged_arch() {
        // A three-hinged arch under vertical loads: H = M₀/f, M₀ the moment
        // of the simply supported beam at the crown hinge and f the hinge's
        // height above the chord of the springing hinges. Common practice,
        // from memory (any statics text).
        let n = 16;
        let ring = parabola(10.0, 2.5, 0.8, n, |x, dx| (1.0 + 0.3 * x + (x * 1.7).sin().abs()) * dx);
        let (left, crown, position, right) = (0.2, 7, 0.7, 0.9);
        let a = ring.joints[0].at(left);
        let b = ring.joints[n].at(right);
        let c = ring.joints[crown].at(position);
        let loads: Vec<(f64, f64)> = ring.blocks.iter().flatten().map(|l| (l.at.x, -l.force.y)).collect();
        let reaction: f64 = loads.iter().map(|(x, p)| p * (b.x - x) / (b.x - a.x)).sum();
        let m0 =
            reaction * (c.x - a.x) - loads.iter().filter(|(x, _)| *x < c.x).map(|(x, p)| p * (c.x - x)).sum::<f64>();
        let rise = c.y - (a.y + (b.y - a.y) * (c.x - a.x) / (b.x - a.x));
        let line = through_three(&ring, left, crown, position, right).unwrap();
        println!("three-hinged: H = {:.9}, M0/f = {:.9}", line.horizontal, m0 / rise);
        assert!((line.horizontal - m0 / rise).abs() < 1e-9 * line.horizontal);
        let given = through(&ring, m0 / rise, left, right).unwrap();
        assert!((given.crossings[crown].unwrap().position - position).abs() < 1e-9);
        assert!((given.crossings[0].unwrap().position - left).abs() < 1e-12);
        assert!((given.crossings[n].unwrap().position - right).abs() < 1e-9);
    }

    #[test]
    fn too_thin_semicircle() {
        // Below t/R ≈ 0.107 (the Heyman arch above) no thrust line fits.
        let ring = semicircle(36, 0.05, false);
        let err = thrust_range(&ring).unwrap_err();
        let ThrustError::NoFit { needed: Some(needed) } = err else { panic!("{err:?}") };
        println!("{err}");
        assert!((needed * 0.05 - 0.107407).abs() < 1e-5);
        let thinnest = least_thickness(&ring).unwrap();
        assert!(thinnest.ratio > 1.0);
        assert!(fits(&ring).unwrap().is_none());
        assert!(middle_third(&ring).unwrap().is_none());
        assert!(matches!(load_factor(&ring, &vec![vec![]; 36]), Err(ThrustError::NoFit { .. })));
    }

    #[test]
    fn load_factor_brings_the_arch_to_collapse() {
        // Safe theorem (Heyman 1966, cited in the module): at the collapse
        // factor the least thickness ratio of the loaded ring is 1 and the
        // line touches the faces at the hinges of a mechanism.
        let n = 72;
        let ring = semicircle(n, 0.2, false);
        let mut live = vec![vec![]; n];
        let quarter = n / 4;
        live[quarter] = vec![load(ring.joints[quarter].at(0.5), Vec2::new(0.0, -0.1))];
        let result = load_factor(&ring, &live).unwrap();
        let factor = result.factor.unwrap();
        let line = result.line.unwrap();
        println!(
            "point load at the quarter point: α = {factor:.6}, hinges {:?}",
            line.hinges.iter().map(|h| (h.joint, h.face)).collect::<Vec<_>>()
        );
        assert!(line.fits(1e-7));
        assert!(line.hinges.len() >= 4);
        let mut loaded = ring.clone();
        for (block, extra) in loaded.blocks.iter_mut().zip(&live) {
            block.extend(extra.iter().map(|l| BlockLoad { force: l.force * factor, ..*l }));
        }
        let ratio = least_thickness(&loaded).unwrap().ratio;
        assert!((ratio - 1.0).abs() < 1e-6, "ratio {ratio}");
        // No live load: no limit.
        assert_eq!(load_factor(&ring, &vec![vec![]; n]).unwrap(), LoadFactor { factor: None, line: None });
    }

    #[test]
    fn bad_input_is_refused() {
        let ring = semicircle(8, 0.2, false);
        assert!(matches!(through(&ring, 0.0, 0.5, 0.5), Err(ThrustError::NonPositiveThrust { .. })));
        assert!(matches!(through(&ring, f64::NAN, 0.5, 0.5), Err(ThrustError::NotFinite { .. })));
        assert!(matches!(load_factor(&ring, &[]), Err(ThrustError::LiveMismatch { blocks: 8, live: 0 })));
        let mut broken = ring.clone();
        broken.joints.pop();
        assert!(matches!(fits(&broken), Err(ThrustError::Malformed { .. })));
        let mut broken = ring.clone();
        broken.blocks[2][0].force.y = f64::INFINITY;
        assert!(matches!(thrust_range(&broken), Err(ThrustError::NotFinite { .. })));
        let mut broken = ring.clone();
        broken.joints[3].extrados = broken.joints[3].intrados;
        assert!(matches!(least_thickness(&broken), Err(ThrustError::Malformed { .. })));
        let mut empty = ring.clone();
        empty.blocks.iter_mut().for_each(Vec::clear);
        assert_eq!(middle_third(&empty), Err(ThrustError::NoLoad));
    }

    mod props {
        use super::*;
        use proptest::prelude::*;

        /// A smooth arch of `n` voussoirs over span 1..10 with joints normal
        /// to a sine-like centre line, random thickness and positive loads.
        /// An arch of `loads.len()` voussoirs over `span`, its centre line
        /// `y = span·rise·(sin πu + skew·sin 2πu)`, its joints normal to it,
        /// each voussoir loaded by `(p, offset, lean)`: a force `(lean·p, −p)`
        /// on the centre line, `offset` voussoirs from the voussoir's middle.
        fn arch(span: f64, rise: f64, thick: f64, skew: f64, loads: &[(f64, f64, f64)]) -> Ring {
            let n = loads.len();
            let centre = |u: f64| Point::new(span * u, span * rise * ((PI * u).sin() + skew * (2.0 * PI * u).sin()));
            let joints: Vec<Joint> = (0..=n)
                .map(|j| {
                    let u = j as f64 / n as f64;
                    let tangent = (centre(u + 1e-6) - centre(u - 1e-6)).normalize();
                    let normal = Vec2::new(-tangent.y, tangent.x) * (0.5 * thick * span);
                    let c = centre(u);
                    Joint { intrados: c - normal, extrados: c + normal }
                })
                .collect();
            let blocks = loads
                .iter()
                .enumerate()
                .map(|(k, &(p, offset, lean))| {
                    let u = (k as f64 + 0.5 + offset) / n as f64;
                    vec![load(centre(u), Vec2::new(lean * p, -p))]
                })
                .collect();
            Ring { joints, blocks }
        }

        /// Smooth arches of 4 to 19 voussoirs, span 1 to 10, random
        /// thickness and positive (slightly leaning) loads.
        fn ring_strategy() -> impl Strategy<Value = Ring> {
            let load = (0.1..10.0f64, -0.4..0.4f64, -0.2..0.2f64);
            (1.0..10.0f64, 0.15..0.8f64, 0.03..0.3f64, 0.0..0.3f64, prop::collection::vec(load, 4..20))
                .prop_map(|(span, rise, thick, skew, loads)| arch(span, rise, thick, skew, &loads))
        }

        /// Arches symmetric about mid-span, loads mirrored.
        fn symmetric_strategy() -> impl Strategy<Value = Ring> {
            let load = (0.5..2.0f64, -0.4..0.4f64, -0.2..0.2f64);
            (1.0..10.0f64, 0.2..0.6f64, 0.1..0.3f64, prop::collection::vec(load, 2..10)).prop_map(
                |(span, rise, thick, half)| {
                    let mut loads = half.clone();
                    loads.extend(half.iter().rev().map(|&(p, offset, lean)| (p, -offset, -lean)));
                    arch(span, rise, thick, 0.0, &loads)
                },
            )
        }

        fn mirror(ring: &Ring) -> Ring {
            let m = |p: Point| Point::new(-p.x, p.y);
            Ring {
                joints: ring
                    .joints
                    .iter()
                    .rev()
                    .map(|j| Joint { intrados: m(j.intrados), extrados: m(j.extrados) })
                    .collect(),
                blocks: ring
                    .blocks
                    .iter()
                    .rev()
                    .map(|b| b.iter().map(|l| load(m(l.at), Vec2::new(-l.force.x, l.force.y))).collect())
                    .collect(),
            }
        }

        proptest! {
            #![proptest_config(ProptestConfig::with_cases(64))]

            #[test]
            fn equilibrium(ring in ring_strategy(), h in 0.1..100.0f64, left in 0.0..1.0f64, right in 0.0..1.0f64) {
                // Statics of a free body: Σ F = 0 and Σ M = 0 (any statics text).
                let line = through(&ring, h, left, right).unwrap();
                let total: f64 = ring.blocks.iter().flatten().map(|l| l.force.hypot()).sum::<f64>() + h;
                let size = ring.joints.iter().map(|j| j.intrados.to_vec2().hypot()).fold(1.0, f64::max);
                let mut sum = line.left;
                let a = line.crossings[0].unwrap().at;
                prop_assert!((a - ring.joints[0].at(left)).hypot() < 1e-9 * size);
                let mut moment = cross(a.to_vec2(), line.left);
                for (j, loads) in ring.blocks.iter().enumerate() {
                    prop_assert!((line.forces[j] - sum).hypot() < 1e-9 * total);
                    for l in loads {
                        sum += l.force;
                        moment += cross(l.at.to_vec2(), l.force);
                    }
                }
                let n = ring.blocks.len();
                prop_assert!((line.forces[n] - sum).hypot() < 1e-9 * total);
                prop_assert!((sum + line.right).hypot() < 1e-9 * total);
                let b = line.crossings[n].unwrap().at;
                prop_assert!((b - ring.joints[n].at(right)).hypot() < 1e-9 * size);
                moment += cross(b.to_vec2(), line.right);
                prop_assert!(moment.abs() < 1e-9 * total * size);
                prop_assert_eq!(line.polygon.len(), n + 2);
            }

            #[test]
            fn range_is_ordered(ring in ring_strategy()) {
                match thrust_range(&ring) {
                    Ok(range) => {
                        prop_assert!(range.min.fits(1e-6));
                        if let Some(max) = &range.max {
                            prop_assert!(max.fits(1e-6));
                            prop_assert!(range.min.horizontal <= max.horizontal * (1.0 + 1e-9));
                        }
                        let thinnest = least_thickness(&ring).unwrap();
                        prop_assert!(thinnest.ratio <= 1.0 + 1e-9);
                        prop_assert!(thinnest.line.fits(1e-6));
                    }
                    Err(ThrustError::NoFit { needed }) => {
                        prop_assert!(needed.is_none_or(|r| r > 1.0 - 1e-9));
                        prop_assert!(fits(&ring).unwrap().is_none());
                    }
                    Err(e) => prop_assert!(false, "{}", e),
                }
            }

            #[test]
            fn symmetric_ring_symmetric_min_line(ring in symmetric_strategy()) {
                // Mirror symmetry of statics, and the convexity of the set of
                // lines that fit (the module's doc): the mirror image of a
                // least-thrust line is one too, and so is their average, which
                // is symmetric. Common practice, no source.
                let Ok(range) = thrust_range(&ring) else {
                    prop_assert!(fits(&ring).unwrap().is_none());
                    return Ok(());
                };
                let line = range.min;
                let total: f64 = ring.blocks.iter().flatten().map(|l| l.force.hypot()).sum();
                if line.horizontal < 1e-3 * total {
                    // A pier rather than an arch: the force nearly runs along
                    // the crown joint, and positions there are ill-conditioned.
                    return Ok(());
                }
                let m = ring.blocks.len();
                let mirrored = thrust_range(&mirror(&ring)).unwrap().min;
                prop_assert!((mirrored.horizontal - line.horizontal).abs() < 1e-9 * line.horizontal.max(1e-9));
                let model = Model::new(&ring, None).unwrap();
                // The line's unknowns, and those of its mirror image (x → −x
                // about the ring's middle, the model's origin): the reaction
                // (H, V_right) at the mirror of the right springing point.
                let r = line.left / model.force;
                let a = model.frame.point(line.crossings[0].unwrap().at).to_vec2();
                let b = model.frame.point(line.crossings[m].unwrap().at).to_vec2();
                let right = line.right / model.force;
                let flipped_r = Vec2::new(-right.x, right.y);
                let one = Unknowns { h: r.x, v: r.y, m0: cross(a, r) };
                let two = Unknowns { h: flipped_r.x, v: flipped_r.y, m0: cross(Vec2::new(-b.x, b.y), flipped_r) };
                let mean = Unknowns { h: 0.5 * (one.h + two.h), v: 0.5 * (one.v + two.v), m0: 0.5 * (one.m0 + two.m0) };
                let symmetric = model.trace(&model.dead, &model.joints, mean);
                prop_assert!(symmetric.fits(1e-6));
                prop_assert!((symmetric.horizontal - line.horizontal).abs() < 1e-9 * line.horizontal.max(1e-9));
                prop_assert!((symmetric.left.y - symmetric.right.y).abs() < 1e-9 * symmetric.left.y.abs());
                for j in 0..=m {
                    let (p, q) = (symmetric.crossings[j].unwrap().position, symmetric.crossings[m - j].unwrap().position);
                    prop_assert!((p - q).abs() < 1e-6, "joint {}: {} vs {}", j, p, q);
                }
            }
        }
    }
}
