//! The `hangline` command line: a thin layer over the library.

fn main() {}
