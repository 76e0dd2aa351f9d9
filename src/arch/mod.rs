//! Assessment of an existing arch by thrust lines (limit analysis).
//!
//! The design path ([`crate::solve`]) fixes the shape to the loads; here the
//! shape is given — an intrados and an extrados — and the question is which
//! thrust lines fit inside it. The hypotheses are the usual ones of limit
//! analysis for masonry (J. Heyman, "The stone skeleton", Int. J. Solids
//! Struct. 2, 1966): no tensile strength, unlimited compressive strength, no
//! sliding. Under them the safe theorem says the arch stands if any thrust
//! line in equilibrium with the loads lies within the masonry.
//!
//! The stages, all pure:
//!
//! * [`outline`]: the intrados and extrados as polylines, left to right,
//!   checked (open, not crossing) — the springings are where they end;
//! * [`slice`]: the outline cut into voussoirs (radial or vertical joints),
//!   each with its weight, the fill above it and the applied loads, as a
//!   [`Ring`];
//! * [`thrust`]: thrust lines through a [`Ring`]: one for a given thrust,
//!   the least and greatest thrust that fit, the least thickness, the middle
//!   third, the load factor on a live load.
//!
//! Units: lengths in the drawing's unit, forces in the report's force unit;
//! the solvers scale internally.

use kurbo::{Point, Vec2};

/// A joint between two voussoirs: a straight cut through the arch from its
/// lower face (the intrados, or a springing line) to its upper face (the
/// extrados).
///
/// Invariant: `intrados != extrados`.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Joint {
    /// Where the joint meets the lower face.
    pub intrados: Point,
    /// Where the joint meets the upper face.
    pub extrados: Point,
}

impl Joint {
    /// The point at `s` along the joint: 0 at the intrados, 1 at the
    /// extrados, ½ on the centre line.
    pub fn at(&self, s: f64) -> Point {
        self.intrados.lerp(self.extrados, s)
    }

    /// The joint scaled by `ratio` about its mid-point: the joint of an arch
    /// on the same centre line with `ratio` times the thickness.
    pub fn scaled(&self, ratio: f64) -> Joint {
        let mid = self.intrados.midpoint(self.extrados);
        let half = (self.extrados - self.intrados) * 0.5 * ratio;
        Joint { intrados: mid - half, extrados: mid + half }
    }

    /// The joint's length.
    pub fn length(&self) -> f64 {
        (self.extrados - self.intrados).hypot()
    }
}

/// What a load on a voussoir is, for the report and the load drawing.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, serde::Serialize)]
#[serde(rename_all = "snake_case")]
pub enum LoadKind {
    /// The voussoir's own weight, at its centroid.
    OwnWeight,
    /// Fill or spandrel above the voussoir, carried down vertically.
    Fill,
    /// A point or distributed load from the loads layer.
    Applied,
}

/// A force on a voussoir and a point on its line of action.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct BlockLoad {
    /// A point on the line of action.
    pub at: Point,
    /// The force (downward loads have a negative `y`).
    pub force: Vec2,
    /// What the load is.
    pub kind: LoadKind,
}

/// An arch cut into voussoirs, ready for the thrust-line solvers.
///
/// Invariant: `joints.len() == blocks.len() + 1 >= 2`; joint 0 is the left
/// springing, the last joint the right springing; block `k` lies between
/// joints `k` and `k + 1` and carries `blocks[k]`.
#[derive(Clone, Debug, PartialEq)]
pub struct Ring {
    /// The joints, left to right.
    pub joints: Vec<Joint>,
    /// The loads on each voussoir.
    pub blocks: Vec<Vec<BlockLoad>>,
}

/// Which face of the arch a hinge forms on.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, serde::Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Face {
    /// The lower face: the thrust line touches the intrados.
    Intrados,
    /// The upper face: the thrust line touches the extrados.
    Extrados,
}

/// Where a thrust line touches a face of the arch: a hinge of the mechanism
/// that would form if the arch were any thinner or the load any larger.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Hinge {
    /// The joint's index in [`Ring::joints`].
    pub joint: usize,
    /// The face touched.
    pub face: Face,
    /// The point of contact.
    pub at: Point,
}

/// Where a thrust line crosses one joint.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Crossing {
    /// The point where the line of action of the force across the joint
    /// meets the joint's line (the centre of pressure).
    pub at: Point,
    /// Its position along the joint: 0 at the intrados, 1 at the extrados;
    /// outside `[0, 1]` the thrust line has left the section.
    pub position: f64,
}

/// A thrust line in equilibrium with a [`Ring`]'s loads.
#[derive(Clone, Debug, PartialEq)]
pub struct ThrustLine {
    /// The horizontal component of the thrust, positive (compression).
    pub horizontal: f64,
    /// The reaction at the left springing: the force the left abutment
    /// exerts on the arch (x = the horizontal thrust, y upward positive).
    pub left: Vec2,
    /// The reaction at the right springing, likewise.
    pub right: Vec2,
    /// The force carried across each joint, left to right: the resultant of
    /// the left reaction and the loads of the voussoirs to the left of it.
    pub forces: Vec<Vec2>,
    /// Where the thrust line crosses each joint (`None` where the force
    /// runs parallel to the joint).
    pub crossings: Vec<Option<Crossing>>,
    /// The thrust line as drawn: the centre of pressure at the left
    /// springing, one vertex on the line of action of each voussoir's
    /// resultant load, the centre of pressure at the right springing.
    pub polygon: Vec<Point>,
    /// Where it touches the intrados or extrados (to a stated tolerance).
    pub hinges: Vec<Hinge>,
}

impl ThrustLine {
    /// True when the line lies within every joint (to `tolerance` as a
    /// fraction of the joint's length).
    pub fn fits(&self, tolerance: f64) -> bool {
        self.crossings.iter().all(|c| c.is_some_and(|c| c.position >= -tolerance && c.position <= 1.0 + tolerance))
    }
}

pub mod outline;
pub mod slice;
pub mod thrust;
