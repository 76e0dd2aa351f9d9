//! The problem in local coordinates: lengths measured from the left
//! support's x and a reference height, so that drawings far from their origin
//! (coordinates up to 1e12) lose no digits inside the solver; and the load
//! line in force space.

use kurbo::{Point, Vec2};

use crate::model::{Structure, Support};

/// The three parameters of the family of funiculars, in local coordinates:
/// the pole O = (Oₓ, O_y) in force space and the left end's height.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Params {
    /// Pole, x.
    pub ox: f64,
    /// Pole, y.
    pub oy: f64,
    /// Height of the left end of the polygon, local.
    pub y_left: f64,
}

/// Loads and span in local coordinates.
#[derive(Clone, Debug)]
pub(crate) struct Frame {
    /// Drawing x of the local origin (the left support's x).
    pub x0: f64,
    /// Drawing y of the local origin.
    pub y0: f64,
    /// Span x_R − x_L (> 0, checked by `Structure::new`).
    pub span: f64,
    /// A point on each load's line of action, local, left to right.
    pub anchors: Vec<Vec2>,
    /// Each load's force.
    pub forces: Vec<Vec2>,
    /// Load line a₀ = 0, aₖ = aₖ₋₁ + Pₖ: n + 1 points in force space.
    pub load_line: Vec<Vec2>,
    /// True when every load is vertical.
    pub vertical: bool,
    /// Σ|Pₖ| (> 0): the scale of forces.
    pub force_scale: f64,
}

impl Frame {
    /// The local frame of a structure.
    pub fn new(structure: &Structure) -> Frame {
        let x0 = structure.left().x();
        // Any height on the drawing would do; a support's keeps numbers small.
        let y0 = match structure.left() {
            Support::Point { at, .. } => at.y,
            Support::Axis { foot, .. } => *foot,
        };
        let loads = structure.loads();
        let mut load_line = Vec::with_capacity(loads.len() + 1);
        let mut a = Vec2::ZERO;
        load_line.push(a);
        for l in loads {
            a += l.force;
            load_line.push(a);
        }
        Frame {
            x0,
            y0,
            span: structure.span(),
            anchors: loads.iter().map(|l| Vec2::new(l.anchor.x - x0, l.anchor.y - y0)).collect(),
            forces: loads.iter().map(|l| l.force).collect(),
            load_line,
            vertical: structure.all_vertical(),
            force_scale: loads.iter().map(|l| l.magnitude()).sum(),
        }
    }

    /// Number of loads.
    pub fn n(&self) -> usize {
        self.forces.len()
    }

    /// The same loads with their horizontal components scaled by `tau`
    /// (same anchors): the intermediate problems of the continuation in
    /// [`super::inclined`].
    pub fn tilted(&self, tau: f64) -> Frame {
        let forces: Vec<Vec2> = self.forces.iter().map(|f| Vec2::new(tau * f.x, f.y)).collect();
        let mut load_line = Vec::with_capacity(forces.len() + 1);
        let mut a = Vec2::ZERO;
        load_line.push(a);
        for f in &forces {
            a += *f;
            load_line.push(a);
        }
        Frame {
            force_scale: forces.iter().map(|f| f.hypot()).sum(),
            vertical: forces.iter().all(|f| f.x == 0.0),
            forces,
            load_line,
            anchors: self.anchors.clone(),
            ..*self
        }
    }

    /// A local point back on the drawing.
    pub fn global(&self, v: [f64; 2]) -> Point {
        Point::new(v[0] + self.x0, v[1] + self.y0)
    }
}
