#!/usr/bin/env python3
"""Writes the round-trip corpus: drawings by an outside library (ezdxf, pinned
in tools/requirements.txt) in every DXF version hangline supports, ASCII and
binary, each with the structure the tool reads (two supports, labelled loads,
a deck) and a background of everything a real drawing may carry, none of
which the tool may lose.

    python tools/roundtrip/make_corpus.py --out DIR     # write DIR/*.dxf and DIR/manifest.json
    python tools/roundtrip/make_corpus.py --out DIR --twice
                                                        # also write it a second time into a
                                                        # temporary folder and exit 1 unless
                                                        # both are byte for byte the same
    python tools/roundtrip/make_corpus.py --out DIR --large
                                                        # instead, four drawings above 8 MiB

The corpus is generated at test time (tests/cli/roundtrip.rs) rather than
committed: see tools/roundtrip/README.md for why.

Deterministic: the hash seed is fixed (ezdxf orders some OBJECTS by iterating
a set of strings), ezdxf's fixed-metadata option freezes the date/time header
variables and GUIDs, and handles come from ezdxf's own sequence.

Every scenario, name and number here is invented. The few facts of the DXF
format that the code relies on name their source beside them (the DXF
reference, "DXF Reference" by Autodesk, sections named where used); what is
our own convention says so.
"""

from __future__ import annotations

import os
import sys

# ezdxf orders some OBJECTS by iterating a set of strings, so the output
# depends on Python's string hashing: fix the seed by re-running ourselves
# (the same trick as tools/fixtures/make_fixtures.py).
if os.environ.get("PYTHONHASHSEED") != "0":
    os.environ["PYTHONHASHSEED"] = "0"
    os.execv(sys.executable, [sys.executable, *sys.argv])

import argparse
import filecmp
import json
import logging
import struct
import tempfile
from pathlib import Path

import ezdxf
from ezdxf.document import Drawing
from ezdxf.entities import DXFClass
from ezdxf.entities.acad_proxy_entity import ACADProxyEntity
from ezdxf.entities.dxfentity import DXFTagStorage
from ezdxf.math import Vec2
from ezdxf.proxygraphic import ProxyGraphic
from ezdxf.render import mleader

sys.dont_write_bytecode = True
ezdxf.options.write_fixed_meta_data_for_testing = True
logging.getLogger("ezdxf").setLevel(logging.ERROR)

MANIFEST_FORMAT = 1

ACADVER = {
    "R12": "AC1009",
    "R2000": "AC1015",
    "R2004": "AC1018",
    "R2007": "AC1021",
    "R2010": "AC1024",
    "R2013": "AC1027",
    "R2018": "AC1032",
}
VERSIONS = list(ACADVER)

# Text encoding per version. DXF reference ("HEADER section group codes",
# $DWGCODEPAGE; "DXF Files: ... R2007 and later are UTF-8"): before R2007 the
# strings are in the code page named by $DWGCODEPAGE, characters outside it
# written as \U+XXXX; from R2007 on, UTF-8. Which legacy page goes with which
# version is our own choice, to cover a Latin, a Cyrillic and a double-byte page.
CODEPAGE = {"R12": "cp1252", "R2000": "cp1251", "R2004": "cp932"}
DWGCODEPAGE = {"cp1252": "ANSI_1252", "cp1251": "ANSI_1251", "cp932": "ANSI_932", "utf8": None}

# Non-ASCII text per encoding (invented wording). In cp932, ソ (0x83 0x5C) and
# 表 (0x95 0x5C) have a backslash as their second byte, a classic trap for
# readers that look for "\U+" escapes byte by byte. Characters outside a
# legacy page are written as \U+XXXX (DXF reference, as above): "≈" is
# outside cp1251 and ezdxf escapes it itself ("\U+2248"); ezdxf writes
# characters below U+0100 that are outside the page as Python-style "\xd8"
# instead, which no CAD program reads, so the "Ø" in the cp1251 drawing is
# given already escaped, as AutoCAD writes it.
TEXTS = {
    "cp1252": ["Brücke Süd – Ø 12 ±", "Widerlager Nord: Ø 40 mm, ±5 mm", "Straßenseite ½ Feld", "Geländer «neu»"],
    "cp1251": ["Мост Н-7 — пролёт ≈ 60 м", "Опора левая ±5 мм", "\\U+00D8 вне кодовой страницы", "Примечание №3"],
    "cp932": ["歩道橋 第三案", "ソ表 構造図", "支点 左 ±5 mm", "ｶﾀｶﾅ 半角"],
    "utf8": ["Γέφυρα Δ-4, άνοιγμα 60 m", "吊桥 方案B", "🌉 ✓ ≤ ≥ 🦺", "Brücke Süd – Ø 12 ±", "Мост Н-7", "歩道橋 ソ表"],
}
# Non-ASCII names of a layer, a block and a layout (R2000 on; our choice).
NAMES = {
    "cp1251": ("ПРИМЕЧАНИЯ", "МАРКА", "Лист Б"),
    "cp932": ("注記", "標識", "図面 B"),
    "utf8": ("ΣΗΜΕΙΩΣΕΙΣ-注記", "ΣΗΜΑ-標識", "Φύλλο B"),
}

