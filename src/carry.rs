//! Carrying distributed loads to the hangers or posts that bring them to
//! the cable or arch.
//!
//! The deck between two consecutive hanger positions is taken as a simple
//! span: the load on it reaches the two hangers as the span's reactions
//! (the lever rule; for a uniform load, half each — tributary lengths). The
//! end panels run from a support's x to the first or last hanger; their
//! share at the support goes straight into the support, not into the cable.
//! (Common practice, no source.)
//!
//! Hanger positions are the vertical lines on the hangers layer and the
//! x of every vertical point load. With none, the distributed loads stay
//! continuous and the solver finds the continuous funicular.

use kurbo::{Point, Vec2};
use serde::Serialize;

use crate::model::{Load, Origin, Structure};

/// What one hanger position receives.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Share {
    /// The hanger's x.
    pub x: f64,
    /// The load it carries from the distributed loads (force units).
    pub load: f64,
}

/// The structure with its distributed loads carried to the hangers.
#[derive(Clone, Debug, PartialEq)]
pub struct Carried {
    /// Point loads only (when there were hanger positions), else as given.
    pub structure: Structure,
    /// What each hanger received, left to right (empty when nothing was carried).
    pub shares: Vec<Share>,
    /// What went straight into the left and right supports.
    pub to_supports: [f64; 2],
}

