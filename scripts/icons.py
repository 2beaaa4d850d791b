#!/usr/bin/env python3
"""Draws the PNG icons for the home screen from the shapes of web/icon.svg.

The SVG (24 x 24: a rounded teal square, a white plumb line, an amber bob)
is the one design; browsers that install a web app also want PNGs, and a
"maskable" one whose shapes sit inside the central safe circle. Python's
standard library only (zlib for PNG), 4 x 4 samples a pixel for smooth
edges. Run it after changing icon.svg; the PNGs it writes are committed:

    python3 scripts/icons.py
"""
import os
import struct
import zlib

TEAL = (0x13, 0x4E, 0x5E)
WHITE = (0xFF, 0xFF, 0xFF)
AMBER = (0xF2, 0xB8, 0x4B)
SAMPLES = 4


def in_rounded_square(x, y, radius):
    """Whether (x, y) lies in the 24 x 24 square with corners of `radius`."""
    if not (0 <= x <= 24 and 0 <= y <= 24):
        return False
    cx = min(max(x, radius), 24 - radius)
    cy = min(max(y, radius), 24 - radius)
    return (x - cx) ** 2 + (y - cy) ** 2 <= radius ** 2


def in_bob(x, y):
    """The bob: the triangle (7.5, 14), (16.5, 14), (12, 21.5)."""
    if y < 14 or y > 21.5:
        return False
    half = 4.5 * (21.5 - y) / 7.5
    return abs(x - 12) <= half


def in_line(x, y):
    """The plumb line: 2 wide, from y 3 to 14."""
    return 11 <= x <= 13 and 3 <= y <= 14


def colour_at(x, y, radius, scale):
    """The colour at a point in icon units, or None outside the icon."""
    if not in_rounded_square(x, y, radius):
        return None
    # The line and bob shrink about the centre for a maskable icon.
    u = 12 + (x - 12) / scale
    v = 12.25 + (y - 12.25) / scale
    if in_line(u, v):
        return WHITE
    if in_bob(u, v):
        return AMBER
    return TEAL


def render(size, radius, scale):
    rows = []
    step = 24 / size
    for py in range(size):
        row = bytearray([0])
        for px in range(size):
            r = g = b = a = 0
            for sy in range(SAMPLES):
                for sx in range(SAMPLES):
                    c = colour_at((px + (sx + 0.5) / SAMPLES) * step,
                                  (py + (sy + 0.5) / SAMPLES) * step, radius, scale)
                    if c:
                        r += c[0]; g += c[1]; b += c[2]; a += 1
            n = SAMPLES * SAMPLES
            if a:
                row += bytes((r // a, g // a, b // a, 255 * a // n))
            else:
                row += bytes(4)
        rows.append(bytes(row))
    return b''.join(rows)


def png(size, pixels):
    def chunk(kind, data):
        return (struct.pack('>I', len(data)) + kind + data
                + struct.pack('>I', zlib.crc32(kind + data) & 0xFFFFFFFF))
    header = struct.pack('>IIBBBBB', size, size, 8, 6, 0, 0, 0)
    return (b'\x89PNG\r\n\x1a\n' + chunk(b'IHDR', header)
            + chunk(b'IDAT', zlib.compress(pixels, 9)) + chunk(b'IEND', b''))


def main():
    web = os.path.join(os.path.dirname(os.path.abspath(__file__)), '..', 'web')
    icons = [
        # name, size, corner radius (icon units), shapes' scale
        ('icon-192.png', 192, 5, 1.0),
        ('icon-512.png', 512, 5, 1.0),
        # Full bleed, shapes inside the central 80 % circle.
        ('icon-maskable-512.png', 512, 0, 0.7),
        # iOS rounds the corners itself.
        ('apple-touch-icon.png', 180, 0, 0.85),
    ]
    for name, size, radius, scale in icons:
        with open(os.path.join(web, name), 'wb') as f:
            f.write(png(size, render(size, radius, scale)))
        print(f'icons: web/{name} ({size} x {size})')


if __name__ == '__main__':
    main()
