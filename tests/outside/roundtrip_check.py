#!/usr/bin/env python3
"""Tag-level proof that a drawing hangline wrote is its input "byte for byte
outside what the tool adds". Documented in tools/roundtrip/README.md (with
the corpus it is run on); run by tests/cli/roundtrip.rs.

    python tests/outside/roundtrip_check.py INPUT.dxf OUTPUT.dxf [--tool-layer-prefix HANGLINE-]

Both files are read as raw tag streams by a reader of our own (ASCII: a group
code line and a value line; binary: the layout of the DXF reference, "Binary
DXF Files" and "Group Code Value Types"), keeping each tag's exact bytes.
The input's tags must appear in the output in order, each byte for byte the
same, with only these differences:

* inserted whole records, blocks and entities where the tool puts them (new
  LAYER records named HANGLINE-*, the DIMSTYLE "HANGLINE", BLOCK_RECORDs and
  BLOCKs named *D<n> that the input did not have, entities on HANGLINE-*
  layers in the ENTITIES section; a BLOCKS section when the input had none);
* the value of $HANDSEED (or the variable inserted when the input lacked it);
* the 70 (entry count) of the LAYER, DIMSTYLE and BLOCK_RECORD table headers.

It also checks what was inserted: handles new and unique, $HANDSEED above
every handle, each table count raised by the number of records inserted, every
inserted DIMENSION pointing to an inserted *D block (and each such block used
once), owners and other pointers of inserted records resolving, and entities on
layers that exist.

Prints ONE JSON object and exits 0 whenever it could run, whatever it found
(the caller decides: "ok" is true when "problems" is empty). Exits 2 on usage
errors. The object gives counts (tags, groups, entities, objects, ...), what
was inserted and changed, the first discrepancy with its position, and the
features found in the input (proxies, XDATA, ...), counted from the tags.
"""

from __future__ import annotations

import argparse
import json
import os
import re
import struct
import sys
from collections import Counter
from dataclasses import dataclass, field

sys.dont_write_bytecode = True

BINARY_SENTINEL = b"AutoCAD Binary DXF\r\n\x1a\x00"  # DXF reference, "Binary DXF Files"
ANONYMOUS_DIM_BLOCK = re.compile(r"^\*D\d+$", re.IGNORECASE)
TOOL_DIMSTYLE = "HANGLINE"  # the tool's dimension style (README, "What is written")
COUNTED_TABLES = ("LAYER", "DIMSTYLE", "BLOCK_RECORD")  # tables whose 70 the tool raises
SUB_ENTITIES = {"VERTEX", "SEQEND", "ATTRIB"}  # follow their owner entity (DXF reference, POLYLINE, INSERT)


# --------------------------------------------------------------------------------------
# Tags
# --------------------------------------------------------------------------------------


def value_kind(code: int) -> str:
    """How a group code's value is stored in binary DXF (DXF reference, "Group
    Code Value Types"; 290-299 booleans as one byte, 310-319 and 1004 binary
    chunks with a length byte)."""
    if 10 <= code <= 59 or 110 <= code <= 149 or 210 <= code <= 239 or 460 <= code <= 469 or 1010 <= code <= 1059:
        return "double"
    if (60 <= code <= 79 or 170 <= code <= 179 or 270 <= code <= 289 or 370 <= code <= 389 or 400 <= code <= 409
            or 1060 <= code <= 1070):
        return "int16"
    if 90 <= code <= 99 or 420 <= code <= 429 or 440 <= code <= 459 or code == 1071:
        return "int32"
    if 160 <= code <= 169:
        return "int64"
    if 290 <= code <= 299:
        return "bool"
    if 310 <= code <= 319 or code == 1004:
        return "chunk"
    return "text"


def is_pointer(code: int) -> bool:
    """Soft/hard pointer and owner codes (DXF reference, "Group Code Value Types")."""
    return 320 <= code <= 369 or 390 <= code <= 399 or code in (480, 481)


@dataclass
class Tag:
    code: int
    start: int  # byte offset of the tag (its group code)
    end: int  # byte offset just past it
    vstart: int  # byte span of the value (ASCII: the value line without its line end)
    vend: int
    line: int | None  # ASCII: 1-based line number of the group code line


