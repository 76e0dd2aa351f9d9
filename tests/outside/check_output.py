#!/usr/bin/env python3
"""Outside-reader check of a drawing hangline wrote: does ezdxf read it, and is
everything of the input still there? See README.md beside this file.

    python tests/outside/check_output.py INPUT.dxf OUTPUT.dxf
        [--tool-layer-prefix HANGLINE-] [--header-may-change VAR ...]

Prints ONE JSON object on stdout and exits 0 whenever it could run, whatever it
found (the caller decides pass or fail; "problems" lists the findings, "clean"
is true when there are none). Exits 2 on usage errors (bad arguments, INPUT
not a file). A missing or unreadable OUTPUT is a finding, not a usage error.
"""

from __future__ import annotations

import argparse
import json
import os
import sys
from collections import Counter

sys.dont_write_bytecode = True

import dxfinfo  # noqa: E402
from dxfinfo import js  # noqa: E402

# Header variables the tool may change: $HANDSEED (new handles for the added
# entities). Anything else the tool is documented to change goes here, or is
# passed with --header-may-change.
HEADER_MAY_CHANGE = ["$HANDSEED"]

DIM_KINDS = {0: "linear", 1: "aligned", 2: "angular", 3: "diameter", 4: "radius", 5: "angular3p", 6: "ordinate"}


def is_tool_layer(name: str, prefix: str) -> bool:
    return str(name).upper().startswith(prefix.upper())


# --------------------------------------------------------------------------------------


def compare_inventories(inv_in: dict, inv_out: dict, prefix: str):
    s_in, s_out = dxfinfo.spaces(inv_in), dxfinfo.spaces(inv_out)
    missing, added = [], []
    for space, content in s_in.items():
        out_flat = dxfinfo.flat(s_out.get(space, {}))
        for (t, layer), n in sorted(dxfinfo.flat(content).items()):
            if is_tool_layer(layer, prefix):
                continue
            m = out_flat.get((t, layer), 0)
            if m < n:
                missing.append({"space": space, "type": t, "layer": layer, "in": n, "out": m})
    for space, content in s_out.items():
        if space not in s_in:
            continue
        in_flat = dxfinfo.flat(s_in[space])
        for (t, layer), m in sorted(dxfinfo.flat(content).items()):
            if is_tool_layer(layer, prefix):
                continue
            n = in_flat.get((t, layer), 0)
            if m > n:
                added.append({"space": space, "type": t, "layer": layer, "in": n, "out": m})
    new_spaces = sorted(set(s_out) - set(s_in))
    return missing, added, new_spaces


def compare_handles(raw: set | None, doc_in, doc_out):
    map_in = dxfinfo.handle_map(doc_in, raw)
    map_out = dxfinfo.handle_map(doc_out)
    checked = Counter(cat for cat, _, _ in map_in.values())
    lost, changed = [], []
    for h, (cat, t, layer) in sorted(map_in.items(), key=lambda kv: (kv[1][0], int(kv[0], 16) if _hex(kv[0]) else 0)):
        o = map_out.get(h)
        if o is None:
            lost.append({"handle": h, "category": cat, "type": t, "layer": layer})
        elif o[1] != t or (o[2] or "").upper() != (layer or "").upper():
            changed.append({"handle": h, "category": cat, "in": {"type": t, "layer": layer},
                            "out": {"type": o[1], "layer": o[2]}})
    ent_ok = not any(x["category"] == "entity" for x in lost + changed)
    obj_ok = not any(x["category"] != "entity" for x in lost + changed)
    return {
        "handles_kept": ent_ok,
        "object_handles_kept": obj_ok,
        "handles": {
            "restricted_to_handles_in_file": raw is not None,
            "checked": dict(sorted(checked.items())),
            "lost": lost,
            "changed": changed,
        },
    }


def _hex(s: str) -> bool:
    try:
        int(s, 16)
        return True
    except ValueError:
        return False


def invented_pointer(attr: str, value, handles_in: set | None) -> bool:
    """A pointer attribute (owner, *_handle) whose value is no handle of the input
    file: ezdxf made it up while loading (R12 files have no owners, materials or
    plot styles), and made up another for the output, so it is not compared."""
    if handles_in is None or not (attr == "owner" or attr.endswith("_handle")):
        return False
    return str(value or "").upper() not in handles_in


