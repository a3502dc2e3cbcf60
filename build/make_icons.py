"""Draw the Couplewise app icons (our own design: two plates joined by a bolt, on teal).

Pure Python (zlib + struct), run once by a maintainer; the PNGs are committed:
    python build/make_icons.py docs/assets/icons
"""

import os
import struct
import sys
import zlib

TEAL = (15, 110, 110, 255)
LIGHT = (222, 235, 240, 255)
COPPER = (196, 112, 64, 255)
GREY = (120, 132, 144, 255)


def inside_round_rect(x, y, x0, y0, x1, y1, r):
    if x < x0 or x > x1 or y < y0 or y > y1:
        return False
    cx = min(max(x, x0 + r), x1 - r)
    cy = min(max(y, y0 + r), y1 - r)
    return (x - cx) ** 2 + (y - cy) ** 2 <= r * r


def pixel(u, v, maskable):
    """Colour at normalised coordinates (u, v) in [0, 1)."""
    pad = 0.0 if maskable else 0.04
    if not inside_round_rect(u, v, pad, pad, 1 - pad, 1 - pad, 0.0 if maskable else 0.18):
        return (0, 0, 0, 0)
    # lower plate (light metal) and upper plate (copper), overlapping in the middle
    if 0.22 <= u <= 0.78 and 0.56 <= v <= 0.68:
        return LIGHT
    if 0.30 <= u <= 0.86 and 0.40 <= v <= 0.52:
        return COPPER
    # the bolt through both
    if 0.50 <= u <= 0.58 and 0.30 <= v <= 0.78:
        return GREY
    if 0.45 <= u <= 0.63 and 0.26 <= v <= 0.32:
        return GREY
    return TEAL


def png(size, maskable=False):
    rows = []
    for y in range(size):
        row = bytearray([0])
        for x in range(size):
            row.extend(pixel((x + 0.5) / size, (y + 0.5) / size, maskable))
        rows.append(bytes(row))
    raw = zlib.compress(b"".join(rows), 9)

    def chunk(tag, data):
        return struct.pack(">I", len(data)) + tag + data + struct.pack(">I", zlib.crc32(tag + data) & 0xFFFFFFFF)

    return (b"\x89PNG\r\n\x1a\n" + chunk(b"IHDR", struct.pack(">IIBBBBB", size, size, 8, 6, 0, 0, 0))
            + chunk(b"IDAT", raw) + chunk(b"IEND", b""))


def main(out):
    os.makedirs(out, exist_ok=True)
    for size in (192, 512):
        with open(os.path.join(out, f"icon-{size}.png"), "wb") as fh:
            fh.write(png(size))
    with open(os.path.join(out, "icon-maskable-512.png"), "wb") as fh:
        fh.write(png(512, maskable=True))


if __name__ == "__main__":
    main(sys.argv[1] if len(sys.argv) > 1 else "docs/assets/icons")
