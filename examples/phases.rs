//! Times the stages on one drawing (a development aid, not a test).
#![allow(clippy::print_stdout, missing_docs)]
use std::time::Instant;
fn main() {
    let path = std::env::args().nth(1).expect("a path");
    let t = Instant::now();
    let bytes = std::fs::read(&path).expect("reads");
    println!("read file   {:?}", t.elapsed());
    let layers = hangline::write::OutputLayers::default();
    let opts = hangline::read::ReadOptions::default();
    let t = Instant::now();
    let file =
        hangline::dxf::File::scan(&bytes, &hangline::read::scan_options(&opts.layers, layers.all())).expect("scans");
    println!("scan        {:?}", t.elapsed());
    let t = Instant::now();
    let reading = hangline::read::read(&file, &opts).expect("reads");
    println!("read model  {:?}", t.elapsed());
    let t = Instant::now();
    let s = hangline::solve::solve(
        &reading.structure,
        hangline::solve::Form::Cable,
        &[hangline::solve::Condition::Sag(4.5)],
    )
    .expect("solves");
    let (adds, _) =
        hangline::layout::layout(&reading.structure, &reading.structure, &s, reading.extents, &Default::default());
    println!("solve+lay   {:?}", t.elapsed());
    let t = Instant::now();
    let mut v = Vec::with_capacity(bytes.len() + 100000);
    hangline::write::write(&file, &adds, &layers, &mut v).expect("writes");
    println!("write vec   {:?}", t.elapsed());
    let t = Instant::now();
    std::fs::write("/tmp/phases-out.dxf", &v).expect("writes");
    println!("write file  {:?}", t.elapsed());
}