def compare_tables(doc_in, doc_out, handles_in: set | None):
    """Every table entry and block of the input, with the same attributes, in the output.

    Entries ezdxf invented while loading the input (handle not in the file) are skipped."""
    t_in, t_out = dxfinfo.table_snapshot(doc_in), dxfinfo.table_snapshot(doc_out)
    diffs = []
    for table, entries in t_in.items():
        out_entries = t_out.get(table, {})
        for key, attribs in entries.items():
            name = attribs.get("name", key)
            h = str(attribs.get("handle", "")).upper()
            if handles_in is not None and h and h not in handles_in:
                continue
            o = out_entries.get(key)
            if o is None:
                diffs.append({"table": table, "name": name, "missing": True})
                continue
            for attr in sorted(set(attribs) | set(o)):
                if invented_pointer(attr, attribs.get(attr), handles_in):
                    continue
                if attribs.get(attr) != o.get(attr):
                    diffs.append({"table": table, "name": name, "attribute": attr,
                                  "in": attribs.get(attr), "out": o.get(attr)})
    return t_in, t_out, diffs


def compare_header(raw_in: dict, raw_out: dict, may_change):
    """Compares the HEADER variables as written in the two files (typed values)."""
    h_in, h_out = raw_in.get("header") or {}, raw_out.get("header") or {}
    may = {v.upper() for v in may_change}
    diffs, ignored = [], {}
    for var, v in h_in.items():
        o = h_out.get(var)
        if var.upper() in may:
            ignored[var] = {"in": _hv(v), "out": _hv(o)}
            continue
        if o is None:
            diffs.append({"var": var, "in": _hv(v), "out": None, "absent": True})
        elif v != o:
            diffs.append({"var": var, "in": _hv(v), "out": _hv(o)})
    return diffs, ignored


def _hv(v):
    """A header value for the report: the single value, or the list of values of a point."""
    if v is None:
        return None
    vals = [x[1] for x in v]
    return vals[0] if len(vals) == 1 else vals


# --------------------------------------------------------------------------------------


def _xy(p):
    return [js(float(p[0])), js(float(p[1]))]


def entity_detail(doc, e, space):
    t = e.dxftype()
    d = {"handle": e.dxf.get("handle"), "type": t, "space": space}
    try:
        if t == "LWPOLYLINE":
            d["closed"] = bool(e.closed)
            d["vertices"] = [_xy(p) for p in e.get_points("xy")]
        elif t == "POLYLINE":
            d["closed"] = bool(e.is_closed)
            d["vertices"] = [_xy(v.dxf.location) for v in e.vertices]
        elif t == "LINE":
            d["start"], d["end"] = _xy(e.dxf.start), _xy(e.dxf.end)
        elif t in ("TEXT", "ATTRIB"):
            d["text"] = e.dxf.text
            d["plain"] = e.plain_text()
            d["at"] = _xy(e.dxf.insert)
            if e.dxf.hasattr("align_point"):
                d["align_point"] = _xy(e.dxf.align_point)
            d["height"] = js(e.dxf.height)
            d["rotation"] = js(e.dxf.get("rotation", 0.0))
        elif t == "MTEXT":
            d["text"] = e.text
            d["plain"] = e.plain_text()
            d["at"] = _xy(e.dxf.insert)
            d["height"] = js(e.dxf.get("char_height", 0.0))
        elif t == "DIMENSION":
            d.update(dimension_detail(doc, e))
        elif t == "INSERT":
            d["block"] = e.dxf.name
            d["at"] = _xy(e.dxf.insert)
            d["rotation"] = js(e.dxf.get("rotation", 0.0))
            d["attribs"] = {a.dxf.tag: a.dxf.text for a in e.attribs}
        elif t in ("CIRCLE", "ARC"):
            d["center"], d["radius"] = _xy(e.dxf.center), js(e.dxf.radius)
        elif t == "POINT":
            d["at"] = _xy(e.dxf.location)
    except Exception as ex:  # noqa: BLE001
        d["detail_error"] = f"{type(ex).__name__}: {ex}"
    return d


