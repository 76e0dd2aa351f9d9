#!/usr/bin/env python3
"""Writes the demo drawings in demo-drawings/ with ezdxf. Invented scenarios,
invented places and numbers:

- ambermoor-footbridge.dxf: a 42 m suspension footbridge over the Kestrel
  Water at Ambermoor, its east bank higher than the west. Nine hangers at
  unequal spacing carry the deck; the hanger at the viewing bay carries more.
- harrowgate-deck.dxf: a 36 m suspension footbridge at Harrowgate Mill whose
  deck load is drawn as distributed loads (surfacing and crowd over the whole
  deck, a heavier stretch at the fishing platform) on the LOADS layer, with
  the hanger positions on the HANGERS layer: the tool carries the deck load
  to the hangers.
- coldbeck-arch.dxf: a 24 m concrete arch at Coldbeck carrying its own weight
  and the fill over its haunches, drawn as a distributed load: solved with
  --arch --self-weight.
- wrenfield-bridge.dxf: an existing stone bridge at Wrenfield over the
  Linnet Beck: a segmental arch of 9 m span and 2.4 m rise, its ring 0.55 m
  deep, with earth fill over it up to the road and the surfacing drawn as a
  distributed load: assessed with `hangline assess`.

    python tools/demo/make_demo.py            # writes the demo drawings
"""

import os
import sys

# Repeatable output: ezdxf orders some objects by Python's string hashing.
if os.environ.get("PYTHONHASHSEED") != "0":
    os.environ["PYTHONHASHSEED"] = "0"
    os.execv(sys.executable, [sys.executable] + sys.argv)

import ezdxf
from ezdxf.enums import TextEntityAlignment

# Fixed dates and GUIDs, so that writing again gives the same bytes.
ezdxf.options.write_fixed_meta_data_for_testing = True

HERE = os.path.dirname(os.path.abspath(__file__))
DEMO = os.path.join(HERE, "..", "..", "demo-drawings")
OUT = os.path.join(DEMO, "ambermoor-footbridge.dxf")


def main() -> int:
    doc = ezdxf.new("R2013", setup=True)
    doc.header["$INSUNITS"] = 6  # metres
    for name, colour in [("SUPPORTS", 1), ("LOADS", 3), ("DECK", 5), ("STRUCTURE", 8), ("GROUND", 52), ("TITLE", 7)]:
        doc.layers.add(name, color=colour)
    msp = doc.modelspace()

    # Saddles on the tower tops: the cable's fixed points.
    west, east = (0.0, 9.0), (42.0, 11.5)
    msp.add_point(west, dxfattribs={"layer": "SUPPORTS"})
    msp.add_circle(east, 0.15, dxfattribs={"layer": "SUPPORTS"})

    # Towers and ground, for the picture only.
    for (x, top), foot in [(west, 0.0), (east, 2.5)]:
        msp.add_lwpolyline([(x - 0.3, foot), (x - 0.15, top), (x + 0.15, top), (x + 0.3, foot)],
                           dxfattribs={"layer": "STRUCTURE"})
    ground = [(-6.0, 0.0), (3.0, 0.0), (8.0, -2.5), (33.0, -2.8), (38.0, 2.5), (48.0, 2.5)]
    msp.add_lwpolyline(ground, dxfattribs={"layer": "GROUND"})
    hatch = msp.add_hatch(color=52, dxfattribs={"layer": "GROUND"})
    hatch.set_pattern_fill("EARTH", scale=0.4)
    hatch.paths.add_polyline_path(ground + [(48.0, -5.0), (-6.0, -5.0)], is_closed=True)
    msp.add_text("Kestrel Water", height=0.4, dxfattribs={"layer": "GROUND"}).set_placement(
        (20.5, -2.3), align=TextEntityAlignment.BOTTOM_CENTER)

    # The deck: a gentle crest over the water.
    deck = [(-2.0, 2.0), (10.0, 2.5), (21.0, 2.8), (32.0, 2.7), (44.0, 2.6)]
    msp.add_lwpolyline(deck, dxfattribs={"layer": "DECK"})

    def deck_y(x):
        for (x0, y0), (x1, y1) in zip(deck, deck[1:]):
            if x0 <= x <= x1:
                return y0 + (y1 - y0) * (x - x0) / (x1 - x0)
        raise ValueError(x)

    # Hanger loads (deck, people and the viewing bay), drawn as short lines
    # up from the deck with their labels.
    hangers = [(4.0, "14 kN"), (8.5, "18 kN"), (13.0, "18 kN"), (17.5, "18 kN"), (22.0, "P = 26 kN"),
               (26.5, "18 kN"), (31.0, "18 kN"), (35.5, "16.5kN"), (39.0, "14 kN")]
    for x, label in hangers:
        y = deck_y(x)
        msp.add_line((x, y), (x, y + 1.2), dxfattribs={"layer": "LOADS"})
        msp.add_text(label, height=0.3, dxfattribs={"layer": "LOADS"}).set_placement((x + 0.2, y + 0.9))

    msp.add_text("AMBERMOOR FOOTBRIDGE - GENERAL ARRANGEMENT (invented example)", height=0.6,
                 dxfattribs={"layer": "TITLE"}).set_placement((-6.0, 16.0))
    msp.add_text("Hanger loads: deck, surfacing and crowd; viewing bay at x = 22 m", height=0.35,
                 dxfattribs={"layer": "TITLE"}).set_placement((-6.0, 15.0))

    doc.saveas(OUT)
    harrowgate()
    coldbeck()
    wrenfield()
    return 0


