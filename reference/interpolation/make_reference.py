#!/usr/bin/python3
"""Reference values for gapmark's interpolating and seasonal fill methods.

Run with Debian's /usr/bin/python3 (it has numpy, scipy and statsmodels):

    /usr/bin/python3 reference/interpolation/make_reference.py

Writes, beside this script:
  interpolation_cases.json   gap cases with the values filled by
                             scipy.interpolate.CubicSpline(bc_type="natural"),
                             scipy.interpolate.PchipInterpolator and a short
                             numpy implementation of the modified Akima
                             definition (scipy 1.10 has only the original weights)
  seasonal_decomposition.json  complete series with the trend and seasonal
                             components of
                             statsmodels.tsa.seasonal.seasonal_decompose(model="additive")
                             and of statsmodels.tsa.seasonal.STL(robust=False)

All series are invented by this script (formulas and a seeded generator);
they describe no real measurement.
"""
import inspect
import json
import math
import pathlib
import platform

import numpy as np
import scipy
import scipy.interpolate as si
import statsmodels
from statsmodels.tsa.seasonal import STL, seasonal_decompose

HERE = pathlib.Path(__file__).resolve().parent


def to_json_list(a):
    """NaN -> null; floats at round-trip precision (json writes repr)."""
    return [None if (v is None or (isinstance(v, float) and math.isnan(v))) else float(v)
            for v in np.asarray(a, dtype=float).tolist()]


def with_gaps(y, missing):
    y = np.array(y, dtype=float)
    y[list(missing)] = np.nan
    return y


# ---------------------------------------------------------------- cases
def invented_cases():
    cases = []

    t = np.arange(24, dtype=float)
    y = 2.0 + 0.3 * t + 1.5 * np.sin(0.7 * t)
    cases.append(dict(
        name="uneven-gaps",
        note="smooth invented curve; gaps of 1, 2, 4 and 5 steps, one in the first and one in the last interval",
        values=with_gaps(y, [1, 4, 5, 8, 9, 10, 11, 15, 16, 17, 18, 19, 22])))

    inc = [0.1, 0.5, 2.0, 0.05, 3.0, 0.2, 0.2, 1.5, 0.01, 4.0, 0.3, 0.3, 0.8, 2.2, 0.05, 0.6]
    y = np.concatenate([[10.0], 10.0 + np.cumsum(inc)])
    cases.append(dict(
        name="monotone",
        note="invented increasing data with very uneven increments",
        values=with_gaps(y, [2, 3, 6, 9, 10, 13, 15])))

    y = [1, 1, 1, 1, 1, 3, 3, 3, 3, 3, 2, 2, 2, 2, 5, 5, 5, 4, 4.5, 4.5, 4.5]
    cases.append(dict(
        name="flat-parts",
        note="invented plateaus joined by steps (zero slopes, sign changes)",
        values=with_gaps(y, [3, 6, 7, 11, 15, 18])))

    t = np.arange(40, dtype=float)
    y = 10.0 * np.sin(1.3 * t) + 0.1 * t
    cases.append(dict(
        name="oscillating",
        note="invented fast oscillation crossing zero; gaps of 1 to 3 steps",
        values=with_gaps(y, [1, 2, 5, 9, 10, 11, 14, 20, 21, 27, 30, 31, 32, 38])))

    # Left end: knots at 0, 2, 3 -> h0 = 2, h1 = 1, m0 = 1, m1 = 3; the
    # three-point end slope (5*m0 - 2*m1)/3 = -1/3 has the wrong sign -> 0.
    # Right end: knots ..., 8, 10, 11 -> h = 2, 1; m = -6, 1; end slope
    # (4*1 + 6)/3 = 10/3 > 3*m_last with a sign change -> 3.
    y = [0.0, np.nan, 2.0, 5.0, 4.0, 6.0, 3.0, np.nan, 14.0, np.nan, 2.0, 3.0]
    cases.append(dict(
        name="end-rule-limits",
        note="ends built so both shape-preserving limits of the three-point end slope act",
        values=np.array(y, dtype=float)))

    y = [1.0, np.nan, 4.0, np.nan, np.nan, np.nan, 2.5]
    cases.append(dict(name="three-points", note="only three observations",
                      values=np.array(y, dtype=float)))

    y = [3.0, np.nan, np.nan, np.nan, np.nan, -2.0]
    cases.append(dict(name="two-points", note="only two observations",
                      values=np.array(y, dtype=float)))

    t = np.arange(18, dtype=float)
    y = 5.0 + np.cos(0.5 * t) * (1 + 0.1 * t)
    cases.append(dict(
        name="edge-gaps",
        note="leading and trailing gaps: references cover the observed span only (outside it: null)",
        values=with_gaps(y, [0, 1, 2, 6, 7, 11, 16, 17])))
    return cases


