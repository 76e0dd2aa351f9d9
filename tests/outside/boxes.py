#!/usr/bin/env python3
"""Bounding boxes of a drawing hangline wrote, by ezdxf: the input's model
space, and each of the tool's layers in the output. One JSON object on stdout.

    python tests/outside/boxes.py INPUT.dxf OUTPUT.dxf [--tool-layer-prefix HANGLINE-]

Keys: "input" ([x0, y0, x1, y1] of every model-space entity of the input, or
null when it has none) and "layers" ({LAYER: [x0, y0, x1, y1]} for each layer
of the output's model space whose name starts with the prefix). Boxes come
from ezdxf.bbox.extents(fast=True): text boxes are estimated from the
height and the number of characters, without fonts.
"""

from __future__ import annotations

import argparse
import json
import sys
from collections import defaultdict

sys.dont_write_bytecode = True

import ezdxf  # noqa: E402
from ezdxf import bbox  # noqa: E402


def box(entities):
    b = bbox.extents(entities, fast=True)
    if not b.has_data:
        return None
    return [b.extmin.x, b.extmin.y, b.extmax.x, b.extmax.y]


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("input")
    ap.add_argument("output")
    ap.add_argument("--tool-layer-prefix", default="HANGLINE-")
    a = ap.parse_args(argv)
    prefix = a.tool_layer_prefix.upper()
    src = ezdxf.readfile(a.input)
    out = ezdxf.readfile(a.output)
    by_layer = defaultdict(list)
    for e in out.modelspace():
        layer = e.dxf.get("layer", "0")
        if layer.upper().startswith(prefix):
            by_layer[layer].append(e)
    result = {"input": box(src.modelspace()), "layers": {k: box(v) for k, v in sorted(by_layer.items())}}
    print(json.dumps(result))
    return 0


if __name__ == "__main__":
    sys.exit(main())
