#!/usr/bin/python3
"""Reference values for the value-dependence screen of `gapmark profile`:
the Mann-Whitney U test, two-sided, normal approximation with the tie
correction and a continuity correction, computed with SciPy
(scipy.stats.mannwhitneyu(x, y, alternative="two-sided",
method="asymptotic", use_continuity=True)), not with gapmark's code.

Run from the repository root with Debian's Python (it needs SciPy):
    /usr/bin/python3 reference/profile/make_reference.py
It rewrites reference/profile/mann_whitney.json, read by
tests/data/value_screen_test.cpp. The samples are invented: small hand-made
ones with ties, and larger pseudo-random ones at a fixed seed.
"""
import json
import pathlib
import sys

import numpy as np
import scipy
from scipy import stats

OUT = pathlib.Path(__file__).with_name("mann_whitney.json")


def main() -> None:
    rng = np.random.default_rng(7)
    samples = [
        ([1.0, 2.0, 3.0, 4.0, 5.0], [6.0, 7.0, 8.0, 9.0, 10.0]),
        ([3.1, 3.1, 2.0, 5.5, 4.0, 3.1], [3.1, 1.0, 2.0, 2.0, 0.5, 4.0, 1.5]),
        ([0.0, 0.0, 1.0, 2.0, 2.0, 2.0, 7.0], [0.0, 1.0, 1.0, 1.0, 2.0, 3.0, 3.0, 4.0]),
        (list(np.round(rng.normal(5.0, 1.0, 40), 1)), list(np.round(rng.normal(5.6, 1.2, 300), 1))),
        (list(np.round(rng.normal(0.0, 1.0, 25), 3)), list(np.round(rng.normal(0.0, 1.0, 80), 3))),
    ]
    cases = []
    for x, y in samples:
        r = stats.mannwhitneyu(x, y, alternative="two-sided", method="asymptotic", use_continuity=True)
        # statistic is U of the first sample (SciPy >= 1.7)
        cases.append({"x": [float(v) for v in x], "y": [float(v) for v in y], "u": float(r.statistic),
                      "p": float(r.pvalue)})
    out = {"source": "scipy.stats.mannwhitneyu(alternative='two-sided', method='asymptotic', use_continuity=True)",
           "versions": {"python": sys.version.split()[0], "scipy": scipy.__version__, "numpy": np.__version__},
           "cases": cases}
    OUT.write_text(json.dumps(out, indent=1) + "\n")


if __name__ == "__main__":
    main()
