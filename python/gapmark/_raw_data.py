"""The raw-data side on DataFrames: profile() says what is missing and how,
regularize() puts event rows or logs on a regular calendar grid."""
import io
import json

from ._engine import InputError, _profile, _regularize

try:
    import pandas as _pd
except ImportError:  # pragma: no cover - depends on the machine
    _pd = None


def _rows_csv(frame):
    """A DataFrame of rows as CSV text, the time first: the index when it is
    not a plain RangeIndex (a DatetimeIndex, say), else the first column
    that is not a group."""
    if _pd is None or not isinstance(frame, _pd.DataFrame):
        raise InputError("frame: expected a pandas DataFrame")
    if not isinstance(frame.index, _pd.RangeIndex):
        frame = frame.reset_index()
    frame = frame.copy()
    for column in frame.columns:  # times in ISO 8601, with their UTC offset when they have one
        if _pd.api.types.is_datetime64_any_dtype(frame[column]):
            frame[column] = [("" if t is _pd.NaT else t.isoformat()) for t in frame[column]]
    return frame.to_csv(index=False, lineterminator="\n")


def _groups(group):
    if group is None:
        return []
    return [group] if isinstance(group, str) else [str(g) for g in group]


def _choices(value, what):
    """{column: choice} or one choice for every column, as (column, choice) pairs."""
    if value is None:
        return []
    if isinstance(value, str):
        return [("", value)]
    if isinstance(value, dict):
        return [(str(k), str(v)) for k, v in value.items()]
    raise InputError(f"{what}: expected a name or a dict of column to name")


class Profile(dict):
    """The profile as `gapmark profile --json` writes it (a dict); str() or
    .text gives the readable text `gapmark profile` prints."""

    def __init__(self, data, text):
        super().__init__(data)
        self.text = text

    def __str__(self):
        return self.text


def profile(frame, *, group=None, step=None, period=None):
    """What is missing in raw rows, and how: missing records apart from
    missing values, duplicates, gap lengths, missingness by hour, weekday
    and month, and a screen for value-dependent missingness; as
    `gapmark profile` does for a CSV file.

    frame: a DataFrame with the times as its index (a DatetimeIndex) or as
        its first column that is not a group; group: the group column(s) of a
        long table; step: the expected step (ISO 8601, default: inferred).
    """
    data, text = _profile(_rows_csv(frame), "frame", _groups(group), step or "", int(period or 0))
    return Profile(json.loads(data), text)


def regularize(frame, *, step, agg=None, empty=None, group=None):
    """Rows onto a regular calendar grid, as `gapmark regularize` does: each
    interval [start, start + step) aggregated (agg: "sum", "count", "mean",
    "min", "max" or "last", for every column or as {column: name}; default
    mean), and an interval without rows either missing (readings, the
    default) or zero (counts, totals): empty="zero" or {column: "zero"}.

    Returns a DataFrame indexed by the intervals' start (wide: one column
    per variable), or with the group columns first when `group` is given.
    """
    text = _regularize(_rows_csv(frame), "frame", _groups(group), str(step), _choices(agg, "agg"),
                       _choices(empty, "empty"))
    out = _pd.read_csv(io.StringIO(text))
    time_column = out.columns[len(_groups(group))]
    try:
        out[time_column] = _pd.to_datetime(out[time_column])
    except (ValueError, TypeError):
        pass
    return out.set_index(time_column) if not group else out
