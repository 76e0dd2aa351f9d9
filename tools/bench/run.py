#!/usr/bin/env python3
"""hangline's side-by-side benchmark: one command, one report.

Builds the release binary and the `dxf` crate reader example, writes the
benchmark drawings with make_big.py into a scratch folder outside the
repository, then measures on each drawing the wall time (the script's own
clock around the run) and the peak memory (maximum resident set size, from
/usr/bin/time -v) of:

* `hangline solve FILE -o OUT --sag 18 -q` (read, solve, write), RUNS times
  (default 3), taking the median time and the largest peak;
* ezdxf's `ezdxf.readfile(FILE)` in the venv's Python, once;
* `target/release/examples/dxf_crate_read FILE` (`dxf::Drawing::load_file`), once;

and prints a table of times, peak memory and ratios, with PASS/FAIL against
the targets below. It exits 0 whatever the verdicts (it is a report); only a
failed build or generation stops it early.

Targets (for the 100 MB drawing; the 10 MB rows are shown for information):

* hangline end to end <= 1/100 of ezdxf's read of the same file;
* hangline end to end <= 1/10 of the dxf crate's read of the same file;
* hangline's peak memory <= 1.5 x the file's size;
* binary DXF as fast as ASCII: the binary file's median time <= the ASCII
  one's of the same drawing, within --binary-allowance (default 5 %).

    tools/bench/run.sh            # 10 MB and 100 MB, ASCII and binary
    tools/bench/run.sh --quick    # 10 MB only, for development
"""

from __future__ import annotations

import argparse
import datetime
import hashlib
import json
import os
import platform
import re
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

HERE = Path(__file__).resolve().parent
ROOT = HERE.parent.parent
MAKE_BIG = HERE / "make_big.py"
#: The sag the generated structure is solved with (make_big.SAG), in metres.
SAG = "18"
VERSION = "R2010"

TARGET_EZDXF = 1 / 100
TARGET_DXF_CRATE = 1 / 10
TARGET_PEAK = 1.5


def log(msg: str) -> None:
    print(msg, file=sys.stderr, flush=True)


def sh(cmd: list[str], **kw) -> subprocess.CompletedProcess:
    return subprocess.run(cmd, text=True, capture_output=True, **kw)


# ---------------------------------------------------------------------------
# Build and generate
# ---------------------------------------------------------------------------


def build() -> Path:
    """cargo build --release (binary and the dxf crate example); the target dir."""
    for cmd in (["cargo", "build", "--release"], ["cargo", "build", "--release", "--example", "dxf_crate_read"]):
        log("== " + " ".join(cmd))
        r = subprocess.run(cmd, cwd=ROOT)
        if r.returncode != 0:
            raise SystemExit(f"run: {' '.join(cmd)} failed")
    meta = sh(["cargo", "metadata", "--format-version", "1", "--no-deps"], cwd=ROOT)
    if meta.returncode != 0:
        raise SystemExit("run: cargo metadata failed:\n" + meta.stderr)
    return Path(json.loads(meta.stdout)["target_directory"])


def stamp_of(args: list[str]) -> str:
    """What a drawing depends on: the generator's text, its arguments, ezdxf."""
    import ezdxf

    h = hashlib.sha256(MAKE_BIG.read_bytes())
    h.update(repr((args, ezdxf.__version__)).encode())
    return h.hexdigest()


def generate(folder: Path, mb: int, binary: bool, verify: bool, regenerate: bool) -> dict:
    """Writes (or reuses, when its stamp matches) one benchmark drawing."""
    name = f"tarrowby-{mb}mb-{VERSION}{'-bin' if binary else ''}.dxf"
    path = folder / name
    args = ["--mb", str(mb), "--version", VERSION] + (["--binary"] if binary else [])
    stamp = stamp_of(args)
    stamp_file = path.with_suffix(".stamp")
    info = {"name": name, "path": path, "mb_asked": mb, "binary": binary, "generated_s": None, "verified": None}
    if not regenerate and path.exists() and stamp_file.exists() and stamp_file.read_text() == stamp:
        log(f"== {name}: reusing (generator and arguments unchanged)")
    else:
        stamp_file.unlink(missing_ok=True)
        log(f"== generating {name}" + (" and checking it with ezdxf (read, audit)" if verify else ""))
        t = time.perf_counter()
        r = subprocess.run(
            [sys.executable, str(MAKE_BIG), *args, "-o", str(path)] + (["--verify"] if verify else []),
            capture_output=True,
            text=True,
        )
        info["generated_s"] = time.perf_counter() - t
        sys.stderr.write(r.stderr)
        if r.returncode != 0:
            raise SystemExit(f"run: generating {name} failed")
        if verify:
            info["verified"] = "OK" in r.stderr.split("verify:")[-1]
        stamp_file.write_text(stamp)
    info["bytes"] = path.stat().st_size
    return info


