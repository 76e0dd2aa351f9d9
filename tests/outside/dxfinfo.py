"""What an outside reader (ezdxf) sees in a DXF file: shared by check_output.py,
inventory.py and tools/fixtures/make_fixtures.py.

Everything returned is plain JSON data (dicts, lists, str, int, finite float);
non-finite floats become the strings "nan", "inf", "-inf".
"""

from __future__ import annotations

import logging
import math
from collections import defaultdict

import ezdxf
from ezdxf.entities import DXFGraphic
from ezdxf.lldxf.tagger import ascii_tags_loader, binary_tags_loader
from ezdxf.lldxf.validator import is_binary_dxf_file

TABLE_ENTRY_TYPES = {"LAYER", "LTYPE", "STYLE", "DIMSTYLE", "UCS", "VIEW", "VPORT", "APPID", "BLOCK_RECORD"}
TABLES = ("layers", "linetypes", "styles", "dimstyles", "appids", "ucs", "views", "viewports", "block_records")


# --------------------------------------------------------------------------------------
# plain JSON values
# --------------------------------------------------------------------------------------


def js(v):
    """Turns ezdxf values (Vec3, tuples, bytes, non-finite floats) into JSON data."""
    if isinstance(v, bool) or v is None or isinstance(v, (int, str)):
        return v
    if isinstance(v, float):
        if math.isfinite(v):
            return v
        return "nan" if math.isnan(v) else ("inf" if v > 0 else "-inf")
    if isinstance(v, (bytes, bytearray)):
        return v.hex()
    if isinstance(v, dict):
        return {str(k): js(x) for k, x in v.items()}
    if hasattr(v, "__iter__"):
        return [js(x) for x in v]
    return str(v)


def nested_count(pairs) -> dict:
    """{type: {layer: count}} from (type, layer) pairs, keys sorted."""
    out: dict = defaultdict(lambda: defaultdict(int))
    for t, layer in pairs:
        out[t][layer] += 1
    return {t: dict(sorted(out[t].items())) for t in sorted(out)}


def flat(inv_space: dict) -> dict:
    """{(type, layer): count} from {type: {layer: count}}."""
    return {(t, layer): n for t, layers in inv_space.items() for layer, n in layers.items()}


# --------------------------------------------------------------------------------------
# loading
# --------------------------------------------------------------------------------------


class _Capture(logging.Handler):
    def __init__(self):
        super().__init__(logging.DEBUG)
        self.messages: list[str] = []

    def emit(self, record):
        if record.levelno >= logging.WARNING:
            self.messages.append(f"{record.levelname}: {record.getMessage()}")


def load(path: str) -> dict:
    """Reads with ezdxf.readfile; on failure also tries ezdxf.recover.readfile.

    Returns {"doc", "loaded", "load_error", "load_warnings", "recover": {...} or None}.
    "doc" is the strictly loaded document, else the recovered one, else None.
    """
    cap = _Capture()
    log = logging.getLogger("ezdxf")
    log.addHandler(cap)
    old_propagate = log.propagate
    log.propagate = False
    try:
        res = {"doc": None, "loaded": False, "load_error": "", "load_warnings": [], "recover": None}
        try:
            res["doc"] = ezdxf.readfile(path)
            res["loaded"] = True
        except Exception as e:  # noqa: BLE001 - every failure is a finding
            res["load_error"] = f"{type(e).__name__}: {e}"
            rec = {"loaded": False, "error": "", "audit": None}
            try:
                from ezdxf import recover

                doc, auditor = recover.readfile(path)
                rec["loaded"] = True
                rec["audit"] = audit_summary(auditor)
                res["doc"] = doc
            except Exception as e2:  # noqa: BLE001
                rec["error"] = f"{type(e2).__name__}: {e2}"
            res["recover"] = rec
        res["load_warnings"] = cap.messages
        return res
    finally:
        log.removeHandler(cap)
        log.propagate = old_propagate


def audit_summary(auditor) -> dict:
    def entry(e):
        ent = e.entity
        return {
            "code": int(e.code),
            "code_name": _code_name(e.code),
            "message": e.message,
            "entity": None if ent is None else f"{ent.dxftype()}(#{ent.dxf.get('handle', '?')})",
        }

    return {
        "errors": [entry(e) for e in auditor.errors],
        "fixes": [entry(e) for e in auditor.fixes],
    }


def _code_name(code) -> str:
    from ezdxf.audit import AuditError

    try:
        return AuditError(code).name
    except ValueError:
        return str(code)


def run_audit(doc) -> dict:
    """Runs ezdxf's Auditor (it may change the document: call it last)."""
    try:
        return audit_summary(doc.audit())
    except Exception as e:  # noqa: BLE001
        return {"errors": [], "fixes": [], "crashed": f"{type(e).__name__}: {e}"}


def _typed(code: int, v):
    """A raw tag value in its DXF type (so ASCII and binary files compare alike)."""
    if isinstance(v, (bytes, bytearray)):
        return v.hex()
    try:
        if 10 <= code <= 59 or 110 <= code <= 149 or 210 <= code <= 239 or 460 <= code <= 469 or 1010 <= code <= 1059:
            return js(float(v))
        if (60 <= code <= 99 or 160 <= code <= 179 or 270 <= code <= 299 or 370 <= code <= 389
                or 400 <= code <= 409 or 420 <= code <= 429 or 440 <= code <= 459 or 1060 <= code <= 1071):
            return int(float(v)) if not isinstance(v, bool) else int(v)
    except (TypeError, ValueError):
        pass
    return str(v).rstrip("\r\n")


