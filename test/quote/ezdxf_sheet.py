"""Read a nested-sheet DXF with ezdxf (Debian python3-ezdxf) for framewright's quote tests.

argv: DXF paths. stdout: one object per file: {"version", "auditErrors", "closedContours",
"byLayer": {layer: count}, "extents": [minX, minY, maxX, maxY] over cut layers}.
A closed contour is a CIRCLE or a closed (LW)POLYLINE.
"""
import json
import sys

import ezdxf
from ezdxf import bbox

out = []
for path in sys.argv[1:]:
    doc = ezdxf.readfile(path)
    auditor = doc.audit()
    msp = doc.modelspace()
    by_layer = {}
    closed = 0
    cut = []
    for e in msp:
        layer = e.dxf.layer
        by_layer[layer] = by_layer.get(layer, 0) + 1
        t = e.dxftype()
        if t == "CIRCLE":
            closed += 1
        elif t == "LWPOLYLINE" and e.closed:
            closed += 1
        elif t == "POLYLINE" and e.is_closed:
            closed += 1
        if t != "TEXT" and t != "MTEXT":
            cut.append(e)
    ext = bbox.extents(cut)
    out.append({
        "version": doc.dxfversion,
        "auditErrors": len(auditor.errors),
        "closedContours": closed,
        "byLayer": by_layer,
        "extents": [ext.extmin.x, ext.extmin.y, ext.extmax.x, ext.extmax.y],
    })
json.dump(out, sys.stdout)
