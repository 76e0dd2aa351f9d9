//! The reader: `dxf::File::scan` then `read::read`, on drawings built in
//! memory (the footbridge fixture with 1, 4 and 16 MiB of survey background;
//! see `common`), ASCII and the same drawing in binary. Throughput is in
//! bytes of the file read: MB/s that stay level from size to size mean the
//! cost is linear in the file's size.
//!
//! `HANGLINE_BENCH_FILE=PATH[,PATH…]` adds drawings from disk (for example
//! those `tools/bench/make_big.py` writes).
//!
//!     cargo bench --bench reader
use std::hint::black_box;
use std::time::Duration;

use criterion::{BenchmarkId, Criterion, Throughput, criterion_group, criterion_main};
use hangline::dxf::File;
use hangline::read::{ReadOptions, read, scan_options};
use hangline::write::OutputLayers;

mod common;

fn scan_and_read(bytes: &[u8], options: &ReadOptions, layers: &OutputLayers) -> usize {
    let file = File::scan(bytes, &scan_options(&options.layers, layers.all())).expect("scans");
    let reading = read(&file, options).expect("reads");
    reading.loads.len()
}

fn reader(c: &mut Criterion) {
    let options = ReadOptions::default();
    let layers = OutputLayers::default();
    let mut group = c.benchmark_group("reader");
    group.sample_size(10).warm_up_time(Duration::from_secs(1)).measurement_time(Duration::from_secs(3));
    for (label, ascii, binary) in common::drawings() {
        for (format, bytes) in [("ascii", ascii.as_bytes()), ("binary", binary.as_slice())] {
            assert_eq!(scan_and_read(bytes, &options, &layers), 7, "the fixture's seven loads");
            group.throughput(Throughput::Bytes(bytes.len() as u64));
            group.bench_with_input(BenchmarkId::new(format!("scan+read/{format}"), label), bytes, |b, bytes| {
                b.iter(|| scan_and_read(black_box(bytes), &options, &layers));
            });
        }
    }
    if let Ok(paths) = std::env::var("HANGLINE_BENCH_FILE") {
        for path in paths.split(',').filter(|p| !p.is_empty()) {
            let bytes = std::fs::read(path).unwrap_or_else(|e| panic!("reading {path}: {e}"));
            let name = std::path::Path::new(path).file_name().map_or(path.into(), |n| n.to_string_lossy());
            group.throughput(Throughput::Bytes(bytes.len() as u64));
            group.bench_with_input(BenchmarkId::new("scan+read/file", name), &bytes, |b, bytes| {
                b.iter(|| scan_and_read(black_box(bytes), &options, &layers));
            });
        }
    }
    group.finish();
}

criterion_group!(benches, reader);
criterion_main!(benches);