/// Carries `structure`'s distributed loads to `hangers` (x and where drawn)
/// and to the x of its vertical point loads.
#[must_use]
pub fn carry(structure: &Structure, hangers: &[(f64, Origin)]) -> Carried {
    let (xl, xr) = (structure.left().x(), structure.right().x());
    let none = Carried { structure: structure.clone(), shares: Vec::new(), to_supports: [0.0, 0.0] };
    if structure.distributed().is_empty() {
        return none;
    }
    let mut stations: Vec<(f64, Option<Origin>)> = hangers
        .iter()
        .filter(|(x, _)| *x > xl && *x < xr)
        .map(|(x, o)| (*x, Some(o.clone())))
        .chain(structure.loads().iter().filter(|l| l.is_vertical()).map(|l| (l.anchor.x, None)))
        .collect();
    if stations.is_empty() {
        return none;
    }
    stations.sort_by(|a, b| a.0.total_cmp(&b.0));
    stations.dedup_by(|b, a| {
        if a.0 == b.0 {
            if a.1.is_none() {
                a.1 = b.1.take();
            }
            true
        } else {
            false
        }
    });
    // Points of the panels: left support, stations, right support.
    let xs: Vec<f64> = std::iter::once(xl).chain(stations.iter().map(|s| s.0)).chain(std::iter::once(xr)).collect();
    let mut at = vec![0.0; xs.len()];
    for w in xs.windows(2).enumerate() {
        let (k, pair) = w;
        let (a, b) = (pair[0], pair[1]);
        for d in structure.distributed() {
            let (p, q) = (a.max(d.x0), b.min(d.x1));
            if q <= p {
                continue;
            }
            let (wp, wq) = (d.at(p), d.at(q));
            let r = 0.5 * (wp + wq) * (q - p);
            if r == 0.0 {
                continue;
            }
            let c = p + (q - p) * (wp + 2.0 * wq) / (3.0 * (wp + wq));
            at[k] += r * (b - c) / (b - a);
            at[k + 1] += r * (c - a) / (b - a);
        }
    }
    let n = xs.len();
    let to_supports = [at[0], at[n - 1]];
    let mut loads: Vec<Load> = structure.loads().to_vec();
    let mut shares = Vec::with_capacity(stations.len());
    for (k, (x, origin)) in stations.iter().enumerate() {
        let share = at[k + 1];
        shares.push(Share { x: *x, load: share });
        if share == 0.0 {
            continue;
        }
        match loads.iter_mut().find(|l| l.is_vertical() && l.anchor.x == *x) {
            Some(l) => l.force += Vec2::new(0.0, -share),
            None => {
                let origin =
                    origin.clone().unwrap_or(Origin { layer: String::new(), handle: None, at: Point::new(*x, 0.0) });
                loads.push(Load::vertical(*x, share, origin));
            }
        }
    }
    Carried { structure: structure.with_loads(loads, Vec::new()), shares, to_supports }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{DistributedLoad, Support};
    use crate::units::{ForceUnit, LengthUnit, Units};

    fn o(x: f64) -> Origin {
        Origin { layer: "L".into(), handle: None, at: Point::new(x, 0.0) }
    }

    fn structure(loads: Vec<Load>, distributed: Vec<DistributedLoad>) -> Structure {
        let units = Units { length: LengthUnit::Metre, force: ForceUnit::Kilonewton };
        let s = |x: f64| Support::Point { at: Point::new(x, 0.0), origin: o(x) };
        Structure::new(units, vec![s(0.0), s(40.0)], loads, distributed, None, "S").unwrap()
    }

    #[test]
    fn a_uniform_load_goes_to_hangers_by_tributary_length() {
        // 10 kN/m over 40 m, hangers every 10 m: 100 kN each, 50 kN into each support.
        let d = DistributedLoad { x0: 0.0, x1: 40.0, w0: 10.0, w1: 10.0, origin: o(20.0) };
        let hangers: Vec<(f64, Origin)> = [10.0, 20.0, 30.0].iter().map(|&x| (x, o(x))).collect();
        let c = carry(&structure(Vec::new(), vec![d]), &hangers);
        let got: Vec<f64> = c.shares.iter().map(|s| s.load).collect();
        assert_eq!(got, [100.0, 100.0, 100.0]);
        assert_eq!(c.to_supports, [50.0, 50.0]);
        assert!(c.structure.distributed().is_empty());
        assert_eq!(c.structure.loads().len(), 3);
        // Nothing is lost: the total is kept.
        let total: f64 = c.structure.loads().iter().map(Load::magnitude).sum::<f64>() + 100.0;
        assert!((total - 400.0).abs() < 1e-12);
    }

    #[test]
    fn a_triangular_load_shares_by_the_lever_rule() {
        // 0 → 12 kN/m over one 10 m panel between hangers at 10 and 20: R = 60 kN
        // at 2/3 of the panel, so 20 kN to the left hanger and 40 kN to the right.
        let d = DistributedLoad { x0: 10.0, x1: 20.0, w0: 0.0, w1: 12.0, origin: o(15.0) };
        let hangers: Vec<(f64, Origin)> = [10.0, 20.0].iter().map(|&x| (x, o(x))).collect();
        let c = carry(&structure(Vec::new(), vec![d]), &hangers);
        assert!((c.shares[0].load - 20.0).abs() < 1e-12 && (c.shares[1].load - 40.0).abs() < 1e-12);
        assert_eq!(c.to_supports, [0.0, 0.0]);
    }

    #[test]
    fn point_loads_are_hanger_positions_and_add_up() {
        let d = DistributedLoad { x0: 0.0, x1: 40.0, w0: 5.0, w1: 5.0, origin: o(20.0) };
        let c = carry(&structure(vec![Load::vertical(20.0, 30.0, o(20.0))], vec![d]), &[]);
        // One station at 20: half of each 20 m panel, 2 × 50 kN, plus 30 kN.
        assert_eq!(c.structure.loads().len(), 1);
        assert!((c.structure.loads()[0].magnitude() - 130.0).abs() < 1e-12);
        assert_eq!(c.to_supports, [50.0, 50.0]);
    }

    #[test]
    fn without_hangers_the_load_stays_continuous() {
        let d = DistributedLoad { x0: 0.0, x1: 40.0, w0: 5.0, w1: 5.0, origin: o(20.0) };
        let c = carry(&structure(Vec::new(), vec![d]), &[]);
        assert_eq!(c.structure.distributed().len(), 1);
        assert!(c.shares.is_empty());
    }
}
