//! Pure solvers: the funicular polygon of a [`Structure`] under three conditions.
//!
//! No I/O and no DXF types here: input is the model, output is a [`Solution`].
//!
//! The construction is the graphic one (Culmann, *Die graphische Statik*, 1866;
//! Bow's notation from R. H. Bow, *Economics of Construction*, 1873 — both
//! from memory): the loads P₁…Pₙ laid end to end form the load line
//! a₀, a₁ = a₀ + P₁, …, aₙ; a pole O is chosen; ray k joins O and aₖ; and the
//! funicular polygon is drawn with segment k parallel to ray k, between the
//! lines of action of loads k and k + 1. With tension positive, the force
//! vector of segment k, pointing from its left end to its right end, is
//! tₖ = O − aₖ, so node equilibrium tₖ − tₖ₋₁ + Pₖ = 0 holds by construction.
//! A cable has its pole to the right of the load line (O − a₀ has x > 0),
//! an arch to the left.
//!
//! The funiculars of given loads form a three-parameter family (Oₓ, O_y, y_L);
//! three conditions pick one. How:
//!
//! * `ask`: the conditions gathered (fixed supports count), checked, counted.
//! * `linear`: vertical loads, solved exactly — every condition but
//!   `--max-force` is linear in (y_L, O_y/Oₓ, 1/Oₓ) (`beam` precomputes);
//!   `maxforce` adds the one nonlinear condition (`roots`); `dependency`
//!   names conditions that clash.
//! * `inclined`: any inclined load — Newton's method on the `construction`
//!   itself, started from the vertical-component problem.
//! * `assemble`: the reported solution and its self-checks (`closed_form`).
//! * `sketch`: the funicular nearest to a drawn sketch (linear least squares
//!   under the conditions), handed to the solve as conditions.
//! * `continuous`: distributed loads (exact, through `loading`), the
//!   length conditions, and with `selfweight` the profile's own weight —
//!   see [`solve_with`].
//!
//! Every step is O(n) in the number of loads (and panels).

mod anderson;
mod ask;
mod assemble;
mod beam;
mod clearance;
mod closed_form;
mod construction;
mod continuous;
mod dense;
mod dependency;
mod frame;
mod gauss;
mod inclined;
mod linear;
mod loading;
mod maxforce;
mod num;
mod residual;
mod roots;
mod selfweight;
mod sketch;
mod types;

#[cfg(test)]
mod tests;

pub use clearance::{Clearance, clearance};
pub use sketch::follow_sketch;
pub use types::*;

use crate::model::Structure;
use ask::Namer;
use beam::Beam;
use frame::Frame;

/// Finds the funicular of `structure`'s loads, of the given `form`, meeting
/// `conditions` together with the structure's fixed supports — exactly three
/// in all.
///
/// For vertical loads the answer is exact (a 3 × 3 linear system, plus a
/// bracketed one-dimensional search for `--max-force`); with inclined loads
/// it is found by Newton's method on the constructed polygon. Either way the
/// polygon returned is constructed the graphic way from the pole found, and
/// [`Solution::checks`] reports how well it meets equilibrium, the closed
/// form y = chord − s·M/H (vertical loads) and the conditions.
///
/// # Errors
///
/// [`SolveError::BadValue`] for a condition that cannot be right,
/// [`SolveError::Count`] unless there are three conditions,
/// [`SolveError::Dependent`] when they fix the same thing or contradict each
/// other, [`SolveError::NoSolution`] when no funicular of this form meets
/// them. Each message names the conditions and says what to change.
pub fn solve(structure: &Structure, form: Form, conditions: &[Condition]) -> Result<Solution, SolveError> {
    solve_with(structure, form, conditions, &SolveOptions::default())
}

