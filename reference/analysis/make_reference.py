#!/usr/bin/python3
"""Reference values for the equivalence test and the bootstrap interval used
by the summary (include/gapmark/stats/equivalence.hpp, bootstrap.hpp).

Run with Debian's Python (it has scipy and statsmodels) from the repository root:
    /usr/bin/python3 reference/analysis/make_reference.py
The data are invented by the generator below with a fixed seed (20261202);
they describe nothing real. Same libraries, same bytes.

- tost.json: statsmodels.stats.weightstats.ttost_paired(x1, x2, low, upp) on
  invented paired samples; the library's paired_tost takes d = x1 - x2.
- bootstrap.json: scipy.stats.bootstrap((x,), np.mean, method="percentile",
  confidence_level=level, n_resamples=200000) on invented samples (a
  Monte Carlo reference: the library draws its own seeded resamples, so the
  test allows a tolerance), and numpy.percentile (the default "linear"
  method) of fixed vectors for the quantile rule itself.
"""
import json
import os
import platform

import numpy as np
import scipy
import scipy.stats as st
import statsmodels
from statsmodels.stats.weightstats import ttost_paired

HERE = os.path.dirname(os.path.abspath(__file__))
rng = np.random.default_rng(20261202)
VERSIONS = {"python": platform.python_version(), "numpy": np.__version__, "scipy": scipy.__version__,
            "statsmodels": statsmodels.__version__}


def write(name, description, cases):
    with open(os.path.join(HERE, name), "w") as f:
        json.dump({"description": description, "generated_by": "reference/analysis/make_reference.py",
                   "versions": VERSIONS, "cases": cases}, f, indent=1)
        f.write("\n")


# ---------------------------------------------------------------- TOST
tost = []
for name, n, shift, spread, low, upp in [
        ("inside_n10", 10, 0.01, 0.02, -0.05, 0.05),
        ("outside_n10", 10, 0.08, 0.02, -0.05, 0.05),
        ("edge_n6", 6, 0.03, 0.03, -0.05, 0.05),
        ("asymmetric_n25", 25, -0.02, 0.05, -0.1, 0.04),
        ("negative_n8", 8, -0.2, 0.1, -0.15, 0.15),
        ("two_points", 2, 0.0, 0.01, -0.05, 0.05)]:
    base = rng.uniform(1.0, 2.0, n)
    x2 = base
    x1 = base + shift + rng.normal(0, spread, n)
    p, (t1, p1, df1), (t2, p2, df2) = ttost_paired(x1, x2, low, upp)
    tost.append({"name": name, "x1": [float(v) for v in x1], "x2": [float(v) for v in x2],
                 "low": low, "upp": upp, "p": float(p), "t_low": float(t1), "p_low": float(p1),
                 "t_high": float(t2), "p_high": float(p2), "df": float(df1)})
write("tost.json", "Paired TOST: statsmodels.stats.weightstats.ttost_paired(x1, x2, low, upp) -> "
      "(p, (t_low, p_low, df), (t_high, p_high, df)).", tost)

# ---------------------------------------------------------------- bootstrap
boot = []
for name, n, level, draw in [
        ("rmse_like_n10", 10, 0.95, lambda n: rng.gamma(4.0, 0.1, n)),
        ("skewed_n12", 12, 0.95, lambda n: rng.lognormal(0.0, 1.0, n)),
        ("near_zero_n7", 7, 0.95, lambda n: rng.exponential(0.01, n)),
        ("level90_n30", 30, 0.90, lambda n: rng.normal(5.0, 1.0, n))]:
    x = draw(n)
    res = st.bootstrap((x,), np.mean, confidence_level=level, method="percentile", n_resamples=200000,
                       random_state=np.random.default_rng(7))
    boot.append({"name": name, "x": [float(v) for v in x], "level": level,
                 "low": float(res.confidence_interval.low), "high": float(res.confidence_interval.high),
                 "bootstrap_sd": float(res.standard_error)})
quantiles = []
for name, v in [("five", [1.0, 2.0, 4.0, 8.0, 16.0]), ("two", [0.5, 1.5]), ("one", [3.0]),
                ("ten", sorted(rng.normal(size=10).tolist()))]:
    qs = [0.0, 0.025, 0.1, 0.5, 0.9, 0.975, 1.0]
    quantiles.append({"name": name, "sorted": v, "q": qs,
                      "value": [float(np.percentile(v, 100 * q)) for q in qs]})
write("bootstrap.json", "Percentile bootstrap interval of the mean: scipy.stats.bootstrap((x,), np.mean, "
      "method='percentile', confidence_level=level, n_resamples=200000, random_state=default_rng(7)); "
      "quantiles: numpy.percentile(v, 100 q) (method 'linear').", {"intervals": boot, "quantiles": quantiles})
print("wrote tost.json and bootstrap.json to", HERE)