def harrowgate() -> None:
    doc = ezdxf.new("R2018", setup=True)
    doc.header["$INSUNITS"] = 6  # metres
    for name, colour in [("SUPPORTS", 1), ("LOADS", 3), ("HANGERS", 8), ("DECK", 5), ("STRUCTURE", 8), ("TITLE", 7)]:
        doc.layers.add(name, color=colour)
    msp = doc.modelspace()
    msp.add_point((0.0, 10.0), dxfattribs={"layer": "SUPPORTS"})
    msp.add_point((36.0, 10.0), dxfattribs={"layer": "SUPPORTS"})
    for x in (0.0, 36.0):
        msp.add_lwpolyline([(x - 0.3, 0.0), (x - 0.15, 10.0), (x + 0.15, 10.0), (x + 0.3, 0.0)],
                           dxfattribs={"layer": "STRUCTURE"})
    msp.add_line((-2.0, 2.0), (38.0, 2.0), dxfattribs={"layer": "DECK"})
    # Hangers every 3 m.
    for k in range(1, 12):
        x = 3.0 * k
        msp.add_line((x, 2.0), (x, 4.0), dxfattribs={"layer": "HANGERS"})
    # Deck load: surfacing and crowd over the deck; over the fishing
    # platform, heavier and rising toward its river end. One stretch per
    # part of the span.
    for x0, x1, label in ((0.0, 15.0, "w = 7.5 kN/m"), (15.0, 21.0, "11.5..13.5 kN/m"), (21.0, 36.0, "7.5 kN/m")):
        msp.add_line((x0, 1.2), (x1, 1.2), dxfattribs={"layer": "LOADS"})
        msp.add_text(label, height=0.3, dxfattribs={"layer": "LOADS"}).set_placement(
            ((x0 + x1) / 2.0, 0.7), align=TextEntityAlignment.MIDDLE_CENTER)
    msp.add_text("HARROWGATE MILL FOOTBRIDGE - DECK LOADS ON THE HANGERS (invented example)", height=0.5,
                 dxfattribs={"layer": "TITLE"}).set_placement((-2.0, 14.0))
    doc.saveas(os.path.join(DEMO, "harrowgate-deck.dxf"))


