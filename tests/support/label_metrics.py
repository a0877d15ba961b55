"""The ink box of a line of text set in a font file, read with fontTools (Debian's python3-fonttools),
not with the product's generated outlines: each glyph's exact outline bounds placed at the running
sum of the advances before it (no kerning), scaled so the font's cap height (OS/2 sCapHeight) is
CAP mm. Prints JSON {width, height, missing}. Usage: /usr/bin/python3 label_metrics.py FONT TEXT CAP"""
import json
import sys

from fontTools.pens.boundsPen import BoundsPen
from fontTools.ttLib import TTFont

path, text, cap = sys.argv[1], sys.argv[2], float(sys.argv[3])
font = TTFont(path)
cmap = font.getBestCmap()
glyphs = font.getGlyphSet()
scale = cap / font["OS/2"].sCapHeight
pen_x = 0
box = [float("inf"), float("inf"), float("-inf"), float("-inf")]
missing = []
for ch in text:
    name = cmap.get(ord(ch))
    if name is None:
        missing.append(ch)
        continue
    pen = BoundsPen(glyphs)
    glyphs[name].draw(pen)
    if pen.bounds:
        x0, y0, x1, y1 = pen.bounds
        box = [min(box[0], pen_x + x0), min(box[1], y0), max(box[2], pen_x + x1), max(box[3], y1)]
    pen_x += font["hmtx"][name][0]
inked = box[0] <= box[2]
print(json.dumps({
    "width": (box[2] - box[0]) * scale if inked else 0,
    "height": (box[3] - box[1]) * scale if inked else 0,
    "missing": missing,
}))
