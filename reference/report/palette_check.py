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
background, and for greyscale the CAM02-UCS lightness J' of each colour and
the smallest step between two of them (a greyscale print keeps lightness
only). Writes palette.json beside this script with the library versions.
Passes (exit 0) when every pair differs by at least 15 under each vision,
every colour by at least 25 from white, and lightness steps are at least 6:
thresholds of our own (common practice puts a just-noticeable difference
near 1 and "clearly different" above 10; no source).
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
PALETTE = ["#274571", "#952e17", "#8553d7", "#cd5f76", "#5fa7d8", "#c8b514"]


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
    lightness = [float(cs_j) for cs_j in colorspacious.cspace_convert(np.array([rgb(c) for c in PALETTE]) / 255.0,
                                                                   "sRGB1", "CAM02-UCS")[:, 0]]
    steps = np.diff(np.sort(lightness))
    result["greyscale"] = {"lightness_j": {c: round(j, 3) for c, j in zip(PALETTE, lightness)},
                           "min_lightness_step": round(float(steps.min()), 3)}
    passed = (all(v["min_pair_delta_e"] >= 15 and v["min_background_delta_e"] >= 25 for v in result["vision"].values())
              and result["greyscale"]["min_lightness_step"] >= 6)
    result["passed"] = bool(passed)
    with open(os.path.join(HERE, "palette.json"), "w") as f:
        json.dump(result, f, indent=1)
        f.write("\n")
    for kind, v in result["vision"].items():
        worst = min(v["pairs"], key=v["pairs"].get)
        print(f"{kind:14s} min pair dE {v['min_pair_delta_e']:6.2f} ({worst}), min vs white {v['min_background_delta_e']:6.2f}")
    print(f"greyscale      min lightness step {result['greyscale']['min_lightness_step']:6.2f}")
    print("passed" if passed else "FAILED")
    return 0 if passed else 1


if __name__ == "__main__":
    raise SystemExit(main())