def coldbeck() -> None:
    doc = ezdxf.new("R2013", setup=True)
    doc.header["$INSUNITS"] = 6  # metres
    for name, colour in [("SUPPORTS", 1), ("LOADS", 3), ("STRUCTURE", 8), ("TITLE", 7)]:
        doc.layers.add(name, color=colour)
    msp = doc.modelspace()
    # Springings.
    msp.add_point((0.0, 0.0), dxfattribs={"layer": "SUPPORTS"})
    msp.add_point((24.0, 0.0), dxfattribs={"layer": "SUPPORTS"})
    for x0, x1 in ((-3.0, 0.0), (24.0, 27.0)):
        msp.add_lwpolyline([(x0, -1.0), (x0, 1.0), (x1, 1.0), (x1, -1.0)], close=True,
                           dxfattribs={"layer": "STRUCTURE"})
    # Fill over the haunches: heavier near the springings, none at the crown.
    msp.add_line((0.0, 9.0), (8.0, 9.0), dxfattribs={"layer": "LOADS"})
    msp.add_text("q = 60..0 kN/m", height=0.35, dxfattribs={"layer": "LOADS"}).set_placement(
        (4.0, 9.5), align=TextEntityAlignment.MIDDLE_CENTER)
    msp.add_line((16.0, 9.0), (24.0, 9.0), dxfattribs={"layer": "LOADS"})
    msp.add_text("q = 0..60 kN/m", height=0.35, dxfattribs={"layer": "LOADS"}).set_placement(
        (20.0, 9.5), align=TextEntityAlignment.MIDDLE_CENTER)
    msp.add_text("COLDBECK ARCH - OWN WEIGHT AND FILL (invented example)", height=0.5,
                 dxfattribs={"layer": "TITLE"}).set_placement((-3.0, 13.0))
    doc.saveas(os.path.join(DEMO, "coldbeck-arch.dxf"))


def wrenfield() -> None:
    import math

    doc = ezdxf.new("R2013", setup=True)
    doc.header["$INSUNITS"] = 6  # metres
    for name, colour in [("INTRADOS", 1), ("EXTRADOS", 5), ("FILL", 52), ("LOADS", 3), ("STRUCTURE", 8),
                         ("GROUND", 52), ("TITLE", 7)]:
        doc.layers.add(name, color=colour)
    msp = doc.modelspace()
    # Segmental arch: springings at x = -4.5 and 4.5 on y = 0, rise 2.4 m;
    # the ring 0.55 m deep, its faces concentric.
    half, rise, ring = 4.5, 2.4, 0.55
    r = (half * half + rise * rise) / (2.0 * rise)
    centre = (0.0, rise - r)
    start = math.degrees(math.atan2(-centre[1], half))
    msp.add_arc(centre, r, start, 180.0 - start, dxfattribs={"layer": "INTRADOS"})
    msp.add_arc(centre, r + ring, start, 180.0 - start, dxfattribs={"layer": "EXTRADOS"})
    # Springing points of the extrados, on the radial springing joints.
    a = math.radians(start)
    ex, ey = centre[0] + (r + ring) * math.cos(a), centre[1] + (r + ring) * math.sin(a)
    road = rise + ring + 0.45
    # Fill between the extrados and the road, over the arch.
    theta = math.pi - 2.0 * a
    bulge = -math.tan(theta / 4.0)  # clockwise: over the top from left to right
    msp.add_lwpolyline([(ex, ey, 0, 0, 0), (ex, road), (-ex, road), (-ex, ey, 0, 0, bulge)],
                       format="xyseb", close=True, dxfattribs={"layer": "FILL"})
    # Road surfacing and parapets, as a load per length over the arch.
    msp.add_line((-ex, road + 0.6), (ex, road + 0.6), dxfattribs={"layer": "LOADS"})
    msp.add_text("w = 6.5 kN/m", height=0.25, dxfattribs={"layer": "LOADS"}).set_placement(
        (0.0, road + 0.8), align=TextEntityAlignment.MIDDLE_CENTER)
    # Abutments, road and stream, for the picture only.
    for x0, x1 in ((-7.5, -ex), (ex, 7.5)):
        msp.add_lwpolyline([(x0, -1.5), (x0, road), (x1, road), (x1, -1.5)], dxfattribs={"layer": "STRUCTURE"})
    msp.add_line((-9.0, road), (9.0, road), dxfattribs={"layer": "STRUCTURE"})
    msp.add_lwpolyline([(-9.0, -0.2), (-4.5, -0.2), (-3.5, -1.3), (3.5, -1.3), (4.5, -0.2), (9.0, -0.2)],
                       dxfattribs={"layer": "GROUND"})
    msp.add_text("Linnet Beck", height=0.3, dxfattribs={"layer": "GROUND"}).set_placement(
        (0.0, -1.0), align=TextEntityAlignment.BOTTOM_CENTER)
    msp.add_text("WRENFIELD BRIDGE - EXISTING STONE ARCH (invented example)", height=0.4,
                 dxfattribs={"layer": "TITLE"}).set_placement((-9.0, road + 2.0))
    doc.saveas(os.path.join(DEMO, "wrenfield-bridge.dxf"))


if __name__ == "__main__":
    sys.exit(main())
