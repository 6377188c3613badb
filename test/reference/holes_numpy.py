"""Vectorised reference for the hole rules of `framewright check` on a drilled plate DXF (numpy + scipy).

Written for this project's tests and benchmark as an independent method: no grids, no exact
line/arc kernel, just numpy arrays and scipy's k-d tree. It reads an ASCII DXF whose cut geometry is
one outline of LINE and ARC entities plus round holes as CIRCLE entities (other entities are refused),
and computes what the web-width and hole-edge-distance rules report for such a plate:

- hole-to-hole webs (centre distance minus both radii) below the web warning level,
- e (hole centre to the nearest outline segment), e/D against the warning and error ratios,
- pitch/D between holes (D the larger diameter) below the pitch warning ratio,
- holes smaller than the router bit (drill them: a note),
- the part metrics minWebMm, minHoleEdgeWebMm, minHoleHoleWebMm, minEdgeRatio,
then reports one finding per rule and place as the check report does: of the findings of one rule
within 1 mm of each other, the worst (most severe, then lowest measured) is kept.

usage: holes_numpy.py PLATE.dxf [--repeat N] [--findings]   (limits as JSON on stdin, or {} for the defaults)
stdout: {"metrics": {...}, "counts": {"rule/severity": n, ...}, "holes": n, "seconds": best of N,
         "findings": [{"rule", "severity", "measured", "limit", "atMm"}, ...] with --findings}
The time covers reading and parsing the file, every computation, one record per finding and the JSON
text of the result; not the interpreter start.
"""
import json
import math
import sys
import time

import numpy as np
from scipy.spatial import cKDTree


def read_entities(path):
    with open(path, "r", encoding="utf-8", errors="replace") as f:
        lines = f.read().split("\n")
    codes = lines[0::2]
    values = lines[1::2]
    lines_out, arcs, circles = [], [], []
    in_entities = False
    cur = None
    for c, v in zip(codes, values):
        c = c.strip()
        v = v.strip()
        if c == "0":
            if cur is not None:
                kind, g = cur
                if kind == "LINE":
                    lines_out.append((g["10"], g["20"], g["11"], g["21"]))
                elif kind == "ARC":
                    arcs.append((g["10"], g["20"], g["40"], g["50"], g["51"]))
                elif kind == "CIRCLE":
                    circles.append((g["10"], g["20"], g["40"]))
                cur = None
            if v == "ENDSEC":
                in_entities = False
            elif in_entities:
                if v not in ("LINE", "ARC", "CIRCLE"):
                    raise SystemExit(f"holes_numpy.py handles LINE, ARC and CIRCLE only, not {v}")
                cur = (v, {})
        elif c == "2" and v == "ENTITIES":
            in_entities = True
        elif cur is not None and c in ("10", "20", "11", "21", "40", "50", "51"):
            cur[1][c] = float(v)
    return np.array(lines_out, float).reshape(-1, 4), np.array(arcs, float).reshape(-1, 5), np.array(circles, float).reshape(-1, 3)


def point_to_lines(p, seg):
    """Distance from each point (n, 2) to the nearest of the line segments (m, 4): (n,)."""
    if len(seg) == 0:
        return np.full(len(p), np.inf)
    a = seg[None, :, 0:2]
    b = seg[None, :, 2:4]
    d = b - a
    t = np.clip(np.sum((p[:, None, :] - a) * d, axis=2) / np.maximum(np.sum(d * d, axis=2), 1e-300), 0.0, 1.0)
    q = a + t[:, :, None] * d
    return np.min(np.hypot(p[:, None, 0] - q[:, :, 0], p[:, None, 1] - q[:, :, 1]), axis=1)


def point_to_arcs(p, arcs):
    """Distance from each point to the nearest DXF ARC (counter-clockwise from start to end angle)."""
    if len(arcs) == 0:
        return np.full(len(p), np.inf)
    cx, cy, r = arcs[:, 0][None, :], arcs[:, 1][None, :], arcs[:, 2][None, :]
    a0 = np.radians(arcs[:, 3])[None, :]
    sweep = np.mod(np.radians(arcs[:, 4] - arcs[:, 3]), 2 * np.pi)
    sweep = np.where(sweep == 0, 2 * np.pi, sweep)[None, :]
    dx = p[:, None, 0] - cx
    dy = p[:, None, 1] - cy
    rho = np.hypot(dx, dy)
    on = np.mod(np.arctan2(dy, dx) - a0, 2 * np.pi) <= sweep
    ends = []
    for ang in (a0, a0 + sweep):
        ends.append(np.hypot(p[:, None, 0] - (cx + r * np.cos(ang)), p[:, None, 1] - (cy + r * np.sin(ang))))
    d = np.where(on, np.abs(rho - r), np.minimum(ends[0], ends[1]))
    return np.min(d, axis=1)


SEVERITY = {"error": 0, "warning": 1, "info": 2}
MERGE_MM = 1.0


