"""run(): a whole experiment from a spec, with data from files or from
pandas and numpy objects; register_method(): a fill method in Python."""
import json
import os
import shutil
import sys
import tempfile
import traceback

import numpy as np

from . import _engine, _series, _times
from ._engine import InputError
from ._results import Results

try:
    import pandas as _pd
except ImportError:  # pragma: no cover - depends on the machine
    _pd = None


def _spec_text(spec):
    """(text, source, base folder) of a spec given as a dict or a path."""
    if isinstance(spec, dict):
        return json.dumps(spec, indent=2) + "\n", "spec", os.getcwd()
    if isinstance(spec, (str, os.PathLike)):
        path = os.fspath(spec)
        try:
            with open(path, encoding="utf-8") as f:
                text = f.read()
        except OSError as e:
            raise InputError(f"{path}: cannot read the spec: {e.strerror}") from None
        return text, path, os.path.dirname(path) or "."
    raise InputError(f"spec: expected a dict or a path, found {type(spec).__name__}")


def _number(v):
    return "" if v is None or (isinstance(v, float) and v != v) else repr(float(v))


def _table_csv(name, table):
    """A DataFrame, Series or numpy array as a wide CSV: a time column (the
    DatetimeIndex in ISO 8601, an integer index, or 0, 1, 2 ...) and one
    column per variable, numbers at round-trip precision, NaN empty."""
    if _pd is not None and isinstance(table, _pd.Series):
        table = table.to_frame(name=str(table.name) if table.name is not None else "value")
    if _pd is not None and isinstance(table, _pd.DataFrame):
        times = _times(table.index)
        if times is None:
            raise InputError(f"data['{name}']: the index must be a DatetimeIndex or integers (the time axis)")
        columns = [str(c) for c in table.columns]
        values = [table[c].to_numpy(dtype=float, na_value=np.nan) for c in table.columns]
    else:
        array = np.asarray(table, dtype=float)
        if array.ndim == 1:
            array = array[:, None]
        if array.ndim != 2:
            raise InputError(f"data['{name}']: expected a 1-D or 2-D array, a Series or a DataFrame")
        times = [str(i) for i in range(array.shape[0])]
        columns = ["value"] if array.shape[1] == 1 else [f"v{k + 1}" for k in range(array.shape[1])]
        values = [array[:, k] for k in range(array.shape[1])]
    header = "time," + ",".join(_csv_cell(c) for c in columns)
    lines = [header] + [t + "," + ",".join(_number(v[i]) for v in values) for i, t in enumerate(times)]
    return "\n".join(lines) + "\n"


def _csv_cell(text):
    return '"' + text.replace('"', '""') + '"' if any(c in text for c in ',"\n\r') else text


def _with_data(spec, data, folder):
    """The spec's data files replaced by the given tables, written as CSV into
    `folder` under the names the spec gives them; the spec's text is kept, so
    its SHA-256 is the one recorded (a dict without "data" gets one entry per table)."""
    text, source, _ = _spec_text(spec)
    parsed = json.loads(text)
    if "data" not in parsed:
        if not isinstance(spec, dict):
            raise InputError(f"{source}: the spec names no data; give them in the spec when it is a file")
        parsed["data"] = [{"file": name} for name in data]
        text = json.dumps(parsed, indent=2) + "\n"
    named = [d if isinstance(d, str) else d.get("file") for d in parsed.get("data", [])]
    for name in named:
        if name not in data:
            raise InputError(f"data: the spec reads '{name}'; give it in data= too (given: {', '.join(map(str, data))})")
    for name, table in data.items():
        if name not in named:
            raise InputError(f"data['{name}']: the spec reads no such file (it reads: {', '.join(map(str, named))})")
        path = os.path.normpath(os.path.join(folder, name))
        if not path.startswith(folder + os.sep):
            raise InputError(f"data['{name}']: a name inside the spec's folder is needed")
        os.makedirs(os.path.dirname(path), exist_ok=True)
        with open(path, "w", encoding="utf-8") as f:
            f.write(_table_csv(name, table))
    return text, source


def _progress_printer():
    def report(done, total):
        end = "\n" if done == total else ""
        sys.stderr.write(f"\rgapmark: {done}/{total} tasks ({100 * done // max(total, 1)}%){end}")
        sys.stderr.flush()
    return report


def run(spec, *, data=None, threads=None, progress=True, allow_external=False):
    """Runs an experiment, as `gapmark run` does, and returns its Results.

    spec: a dict (the JSON spec; relative paths read from the current
        folder) or the path of a spec file.
    data: tables in place of the spec's data files, by the name the spec
        gives them ({"demo/pen3_hourly.csv": frame}): DataFrames or Series
        with a DatetimeIndex or integer index, or numpy arrays (index 0, 1,
        2 ...; give "step" in the spec's data entry for dated data).
    threads: worker threads (default: every core); the results do not
        depend on it. Built-in methods run on every thread; Python methods
        (register_method) run one at a time under the GIL.
    progress: print the tasks done on stderr.
    allow_external: a spec whose "external" methods start programs is
        refused unless this is True (read the spec first).

    Nothing is written; Results.write(folder) writes every report.
    """
    progress_fn = _progress_printer() if progress else None
    if data is None:
        text, source, base = _spec_text(spec)
        handle = _engine._run(text, source, base, int(threads or 0), bool(allow_external), progress_fn)
        return Results(handle)
    if not isinstance(data, dict):
        raise InputError("data: expected a dict of file name (as the spec writes it) to table")
    folder = os.path.realpath(tempfile.mkdtemp(prefix="gapmark-data-"))
    try:
        text, source = _with_data(spec, data, folder)
        handle = _engine._run(text, source, folder, int(threads or 0), bool(allow_external), progress_fn)
    finally:
        shutil.rmtree(folder, ignore_errors=True)
    return Results(handle)


