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
//!
//! Every step is O(n) in the number of loads.

mod ask;
mod assemble;
mod beam;
mod clearance;
mod closed_form;
mod construction;
mod dense;
mod dependency;
mod frame;
mod inclined;
mod linear;
mod maxforce;
mod num;
mod residual;
mod roots;
mod types;

#[cfg(test)]
mod tests;

pub use clearance::{Clearance, clearance};
pub use types::*;

use crate::model::{Structure, fmt_num};
use ask::Namer;
use beam::Beam;
use frame::{Frame, Params};

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
    let conds = ask::gather(structure, form, conditions)?;
    let namer = Namer { units: structure.units(), form };
    let frame = Frame::new(structure);
    let beam = Beam::new(&frame);
    let found = linear::solve(&beam, &frame, &conds, &namer)?;
    let mut warnings = Vec::new();
    let params = if frame.vertical {
        if let Some(other) = found.other {
            warnings.push(second_root(&namer, &found.params, &other));
        }
        found.params
    } else {
        let p = inclined::solve(&frame, structure.loads(), &conds, found.params, &namer)?;
        // The other --max-force root of the start may lead to a second solution.
        let q = found.other.and_then(|o| inclined::solve(&frame, structure.loads(), &conds, o, &namer).ok());
        match q {
            Some(q) if (q.ox - p.ox).abs() > 1e-9 * frame.force_scale => {
                let (shallow, deep) = if q.ox.abs() > p.ox.abs() { (q, p) } else { (p, q) };
                warnings.push(second_root(&namer, &shallow, &deep));
                shallow
            }
            _ => p,
        }
    };
    assemble::build(structure, &frame, &conds, &namer, params, warnings)
}

/// The warning for a second funicular with the same largest force.
fn second_root(namer: &Namer, chosen: &Params, other: &Params) -> String {
    format!(
        "a second, deeper {} has the same largest force, with a thrust of {}; this is the shallower one, with a thrust of {}. For the other, replace --max-force with --thrust {}",
        namer.form,
        namer.force(other.ox.abs()),
        namer.force(chosen.ox.abs()),
        fmt_num(other.ox.abs())
    )
}