/// [`solve`] with options: the profile's own weight, its axial stiffness,
/// and the tolerances of the drawing and of the self-weight iteration.
///
/// Point loads alone (no distributed load, no self-weight, no length
/// condition) are solved as by [`solve`], the polygon being the exact
/// funicular; with an axial stiffness its unstressed length
/// Σ ℓₖ/(1 + Tₖ/EA) is reported as well (exact: the force is constant
/// along each segment).
///
/// Otherwise the loads must be vertical, and the continuous funicular is
/// found (see the `continuous` module):
///
/// * distributed loads (trapezoidal, per horizontal length) exactly: the
///   closed form y = chord ∓ M(x)/H with the continuous simple-beam moment
///   M (Beer & Johnston, *Vector Mechanics for Engineers: Statics*,
///   §7.8–7.9); the drawn polygon has its nodes on the exact curve, with
///   panel points close enough that its chords stay within the chord
///   tolerance;
/// * self-weight q per unit length of the profile (per unit unstressed
///   length with an axial stiffness: the mass is conserved) by iterating
///   shape and load, accelerated by Anderson's method; a uniform self-weight
///   alone gives the catenary to round-off. [`Solution::iterations`] counts
///   the iterations, over every trial of a length search;
/// * `--length S` and `--unstressed-length S0` fix the thrust, found by a
///   bracketed root search with the two other conditions (which must fix
///   two heights, or a height and a level point).
///
/// [`Solution::profile_length`] is the curve's length and, with an axial
/// stiffness, [`Solution::unstressed_length`] is ∫ ds/(1 + T/EA), both by
/// eight-point Gauss–Legendre quadrature, to about 1e-15 relative.
///
/// # Errors
///
/// Those of [`solve`]; [`SolveError::BadValue`] for an option that cannot
/// be right (a self-weight or stiffness not positive, a length condition
/// without the stiffness it needs); [`SolveError::NoSolution`] for inclined
/// point loads with continuous loads, a length no profile can have (a cable
/// between fixed supports must be longer than their chord), a self-weight
/// iteration that does not settle within [`SolveOptions::max_iterations`],
/// or a force beyond the axial stiffness.
pub fn solve_with(
    structure: &Structure,
    form: Form,
    conditions: &[Condition],
    options: &SolveOptions,
) -> Result<Solution, SolveError> {
    let namer = Namer { units: structure.units(), form };
    ask::check_options(&namer, options)?;
    let conds = ask::gather_with(structure, form, conditions, options)?;
    let continuous = !structure.distributed().is_empty()
        || options.self_weight.is_some()
        || conds.iter().any(|c| matches!(c, ask::Cond::Length(_) | ask::Cond::Unstressed(_)));
    if continuous {
        return continuous::solve(structure, &conds, &namer, options);
    }
    if structure.loads().is_empty() {
        return Err(SolveError::NoSolution {
            form,
            list: namer.list(&conds),
            reason: "there are no loads; draw loads, or give the profile's own weight with --self-weight q".into(),
        });
    }
    let mut sol = point_loads(structure, &conds, &namer)?;
    if let Some(ea) = options.axial_stiffness {
        let mut s0 = 0.0;
        for g in &sol.segments {
            let den = 1.0 + g.force / ea;
            if den <= 0.0 || g.force / ea >= 1.0 {
                return Err(SolveError::NoSolution {
                    form,
                    list: namer.list(&conds),
                    reason: format!(
                        "its largest force, {}, reaches {}: the axial strain would exceed 100%; check the stiffness and its unit",
                        namer.force(g.force.abs()),
                        namer.stiffness(ea)
                    ),
                });
            }
            s0 += g.length / den;
        }
        sol.unstressed_length = Some(s0);
    }
    Ok(sol)
}

/// The point-load solve of [`solve`].
fn point_loads(structure: &Structure, conds: &[ask::Cond], namer: &Namer) -> Result<Solution, SolveError> {
    let namer = *namer;
    let frame = Frame::new(structure);
    let beam = Beam::new(&frame);
    let found = linear::solve(&beam, &frame, conds, &namer)?;
    let mut warnings = Vec::new();
    let params = if frame.vertical {
        if let Some(other) = found.other {
            warnings.push(continuous::second_root(&namer, &found.params, &other, "largest force", "--max-force"));
        }
        found.params
    } else {
        let p = inclined::solve(&frame, structure.loads(), conds, found.params, &namer)?;
        // The other --max-force root of the start may lead to a second solution.
        let q = found.other.and_then(|o| inclined::solve(&frame, structure.loads(), conds, o, &namer).ok());
        match q {
            Some(q) if (q.ox - p.ox).abs() > 1e-9 * frame.force_scale => {
                let (shallow, deep) = if q.ox.abs() > p.ox.abs() { (q, p) } else { (p, q) };
                warnings.push(continuous::second_root(&namer, &shallow, &deep, "largest force", "--max-force"));
                shallow
            }
            _ => p,
        }
    };
    assemble::build(structure, &frame, conds, &namer, params, warnings)
}
