#!/usr/bin/env python3
"""Writes a large DXF drawing for hangline's benchmark.

An invented scenario: the general-arrangement and survey sheet of a
suspension footbridge at Tarrowby Reach, where it crosses the River Orrin
(both invented). The structure hangline reads is small and fixed:

* two POINTs on SUPPORTS (the saddles on the tower tops, 186 m apart),
* 20 vertical LINEs on LOADS (the hanger loads), each with a TEXT label such
  as "45 kN" just right of it, and
* the DECK as an LWPOLYLINE.

Around it lies a large survey background on 200 other layers: contours
(LWPOLYLINE) with level labels, the river with a SOLID hatch, buildings with
ANSI31 hatches and rendered linear DIMENSIONs, planting beds whose hatches have
line-and-arc edge paths, trees, boreholes, survey stations, manholes and lamps
as block INSERTs with ATTRIBs, spot levels (TEXT and POINT), kerbs (LINE,
ARC), bollards (CIRCLE) and MTEXT notes. Every name and number is invented.

How it is built, so that 100 MB takes seconds rather than the better part of
an hour:

1. ezdxf writes a small drawing: the structure, the shared blocks and one
   survey *tile* (about 0.8 MB of ASCII) around the bridge.
2. That drawing is split into group-code tags; the tile's entities, the
   anonymous blocks of its dimensions (``*D``) and their BLOCK_RECORD entries
   are compiled into templates whose handles, pointers, ``*D`` names and
   coordinates are holes.
3. The file is written once, in ASCII or binary, streaming: the small drawing
   as it was, plus the tile repeated on a grid, each copy with fresh unique
   handles (pointers within a copy follow its handles; pointers out of it,
   such as the owner model space, stay), its own ``*D`` block names, and its
   coordinates moved to its grid cell. ``$HANDSEED``, ``$EXTMIN``/``$EXTMAX``
   and the BLOCK_RECORD count are set to match.

``--mb`` is the size of the ASCII file (10⁶ bytes, to within about 1 %; the
last tile is a partial one); ``--binary`` writes the same drawing (same
handles, same values) as binary DXF, about 72 % of that size. The output is deterministic: same arguments, same
bytes. ``--verify`` reads the result back with ezdxf and runs its audit.

    python tools/bench/make_big.py --mb 10 -o /tmp/tarrowby-10.dxf
    python tools/bench/make_big.py --mb 100 --binary -o /tmp/tarrowby-100-bin.dxf
    python tools/bench/make_big.py --mb 10 -o /tmp/t.dxf --verify

The structure is solved with, for example, ``hangline solve FILE --sag 18``.
"""

from __future__ import annotations

import argparse
import io
import math
import os
import random
import struct
import sys
import time

# Repeatable output: ezdxf orders some objects by Python's string hashing.
if os.environ.get("PYTHONHASHSEED") != "0":
    os.environ["PYTHONHASHSEED"] = "0"
    os.execv(sys.executable, [sys.executable] + sys.argv)

import ezdxf  # noqa: E402
from ezdxf.enums import TextEntityAlignment  # noqa: E402
from ezdxf.lldxf.types import BINARY_DATA, BYTES, DOUBLE, INT16, INT32, INT64  # noqa: E402

# Fixed dates and GUIDs, so that writing again gives the same bytes.
ezdxf.options.write_fixed_meta_data_for_testing = True

VERSIONS = {"R2000", "R2004", "R2007", "R2010", "R2013", "R2018"}

# ---------------------------------------------------------------------------
# The scenario (all invented)
# ---------------------------------------------------------------------------

#: Saddles on the west and east tower tops (m).
WEST, EAST = (0.0, 38.0), (186.0, 40.5)
#: Hanger loads: x (m) and label. Spacing 8.5 m; the heavier ones carry the
#: viewing platform at mid-span and the service duct near the east bank.
HANGERS = [
    (12.0 + 8.5 * i, lab)
    for i, lab in enumerate(
        [
            "45 kN", "42 kN", "42 kN", "44 kN", "44 kN", "46 kN", "48 kN", "52 kN", "P = 61 kN", "P = 63 kN",
            "P = 61 kN", "52 kN", "48 kN", "46 kN", "47.5 kN", "50 kN", "50 kN", "44 kN", "42 kN", "45 kN",
        ]
    )
]
#: The deck: a gentle crest over the river.
DECK = [(-8.0, 9.0), (30.0, 10.2), (93.0, 11.4), (150.0, 10.9), (194.0, 10.0)]
#: The sag the structure is solved with in the benchmark (m).
SAG = 18.0

#: One survey tile (m): its lower-left corner in tile 0, and its size. Copies
#: sit on a grid of such cells, going east then south.
TILE_X0, TILE_Y0, TILE_W, TILE_H = -150.0, -160.0, 480.0, 360.0

