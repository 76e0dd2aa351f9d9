#!/usr/bin/env python3
"""Self-test of check_output.py, without hangline: imitation outputs made with ezdxf.

    python tests/outside/selftest.py [FIXTURES_DIR]

Each case writes an imitation "tool output" into a temp dir, runs
check_output.py on it as a subprocess and checks what it reports. Prints one
line per case and a closing "N passed, N failed"; exits 1 if any failed.
"""

from __future__ import annotations

import json
import subprocess
import sys
import tempfile
import traceback
from pathlib import Path

sys.dont_write_bytecode = True

import ezdxf  # noqa: E402

HERE = Path(__file__).resolve().parent
CHECK = HERE / "check_output.py"
ezdxf.options.write_fixed_meta_data_for_testing = True


def run_check(inp: Path, out: Path, *extra) -> dict:
    p = subprocess.run(
        [sys.executable, str(CHECK), str(inp), str(out), *extra],
        capture_output=True, text=True, check=False,
    )
    assert p.returncode == 0, f"exit {p.returncode}: {p.stderr}"
    return json.loads(p.stdout)


def add_tool_content(doc, scale=1.0):
    """What a tool might add: profile polyline, texts, a rendered dimension."""
    msp = doc.modelspace()
    doc.layers.add("HANGLINE-PROFILE", color=1)
    doc.layers.add("HANGLINE-TEXT", color=2)
    doc.layers.add("HANGLINE-DIM", color=3)
    pts = [(0, 0), (2 * scale, -2.2235 * scale), (4 * scale, -3.6 * scale), (8 * scale, -2.4 * scale)]
    msp.add_lwpolyline(pts, dxfattribs={"layer": "HANGLINE-PROFILE"})
    msp.add_text("H = 850 lbf", height=0.2 * scale, dxfattribs={"layer": "HANGLINE-TEXT"}).set_placement((0, -5 * scale))
    msp.add_mtext("{\\fArial|b1;T max} = 1271 lbf", dxfattribs={"layer": "HANGLINE-TEXT", "char_height": 0.2 * scale,
                                                               "insert": (0, -6 * scale)})
    if "Standard" not in doc.dimstyles:
        doc.dimstyles.add("Standard")
    dim = msp.add_linear_dim(base=(0, -4 * scale), p1=(0, 0), p2=(8 * scale, -2.4 * scale), dimstyle="Standard",
                             dxfattribs={"layer": "HANGLINE-DIM"})
    dim.render()


CASES = []


def case(fn):
    CASES.append(fn)
    return fn


@case
def self_pair_is_clean(fx: Path, tmp: Path):
    for name in ("footbridge-m-r2018.dxf", "bj7116-ft-r12-bin.dxf", "arch-m-r12.dxf"):
        r = run_check(fx / name, fx / name)
        assert r["clean"], (name, r["problems"])
        assert r["handles_kept"] and r["tables_kept"] and r["header_kept"] and not r["missing"], name
        assert r["new_layers"] == [] and r["tool_layers"] == {}, name


@case
def additions_are_reported_and_nothing_missing(fx: Path, tmp: Path):
    for name, binary in (("bj7116-ft-r2000.dxf", False), ("footbridge-m-r2018-bin.dxf", True)):
        doc = ezdxf.readfile(fx / name)
        add_tool_content(doc)
        out = tmp / f"out-{name}"
        doc.saveas(out, fmt="bin" if binary else "asc")
        r = run_check(fx / name, out)
        assert r["loaded"] and not r["missing"] and r["handles_kept"], (name, r["problems"])
        assert r["binary"]["output"] is binary
        assert r["new_layers"] == ["HANGLINE-DIM", "HANGLINE-PROFILE", "HANGLINE-TEXT"], r["new_layers"]
        tl = r["tool_layers"]
        assert tl["HANGLINE-PROFILE"]["counts"]["model"] == {"LWPOLYLINE": 1}
        assert tl["HANGLINE-PROFILE"]["polylines"][0]["vertices"][2] == [4.0, -3.6]
        texts = sorted(t["plain"] for t in tl["HANGLINE-TEXT"]["texts"])
        assert texts == ["H = 850 lbf", "T max = 1271 lbf"], texts
        (dim,) = tl["HANGLINE-DIM"]["dimensions"]
        assert dim["block_exists"] and dim["block_entities"] > 0, dim
        assert abs(dim["measurement"] - 8.0) < 1e-9, dim
        # ezdxf re-saving may only touch what ezdxf maintains itself
        allowed = {"$ACADMAINTVER", "$EXTMIN", "$EXTMAX", "$LIMMIN", "$LIMMAX", "$PEXTMIN", "$PEXTMAX",
                   "$PLIMMIN", "$PLIMMAX", "$FINGERPRINTGUID", "$VERSIONGUID", "$DIMSTYLE", "$CMATERIAL"}
        other = [d["var"] for d in r["header_differences"] if d["var"] not in allowed]
        assert not other, other


