"""Reads a DXF with ezdxf (Debian's python3-ezdxf) and prints, as JSON, what a fabricator's CAD
would be told: the audit, the header (version, code page, units), every ARC's angles, and the
area of the CUT layer's part, computed here and not by the product: each entity flattened to
points by ezdxf (arcs and circles to chords of points on the true circle, sagitta at most 1e-6 of
a unit), the pieces chained end to end into closed loops, each loop's area
by the shoelace formula, the largest loop (the outline) less every other (bore, holes).
Optionally also the volume of an ASCII STL (e.g. OpenSCAD's extrusion of the same DXF), summed
as signed tetrahedra from the origin. Usage: /usr/bin/python3 dxf_area.py FILE.dxf [FILE.stl]"""
import json
import math
import sys

import ezdxf
from ezdxf import recover

path = sys.argv[1]
doc, auditor = recover.readfile(path)
audit = doc.audit()
msp = doc.modelspace()
cut = [e for e in msp if e.dxf.layer == "CUT"]

# ezdxf's path module would give arcs as cubic Bezier curves, which stand up to 2.7e-4 of the
# radius off the circle; chords of the circle itself, with a sagitta of 1e-6, lose far less area.
pieces = []
for e in cut:
    if e.dxftype() == "LINE":
        pts = [(e.dxf.start.x, e.dxf.start.y), (e.dxf.end.x, e.dxf.end.y)]
    else:
        pts = [(v.x, v.y) for v in e.flattening(1e-6)]
    pieces.append(pts)

TOL = 1e-5
loops = []
open_pieces = []
for p in pieces:
    if math.dist(p[0], p[-1]) < TOL and len(p) > 2:
        loops.append(p)
    else:
        open_pieces.append(p)

# Chain the open pieces (lines and arcs of a contour) end to end, reversing where they run the other way.
by_end = {}


def key(pt):
    return (round(pt[0] / 1e-4), round(pt[1] / 1e-4))


used = [False] * len(open_pieces)
ends = {}
for i, p in enumerate(open_pieces):
    for pt in (p[0], p[-1]):
        ends.setdefault(key(pt), []).append(i)


def near(pt):
    kx, ky = key(pt)
    for dx in (-1, 0, 1):
        for dy in (-1, 0, 1):
            for j in ends.get((kx + dx, ky + dy), []):
                yield j


unchained = 0
for i in range(len(open_pieces)):
    if used[i]:
        continue
    used[i] = True
    loop = list(open_pieces[i])
    while math.dist(loop[0], loop[-1]) >= TOL:
        nxt = None
        for j in near(loop[-1]):
            if used[j]:
                continue
            q = open_pieces[j]
            if math.dist(q[0], loop[-1]) < TOL:
                nxt = q
            elif math.dist(q[-1], loop[-1]) < TOL:
                nxt = list(reversed(q))
            if nxt is not None:
                used[j] = True
                break
        if nxt is None:
            unchained += 1
            break
        loop += nxt[1:]
    loops.append(loop)


def shoelace(pts):
    return 0.5 * sum(pts[i][0] * pts[(i + 1) % len(pts)][1] - pts[(i + 1) % len(pts)][0] * pts[i][1] for i in range(len(pts)))


areas = sorted((abs(shoelace(l)) for l in loops), reverse=True)
area = areas[0] - sum(areas[1:]) if areas else 0.0

arcs = [(e.dxf.start_angle, e.dxf.end_angle) for e in msp if e.dxftype() == "ARC"]
facts = {
    "auditErrors": len(auditor.errors) + len(audit.errors),
    "auditFixes": len(auditor.fixes) + len(audit.fixes),
    "acadver": doc.header.get("$ACADVER"),
    "codepage": doc.header.get("$DWGCODEPAGE"),
    "insunits": doc.header.get("$INSUNITS"),
    "measurement": doc.header.get("$MEASUREMENT"),
    "arcAngleMin": min((min(a) for a in arcs), default=None),
    "arcAngleMax": max((max(a) for a in arcs), default=None),
    "texts": [e.plain_text() for e in msp if e.dxftype() == "TEXT"],
    "loops": len(loops),
    "unchained": unchained,
    "area": area,
}

if len(sys.argv) > 2:
    volume = 0.0
    tri = []
    with open(sys.argv[2]) as f:
        for line in f:
            words = line.split()
            if words and words[0] == "vertex":
                tri.append(tuple(map(float, words[1:4])))
                if len(tri) == 3:
                    (ax, ay, az), (bx, by, bz), (cx, cy, cz) = tri
                    volume += (ax * (by * cz - bz * cy) - ay * (bx * cz - bz * cx) + az * (bx * cy - by * cx)) / 6
                    tri = []
    facts["stlVolume"] = abs(volume)

print(json.dumps(facts))