DISCIPLINES = ["SV", "UT", "TP", "GE", "LS", "HW", "DR", "EL", "ST", "AN"]
ITEMS = [
    "EXIST", "PROP", "TEXT", "HATCH", "DIM", "SYMB", "LINE", "BOUND", "LEVEL", "NOTE",
    "GRID", "REF", "AREA", "POINT", "DETAIL", "MARK", "EDGE", "CENTRE", "SECT", "KEY",
]
#: 200 background layers; the structure's layers are not among them.
BACKGROUND_LAYERS = [f"{d}-{i}" for d in DISCIPLINES for i in ITEMS]
LINETYPES = ["Continuous", "DASHED", "CENTER", "DOT", "PHANTOM", "DASHDOT", "DIVIDE", "Continuous"]

SPECIES = ["Ash", "Oak", "Alder", "Willow", "Birch", "Field maple", "Hawthorn", "Hazel", "Lime", "Rowan"]


def deck_y(x: float) -> float:
    for (x0, y0), (x1, y1) in zip(DECK, DECK[1:]):
        if x0 <= x <= x1:
            return y0 + (y1 - y0) * (x - x0) / (x1 - x0)
    raise ValueError(x)


def layer_picker(rng: random.Random):
    """A layer of a discipline, spread so that every layer gets used."""

    def pick(disc: str) -> str:
        return f"{disc}-{rng.choice(ITEMS)}"

    return pick


def build_base(version: str) -> ezdxf.document.Drawing:
    """The small drawing: structure, shared blocks and survey tile 0."""
    doc = ezdxf.new(version, setup=True)
    doc.header["$INSUNITS"] = 6  # metres
    doc.header["$MEASUREMENT"] = 1
    for name, colour in [("SUPPORTS", 1), ("LOADS", 3), ("DECK", 5), ("BR-TOWERS", 8), ("BR-TITLE", 7)]:
        doc.layers.add(name, color=colour)
    for n, name in enumerate(BACKGROUND_LAYERS):
        lt = LINETYPES[n % len(LINETYPES)]
        doc.layers.add(name, color=1 + (n * 37) % 254, linetype=lt)
    doc.dimstyles.new(
        "TARROWBY",
        dxfattribs={"dimtxt": 0.9, "dimasz": 0.7, "dimexo": 0.3, "dimexe": 0.4, "dimgap": 0.25, "dimdec": 2},
    )
    define_blocks(doc)
    msp = doc.modelspace()
    draw_structure(msp)
    draw_tile(msp, random.Random(20240611))
    return doc


def define_blocks(doc) -> None:
    """Blocks shared by every tile: survey symbols with attribute definitions."""
    att = {"height": 0.35, "layer": "0"}

    tree = doc.blocks.new("TREE")
    tree.add_circle((0, 0), 1.0)
    tree.add_line((-0.15, 0), (0.15, 0))
    tree.add_line((0, -0.15), (0, 0.15))
    for i, tag in enumerate(["TREE_NO", "SPECIES", "GIRTH", "SPREAD"]):
        tree.add_attdef(tag, (1.1, 0.4 - 0.45 * i), dxfattribs=att)

    bh = doc.blocks.new("BOREHOLE")
    bh.add_circle((0, 0), 0.5)
    bh.add_line((-0.7, 0), (0.7, 0))
    bh.add_line((0, -0.7), (0, 0.7))
    h = bh.add_hatch()
    h.paths.add_polyline_path([(0, 0), (0.5, 0), (0, 0.5)], is_closed=True)
    for i, tag in enumerate(["BH_ID", "GL", "DEPTH"]):
        bh.add_attdef(tag, (0.8, 0.3 - 0.45 * i), dxfattribs=att)

    stn = doc.blocks.new("SURVEY_STN")
    stn.add_lwpolyline([(-0.6, -0.35), (0.6, -0.35), (0, 0.7)], close=True)
    stn.add_point((0, 0))
    for i, tag in enumerate(["STN", "EASTING", "NORTHING", "LEVEL"]):
        stn.add_attdef(tag, (0.9, 0.5 - 0.45 * i), dxfattribs=att)

    mh = doc.blocks.new("MANHOLE")
    mh.add_lwpolyline([(-0.6, -0.6), (0.6, -0.6), (0.6, 0.6), (-0.6, 0.6)], close=True)
    mh.add_circle((0, 0), 0.45)
    for i, tag in enumerate(["MH_REF", "COVER_LEVEL", "INVERT_LEVEL"]):
        mh.add_attdef(tag, (0.9, 0.3 - 0.45 * i), dxfattribs=att)

    lamp = doc.blocks.new("LAMP")
    lamp.add_circle((0, 0), 0.25)
    lamp.add_line((0, 0), (0, 1.2))
    lamp.add_attdef("LAMP_ID", (0.4, 0.2), dxfattribs=att)