def raw_tags(path: str):
    """(code, value) pairs straight from the file, ASCII or binary."""
    if is_binary_dxf_file(path):
        with open(path, "rb") as fp:
            data = fp.read()
        for t in binary_tags_loader(data):
            yield int(t.code), t.value
    else:
        with open(path, encoding="latin-1", newline=None) as fp:
            for t in ascii_tags_loader(fp):
                yield int(t.code), t.value


def raw_scan(path: str) -> dict:
    """Handles (group codes 5 and 105) and HEADER variables as they are in the file.

    ezdxf repairs and invents a few things while loading (objects with new
    handles, fresh GUIDs for all-zero ones, ...); comparing what is in the
    files themselves avoids reporting those as differences. Returns
    {"handles": set or None, "header": {VAR: [[code, value], ...]} or None,
    "error": str}."""
    out = {"handles": set(), "header": {}, "error": ""}
    section, var, prev_code0 = None, None, None
    try:
        for code, value in raw_tags(path):
            if code == 0:
                prev_code0 = str(value).strip()
                if prev_code0 == "ENDSEC":
                    section = None
                var = None
                continue
            if code == 2 and prev_code0 == "SECTION" and section is None:
                section = str(value).strip()
                prev_code0 = None
                continue
            if section == "HEADER":
                if code == 9:
                    var = str(value).strip()
                    out["header"][var] = []
                elif var is not None:
                    out["header"][var].append([code, _typed(code, value)])
            elif code in (5, 105):
                out["handles"].add(str(value).strip().upper())
    except Exception as e:  # noqa: BLE001
        out["error"] = f"{type(e).__name__}: {e}"
        out["handles"] = None if not out["handles"] else out["handles"]
    return out


def raw_handles(path: str) -> set[str] | None:
    return raw_scan(path)["handles"]


# --------------------------------------------------------------------------------------
# inventory
# --------------------------------------------------------------------------------------


def _with_subentities(layout):
    for e in layout:
        yield e
        if e.dxftype() == "INSERT":
            yield from e.attribs


def _layer(e) -> str:
    return e.dxf.get("layer", "0")


def paper_layouts(doc):
    """Paper-space layouts in tab order, as (name, layout)."""
    out = []
    for name in doc.layouts.names_in_taborder():
        lay = doc.layouts.get(name)
        if lay.is_modelspace:
            continue
        out.append((name, lay))
    return out


def block_definitions(doc):
    """Block definitions that are not layouts, as (name, BlockLayout), sorted by name."""
    out = []
    for blk in doc.blocks:
        rec = blk.block_record
        if rec is not None and rec.is_any_layout:
            continue
        out.append((blk.name, blk))
    return sorted(out, key=lambda p: p[0])


def inventory(doc) -> dict:
    """Counts of (dxftype, layer) in model space, each paper space and each block.

    ATTRIBs of INSERTs are counted as entities of type ATTRIB in the same space."""
    msp = doc.modelspace()
    return {
        "model": nested_count((e.dxftype(), _layer(e)) for e in _with_subentities(msp)),
        "paper": {
            name: nested_count((e.dxftype(), _layer(e)) for e in _with_subentities(lay))
            for name, lay in paper_layouts(doc)
        },
        "blocks": {
            name: nested_count((e.dxftype(), _layer(e)) for e in _with_subentities(blk))
            for name, blk in block_definitions(doc)
        },
    }


def inventory_of_file(path: str) -> dict:
    doc = ezdxf.readfile(path)
    return {"acadver": doc.dxfversion, **inventory(doc)}


def spaces(inv: dict) -> dict:
    """{space name: {type: {layer: n}}} with space names model, paper:NAME, block:NAME."""
    out = {"model": inv.get("model", {})}
    for name, v in inv.get("paper", {}).items():
        out[f"paper:{name}"] = v
    for name, v in inv.get("blocks", {}).items():
        out[f"block:{name}"] = v
    return out


# --------------------------------------------------------------------------------------
# tables, header, handles
# --------------------------------------------------------------------------------------


def table_snapshot(doc) -> dict:
    """{table: {NAME_UPPER: {"name", attribs...}}} for the symbol tables, plus blocks."""
    snap = {}
    for tname in TABLES:
        table = getattr(doc, tname, None)
        if table is None:
            continue
        entries = {}
        for entry in table:
            attribs = js(entry.dxfattribs())
            entries[str(entry.dxf.name).upper()] = attribs
        snap[tname] = entries
    blocks = {}
    for blk in doc.blocks:
        b = blk.block
        attribs = js(b.dxfattribs()) if b is not None else {}
        attribs["name"] = blk.name
        blocks[blk.name.upper()] = attribs
    snap["blocks"] = blocks
    return snap


def header_snapshot(doc) -> dict:
    out = {}
    for name in doc.header.varnames():
        try:
            out[name] = js(doc.header.get(name))
        except Exception as e:  # noqa: BLE001
            out[name] = f"<unreadable: {e}>"
    return out


def handle_map(doc, only: set[str] | None = None) -> dict:
    """{HANDLE: (category, dxftype, layer or None)} for every entity ezdxf holds.

    category: "entity" (graphical, incl. ATTRIB, VERTEX, SEQEND), "table" (table
    entries) or "object" (everything else: BLOCK/ENDBLK, dictionaries, ...)."""
    out = {}
    for e in doc.entitydb.values():
        h = e.dxf.get("handle")
        if h is None:
            continue
        h = str(h).upper()
        if only is not None and h not in only:
            continue
        t = e.dxftype()
        if isinstance(e, DXFGraphic) and t not in ("BLOCK", "ENDBLK"):
            cat = "entity"
        elif t in TABLE_ENTRY_TYPES:
            cat = "table"
        else:
            cat = "object"
        layer = e.dxf.get("layer") if e.dxf.is_supported("layer") else None
        out[h] = (cat, t, layer)
    return out
