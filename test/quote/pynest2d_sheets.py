"""Reference sheet count from an independent nesting library: libnest2d (Debian python3-pynest2d).

libnest2d's no-fit polygons are only right for convex items, so every part is given as its convex
hull. libnest2d keeps its `distance` by growing every item by half of it and keeping the grown item in
the bin, so the bin is the sheet's usable area (inside the margins) grown by half the spacing on every
side: parts then stay inside the margins and the spacing apart. Coordinates are integers: micrometres.

stdin: {"widthMm", "heightMm", "marginMm", "spacingMm",
        "groups": [{"name": str, "items": [{"hull": [[x, y], ...] (mm, counter-clockwise), "count": n}]}]}
stdout: {"groups": [{"name": str, "sheets": n, "seconds": s}]}
"""
import json
import math
import sys
import time

from pynest2d import Box, Item, NfpConfig, Point, nest

UM = 1000  # integer units per mm

req = json.load(sys.stdin)
spacing = math.ceil(req["spacingMm"] * UM)
bin_w = round((req["widthMm"] - 2 * req["marginMm"]) * UM) + spacing
bin_h = round((req["heightMm"] - 2 * req["marginMm"]) * UM) + spacing
out = []
for group in req["groups"]:
    items = []
    for it in group["items"]:
        pts = [Point(round(x * UM), round(y * UM)) for x, y in it["hull"]]
        for _ in range(it["count"]):
            items.append(Item(pts))
    config = NfpConfig()
    config.rotations = [0.0, 0.5 * math.pi, math.pi, 1.5 * math.pi]
    config.parallel = False
    t0 = time.perf_counter()
    bins = nest(items, Box(bin_w, bin_h), spacing, config)
    if any(i.binId() < 0 for i in items):
        raise SystemExit(f"libnest2d left parts of {group['name']} unplaced")
    out.append({"name": group["name"], "sheets": int(bins), "seconds": time.perf_counter() - t0})
json.dump({"groups": out}, sys.stdout)
