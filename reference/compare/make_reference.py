#!/usr/bin/python3
"""Reference values for `gapmark compare`: paired per-replicate metric values
of a baseline and a current run (INVENTED numbers from a fixed seed) and the
two-sided Wilcoxon signed-rank p-value that scipy.stats.wilcoxon gives for the
per-replicate distance from the best value of each metric:
    lower -> x, zero -> |x|, one -> |x - 1|, higher -> -x
with d = distance(current) - distance(baseline).

Run from the repository root with Debian's Python (it has scipy):
    /usr/bin/python3 reference/compare/make_reference.py
It writes wilcoxon_cases.json beside this script, with the library versions.
scipy is called with zero_method="wilcox", correction=False and method
"exact" when there are no zero and no tied differences (n <= 50), else
"approx": the rule gapmark's Wilcoxon test follows (stats/wilcoxon.hpp).
"""
import json
import os
import platform

import numpy as np
import scipy
import scipy.stats as st

HERE = os.path.dirname(os.path.abspath(__file__))
SEED = 20310106


def distance(values, direction):
    v = np.asarray(values, dtype=float)
    return {"lower": v, "zero": np.abs(v), "one": np.abs(v - 1.0), "higher": -v}[direction]


def case(name, direction, baseline, current):
    b = [float(x) for x in baseline]
    c = [float(x) for x in current]
    d = distance(c, direction) - distance(b, direction)
    nonzero = d[d != 0]
    ties = len(np.unique(np.abs(nonzero))) != len(nonzero)
    zeros = len(nonzero) != len(d)
    method = "approx" if (ties or zeros or len(nonzero) > 50) else "exact"
    res = st.wilcoxon(d, zero_method="wilcox", correction=False, alternative="two-sided", method=method)
    return {"name": name, "direction": direction, "baseline": b, "current": c,
            "scipy_method": method, "scipy_statistic": float(res.statistic), "scipy_p": float(res.pvalue)}


def main():
    rng = np.random.default_rng(SEED)
    cases = []
    base = rng.uniform(0.9, 1.1, 10)
    cases.append(case("lower, worse in most replicates (exact)", "lower", base, base + rng.normal(0.02, 0.015, 10)))
    base = rng.uniform(0.5, 0.7, 12)
    cases.append(case("lower, no systematic change (exact)", "lower", base, base + rng.normal(0.0, 0.02, 12)))
    base = rng.normal(0.0, 0.05, 8)
    cases.append(case("zero-best bias, signs differ (exact)", "zero", base, -1.5 * base + rng.normal(0.0, 0.01, 8)))
    base = rng.normal(1.0, 0.05, 9)
    cases.append(case("one-best variance ratio (exact)", "one", base, 1.0 + 1.3 * (base - 1.0)))
    base = rng.uniform(0.6, 0.8, 7)
    cases.append(case("higher is better, lower now (exact)", "higher", base, base - rng.uniform(0.01, 0.05, 7)))
    base = np.round(rng.uniform(1.0, 2.0, 11), 2)
    cur = base.copy()
    cur[:3] = base[:3]                      # three unchanged replicates: zero differences
    cur[3:] = base[3:] + np.array([0.02, 0.02, 0.05, -0.01, 0.03, 0.02, 0.04, 0.05])  # tied |d|
    cases.append(case("lower, zeros and ties (normal approximation)", "lower", base, cur))
    base = rng.uniform(0.9, 1.1, 5)
    cases.append(case("lower, five pairs only", "lower", base, base + 0.1))
    out = {
        "source": "scipy.stats.wilcoxon on invented paired values; see make_reference.py",
        "versions": {"python": platform.python_version(), "numpy": np.__version__, "scipy": scipy.__version__},
        "cases": cases,
    }
    with open(os.path.join(HERE, "wilcoxon_cases.json"), "w") as f:
        json.dump(out, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