# The structure (metres): supports, loads and deck, the same in every drawing.
LEFT, RIGHT = (0.0, 20.0), (60.0, 17.0)
DECK_Y = 8.0
LOADS = [  # x, label, label kind (MTEXT only R2000 on)
    (8.0, "30 kN", "TEXT"),
    (17.0, "P = 45 kN", "TEXT"),
    (26.0, "40kN", "TEXT"),
    (34.0, "W4: 40 kN", "TEXT"),
    (43.0, "{\\fArial|b1|i0|c0|p34;35} kN", "MTEXT"),
    (52.0, "25 kN", "TEXT"),
]
SAG = 6.0  # metres below the chord: the profile stays well above the deck
SUPPORT_KINDS = {  # left, right
    "R12": ("POINT", "CIRCLE"),
    "R2000": ("INSERT", "POINT"),
    "R2004": ("CIRCLE", "INSERT"),
    "R2007": ("POINT", "POINT"),
    "R2010": ("INSERT", "CIRCLE"),
    "R2013": ("CIRCLE", "POINT"),
    "R2018": ("INSERT", "INSERT"),
}


# --------------------------------------------------------------------------------------
# Proxy entities and objects
# --------------------------------------------------------------------------------------
#
# ezdxf reads and writes back ACAD_PROXY_ENTITY (its class is marked "read
# only") but has no API to create one, and keeps ACAD_PROXY_OBJECT as plain
# tag storage. Both are created here from their tags, in the layout of the
# DXF reference ("ACAD_PROXY_ENTITY" and "ACAD_PROXY_OBJECT" group codes):
#   100 AcDbProxyEntity, 90 proxy entity class ID (always 498; 499 for
#   objects), 91 application class ID (500 + the class's index in CLASSES),
#   92 graphics size in bytes (R2010 on: 160), 310 graphics data, 93 entity
#   data size in bits (R2010 on: 161), 310 entity data, 330/340/350/360
#   object IDs, 94 0 (end of object IDs), 95 drawing format, 70 original data
#   format (0 = DWG, 1 = DXF).
# The graphics are a valid proxy-graphics stream (checked by decoding them
# back with ezdxf.proxygraphic): an 8-byte header (total size, number of
# chunks), then chunks of (size, type, data), after the layout ezdxf's reader
# implements (types 6 = polyline, 2 = circle). The entity data are opaque
# bytes, as they are to every program without the application. 310 values are
# split into chunks of at most 127 bytes (DXF reference, group codes 310-319:
# "same representation and limits as 1004", i.e. up to 127 bytes per line).


def _chunk(kind: int, data: bytes) -> bytes:
    return struct.pack("<2L", 8 + len(data), kind) + data


def proxy_graphics(x: float, y: float) -> bytes:
    """A gauge housing: a closed 1.2 x 0.6 rectangle and a circle, as proxy graphics."""
    pts = [(x, y, 0.0), (x + 1.2, y, 0.0), (x + 1.2, y + 0.6, 0.0), (x, y + 0.6, 0.0), (x, y, 0.0)]
    poly = _chunk(6, struct.pack("<L", len(pts)) + b"".join(struct.pack("<3d", *p) for p in pts))
    circle = _chunk(2, struct.pack("<3d", x + 0.6, y + 0.3, 0.0) + struct.pack("<d", 0.2) + struct.pack("<3d", 0, 0, 1))
    body = poly + circle
    return struct.pack("<2L", 8 + len(body), 2) + body


def _binary_tags(code: int, data: bytes) -> list[str]:
    out = []
    for i in range(0, len(data), 127):
        out += [str(code), data[i:i + 127].hex().upper()]
    return out


def _register_class(doc, name: str, cpp: str, is_entity: bool) -> int:
    """Registers an application class and returns its class ID (500 + index).

    ezdxf adds the classes it needs at save time after those already
    registered, so they are added first and ours goes last: its index stays."""
    doc.classes.add_required_classes(doc.dxfversion)
    cls = DXFClass.new(doc=doc)
    cls.update_dxf_attribs({
        "name": name, "cpp_class_name": cpp, "app_name": "HB Monitoring (invented)",
        "flags": 1, "was_a_proxy": 0, "is_an_entity": 1 if is_entity else 0,
    })
    doc.classes.register(cls)
    return 500 + list(doc.classes.classes).index(cls.key)


# Object drawing format (group code 95): an invented value carried through;
# no reader here interprets it.
PROXY_FORMAT = 0x0000_001F


def add_proxy_entity(doc, layout, layer: str, at: tuple[float, float]) -> ACADProxyEntity:
    class_id = _register_class(doc, "HB_STRAINGAUGE", "HbStrainGauge", True)
    r2010 = doc.dxfversion >= "AC1024"
    graphics = proxy_graphics(*at)
    data = bytes(range(1, 25))  # opaque entity data
    tags = ["0", "ACAD_PROXY_ENTITY", "5", "0", "330", "0", "100", "AcDbEntity", "8", layer,
            "100", "AcDbProxyEntity", "90", "498", "91", str(class_id),
            "160" if r2010 else "92", str(len(graphics)), *_binary_tags(310, graphics),
            "161" if r2010 else "93", str(8 * len(data)), *_binary_tags(310, data),
            "94", "0", "95", str(PROXY_FORMAT), "70", "0"]
    e = ACADProxyEntity.from_text("\n".join(tags) + "\n", doc)
    e.dxf.handle = None
    doc.entitydb.add(e)
    layout.add_entity(e)
    decoded = [v.dxftype() for v in ProxyGraphic(graphics, doc).virtual_entities()]
    assert decoded == ["POLYLINE", "CIRCLE"], decoded
    return e