class DxfTags:
    """The tags of one file, with their exact bytes."""

    def __init__(self, path: str):
        with open(path, "rb") as fp:
            self.data = fp.read()
        self.path = path
        self.binary = self.data.startswith(BINARY_SENTINEL)
        self.wide_codes: bool | None = None
        self.tags: list[Tag] = []
        self.prefix = b""
        self.tail = b""
        self.line_ends = Counter()
        if self.binary:
            self._read_binary()
        else:
            self._read_ascii()
        self.encoding = "cp1252"
        self._find_encoding()

    # ---- readers ------------------------------------------------------------------
    def _read_ascii(self):
        d, n, pos, line = self.data, len(self.data), 0, 1
        tags = self.tags
        while pos < n:
            e1 = d.find(b"\n", pos)
            if e1 < 0:
                break  # a last line without a value: left as the tail
            code_text = d[pos:e1].strip()
            try:
                code = int(code_text)
            except ValueError:
                raise ValueError(f"line {line} (byte {pos}): group code expected, found {code_text[:40]!r}")
            e2 = d.find(b"\n", e1 + 1)
            end = n if e2 < 0 else e2 + 1
            vend = end if e2 < 0 else e2
            self.line_ends[b"\r\n" if d[e1 - 1:e1] == b"\r" else b"\n"] += 1
            if e2 >= 0:
                self.line_ends[b"\r\n" if d[e2 - 1:e2] == b"\r" else b"\n"] += 1
            if vend > e1 + 1 and d[vend - 1:vend] == b"\r":
                vend -= 1
            tags.append(Tag(code, pos, end, e1 + 1, vend, line))
            pos, line = end, line + 2
            if code == 0 and d[e1 + 1:vend].strip() == b"EOF":
                break
        self.tail = d[pos:]

    def _read_binary(self):
        d, n = self.data, len(self.data)
        self.prefix = BINARY_SENTINEL
        pos = len(BINARY_SENTINEL)
        # The first tag is (0, SECTION): with 2-byte group codes its second byte
        # is the code's high byte, 0 (R13 on); with 1-byte codes it is 'S' (R12).
        if d[pos:pos + 3] == b"\x00\x00S":
            self.wide_codes = True
        elif d[pos:pos + 2] == b"\x00S":
            self.wide_codes = False
        else:
            raise ValueError("binary DXF: the sentinel is not followed by (0, SECTION)")
        unpack = struct.unpack_from
        while pos < n:
            start = pos
            if self.wide_codes:
                code = unpack("<h", d, pos)[0]
                pos += 2
            else:
                code = d[pos]
                pos += 1
                if code == 255:  # 1-byte codes: 255 escapes a 2-byte code (DXF reference, "Binary DXF Files")
                    code = unpack("<h", d, pos)[0]
                    pos += 2
            kind = value_kind(code)
            vstart = pos
            if kind == "text":
                z = d.find(b"\x00", pos)
                if z < 0:
                    raise ValueError(f"binary DXF: unterminated string at byte {pos}")
                vend, pos = z, z + 1
            elif kind == "chunk":
                length = d[pos]
                vstart, vend = pos + 1, pos + 1 + length
                pos = vend
            else:
                size = {"double": 8, "int16": 2, "int32": 4, "int64": 8, "bool": 1}[kind]
                vend = pos = pos + size
            if pos > n:
                raise ValueError(f"binary DXF: tag at byte {start} runs past the end of the file")
            self.tags.append(Tag(code, start, pos, vstart, vend, None))
            if code == 0 and d[vstart:vend] == b"EOF":
                break
        self.tail = d[pos:]

    def _find_encoding(self):
        """Before R2007 strings are in the page of $DWGCODEPAGE, from R2007 on
        UTF-8 (DXF reference, HEADER section, $DWGCODEPAGE and $ACADVER)."""
        acadver = self.header_value("$ACADVER")
        self.acadver = self.text_of_bytes(acadver or b"", "ascii")
        if self.acadver >= "AC1021":
            self.encoding = "utf-8"
            return
        page = self.text_of_bytes(self.header_value("$DWGCODEPAGE") or b"", "ascii").upper()
        m = re.match(r"ANSI_(\d+)$", page)
        if m:
            self.encoding = "cp" + m.group(1)

    # ---- values -------------------------------------------------------------------
    def raw(self, t: Tag) -> bytes:
        return self.data[t.start:t.end]

    def vbytes(self, t: Tag) -> bytes:
        return self.data[t.vstart:t.vend]

    @staticmethod
    def text_of_bytes(b: bytes, enc: str) -> str:
        return b.decode(enc, errors="backslashreplace")

    def text(self, t: Tag) -> str:
        """A string value (trimmed), for names and reports."""
        b = self.vbytes(t)
        if self.binary and value_kind(t.code) != "text":
            return str(self.number(t))
        return self.text_of_bytes(b, self.encoding).strip()

    def number(self, t: Tag):
        b = self.vbytes(t)
        if not self.binary:
            s = b.decode("ascii", "replace").strip()
            try:
                return int(s)
            except ValueError:
                try:
                    return float(s)
                except ValueError:
                    return None
        kind = value_kind(t.code)
        fmt = {"double": "<d", "int16": "<h", "int32": "<i", "int64": "<q", "bool": "<B"}.get(kind)
        if fmt is None:
            return None
        return struct.unpack(fmt, b)[0]

    def shown(self, t: Tag) -> str:
        """A value for a report: text decoded, binary chunks as hex, numbers as numbers."""
        kind = value_kind(t.code)
        if self.binary and kind == "chunk":
            return self.vbytes(t).hex().upper()
        if self.binary and kind != "text":
            return str(self.number(t))
        return self.text_of_bytes(self.vbytes(t), self.encoding)

    def header_value(self, var: str) -> bytes | None:
        for k, t in enumerate(self.tags):
            if t.code == 9 and self.data[t.vstart:t.vend].strip() == var.encode():
                if k + 1 < len(self.tags):
                    return self.data[self.tags[k + 1].vstart:self.tags[k + 1].vend].strip()
            if t.code == 0 and self.data[t.vstart:t.vend].strip() == b"ENDSEC":
                return None
        return None

    def where(self, index: int) -> dict:
        """The position of tag `index`, for reports."""
        if index >= len(self.tags):
            return {"tag": index, "byte": len(self.data), "at": "end of file"}
        t = self.tags[index]
        out = {"tag": index, "byte": t.start, "code": t.code, "value": self.shown(t)}
        if t.line is not None:
            out["line"] = t.line
        return out


# --------------------------------------------------------------------------------------
# Groups: a code-0 tag and the tags up to the next one
# --------------------------------------------------------------------------------------


