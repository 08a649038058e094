#!/usr/bin/python3
"""The hand-written pipeline a user would write today with pandas, scipy and
statsmodels: for every mask exported by `gapmark mask --flags`, fill every
series with each method, score the hidden points (MAE, RMSE, bias), average
over replicates and rank the methods per (series, scheme, rate) cell.

It does the work `gapmark run` does for the same spec with "metrics":
["error"], with the same methods where these libraries have them:

  linear          numpy.interp (nearest value before the first / after the last observation)
  natural-spline  scipy.interpolate.CubicSpline(bc_type="natural"), nearest value at the edges
  pchip           scipy.interpolate.PchipInterpolator, nearest value at the edges
  carry-forward   pandas ffill, then bfill for a leading gap
  seasonal-mean   pandas groupby(index mod period).mean(), overall mean for an empty phase
  kalman-level    statsmodels UnobservedComponents("local level"), ML fit (its defaults:
                  L-BFGS, approximate diffuse start), smoothed level; nearest value at the edges

Each fill is timed; the time to read the masks and to score and rank is
counted in the total. The library versions are printed with the times.

Usage:
  /usr/bin/python3 python_pipeline.py --truth rooms.csv --masks MASK_DIR --period 24 \
      [--series N] [--methods linear,pchip,...] --out cells.csv --trials trials.csv

MASK_DIR holds files named SCHEME@RATE@REPLICATE.csv written by
`gapmark mask --flags` (see compare_python.sh). --series N keeps the first N
series (to scale the run down). Prints the time spent filling and scoring.
"""
import argparse
import glob
import os
import sys
import time
import warnings

import numpy as np
import pandas as pd
import scipy
import statsmodels
from scipy.interpolate import CubicSpline, PchipInterpolator
from statsmodels.tsa.statespace.structural import UnobservedComponents


def edges_nearest(filled, known):
    first, last = known[0], known[-1]
    filled[:first] = filled[first]
    filled[last + 1:] = filled[last]
    return filled


def fill_linear(y, period):
    idx = np.arange(len(y))
    known = ~np.isnan(y)
    out = y.copy()
    out[~known] = np.interp(idx[~known], idx[known], y[known])
    return out


def fill_natural_spline(y, period):
    idx = np.arange(len(y))
    known = np.flatnonzero(~np.isnan(y))
    out = y.copy()
    spline = CubicSpline(known, y[known], bc_type="natural")
    gaps = np.isnan(y)
    out[gaps] = spline(idx[gaps])
    return edges_nearest(out, known)


def fill_pchip(y, period):
    idx = np.arange(len(y))
    known = np.flatnonzero(~np.isnan(y))
    out = y.copy()
    gaps = np.isnan(y)
    out[gaps] = PchipInterpolator(known, y[known], extrapolate=False)(idx[gaps])
    return edges_nearest(out, known)


def fill_carry_forward(y, period):
    return pd.Series(y).ffill().bfill().to_numpy()


def fill_seasonal_mean(y, period):
    s = pd.Series(y)
    phase = np.arange(len(y)) % period
    means = s.groupby(phase).mean()
    level = means.reindex(range(period)).fillna(s.mean()).to_numpy()
    out = y.copy()
    gaps = np.isnan(y)
    out[gaps] = level[phase[gaps]]
    return out


def fill_kalman_level(y, period):
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        model = UnobservedComponents(y, level="local level")
        fit = model.fit(disp=False)
    out = y.copy()
    gaps = np.isnan(y)
    out[gaps] = fit.smoothed_state[0][gaps]
    return edges_nearest(out, np.flatnonzero(~gaps))


METHODS = {
    "linear": fill_linear,
    "natural-spline": fill_natural_spline,
    "pchip": fill_pchip,
    "carry-forward": fill_carry_forward,
    "seasonal-mean": fill_seasonal_mean,
    "kalman-level": fill_kalman_level,
}


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--truth", required=True)
    parser.add_argument("--masks", required=True)
    parser.add_argument("--period", type=int, default=24)
    parser.add_argument("--series", type=int, default=0)
    parser.add_argument("--methods", default=",".join(METHODS))
    parser.add_argument("--out", required=True)
    parser.add_argument("--trials", default="")
    args = parser.parse_args()

    started = time.perf_counter()
    truth = pd.read_csv(args.truth, index_col=0)
    columns = list(truth.columns)
    if args.series:
        columns = columns[: args.series]
    methods = args.methods.split(",")
    rows = []
    seconds = {m: 0.0 for m in methods}
    for path in sorted(glob.glob(os.path.join(args.masks, "*.csv"))):
        scheme, rate, replicate = os.path.basename(path)[:-4].split("@")
        masked = pd.read_csv(path, index_col=0)
        for column in columns:
            y_true = truth[column].to_numpy(dtype=float)
            y = masked[column].to_numpy(dtype=float)
            hidden = masked[column + "_masked"].to_numpy() == 1
            if not hidden.any():
                continue
            for method in methods:
                t0 = time.perf_counter()
                try:
                    filled = METHODS[method](y, args.period)
                    status = "ok"
                except Exception as error:  # a failed cell, as gapmark records it
                    filled = np.full_like(y, np.nan)
                    status = "failed: " + str(error).splitlines()[0]
                seconds[method] += time.perf_counter() - t0
                e = filled[hidden] - y_true[hidden]
                e = e[~np.isnan(e)]
                rows.append((column, scheme, float(rate), int(replicate), method, status,
                             int(hidden.sum()), len(e),
                             float(np.abs(e).mean()) if len(e) else np.nan,
                             float(np.sqrt((e * e).mean())) if len(e) else np.nan,
                             float(e.mean()) if len(e) else np.nan))
    trials = pd.DataFrame(rows, columns=["series", "scheme", "rate", "replicate", "method", "status",
                                         "masked", "scored", "mae", "rmse", "bias"])
    cells = (trials.groupby(["series", "scheme", "rate", "method"])[["mae", "rmse", "bias"]]
             .agg(["mean", "std"]).reset_index())
    cells.columns = ["_".join(c).strip("_") for c in cells.columns]
    cells["rank"] = cells.groupby(["series", "scheme", "rate"])["rmse_mean"].rank(method="average")
    cells.to_csv(args.out, index=False)
    if args.trials:
        trials.to_csv(args.trials, index=False)
    total = time.perf_counter() - started
    print(f"python pipeline: {len(columns)} series, {len(trials)} trials, {total:.1f} s "
          f"(fill seconds: " + ", ".join(f"{m} {s:.1f}" for m, s in seconds.items()) + ")",
          file=sys.stderr)
    print(f"python pipeline libraries: Python {sys.version.split()[0]}, numpy {np.__version__}, "
          f"pandas {pd.__version__}, scipy {scipy.__version__}, statsmodels {statsmodels.__version__}",
          file=sys.stderr)


if __name__ == "__main__":
    main()
