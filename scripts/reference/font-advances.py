"""Advance widths (em) of the character classes src/report/plot/text.ts uses,
read from a TrueType file's cmap (format 4) and hmtx tables with the standard
library only (TrueType reference manual, Apple, tables 'cmap', 'hhea',
'hmtx', 'head'). Prints the widest glyph of each class, so the estimate in
text.ts can be checked to stay at or above it.

usage: python3 scripts/reference/font-advances.py /usr/share/fonts/truetype/dejavu/DejaVuSans.ttf
"""
import struct
import sys


def tables(data):
    n = struct.unpack(">H", data[4:6])[0]
    out = {}
    for i in range(n):
        tag, _, off, length = struct.unpack(">4sIII", data[12 + 16 * i : 28 + 16 * i])
        out[tag.decode()] = (off, length)
    return out


def cmap4(data, off):
    n = struct.unpack(">H", data[off + 2 : off + 4])[0]
    for i in range(n):
        pid, eid, sub = struct.unpack(">HHI", data[off + 4 + 8 * i : off + 12 + 8 * i])
        s = off + sub
        if struct.unpack(">H", data[s : s + 2])[0] == 4 and pid in (0, 3):
            seg = struct.unpack(">H", data[s + 6 : s + 8])[0] // 2
            ends = struct.unpack(">%dH" % seg, data[s + 14 : s + 14 + 2 * seg])
            p = s + 16 + 2 * seg
            starts = struct.unpack(">%dH" % seg, data[p : p + 2 * seg])
            deltas = struct.unpack(">%dh" % seg, data[p + 2 * seg : p + 4 * seg])
            ro_at = p + 4 * seg
            ros = struct.unpack(">%dH" % seg, data[ro_at : ro_at + 2 * seg])

            def glyph(c):
                for k in range(seg):
                    if starts[k] <= c <= ends[k]:
                        if ros[k] == 0:
                            return (c + deltas[k]) & 0xFFFF
                        a = ro_at + 2 * k + ros[k] + 2 * (c - starts[k])
                        g = struct.unpack(">H", data[a : a + 2])[0]
                        return (g + deltas[k]) & 0xFFFF if g else 0
                return 0

            return glyph
    raise SystemExit("no format-4 cmap")


def main(path):
    data = open(path, "rb").read()
    t = tables(data)
    upem = struct.unpack(">H", data[t["head"][0] + 18 : t["head"][0] + 20])[0]
    nh = struct.unpack(">H", data[t["hhea"][0] + 34 : t["hhea"][0] + 36])[0]
    hm = t["hmtx"][0]
    glyph = cmap4(data, t["cmap"][0])

    def adv(ch):
        g = glyph(ord(ch))
        g = min(g, nh - 1)
        return struct.unpack(">H", data[hm + 4 * g : hm + 4 * g + 2])[0] / upem

    classes = {
        "narrow (0.42)": "iljtfrIJ.,:;'!|()[] /-\u00b7",
        "wide (1.0)": "MWmw@%\u2014",
        "digits and lower case (0.64)": "0123456789abcdefghijklnopqrstuvxyz",
        "upper case (0.79)": "ABCDEFGHIJKLNOPQRSTUVXYZ",
        "other (0.84)": "+=*#&?<>^~_{}\u00b5\u00b0\u00b1\u2212\u00b2\u221a\u03a9\u03c3\u03c9\u03c0",
    }
    print(path, "units per em", upem)
    for name, chars in classes.items():
        widest = max(chars, key=adv)
        print(f"{name:40s} widest {widest!r} {adv(widest):.4f} em")


main(sys.argv[1] if len(sys.argv) > 1 else "/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf")
