"""Reference values for the kalman fill method from statsmodels'
UnobservedComponents with exact diffuse initialisation, on the open data that
r_reference.R exported (R's datasets package) to reference/kalman/data.csv.

Run from the repository root:  /usr/bin/python3 reference/kalman/statsmodels_reference.py
Writes reference/kalman/statsmodels_reference.json.

For each case: the maximum-likelihood variances (best of several optimiser
runs, see fit_best) with the log-likelihood, and at fixed variances the
log-likelihood and the smoothed signal Z a_t with its variance Z V_t Z'.
"""
import csv
import json
import platform
import warnings

import numpy as np
import scipy
import statsmodels
from statsmodels.tsa.statespace.structural import UnobservedComponents

warnings.simplefilter("ignore")
OUT = "reference/kalman/statsmodels_reference.json"


def load(series):
    rows = [r for r in csv.DictReader(open("reference/kalman/data.csv")) if r["series"] == series]
    return np.array([float(r["value"]) if r["value"] != "" else np.nan for r in rows])


def with_gaps(y, ranges):
    y = y.copy()
    for a, b in ranges:  # 1-based inclusive
        y[a - 1:b] = np.nan
    return y


def model(y, kind, period):
    kwargs = dict(level="local level" if kind == "level" else "local linear trend",
                  use_exact_diffuse=True)
    if kind == "seasonal":
        kwargs["seasonal"] = period
    return UnobservedComponents(y, **kwargs)


def fit_best(mod):
    """Several optimiser runs from statsmodels' own start and scaled starts; the best log-likelihood."""
    best = None
    start = np.asarray(mod.start_params)
    starts = [start] + [start * f for f in (0.1, 10.0)]
    for s in starts:
        for method in ("lbfgs", "nm", "powell"):
            try:
                res = mod.fit(start_params=s, method=method, disp=False, maxiter=20000)
                res = mod.fit(start_params=res.params, method="lbfgs", disp=False, maxiter=2000)
            except Exception:  # an optimiser that fails is simply skipped
                continue
            if np.isfinite(res.llf) and (best is None or res.llf > best.llf):
                best = res
    return best


def smoothed_signal(res):
    z = np.asarray(res.model.ssm["design"]).reshape(-1)  # one row, time-invariant
    mean = z @ res.smoothed_state
    cov = res.smoothed_state_cov
    var = np.einsum("i,ijt,j->t", z, cov, z)
    return mean, var


def listed(a):
    return [None if not np.isfinite(v) else float(v) for v in a]


CASES = [
    # name, series, model, period, gaps (1-based inclusive ranges), fixed variances (irregular first)
    ("nile_full", "nile", "level", 0, [], [15099.0, 1469.1]),
    ("nile_gaps", "nile", "level", 0, [(21, 40), (61, 80)], [15099.0, 1469.1]),
    ("lake_trend_full", "lake_huron", "trend", 0, [], [0.30, 0.25, 0.002]),
    ("lake_trend_gaps", "lake_huron", "trend", 0, [(1, 6), (30, 45), (90, 98)], [0.30, 0.25, 0.002]),
    ("ukgas_seasonal_full", "log_ukgas", "seasonal", 4, [], [0.0012, 0.0003, 0.00002, 0.0015]),
    ("ukgas_seasonal_gaps", "log_ukgas", "seasonal", 4, [(1, 3), (40, 52), (100, 108)],
     [0.0012, 0.0003, 0.00002, 0.0015]),
    ("drivers_seasonal_full", "log_ukdriverdeaths", "seasonal", 12, [], [0.0035, 0.0009, 1e-6, 0.00005]),
    ("drivers_seasonal_gaps", "log_ukdriverdeaths", "seasonal", 12, [(1, 7), (60, 84), (150, 160)],
     [0.0035, 0.0009, 1e-6, 0.00005]),
]

NAMES = {"sigma2.irregular": "irregular", "sigma2.level": "level", "sigma2.trend": "slope",
         "sigma2.seasonal": "seasonal"}

out = {
    "generator": "reference/kalman/statsmodels_reference.py",
    "versions": {"python": platform.python_version(), "statsmodels": statsmodels.__version__,
                 "numpy": np.__version__, "scipy": scipy.__version__},
    "model": "statsmodels UnobservedComponents, use_exact_diffuse=True; signal = design @ smoothed_state",
    "cases": {},
}
for name, series, kind, period, gaps, fixed in CASES:
    y = with_gaps(load(series), gaps)
    mod = model(y, kind, period)
    order = [NAMES[p] for p in mod.param_names]
    # statsmodels orders its variances irregular, level, trend, seasonal, as we do.
    assert order == ["irregular", "level"] + (["slope"] if kind != "level" else []) + (
        ["seasonal"] if kind == "seasonal" else []), order
    best = fit_best(mod)
    res = mod.smooth(np.array(fixed))
    mean, var = smoothed_signal(res)
    out["cases"][name] = {
        "series": series, "model": kind, "period": period, "gaps": gaps,
        "values": listed(y),
        "ml_variances": [float(v) for v in best.params], "ml_loglik": float(best.llf),
        "fixed_variances": fixed, "fixed_loglik": float(res.llf),
        "fixed_smoothed_signal": listed(mean), "fixed_smoothed_signal_variance": listed(var),
    }
    print(name, dict(zip(order, best.params)), best.llf, res.llf)

with open(OUT, "w") as f:
    json.dump(out, f, indent=1)
    f.write("\n")
