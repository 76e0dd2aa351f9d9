//! Reads a drawing with the `dxf` crate, for the benchmark's side-by-side.
fn main() {
    let path = std::env::args().nth(1).expect("a path");
    let d = dxf::Drawing::load_file(&path).expect("loads");
    std::process::exit(if d.entities().count() > 0 { 0 } else { 1 });
}