# ------------------------------------------------------ modified Akima
def akima_weighted_slopes(x, y):
    """Derivatives at the knots by Akima's (1970) construction with the
    modified weights w1 = |m[i+1] - m[i]| + |m[i+1] + m[i]|/2,
    w2 = |m[i-1] - m[i-2]| + |m[i-1] + m[i-2]|/2, and Akima's end rule of two
    extra slopes on each side by quadratic extrapolation
    (m[-1] = 2 m[0] - m[1], m[-2] = 2 m[-1] - m[0], likewise at the right).
    Where w1 + w2 = 0 the derivative is the mean of m[i-1] and m[i]."""
    m = np.diff(y) / np.diff(x)
    mm1 = 2 * m[0] - m[1]
    mm2 = 2 * mm1 - m[0]
    mp1 = 2 * m[-1] - m[-2]
    mp2 = 2 * mp1 - m[-1]
    me = np.concatenate([[mm2, mm1], m, [mp1, mp2]])  # me[k + 2] = m[k]
    n = len(x)
    s = np.empty(n)
    for i in range(n):
        a, b, c, d = me[i], me[i + 1], me[i + 2], me[i + 3]  # m[i-2], m[i-1], m[i], m[i+1]
        w1 = abs(d - c) + abs(d + c) / 2
        w2 = abs(b - a) + abs(b + a) / 2
        s[i] = (b + c) / 2 if w1 + w2 == 0 else (w1 * b + w2 * c) / (w1 + w2)
    return s


def fill_inside(values, curve):
    """Missing points strictly inside the observed span get curve(i); points
    outside it stay missing; observed points are copied."""
    out = values.copy()
    obs = np.flatnonzero(~np.isnan(values))
    lo, hi = obs[0], obs[-1]
    idx = np.arange(len(values))
    inside = np.isnan(values) & (idx > lo) & (idx < hi)
    out[inside] = curve(idx[inside].astype(float))
    return out


def interpolation_reference():
    out = []
    for case in invented_cases():
        v = case["values"]
        obs = np.flatnonzero(~np.isnan(v))
        x, y = obs.astype(float), v[obs]
        entry = dict(name=case["name"], note=case["note"], values=to_json_list(v))
        entry["natural_spline"] = to_json_list(
            fill_inside(v, si.CubicSpline(x, y, bc_type="natural")))
        entry["pchip"] = to_json_list(fill_inside(v, si.PchipInterpolator(x, y)))
        if len(x) >= 4:
            herm = si.CubicHermiteSpline(x, y, akima_weighted_slopes(x, y))
            entry["akima_weighted"] = to_json_list(fill_inside(v, herm))
        else:
            entry["akima_weighted"] = None
        out.append(entry)
    return out


# ------------------------------------------------ seasonal decomposition
def decomposition_reference():
    rng = np.random.default_rng(20260301)
    cases = []
    for name, period, n in [("even-period", 12, 53), ("odd-period", 7, 38)]:
        t = np.arange(n, dtype=float)
        shape = np.sin(2 * np.pi * (t % period) / period) * 4 + ((t % period) == 2) * 3.0
        x = 40.0 + 0.25 * t + 0.002 * t ** 2 + shape + rng.normal(0.0, 0.5, n)
        res = seasonal_decompose(x, model="additive", period=period)
        stl = STL(x, period=period, robust=False)
        fit = stl.fit()
        cases.append(dict(
            name=name, period=period,
            note="invented: trend + seasonal shape + seeded normal noise (numpy default_rng(20260301))",
            values=to_json_list(x), trend=to_json_list(res.trend),
            seasonal=to_json_list(res.seasonal),
            stl_config={k: (bool(v) if isinstance(v, (bool, np.bool_)) else int(v)) for k, v in stl.config.items()},
            stl_trend=to_json_list(fit.trend), stl_seasonal=to_json_list(fit.seasonal)))
    return cases


def versions():
    return {
        "python": platform.python_version(),
        "numpy": np.__version__,
        "scipy": scipy.__version__,
        "statsmodels": statsmodels.__version__,
        "scipy_akima_signature": str(inspect.signature(si.Akima1DInterpolator.__init__)),
    }


def main():
    interp = {
        "generated_by": "reference/interpolation/make_reference.py",
        "versions": versions(),
        "sources": {
            "natural_spline": "scipy.interpolate.CubicSpline(x, y, bc_type='natural')",
            "pchip": "scipy.interpolate.PchipInterpolator(x, y)",
            "akima_weighted": "numpy implementation of Akima (1970) with the modified weights, "
                      "evaluated by scipy.interpolate.CubicHermiteSpline",
        },
        "knots": "x = index of each observed point, y = its value",
        "cases": interpolation_reference(),
    }
    (HERE / "interpolation_cases.json").write_text(json.dumps(interp, indent=1) + "\n")
    decomp = {
        "generated_by": "reference/interpolation/make_reference.py",
        "versions": versions(),
        "source": "trend, seasonal: statsmodels.tsa.seasonal.seasonal_decompose(x, model='additive', period=p); "
                  "stl_trend, stl_seasonal: statsmodels.tsa.seasonal.STL(x, period=p, robust=False).fit() "
                  "(defaults: seasonal=7, degrees 1, jumps 1, 5 inner passes, no outer passes)",
        "cases": decomposition_reference(),
    }
    (HERE / "seasonal_decomposition.json").write_text(json.dumps(decomp, indent=1) + "\n")


if __name__ == "__main__":
    main()
