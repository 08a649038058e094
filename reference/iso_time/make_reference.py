#!/usr/bin/python3
"""Reference calendar facts for gapmark's time axis, computed with Python's
standard datetime module and pandas (not with gapmark's own code).

Run with /usr/bin/python3 (it needs pandas) from the repository root:
    /usr/bin/python3 reference/iso_time/make_reference.py
It rewrites reference/iso_time/iso_time.json, which tests/core/time_axis_test.cpp
reads. Sources of each value:
  - dates: datetime.date.isocalendar(), isoweekday(), toordinal() (epoch days)
  - date_times: datetime.datetime.fromisoformat() (wall-clock seconds since
    1970-01-01T00:00 and the written UTC offset)
  - invalid: strings that datetime.fromisoformat() rejects with ValueError
  - month_shifts: pandas.Timestamp + pandas.DateOffset(months=n) (clamps the
    day to the month's length)
  - axes: series made with pandas.date_range (or Timestamp + DateOffset for
    a series anchored on day 30), with the step pandas.infer_freq finds
"""
import datetime as dt
import json
import pathlib
import sys

import pandas as pd

EPOCH = dt.datetime(1970, 1, 1)
OUT = pathlib.Path(__file__).with_name("iso_time.json")

DATES = [
    "2026-01-01", "2027-01-01", "2026-03-01", "2026-12-28", "2026-12-31",
    "2024-02-29", "2000-02-29", "1600-02-29", "1900-02-28", "1900-03-01",
    "2100-02-28", "2100-03-01", "1970-01-01", "1969-12-31", "1901-12-13",
    "2020-12-31", "2021-01-03", "2021-01-04", "2015-12-31", "2008-12-29",
    "2010-01-03", "2038-01-19", "0001-01-01", "9999-12-31",
]

DATE_TIMES = [
    "2026-03-01T06:00",
    "2026-03-01 06:00",
    "2026-03-01T06:00:30",
    "2026-03-01 23:59:59",
    "2024-02-29T12:00Z",
    "2024-02-29T12:00:00Z",
    "1969-12-31T23:00:00-05:00",
    "1969-12-31T23:59:59",
    "2026-10-25T01:30+01:00",
    "2026-10-25T01:30+0130",
    "2026-03-01T06:00:00.000+01:00",
    "2026-03-01T06:00:00.000",
    "2038-01-19T03:14:08",
    "1900-01-01T00:00",
    "2000-01-01T00:00:00-12:00",
    "2000-01-01T00:00:00+14:00",
]

INVALID = [
    "2026-02-30", "2025-02-29", "1900-02-29", "2026-13-01", "2026-00-10", "2026-04-31",
    "2026-03-01T25:00", "2026-03-01T24:00", "2026-03-01T12:60", "2026-03-01T12:00:61",
    "2026-03-01T", "2026-3-1", "2026-03-01T06:00+25:00",
    "26-03-01",
]

MONTH_SHIFTS = [
    ("2026-01-31", 1), ("2024-01-31", 1), ("2026-03-31", -1), ("2024-02-29", 12),
    ("2024-02-29", 48), ("2026-08-31", 3), ("2026-01-30", 1), ("2026-05-15T06:30:00", 7),
    ("2026-12-31T23:00:00", 2), ("1970-01-31", -1), ("2026-01-01", 120),
]


def epoch_seconds(wall):
    delta = wall - EPOCH
    return delta.days * 86400 + delta.seconds


def step_of_offset(offset):
    """pandas offset -> (unit, amount) in gapmark's terms."""
    from pandas.tseries import offsets as o
    if isinstance(offset, (o.MonthBegin, o.MonthEnd)):
        return "months", offset.n
    if isinstance(offset, (o.QuarterBegin, o.QuarterEnd)):
        return "months", 3 * offset.n
    if isinstance(offset, (o.YearBegin, o.YearEnd)):
        return "months", 12 * offset.n
    if isinstance(offset, o.Week):
        return "seconds", 7 * 86400 * offset.n
    if isinstance(offset, o.Tick):  # Day, Hour, Minute, Second
        return "seconds", offset.nanos // 10**9
    raise ValueError(f"unexpected offset {offset!r}")


