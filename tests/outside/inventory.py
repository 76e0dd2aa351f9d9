#!/usr/bin/env python3
"""Prints the entity inventory of one DXF file as JSON (see README.md).

    python tests/outside/inventory.py INPUT.dxf

Output: {"file", "acadver", "model": {TYPE: {LAYER: n}}, "paper": {LAYOUT: {...}},
"blocks": {BLOCK: {...}}, "layers": [names in the layer table]}.
Exit 0 on success, 1 if ezdxf cannot read the file, 2 on usage errors.
"""

import argparse
import json
import sys

sys.dont_write_bytecode = True

import dxfinfo  # noqa: E402


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description="Print the (type, layer) inventory of a DXF file as JSON.")
    ap.add_argument("input", help="DXF file (ASCII or binary)")
    a = ap.parse_args(argv)
    try:
        import ezdxf

        doc = ezdxf.readfile(a.input)
    except Exception as e:  # noqa: BLE001
        print(json.dumps({"file": a.input, "error": f"{type(e).__name__}: {e}"}))
        return 1
    out = {"file": a.input, "acadver": doc.dxfversion, **dxfinfo.inventory(doc),
           "layers": [layer.dxf.name for layer in doc.layers]}
    print(json.dumps(dxfinfo.js(out), indent=1))
    return 0


if __name__ == "__main__":
    sys.exit(main())