def draw_structure(msp) -> None:
    """What hangline reads, and the towers and title (not repeated)."""
    msp.add_point(WEST, dxfattribs={"layer": "SUPPORTS"})
    msp.add_point(EAST, dxfattribs={"layer": "SUPPORTS"})
    for (x, top), foot in [(WEST, 2.0), (EAST, 3.5)]:
        msp.add_lwpolyline(
            [(x - 1.2, foot), (x - 0.6, top), (x + 0.6, top), (x + 1.2, foot)], dxfattribs={"layer": "BR-TOWERS"}
        )
    msp.add_lwpolyline(DECK, dxfattribs={"layer": "DECK"})
    for x, label in HANGERS:
        y = deck_y(x)
        msp.add_line((x, y), (x, y + 4.0), dxfattribs={"layer": "LOADS"})
        msp.add_text(label, height=0.8, dxfattribs={"layer": "LOADS"}).set_placement((x + 0.6, y + 2.6))
    msp.add_text(
        "TARROWBY REACH FOOTBRIDGE OVER THE RIVER ORRIN - GENERAL ARRANGEMENT AND SURVEY (invented example)",
        height=2.5,
        dxfattribs={"layer": "BR-TITLE"},
    ).set_placement((-20.0, 60.0))
    msp.add_text(
        "Hanger loads: deck, surfacing, crowd; viewing platform at mid-span", height=1.5,
        dxfattribs={"layer": "BR-TITLE"},
    ).set_placement((-20.0, 56.0))


