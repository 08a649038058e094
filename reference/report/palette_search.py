#!/usr/bin/python3
"""How the six method colours of report.html were chosen (src/report/svg.cpp).

    /usr/bin/python3 reference/report/palette_search.py [SEED]

A seeded random search, our own: 4000 random sRGB colours (channels 20..235)
are filtered to moderate chroma (14..32 in CAM02-UCS a'b'), lightness J'
between 30 and 76, and a CAM02-UCS difference from the white background of
at least 32 (28 under each simulated colour-vision deficiency). From random
starts, single swaps are kept when they do not lower the score: the smallest
pairwise CAM02-UCS difference over normal vision and simulated protanomaly,
deuteranomaly and tritanomaly at severity 100 (Machado, Oliveira & Fernandes
2009, as implemented by colorspacious), capped by 2.6 times the smallest
lightness step, so that the colours also stay apart in greyscale. The palette
in svg.cpp is the result for seed 3, ordered dark to light; the search takes
a few minutes. palette_check.py measures the chosen colours.
"""
import sys

import colorspacious as cs
import numpy as np

KINDS = ["protanomaly", "deuteranomaly", "tritanomaly"]


def to_ucs(rgb255, kind=None):
    x = rgb255 / 255.0
    if kind:
        x = np.clip(cs.cspace_convert(x, {"name": "sRGB1+CVD", "cvd_type": kind, "severity": 100}, "sRGB1"), 0, 1)
    return cs.cspace_convert(x, "sRGB1", "CAM02-UCS")


def main(seed):
    rng = np.random.default_rng(seed)
    pool = rng.integers(20, 236, size=(4000, 3)).astype(float)
    views = {None: to_ucs(pool)}
    for k in KINDS:
        views[k] = to_ucs(pool, k)
    white = cs.cspace_convert([1, 1, 1], "sRGB1", "CAM02-UCS")
    lightness = views[None][:, 0]
    ok = np.linalg.norm(views[None] - white, axis=1) >= 32
    for k in KINDS:
        ok &= np.linalg.norm(views[k] - white, axis=1) >= 28
    chroma = np.hypot(views[None][:, 1], views[None][:, 2])
    ok &= (lightness >= 30) & (lightness <= 76) & (chroma >= 14) & (chroma <= 32)
    candidates = np.where(ok)[0]

    def score(sel):
        smallest = 1e9
        for v in views.values():
            p = v[sel]
            d = np.linalg.norm(p[:, None] - p[None], axis=2) + np.eye(len(sel)) * 1e9
            smallest = min(smallest, d.min())
        return min(smallest, 2.6 * np.diff(np.sort(lightness[sel])).min())

    best, best_score = None, -1
    for _ in range(40):
        sel = list(rng.choice(candidates, 6, replace=False))
        s = score(sel)
        for _ in range(3000):
            i, c = rng.integers(6), rng.choice(candidates)
            if c in sel:
                continue
            new = sel.copy()
            new[i] = c
            ns = score(new)
            if ns >= s:
                sel, s = new, ns
        if s > best_score:
            best_score, best = s, sel
    print(f"score {best_score:.2f}")
    for i in sorted(best, key=lambda i: lightness[i]):
        print("#%02x%02x%02x" % tuple(int(v) for v in pool[i]), f"J' {lightness[i]:.1f}")


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 3)