# ---------------------------------------------------------------------------
# Measure
# ---------------------------------------------------------------------------


def clock_to_s(s: str) -> float:
    """/usr/bin/time's "h:mm:ss" or "m:ss.ss" to seconds."""
    total = 0.0
    for part in s.split(":"):
        total = total * 60 + float(part)
    return total


def timed(cmd: list[str], workdir: Path) -> dict:
    """Runs cmd under /usr/bin/time -v: wall seconds, peak RSS bytes, exit code."""
    with tempfile.NamedTemporaryFile("r", dir=workdir, suffix=".time", delete=False) as tf:
        tfile = tf.name
    try:
        t = time.perf_counter()
        r = subprocess.run(["/usr/bin/time", "-v", "-o", tfile, *cmd], capture_output=True, text=True)
        wall_s = time.perf_counter() - t
        text = Path(tfile).read_text()
    finally:
        os.unlink(tfile)
    wall = re.search(r"Elapsed \(wall clock\) time \(h:mm:ss or m:ss\): (\S+)", text)
    rss = re.search(r"Maximum resident set size \(kbytes\): (\d+)", text)
    code = re.search(r"Exit status: (\d+)", text)
    # Wall time from this process's clock (1 µs resolution; /usr/bin/time's
    # own is in centiseconds, kept as time_s); peak memory from /usr/bin/time.
    return {
        "s": wall_s,
        "time_s": clock_to_s(wall.group(1)) if wall else None,
        "peak": int(rss.group(1)) * 1024 if rss else None,
        "rc": int(code.group(1)) if code else r.returncode,
        "stderr": r.stderr.strip()[-400:],
    }


def measure(drawing: dict, target: Path, runs: int, workdir: Path) -> dict:
    path = str(drawing["path"])
    with open(path, "rb") as f:  # the same warm page cache for every reader
        while f.read(1 << 24):
            pass
    out = workdir / ("out-" + drawing["name"])
    hl = []
    for i in range(runs):
        m = timed([str(target / "release" / "hangline"), "solve", path, "-o", str(out), "--sag", SAG, "-q"], workdir)
        log(f"   hangline run {i + 1}: {fmt_s(m['s'])} s, peak {fmt_mib(m['peak'])} MiB" + bad(m))
        hl.append(m)
        out.unlink(missing_ok=True)
    ok = [m for m in hl if m["rc"] == 0 and m["s"] is not None]
    ez = timed([sys.executable, "-c", "import sys, ezdxf; ezdxf.readfile(sys.argv[1])", path], workdir)
    log(f"   ezdxf.readfile: {fmt_s(ez['s'])} s, peak {fmt_mib(ez['peak'])} MiB" + bad(ez))
    dc = timed([str(target / "release" / "examples" / "dxf_crate_read"), path], workdir)
    log(f"   dxf crate load_file: {fmt_s(dc['s'])} s, peak {fmt_mib(dc['peak'])} MiB" + bad(dc))
    return {
        "hangline_runs": hl,
        "hangline_s": statistics.median(m["s"] for m in ok) if len(ok) == len(hl) else None,
        "hangline_peak": max(m["peak"] for m in ok) if len(ok) == len(hl) else None,
        "ezdxf": ez,
        "dxf_crate": dc,
    }


def bad(m: dict) -> str:
    return "" if m["rc"] == 0 else f"  FAILED (exit {m['rc']}): {m['stderr']}"


# ---------------------------------------------------------------------------
# Report
# ---------------------------------------------------------------------------


def fmt_s(v) -> str:
    if v is None:
        return "-"
    return f"{v:.4f}" if v < 1 else f"{v:.3f}" if v < 10 else f"{v:.1f}"


def fmt_mib(v) -> str:
    return "-" if v is None else f"{v / 2**20:.0f}"


def fmt_ratio(v) -> str:
    if v is None:
        return "-"
    return f"{v:.4f} (1/{1 / v:.0f})" if v > 0 else "0"


def ratio(a, b):
    return a / b if a is not None and b and b > 0 else None


def verdict(value, limit) -> str:
    if value is None:
        return "n/a"
    return "PASS" if value <= limit else "FAIL"


