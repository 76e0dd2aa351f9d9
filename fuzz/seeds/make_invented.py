"""Writes the invented seed drawings in fuzz/seeds/reader/ (every number
invented): a three-load cable between two anchors (R12, ASCII and binary)
and two tower axes with block loads (no HEADER section, ASCII and binary).

Run from anywhere: python3 fuzz/seeds/make_invented.py
"""

import pathlib
import struct

HERE = pathlib.Path(__file__).resolve().parent / "reader"
SENTINEL = b"AutoCAD Binary DXF\r\n\x1a\x00"


def ascii_dxf(pairs):
    return "".join(f"{c:>3}\n{v}\n" for c, v in pairs).encode("ascii")


def kind(code):
    """Storage of a group code's value in binary DXF (the subset used here)."""
    if 10 <= code <= 59:
        return "<d"
    if 60 <= code <= 79:
        return "<h"
    if 90 <= code <= 99:
        return "<i"
    return None


def binary_dxf(pairs):
    """Binary DXF with 1-byte group codes, as R12 writes it."""
    out = bytearray(SENTINEL)
    for c, v in pairs:
        out += bytes([c]) if c < 255 else b"\xff" + struct.pack("<h", c)
        k = kind(c)
        if k is None:
            out += str(v).encode("latin-1") + b"\0"
        elif k == "<d":
            out += struct.pack(k, float(v))
        else:
            out += struct.pack(k, int(v))
    return bytes(out)


def section(name, body):
    return [(0, "SECTION"), (2, name)] + body + [(0, "ENDSEC")]


def layer_table(names):
    recs = []
    for n in names:
        recs += [(0, "LAYER"), (2, n), (70, 0), (62, 7), (6, "CONTINUOUS")]
    return [(0, "TABLE"), (2, "LAYER"), (70, len(names))] + recs + [(0, "ENDTAB")]


def cable():
    header = section("HEADER", [(9, "$ACADVER"), (1, "AC1009"), (9, "$INSUNITS"), (70, 6)])
    tables = section("TABLES", layer_table(["0", "SUPPORTS", "LOADS", "DECK"]))
    ents = [
        (0, "POINT"), (8, "SUPPORTS"), (10, "0.0"), (20, "0.0"),
        (0, "CIRCLE"), (8, "SUPPORTS"), (10, "12.0"), (20, "1.5"), (40, "0.2"),
        (0, "LINE"), (8, "LOADS"), (10, "3.0"), (20, "-1.0"), (11, "3.0"), (21, "-3.0"),
        (0, "TEXT"), (8, "LOADS"), (10, "3.2"), (20, "-2.0"), (40, "0.3"), (1, "P1 = 5 kN"),
        (0, "LINE"), (8, "LOADS"), (10, "6.5"), (20, "-1.0"), (11, "6.0"), (21, "-3.0"),
        (0, "TEXT"), (8, "LOADS"), (10, "4.9"), (20, "-2.0"), (40, "0.3"), (1, "%%u8.5%%u kN"),
        (0, "LINE"), (8, "LOADS"), (10, "9.0"), (20, "-1.0"), (11, "9.0"), (21, "-3.0"),
        (0, "MTEXT"), (8, "LOADS"), (10, "9.2"), (20, "-2.0"), (40, "0.3"), (1, r"{\H0.5;\LW_3\l:} 3\~kN"),
        (0, "LWPOLYLINE"), (8, "DECK"), (90, 2), (70, 0),
        (10, "0.0"), (20, "-4.0"), (10, "12.0"), (20, "-4.0"),
    ]
    return header + tables + section("BLOCKS", []) + section("ENTITIES", ents) + [(0, "EOF")]


def towers():
    blocks = section("BLOCKS", [
        (0, "BLOCK"), (8, "0"), (2, "ARROW"), (70, 2), (10, "0.0"), (20, "0.0"),
        (0, "LINE"), (8, "0"), (10, "0.0"), (20, "1.0"), (11, "0.0"), (21, "0.0"),
        (0, "ATTDEF"), (8, "0"), (10, "0.1"), (20, "0.5"), (40, "0.2"), (1, "1 kN"),
        (3, "LOAD"), (2, "P"), (70, 0),
        (0, "ENDBLK"), (8, "0"),
    ])
    ents = [
        (0, "LINE"), (8, "supports"), (10, "-4.0"), (20, "0.0"), (11, "-4.0"), (21, "6.0"),
        (0, "LINE"), (8, "supports"), (10, "8.0"), (20, "0.0"), (11, "8.0"), (21, "6.0"),
        (0, "INSERT"), (8, "loads"), (66, 1), (2, "ARROW"), (10, "0.0"), (20, "3.0"),
        (0, "ATTRIB"), (8, "loads"), (10, "0.1"), (20, "3.5"), (40, "0.2"), (1, "12 kN"),
        (2, "P"), (70, 0),
        (0, "SEQEND"), (8, "loads"),
        (0, "INSERT"), (8, "loads"), (2, "ARROW"), (10, "4.0"), (20, "3.0"), (50, "10.0"),
        (0, "TEXT"), (8, "loads"), (10, "4.3"), (20, "3.5"), (40, "0.2"), (1, "W_2: 2.5e1 kN."),
    ]
    tables = section("TABLES", layer_table(["SUPPORTS", "LOADS"]))
    return tables + blocks + section("ENTITIES", ents) + [(0, "EOF")]


for name, pairs in [("invented-cable-r12", cable()), ("invented-towers-noheader", towers())]:
    (HERE / f"{name}.dxf").write_bytes(ascii_dxf(pairs))
    (HERE / f"{name}-bin.dxf").write_bytes(binary_dxf(pairs))