@dataclass
class Group:
    first: int  # tag index
    last: int  # one past
    type: str
    section: str | None = None
    table: str | None = None
    block: str | None = None
    name: str | None = None
    handle: str | None = None
    layer: str | None = None
    owner: str | None = None
    codes: set = field(default_factory=set)


def groups_of(f: DxfTags) -> list[Group]:
    tags = f.tags
    starts = [k for k, t in enumerate(tags) if t.code == 0]
    if not starts or starts[0] != 0:
        starts = [0] + starts  # tags before the first 0 (comments) form a group of their own
    out = []
    section = table = block = None
    for a, b in zip(starts, starts[1:] + [len(tags)]):
        t0 = tags[a]
        typ = f.text(t0) if t0.code == 0 else "(prelude)"
        g = Group(a, b, typ)
        depth = 0
        # the HEADER section is one group whose tags are variables, not attributes
        own = b if typ != "SECTION" else min(b, a + 2)
        for k in range(a + 1, own):
            t = tags[k]
            g.codes.add(t.code)
            if t.code == 102:
                v = f.text(t)
                depth += 1 if v.startswith("{") else (-1 if v == "}" else 0)
                continue
            if t.code == 1001:
                break  # XDATA: nothing below is the entity's own
            if t.code == 2 and g.name is None:
                g.name = f.text(t)
            elif t.code in (5, 105) and g.handle is None:
                g.handle = f.text(t).upper()
            elif t.code == 8 and g.layer is None:
                g.layer = f.text(t)
            elif t.code == 330 and depth == 0 and g.owner is None:
                g.owner = f.text(t).upper()
        for k in range(a + 1, b):  # codes after XDATA too
            g.codes.add(tags[k].code)
        if typ == "SECTION":
            section = g.name
            table = block = None
        elif typ == "TABLE":
            table = g.name
        elif typ == "BLOCK":
            block = g.name
        g.section, g.table, g.block = section, table, block
        if typ == "ENDSEC":
            section = None
        elif typ == "ENDTAB":
            table = None
        elif typ == "ENDBLK":
            block = None
        out.append(g)
    return out


def tags_of(f: DxfTags, g: Group):
    return f.tags[g.first:g.last]


def same_bytes(fi: DxfTags, gi: Group, fo: DxfTags, go: Group) -> bool:
    return fi.data[fi.tags[gi.first].start:fi.tags[gi.last - 1].end] == \
        fo.data[fo.tags[go.first].start:fo.tags[go.last - 1].end]


# --------------------------------------------------------------------------------------
# The comparison
# --------------------------------------------------------------------------------------