def environment() -> dict:
    def first(cmd, cwd=ROOT):
        try:
            r = sh(cmd, cwd=cwd)
            return r.stdout.strip().splitlines()[0] if r.returncode == 0 and r.stdout.strip() else "?"
        except OSError:
            return "?"

    cpu = "?"
    try:
        for line in Path("/proc/cpuinfo").read_text().splitlines():
            if line.startswith("model name"):
                cpu = line.split(":", 1)[1].strip()
                break
    except OSError:
        pass
    import ezdxf

    dirty = sh(["git", "status", "--porcelain", "--untracked-files=no"], cwd=ROOT).stdout.strip()
    return {
        "date": datetime.datetime.now().isoformat(timespec="seconds"),
        "commit": first(["git", "rev-parse", "--short", "HEAD"]) + (" (uncommitted changes)" if dirty else ""),
        "cpu": f"{cpu}, {os.cpu_count()} logical CPUs",
        "load": " ".join(f"{x:.2f}" for x in os.getloadavg()),
        "rustc": first(["rustc", "--version"]),
        "python": platform.python_version(),
        "ezdxf": ezdxf.__version__,
    }


def report(rows: list[dict], env: dict, quick: bool, allowance: float) -> list[str]:
    lines = []
    p = lines.append
    p("")
    p("hangline benchmark: Tarrowby Reach survey drawings (invented), solve --sag " + SAG)
    p(f"  {env['date']}  commit {env['commit']}  load average {env['load']} at start")
    p(f"  {env['cpu']}; {env['rustc']}; Python {env['python']}, ezdxf {env['ezdxf']}")
    p("  times: wall seconds; hangline: median of its runs, peak: the largest of its runs; ezdxf and dxf crate: one run")
    p("")
    head = ["file", "MB", "hangline s", "peak MiB", "peak/size", "ezdxf s", "dxf-crate s", "hangline/ezdxf",
            "hangline/dxf-crate", "time<=1/100 ezdxf", "time<=1/10 dxf", "peak<=1.5x"]
    table = [head]
    for r in rows:
        d, m = r["drawing"], r["m"]
        hs, peak = m["hangline_s"], m["hangline_peak"]
        ez = m["ezdxf"]["s"] if m["ezdxf"]["rc"] == 0 else None
        dc = m["dxf_crate"]["s"] if m["dxf_crate"]["rc"] == 0 else None
        r_ez, r_dc, r_peak = ratio(hs, ez), ratio(hs, dc), ratio(peak, d["bytes"])
        r.update(ratio_ezdxf=r_ez, ratio_dxf_crate=r_dc, peak_ratio=r_peak)
        table.append([
            d["name"], f"{d['bytes'] / 1e6:.1f}", fmt_s(hs) if hs is not None else "FAILED", fmt_mib(peak),
            f"{r_peak:.2f}" if r_peak is not None else "-",
            fmt_s(ez) if ez is not None else "FAILED", fmt_s(dc) if dc is not None else "FAILED",
            fmt_ratio(r_ez), fmt_ratio(r_dc),
            verdict(r_ez, TARGET_EZDXF), verdict(r_dc, TARGET_DXF_CRATE), verdict(r_peak, TARGET_PEAK),
        ])
    widths = [max(len(row[i]) for row in table) for i in range(len(head))]
    for n, row in enumerate(table):
        p("  " + "  ".join(c.ljust(w) if i == 0 else c.rjust(w) for i, (c, w) in enumerate(zip(row, widths))))
        if n == 0:
            p("  " + "  ".join("-" * w for w in widths))
    p("")

    # Binary against ASCII, per size: the same drawing in both encodings.
    bin_verdicts = {}
    p(f"binary vs ASCII (same drawing; PASS when binary time <= ASCII time x {1 + allowance:.2f}):")
    for r in rows:
        d = r["drawing"]
        if not d["binary"]:
            continue
        twin = next((a for a in rows if not a["drawing"]["binary"] and a["drawing"]["mb_asked"] == d["mb_asked"]), None)
        if twin is None:
            continue
        rb = ratio(r["m"]["hangline_s"], twin["m"]["hangline_s"])
        v = verdict(rb, 1 + allowance)
        bin_verdicts[d["mb_asked"]] = (rb, v)
        p(f"  {d['mb_asked']} MB: binary {fmt_s(r['m']['hangline_s'])} s ({d['bytes'] / 1e6:.1f} MB), "
          f"ASCII {fmt_s(twin['m']['hangline_s'])} s ({twin['drawing']['bytes'] / 1e6:.1f} MB): "
          f"ratio {rb:.2f} -> {v}" if rb is not None else f"  {d['mb_asked']} MB: n/a (a run failed)")
    p("")

    # The verdicts that count: the 100 MB drawing.
    big = [r for r in rows if r["drawing"]["mb_asked"] == 100]
    if not big:
        p("VERDICTS: none (quick run: the targets are for the 100 MB drawing; the rows above are for information)")
        return lines
    p("VERDICTS (100 MB drawing):")
    checks = []
    for r in big:
        kind = "binary" if r["drawing"]["binary"] else "ASCII"
        checks += [
            (f"{kind}: hangline <= 1/100 of ezdxf's read", r["ratio_ezdxf"], TARGET_EZDXF, fmt_ratio),
            (f"{kind}: hangline <= 1/10 of the dxf crate's read", r["ratio_dxf_crate"], TARGET_DXF_CRATE, fmt_ratio),
            (f"{kind}: peak memory <= 1.5 x file size", r["peak_ratio"], TARGET_PEAK,
             lambda v: "-" if v is None else f"{v:.2f} x"),
        ]
    if 100 in bin_verdicts:
        checks.append(("binary as fast as ASCII", bin_verdicts[100][0], 1 + allowance,
                       lambda v: "-" if v is None else f"{v:.2f} x the ASCII time"))
    for text, value, limit, f in checks:
        p(f"  {verdict(value, limit):4}  {text}: {f(value)}")
    passed = sum(verdict(v, lim) == "PASS" for _, v, lim, _ in checks)
    p(f"  {passed} of {len(checks)} targets met")
    return lines


