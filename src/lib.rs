//! hangline: the funicular cable or arch of a drawing's loads, by graphic statics.
//!
//! The pipeline runs one way, one module a stage:
//!
//! ```text
//! DXF bytes ─ dxf::File ─▶ read ─▶ model::Structure ─▶ solve ─▶ Solution
//!                 │                                              │
//!                 └──────────────▶ write ◀─ layout::Additions ◀──┘
//! ```
//!
//! * [`dxf`] scans a DXF file (ASCII or binary) into group-code pairs with
//!   their byte spans, without copying it; only [`read`] and [`write`] use it.
//! * [`read`] turns the scanned drawing into the plain [`model`].
//! * [`solve`] finds the funicular: pure functions, no I/O, no DXF types.
//! * [`layout`] places what is drawn back: profile, hangers, force diagram,
//!   annotations, dimensions, Bow's notation — as plain shapes.
//! * [`write`] splices those shapes into a copy of the input's bytes, keeping
//!   every byte of the user's drawing.
//! * [`sizing`] sizes the members for the forces found, under the user's
//!   safety factors (indicative: the code in force governs).
//! * [`report`] is the machine-readable summary.
//! * [`pipeline`] runs the stages in order on one drawing's bytes.
//! * [`preview`] draws the input's relevant layers and the additions as SVG.
//!
//! ```
//! use hangline::pipeline::{Given, Job, run};
//! use hangline::solve::Form;
//!
//! // Beer & Johnston, Vector Mechanics for Engineers: Statics, Prob. 7.116:
//! // the cable through (4, −3.6) ft carries its loads with H = 850 lb.
//! let drawing = std::fs::read("fixtures/bj7116-ft-r2000.dxf")?;
//! let job = Job {
//!     read: Default::default(),
//!     form: Form::Cable,
//!     given: vec![Given::Through(4.0, -3.6)],
//!     layout: Default::default(),
//!     force_scale: None,
//!     layers: Default::default(),
//!     self_weight: None,
//!     axial_stiffness: None,
//!     chord_tolerance: None,
//!     alternatives: Vec::new(),
//!     sizing: None,
//! };
//! let mut output = Vec::new();
//! let outcome = run(&drawing, &job, &mut output)?;
//! assert!((outcome.solution.thrust - 850.0).abs() < 1e-9);
//! assert!(output.len() > drawing.len());
//! # Ok::<(), Box<dyn std::error::Error>>(())
//! ```

pub mod arch;
pub mod carry;
pub mod dxf;
pub mod error;
pub mod layout;
pub mod model;
pub mod pipeline;
pub mod preview;
pub mod read;
pub mod report;
pub mod sheet;
pub mod sizing;
pub mod solve;
pub mod units;
pub mod write;
pub use error::Error;