def draw_tile(msp, rng: random.Random) -> None:
    """One survey tile in the cell of tile 0. Everything on background layers."""
    pick = layer_picker(rng)
    x0, y0, w, h = TILE_X0, TILE_Y0, TILE_W, TILE_H

    def rxy(margin: float = 10.0):
        return (rng.uniform(x0 + margin, x0 + w - margin), rng.uniform(y0 + margin, y0 + h - margin))

    def level() -> float:
        return round(rng.uniform(4.0, 31.0), 2)

    # Contours every 1 m of level, running east-west across the cell.
    for k in range(34):
        base = y0 + 6.0 + k * (h - 12.0) / 34
        amp, phase, waves = rng.uniform(2.0, 7.0), rng.uniform(0, 2 * math.pi), rng.choice([1, 2, 3])
        pts = []
        for j in range(121):
            x = x0 + w * j / 120
            y = base + amp * math.sin(2 * math.pi * waves * j / 120 + phase) + rng.uniform(-0.4, 0.4)
            pts.append((round(x, 3), round(y, 3)))
        major = k % 5 == 0
        layer = "TP-LEVEL" if major else pick("TP")
        msp.add_lwpolyline(pts, dxfattribs={"layer": layer, "const_width": 0.08 if major else 0.0})
        for j in (20, 60, 100):
            msp.add_text(f"{5.0 + k:.1f}", height=0.8, rotation=0.0, dxfattribs={"layer": "TP-TEXT"}).set_placement(
                pts[j], align=TextEntityAlignment.MIDDLE_CENTER
            )

    # The river, winding north-south under the bridge, with a SOLID hatch.
    west_bank, east_bank = [], []
    for j in range(61):
        y = y0 + h * j / 60
        xc = 93.0 + 25.0 * math.sin(2 * math.pi * j / 60)
        half = 20.0 + 3.0 * math.sin(2 * math.pi * 3 * j / 60)
        west_bank.append((round(xc - half, 3), round(y, 3)))
        east_bank.append((round(xc + half, 3), round(y, 3)))
    for bank in (west_bank, east_bank):
        msp.add_lwpolyline(bank, dxfattribs={"layer": "TP-EDGE"})
    water = msp.add_hatch(color=5, dxfattribs={"layer": "TP-HATCH"})
    water.set_solid_fill(color=5)
    water.paths.add_polyline_path(west_bank + east_bank[::-1], is_closed=True)
    msp.add_text("RIVER ORRIN", height=3.0, rotation=90.0, dxfattribs={"layer": "TP-TEXT"}).set_placement(
        (93.0, y0 + 40.0), align=TextEntityAlignment.MIDDLE_CENTER
    )

    # Buildings: outline, ANSI31 hatch, name, and a rendered dimension.
    for b in range(24):
        cx, cy = rxy(30.0)
        bw, bd, rot = rng.uniform(8, 26), rng.uniform(6, 16), rng.uniform(0, math.pi)
        c, s = math.cos(rot), math.sin(rot)
        corners = [
            (round(cx + c * u - s * v, 3), round(cy + s * u + c * v, 3))
            for u, v in [(-bw / 2, -bd / 2), (bw / 2, -bd / 2), (bw / 2, bd / 2), (-bw / 2, bd / 2)]
        ]
        msp.add_lwpolyline(corners, close=True, dxfattribs={"layer": pick("ST")})
        hatch = msp.add_hatch(dxfattribs={"layer": "ST-HATCH"})
        hatch.set_pattern_fill("ANSI31", scale=2.0, angle=math.degrees(rot))
        hatch.paths.add_polyline_path(corners, is_closed=True)
        msp.add_text(f"Unit {b + 1}", height=1.2, dxfattribs={"layer": "AN-TEXT"}).set_placement(
            (cx, cy), align=TextEntityAlignment.MIDDLE_CENTER
        )
        (ax, ay), (bx, by) = corners[0], corners[1]
        dim = msp.add_aligned_dim(p1=(ax, ay), p2=(bx, by), distance=3.0, dimstyle="TARROWBY",
                                  dxfattribs={"layer": pick("AN")})
        dim.render()

    # Plot boundaries with linear dimensions, horizontal and vertical.
    for b in range(12):
        ax, ay = rxy(40.0)
        bx = ax + rng.uniform(15, 35)
        by = ay + rng.uniform(10, 25)
        msp.add_lwpolyline([(ax, ay), (bx, ay), (bx, by), (ax, by)], close=True,
                           dxfattribs={"layer": pick("SV"), "linetype": "PHANTOM"})
        msp.add_linear_dim(base=(ax, ay - 4.0), p1=(ax, ay), p2=(bx, ay), dimstyle="TARROWBY",
                           dxfattribs={"layer": "SV-DIM"}).render()
        msp.add_linear_dim(base=(bx + 4.0, ay), p1=(bx, ay), p2=(bx, by), angle=90, dimstyle="TARROWBY",
                           dxfattribs={"layer": "SV-DIM"}).render()

    # Planting beds: stadium shapes, edge paths of lines and arcs.
    for b in range(30):
        cx, cy = rxy(20.0)
        half, r = rng.uniform(3, 10), rng.uniform(1.5, 4)
        hatch = msp.add_hatch(dxfattribs={"layer": pick("LS")})
        hatch.set_pattern_fill(rng.choice(["GRASS", "EARTH", "AR-SAND", "DOTS"]), scale=0.6)
        path = hatch.paths.add_edge_path()
        path.add_line((cx - half, cy - r), (cx + half, cy - r))
        path.add_arc((cx + half, cy), r, -90, 90)
        path.add_line((cx + half, cy + r), (cx - half, cy + r))
        path.add_arc((cx - half, cy), r, 90, 270)
        msp.add_arc((cx + half, cy), r, -90, 90, dxfattribs={"layer": "LS-EDGE"})
        msp.add_arc((cx - half, cy), r, 90, 270, dxfattribs={"layer": "LS-EDGE"})

    # Trees, boreholes, survey stations, manholes and lamps: INSERTs with ATTRIBs.
    for t in range(150):
        x, y = rxy(5.0)
        spread = rng.uniform(2.0, 6.0)
        ref = msp.add_blockref("TREE", (x, y), dxfattribs={"layer": pick("LS"), "xscale": spread, "yscale": spread})
        ref.add_auto_attribs({"TREE_NO": f"T{t + 1:03d}", "SPECIES": rng.choice(SPECIES),
                              "GIRTH": f"{rng.uniform(0.3, 2.8):.2f}m", "SPREAD": f"{2 * spread:.1f}m"})
    for n in range(18):
        ref = msp.add_blockref("BOREHOLE", rxy(), dxfattribs={"layer": pick("GE")})
        ref.add_auto_attribs({"BH_ID": f"BH{n + 1:02d}", "GL": f"{level():.2f}", "DEPTH": f"{rng.uniform(8, 30):.1f}"})
    for n in range(16):
        x, y = rxy()
        ref = msp.add_blockref("SURVEY_STN", (x, y), dxfattribs={"layer": pick("SV")})
        ref.add_auto_attribs({"STN": f"TS{n + 1:02d}", "EASTING": f"{431000 + x:.3f}",
                              "NORTHING": f"{287000 + y:.3f}", "LEVEL": f"{level():.3f}"})
    manholes = []
    for n in range(30):
        x, y = rxy()
        cl = level()
        manholes.append((x, y))
        ref = msp.add_blockref("MANHOLE", (x, y), dxfattribs={"layer": pick("DR")})
        ref.add_auto_attribs({"MH_REF": f"S{n + 1:02d}", "COVER_LEVEL": f"{cl:.2f}",
                              "INVERT_LEVEL": f"{cl - rng.uniform(1.2, 3.5):.2f}"})
    for (ax, ay), (bx, by) in zip(manholes, manholes[1:]):
        msp.add_line((ax, ay), (bx, by), dxfattribs={"layer": pick("DR"), "linetype": "DASHED"})
        msp.add_text(f"{rng.choice([150, 225, 300, 375])} dia", height=0.5,
                     dxfattribs={"layer": "DR-TEXT"}).set_placement(((ax + bx) / 2, (ay + by) / 2))
    for n in range(40):
        ref = msp.add_blockref("LAMP", rxy(), dxfattribs={"layer": pick("EL")})
        ref.add_auto_attribs({"LAMP_ID": f"L{n + 1:02d}"})

    # Spot levels: a POINT and its level.
    for _ in range(420):
        x, y = rxy(2.0)
        msp.add_point((x, y), dxfattribs={"layer": "SV-POINT"})
        msp.add_text(f"+{level():.2f}", height=0.4, dxfattribs={"layer": "SV-LEVEL"}).set_placement((x + 0.2, y + 0.2))

    # Kerbs, fences, bollards and services: LINEs, ARCs and CIRCLEs.
    for _ in range(220):
        x, y = rxy(5.0)
        a = rng.uniform(0, 2 * math.pi)
        length = rng.uniform(2, 18)
        msp.add_line((x, y), (x + length * math.cos(a), y + length * math.sin(a)),
                     dxfattribs={"layer": pick(rng.choice(["HW", "UT", "EL"]))})
    for _ in range(120):
        msp.add_arc(rxy(), rng.uniform(1, 12), rng.uniform(0, 360), rng.uniform(0, 360),
                    dxfattribs={"layer": pick("HW")})
    for _ in range(180):
        msp.add_circle(rxy(), rng.uniform(0.1, 0.6), dxfattribs={"layer": pick(rng.choice(["HW", "UT", "GE"]))})

    # The survey grid, every 50 m, with its coordinates.
    for gx in range(int(x0 // 50) + 1, int((x0 + w) // 50) + 1):
        msp.add_line((gx * 50.0, y0), (gx * 50.0, y0 + h), dxfattribs={"layer": "SV-GRID"})
        msp.add_text(f"E {431000 + gx * 50:.0f}", height=1.0, dxfattribs={"layer": "SV-GRID"}).set_placement(
            (gx * 50.0 + 0.5, y0 + 1.0))
    for gy in range(int(y0 // 50) + 1, int((y0 + h) // 50) + 1):
        msp.add_line((x0, gy * 50.0), (x0 + w, gy * 50.0), dxfattribs={"layer": "SV-GRID"})
        msp.add_text(f"N {287000 + gy * 50:.0f}", height=1.0, dxfattribs={"layer": "SV-GRID"}).set_placement(
            (x0 + 1.0, gy * 50.0 + 0.5))

    # Notes.
    for n in range(12):
        msp.add_mtext(
            f"\\A1;{{\\fArial|b1;SURVEY NOTE {n + 1}}}\\P"
            "Levels in metres above the Tarrowby site datum.\\P"
            "Tree spreads are diameters; girths at 1.0 m above ground.\\P"
            f"Surveyed by Orrin Valley Surveys, sheet {n + 1} of 12 (invented).",
            dxfattribs={"layer": pick("AN"), "char_height": 0.8, "width": 30.0, "insert": rxy(30.0)},
        )


# ---------------------------------------------------------------------------
# Tags and templates
# ---------------------------------------------------------------------------


def split_tags(text: str):
    """(code, raw code line, value) for every pair of an ASCII DXF file."""
    lines = text.split("\n")
    if lines and lines[-1] == "":
        lines.pop()
    return [(int(lines[i]), lines[i], lines[i + 1]) for i in range(0, len(lines) - 1, 2)]


def is_handle_code(code: int) -> bool:
    return code == 5 or code == 105 or 320 <= code <= 369 or 390 <= code <= 399 or 480 <= code <= 481 or code == 1005


def binary_value(code: int, value: str) -> bytes:
    """One pair in binary DXF (R13 on: 2-byte codes), by ezdxf's type sets."""
    head = code.to_bytes(2, "little")
    if code in BINARY_DATA:
        data = bytes.fromhex(value)
        return head + len(data).to_bytes(1, "little") + data
    if code in BYTES:
        return head + int(value).to_bytes(1, "little")
    if code in INT16:
        return head + int(value).to_bytes(2, "little", signed=True)
    if code in INT32:
        return head + int(value).to_bytes(4, "little", signed=True)
    if code in INT64:
        return head + int(value).to_bytes(8, "little", signed=True)
    if code in DOUBLE:
        return head + struct.pack("<d", float(value))
    return head + value.encode("utf8") + b"\x00"


class Encoder:
    """Pairs to bytes, ASCII or binary."""

    def __init__(self, binary: bool):
        self.binary = binary

    def tags(self, tags) -> bytes:
        if self.binary:
            return b"".join(binary_value(c, v) for c, _, v in tags if c != 999)
        return "".join(f"{raw}\n{v}\n" for _, raw, v in tags).encode("utf8")

    def code(self, code: int, raw: str) -> bytes:
        """Just the group code (a hole's value follows)."""
        return code.to_bytes(2, "little") if self.binary else f"{raw}\n".encode()

    def double(self, v: float) -> bytes:
        # repr is what ezdxf writes, and reads back as the same double.
        return struct.pack("<d", v) if self.binary else f"{v!r}\n".encode()

    def text(self, s: str) -> bytes:
        return s.encode() + (b"\x00" if self.binary else b"\n")


#: Coordinates moved with a copy, by entity type: x codes (y is x + 10).
#: HATCH's first 10 is its elevation point and stays; DIMENSION's 12 is the
#: block's insertion (its block's contents move instead); MTEXT's 11 is a
#: direction.
MOVE = {
    "LINE": {10, 11},
    "POINT": {10},
    "CIRCLE": {10},
    "ARC": {10},
    "LWPOLYLINE": {10},
    "TEXT": {10, 11},
    "MTEXT": {10},
    "INSERT": {10},
    "ATTRIB": {10, 11},
    "SEQEND": set(),
    "SOLID": {10, 11, 12, 13},
    "HATCH": {10, 11},
    "DIMENSION": {10, 11, 13, 14, 15, 16},
    "BLOCK": set(),
    "ENDBLK": set(),
    "BLOCK_RECORD": set(),
}


class Template:
    """A run of pairs with holes: handles, ``*D`` names and coordinates.

    Holes: ``("h", i)`` the copy's i-th new handle; ``("n", i)`` the copy's
    i-th block name; ``("x", v)`` / ``("y", v)`` v moved by the copy's offset.
    """

    def __init__(self, tags, handles: dict, names: dict, enc: Encoder):
        self.parts: list[bytes] = []
        self.holes: list[tuple] = []
        lit: list[bytes] = []
        kind = None
        first_hatch_10 = False
        pending_y = False
        for code, raw, value in tags:
            if code == 0:
                kind = value
                if kind not in MOVE:
                    raise SystemExit(f"make_big: no coordinate rule for {kind} in the tile")
                first_hatch_10 = kind == "HATCH"
                pending_y = False
            hole = None
            if is_handle_code(code) and value in handles:
                hole = ("h", handles[value])
            elif code in (2, 3) and value in names:
                hole = ("n", names[value])
            elif 10 <= code <= 18 and code in MOVE[kind]:
                if first_hatch_10 and code == 10:
                    first_hatch_10 = False
                else:
                    hole = ("x", float(value))
                    pending_y = True
            elif 20 <= code <= 28 and pending_y and (code - 10) in MOVE[kind]:
                hole = ("y", float(value))
                pending_y = False
            if hole is None:
                lit.append(enc.tags([(code, raw, value)]))
            else:
                lit.append(enc.code(code, raw))
                self.parts.append(b"".join(lit))
                lit = []
                self.holes.append(hole)
        self.parts.append(b"".join(lit))

    def render(self, hexes: list[str], names: list[str], dx: float, dy: float, enc: Encoder) -> bytes:
        out = [self.parts[0]]
        double, text = enc.double, enc.text
        hex_b = [text(h) for h in hexes]
        name_b = [text(n) for n in names]
        for (k, v), part in zip(self.holes, self.parts[1:]):
            if k == "h":
                out.append(hex_b[v])
            elif k == "x":
                out.append(double(v + dx))
            elif k == "y":
                out.append(double(v + dy))
            else:
                out.append(name_b[v])
            out.append(part)
        return b"".join(out)


def entities_of(tags, start: int, end: int):
    """Groups of an entity run: [start, end) indices, an INSERT or POLYLINE
    together with its ATTRIBs/VERTEXes and SEQEND."""
    groups = []
    i = start
    while i < end:
        j = i + 1
        while j < end and tags[j][0] != 0:
            j += 1
        if tags[i][2] in ("ATTRIB", "VERTEX", "SEQEND") and groups:
            groups[-1] = (groups[-1][0], j)
        else:
            groups.append((i, j))
        i = j
    return groups


def value_of(tags, lo: int, hi: int, code: int):
    for c, _, v in tags[lo:hi]:
        if c == code:
            return v
    return None


def find(tags, code: int, value: str, start: int = 0) -> int:
    for i in range(start, len(tags)):
        if tags[i][0] == code and tags[i][2] == value:
            return i
    raise SystemExit(f"make_big: ({code}, {value}) not found")


def section(tags, name: str):
    """[first tag after `2 NAME`, index of its ENDSEC)."""
    i = 0
    while True:
        i = find(tags, 0, "SECTION", i)
        if tags[i + 1][2] == name:
            return i + 2, find(tags, 0, "ENDSEC", i)
        i += 1


# ---------------------------------------------------------------------------
# The big file
# ---------------------------------------------------------------------------


def write_big(doc, out_path: str, mb: float, binary: bool, log) -> dict:
    buf = io.StringIO()
    doc.write(buf)
    tags = split_tags(buf.getvalue())
    base_size_ascii = len(buf.getvalue().encode("utf8"))
    enc = Encoder(binary)
    tile_layers = set(BACKGROUND_LAYERS)

    # Sections and the runs that are copied.
    tab_lo, tab_hi = section(tags, "TABLES")
    br_i = tab_lo
    while not (tags[br_i][0] == 0 and tags[br_i][2] == "TABLE" and tags[br_i + 1][2] == "BLOCK_RECORD"):
        br_i += 1
    br_end = find(tags, 0, "ENDTAB", br_i)
    records = [g for g in entities_of(tags, br_i + 1, br_end) if tags[g[0]][:3:2] == (0, "BLOCK_RECORD")]
    d_records = [g for g in records if (value_of(tags, *g, 2) or "").startswith("*D")]
    # The table's own header holds the record count (70) before its first record.
    count_i = next(i for i in range(br_i, records[0][0]) if tags[i][0] == 70)

    blk_lo, blk_hi = section(tags, "BLOCKS")
    d_blocks = []
    i = blk_lo
    while i < blk_hi:
        if tags[i][0] == 0 and tags[i][2] == "BLOCK":
            j = find(tags, 0, "ENDBLK", i)
            j += 1
            while j < blk_hi and tags[j][0] != 0:
                j += 1
            if (value_of(tags, i, i + 20, 2) or "").startswith("*D"):
                d_blocks.append((i, j))
            i = j
        else:
            i += 1

    ent_lo, ent_hi = section(tags, "ENTITIES")
    tile_groups = [g for g in entities_of(tags, ent_lo, ent_hi) if value_of(tags, g[0], g[1], 8) in tile_layers]

    # Handles and *D names defined by the tile, numbered in file order.
    handles: dict[str, int] = {}
    names: dict[str, int] = {}
    for lo, hi in d_records + d_blocks + tile_groups:
        for c, _, v in tags[lo:hi]:
            if c == 5 and v not in handles:
                handles[v] = len(handles)
    for lo, hi in d_records:
        names[value_of(tags, lo, hi, 2)] = len(names)
    seed_i = find(tags, 9, "$HANDSEED") + 1
    seed = int(tags[seed_i][2], 16)
    next_d = 1 + max(int(n[2:]) for n in names) if names else 1

    def run(groups):
        return [t for lo, hi in groups for t in tags[lo:hi]]

    t_records = Template(run(d_records), handles, names, enc)
    t_blocks = Template(run(d_blocks), handles, names, enc)
    t_entities = Template(run(tile_groups), handles, names, enc)

    nh, nn = len(handles), len(names)

    def copy(k: int, cols: int):
        """Handles, names and offset of copy k (k ≥ 1; tile 0 is the base's)."""
        first = seed + (k - 1) * nh
        hexes = [f"{first + j:X}" for j in range(nh)]
        dnames = [f"*D{next_d + (k - 1) * nn + j}" for j in range(nn)]
        return hexes, dnames, (k % cols) * TILE_W, -(k // cols) * TILE_H

    # How many tiles: the ASCII size decides, so that ASCII and binary hold
    # the same drawing. Copies grow a little down the grid (longer handles,
    # longer coordinates), so the size of a copy is the mean of the first and
    # the last, rendered in ASCII. Whole tiles first, then a last, partial
    # tile: the leading entities of a tile, leaving out dimensions (their
    # blocks would be needed too), up to the size.
    enc_a = Encoder(False)
    whole_a = [Template(run(g), handles, names, enc_a) for g in (d_records, d_blocks, tile_groups)]

    def tile_size(k: int, cols: int) -> int:
        return sum(len(t.render(*copy(k, cols), enc_a)) for t in whole_a)

    want = mb * 1e6 - base_size_ascii
    first = tile_size(1, 1)
    guess = max(1, int(want // first) + 1)
    cols = max(1, math.ceil(math.sqrt(guess * TILE_H / TILE_W)))
    mean = (first + tile_size(max(1, guess - 1), cols)) / 2
    tiles = max(1, int(want // mean) + 1)
    rest = want - (tiles - 1) * mean
    last = copy(tiles, cols)
    partial = []
    for g in tile_groups:
        size = len(Template(tags[g[0]:g[1]], handles, names, enc_a).render(*last, enc_a))
        if size > rest:
            break
        if tags[g[0]][2] != "DIMENSION":
            partial.append(g)
            rest -= size
    cells = tiles + (1 if partial else 0)
    cols = max(1, math.ceil(math.sqrt(cells * TILE_H / TILE_W)))
    rows = math.ceil(cells / cols)
    t_partial = Template(run(partial), handles, names, enc)

    copies = range(1, tiles)
    new_seed = seed + (cells - 1) * nh
    ext_min = (TILE_X0, TILE_Y0 - (rows - 1) * TILE_H)
    ext_max = (TILE_X0 + min(cells, cols) * TILE_W, TILE_Y0 + TILE_H)

    # Header and table values replaced on the way out.
    replace = {seed_i: f"{new_seed:X}", count_i: str(len(records) + (tiles - 1) * nn)}
    for var, (x, y) in [("$EXTMIN", ext_min), ("$EXTMAX", ext_max)]:
        vi = find(tags, 9, var)
        replace[vi + 1], replace[vi + 2] = repr(x), repr(y)

    def base_run(lo: int, hi: int) -> bytes:
        part = tags[lo:hi]
        if any(lo <= r < hi for r in replace):
            part = [(c, raw, replace.get(lo + n, v)) for n, (c, raw, v) in enumerate(part)]
        return enc.tags(part)

    tmp = out_path + ".part"
    with open(tmp, "wb") as f:
        if binary:
            f.write(b"AutoCAD Binary DXF\r\n\x1a\x00")
        f.write(base_run(0, br_end))
        for k in copies:
            f.write(t_records.render(*copy(k, cols), enc))
        f.write(base_run(br_end, blk_hi))
        for k in copies:
            f.write(t_blocks.render(*copy(k, cols), enc))
        f.write(base_run(blk_hi, ent_hi))
        for k in copies:
            f.write(t_entities.render(*copy(k, cols), enc))
        if partial:
            f.write(t_partial.render(*copy(tiles, cols), enc))
        f.write(base_run(ent_hi, len(tags)))
    os.replace(tmp, out_path)

    def count(groups) -> int:
        return sum(1 for lo, hi in groups for c, _, _ in tags[lo:hi] if c == 0)

    per_tile = count(tile_groups)
    return {
        "tiles": tiles,
        "partial_tile_entities": count(partial),
        "grid": f"{cols} x {rows}",
        "handles_per_tile": nh,
        "dimensions": tiles * nn,
        "model_space_entities": count(entities_of(tags, ent_lo, ent_hi)) + (tiles - 1) * per_tile + count(partial),
        "handseed": f"{new_seed:X}",
    }


def verify(path: str, info: dict, log) -> bool:
    """Reads the file with ezdxf, runs its audit, checks counts and handles."""
    t = time.perf_counter()
    doc = ezdxf.readfile(path)
    msp = doc.modelspace()
    n = sum(1 + (len(e.attribs) + 1 if e.dxftype() == "INSERT" and e.attribs else 0) for e in msp)
    auditor = doc.audit()
    loads = msp.query('LINE[layer=="LOADS"]')
    labels = msp.query('TEXT[layer=="LOADS"]')
    supports = msp.query('*[layer=="SUPPORTS"]')
    dims = msp.query("DIMENSION")
    missing = [d.dxf.handle for d in dims if doc.blocks.get(d.dxf.geometry) is None]
    ok = (
        not auditor.has_errors
        and n == info["model_space_entities"]
        and len(loads) == len(HANGERS)
        and len(labels) == len(HANGERS)
        and len(supports) == 2
        and not missing
    )
    log(
        f"verify: ezdxf read + audit in {time.perf_counter() - t:.1f} s; "
        f"{len(auditor.errors)} audit error(s), {len(auditor.fixes)} fix(es); "
        f"{n} model-space entities (expected {info['model_space_entities']}); "
        f"{len(doc.layers)} layers; {len(dims)} dimensions, {len(missing)} without their block; "
        f"{len(loads)} load lines, {len(labels)} labels, {len(supports)} supports -> {'OK' if ok else 'FAILED'}"
    )
    for e in auditor.errors[:10]:
        log(f"  audit: {e.message}")
    return ok


def main() -> int:
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--mb", type=float, default=10.0, help="size of the ASCII file in 10^6 bytes (default 10)")
    ap.add_argument("--version", default="R2010", choices=sorted(VERSIONS), help="DXF release (default R2010)")
    ap.add_argument("--binary", action="store_true", help="write binary DXF (the same drawing as the ASCII one)")
    ap.add_argument("-o", "--output", help="output path (default tarrowby-<mb>mb-<version>[-bin].dxf here)")
    ap.add_argument("--verify", action="store_true", help="read the result with ezdxf and audit it")
    ap.add_argument("-q", "--quiet", action="store_true")
    args = ap.parse_args()

    def log(msg: str) -> None:
        if not args.quiet or msg.startswith("verify"):
            print(msg, file=sys.stderr)

    out = args.output or f"tarrowby-{args.mb:g}mb-{args.version}{'-bin' if args.binary else ''}.dxf"
    t0 = time.perf_counter()
    doc = build_base(args.version)
    t1 = time.perf_counter()
    info = write_big(doc, out, args.mb, args.binary, log)
    t2 = time.perf_counter()
    size = os.path.getsize(out)
    log(
        f"{out}: {size / 1e6:.1f} MB {'binary' if args.binary else 'ASCII'} {args.version}, "
        f"{info['tiles']} tiles + {info['partial_tile_entities']} entities ({info['grid']} grid), "
        f"{info['model_space_entities']} model-space entities, {info['dimensions']} dimensions; "
        f"ezdxf base {t1 - t0:.1f} s, write {t2 - t1:.1f} s; solve with --sag {SAG:g}"
    )
    if args.verify and not verify(out, info, log):
        return 1
    return 0


if __name__ == "__main__":
    sys.exit(main())