class Check:
    def __init__(self, inp: DxfTags, out: DxfTags, prefix: str):
        self.fi, self.fo, self.prefix = inp, out, prefix.upper()
        self.gi, self.go = groups_of(inp), groups_of(out)
        self.problems: list[str] = []
        self.first_discrepancy = None
        self.changed: list[dict] = []
        self.matched_tags = 0
        self.inserted_tags = 0
        self.inserted_groups: list[Group] = []  # every inserted group, in order
        self.inserted_units: list[dict] = []
        self.input_names = self._names(self.fi, self.gi)
        self.input_sections = {g.name for g in self.gi if g.type == "SECTION"}

    @staticmethod
    def _names(f, groups):
        names = {"BLOCK": set(), "BLOCK_RECORD": set(), "LAYER": set(), "DIMSTYLE": set()}
        for g in groups:
            if g.type in names and g.name is not None:
                names[g.type].add(g.name.upper())
        return names

    def is_tool_layer(self, name: str | None) -> bool:
        return name is not None and name.upper().startswith(self.prefix)

    def problem(self, msg: str):
        self.problems.append(msg)

    def discrepancy(self, why: str, ti: int, to: int):
        if self.first_discrepancy is None:
            self.first_discrepancy = {"why": why, "input": self.fi.where(ti), "output": self.fo.where(to)}
            g = self._group_at(self.gi, ti)
            if g is not None:
                self.first_discrepancy["input_group"] = describe(g)
            g = self._group_at(self.go, to)
            if g is not None:
                self.first_discrepancy["output_group"] = describe(g)
        self.problem(f"{why} (input tag {ti} at byte {self.fi.where(ti)['byte']}, "
                     f"output tag {to} at byte {self.fo.where(to)['byte']})")

    @staticmethod
    def _group_at(groups, tag_index):
        for g in groups:
            if g.first <= tag_index < g.last:
                return g
        return None

    # ---- within a group -------------------------------------------------------------
    def compare_inside(self, gi: Group, go: Group) -> bool:
        """Tag by tag, allowing only the changes the tool may make in this group."""
        fi, fo = self.fi, self.fo
        ti, to = tags_of(fi, gi), tags_of(fo, go)
        header = gi.type == "SECTION" and gi.name == "HEADER"
        counted = gi.type == "TABLE" and (gi.name or "").upper() in COUNTED_TABLES
        count_seen = False
        a = b = 0
        var_in = var_out = None
        has_seed = fi.header_value("$HANDSEED") is not None
        while a < len(ti) or b < len(to):
            x = ti[a] if a < len(ti) else None
            y = to[b] if b < len(to) else None
            if x is not None and y is not None and fi.raw(x) == fo.raw(y):
                if header and x.code == 9:
                    var_in = var_out = fi.text(x)
                a, b = a + 1, b + 1
                continue
            # $HANDSEED's value
            if (header and x is not None and y is not None and var_in == "$HANDSEED" and var_out == "$HANDSEED"
                    and x.code == y.code and x.code != 9 and self._same_frame(x, y)):
                self._changed("$HANDSEED", gi.first + a, go.first + b, x, y)
                a, b = a + 1, b + 1
                continue
            # $HANDSEED inserted at the end of a header that lacked it
            if (header and not has_seed and y is not None and y.code == 9 and fo.text(y) == "$HANDSEED"
                    and (x is None) and b + 1 < len(to) and to[b + 1].code == 5):
                self.inserted_units.append({"kind": "header_variable", "name": "$HANDSEED",
                                            "value": fo.text(to[b + 1]), "tags": 2})
                self.inserted_tags += 2
                var_out = "$HANDSEED"
                b += 2
                continue
            # a table's entry count
            if (counted and not count_seen and x is not None and y is not None and x.code == 70 and y.code == 70
                    and self._same_frame(x, y)):
                self._changed(f"{gi.name.upper()} table count", gi.first + a, go.first + b, x, y)
                count_seen = True
                a, b = a + 1, b + 1
                continue
            if x is None:
                self.discrepancy(f"extra tag in the output's {describe_short(go)}", gi.last, go.first + b)
            elif y is None:
                self.discrepancy(f"input tag missing from the output's {describe_short(go)}", gi.first + a, go.last)
            else:
                self.discrepancy(f"tag differs in {describe_short(gi)}", gi.first + a, go.first + b)
            return False
        self.matched_tags += len(ti) - sum(1 for c in self.changed if gi.first <= c["input_tag"] < gi.last)
        return True

    def _same_frame(self, x: Tag, y: Tag) -> bool:
        """The same bytes around the value: group code (line) and, after the
        value, its line end (ASCII) or terminator (binary strings)."""
        fi, fo = self.fi, self.fo
        return fi.data[x.start:x.vstart] == fo.data[y.start:y.vstart] and fi.data[x.vend:x.end] == fo.data[y.vend:y.end]

    def _changed(self, what, ia, ob, x, y):
        self.changed.append({"what": what, "code": x.code, "in": self.fi.shown(x), "out": self.fo.shown(y),
                             "input_tag": ia, "output_tag": ob, "input_byte": x.start, "output_byte": y.start})

    # ---- inserted units -------------------------------------------------------------
    def classify(self, j: int) -> tuple[int, dict] | None:
        """If output group j starts something the tool may insert, how many
        groups it spans and what it is; else None."""
        go, g = self.go, self.go[j]
        upper = (g.name or "").upper()
        if g.section == "ENTITIES" and g.type not in ("SECTION", "ENDSEC"):
            if self.is_tool_layer(g.layer):
                n = 1
                while j + n < len(go) and go[j + n].type in SUB_ENTITIES and go[j + n].section == "ENTITIES" \
                        and (go[j + n].layer is None or self.is_tool_layer(go[j + n].layer)):
                    n += 1
                return n, {"kind": "entity", "type": g.type, "layer": g.layer}
            return None
        if g.section == "TABLES":
            table = (g.table or "").upper()
            if g.type == "LAYER" and table == "LAYER" and self.is_tool_layer(g.name) \
                    and upper not in self.input_names["LAYER"]:
                return 1, {"kind": "layer_record", "name": g.name}
            if g.type == "DIMSTYLE" and table == "DIMSTYLE" and upper == TOOL_DIMSTYLE \
                    and upper not in self.input_names["DIMSTYLE"]:
                return 1, {"kind": "dimstyle_record", "name": g.name}
            if g.type == "BLOCK_RECORD" and table == "BLOCK_RECORD" and ANONYMOUS_DIM_BLOCK.match(g.name or "") \
                    and upper not in self.input_names["BLOCK_RECORD"]:
                return 1, {"kind": "block_record", "name": g.name}
            return None
        if g.section == "BLOCKS" and g.type == "BLOCK":
            if ANONYMOUS_DIM_BLOCK.match(g.name or "") and upper not in self.input_names["BLOCK"]:
                n = 1
                while j + n < len(go) and go[j + n].type != "ENDBLK":
                    if go[j + n].type in ("BLOCK", "ENDSEC", "SECTION", "EOF"):
                        return None
                    n += 1
                if j + n >= len(go):
                    return None
                inner = go[j + 1:j + n]
                return n + 1, {"kind": "block", "name": g.name, "entities": len(inner),
                               "types": dict(Counter(x.type for x in inner)),
                               "layers": dict(Counter(x.layer for x in inner))}
            return None
        if g.type == "SECTION" and g.name == "BLOCKS" and "BLOCKS" not in self.input_sections:
            n = 1
            while j + n < len(go) and go[j + n].type != "ENDSEC":
                r = self.classify(j + n)
                if r is None or r[1]["kind"] != "block":
                    return None
                n += r[0]
            if j + n >= len(go):
                return None
            return n + 1, {"kind": "blocks_section"}
        return None

    # ---- the walk -------------------------------------------------------------------
    def run(self):
        fi, fo, gi, go = self.fi, self.fo, self.gi, self.go
        if fi.binary != fo.binary:
            self.problem(f"format changed: input {'binary' if fi.binary else 'ASCII'}, "
                         f"output {'binary' if fo.binary else 'ASCII'}")
            return
        if fi.prefix != fo.prefix:
            self.problem("the binary sentinel differs")
        i = j = 0
        while j < len(go):
            if i < len(gi) and same_bytes(fi, gi[i], fo, go[j]):
                self.matched_tags += gi[i].last - gi[i].first
                i, j = i + 1, j + 1
                continue
            if i < len(gi) and gi[i].type == go[j].type and (
                    (gi[i].type == "SECTION" and gi[i].name == "HEADER" and go[j].name == "HEADER")
                    or (gi[i].type == "TABLE" and (gi[i].name or "").upper() in COUNTED_TABLES
                        and gi[i].name == go[j].name)):
                if not self.compare_inside(gi[i], go[j]):
                    return
                i, j = i + 1, j + 1
                continue
            r = self.classify(j)
            if r is None:
                if i < len(gi):
                    a, b = first_difference(fi, gi[i], fo, go[j])
                    if gi[i].type == go[j].type and gi[i].handle == go[j].handle and gi[i].name == go[j].name:
                        why = f"{describe_short(gi[i])} differs from the input at its tag {a - gi[i].first}"
                    else:
                        why = (f"output group {describe_short(go[j])} is neither the next input group "
                               f"({describe_short(gi[i])}) nor something the tool may add there")
                    self.discrepancy(why, a, b)
                else:
                    self.discrepancy(f"output group {describe_short(go[j])} after the end of the input",
                                     len(fi.tags), go[j].first)
                return
            n, info = r
            unit = go[j:j + n]
            info["groups"] = n
            info["tags"] = unit[-1].last - unit[0].first
            info["handles"] = [u.handle for u in unit if u.handle]
            info["first_group"] = j
            self.inserted_units.append(info)
            self.inserted_groups.extend(unit)
            self.inserted_tags += info["tags"]
            j += n
        if i < len(gi):
            self.discrepancy(f"input group {describe_short(gi[i])} and what follows are not in the output",
                             gi[i].first, len(fo.tags))
            return
        if fi.tail != fo.tail:
            self.problem(f"bytes after EOF differ: input {fi.tail[:40]!r}, output {fo.tail[:40]!r}")

    # ---- what was inserted, checked ----------------------------------------------------
    def check_insertions(self):
        fi, fo = self.fi, self.fo
        modern = fi.acadver >= "AC1012"  # R13 on: owners, subclasses (DXF reference, $ACADVER)
        in_handles = {g.handle for g in self.gi if g.handle}
        out_handles = Counter(g.handle for g in self.go if g.handle)
        ins_handles = [g.handle for g in self.inserted_groups if g.handle]
        for h in ins_handles:
            if h in in_handles:
                self.problem(f"inserted handle {h} is already an input handle")
            if out_handles[h] > 1:
                self.problem(f"handle {h} occurs {out_handles[h]} times in the output")
        if modern:
            missing = [describe_short(g) for g in self.inserted_groups if not g.handle and g.type != "ENDSEC"
                       and g.type != "SECTION"]
            if missing:
                self.problem(f"inserted groups without a handle: {missing[:5]}")

        # $HANDSEED above every handle (DXF reference, HEADER section variables:
        # $HANDSEED is the "next available handle")
        def hexval(s):
            try:
                return int(s, 16)
            except (TypeError, ValueError):
                return None

        seed_in = fi.header_value("$HANDSEED")
        seed_out = fo.header_value("$HANDSEED")
        max_out = max((hexval(h) or 0 for h in out_handles), default=0)
        self.handseed = {"in": seed_in.decode("ascii", "replace") if seed_in else None,
                         "out": seed_out.decode("ascii", "replace") if seed_out else None,
                         "max_handle_out": f"{max_out:X}"}
        if ins_handles:
            so = hexval(self.handseed["out"]) if self.handseed["out"] else None
            if so is None:
                self.problem("the output has handles the tool added but no readable $HANDSEED")
            elif so <= max_out:
                self.problem(f"$HANDSEED {self.handseed['out']} is not above the largest handle {max_out:X}")
            si = hexval(self.handseed["in"]) if self.handseed["in"] else None
            if si is not None and so is not None and so < si:
                self.problem(f"$HANDSEED went down: {self.handseed['in']} -> {self.handseed['out']}")

        # table counts raised by the records inserted
        kinds = {"LAYER": "layer_record", "DIMSTYLE": "dimstyle_record", "BLOCK_RECORD": "block_record"}
        self.table_counts = {}
        for table, kind in kinds.items():
            inserted = sum(1 for u in self.inserted_units if u["kind"] == kind)
            ch = [c for c in self.changed if c["what"] == f"{table} table count"]
            entry = {"inserted_records": inserted}
            if ch:
                entry["in"], entry["out"] = ch[0]["in"], ch[0]["out"]
                try:
                    if int(float(ch[0]["out"])) - int(float(ch[0]["in"])) != inserted:
                        self.problem(f"{table} table count {ch[0]['in']} -> {ch[0]['out']}, "
                                     f"but {inserted} record(s) were inserted")
                except ValueError:
                    self.problem(f"{table} table count unreadable: {ch[0]['out']!r}")
            elif inserted:
                has_count = any(g.type == "TABLE" and (g.name or "").upper() == table and 70 in g.codes
                                for g in self.gi)
                if has_count:
                    self.problem(f"{inserted} {table} record(s) inserted but the table count was not raised")
            self.table_counts[table] = entry

        # where: records just before their table's ENDTAB, blocks and entities
        # just before their section's ENDSEC, a new BLOCKS section just before
        # ENTITIES (README, "What is written"; src/write/mod.rs)
        go, k = self.go, 0
        units = sorted(self.inserted_units, key=lambda u: u.get("first_group", -1))
        units = [u for u in units if "first_group" in u]
        while k < len(units):
            run = [units[k]]
            while k + 1 < len(units) and units[k + 1]["first_group"] == run[-1]["first_group"] + run[-1]["groups"]:
                k += 1
                run.append(units[k])
            k += 1
            after = run[-1]["first_group"] + run[-1]["groups"]
            nxt = go[after] if after < len(go) else None
            for u in run:
                want = {"layer_record": "ENDTAB", "dimstyle_record": "ENDTAB", "block_record": "ENDTAB",
                        "block": "ENDSEC", "entity": "ENDSEC", "blocks_section": "SECTION"}[u["kind"]]
                if nxt is None or nxt.type != want or (want == "SECTION" and nxt.name != "ENTITIES"):
                    self.problem(f"inserted {u['kind']} {u.get('name') or u.get('type')} (output group "
                                 f"{u['first_group']}) is not at the end of its "
                                 f"{'table' if want == 'ENDTAB' else 'section'}: followed by "
                                 f"{describe_short(nxt) if nxt else 'the end of the file'}")
                    break

        # layers of inserted entities exist; DIMENSIONs and *D blocks pair up
        out_layers = {g.name.upper() for g in self.go if g.type == "LAYER" and g.section == "TABLES" and g.name}
        blocks = {u["name"].upper(): u for u in self.inserted_units if u["kind"] == "block"}
        records = {u["name"].upper(): u for u in self.inserted_units if u["kind"] == "block_record"}
        used = Counter()
        out_styles = {x.name.upper() for x in self.go if x.type == "DIMSTYLE" and x.name}
        for g in self.inserted_groups:
            if g.section != "ENTITIES" or g.type in ("SECTION", "ENDSEC"):
                continue
            if g.layer is not None and g.layer.upper() not in out_layers:
                self.problem(f"inserted {g.type} {g.handle} is on layer {g.layer}, which has no LAYER record")
            if g.type == "DIMENSION":
                name = self._value(fo, g, 2)
                if name is None or name.upper() not in blocks:
                    self.problem(f"inserted DIMENSION {g.handle} uses block {name!r}, not one inserted with it")
                else:
                    used[name.upper()] += 1
                style = self._value(fo, g, 3)
                if style is not None and style.upper() not in out_styles:
                    self.problem(f"inserted DIMENSION {g.handle} uses dimension style {style!r}, which does not exist")
        for name in blocks:
            if used[name] != 1:
                self.problem(f"inserted block {name} is used by {used[name]} inserted DIMENSION(s), not 1")
            if modern and name not in records:
                self.problem(f"inserted block {name} has no inserted BLOCK_RECORD")
        for name in records:
            if name not in blocks:
                self.problem(f"inserted BLOCK_RECORD {name} has no inserted block")

        # owners and pointers of inserted groups resolve
        all_out = set(out_handles)
        ms = next((g.handle for g in self.gi if g.type == "BLOCK_RECORD" and (g.name or "").upper() == "*MODEL_SPACE"),
                  None)
        tables = {(g.name or "").upper(): g.handle for g in self.go if g.type == "TABLE"}
        record_of = {g.name.upper(): g.handle for g in self.inserted_groups if g.type == "BLOCK_RECORD" and g.name}
        dangling = []
        for g in self.inserted_groups:
            for t in tags_of(fo, g):
                if t.code == 1001:
                    break
                if is_pointer(t.code):
                    h = fo.text(t).upper()
                    if h not in ("0", "") and h not in all_out:
                        dangling.append(f"{describe_short(g)} {t.code}={h}")
            if not modern:
                continue
            want = None
            if g.section == "ENTITIES" and g.type not in ("SECTION", "ENDSEC"):
                want = ms
            elif g.section == "TABLES" and g.type in ("LAYER", "DIMSTYLE", "BLOCK_RECORD"):
                want = tables.get(g.type)
            elif g.section == "BLOCKS" and g.block:
                want = record_of.get(g.block.upper())
            if want is not None and g.owner != want:
                self.problem(f"inserted {describe_short(g)} is owned by {g.owner}, expected {want}")
        if dangling:
            self.problem(f"inserted groups point to handles that do not exist: {dangling[:5]}")

    @staticmethod
    def _value(f, g, code):
        for t in tags_of(f, g):
            if t.code == 1001:
                break
            if t.code == code:
                return f.text(t)
        return None


