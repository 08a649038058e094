#!/usr/bin/python3
"""Reference values for gapmark's low-rank fill method (soft-impute).

Run with Debian's /usr/bin/python3 (it has numpy):

    /usr/bin/python3 reference/low_rank/make_reference.py

Writes soft_impute_cases.json beside this script. Each case is a small
time x series matrix with missing cells (column 0 is the series to fill,
the others its siblings) and a fixed number of soft-impute steps written
here directly from the published update (Mazumder, Hastie & Tibshirani
2010, JMLR 11:2287-2322, Algorithm 1), using numpy.linalg.svd:

    W     = observed cells of X, Z elsewhere
    Z_new = U diag(max(d - lambda, 0)) V'   (optionally only the r largest)

from Z = 0 (see make_case for the warm-started path), with the columns
first centred and scaled (sample standard deviation, ddof=1) on their
observed cells, and lambda given as a fraction
of the largest singular value of the standardised matrix with missing
cells set to 0. The stored values are:
  standardised   the standardised matrix (null = missing)
  lambda_max     the largest singular value of the standardised matrix
                 with missing cells set to 0
  lambdas        the thresholds used in turn: [lambda_fraction * lambda_max]
                 when a fraction is given; for a rank alone, gapmark's path
                 (20 values from lambda_max down to lambda_max / 1000, then 0),
                 each fit warm-starting the next
  iterations     steps per lambda (a step that changes nothing ends it early)
  z              the estimate after `iterations` steps (standardised scale)
  rank_kept      the components the last step kept (singular values above
                 lambda, within the rank cap): what the method's fit records
  filled         column 0 with its gaps filled, on the original scale

All data are invented by this script (formulas and a seeded generator): a
few made-up sensor channels of one invented tank; they describe no real
measurement.
"""
import json
import math
import pathlib
import platform

import numpy as np

HERE = pathlib.Path(__file__).resolve().parent


def to_list(a):
    """2-D or 1-D array -> nested lists, NaN -> null, floats at round-trip precision."""
    a = np.asarray(a, dtype=float)
    if a.ndim == 1:
        return [None if math.isnan(v) else float(v) for v in a.tolist()]
    return [to_list(col) for col in a.T]  # column-major: one list per series


def standardise(x):
    centre = np.nanmean(x, axis=0)
    scale = np.nanstd(x, axis=0, ddof=1)
    scale = np.where((scale > 0) & np.isfinite(scale), scale, 1.0)
    return (x - centre) / scale, centre, scale


def soft_impute(x, lam, max_rank, iterations, z):
    """`iterations` steps from z, stopping early only when a step changes nothing.
    Returns the estimate and the number of components the last step kept."""
    observed = ~np.isnan(x)
    kept = 0
    for _ in range(iterations):
        w = np.where(observed, x, z)
        u, d, vt = np.linalg.svd(w, full_matrices=False)
        keep = d > lam
        if max_rank:
            keep &= np.arange(d.size) < max_rank
        z_new = (u[:, keep] * (d[keep] - lam)) @ vt[keep]
        kept = int(keep.sum())
        change = np.linalg.norm(z_new - z)
        z = z_new
        if change == 0.0:
            break
    return z, kept


def lambda_grid(top, count, smallest_ratio):
    """gapmark's grid: top * exp(i * log(ratio) / (count - 1)), i = 0 .. count-1."""
    step = math.log(smallest_ratio) / (count - 1)
    return [top * math.exp(step * i) for i in range(count)]


def invented_matrix(rng, n, loadings, noise):
    t = np.arange(n, dtype=float)
    factors = np.column_stack([np.ones(n), np.sin(2 * np.pi * t / 12.0), t / n])
    return factors @ loadings + noise * rng.standard_normal((n, loadings.shape[1]))


def with_gaps(rng, x, rate):
    x = x.copy()
    holes = rng.random(x.shape) < rate
    holes[0, 0] = False  # keep column 0 observed at both ends
    holes[-1, 0] = False
    x[holes] = np.nan
    return x


def make_case(name, x, fraction, max_rank, iterations):
    """lambda given: one fit from zero. Rank only (fraction 0): the
    rank-capped path over gapmark's grid (20 lambdas from lambda_max to
    lambda_max / 1000), each fit warm-starting the next, then lambda 0."""
    xs, centre, scale = standardise(x)
    lam_max = np.linalg.svd(np.where(np.isnan(xs), 0.0, xs), compute_uv=False)[0]
    if fraction > 0:
        lambdas = [fraction * lam_max]
    else:
        lambdas = lambda_grid(lam_max, 20, 1e-3) + [0.0]
    z = np.zeros_like(xs)
    kept = 0
    for lam in lambdas:
        z, kept = soft_impute(xs, lam, max_rank, iterations, z)
    filled = np.where(np.isnan(x[:, 0]), z[:, 0] * scale[0] + centre[0], x[:, 0])
    return {
        "name": name,
        "values": to_list(x),
        "lambda_fraction": fraction,
        "rank": max_rank,
        "iterations": iterations,
        "standardised": to_list(xs),
        "lambda_max": float(lam_max),
        "lambdas": [float(v) for v in lambdas],
        "z": to_list(z),
        "rank_kept": kept,
        "filled": to_list(filled),
    }


def main():
    rng = np.random.default_rng(20260311)
    loadings4 = np.array([[20.0, 7.5, 3.0, 110.0],
                          [2.0, -1.5, 0.4, 9.0],
                          [1.0, 0.5, -0.2, 4.0]])
    x1 = with_gaps(rng, invented_matrix(rng, 48, loadings4, 0.1), 0.25)
    loadings5 = np.array([[5.0, 6.0, 7.0, 8.0, 9.0],
                          [1.0, 2.0, -1.0, 0.5, 3.0],
                          [0.0, 1.0, 1.0, -2.0, 0.5]])
    x2 = with_gaps(rng, invented_matrix(rng, 60, loadings5, 0.2), 0.3)
    cases = [
        make_case("soft-no-cap", x1, 0.2, 0, 30),
        make_case("soft-rank-2", x1, 0.05, 2, 40),
        make_case("rank-2-path", x2, 0.0, 2, 4),
        make_case("soft-small-lambda", x2, 0.01, 0, 60),
    ]
    out = {
        "generator": "reference/low_rank/make_reference.py",
        "method": "soft-impute update written with numpy.linalg.svd (Mazumder, Hastie & Tibshirani 2010, Algorithm 1)",
        "layout": "matrices are stored column by column: values[j] is series j (0 = the series to fill)",
        "versions": {"python": platform.python_version(), "numpy": np.__version__},
        "data": "invented by this script; no real measurement",
        "cases": cases,
    }
    path = HERE / "soft_impute_cases.json"
    path.write_text(json.dumps(out, indent=1) + "\n")
    print(f"wrote {path} ({len(cases)} cases)")


if __name__ == "__main__":
    main()
