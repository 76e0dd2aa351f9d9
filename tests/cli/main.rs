//! The command line, run on the drawings in fixtures/: one test binary for
//! all of it.

mod bad;
mod behaviour;
mod cases;
mod outside;
mod util;