def main() -> int:
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0],
                                 formatter_class=argparse.RawDescriptionHelpFormatter, epilog=__doc__)
    ap.add_argument("--quick", action="store_true", help="the 10 MB drawings only (development)")
    ap.add_argument("--dir", type=Path, default=Path(os.environ.get("TMPDIR", "/tmp")) / "hangline-bench",
                    help="scratch folder for drawings and outputs (default $TMPDIR/hangline-bench)")
    ap.add_argument("--runs", type=int, default=3, help="hangline runs per drawing, median taken (default 3)")
    ap.add_argument("--regenerate", action="store_true", help="write the drawings even when they are current")
    ap.add_argument("--no-build", action="store_true", help="use the binaries already built")
    ap.add_argument("--binary-allowance", type=float, default=0.05,
                    help="noise allowed in 'binary as fast as ASCII' (default 0.05: 5 %%)")
    args = ap.parse_args()

    folder = args.dir.resolve()
    if folder == ROOT or ROOT in folder.parents:
        raise SystemExit("run: --dir must be outside the repository")
    if shutil.which("/usr/bin/time") is None:
        raise SystemExit("run: /usr/bin/time is needed (apt-get install time)")
    folder.mkdir(parents=True, exist_ok=True)
    started = time.perf_counter()

    env = environment()
    if float(env["load"].split()[0]) > 0.5 * (os.cpu_count() or 1):
        log(f"note: load average {env['load']} on {os.cpu_count()} CPUs: the machine is busy, times will be noisy")
    if args.no_build:
        meta = sh(["cargo", "metadata", "--format-version", "1", "--no-deps"], cwd=ROOT)
        target = Path(json.loads(meta.stdout)["target_directory"])
    else:
        target = build()

    sizes = [10] if args.quick else [10, 100]
    t = time.perf_counter()
    drawings = []
    for mb in sizes:
        for binary in (False, True):
            drawings.append(generate(folder, mb, binary, verify=mb <= 10, regenerate=args.regenerate))
    gen_s = time.perf_counter() - t
    rows = []
    for d in drawings:
        log(f"== measuring {d['name']} ({d['bytes'] / 1e6:.1f} MB)")
        rows.append({"drawing": d, "m": measure(d, target, args.runs, folder)})

    lines = report(rows, env, args.quick, args.binary_allowance)
    total = time.perf_counter() - started
    lines.append("")
    lines.append(f"generation {gen_s:.0f} s (0 when reused), whole run {total:.0f} s; drawings in {folder}")
    print("\n".join(lines))
    result = {
        "environment": env,
        "sag": SAG,
        "rows": [
            {**{k: (str(v) if isinstance(v, Path) else v) for k, v in r["drawing"].items()},
             **{k: v for k, v in r["m"].items()},
             **{k: r.get(k) for k in ("ratio_ezdxf", "ratio_dxf_crate", "peak_ratio")}}
            for r in rows
        ],
        "report": lines,
    }
    out = folder / "results.json"
    out.write_text(json.dumps(result, indent=1, default=str))
    print(f"results: {out}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