def first_difference(fi, gi, fo, go) -> tuple[int, int]:
    """The first tag where two groups differ (tag indices in each file)."""
    a, b = gi.first, go.first
    while a < gi.last and b < go.last and fi.raw(fi.tags[a]) == fo.raw(fo.tags[b]):
        a, b = a + 1, b + 1
    return a, b


def describe(g: Group) -> dict:
    d = {"type": g.type}
    for k in ("name", "handle", "layer", "section", "table", "block"):
        v = getattr(g, k)
        if v is not None:
            d[k] = v
    return d


def describe_short(g: Group) -> str:
    s = g.type
    if g.name and g.type in ("SECTION", "TABLE", "BLOCK", "LAYER", "DIMSTYLE", "BLOCK_RECORD", "STYLE", "LTYPE",
                             "APPID", "UCS", "VIEW", "VPORT"):
        s += f" {g.name}"
    if g.handle:
        s += f" #{g.handle}"
    if g.layer:
        s += f" on {g.layer}"
    return s


# --------------------------------------------------------------------------------------
# What the input holds (counted from its tags)
# --------------------------------------------------------------------------------------

OBJECT_FEATURES = ("ACAD_PROXY_OBJECT", "XRECORD", "DICTIONARY", "GROUP", "LAYOUT", "IMAGEDEF", "PDFDEFINITION",
                   "MLEADERSTYLE", "DICTIONARYVAR", "IMAGEDEF_REACTOR")
