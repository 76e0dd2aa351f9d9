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
//! * [`report`] is the machine-readable summary.

pub mod dxf;
pub mod error;
pub mod layout;
pub mod model;
pub mod pipeline;
pub mod read;
pub mod report;
pub mod solve;
pub mod units;
pub mod write;
pub use error::Error;
