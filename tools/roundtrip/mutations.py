#!/usr/bin/env python3
"""Shows that tests/outside/roundtrip_check.py can fail: damages a copy of a
hangline output in the ways a writer could go wrong and runs the check on
each copy.

    python tools/roundtrip/mutations.py INPUT.dxf OUTPUT.dxf

OUTPUT must be what hangline wrote for INPUT (and pass the check: the first
case, "unchanged", says so). Prints one JSON object:
{"cases": [{"name", "what", "ok", "problem"}], "unchanged_ok", "all_caught"}
and exits 0; the caller decides. A damaged copy is "caught" when the check
reports ok = false. Cases that need handles, or a feature the drawing lacks,
are left out for a drawing without them.
"""

from __future__ import annotations

import json
import struct
import sys
import tempfile
from pathlib import Path

sys.dont_write_bytecode = True
HERE = Path(__file__).resolve().parent
sys.path.insert(0, str(HERE.parents[1] / "tests" / "outside"))

import roundtrip_check as rc  # noqa: E402


class Output:
    def __init__(self, path: str, input_path: str):
        self.f = rc.DxfTags(path)
        self.groups = rc.groups_of(self.f)
        inp = rc.DxfTags(input_path)
        self.input = inp
        self.input_seed = inp.header_value("$HANDSEED")
        self.input_handles = {g.handle for g in rc.groups_of(inp) if g.handle}
        self.input_layers = {g.name for g in rc.groups_of(inp) if g.type == "LAYER" and g.name}

    # ---- finding things ----------------------------------------------------------------
    def select(self, pred):
        return [g for g in self.groups if pred(g)]

    def user_entities(self):
        return self.select(lambda g: g.section == "ENTITIES" and g.type not in ("SECTION", "ENDSEC")
                           and not (g.layer or "").upper().startswith("HANGLINE-"))

    def tool_entities(self):
        return self.select(lambda g: g.section == "ENTITIES" and (g.layer or "").upper().startswith("HANGLINE-"))

    def tag(self, g, code):
        for t in rc.tags_of(self.f, g):
            if t.code == code:
                return t
        return None

    def span(self, g):
        return self.f.tags[g.first].start, self.f.tags[g.last - 1].end

    # ---- edits (each returns new bytes) -------------------------------------------------
    def remove(self, a, b):
        d = self.f.data
        return d[:a] + d[b:]

    def set_value(self, t, value: bytes):
        d = self.f.data
        return d[:t.vstart] + value + d[t.vend:]

    def set_text(self, t, s: str):
        return self.set_value(t, s.encode(self.f.encoding))

    def set_int(self, t, n: int):
        if not self.f.binary:
            return self.set_value(t, str(n).encode())
        fmt = {"int16": "<h", "int32": "<i"}[rc.value_kind(t.code)]
        return self.set_value(t, struct.pack(fmt, n))


