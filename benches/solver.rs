//! The solver: `solve::solve` on 100, 1 000, 10 000 and 100 000 loads
//! between two fixed supports, sag given (three conditions):
//!
//! * `vertical-sag`: vertical loads, the exact linear solve;
//! * `vertical-max-force`: the same loads with the largest force given
//!   instead of the sag, the one nonlinear condition (a bracketed search);
//! * `inclined-sag`: loads leaning 5° to 10° from vertical, turning slowly
//!   along the span (their lines of action meet far below the cable), solved
//!   by Newton's method on the construction.
//!
//! Invented loads: 10 to 60 kN on a 120 m span, sag 12 m. Throughput is in
//! loads: loads per second that stay level from 100 to 100 000 mean the cost
//! is linear in the number of loads.
//!
//!     cargo bench --bench solver
use std::hint::black_box;
use std::time::Duration;

use criterion::{BenchmarkId, Criterion, Throughput, criterion_group, criterion_main};
use hangline::model::{Load, Origin, Structure, Support};
use hangline::solve::{Condition, Form, solve};
use hangline::units::{ForceUnit, LengthUnit, Units};
use kurbo::{Point, Vec2};

mod common;

const SPAN: f64 = 120.0;
const SAG: f64 = 12.0;
const COUNTS: [usize; 4] = [100, 1_000, 10_000, 100_000];

fn origin(x: f64, y: f64) -> Origin {
    Origin { layer: "LOADS".into(), handle: None, at: Point::new(x, y) }
}

/// `n` loads evenly along the span; vertical, or leaning 5° to 10° toward +x.
fn structure(n: usize, inclined: bool) -> Structure {
    let mut rng = common::Rng::new(n as u64);
    let loads = (0..n)
        .map(|i| {
            let t = (i as f64 + 0.5) / n as f64;
            let (x, w) = (SPAN * t, rng.range(10.0, 60.0));
            if inclined {
                let lean = (5.0 + 5.0 * t).to_radians();
                Load {
                    anchor: Point::new(x, 0.0),
                    force: Vec2::new(w * lean.sin(), -w * lean.cos()),
                    origin: origin(x, 0.0),
                }
            } else {
                Load::vertical(x, w, origin(x, 0.0))
            }
        })
        .collect();
    let supports = vec![
        Support::Point { at: Point::new(0.0, 0.0), origin: origin(0.0, 0.0) },
        Support::Point { at: Point::new(SPAN, 4.0), origin: origin(SPAN, 4.0) },
    ];
    let units = Units { length: LengthUnit::Metre, force: ForceUnit::Kilonewton };
    Structure::new(units, supports, loads, Vec::new(), None, "SUPPORTS").expect("a valid structure")
}

fn solver(c: &mut Criterion) {
    let mut group = c.benchmark_group("solver");
    group.sample_size(10).warm_up_time(Duration::from_millis(500)).measurement_time(Duration::from_secs(2));
    for n in COUNTS {
        let vertical = structure(n, false);
        let inclined = structure(n, true);
        // The largest force of the sag solution, given back as a condition.
        let at_sag = solve(&vertical, Form::Cable, &[Condition::Sag(SAG)]).expect("solves");
        let max_force = Condition::MaxForce(at_sag.max_force() * 1.01);
        group.throughput(Throughput::Elements(n as u64));
        for (name, s, cond) in [
            ("vertical-sag", &vertical, Condition::Sag(SAG)),
            ("vertical-max-force", &vertical, max_force),
            ("inclined-sag", &inclined, Condition::Sag(SAG)),
        ] {
            let once = solve(s, Form::Cable, &[cond]).expect("solves");
            assert_eq!(once.nodes.len(), n + 2, "{name}: a node per load and the supports");
            group.bench_with_input(BenchmarkId::new(name, n), s, |b, s| {
                b.iter(|| solve(black_box(s), Form::Cable, &[cond]).expect("solves"));
            });
        }
    }
    group.finish();
}

criterion_group!(benches, solver);
criterion_main!(benches);
