"""Independent reference for src/cli/woff.ts: fontTools (Debian python3-fonttools) reads the WOFF
and the unpacked font, and prints each table's SHA-256 as fontTools sees it, with the unpacked font's
offset-table search fields and a few parsed values that only come out of a well-formed font.
Usage: woff_tables.py FONT.woff FONT.ttf  -> JSON on stdout."""
import hashlib
import json
import struct
import sys

from fontTools.ttLib import TTFont


def tables(path):
    font = TTFont(path, lazy=True)
    return font, {tag: hashlib.sha256(font.reader[tag]).hexdigest() for tag in sorted(font.reader.keys())}


woff, woff_tables = tables(sys.argv[1])
ttf, ttf_tables = tables(sys.argv[2])
with open(sys.argv[2], "rb") as f:
    head = f.read(12)
_version, num, search_range, entry_selector, range_shift = struct.unpack(">IHHHH", head)
print(json.dumps({
    "woffFlavor": woff.flavor,
    "ttfFlavor": ttf.flavor,
    "woff": woff_tables,
    "ttf": ttf_tables,
    "offsetTable": {"numTables": num, "searchRange": search_range, "entrySelector": entry_selector, "rangeShift": range_shift},
    "unitsPerEm": ttf["head"].unitsPerEm,
    "glyphs": len(ttf.getGlyphOrder()),
    "advanceOfA": ttf["hmtx"][ttf.getBestCmap()[ord("A")]][0],
}))
