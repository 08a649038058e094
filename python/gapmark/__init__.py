"""gapmark from Python: benchmark gap-filling methods on numpy arrays and
pandas objects with gapmark's compiled engine, and run your own Python fill
method beside the built-in ones on the same masks, with the same statistics.

    import gapmark
    gapmark.methods()[0]                        # the registry, as dicts
    filled, variance = gapmark.fill(series, "kalman:model=trend")
    hidden = gapmark.mask(series, "blocks", rate=0.1, seed=1, length_mean=8)
    results = gapmark.run("spec.json")          # or a dict
    results.verdict, results.trials, results.write("out")

Errors are gapmark's one-line messages as exceptions: InputError (bad
input: a ValueError) and MethodFailure (a method that cannot fill: a
RuntimeError). docs/python.md walks through a whole benchmark.
"""
import json
import math
import os
import sys

import numpy as np

from . import _engine
from ._engine import InputError, MethodFailure

try:  # pandas is optional: without it, results come as lists of dicts
    import pandas as _pd
except ImportError:  # pragma: no cover - depends on the machine
    _pd = None

from ._results import Results, load_results
from ._raw_data import profile, regularize

__version__ = _engine.__version__
__all__ = ["methods", "schemes", "metrics", "fill", "mask", "run", "Results", "load_results",
           "register_method", "profile", "regularize", "Filled", "InputError", "MethodFailure"]


def methods():
    """The fill methods: a list of dicts with name, summary, needs and params
    (name, type, default, min, max, choices, help)."""
    return json.loads(_engine._listing("methods"))


def schemes():
    """The masking schemes, as methods() lists the methods."""
    return json.loads(_engine._listing("schemes"))


def metrics():
    """The metrics, as methods() lists the methods."""
    return json.loads(_engine._listing("metrics"))


def _param_text(key, value):
    """A keyword argument as gapmark's parameter text."""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, (int, np.integer)):
        return str(int(value))
    if isinstance(value, (float, np.floating)):
        if not math.isfinite(value):
            raise InputError(f"{key}: expected a finite number, found {value!r}")
        return repr(float(value))
    if isinstance(value, str):
        return value
    if isinstance(value, (list, tuple)):  # bounds=(0, None): "0,"
        return ",".join("" if v is None else _param_text(key, v) for v in value)
    raise InputError(f"{key}: expected a number, text, true/false or a list, found {type(value).__name__}")


def _call_args(params):
    return [(k, _param_text(k, v)) for k, v in params.items()]


def _times(index):
    """A pandas index as ISO 8601 or integer times; None for other indexes."""
    if _pd is None or index is None:
        return None
    if isinstance(index, _pd.DatetimeIndex):
        return [t.isoformat() for t in index]
    if isinstance(index, _pd.RangeIndex) or (isinstance(index, _pd.Index) and index.dtype.kind in "iu"):
        return [str(int(t)) for t in index]
    return None


def _series(values, what="values"):
    """(float array, pandas index or None, name or None) of an array or a Series."""
    if _pd is not None and isinstance(values, _pd.Series):
        return values.to_numpy(dtype=float, na_value=np.nan), values.index, values.name
    array = np.asarray(values, dtype=float)
    if array.ndim != 1:
        raise InputError(f"{what}: expected a 1-D array, found {array.ndim} dimensions")
    return array, None, None


def _siblings(siblings):
    """Names and arrays of sibling series: a dict, or a DataFrame (its columns)."""
    if siblings is None:
        return [], []
    if _pd is not None and isinstance(siblings, _pd.DataFrame):
        siblings = {str(c): siblings[c] for c in siblings.columns}
    if not isinstance(siblings, dict):
        raise InputError("siblings: expected a dict of name to values, or a DataFrame")
    names = [str(k) for k in siblings]
    arrays = [_series(v, f"siblings['{k}']")[0] for k, v in siblings.items()]
    return names, arrays


class Filled:
    """What fill() returns: `values` (filled), `variance` (the method's
    predictive variance per point, 0 where observed; None when the method
    gives none), `fit` (a model-based method's fitted parameters, a dict, or
    None), `clipped` (fills moved into bounds=LO,HI) and `method` (the call
    as canonical text). Unpacks as `values, variance = gapmark.fill(...)`."""

    def __init__(self, values, variance, fit, clipped, method):
        self.values, self.variance, self.fit, self.clipped, self.method = values, variance, fit, clipped, method

    def __iter__(self):
        return iter((self.values, self.variance))

    def __repr__(self):
        return f"Filled(method={self.method!r}, values=<{len(self.values)} points>, " \
               f"variance={'None' if self.variance is None else '<given>'})"


def fill(values, method="linear", *, period=None, siblings=None, **params):
    """Fills the missing values (NaN) of a series with one method, exactly
    as `gapmark fill` fills a CSV column.

    values: a 1-D array (NaN = missing) or a pandas Series, whose index is
        kept (a DatetimeIndex or an integer index is the series' time axis).
    method: a method name, or a call as on the command line
        ("kalman:model=trend"); keyword arguments add parameters
        (model="trend", bounds=(0, None)).
    period: the seasonal period in steps (default: from the index's step,
        24 for hourly data; none for arrays).
    siblings: other series on the same time axis, for the methods that
        borrow from them: a dict of name to values, or a DataFrame.

    Returns a Filled: values and variance (arrays, or Series with the
    input's index). Raises InputError for bad input and MethodFailure,
    with the method's reason, when the method cannot fill the series.
    """
    array, index, name = _series(values)
    names, arrays = _siblings(siblings)
    out, variance, fit, clipped, label = _engine._fill(
        array, method, _call_args(params), int(period or 0), _times(index), names, arrays)
    fit = json.loads(fit) if fit is not None else None
    if index is not None:
        out = _pd.Series(out, index=index, name=name)
        if variance is not None:
            variance = _pd.Series(variance, index=index, name=name)
    return Filled(out, variance, fit, clipped, label)


def mask(values, scheme, *, rate, seed, replicate=0, period=None, holdout=0, name=None, siblings=None, **params):
    """The points a scheme hides: the same boolean mask `gapmark run` and
    `gapmark mask` draw for this series, seed, rate and replicate.

    The mask's seed derives from the series' name as a run labels it (the
    CSV column name): `name`, else the Series' name. Keyword arguments are
    the scheme's parameters (length_mean=8); `holdout` keeps the last points
    unmasked as a spec's "holdout" does; `siblings` (a dict or DataFrame)
    are the other series of the same file, for schemes that read them.

    Returns a boolean array, or a boolean Series with the input's index.
    """
    array, index, series_name = _series(values)
    label = name if name is not None else ("" if series_name is None else str(series_name))
    names, arrays = _siblings(siblings)
    hidden = _engine._mask(array, scheme, _call_args(params), float(rate), int(seed), int(replicate),
                           int(period or 0), int(holdout), label, _times(index), names, arrays)
    if index is not None:
        return _pd.Series(hidden, index=index, name=series_name)
    return hidden


from ._run import run, register_method  # noqa: E402  (they use the helpers above)