def dimension_detail(doc, e):
    d = {}
    dimtype = e.dxf.get("dimtype", 0)
    d["dimtype"] = dimtype
    d["kind"] = DIM_KINDS.get(dimtype & 7, str(dimtype & 7))
    d["text"] = e.dxf.get("text", "")
    d["dimstyle"] = e.dxf.get("dimstyle", "")
    d["dimstyle_exists"] = d["dimstyle"] in doc.dimstyles
    for attr in ("defpoint", "defpoint2", "defpoint3", "defpoint4", "text_midpoint"):
        if e.dxf.hasattr(attr):
            d[attr] = _xy(e.dxf.get(attr))
    try:
        d["measurement"] = js(e.get_measurement())
    except Exception as ex:  # noqa: BLE001
        d["measurement"] = None
        d["measurement_error"] = f"{type(ex).__name__}: {ex}"
    name = e.dxf.get("geometry")
    d["geometry_block"] = name
    blk = doc.blocks.get(name) if name else None
    d["block_exists"] = blk is not None
    if blk is not None:
        ents = list(blk)
        d["block_entities"] = len(ents)
        d["block_entity_types"] = dict(sorted(Counter(x.dxftype() for x in ents).items()))
        texts = []
        for x in ents:
            if x.dxftype() == "MTEXT":
                texts.append(x.plain_text())
            elif x.dxftype() == "TEXT":
                texts.append(x.dxf.text)
        d["block_texts"] = texts
    return d


def tool_layers(doc, prefix):
    table = {layer.dxf.name.upper(): layer for layer in doc.layers}
    per: dict = {}

    def record(name):
        key = name
        if key not in per:
            lay = table.get(name.upper())
            per[key] = {
                "in_layer_table": lay is not None,
                "layer": None if lay is None else {
                    "color": lay.dxf.get("color"),
                    "linetype": lay.dxf.get("linetype"),
                    "lineweight": lay.dxf.get("lineweight"),
                    "flags": lay.dxf.get("flags"),
                },
                "counts": {},
                "polylines": [],
                "lines": [],
                "texts": [],
                "dimensions": [],
                "inserts": [],
                "other": [],
            }
        return per[key]

    for name, lay in sorted(table.items()):
        if is_tool_layer(lay.dxf.name, prefix):
            record(lay.dxf.name)

    layouts = [("model", doc.modelspace())]
    layouts += [(f"paper:{n}", lay) for n, lay in dxfinfo.paper_layouts(doc)]
    layouts += [(f"block:{n}", blk) for n, blk in dxfinfo.block_definitions(doc)]
    for space, layout in layouts:
        for e in dxfinfo._with_subentities(layout):
            lname = e.dxf.get("layer", "0")
            if not is_tool_layer(lname, prefix):
                continue
            # the layer table is case-insensitive: file entities under the table's spelling
            lay = table.get(lname.upper())
            r = record(lay.dxf.name if lay is not None else lname)
            t = e.dxftype()
            counts = r["counts"].setdefault(space, {})
            counts[t] = counts.get(t, 0) + 1
            det = entity_detail(doc, e, space)
            if t in ("LWPOLYLINE", "POLYLINE"):
                r["polylines"].append(det)
            elif t == "LINE":
                r["lines"].append(det)
            elif t in ("TEXT", "MTEXT", "ATTRIB"):
                r["texts"].append(det)
            elif t == "DIMENSION":
                r["dimensions"].append(det)
            elif t == "INSERT":
                r["inserts"].append(det)
            else:
                r["other"].append(det)
    for r in per.values():
        r["counts"] = {s: dict(sorted(c.items())) for s, c in sorted(r["counts"].items())}
    return dict(sorted(per.items()))


def undefined_layers(doc) -> list[str]:
    table = {layer.dxf.name.upper() for layer in doc.layers}
    used = set()
    layouts = [doc.modelspace()] + [lay for _, lay in dxfinfo.paper_layouts(doc)]
    layouts += [blk for _, blk in dxfinfo.block_definitions(doc)]
    for layout in layouts:
        for e in dxfinfo._with_subentities(layout):
            used.add(e.dxf.get("layer", "0"))
    return sorted(n for n in used if n.upper() not in table)


# --------------------------------------------------------------------------------------