ENTITY_FEATURES = ("HATCH", "MULTILEADER", "ACAD_PROXY_ENTITY", "IMAGE", "PDFUNDERLAY", "VIEWPORT", "DIMENSION",
                   "INSERT", "ATTRIB", "ATTDEF", "MTEXT", "TEXT", "POLYLINE", "VERTEX", "LWPOLYLINE")


def contents(f: DxfTags, groups: list[Group]) -> dict:
    counts = Counter()
    entities, objects, table_entries = Counter(), Counter(), Counter()
    features = Counter()
    xdata_types = Counter()
    for g in groups:
        sec, typ = g.section, g.type
        if typ in ("SECTION", "ENDSEC", "EOF", "(prelude)"):
            continue
        if sec == "HEADER":
            continue
        if sec == "CLASSES":
            counts["classes"] += 1
        elif sec == "TABLES":
            if typ == "TABLE":
                counts["tables"] += 1
            elif typ != "ENDTAB":
                counts["table_entries"] += 1
                table_entries[typ] += 1
        elif sec == "BLOCKS":
            if typ == "BLOCK":
                counts["blocks"] += 1
            elif typ != "ENDBLK":
                counts["block_entities"] += 1
                entities[typ] += 1
                if (g.block or "").upper().startswith("*PAPER_SPACE"):
                    features["paper_space_entities"] += 1
        elif sec == "ENTITIES":
            counts["entities"] += 1
            entities[typ] += 1
        elif sec == "OBJECTS":
            counts["objects"] += 1
            objects[typ] += 1
        else:
            counts["other_groups"] += 1
        if g.handle:
            counts["handles"] += 1
        # features, from the tags
        if 1001 in g.codes:
            features["xdata_groups"] += 1
            xdata_types[typ] += 1
        tags = tags_of(f, g)
        for t in tags:
            kind = value_kind(t.code)
            if t.code == 102 and f.text(t) == "{ACAD_XDICTIONARY":
                features["extension_dictionaries"] += 1
            if kind == "text" and t.code != 0:
                b = f.vbytes(t)
                if any(c >= 0x80 for c in b):
                    features["non_ascii_values"] += 1
                if b"\\U+" in b or b"\\u+" in b:
                    features["unicode_escapes"] += 1
        if sec in ("ENTITIES", "BLOCKS") and typ not in ("BLOCK", "ENDBLK"):
            if 420 in g.codes:
                features["true_color_entities"] += 1
            if 440 in g.codes:
                features["transparent_entities"] += 1
            if 370 in g.codes:
                features["lineweight_entities"] += 1
            if sec == "ENTITIES" and any(t.code == 67 and f.number(t) == 1 for t in tags):
                features["paper_space_entities"] += 1
        if typ == "HATCH":
            solid = next((f.number(t) for t in tags if t.code == 70), None)
            paths = next((f.number(t) for t in tags if t.code == 91), 0) or 0
            gradient = any(t.code == 450 and f.number(t) == 1 for t in tags)
            key = "hatch_gradient" if gradient else ("hatch_solid" if solid == 1 else "hatch_pattern")
            features[key] += 1
            if paths > 1:
                features["hatch_with_holes"] += 1
        if typ == "LAYER" and sec == "TABLES":
            flags = next((f.number(t) for t in tags if t.code == 70), 0) or 0
            colour = next((f.number(t) for t in tags if t.code == 62), 7) or 7
            if flags & 1:
                features["layers_frozen"] += 1
            if flags & 4:
                features["layers_locked"] += 1
            if colour < 0:
                features["layers_off"] += 1
            if any(t.code == 290 and f.number(t) == 0 for t in tags):
                features["layers_plot_off"] += 1
            if 420 in g.codes:
                features["layers_true_color"] += 1
            if any(t.code == 1001 and f.text(t) == "AcCmTransparency" for t in tags):
                features["layers_transparency"] += 1
        if typ in ENTITY_FEATURES and sec in ("ENTITIES", "BLOCKS"):
            features[typ] += 1
        if typ in OBJECT_FEATURES and sec == "OBJECTS":
            features[typ] += 1
    return {"counts": dict(sorted(counts.items())), "entities": dict(sorted(entities.items())),
            "objects": dict(sorted(objects.items())), "table_entries": dict(sorted(table_entries.items())),
            "features": dict(sorted(features.items())), "xdata_on": dict(sorted(xdata_types.items()))}