def date_record(text):
    d = dt.date.fromisoformat(text)
    iso = d.isocalendar()
    return {
        "date": text,
        "epoch_days": d.toordinal() - dt.date(1970, 1, 1).toordinal(),
        "iso_year": iso[0],
        "iso_week": iso[1],
        "iso_weekday": iso[2],
        "isoweekday": d.isoweekday(),
        "month": d.month,
    }


def date_time_record(text):
    t = dt.datetime.fromisoformat(text)
    offset = t.utcoffset()
    return {
        "text": text,
        "wall_seconds": epoch_seconds(t.replace(tzinfo=None)),
        "offset_minutes": None if offset is None else int(offset.total_seconds() // 60),
        "hour": t.hour,
        "isoweekday": t.isoweekday(),
        "month": t.month,
    }


def check_invalid(text):
    try:
        dt.datetime.fromisoformat(text)
    except ValueError:
        return text
    raise SystemExit(f"datetime.fromisoformat accepted {text!r}; not a reject")


def month_shift(start, months):
    result = pd.Timestamp(start) + pd.DateOffset(months=months)
    kind = "date" if len(start) == 10 else "date_time"
    return {
        "start": start,
        "months": months,
        "kind": kind,
        "result": result.strftime("%Y-%m-%d" if kind == "date" else "%Y-%m-%dT%H:%M:%S"),
        "result_wall_seconds": epoch_seconds(result.to_pydatetime()),
    }


def axis_record(name, index, kind):
    fmt = "%Y-%m-%d" if kind == "date" else "%Y-%m-%dT%H:%M"
    freq = pd.infer_freq(index)
    unit, amount = step_of_offset(pd.tseries.frequencies.to_offset(freq))
    return {"name": name, "pandas_freq": freq, "unit": unit, "amount": amount,
            "times": [t.strftime(fmt) for t in index]}


def axes():
    out = [
        axis_record("PT15M", pd.date_range("2026-03-01 00:00", periods=200, freq="15T"), "date_time"),
        axis_record("PT1H", pd.date_range("2026-03-28 00:00", periods=100, freq="H"), "date_time"),
        axis_record("P1D", pd.date_range("2024-02-20", periods=30, freq="D"), "date"),
        axis_record("P7D", pd.date_range("2026-01-05", periods=60, freq="7D"), "date"),
        axis_record("P1M month starts", pd.date_range("2023-11-01", periods=30, freq="MS"), "date"),
        axis_record("P1M month ends", pd.date_range("2023-11-30", periods=30, freq="M"), "date"),
        axis_record("P1M month ends from February", pd.date_range("2026-02-28", periods=15, freq="M"), "date"),
        axis_record("P3M", pd.date_range("2020-01-01", periods=24, freq="QS"), "date"),
        axis_record("P1Y", pd.date_range("1995-01-01", periods=40, freq="AS"), "date"),
    ]
    # Monthly on day 30, clamped in February: each point is start + k months.
    start = pd.Timestamp("2025-12-30")
    day30 = [start + pd.DateOffset(months=k) for k in range(16)]
    out.append({"name": "P1M on day 30", "pandas_freq": None, "unit": "months", "amount": 1,
                "times": [t.strftime("%Y-%m-%d") for t in day30]})
    return out


def main():
    data = {
        "generated_by": "reference/iso_time/make_reference.py",
        "versions": {"python": sys.version.split()[0], "pandas": pd.__version__},
        "dates": [date_record(d) for d in DATES],
        "date_times": [date_time_record(t) for t in DATE_TIMES],
        "invalid": [check_invalid(t) for t in INVALID],
        "month_shifts": [month_shift(s, n) for s, n in MONTH_SHIFTS],
        "axes": axes(),
    }
    OUT.write_text(json.dumps(data, indent=1) + "\n")
    print(f"wrote {OUT}")


if __name__ == "__main__":
    main()
