"""Reads a DXF with ezdxf (Debian's python3-ezdxf, the reference reader) and prints what the
tests check, as JSON: the audit, header units, layers, entity kinds, open chain ends, extents,
the tooth flanks and tips, and the box round the etched geometry. Usage: /usr/bin/python3 dxf_facts.py FILE OD"""
import json
import math
import sys
from collections import Counter

import ezdxf
from ezdxf import bbox, recover

path, od = sys.argv[1], float(sys.argv[2])
doc, auditor = recover.readfile(path)
msp = doc.modelspace()
cut = [e for e in msp if e.dxf.layer == "CUT"]


# Every line and arc end must meet exactly one other end (within 1e-6 of a unit): closed chains.
TOL = 1e-6
points = []
for e in cut:
    if e.dxftype() == "LINE":
        points += [(e.dxf.start.x, e.dxf.start.y), (e.dxf.end.x, e.dxf.end.y)]
    elif e.dxftype() == "ARC":
        points += [(e.start_point.x, e.start_point.y), (e.end_point.x, e.end_point.y)]
grid = {}
for i, (x, y) in enumerate(points):
    grid.setdefault((round(x / 1e-3), round(y / 1e-3)), []).append(i)


def partners(i):
    x, y = points[i]
    cx, cy = round(x / 1e-3), round(y / 1e-3)
    n = 0
    for dx in (-1, 0, 1):
        for dy in (-1, 0, 1):
            for j in grid.get((cx + dx, cy + dy), []):
                if j != i and math.hypot(points[j][0] - x, points[j][1] - y) < TOL:
                    n += 1
    return n


open_ends = sum(1 for i in range(len(points)) if partners(i) != 1)

ext = bbox.extents(cut)
# The farthest any cut geometry reaches from the centre (arcs centred on the origin: their radius).
reach = 0.0
for e in cut:
    if e.dxftype() == "LINE":
        reach = max(reach, math.hypot(e.dxf.start.x, e.dxf.start.y), math.hypot(e.dxf.end.x, e.dxf.end.y))
    elif e.dxftype() in ("ARC", "CIRCLE"):
        reach = max(reach, math.hypot(e.dxf.center.x, e.dxf.center.y) + e.dxf.radius)
tips = [e for e in cut if e.dxftype() == "ARC" and abs(e.dxf.radius - od / 2) < 1e-6]
# Flanks: radial lines that reach out towards the tips (the keyway's walls are not radial).
flanks = []
for e in cut:
    if e.dxftype() != "LINE":
        continue
    (x0, y0), (x1, y1) = (e.dxf.start.x, e.dxf.start.y), (e.dxf.end.x, e.dxf.end.y)
    a0, a1 = math.degrees(math.atan2(y0, x0)), math.degrees(math.atan2(y1, x1))
    # DXF numbers carry about 1e-6 of a unit, so a short flank is radial to within ~1e-3°.
    if abs(((a0 - a1 + 180) % 360) - 180) < 1e-3 and max(math.hypot(x0, y0), math.hypot(x1, y1)) > od / 2 * 0.8:
        flanks.append(round(a0 % 360, 6))

etch = [e for e in msp if e.dxf.layer == "ETCH"]
etch_box = bbox.extents(etch) if etch else None

print(json.dumps({
    "auditErrors": len(auditor.errors),
    "auditFixes": len(auditor.fixes),
    "insunits": doc.header.get("$INSUNITS"),
    "layers": {l.dxf.name: l.dxf.color for l in doc.layers},
    "kinds": sorted({e.dxftype() for e in msp}),
    "kindsByLayer": {f"{k[0]}@{k[1]}": n for k, n in Counter((e.dxftype(), e.dxf.layer) for e in msp).items()},
    "openEnds": open_ends,
    "extent": [ext.size.x, ext.size.y],
    "reach": reach,
    "tipArcs": len(tips),
    "flankAngles": sorted(flanks),
    # Everything etched (index mark, label outlines): [x0, y0, x1, y1], or null.
    "etchBox": [etch_box.extmin.x, etch_box.extmin.y, etch_box.extmax.x, etch_box.extmax.y] if etch_box else None,
}))