def cases(o: Output):
    f = o.f
    d = f.data
    user = o.user_entities()
    tool = o.tool_entities()
    circle = next(g for g in user if g.type == "CIRCLE")
    yield "unchanged", "the output as hangline wrote it (must pass)", d

    a, b = o.span(circle)
    yield "entity_dropped", f"an input CIRCLE (#{circle.handle}) left out", o.remove(a, b)

    xg = next((g for g in user if 1001 in g.codes and g.type == "TEXT"), None)
    if xg is not None:
        first_x = next(t for t in rc.tags_of(f, xg) if t.code == 1001)
        yield "xdata_dropped", f"the XDATA of TEXT #{xg.handle} left out", \
            o.remove(first_x.start, f.tags[xg.last - 1].end)

    t10 = o.tag(circle, 10)
    if f.binary:
        v = bytearray(d[t10.vstart:t10.vend])
        v[0] ^= 1  # the last bit of the mantissa: 1 ulp
        yield "double_1ulp", "an input coordinate changed by one unit in the last place", o.set_value(t10, bytes(v))
    else:
        yield "value_whitespace", "a space added after an input coordinate", \
            o.set_value(t10, d[t10.vstart:t10.vend] + b" ")
        t8 = o.tag(circle, 8)
        line = d[t8.start:t8.vstart]
        other = line.lstrip(b" ") if line.startswith(b" ") else b"  " + line
        yield "code_line_format", f"an input group code line rewritten ({other!r} for {line!r})", \
            d[:t8.start] + other + d[t8.vstart:]

    if circle.handle:
        yield "handle_changed", "an input handle changed", o.set_text(o.tag(circle, 5), "FFFFF")

    i1, i2 = user[3], user[4]
    (a1, b1), (a2, b2) = o.span(i1), o.span(i2)
    yield "entities_swapped", "two input entities in swapped order", d[:a1] + d[a2:b2] + d[a1:b1] + d[b2:]

    t = o.tag(tool[0], 8)
    yield "inserted_on_user_layer", f"an inserted {tool[0].type} moved to layer ANNOT", o.set_text(t, "ANNOT")

    sec = next(g for g in o.groups if g.type == "SECTION" and g.name == "ENTITIES")
    after_head = f.tags[sec.last - 1].end
    a, b = o.span(tool[-1])
    if tool[-1].type not in rc.SUB_ENTITIES:
        yield "inserted_entity_moved", f"an inserted {tool[-1].type} moved to the start of ENTITIES", \
            d[:after_head] + d[a:b] + d[after_head:a] + d[b:]

    layer_table = next(g for g in o.groups if g.type == "TABLE" and g.name == "LAYER")
    t70 = o.tag(layer_table, 70)
    yield "table_count_wrong", "the LAYER table count one too high", \
        o.set_int(t70, int(f.number(t70)) + 1)

    if o.input_handles:
        header = o.groups[0]
        tags = rc.tags_of(f, header)
        k = next(k for k, t in enumerate(tags) if t.code == 9 and f.text(t) == "$HANDSEED")
        yield "handseed_low", "$HANDSEED left at the input's value", \
            o.set_text(tags[k + 1], (o.input_seed or b"1").decode("ascii"))
        victim = next(h for h in sorted(o.input_handles) if h)
        yield "handle_reused", f"an inserted entity given the input handle {victim}", \
            o.set_text(o.tag(tool[0], 5), victim)

    obj = next((g for g in o.groups if g.section == "OBJECTS" and g.type in ("ACAD_PROXY_OBJECT", "XRECORD")), None)
    if obj is not None:
        a, b = o.span(obj)
        yield "object_dropped", f"the input {obj.type} #{obj.handle} left out", o.remove(a, b)

    dim = next((g for g in tool if g.type == "DIMENSION"), None)
    if dim is not None:
        yield "dimension_block_renamed", "an inserted DIMENSION pointing to a block that does not exist", \
            o.set_text(o.tag(dim, 2), "*D999")

    rec = next(g for g in o.groups if g.type == "LAYER" and g.section == "TABLES" and g.name in o.input_layers
               and g.name not in ("0",))
    yield "layer_renamed", f"the input layer {rec.name} renamed", o.set_text(o.tag(rec, 2), rec.name + "X")

    yield "tail_added", "bytes after EOF", d + b"\x1a"


def main(argv=None) -> int:
    argv = sys.argv[1:] if argv is None else argv
    if len(argv) != 2:
        print(__doc__, file=sys.stderr)
        return 2
    inp, out = argv
    o = Output(out, inp)
    results = []
    with tempfile.TemporaryDirectory() as tmp:
        for k, (name, what, data) in enumerate(cases(o)):
            p = Path(tmp) / f"{k:02d}-{name}.dxf"
            p.write_bytes(data)
            try:
                # the input is read once; ezdxf's count of the tags is left out (the
                # damaged copies are ours, and the undamaged one is counted by the caller)
                r = rc.check(inp, str(p), "HANGLINE-", crosscheck=False, parsed_input=o.input)
                ok, problem = r["ok"], (r["problems"] or [None])[0]
            except Exception as e:  # noqa: BLE001 - a damaged file may stop the reader: caught too
                ok, problem = False, f"reader stopped: {type(e).__name__}: {e}"
            results.append({"name": name, "what": what, "ok": ok, "problem": problem})
    unchanged = results[0]["ok"]
    caught = all(not r["ok"] for r in results[1:])
    print(json.dumps({"input": inp, "output": out, "cases": results, "unchanged_ok": unchanged,
                      "all_caught": caught}, indent=1, ensure_ascii=True))
    return 0


if __name__ == "__main__":
    sys.exit(main())