def check(path_in: str, path_out: str, prefix: str, may_change: list[str]) -> dict:
    rep: dict = {
        "input": path_in,
        "output": path_out,
        "tool_layer_prefix": prefix,
        "header_may_change": may_change,
    }
    rin = dxfinfo.load(path_in)
    if os.path.isfile(path_out):
        rout = dxfinfo.load(path_out)
    else:
        rout = {"doc": None, "loaded": False, "load_error": "output file does not exist",
                "load_warnings": [], "recover": None}
    doc_in, doc_out = rin["doc"], rout["doc"]
    rep.update(
        {
            "input_loaded": rin["loaded"],
            "input_load_error": rin["load_error"],
            "loaded": rout["loaded"],
            "load_error": rout["load_error"],
            "load_warnings": rout["load_warnings"],
            "recover": rout["recover"],
            "analysed": "strict" if rout["loaded"] else ("recovered" if doc_out is not None else "none"),
            "binary": {
                "input": _is_binary(path_in),
                "output": _is_binary(path_out) if os.path.isfile(path_out) else None,
            },
            "versions": {
                "input": None if doc_in is None else doc_in.dxfversion,
                "output": None if doc_out is None else doc_out.dxfversion,
            },
        }
    )
    problems = []
    if not rin["loaded"]:
        problems.append(f"input not readable by ezdxf: {rin['load_error']}")
    if not rout["loaded"]:
        problems.append(f"output not readable by ezdxf.readfile: {rout['load_error']}")
        if doc_out is not None:
            problems.append("output readable only by ezdxf.recover")

    if doc_in is not None and doc_out is not None and rin["loaded"]:
        if doc_in.dxfversion != doc_out.dxfversion:
            problems.append(f"DXF version changed: {doc_in.dxfversion} -> {doc_out.dxfversion}")
        inv_in, inv_out = dxfinfo.inventory(doc_in), dxfinfo.inventory(doc_out)
        missing, added, new_spaces = compare_inventories(inv_in, inv_out, prefix)
        rep["inventory_in"], rep["inventory_out"] = inv_in, inv_out
        rep["missing"] = missing
        rep["added_outside_tool_layers"] = added
        rep["new_spaces"] = new_spaces
        for m in missing:
            problems.append(f"missing in {m['space']}: {m['type']} on {m['layer']} ({m['in']} -> {m['out']})")

        raw_in, raw_out = dxfinfo.raw_scan(path_in), dxfinfo.raw_scan(path_out)
        rep["raw_scan_errors"] = {"input": raw_in["error"], "output": raw_out["error"]}
        if raw_out["error"]:
            problems.append(f"output not scannable as DXF tags: {raw_out['error']}")
        rep.update(compare_handles(raw_in["handles"], doc_in, doc_out))
        for x in rep["handles"]["lost"]:
            problems.append(f"lost handle {x['handle']} ({x['category']} {x['type']} on {x['layer']})")
        for x in rep["handles"]["changed"]:
            problems.append(f"handle {x['handle']} changed from {x['in']} to {x['out']}")

        t_in, t_out, tdiffs = compare_tables(doc_in, doc_out, raw_in["handles"])
        rep["tables_kept"] = not tdiffs
        rep["table_differences"] = tdiffs
        for dd in tdiffs:
            what = "missing" if dd.get("missing") else f"{dd['attribute']} {dd['in']!r} -> {dd['out']!r}"
            problems.append(f"table {dd['table']} entry {dd['name']}: {what}")
        in_layers = set(t_in.get("layers", {}))
        rep["new_layers"] = sorted(a["name"] for k, a in t_out.get("layers", {}).items() if k not in in_layers)
        rep["new_blocks"] = sorted(a["name"] for k, a in t_out.get("blocks", {}).items() if k not in t_in.get("blocks", {}))
        non_tool = [n for n in rep["new_layers"] if not is_tool_layer(n, prefix)]
        rep["new_layers_without_prefix"] = non_tool
        for n in non_tool:
            problems.append(f"new layer {n} does not carry the tool prefix {prefix}")

        hdiffs, hignored = compare_header(raw_in, raw_out, may_change)
        rep["header_kept"] = not hdiffs
        rep["header_differences"] = hdiffs
        rep["header_ignored"] = hignored
        for dd in hdiffs:
            problems.append(f"header {dd['var']} changed: {dd['in']!r} -> {dd['out']!r}")

        und_in, und_out = set(undefined_layers(doc_in)), undefined_layers(doc_out)
        rep["undefined_layers_in"] = sorted(und_in)
        rep["undefined_layers_out"] = und_out
        for n in und_out:
            if n not in und_in:
                problems.append(f"entities on layer {n}, which has no layer table entry")

    if doc_out is not None:
        rep["tool_layers"] = tool_layers(doc_out, prefix)
        for lname, r in rep["tool_layers"].items():
            for dim in r["dimensions"]:
                if not dim.get("block_exists"):
                    problems.append(f"dimension {dim['handle']} on {lname}: geometry block {dim.get('geometry_block')!r} missing")
        if doc_in is None or not rin["loaded"]:
            rep["new_layers"] = [n for n in rep["tool_layers"]]

    # the Auditor may change a document: run it last
    if doc_out is not None and rout["loaded"]:
        rep["audit"] = dxfinfo.run_audit(doc_out)
    elif doc_out is not None:
        rep["audit"] = rout["recover"]["audit"]
    else:
        rep["audit"] = None
    rep["audit_errors"] = len(rep["audit"]["errors"]) if rep["audit"] else 0
    rep["audit_fixes"] = len(rep["audit"]["fixes"]) if rep["audit"] else 0
    if doc_in is not None and rin["loaded"]:
        a_in = dxfinfo.run_audit(doc_in)
        rep["audit_input"] = {"errors": len(a_in["errors"]), "fixes": len(a_in["fixes"]),
                              "error_codes": sorted({e["code_name"] for e in a_in["errors"]})}
        if rep["audit"]:
            c_in = Counter(e["code"] for e in a_in["errors"])
            c_out = Counter(e["code"] for e in rep["audit"]["errors"])
            for code, n in sorted(c_out.items()):
                if n > c_in.get(code, 0):
                    problems.append(f"audit: {n - c_in.get(code, 0)} more error(s) of code {code} "
                                    f"({dxfinfo._code_name(code)}) in the output than in the input")
    elif rep["audit_errors"]:
        problems.append(f"audit: {rep['audit_errors']} error(s) in the output")

    # every key is always present; null where it could not be computed
    for key in ("inventory_in", "inventory_out", "missing", "added_outside_tool_layers", "new_spaces",
                "raw_scan_errors", "handles_kept", "object_handles_kept", "handles", "tables_kept",
                "table_differences", "new_layers", "new_blocks", "new_layers_without_prefix", "header_kept",
                "header_differences", "header_ignored", "undefined_layers_in", "undefined_layers_out",
                "tool_layers", "audit_input"):
        rep.setdefault(key, None)
    rep["problems"] = problems
    rep["clean"] = not problems
    return rep


