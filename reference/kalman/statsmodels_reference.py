"""Reference values for the kalman fill method from statsmodels'
UnobservedComponents with exact diffuse initialisation, on the open data that
r_reference.R exported (R's datasets package) to reference/kalman/data.csv,
and on one invented hourly series made here (invented_hourly, a fixed seed).

Run from the repository root:  /usr/bin/python3 reference/kalman/statsmodels_reference.py
Writes reference/kalman/statsmodels_reference.json.

Seasonal cases come in two forms: the dummy seasonal (`seasonal=period`,
harmonics 0) and the trigonometric one (`freq_seasonal=[{period, harmonics}]`,
one variance shared by all harmonics).

For each case: the maximum-likelihood variances (best of several optimiser
runs, see fit_best) with the log-likelihood, and at fixed variances the
log-likelihood and the smoothed signal Z a_t with its variance Z V_t Z'.

A second, independent computation (numpy dense linear algebra, see dense_gls):
with a flat prior on the initial state, the smoothed signal is the
generalised-least-squares (universal kriging) predictor from the joint
covariance of all observations, and the diffuse log-likelihood differs from
the restricted (REML) log-likelihood only by a constant. It stores the
smoothed signal and its variance at the fixed variances and the change of
the log-likelihood from the fixed to the ML variances, and the first index
from which statsmodels' smoothed values agree with it to 1e-6 relative
(statsmodels, like any filter that removes the flat prior with the first m
observations, loses digits there when those observations barely separate the
states).
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


def invented_hourly(n=720, seed=20261201):
    """Invented data (no real source): an hourly series with a daily cycle of
    two harmonics whose shape drifts slowly, a random-walk level with a small
    drifting slope, and noise; values rounded to 4 decimals."""
    rng = np.random.default_rng(seed)
    t = np.arange(n)
    slope = np.cumsum(0.002 * rng.standard_normal(n))
    level = 20 + np.cumsum(slope + 0.05 * rng.standard_normal(n))
    amp1 = 3.0 + np.cumsum(0.01 * rng.standard_normal(n))
    amp2 = 1.0 + np.cumsum(0.01 * rng.standard_normal(n))
    season = amp1 * np.sin(2 * np.pi * t / 24) + amp2 * np.cos(4 * np.pi * t / 24 + 0.5)
    return np.round(level + season + 0.4 * rng.standard_normal(n), 4)


def random_gaps(y, share, seed):
    """Each point hidden with probability `share` (fixed seed), first and last kept."""
    y = y.copy()
    hide = np.random.default_rng(seed).random(len(y)) < share
    hide[0] = hide[-1] = False
    y[hide] = np.nan
    return y


def with_gaps(y, ranges):
    y = y.copy()
    for a, b in ranges:  # 1-based inclusive
        y[a - 1:b] = np.nan
    return y


def model(y, kind, period, harmonics):
    kwargs = dict(level="local level" if kind == "level" else "local linear trend",
                  use_exact_diffuse=True)
    if kind == "seasonal" and harmonics == 0:
        kwargs["seasonal"] = period
    elif kind == "seasonal":
        kwargs["freq_seasonal"] = [{"period": period, "harmonics": harmonics}]
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


def system(kind, period, harmonics, variances):
    """T, Z and the state disturbance covariance Q, written from the model definitions."""
    m = 1 if kind == "level" else 2
    seasonal = 0 if kind != "seasonal" else (2 * harmonics if harmonics else period - 1)
    m += seasonal
    T = np.zeros((m, m)); Z = np.zeros(m); Q = np.zeros((m, m))
    T[0, 0] = 1; Z[0] = 1; Q[0, 0] = variances[1]
    if kind != "level":
        T[0, 1] = T[1, 1] = 1; Q[1, 1] = variances[2]
    if seasonal and harmonics:
        for j in range(1, harmonics + 1):
            p = 2 * j; lam = 2 * np.pi * j / period
            T[p:p + 2, p:p + 2] = [[np.cos(lam), np.sin(lam)], [-np.sin(lam), np.cos(lam)]]
            Z[p] = 1; Q[p, p] = Q[p + 1, p + 1] = variances[3]
    elif seasonal:
        T[2, 2:] = -1
        for j in range(3, m):
            T[j, j - 1] = 1
        Z[2] = 1; Q[2, 2] = variances[3]
    return T, Z, Q


def dense_gls(y, kind, period, harmonics, variances):
    """Smoothed signal mean and variance, and the REML log-likelihood, from the
    joint covariance of all points with a flat prior on the initial state."""
    T, Z, Q = system(kind, period, harmonics, variances)
    n, m = len(y), len(Z)
    G = np.zeros((n, m)); power = np.eye(m); V = [np.zeros((m, m))]
    for t in range(n):  # signal_t = G_t a_1 + u_t, u_t from the disturbances
        G[t] = Z @ power; power = T @ power
        if t + 1 < n:
            V.append(T @ V[-1] @ T.T + Q)
    C = np.zeros((n, n))
    for s in range(n):
        v = V[s] @ Z
        for t in range(s, n):
            C[t, s] = C[s, t] = Z @ v
            v = T @ v
    o = ~np.isnan(y)
    Cyy = C[np.ix_(o, o)] + variances[0] * np.eye(o.sum()); H = G[o]; yo = y[o]
    chol = np.linalg.cholesky(Cyy)
    Hw = np.linalg.solve(chol, H); yw = np.linalg.solve(chol, yo)
    q, r = np.linalg.qr(Hw)
    resid = yw - q @ (q.T @ yw)
    reml = -0.5 * (o.sum() * np.log(2 * np.pi) + 2 * np.sum(np.log(np.diag(chol)))
                   + 2 * np.sum(np.log(np.abs(np.diag(r)))) + resid @ resid)
    Ci = np.linalg.inv(Cyy); Csy = C[:, o]
    M = H.T @ Ci @ H
    a1 = np.linalg.solve(M, H.T @ Ci @ yo)
    mean = G @ a1 + Csy @ Ci @ (yo - H @ a1)
    B = G - Csy @ Ci @ H
    var = (np.diag(C) - np.einsum("ij,jk,ik->i", Csy, Ci, Csy)
           + np.einsum("ij,jk,ik->i", B, np.linalg.inv(M), B))
    return mean, var, reml


def agrees_from(ours, theirs, floor):
    """First index from which |ours - theirs| <= 1e-6 max(|theirs|, floor) at every later point."""
    bad = np.abs(ours - theirs) > 1e-6 * np.maximum(np.abs(theirs), floor)
    return int(np.nonzero(bad)[0][-1] + 1) if bad.any() else 0


def smoothed_signal(res):
    z = np.asarray(res.model.ssm["design"]).reshape(-1)  # one row, time-invariant
    mean = z @ res.smoothed_state
    cov = res.smoothed_state_cov
    var = np.einsum("i,ijt,j->t", z, cov, z)
    return mean, var


def listed(a):
    return [None if not np.isfinite(v) else float(v) for v in a]


CASES = [
    # name, series, model, period, harmonics (0 = dummy seasonal), gaps (1-based inclusive ranges,
    # or a share hidden at random), fixed variances (irregular first)
    ("nile_full", "nile", "level", 0, 0, [], [15099.0, 1469.1]),
    ("nile_gaps", "nile", "level", 0, 0, [(21, 40), (61, 80)], [15099.0, 1469.1]),
    ("lake_trend_full", "lake_huron", "trend", 0, 0, [], [0.30, 0.25, 0.002]),
    ("lake_trend_gaps", "lake_huron", "trend", 0, 0, [(1, 6), (30, 45), (90, 98)], [0.30, 0.25, 0.002]),
    ("ukgas_seasonal_full", "log_ukgas", "seasonal", 4, 0, [], [0.0012, 0.0003, 0.00002, 0.0015]),
    ("ukgas_seasonal_gaps", "log_ukgas", "seasonal", 4, 0, [(1, 3), (40, 52), (100, 108)],
     [0.0012, 0.0003, 0.00002, 0.0015]),
    ("drivers_seasonal_full", "log_ukdriverdeaths", "seasonal", 12, 0, [], [0.0035, 0.0009, 1e-6, 0.00005]),
    ("drivers_seasonal_gaps", "log_ukdriverdeaths", "seasonal", 12, 0, [(1, 7), (60, 84), (150, 160)],
     [0.0035, 0.0009, 1e-6, 0.00005]),
    # Trigonometric seasonals.
    ("ukgas_trig1_gaps", "log_ukgas", "seasonal", 4, 1, [(1, 3), (40, 52), (100, 108)],
     [0.0012, 0.0003, 0.00002, 0.0015]),
    ("drivers_trig2_full", "log_ukdriverdeaths", "seasonal", 12, 2, [], [0.0035, 0.0009, 1e-6, 0.00005]),
    ("drivers_trig2_gaps", "log_ukdriverdeaths", "seasonal", 12, 2, [(1, 7), (60, 84), (150, 160)],
     [0.0035, 0.0009, 1e-6, 0.00005]),
    ("drivers_trig5_gaps", "log_ukdriverdeaths", "seasonal", 12, 5, [(1, 7), (60, 84), (150, 160)],
     [0.0035, 0.0009, 1e-6, 0.00005]),
    ("invented_hourly_trig3_gaps", "invented_hourly", "seasonal", 24, 3, {"share": 0.15, "seed": 7,
                                                                         "ranges": [(1, 5), (300, 340)]},
     [0.16, 0.0025, 4e-6, 1e-4]),
]

NAMES = {"sigma2.irregular": "irregular", "sigma2.level": "level", "sigma2.trend": "slope",
         "sigma2.seasonal": "seasonal"}


def variance_name(param):
    return "seasonal" if param.startswith("sigma2.freq_seasonal_") else NAMES[param]


def series_with_gaps(series, gaps):
    y = invented_hourly() if series == "invented_hourly" else load(series)
    if isinstance(gaps, dict):
        return with_gaps(random_gaps(y, gaps["share"], gaps["seed"]), gaps["ranges"])
    return with_gaps(y, gaps)

out = {
    "generator": "reference/kalman/statsmodels_reference.py",
    "versions": {"python": platform.python_version(), "statsmodels": statsmodels.__version__,
                 "numpy": np.__version__, "scipy": scipy.__version__},
    "model": ("statsmodels UnobservedComponents, use_exact_diffuse=True; seasonal=period (harmonics 0) or "
              "freq_seasonal=[{period, harmonics}]; signal = design @ smoothed_state"),
    "cases": {},
}
for name, series, kind, period, harmonics, gaps, fixed in CASES:
    y = series_with_gaps(series, gaps)
    mod = model(y, kind, period, harmonics)
    order = [variance_name(p) for p in mod.param_names]
    # statsmodels orders its variances irregular, level, trend, seasonal, as we do.
    assert order == ["irregular", "level"] + (["slope"] if kind != "level" else []) + (
        ["seasonal"] if kind == "seasonal" else []), order
    best = fit_best(mod)
    res = mod.smooth(np.array(fixed))
    mean, var = smoothed_signal(res)
    gls_mean, gls_var, reml_fixed = dense_gls(y, kind, period, harmonics, fixed)
    reml_ml = dense_gls(y, kind, period, harmonics, list(best.params))[2]
    from_index = max(agrees_from(mean, gls_mean, 1.0), agrees_from(var, gls_var, 1e-12))
    out["cases"][name] = {
        "series": series, "model": kind, "period": period, "harmonics": harmonics, "gaps": gaps,
        "values": listed(y),
        "ml_variances": [float(v) for v in best.params], "ml_loglik": float(best.llf),
        "fixed_variances": fixed, "fixed_loglik": float(res.llf),
        "fixed_smoothed_signal": listed(mean), "fixed_smoothed_signal_variance": listed(var),
        "dense_smoothed_signal": listed(gls_mean), "dense_smoothed_signal_variance": listed(gls_var),
        "dense_loglik_ml_minus_fixed": float(reml_ml - reml_fixed),
        "statsmodels_agrees_with_dense_from": from_index,
    }
    print(name, dict(zip(order, best.params)), best.llf, res.llf, "statsmodels agrees with dense from", from_index,
          "loglik change: statsmodels", best.llf - res.llf, "dense", reml_ml - reml_fixed)

with open(OUT, "w") as f:
    json.dump(out, f, indent=1)
    f.write("\n")
