#!/usr/bin/env bash
# Runs one fuzz target on one core for a given time, from the repository root:
#
#   bash fuzz/run.sh TARGET SECONDS [more libFuzzer options]
#
# TARGET is reader, labels or structure. The working corpus grows in
# fuzz/corpus/TARGET (not committed); fuzz/seeds/TARGET (committed) is read as
# a second corpus directory, and fuzz/dict/TARGET.dict as the dictionary when
# they exist. Crashes go to fuzz/artifacts/TARGET/, the log to
# fuzz/logs/TARGET.log. See fuzz/README.md.
set -euo pipefail
cd "$(dirname "$0")/.."
target=${1:?usage: fuzz/run.sh TARGET SECONDS [libFuzzer options]}
seconds=${2:?usage: fuzz/run.sh TARGET SECONDS [libFuzzer options]}
shift 2
mkdir -p "fuzz/corpus/$target" fuzz/logs
dirs=("fuzz/corpus/$target")
[ -d "fuzz/seeds/$target" ] && dirs+=("fuzz/seeds/$target")
opts=(-max_total_time="$seconds" -rss_limit_mb=2048 -timeout=10 -print_final_stats=1)
[ -f "fuzz/dict/$target.dict" ] && opts+=(-dict="fuzz/dict/$target.dict")
# Stable toolchain: RUSTC_BOOTSTRAP lets cargo-fuzz pass its -Z flags.
# No sanitizer: the crate forbids unsafe code, and without ASan a run is
# several times faster. Release build with debug assertions and overflow
# checks (cargo-fuzz's default).
# taskset: one core (FUZZ_CPU, default 0), also for the reader's second scan
# thread (the split-ENTITIES check).
RUSTC_BOOTSTRAP=1 taskset -c "${FUZZ_CPU:-0}" cargo fuzz run --sanitizer none "$target" "${dirs[@]}" -- "${opts[@]}" "$@" \
    2>&1 | tee "fuzz/logs/$target.log"