@case
def losses_are_reported(fx: Path, tmp: Path):
    name = "footbridge-m-r2018.dxf"
    doc = ezdxf.readfile(fx / name)
    msp = doc.modelspace()
    hatch = next(e for e in msp if e.dxftype() == "HATCH")
    lost_handle = hatch.dxf.handle
    msp.delete_entity(hatch)
    doc.layers.get("GRID").dxf.color = 1
    doc.header["$INSUNITS"] = 4
    next(e for e in msp if e.dxftype() == "CIRCLE" and e.dxf.layer == "LEGEND").dxf.layer = "HANGLINE-OOPS"
    out = tmp / "lossy.dxf"
    doc.saveas(out)
    r = run_check(fx / name, out)
    assert not r["clean"]
    assert {"space": "model", "type": "HATCH", "layer": "GROUND", "in": 2, "out": 1} in r["missing"], r["missing"]
    assert any(m["layer"] == "LEGEND" for m in r["missing"]), r["missing"]
    assert not r["handles_kept"]
    assert any(x["handle"] == lost_handle for x in r["handles"]["lost"])
    assert any(x["in"]["layer"] == "LEGEND" for x in r["handles"]["changed"])
    assert any(d["table"] == "layers" and d["name"] == "GRID" and d["attribute"] == "color" for d in r["table_differences"])
    assert any(d["var"] == "$INSUNITS" and d["in"] == 6 and d["out"] == 4 for d in r["header_differences"])
    assert "HANGLINE-OOPS" in r["undefined_layers_out"]


@case
def unreadable_outputs_are_findings(fx: Path, tmp: Path):
    src = fx / "bj7116-ft-r2000.dxf"
    missing = run_check(src, tmp / "does-not-exist.dxf")
    assert missing["loaded"] is False and missing["analysed"] == "none", missing
    trunc = run_check(src, fx / "bad" / "truncated.dxf")
    assert trunc["loaded"] is False and trunc["load_error"], trunc
    assert trunc["recover"] is not None and "loaded" in trunc["recover"]
    png = run_check(src, fx / "bad" / "png-magic.dxf")
    assert png["loaded"] is False and not png["clean"]
    p = subprocess.run([sys.executable, str(CHECK), str(tmp / "nope.dxf"), str(src)], capture_output=True, text=True)
    assert p.returncode == 2, p.returncode


@case
def inventory_script_matches_expectation(fx: Path, tmp: Path):
    p = subprocess.run([sys.executable, str(HERE / "inventory.py"), str(fx / "footbridge-m-r2018.dxf")],
                       capture_output=True, text=True, check=True)
    inv = json.loads(p.stdout)
    exp = json.loads((fx / "footbridge-m-r2018.expect.json").read_text(encoding="utf-8"))["inventory"]
    for key in ("model", "paper", "blocks"):
        assert inv[key] == exp[key], key


def main(argv) -> int:
    fx = Path(argv[1]) if len(argv) > 1 else HERE.parents[1] / "fixtures"
    passed = failed = 0
    with tempfile.TemporaryDirectory() as t:
        for fn in CASES:
            sub = Path(t) / fn.__name__
            sub.mkdir()
            try:
                fn(fx, sub)
                print(f"ok   {fn.__name__}")
                passed += 1
            except Exception:  # noqa: BLE001
                print(f"FAIL {fn.__name__}")
                traceback.print_exc()
                failed += 1
    print(f"{passed} passed, {failed} failed")
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
