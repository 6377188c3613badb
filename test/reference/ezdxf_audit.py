"""Independent reference: read DXF files with ezdxf (Debian python3-ezdxf) and audit them.

argv: DXF paths. stdout: [{"path", "version", "insunits", "errors", "fixes", "layers": [...],
"entities": {TYPE: count}, "closedPolylines": n, "openPolylines": n, "circles": [r, ...]}]
"""
import json
import sys
from collections import Counter

import ezdxf

result = []
for path in sys.argv[1:]:
    doc = ezdxf.readfile(path)
    auditor = doc.audit()
    msp = doc.modelspace()
    kinds = Counter(e.dxftype() for e in msp)
    closed = opened = 0
    for e in msp:
        if e.dxftype() == "LWPOLYLINE":
            closed += 1 if e.closed else 0
            opened += 0 if e.closed else 1
        elif e.dxftype() == "POLYLINE":
            closed += 1 if e.is_closed else 0
            opened += 0 if e.is_closed else 1
    result.append({
        "path": path,
        "version": doc.dxfversion,
        "insunits": doc.header.get("$INSUNITS", 0),
        "errors": len(auditor.errors),
        "fixes": len(auditor.fixes),
        "layers": sorted(layer.dxf.name for layer in doc.layers),
        "entities": dict(kinds),
        "closedPolylines": closed,
        "openPolylines": opened,
        "circles": sorted(e.dxf.radius for e in msp if e.dxftype() == "CIRCLE"),
    })
json.dump(result, sys.stdout)
