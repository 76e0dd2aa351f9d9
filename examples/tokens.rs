//! Times the tokenizer alone (a development aid).
#![allow(clippy::print_stdout, missing_docs)]
use std::time::Instant;
fn main() {
    let path = std::env::args().nth(1).expect("a path");
    let bytes = std::fs::read(&path).expect("reads");
    for _ in 0..3 {
        let t = Instant::now();
        let mut p = hangline::dxf::Pairs::new(&bytes).expect("pairs");
        let mut n = 0u64;
        let mut codes = 0i64;
        while let Ok(Some(pair)) = p.next_pair() {
            n += 1;
            codes += i64::from(pair.code);
        }
        println!("pairs {n} ({codes}) in {:?}", t.elapsed());
        let t = Instant::now();
        let n = memchr::memchr_iter(b'\n', &bytes).count();
        println!("lines {n} in {:?}", t.elapsed());
    }
}
