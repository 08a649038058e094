#!/usr/bin/python3
"""How distinct the method colours of report.html stay for readers with a
colour-vision deficiency.

Run from the repository root with Debian's Python and python3-colorspacious:
    /usr/bin/python3 reference/report/palette_check.py
For each pair of the six method colours (src/report/svg.cpp, svg::style) it
computes the colour difference in CAM02-UCS (Luo, Cui & Li 2006) for normal
vision and for simulated protanomaly, deuteranomaly and tritanomaly at
severity 100 (the Machado, Oliveira & Fernandes 2009 model, as implemented by
colorspacious), and the difference of each colour from the white chart
background. Writes palette.json beside this script with the library versions.
The report also tells methods apart by dash pattern and marker shape, so
colour is never the only cue; this check only measures the colour part.
"""
import json
import os
import platform
from itertools import combinations

import colorspacious
import numpy as np

HERE = os.path.dirname(os.path.abspath(__file__))
PALETTE = ["#2f5f8f", "#e0b040", "#a0522d", "#7fb8a4", "#b07aa1", "#3e8c76"]


def rgb(hex_colour):
    return np.array([int(hex_colour[i:i + 2], 16) for i in (1, 3, 5)], dtype=float)


def simulate(colour, kind):
    if kind == "normal":
        return colour
    cvd = {"name": "sRGB1+CVD", "cvd_type": kind, "severity": 100}
    out = colorspacious.cspace_convert(colour / 255.0, cvd, "sRGB1")
    return np.clip(out, 0, 1) * 255.0


def main():
    result = {"source": "colorspacious CAM02-UCS delta E with the Machado 2009 CVD simulation; see palette_check.py",
              "versions": {"python": platform.python_version(), "numpy": np.__version__,
                           "colorspacious": "1.1.2 (Debian python3-colorspacious)"},
              "palette": PALETTE, "vision": {}}
    for kind in ["normal", "protanomaly", "deuteranomaly", "tritanomaly"]:
        sim = [simulate(rgb(c), kind) for c in PALETTE]
        pairs = {}
        for a, b in combinations(range(len(PALETTE)), 2):
            pairs[f"{PALETTE[a]} {PALETTE[b]}"] = round(float(colorspacious.deltaE(sim[a], sim[b], input_space="sRGB255")), 3)
        background = [round(float(colorspacious.deltaE(s, [255, 255, 255], input_space="sRGB255")), 3) for s in sim]
        result["vision"][kind] = {"min_pair_delta_e": min(pairs.values()), "pairs": pairs,
                                  "min_background_delta_e": min(background)}
    with open(os.path.join(HERE, "palette.json"), "w") as f:
        json.dump(result, f, indent=1)
        f.write("\n")
    for kind, v in result["vision"].items():
        worst = min(v["pairs"], key=v["pairs"].get)
        print(f"{kind:14s} min pair dE {v['min_pair_delta_e']:6.2f} ({worst}), min vs white {v['min_background_delta_e']:6.2f}")


if __name__ == "__main__":
    main()
