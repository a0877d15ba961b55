"""Reads a wheel DXF's etched degree ring back with ezdxf (Debian's python3-ezdxf) and prints, as
JSON: the layers, the index mark on ETCH (its open line's outer end as an angle), and on the ring's
layer each connected piece of line work: open single lines (the ticks: angle, inner and outer
radius) and closed outlines (letters' contours: centroid and the piece's point count).
Usage: /usr/bin/python3 etch_ring.py FILE LAYER"""
import json
import math
import sys

import ezdxf

path, layer = sys.argv[1], sys.argv[2]
doc = ezdxf.readfile(path)
msp = doc.modelspace()


def pieces(lines):
    """Lines joined where their ends meet (to 1e-6): each piece its lines and whether it closes."""
    key = lambda p: (round(p[0] / 1e-6), round(p[1] / 1e-6))
    parent = list(range(len(lines)))

    def find(i):
        while parent[i] != i:
            parent[i] = parent[parent[i]]
            i = parent[i]
        return i

    ends = {}
    for i, (a, b) in enumerate(lines):
        for p in (a, b):
            ends.setdefault(key(p), []).append(i)
    for members in ends.values():
        for j in members[1:]:
            parent[find(j)] = find(members[0])
    groups = {}
    for i in range(len(lines)):
        groups.setdefault(find(i), []).append(i)
    out = []
    for members in groups.values():
        degree = {}
        for i in members:
            for p in lines[i]:
                degree[key(p)] = degree.get(key(p), 0) + 1
        out.append((members, all(d == 2 for d in degree.values())))
    return out


def lines_on(name):
    return [((e.dxf.start.x, e.dxf.start.y), (e.dxf.end.x, e.dxf.end.y)) for e in msp if e.dxf.layer == name and e.dxftype() == "LINE"]


angle = lambda p: math.degrees(math.atan2(p[1], p[0])) % 360
radius = lambda p: math.hypot(p[0], p[1])

ring = lines_on(layer)
ticks, outlines = [], []
for members, closed in pieces(ring):
    if closed:
        pts = [ring[i][0] for i in members]
        cx = sum(p[0] for p in pts) / len(pts)
        cy = sum(p[1] for p in pts) / len(pts)
        outlines.append({"angle": angle((cx, cy)), "r": radius((cx, cy))})
    elif len(members) == 1:
        a, b = ring[members[0]]
        outer, inner = (a, b) if radius(a) > radius(b) else (b, a)
        ticks.append({"angle": angle(outer), "spread": abs((angle(outer) - angle(inner) + 180) % 360 - 180), "rOuter": radius(outer), "rInner": radius(inner)})

index = [ring_lines for ring_lines in lines_on("ETCH")]
index_mark = None
for members, closed in pieces(index):
    if not closed and len(members) == 1:
        a, b = index[members[0]]
        index_mark = angle(a if radius(a) > radius(b) else b)

print(json.dumps({"layers": sorted(l.dxf.name for l in doc.layers), "indexMark": index_mark, "ticks": ticks, "outlines": outlines}))