class FillRequest:
    """What a Python method is given beside the values: `period` (seasonal
    period in steps, 0 = none), `siblings` (dict of name to array: the other
    series of the same file, for a method registered with
    needs={"siblings": True}; empty otherwise), `start` (the first time, ISO 8601 or an
    integer, as text), `step` (ISO 8601 duration or an integer) and
    `params` (the method's parameters as bound)."""

    __slots__ = ("period", "siblings", "start", "step", "params")

    def __init__(self, period, siblings, start, step, params):
        self.period, self.siblings, self.start, self.step, self.params = period, siblings, start, step, params

    def __repr__(self):
        return f"FillRequest(period={self.period}, siblings={list(self.siblings)}, start={self.start!r}, " \
               f"step={self.step!r}, params={self.params})"


def _one_line(e):
    text = f"{type(e).__name__}: {e}".strip()
    return " ".join(text.split())


def _call_method(function, values, period, siblings, start, step, params):
    """Calls a registered method; returns (values, variance or None) as
    float arrays of the series' length, or ("error", message)."""
    try:
        request = FillRequest(period, siblings, start, step, dict(params))
        out = function(values, request, **params)
        variance = None
        if isinstance(out, tuple):
            if len(out) != 2:
                raise TypeError(f"returned a tuple of {len(out)}; return values or (values, variance)")
            out, variance = out
        filled = np.ascontiguousarray(np.asarray(out, dtype=float).reshape(-1))
        if filled.shape[0] != values.shape[0]:
            raise ValueError(f"returned {filled.shape[0]} values for a series of {values.shape[0]}")
        if variance is not None:
            variance = np.ascontiguousarray(np.asarray(variance, dtype=float).reshape(-1))
            if variance.shape[0] != values.shape[0]:
                raise ValueError(f"returned {variance.shape[0]} variances for a series of {values.shape[0]}")
        return filled, variance
    except Exception as e:  # the trial fails with this message; the run goes on
        return "error", _one_line(e)


_TYPES = {bool: "flag", int: "integer", float: "number", str: "text"}


def _param_specs(params):
    """Parameter schema from {name: default} or {name: {type, default, min, max, choices, help}}."""
    from . import _param_text
    specs = []
    for name, value in (params or {}).items():
        if isinstance(value, dict):
            spec = dict(value)
            spec["name"] = name
            default = spec.get("default", "")
            spec.setdefault("type", _TYPES.get(type(default), "text") if default != "" else "number")
            if "choices" in spec:
                spec["type"] = "choice"
                spec["choices"] = [str(c) for c in spec["choices"]]
        else:
            if type(value) not in _TYPES:
                raise InputError(f"params['{name}']: a default of type bool, int, float or str is needed")
            spec = {"name": name, "type": _TYPES[type(value)], "default": value}
        spec["default"] = "" if spec.get("default") in (None, "") else _param_text(name, spec["default"])
        specs.append(spec)
    return specs


def register_method(name, function, *, params=None, needs=None, summary=None):
    """Registers a Python function as a fill method named `name`, usable in
    specs and run() beside the built-in methods, on the same masks.

    function(values, request, **params) receives the series with NaN where
    it must fill (a float array; observed values are restored afterwards)
    and a FillRequest (period, siblings, start, step, params), and returns
    the filled values, or (values, variance). An exception fails the trial
    with its message, as a failing built-in method does.
    params: {name: default} (the type follows the default) or
        {name: {"type": "integer"|"number"|"text"|"flag", "default": ...,
        "min": ..., "max": ..., "choices": [...], "help": ...}}.
    needs: {"period": bool, "siblings": bool, "min_observed": int,
        "uses_period": bool} (default: none and 1 observed value).
    """
    if not callable(function):
        raise InputError(f"register_method('{name}'): the function is not callable")
    needs = dict(needs or {})
    unknown = set(needs) - {"period", "siblings", "min_observed", "uses_period"}
    if unknown:
        raise InputError(f"register_method('{name}'): unknown need(s) {sorted(unknown)} "
                         "(period, siblings, min_observed, uses_period)")
    full_needs = {"period": bool(needs.get("period", False)), "uses_period": bool(needs.get("uses_period", False)),
                  "siblings": bool(needs.get("siblings", False)), "min_observed": int(needs.get("min_observed", 1))}
    text = summary or (function.__doc__ or "").strip().split("\n")[0] or f"Python function {function.__name__}"
    _engine._register_method(name, text, _call_method, function, _param_specs(params), full_needs)
