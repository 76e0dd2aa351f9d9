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

mod types;

pub use types::*;