def ezdxf_tag_count(path: str) -> int | None:
    """The number of tags ezdxf's own low-level loader finds, as a cross-check of our reader."""
    try:
        from ezdxf.lldxf.tagger import ascii_tags_loader, binary_tags_loader
        from ezdxf.lldxf.validator import is_binary_dxf_file
    except ImportError:
        return None
    if is_binary_dxf_file(path):
        with open(path, "rb") as fp:
            return sum(1 for _ in binary_tags_loader(fp.read()))
    with open(path, encoding="latin-1", newline=None) as fp:
        return sum(1 for _ in ascii_tags_loader(fp, skip_comments=False))


# --------------------------------------------------------------------------------------


def check(input_path: str, output_path: str, prefix: str, *, crosscheck: bool = True,
          parsed_input: DxfTags | None = None) -> dict:
    """The whole check. `crosscheck`: also count the tags with ezdxf's reader;
    `parsed_input`: the input already read (for callers that check many outputs
    of one input)."""
    rep: dict = {"input": input_path, "output": output_path, "tool_layer_prefix": prefix}
    fi = parsed_input if parsed_input is not None else DxfTags(input_path)
    rep["format"] = "binary" if fi.binary else "ascii"
    rep["acadver"] = fi.acadver
    rep["encoding"] = fi.encoding
    if fi.binary:
        rep["group_code_bytes"] = 2 if fi.wide_codes else 1
    else:
        rep["line_ends"] = {("crlf" if k == b"\r\n" else "lf"): v for k, v in fi.line_ends.items()}
    if not os.path.isfile(output_path):
        rep.update({"ok": False, "problems": ["the output does not exist"]})
        return rep
    fo = DxfTags(output_path)
    c = Check(fi, fo, prefix)
    c.run()
    if not c.problems:
        c.check_insertions()
    else:
        c.handseed, c.table_counts = None, None
    what = contents(fi, c.gi)
    inserted_entities = Counter(u["type"] for u in c.inserted_units if u["kind"] == "entity")
    inserted_layers = Counter(u["layer"] for u in c.inserted_units if u["kind"] == "entity")
    rep["counts"] = {
        "input_bytes": len(fi.data),
        "output_bytes": len(fo.data),
        "input_tags": len(fi.tags),
        "output_tags": len(fo.tags),
        "tags_compared": c.matched_tags + len(c.changed),
        "matched_tags": c.matched_tags,
        "inserted_tags": c.inserted_tags,
        "changed_values": len(c.changed),
        "input_groups": len(c.gi),
        "output_groups": len(c.go),
        "inserted_groups": len(c.inserted_groups),
        "header_variables": sum(1 for t in fi.tags if t.code == 9),
        **what["counts"],
    }
    rep["input_contents"] = {k: what[k] for k in ("entities", "objects", "table_entries", "xdata_on")}
    rep["features"] = what["features"]
    rep["inserted"] = {
        "entities": dict(sorted(inserted_entities.items())),
        "entity_layers": dict(sorted(inserted_layers.items())),
        "layer_records": [u["name"] for u in c.inserted_units if u["kind"] == "layer_record"],
        "dimstyle_records": [u["name"] for u in c.inserted_units if u["kind"] == "dimstyle_record"],
        "block_records": [u["name"] for u in c.inserted_units if u["kind"] == "block_record"],
        "blocks": [{k: u[k] for k in ("name", "entities", "types", "layers")}
                   for u in c.inserted_units if u["kind"] == "block"],
        "header_variables": [u["name"] for u in c.inserted_units if u["kind"] == "header_variable"],
        "sections": [u["kind"] for u in c.inserted_units if u["kind"] == "blocks_section"],
    }
    rep["changed"] = c.changed
    rep["handseed"] = c.handseed
    rep["table_counts"] = c.table_counts
    rep["first_discrepancy"] = c.first_discrepancy
    counted = {"input": None, "output": None}
    for key, path in (("input", input_path), ("output", output_path)) if crosscheck else ():
        try:
            counted[key] = ezdxf_tag_count(path)
        except Exception as e:  # noqa: BLE001 - ezdxf's reader failing on a file is a finding
            counted[key] = None
            c.problem(f"ezdxf's tag reader failed on the {key}: {type(e).__name__}: {e}")
    n_in, n_out = counted["input"], counted["output"]
    agrees = None if n_in is None or n_out is None else (n_in == len(fi.tags) and n_out == len(fo.tags))
    rep["ezdxf_tag_count"] = {"input": n_in, "output": n_out, "agrees": agrees}
    if agrees is False:
        c.problem(f"our tag reader and ezdxf's disagree: {len(fi.tags)}/{len(fo.tags)} vs {n_in}/{n_out}")
    if not fi.tags or fi.text(fi.tags[-1]) != "EOF":
        c.problem("the input does not end with (0, EOF): the comparison may be incomplete")
    if fi.tail:
        c.problem(f"the input has {len(fi.tail)} byte(s) after (0, EOF)")
    rep["problems"] = c.problems
    rep["ok"] = not c.problems
    return rep


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description="Tag-level round-trip check of a hangline output against its input; "
                                             "prints one JSON object.")
    ap.add_argument("input", help="the drawing given to hangline")
    ap.add_argument("output", help="the drawing hangline wrote")
    ap.add_argument("--tool-layer-prefix", default="HANGLINE-", help="prefix of the tool's layers (default HANGLINE-)")
    ap.add_argument("--no-ezdxf", action="store_true",
                    help="skip counting the tags with ezdxf's reader as well (then ezdxf is not needed)")
    a = ap.parse_args(argv)
    if not os.path.isfile(a.input):
        ap.error(f"INPUT {a.input!r} is not a file")
    try:
        rep = check(a.input, a.output, a.tool_layer_prefix, crosscheck=not a.no_ezdxf)
    except Exception as e:  # noqa: BLE001 - a crash of the checker is reported, never silent
        import traceback

        rep = {"input": a.input, "output": a.output, "checker_error": traceback.format_exc(),
               "problems": [f"roundtrip_check.py crashed: {type(e).__name__}: {e}"], "ok": False}
    sys.stdout.write(json.dumps(rep, indent=1, ensure_ascii=True) + "\n")
    return 0


if __name__ == "__main__":
    sys.exit(main())
