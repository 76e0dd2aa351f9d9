//! Clearance between the profile and the deck.

use serde::Serialize;

use super::{Form, Solution};
use crate::model::Structure;

/// The least vertical distance between the deck and the profile, measured
/// at the load nodes (where hangers or posts stand).
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Clearance {
    /// Profile above the deck (cable) or deck above the profile (arch);
    /// negative when the profile crosses the deck.
    pub value: f64,
    /// Its x.
    pub x: f64,
    /// The deck's y at `x`.
    pub deck_y: f64,
    /// The profile's y at `x`.
    pub profile_y: f64,
}

/// The clearance, when a deck is drawn under (cable) or over (arch) any node.
#[must_use]
pub fn clearance(structure: &Structure, solution: &Solution) -> Option<Clearance> {
    let deck = structure.deck()?;
    let n = solution.nodes.len();
    solution.nodes[1..n.saturating_sub(1)]
        .iter()
        .filter_map(|p| {
            let d = deck.y_at(p.x)?;
            let value = match solution.form {
                Form::Cable => p.y - d,
                Form::Arch => d - p.y,
            };
            Some(Clearance { value, x: p.x, deck_y: d, profile_y: p.y })
        })
        .min_by(|a, b| a.value.total_cmp(&b.value))
}
