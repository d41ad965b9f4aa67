# SPDX-License-Identifier: MIT
"""almanac's own palette, checked numerically from the colours the SVG uses.

Colour science used (each a published source):
- sRGB decoding: IEC 61966-2-1:1999 (the piecewise transfer function and the
  linear-RGB-to-XYZ matrix for D65).
- CIELAB and the CIE 1976 colour difference ΔE*ab: CIE 15:2004, D65 white.
- Colour-vision deficiency: Machado, Oliveira & Fernandes, "A Physiologically-
  based Model for Simulation of Color Vision Deficiency", IEEE TVCG 15(6),
  2009 — the severity-1.0 matrices for protanopia, deuteranopia, tritanopia,
  applied to linear RGB (the values below are from memory and were checked
  once by hand against the table Debian's python3-colorspacious ships in
  colorspacious.cvd.machado_et_al_2009_matrix).
- Greyscale: CIE L* (lightness), and ITU-R BT.601 luma (0.299 R' + 0.587 G'
  + 0.114 B'), the weights common desaturation and office printers use.

Thresholds (ours, stated here): every pair of the 8 colours differs by
ΔE*ab >= 50 for normal vision and >= 22 under each simulated deficiency
(for scale: about 2.3 is a just-noticeable difference, common practice);
in greyscale neighbours differ by >= 6 L* and >= 12/255 luma, and the
palette spans >= 40 L*; the lightest colour has L* <= 76 so a line on the
white background stays visible.
"""
import itertools
import xml.etree.ElementTree as ET

import numpy as np

SVG = "{http://www.w3.org/2000/svg}"

MACHADO_2009 = {
    "protanopia": np.array([[0.152286, 1.052583, -0.204868],
                            [0.114503, 0.786281, 0.099216],
                            [-0.003882, -0.048116, 1.051998]]),
    "deuteranopia": np.array([[0.367322, 0.860646, -0.227968],
                              [0.280085, 0.672501, 0.047413],
                              [-0.011820, 0.042940, 0.968881]]),
    "tritanopia": np.array([[1.255528, -0.076749, -0.178779],
                            [-0.078411, 0.930809, 0.147602],
                            [0.004733, 0.691367, 0.303900]]),
}
SRGB_TO_XYZ = np.array([[0.4124, 0.3576, 0.1805],   # IEC 61966-2-1
                        [0.2126, 0.7152, 0.0722],
                        [0.0193, 0.1192, 0.9505]])


def decode(hex_colour):
    return np.array([int(hex_colour[i:i + 2], 16) / 255 for i in (1, 3, 5)])


def to_linear(c):
    return np.where(c <= 0.04045, c / 12.92, ((c + 0.055) / 1.055) ** 2.4)


def lab(linear):
    white = SRGB_TO_XYZ @ np.ones(3)
    t = (SRGB_TO_XYZ @ linear) / white
    d = 6 / 29
    f = np.where(t > d ** 3, np.cbrt(t), t / (3 * d * d) + 4 / 29)
    return np.array([116 * f[1] - 16, 500 * (f[0] - f[1]), 200 * (f[1] - f[2])])


def palette(db):
    rows = [(x, x * k, f"series {k}") for k in range(8) for x in range(2)]
    db.execute("CREATE TABLE p(x, y, s)")
    db.executemany("INSERT INTO p VALUES (?, ?, ?)", rows)
    root = ET.fromstring(db.execute("SELECT svg_line_chart(x, y, s) FROM p").fetchone()[0])
    entries = [g for g in root.iter(f"{SVG}g") if g.get("class") == "legend-entry"]
    return [g.find(f"{SVG}line").get("stroke") for g in entries]


def min_difference(colours, matrix):
    labs = [lab(np.clip(matrix @ to_linear(decode(c)), 0, 1)) for c in colours]
    return min(np.linalg.norm(a - b) for a, b in itertools.combinations(labs, 2))


def test_palette_is_distinct_for_normal_and_colour_deficient_vision(db):
    colours = palette(db)
    assert len(set(colours)) == 8
    normal = min_difference(colours, np.eye(3))
    print(f"min ΔE*ab normal vision: {normal:.1f}")
    assert normal >= 50
    for name, matrix in MACHADO_2009.items():
        worst = min_difference(colours, matrix)
        print(f"min ΔE*ab {name}: {worst:.1f}")
        assert worst >= 22, name


def test_palette_is_distinct_in_greyscale(db):
    colours = palette(db)
    lightness = sorted(lab(to_linear(decode(c)))[0] for c in colours)
    luma = sorted(255 * float(np.dot([0.299, 0.587, 0.114], decode(c))) for c in colours)
    print("L*:", [round(v, 1) for v in lightness], "luma:", [round(v) for v in luma])
    assert min(np.diff(lightness)) >= 6
    assert lightness[-1] - lightness[0] >= 40
    assert lightness[-1] <= 76
    assert min(np.diff(luma)) >= 12


def test_palette_is_not_a_well_known_default(db):
    # Originality (common brief): none of the colours is one of the primaries
    # or web named colours a default palette is usually built from.
    colours = {c.lower() for c in palette(db)}
    named = {"#ff0000", "#00ff00", "#0000ff", "#000000", "#ffff00", "#00ffff", "#ff00ff",
             "#808080", "#800000", "#008000", "#000080", "#808000", "#800080", "#008080",
             "#ffa500", "#a52a2a"}
    assert not colours & named
