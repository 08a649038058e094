#!/usr/bin/python3
"""Reference fills for the basic methods, computed with numpy and pandas.

    /usr/bin/python3 reference/basic_fills/make_reference.py

writes reference/basic_fills/basic_fills.json. Sources:
  linear          numpy.interp over the observed (index, value) pairs; outside
                  the observed span numpy.interp holds the end values, which is
                  gapmark's edges=nearest policy
  carry-forward   pandas.Series.ffill, then bfill for a leading gap (edges=nearest)
  carry-backward  pandas.Series.bfill, then ffill for a trailing gap
  mean / median   numpy.nanmean / numpy.nanmedian
"""
import json
import pathlib

import numpy as np
import pandas as pd

rng = np.random.default_rng(20261201)
cases = []
for name, n, p_missing in [("short", 12, 0.3), ("uneven", 60, 0.35), ("long-gaps", 200, 0.5)]:
    y = np.cumsum(rng.normal(0.0, 1.0, n)) + 5.0
    missing = rng.random(n) < p_missing
    missing[0] = True  # a leading gap
    missing[-2:] = True  # a trailing gap
    if name == "long-gaps":
        missing[50:90] = True
    x = np.where(missing, np.nan, y)
    idx = np.arange(n)
    obs = ~np.isnan(x)
    s = pd.Series(x)
    cases.append({
        "name": name,
        "input": [None if np.isnan(v) else float(v) for v in x],
        "linear": np.interp(idx, idx[obs], x[obs]).tolist(),
        "carry-forward": s.ffill().bfill().tolist(),
        "carry-backward": s.bfill().ffill().tolist(),
        "mean": float(np.nanmean(x)),
        "median": float(np.nanmedian(x)),
    })

out = {
    "source": "numpy.interp, pandas.Series.ffill/bfill, numpy.nanmean/nanmedian",
    "versions": {"numpy": np.__version__, "pandas": pd.__version__},
    "cases": cases,
}
path = pathlib.Path(__file__).with_name("basic_fills.json")
path.write_text(json.dumps(out, indent=1) + "\n")
print(f"wrote {path}")
