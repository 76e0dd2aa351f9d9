//! The writer: `write::write` of the footbridge fixture's solution into a
//! `Vec`, on drawings built in memory (the fixture with 1, 4 and 16 MiB of
//! survey background; see `common`), ASCII and the same drawing in binary.
//! The drawing is scanned, read, solved (sag 4.5 m) and laid out once,
//! outside the timing. Throughput is in bytes of the input: MB/s that stay
//! level from size to size mean the cost is linear in the file's size.
//!
//!     cargo bench --bench writer
use std::hint::black_box;
use std::time::Duration;

use criterion::{BenchmarkId, Criterion, Throughput, criterion_group, criterion_main};
use hangline::dxf::File;
use hangline::layout::layout;
use hangline::read::{ReadOptions, read, scan_options};
use hangline::solve::{Condition, Form, solve};
use hangline::write::{OutputLayers, write};

mod common;

fn writer(c: &mut Criterion) {
    let options = ReadOptions::default();
    let layers = OutputLayers::default();
    let mut group = c.benchmark_group("writer");
    group.sample_size(10).warm_up_time(Duration::from_secs(1)).measurement_time(Duration::from_secs(3));
    for (label, ascii, binary) in common::drawings() {
        for (format, bytes) in [("ascii", ascii.as_bytes()), ("binary", binary.as_slice())] {
            let file = File::scan(bytes, &scan_options(&options.layers, layers.all())).expect("scans");
            let reading = read(&file, &options).expect("reads");
            let solution = solve(&reading.structure, Form::Cable, &[Condition::Sag(common::SAG)]).expect("solves");
            let (additions, _) =
                layout(&reading.structure, &reading.structure, &solution, reading.extents, &Default::default());
            let mut out = Vec::with_capacity(bytes.len() + (1 << 20));
            write(&file, &additions, &layers, &mut out).expect("writes");
            assert!(out.len() > bytes.len(), "the additions are written");
            common::dump(&format!("bench-{label}{}-out.dxf", if format == "ascii" { "" } else { "-bin" }), &out);
            group.throughput(Throughput::Bytes(bytes.len() as u64));
            group.bench_function(BenchmarkId::new(format!("write/{format}"), label), |b| {
                b.iter(|| {
                    out.clear();
                    write(black_box(&file), &additions, &layers, &mut out).expect("writes");
                    out.len()
                });
            });
        }
    }
    group.finish();
}

criterion_group!(benches, writer);
criterion_main!(benches);
