//! The command line, run on the drawings in fixtures/: one test binary for
//! all of it.

#![allow(clippy::print_stderr, missing_docs)]

mod assess;
mod bad;
mod batch;
mod behaviour;
mod cases;
mod continuous;
mod hostile;
mod outside;
mod regressions;
mod roundtrip;
mod sketch;
mod util;
