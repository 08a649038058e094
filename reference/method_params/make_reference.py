#!/usr/bin/python3
"""Reference fills for the parameters every method takes (bounds, transform, period).

    /usr/bin/python3 reference/method_params/make_reference.py

writes reference/method_params/method_params.json. Sources:
  transform=log    numpy.exp of numpy.interp over (index, numpy.log(value)) pairs
  transform=log1p  numpy.expm1 of numpy.interp over (index, numpy.log1p(value))
  bounds=LO,HI     scipy.interpolate.CubicSpline(bc_type="natural") through the
                   observed points, then numpy.clip at the missing points; the
                   count is how many missing points numpy.clip moved
  period=N         pandas groupby(index % N).mean() of the observed values
The data are invented here (a seeded positive random walk with gaps).
"""
import json
import pathlib

import numpy as np
import pandas as pd
import scipy
from scipy.interpolate import CubicSpline

rng = np.random.default_rng(20261202)
n = 48
y = np.exp(np.cumsum(rng.normal(0.0, 0.3, n))) * 10.0
y[7] = 0.0  # one zero: log refuses it, log1p takes it
missing = rng.random(n) < 0.3
missing[[0, 7, 20, 21, 22, 23, 24, 25, 26, n - 1]] = [True, False, True, True, True, True, True, True, True, True]
x = np.where(missing, np.nan, y)
idx = np.arange(n)
obs = ~np.isnan(x)

x_pos = np.where(obs & (x > 0), x, np.nan)  # the log case drops the zero from the input
obs_pos = ~np.isnan(x_pos)

log_fill = np.where(obs_pos, x_pos, np.exp(np.interp(idx, idx[obs_pos], np.log(x_pos[obs_pos]))))
log1p_fill = np.where(obs, x, np.expm1(np.interp(idx, idx[obs], np.log1p(x[obs]))))

first, last = idx[obs][0], idx[obs][-1]
spline = CubicSpline(idx[obs], x[obs], bc_type="natural")
raw = spline(idx)
raw[:first] = x[first]   # edges=nearest
raw[last + 1:] = x[last]
lo, hi = 2.0, 15.0  # narrower than the data, so that several fills move
clipped = np.clip(raw, lo, hi)
moved = int(np.sum((clipped != raw) & ~obs))
bounded = np.where(obs, x, clipped)

by_phase = {}
for period in (3, 5):
    s = pd.Series(x)
    means = s.groupby(idx % period).mean()
    by_phase[str(period)] = np.where(obs, x, means.to_numpy()[idx % period]).tolist()

def listed(a):
    return [None if np.isnan(v) else float(v) for v in a]

out = {
    "source": "numpy.interp/log/exp/log1p/expm1/clip, scipy.interpolate.CubicSpline(bc_type='natural'), pandas groupby mean",
    "versions": {"numpy": np.__version__, "scipy": scipy.__version__, "pandas": pd.__version__},
    "input": listed(x),
    "input_positive": listed(x_pos),
    "linear_log": log_fill.tolist(),
    "linear_log1p": log1p_fill.tolist(),
    "bounds": [lo, hi],
    "natural_spline_unbounded": raw.tolist(),
    "natural_spline_bounded": bounded.tolist(),
    "natural_spline_clipped": moved,
    "seasonal_mean_by_period": by_phase,
}
path = pathlib.Path(__file__).with_name("method_params.json")
path.write_text(json.dumps(out, indent=1) + "\n")
print(f"wrote {path}: {moved} points clipped")