def add_proxy_object(doc, owner_dict, key: str, ref_handle: str):
    class_id = _register_class(doc, "HB_GAUGEREADINGS", "HbGaugeReadings", False)
    h = doc.entitydb.next_handle()
    data = "Ablesung 2031-04-07 / 0.42 mm".encode("ascii", "replace")
    tags = ["0", "ACAD_PROXY_OBJECT", "5", h, "330", owner_dict.dxf.handle, "100", "AcDbProxyObject",
            "90", "499", "91", str(class_id), "93", str(8 * len(data)), *_binary_tags(310, data),
            "340", ref_handle, "94", "0", "95", str(PROXY_FORMAT), "70", "0"]
    o = DXFTagStorage.from_text("\n".join(tags) + "\n", doc)
    doc.entitydb.add(o)
    doc.objects.add_object(o)
    owner_dict.add(key, o)
    return o


# --------------------------------------------------------------------------------------
# One drawing
# --------------------------------------------------------------------------------------


class Corpus:
    """One drawing under construction, recording what it holds."""

    def __init__(self, version: str, encoding: str, title: str):
        self.version = version
        self.modern = version != "R12"  # R13 structure: subclasses, OBJECTS, owners
        self.r2004 = version >= "R2004" and self.modern
        self.encoding = encoding
        if version == "R12":
            self.doc = Drawing.new("R12")  # R12 has no $INSUNITS
            from ezdxf.tools.standards import setup_drawing

            setup_drawing(self.doc, topics=("linetypes", "styles"))
        else:
            self.doc = ezdxf.new(version, setup=True, units=6)
        if encoding != "utf8":
            self.doc.encoding = encoding
        self.msp = self.doc.modelspace()
        self.title = title
        self.features: set[str] = set()
        self.texts = TEXTS[encoding]
        self.names = NAMES.get(encoding)

    def has(self, *features: str) -> None:
        self.features.update(features)

    # ---- tables -------------------------------------------------------------------
    def tables(self):
        doc = self.doc
        layers = doc.layers
        layers.add("SUPPORTS", color=1)
        layers.add("LOADS", color=3)
        layers.add("DECK", color=5)
        layers.add("ANNOT", color=7)
        layers.add("GROUND", color=8)
        doc.linetypes.add("HB-DASH", pattern=[1.5, 1.0, -0.5], description="HB dash __ __ __")
        layers.add("OLD-SURVEY", color=9).freeze()
        layers.add("GRID", color=252, linetype="HB-DASH").lock()
        layers.add("LEGEND", color=4).off()
        self.has("layer_frozen", "layer_locked", "layer_off", "linetype")
        if self.modern:
            layers.add("VIEWPORTS", color=7).dxf.plot = 0
            layers.add("TITLE", color=7, lineweight=70)
            self.has("layer_plot_off", "layer_lineweight")
        if self.r2004:
            tc = layers.add("SHADING", color=30)
            tc.rgb = (201, 120, 45)
            tc.transparency = 0.4
            self.has("layer_true_color", "layer_transparency")
        if self.names:
            layers.add(self.names[0], color=6)
            self.has("non_ascii_layer_name")
        doc.appids.add("HB_SURVEY")
        doc.appids.add("HB_REVIEW")
        doc.styles.add("HB-ROMANS", font="romans.shx")
        doc.styles.add("HB-ARIAL", font="arial.ttf")
        ds = doc.dimstyles.add("HB-DIM")
        ds.dxf.dimtxt = 0.35
        ds.dxf.dimasz = 0.25
        ds.dxf.dimexe = 0.15
        ds.dxf.dimexo = 0.15
        ds.dxf.dimgap = 0.1
        ds.dxf.dimdec = 2
        doc.ucs.new("HB-SKEW", dxfattribs={"origin": (10, 5, 0), "xaxis": (1, 1, 0), "yaxis": (-1, 1, 0)})
        doc.views.new("HB-OVERVIEW", dxfattribs={"center": (30, 12), "height": 40, "width": 80})
        self.has("appids", "text_styles", "dimstyle", "ucs", "view")

    # ---- blocks -------------------------------------------------------------------
    def blocks(self):
        doc = self.doc
        b = doc.blocks.new("BEARING")
        b.add_lwpolyline([(0, 0), (-0.5, -0.75), (0.5, -0.75)], close=True) if self.modern else \
            b.add_polyline2d([(0, 0), (-0.5, -0.75), (0.5, -0.75)], close=True)
        b.add_line((-0.8, -0.75), (0.8, -0.75))
        b.add_attdef("TYPE", (0.6, -0.3), "fixed", dxfattribs={"height": 0.25, "prompt": "Bearing type"})
        b.add_attdef("REF", (0.6, -0.7), "B-?", dxfattribs={"height": 0.25, "prompt": "Reference"})
        g = doc.blocks.new("GAUGE")
        g.add_circle((0, 0), 0.3)
        g.add_line((-0.4, 0), (0.4, 0), dxfattribs={"color": 0})  # BYBLOCK
        g.add_attdef("ID", (0.4, 0.1), dxfattribs={"height": 0.2})
        g.add_attdef("NOTE", (0.4, -0.3), dxfattribs={"height": 0.2})
        d = doc.blocks.new("DETAIL")  # a block holding an attributed insert: nesting
        d.add_circle((0, 0), 1.0)
        ins = d.add_blockref("GAUGE", (0.5, 0.5))
        ins.add_auto_attribs({"ID": "G-0", "NOTE": self.texts[2]})
        m = doc.blocks.new("MARKER")
        m.add_circle((0, 0), 0.25)
        m.add_line((-0.25, -0.25), (0.25, 0.25))
        self.has("blocks_with_attributes", "nested_block")
        if self.names:
            nb = doc.blocks.new(self.names[1])
            nb.add_text(self.texts[0], height=0.3)
            nb.add_circle((0, 0), 0.5)
            self.has("non_ascii_block_name")

    # ---- what the tool reads ---------------------------------------------------------
    def support(self, kind: str, at, ref: str):
        msp = self.msp
        if kind == "POINT":
            return msp.add_point(at, dxfattribs={"layer": "SUPPORTS"})
        if kind == "CIRCLE":
            return msp.add_circle(at, 0.3, dxfattribs={"layer": "SUPPORTS"})
        e = msp.add_blockref("BEARING", at, dxfattribs={"layer": "SUPPORTS"})
        e.add_auto_attribs({"TYPE": "pinned", "REF": ref})
        return e

    def structure(self):
        msp = self.msp
        left_kind, right_kind = SUPPORT_KINDS[self.version]
        left = self.support(left_kind, LEFT, "B-1")
        right = self.support(right_kind, RIGHT, "B-2")
        left.set_xdata("HB_SURVEY", [(1000, "support set out " + self.texts[0]), (1040, 0.005)])
        if self.modern:
            xd = right.new_extension_dict()
            xd.add_xrecord("HB_BEARING").reset([(1, self.texts[1]), (40, 1250.0), (70, 2)])
        for i, (x, label, kind) in enumerate(LOADS):
            line = msp.add_line((x, DECK_Y + 0.5), (x, DECK_Y + 2.5), dxfattribs={"layer": "LOADS"})
            at = (x + 0.3, DECK_Y + 2.0)
            if kind == "MTEXT" and self.modern:
                msp.add_mtext(label, dxfattribs={"layer": "LOADS", "char_height": 0.35, "insert": at})
            else:
                plain = "35 kN" if kind == "MTEXT" else label
                msp.add_text(plain, height=0.35, dxfattribs={"layer": "LOADS"}).set_placement(at)
            if i == 1:
                line.set_xdata("HB_REVIEW", [(1000, "hanger H2 " + self.texts[1]), (1070, 2)])
            if i == 2 and self.modern:
                xd = line.new_extension_dict()
                xd.add_xrecord("HB_HANGER").reset([(1, "H3"), (40, 40.0)])
        if self.modern:
            self.msp.add_lwpolyline([(-2, DECK_Y), (30, DECK_Y + 0.4), (62, DECK_Y)], dxfattribs={"layer": "DECK"})
        else:
            self.msp.add_polyline2d([(-2, DECK_Y), (30, DECK_Y + 0.4), (62, DECK_Y)], dxfattribs={"layer": "DECK"})
        self.has("supports_" + left_kind.lower(), "supports_" + right_kind.lower(), "labelled_loads",
                 "xdata", "deck")

    # ---- background for every version ---------------------------------------------------
    def background(self):
        msp, doc, t = self.msp, self.doc, self.texts
        # plain geometry
        msp.add_arc((30, 26), 2.0, 200, 340, dxfattribs={"layer": "ANNOT"})
        msp.add_solid([(-6, 0), (-4, 0), (-6, 2), (-4, 2)], dxfattribs={"layer": "GROUND"})
        msp.add_trace([(64, 0), (66, 0), (64, 2), (66, 2)], dxfattribs={"layer": "GROUND"})
        msp.add_3dface([(0, -4, 0), (4, -4, 0), (4, -2, 1), (0, -2, 1)], dxfattribs={"layer": "GROUND"})
        msp.add_polyline2d([(0, -6, 0.5), (10, -6, 0), (20, -7, -0.3), (30, -6, 0)],
                           format="xyb", dxfattribs={"layer": "GROUND"})
        msp.add_polyline3d([(0, -8, 0), (30, -8, 1), (60, -8, 0)], dxfattribs={"layer": "GROUND"})
        pf = msp.add_polyface(dxfattribs={"layer": "GROUND"})
        pf.append_face([(40, -4, 0), (44, -4, 0), (44, -2, 0), (40, -2, 0)])
        pf.append_face([(44, -4, 0), (48, -4, 0), (48, -2, 0.5)])
        self.has("arc", "solid", "trace", "3dface", "polyline_2d_bulges", "polyline_3d", "polyface")
        # frozen, locked and off layers with entities
        msp.add_line((2, 11), (58, 11), dxfattribs={"layer": "OLD-SURVEY"})
        for gx in range(0, 61, 15):
            msp.add_line((gx, -10), (gx, 30), dxfattribs={"layer": "GRID"})
        msp.add_circle((58, 28), 0.5, dxfattribs={"layer": "LEGEND"})
        # non-ASCII texts, with XDATA of several kinds
        for k, s in enumerate(t):
            txt = msp.add_text(s, height=0.4, dxfattribs={"layer": "ANNOT", "style": "HB-ARIAL"})
            txt.set_placement((5, 27 - k))
            if k == 0:
                # every XDATA group code of the DXF reference ("Group codes in
                # extended data"): 1071 and 1011 from R2000 on (our choice)
                ref = msp.query('LINE[layer=="LOADS"]')[0].dxf.handle
                xdata = [(1000, s), (1002, "{"), (1070, 7), (1040, 2.5), (1041, 1.5), (1042, 0.75),
                         (1010, (1.0, 2.0, 3.0)), (1003, "ANNOT"), (1005, ref), (1004, b"\x00\x01hb\xff"),
                         (1002, "}")]
                if self.modern:
                    xdata[3:3] = [(1071, 123456789), (1011, (4.0, 5.0, 6.0)), (1012, (0.5, 0.5, 0.0)),
                                  (1013, (0.0, 0.0, 1.0))]
                txt.set_xdata("HB_SURVEY", xdata)
                txt.set_xdata("HB_REVIEW", [(1000, "checked")])
        self.has("non_ascii_text", "xdata_multiple_appids", "xdata_all_types")
        c = msp.add_circle((30, 3), 1.0, dxfattribs={"layer": "ANNOT"})
        c.set_xdata("HB_REVIEW", [(1000, t[2]), (1070, 1)])
        # attributed inserts, nested block
        ins = msp.add_blockref("GAUGE", (20, 3), dxfattribs={"layer": "ANNOT"})
        ins.add_auto_attribs({"ID": "G-7", "NOTE": t[3]})
        ins.set_xdata("HB_SURVEY", [(1000, "gauge G-7"), (1040, 0.42)])
        msp.add_blockref("DETAIL", (40, 3), dxfattribs={"layer": "ANNOT"})
        if self.names:
            msp.add_blockref(self.names[1], (48, 26), dxfattribs={"layer": self.names[0]})
            msp.add_text(t[1], height=0.4, dxfattribs={"layer": self.names[0]}).set_placement((48, 24))
        # a rendered DIMENSION (geometry block *D...), an aligned one
        dim = msp.add_linear_dim(base=(0, -12), p1=(0, -10), p2=(60, -10), dimstyle="HB-DIM",
                                 dxfattribs={"layer": "ANNOT"})
        dim.render()
        ali = msp.add_aligned_dim(p1=(0, 20), p2=(60, 17), distance=2, dimstyle="HB-DIM", dxfattribs={"layer": "ANNOT"})
        ali.render()
        self.has("dimension")
        # an entity on a layer without a table entry
        msp.add_circle((66, 25), 0.3, dxfattribs={"layer": "UNLISTED-SKETCH"})
        # paper space: the first layout
        psp = doc.paperspace()
        psp.add_line((0, 0), (420, 0), dxfattribs={"layer": "ANNOT"})
        psp.add_text(self.title, height=5, dxfattribs={"layer": "ANNOT"}).set_placement((20, 20))
        psp.add_text(t[0], height=3.5, dxfattribs={"layer": "ANNOT"}).set_placement((20, 12))
        psp.add_viewport(center=(210, 160), size=(380, 220), view_center_point=(30, 10), view_height=45,
                         dxfattribs={"layer": "VIEWPORTS" if self.modern else "ANNOT"})
        self.has("paper_space", "viewport")
        # traps: a support and a labelled load in paper space and inside a block,
        # which the tool must not read (README: "Entities inside block
        # definitions and in paper space are not read as supports or loads")
        psp.add_point((30, 30), dxfattribs={"layer": "SUPPORTS"})
        psp.add_line((40, 30), (40, 40), dxfattribs={"layer": "LOADS"})
        psp.add_text("99 kN", height=2.5, dxfattribs={"layer": "LOADS"}).set_placement((41, 35))
        trap = doc.blocks.get("DETAIL")
        trap.add_point((0.2, 0.2), dxfattribs={"layer": "SUPPORTS"})
        trap.add_line((0.6, -0.5), (0.6, 0.5), dxfattribs={"layer": "LOADS"})
        trap.add_text("77 kN", height=0.2, dxfattribs={"layer": "LOADS"}).set_placement((0.7, 0))
        self.has("traps_in_paper_space_and_blocks")
        if not self.modern:
            pl = msp.query('POLYLINE[layer=="GROUND"]')[0]
            pl.set_xdata("HB_SURVEY", [(1000, "ground line")])

    # ---- R2000 and later --------------------------------------------------------------
    def modern_background(self):
        msp, doc, t = self.msp, self.doc, self.texts
        lw = msp.add_lwpolyline([(0, -14, 0.2, 0.2, 0.4), (20, -14, 0.1, 0.1, 0), (40, -15, 0, 0, -0.3), (60, -14)],
                                format="xyseb", dxfattribs={"layer": "GROUND", "lineweight": 50})
        lw.set_xdata("HB_SURVEY", [(1000, "kerb line"), (1010, (0, -14, 0))])
        msp.add_mtext(t[0] + "\\P" + t[1], dxfattribs={"layer": "ANNOT", "char_height": 0.4, "insert": (5, 32)})
        msp.add_ellipse((30, 30), major_axis=(3, 0), ratio=0.4, dxfattribs={"layer": "ANNOT"})
        msp.add_spline([(0, 34), (10, 36), (20, 33), (30, 35)], dxfattribs={"layer": "ANNOT"})
        msp.add_ray((0, 40), (1, 0.1), dxfattribs={"layer": "GRID"})
        msp.add_xline((0, 41), (1, 0), dxfattribs={"layer": "GRID"})
        msp.add_leader([(12, 3), (14, 5), (16, 5)], dimstyle="HB-DIM", dxfattribs={"layer": "ANNOT"})
        msp.new_entity("TOLERANCE", {"content": "{\\Fgdt;j}%%v0.5", "insert": (20, -16), "dimstyle": "HB-DIM",
                                     "layer": "ANNOT"})
        msp.add_mline([(0, -18), (20, -18), (30, -19)], dxfattribs={"layer": "GROUND"})
        msp.add_helix(0.5, 0.25, 3, dxfattribs={"layer": "ANNOT"}).translate(55, -16, 0)
        mesh = msp.add_mesh(dxfattribs={"layer": "GROUND"})
        with mesh.edit_data() as md:
            md.vertices = [(50, -4, 0), (54, -4, 0), (54, -2, 0), (50, -2, 0), (52, -3, 1)]
            md.faces = [(0, 1, 4), (1, 2, 4), (2, 3, 4), (3, 0, 4)]
        msp.add_wipeout([(22, 28), (26, 28), (26, 30), (22, 30)], dxfattribs={"layer": "ANNOT"})
        self.has("lwpolyline_bulges_widths", "mtext", "ellipse", "spline", "ray", "xline", "leader", "tolerance",
                 "mline", "helix", "mesh", "wipeout", "lineweight")

        # HATCH: a pattern fill with a hole, a solid fill with a hole
        h1 = msp.add_hatch(color=8, dxfattribs={"layer": "GROUND"})
        h1.set_pattern_fill("ANSI31", scale=0.5)
        h1.paths.add_polyline_path([(-6, 4), (-1, 4), (-1, 8), (-6, 8)], is_closed=True, flags=1)  # external
        h1.paths.add_polyline_path([(-5, 5), (-2, 5), (-2, 7), (-5, 7)], is_closed=True, flags=16)  # outermost: a hole
        h1.set_xdata("HB_SURVEY", [(1000, "abutment fill " + t[0])])
        h2 = msp.add_hatch(color=5, dxfattribs={"layer": "GROUND"})
        h2.set_solid_fill(color=5)
        h2.paths.add_polyline_path([(61, 4), (66, 4), (66, 8), (61, 8)], is_closed=True, flags=1)
        ep = h2.paths.add_edge_path(flags=16)
        ep.add_arc((63.5, 6), 1.0, 0, 360)
        xd = h2.new_extension_dict()
        xd.add_xrecord("HB_FILL").reset([(1, "solid"), (70, 1)])
        self.has("hatch_pattern_with_hole", "hatch_solid_with_hole")

        # MULTILEADER: text content and block content
        ml = msp.add_multileader_mtext("Standard", dxfattribs={"layer": "ANNOT"})
        ml.set_content(t[0] + "\\P" + "Ø 40 cable", char_height=0.4)
        ml.add_leader_line(mleader.ConnectionSide.left, [Vec2(2, 21)])
        ml.build(insert=Vec2(6, 24))
        ml.multileader.set_xdata("HB_REVIEW", [(1000, "leader note")])
        mb = msp.add_multileader_block("Standard", dxfattribs={"layer": "ANNOT"})
        mb.set_content(name="MARKER", scale=1.0)
        mb.add_leader_line(mleader.ConnectionSide.left, [Vec2(56, 19)])
        mb.build(insert=Vec2(58, 23))
        self.has("multileader_mtext", "multileader_block")

        # IMAGE and a PDF underlay (the files they name need not exist)
        img = doc.add_image_def(filename="site/photo-north-abutment.jpg", size_in_pixel=(1600, 1200))
        msp.add_image(img, insert=(70, 0), size_in_units=(8, 6), dxfattribs={"layer": "ANNOT"})
        und = doc.add_underlay_def(filename="survey/levels-2031.pdf", fmt="pdf", name="1")
        msp.add_underlay(und, insert=(70, 10), scale=(0.1, 0.1, 0.1), dxfattribs={"layer": "ANNOT"})
        self.has("image", "pdf_underlay")

        # groups: named and anonymous
        grid = list(msp.query('LINE[layer=="GRID"]'))
        doc.groups.new("HB-GRIDLINES", description="grid lines").extend(grid)
        doc.groups.new(description="ground hatches").extend([h1, h2])
        self.has("groups")

        # extension dictionaries on an INSERT, a LAYER record; application data in the root dictionary
        ins = msp.query('INSERT[name=="GAUGE"]')[0]
        xd = ins.new_extension_dict()
        xd.add_xrecord("HB_CALIBRATION").reset([(1, t[2]), (40, 0.998), (10, (1.0, 2.0, 0.0)), (70, 4)])
        layer = doc.layers.get("GROUND")
        layer.new_extension_dict().add_xrecord("HB_LAYERNOTE").reset([(1, "ground as surveyed")])
        layer.set_xdata("HB_SURVEY", [(1000, "layer xdata")])
        project = doc.rootdict.add_new_dict("HB_PROJECT")
        project.add_xrecord("INFO").reset([(1, self.title), (1, t[0]), (70, 2031)])
        self.has("extension_dict_xrecord", "root_dict_xrecord", "xdata_on_table_entry")

        # proxy entity in model space, proxy object in the project dictionary
        pe = add_proxy_entity(doc, msp, "ANNOT", (24.0, -3.0))
        add_proxy_object(doc, project, "GAUGE_READINGS", pe.dxf.handle)
        self.has("proxy_entity", "proxy_object")

        # two more paper-space layouts, each with a viewport and entities
        names = ["Sheet B", "Sheet C"] if not self.names else ["Sheet B", self.names[2]]
        for k, name in enumerate(names):
            lay = doc.layouts.new(name)
            lay.add_lwpolyline([(0, 0), (420, 0), (420, 297), (0, 297)], close=True, dxfattribs={"layer": "TITLE"})
            sheet = lay.add_text(f"{self.title}, sheet {k + 2}", height=5, dxfattribs={"layer": "TITLE"})
            sheet.set_placement((20, 20))
            lay.add_text(t[k + 1], height=3.5, dxfattribs={"layer": "TITLE"}).set_placement((20, 12))
            lay.add_circle((400, 20), 8, dxfattribs={"layer": "TITLE"})
            lay.add_viewport(center=(210, 160), size=(300, 200), view_center_point=(15 + 30 * k, 12),
                             view_height=25, dxfattribs={"layer": "VIEWPORTS"})
            lay.add_point((300, 30), dxfattribs={"layer": "SUPPORTS"})  # a trap, as in the first layout
        self.has("layouts_3", *(["non_ascii_layout_name"] if self.names else []))

    # ---- R2004 and later --------------------------------------------------------------
    def r2004_background(self):
        msp = self.msp
        c = msp.add_circle((36, 30), 1.2, dxfattribs={"layer": "SHADING"})
        c.rgb = (12, 140, 200)
        c.transparency = 0.25
        h = msp.add_hatch(dxfattribs={"layer": "SHADING"})
        h.set_gradient((255, 240, 200), (120, 60, 10), name="LINEAR")
        h.paths.add_polyline_path([(40, 28), (46, 28), (46, 32), (40, 32)], is_closed=True, flags=1)
        h.transparency = 0.5
        t = msp.add_text(self.texts[0], height=0.4, dxfattribs={"layer": "SHADING"})
        t.set_placement((40, 34))
        t.rgb = (200, 20, 20)
        self.has("true_color", "transparency", "hatch_gradient")

    # ---- bulk, for the large variants -----------------------------------------------------
    def bulk(self, n: int):
        """n cells of plain entities below the structure: enough of them make a
        drawing larger than the size from which hangline scans the ENTITIES
        section on two threads (8 MiB, its src/dxf/index.rs PARALLEL_FROM),
        with values that look like structure to a careless splitter: TEXTs and
        ATTRIBs reading "0" and "ENDSEC", POLYLINEs and INSERTs whose
        sub-entities must stay with them."""
        msp, t = self.msp, self.texts
        for i in range(n):
            x, y = (i % 200) * 0.3, -30 - (i // 200) * 0.3
            msp.add_line((x, y), (x + 0.2, y + 0.1), dxfattribs={"layer": "GROUND"})
            msp.add_text("0", height=0.1, dxfattribs={"layer": "ANNOT"}).set_placement((x, y))
            if i % 10 == 0:
                msp.add_text(t[i // 10 % len(t)], height=0.1, dxfattribs={"layer": "ANNOT"}).set_placement((x, y + 0.1))
                msp.add_polyline2d([(x, y), (x + 0.1, y), (x + 0.1, y + 0.1)], dxfattribs={"layer": "GROUND"})
                ins = msp.add_blockref("GAUGE", (x, y), dxfattribs={"layer": "ANNOT"})
                ins.add_auto_attribs({"ID": "0", "NOTE": "ENDSEC"})
            if i % 50 == 0:
                msp.add_circle((x, y), 0.05, dxfattribs={"layer": "GROUND"}).set_xdata(
                    "HB_SURVEY", [(1000, f"cell {i}"), (1070, i % 30000)])
        self.has("bulk")

    def build(self, bulk: int = 0):
        self.tables()
        self.blocks()
        self.structure()
        self.background()
        if self.modern:
            self.modern_background()
        if self.r2004:
            self.r2004_background()
        if bulk:
            self.bulk(bulk)
        # the model-space extents, so the tool places its force diagram beside them
        from ezdxf import bbox

        box = bbox.extents(self.msp, fast=True)
        self.msp.reset_extents([round(v, 6) for v in box.extmin], [round(v, 6) for v in box.extmax])
        return self


# --------------------------------------------------------------------------------------
# The corpus
# --------------------------------------------------------------------------------------

# (version, encoding, binary, line end, handles): every version as ASCII and
# binary, plus two ASCII drawings with CR LF line ends and an R12 drawing
# without handles ($HANDLING 0: handles are optional in R12, DXF reference,
# HEADER section).
VARIANTS = [(v, CODEPAGE.get(v, "utf8"), b, "lf", True) for v in VERSIONS for b in (False, True)] + [
    ("R2000", "cp1252", False, "crlf", True),
    ("R2018", "utf8", False, "crlf", True),
    ("R12", "cp1252", False, "lf", False),
]
# --large: drawings above 8 MiB (each with its number of bulk cells), for the
# tool's two-thread scan of large ENTITIES sections; slow to write and check,
# so not part of the default corpus.
LARGE_VARIANTS = [
    ("R2018", "utf8", False, "lf", True, 24000),
    ("R2018", "utf8", True, "lf", True, 28000),
    ("R12", "cp1252", True, "lf", True, 46000),
    ("R2004", "cp932", False, "crlf", True, 22000),
]

TITLES = {
    "R12": "Velmsee footbridge, scheme A (invented)",
    "R2000": "Footbridge N-7 over the Ostra, scheme B (invented)",
    "R2004": "Kiritani footbridge, scheme C (invented)",
    "R2007": "Lakeside walk bridge D-4, scheme D (invented)",
    "R2010": "Harwick Mill footbridge, scheme E (invented)",
    "R2013": "Pellan quay footbridge, scheme F (invented)",
    "R2018": "Orrin valley footbridge, scheme G (invented)",
}


def file_name(version: str, encoding: str, binary: bool, line_end: str, handles: bool, large: bool = False) -> str:
    parts = ["rt", version.lower(), encoding]
    if large:
        parts.append("large")
    if binary:
        parts.append("bin")
    if line_end == "crlf":
        parts.append("crlf")
    if not handles:
        parts.append("nohandles")
    return "-".join(parts) + ".dxf"


def save(doc, path: Path, binary: bool, line_end: str) -> None:
    if binary:
        doc.saveas(path, fmt="bin")
    elif line_end == "crlf":
        # ezdxf's own writer, into a text stream with CR LF line ends (the
        # encoding and error handler Drawing.saveas uses).
        with open(path, "wt", encoding=doc.output_encoding, errors="dxfreplace", newline="\r\n") as fp:
            doc.write(fp, fmt="asc")
    else:
        doc.saveas(path, fmt="asc")


def generate(out: Path, large: bool = False) -> list[dict]:
    out.mkdir(parents=True, exist_ok=True)
    entries = []
    variants = [(*v, 0) for v in VARIANTS] if not large else LARGE_VARIANTS
    for version, encoding, binary, line_end, handles, bulk in variants:
        c = Corpus(version, encoding, TITLES[version]).build(bulk)
        if not handles:
            c.doc.header["$HANDLING"] = 0
        name = file_name(version, encoding, binary, line_end, handles, bool(bulk))
        path = out / name
        save(c.doc, path, binary, line_end)
        args = ["--sag", f"{SAG:g}"]
        if version == "R12":
            args += ["--units", "m"]  # R12 has no $INSUNITS
        entries.append({
            "file": name,
            "version": version,
            "acadver": ACADVER[version],
            "format": "binary" if binary else "ascii",
            "line_end": None if binary else line_end,
            "handles": handles,
            "large": bool(bulk),
            "encoding": encoding,
            "dwgcodepage": DWGCODEPAGE[encoding] or "UTF-8 (R2007 on: $DWGCODEPAGE not used for text)",
            "title": c.title,
            "non_ascii_texts": c.texts,
            "supports": list(SUPPORT_KINDS[version]),
            "loads": len(LOADS),
            "solve_args": args,
            "features": sorted(c.features),
            "bytes": path.stat().st_size,
        })
    manifest = {
        "format": MANIFEST_FORMAT,
        "generator": "tools/roundtrip/make_corpus.py",
        "library": f"ezdxf {ezdxf.__version__}",
        "scenario": "invented: every place, name and number",
        "not_possible": {
            "R12": "HATCH, MULTILEADER, proxies, extension dictionaries, groups, images, underlays, more than one "
                   "paper-space layout, lineweights, plot flags, true colour and transparency need the R13+ "
                   "structure (subclasses, OBJECTS section); ezdxf refuses or drops them in R12.",
            "R2000": "true colour and transparency (group codes 420/440) are R2004 features.",
        },
        "drawings": entries,
    }
    (out / "manifest.json").write_text(json.dumps(manifest, indent=1, ensure_ascii=False) + "\n", encoding="utf-8")
    return entries


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--out", type=Path, required=True, help="folder to write the corpus into")
    ap.add_argument("--twice", action="store_true", help="write it again into a temporary folder and compare")
    ap.add_argument("--large", action="store_true",
                    help="write the large drawings (above 8 MiB) instead of the default corpus")
    a = ap.parse_args(argv)
    entries = generate(a.out, a.large)
    result = {"out": str(a.out), "drawings": len(entries), "bytes": sum(e["bytes"] for e in entries)}
    if a.twice:
        with tempfile.TemporaryDirectory() as tmp:
            generate(Path(tmp), a.large)
            files = [e["file"] for e in entries] + ["manifest.json"]
            differ = [f for f in files if not filecmp.cmp(a.out / f, Path(tmp) / f, shallow=False)]
        result["deterministic"] = not differ
        result["differ"] = differ
    print(json.dumps(result))
    return 1 if result.get("differ") else 0


if __name__ == "__main__":
    sys.exit(main())
