//! The command line, run on the drawings in fixtures/: one test binary for
//! all of it.

#![allow(clippy::print_stderr, missing_docs)]

mod alternatives;
mod assess;
mod bad;
mod batch;
mod behaviour;
mod cases;
mod continuous;
mod hostile;
mod outside;
mod preview;
mod regressions;
mod roundtrip;
mod sheet;
mod sizing;
mod sketch;
mod util;