def _is_binary(path):
    try:
        return dxfinfo.is_binary_dxf_file(path)
    except Exception:  # noqa: BLE001
        return None


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(
        description="Check a hangline output drawing against its input with ezdxf; prints one JSON object."
    )
    ap.add_argument("input", help="the drawing given to hangline")
    ap.add_argument("output", help="the drawing hangline wrote")
    ap.add_argument("--tool-layer-prefix", default="HANGLINE-", help="prefix of the tool's own layers (default HANGLINE-)")
    ap.add_argument("--header-may-change", action="append", default=[], metavar="VAR",
                    help="a header variable the tool may change, besides " + ", ".join(HEADER_MAY_CHANGE))
    a = ap.parse_args(argv)
    if not os.path.isfile(a.input):
        ap.error(f"INPUT {a.input!r} is not a file")
    try:
        rep = check(a.input, a.output, a.tool_layer_prefix, HEADER_MAY_CHANGE + a.header_may_change)
    except Exception as e:  # noqa: BLE001 - a crash of the checker is reported, never silent
        import traceback

        rep = {"input": a.input, "output": a.output, "checker_error": traceback.format_exc(),
               "problems": [f"check_output.py crashed: {type(e).__name__}: {e}"], "clean": False}
    sys.stdout.write(json.dumps(js(rep), indent=1, ensure_ascii=True, allow_nan=False) + "\n")
    return 0


if __name__ == "__main__":
    sys.exit(main())