def merged(records):
    """One finding per rule and place: worst first, dropped when a kept one of its rule lies within 1 mm."""
    ranked = sorted(range(len(records)), key=lambda i: (SEVERITY[records[i]["severity"]], records[i]["measured"], i))
    cells = {}
    keep = set()
    for i in ranked:
        f = records[i]
        x, y = f["atMm"]
        ci, cj = math.floor(x / MERGE_MM), math.floor(y / MERGE_MM)
        near = False
        for di in (-1, 0, 1):
            for dj in (-1, 0, 1):
                for (u, v) in cells.get((f["rule"], ci + di, cj + dj), ()):
                    if math.hypot(u - x, v - y) < MERGE_MM:
                        near = True
        if near:
            continue
        keep.add(i)
        cells.setdefault((f["rule"], ci, cj), []).append((x, y))
    return [records[i] for i in sorted(keep)]


def check(path, lim):
    lines, arcs, circles = read_entities(path)
    c = circles[:, 0:2]
    r = circles[:, 2]
    dia = 2 * r
    counts = {}
    records = []

    def add(key, mask, measured, limit, at):
        """Count the findings selected by mask and keep a record of each (rule, severity, numbers, place)."""
        n = int(np.count_nonzero(mask))
        if not n:
            return
        counts[key] = counts.get(key, 0) + n
        rule, severity = key.split("/")
        m = np.round(measured[mask], 4).tolist()
        xy = np.round(at[mask], 4).tolist()
        records.extend({"rule": rule, "severity": severity, "measured": a, "limit": limit, "atMm": b} for a, b in zip(m, xy))

    web_err = max(lim["webMinMm"], lim["webPerThickness"] * lim["thicknessMm"])
    web_warn = web_err * lim["webWarnFactor"]
    # Hole pairs that can matter: closer than the pitch warning or than the web warning level.
    reach = max(lim["warnPitchRatio"] * dia.max(), web_warn + 2 * r.max())
    pairs = cKDTree(c).query_pairs(reach, output_type="ndarray")
    i, j = pairs[:, 0], pairs[:, 1]
    s = np.hypot(c[i, 0] - c[j, 0], c[i, 1] - c[j, 1])
    web = s - r[i] - r[j]
    mid = (c[i] + c[j]) / 2
    add("web-width/error", web < web_err, web, web_err, mid)
    add("web-width/warning", (web >= web_err) & (web < web_warn), web, web_warn, mid)
    pitch = s / np.maximum(dia[i], dia[j])
    add("hole-edge-distance/warning", (s > 0) & (pitch < lim["warnPitchRatio"]), pitch, lim["warnPitchRatio"], mid)
    e = np.minimum(point_to_lines(c, lines), point_to_arcs(c, arcs))
    edge_web = e - r
    add("web-width/error", edge_web < web_err, edge_web, web_err, c)
    add("web-width/warning", (edge_web >= web_err) & (edge_web < web_warn), edge_web, web_warn, c)
    ratio = e / dia
    add("hole-edge-distance/error", ratio < lim["errorEdgeRatio"], ratio, lim["errorEdgeRatio"], c)
    add("hole-edge-distance/warning", (ratio >= lim["errorEdgeRatio"]) & (ratio < lim["warnEdgeRatio"]), ratio, lim["warnEdgeRatio"], c)
    add("bit-reach/info", dia < lim["toolDiameterMm"] - 1e-6, dia, lim["toolDiameterMm"], c)
    records = merged(records)
    counts = {}
    for f in records:
        k = f"{f['rule']}/{f['severity']}"
        counts[k] = counts.get(k, 0) + 1
    # The nearest hole-hole web may lie beyond the reach of the pairs above: ask the tree.
    dd, nn = cKDTree(c).query(c, k=2)
    hole_hole = float(np.min(dd[:, 1] - r - r[nn[:, 1]])) if len(c) > 1 else None
    if len(web):
        hole_hole = min(hole_hole, float(web.min()))
    min_edge_web = float(edge_web.min())
    return {
        "metrics": {
            "minWebMm": round(min(x for x in (hole_hole, min_edge_web) if x is not None), 4),
            "minHoleEdgeWebMm": round(min_edge_web, 4),
            "minHoleHoleWebMm": None if hole_hole is None else round(hole_hole, 4),
            "minEdgeRatio": round(float(ratio.min()), 4),
        },
        "counts": counts,
        "findings": records,
        "holes": int(len(c)),
    }


def main():
    path = sys.argv[1]
    repeat = int(sys.argv[sys.argv.index("--repeat") + 1]) if "--repeat" in sys.argv else 1
    given = json.load(sys.stdin) if not sys.stdin.isatty() else {}
    lim = {
        # The defaults of framewright's checks section (src/params/checksSchema.ts) for a 2 mm plate.
        "thicknessMm": 2, "webMinMm": 1.5, "webPerThickness": 0.4, "webWarnFactor": 1.25,
        "warnEdgeRatio": 2.0, "errorEdgeRatio": 1.5, "warnPitchRatio": 3.0, "toolDiameterMm": 3.175,
    }
    lim.update(given)
    best = None
    result = None
    for _ in range(repeat):
        t0 = time.perf_counter()
        result = check(path, lim)
        text = json.dumps(result)
        dt = time.perf_counter() - t0
        best = dt if best is None else min(best, dt)
    summary = {k: v for k, v in result.items() if k != "findings"}
    summary["seconds"] = best
    if "--findings" in sys.argv:
        summary["findings"] = result["findings"]
    json.dump(summary, sys.stdout)


main()
