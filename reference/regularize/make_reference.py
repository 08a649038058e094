#!/usr/bin/python3
"""Reference values for `gapmark regularize`, computed with pandas (not with
gapmark's own code), and calendar facts from Python's datetime.

Run from the repository root with Debian's Python (it needs pandas):
    /usr/bin/python3 reference/regularize/make_reference.py
It writes three small INVENTED example inputs (deterministic, seed below)
and reference/regularize/regularize_reference.json, which
tests/data/regularize_reference_test.cpp reads.

How each reference is made:
  - bins: DataFrame.resample(rule, closed="left", label="left") per group
    (pandas labels a bin by its start when label="left"). Rules: "h" (PT1H),
    "D" (P1D), "MS" (P1M, month starts), "QS-JAN" (P3M, calendar quarters).
  - ISO weeks (P1W, Monday 00:00): resample("W-MON", closed="left",
    label="left") -- bins [Monday, next Monday) labelled by their Monday --
    and, as a cross-check, explicit bins: each time's Monday from
    datetime.isocalendar(); the script stops if the two disagree.
    (Note: pandas' default for weekly rules is closed="right",
    label="right", which does not give ISO weeks for times of day.)
  - sum: resample(...).sum(min_count=1) (NaN when a bin has no value);
    count: .count(); mean, min, max: .mean(), .min(), .max(); last: the last
    non-missing value by time, then by file order (.last() skips NaN).
    Rows per bin: .size(). gapmark's rules are then applied to those pandas
    numbers: a bin with no rows is 0 under the zero policy, empty under
    the missing policy; a bin with rows but no value is empty.
  - shared span: each group's bins reindexed to the bins of all rows.
  - UTC offsets: pandas.to_datetime(utc=True) converts times written with
    different offsets (+01:00, +02:00 across a daylight-saving change).
  - iso_weeks: datetime.date.isocalendar() and date.fromisocalendar().
"""
import datetime as dt
import json
import pathlib
import random
import sys

import numpy as np
import pandas as pd

HERE = pathlib.Path(__file__).parent
SEED = 4026


def write_examples(rng: random.Random) -> None:
    # Hourly: two sites, 2 days, rows at random seconds, some empty cells.
    rows = ["site,time,amount,reading"]
    start = dt.datetime(2026, 3, 9, 0, 0)
    for site in ["A", "B"]:
        t = start + dt.timedelta(minutes=rng.randint(0, 50))
        while t < start + dt.timedelta(days=2):
            amount = "" if rng.random() < 0.08 else f"{rng.randint(1, 40) / 4:.2f}"
            reading = "" if rng.random() < 0.1 else f"{rng.gauss(20, 3):.3f}"
            rows.append(f"{site},{t.strftime('%Y-%m-%dT%H:%M:%S')},{amount},{reading}")
            # bursts and long quiet spells, so that many hours have no rows
            t += dt.timedelta(seconds=rng.choice([40, 300, 900, 2400, 7200, 14000]))
    # a few rows out of order, and one hour with rows but only empty cells
    rows[5], rows[9] = rows[9], rows[5]
    rows.append("A,2026-03-10T21:10:00,,")
    rows.append("A,2026-03-10T21:40:00,,")
    (HERE / "events_hourly.csv").write_text("\n".join(rows) + "\n")

    # Calendar: one site, 2025-12-15 to 2026-03-20, across a year end,
    # February and an ISO week 53 boundary check elsewhere.
    rows = ["time,amount,reading"]
    t = dt.datetime(2025, 12, 15, 3, 0)
    while t < dt.datetime(2026, 3, 20):
        amount = f"{rng.randint(1, 20)}"
        reading = "" if rng.random() < 0.1 else f"{rng.gauss(8, 1):.2f}"
        rows.append(f"{t.strftime('%Y-%m-%dT%H:%M')},{amount},{reading}")
        t += dt.timedelta(hours=rng.choice([5, 11, 19, 26, 50, 80]))
    (HERE / "events_calendar.csv").write_text("\n".join(rows) + "\n")

    # Offsets: local times written with their offsets across the change from
    # +01:00 to +02:00 on 2026-03-29 (clocks go from 02:00 to 03:00 local).
    rows = ["time,amount"]
    u = dt.datetime(2026, 3, 28, 20, 0, tzinfo=dt.timezone.utc)
    while u < dt.datetime(2026, 3, 29, 8, 0, tzinfo=dt.timezone.utc):
        off = 2 if u >= dt.datetime(2026, 3, 29, 1, 0, tzinfo=dt.timezone.utc) else 1
        local = u.astimezone(dt.timezone(dt.timedelta(hours=off)))
        rows.append(f"{local.strftime('%Y-%m-%dT%H:%M')}+0{off}:00,{rng.randint(1, 9)}")
        u += dt.timedelta(minutes=rng.choice([20, 35, 50, 95]))
    (HERE / "events_offsets.csv").write_text("\n".join(rows) + "\n")


def last_valid(s: pd.Series):
    s = s.dropna()
    return s.iloc[-1] if len(s) else np.nan


def bins_for(df: pd.DataFrame, rule: str, column: str, agg: str) -> pd.DataFrame:
    """Per-bin value (pandas) and rows per bin."""
    r = df.set_index("t").sort_index(kind="stable")[column].resample(rule, closed="left", label="left")
    size = r.size()
    if agg == "sum":
        v = r.sum(min_count=1)
    elif agg == "count":
        v = r.count().astype(float)
    elif agg == "mean":
        v = r.mean()
    elif agg == "min":
        v = r.min()
    elif agg == "max":
        v = r.max()
    elif agg == "last":
        v = r.apply(last_valid)
    else:
        raise ValueError(agg)
    return pd.DataFrame({"value": v, "rows": size})


def apply_policy(frame: pd.DataFrame, agg: str, empty: str) -> list:
    out = []
    for when, row in frame.iterrows():
        if row["rows"] == 0:
            value = 0.0 if empty == "zero" else None
        elif agg == "count" and row["value"] == 0:
            value = None  # rows, but no value: missing under either policy
        else:
            value = None if pd.isna(row["value"]) else float(row["value"])
        out.append([when.strftime("%Y-%m-%dT%H:%M"), value])
    return out


def week_check(df: pd.DataFrame, column: str) -> None:
    """resample('W-MON', left, left) must equal bins from isocalendar()."""
    a = bins_for(df, "W-MON", column, "sum")
    monday = df["t"].map(lambda t: pd.Timestamp(dt.date.fromisocalendar(*t.isocalendar()[:2], 1)))
    b = df.assign(monday=monday).groupby("monday")[column].sum(min_count=1)
    for when, v in b.items():
        av = a.loc[when, "value"]
        if not ((pd.isna(av) and pd.isna(v)) or abs(av - v) < 1e-9):
            sys.exit(f"W-MON and isocalendar bins disagree at {when}: {av} vs {v}")


def main() -> None:
    write_examples(random.Random(SEED))
    cases = []

    hourly = pd.read_csv(HERE / "events_hourly.csv", dtype={"site": str})
    hourly["t"] = pd.to_datetime(hourly["time"])
    lo, hi = hourly["t"].min().floor("h"), hourly["t"].max().floor("h")
    for column, agg, empty in [("amount", "sum", "zero"), ("amount", "count", "zero"), ("amount", "sum", "missing"),
                               ("reading", "mean", "missing"), ("reading", "min", "missing"),
                               ("reading", "max", "missing"), ("reading", "last", "missing")]:
        for span in ["own", "shared"]:
            groups = {}
            for site, part in hourly.groupby("site", sort=False):
                frame = bins_for(part, "h", column, agg)
                if span == "shared":
                    frame = frame.reindex(pd.date_range(lo, hi, freq="h"), fill_value=0)
                    frame.loc[frame["rows"] == 0, "value"] = np.nan
                groups[site] = apply_policy(frame, agg, empty)
            cases.append({"file": "events_hourly.csv", "groups": ["site"], "step": "PT1H", "column": column,
                          "agg": agg, "empty": empty, "span": span, "bins": groups})

    cal = pd.read_csv(HERE / "events_calendar.csv")
    cal["t"] = pd.to_datetime(cal["time"])
    week_check(cal, "amount")
    for rule, step in [("D", "P1D"), ("W-MON", "P1W"), ("MS", "P1M"), ("QS-JAN", "P3M")]:
        for column, agg, empty in [("amount", "sum", "zero"), ("amount", "count", "missing"), ("reading", "mean", "missing")]:
            frame = bins_for(cal, rule, column, agg)
            cases.append({"file": "events_calendar.csv", "groups": [], "step": step, "column": column, "agg": agg,
                          "empty": empty, "span": "shared", "pandas_rule": rule,
                          "bins": {"": apply_policy(frame, agg, empty)}})

    off = pd.read_csv(HERE / "events_offsets.csv")
    off["t"] = pd.to_datetime(off["time"], utc=True).dt.tz_localize(None)
    frame = bins_for(off, "h", "amount", "sum")
    cases.append({"file": "events_offsets.csv", "groups": [], "step": "PT1H", "column": "amount", "agg": "sum",
                  "empty": "zero", "span": "shared", "utc_offset": "Z", "bins": {"": apply_policy(frame, "sum", "zero")}})

    iso_weeks = []
    for text in ["2026-01-01", "2027-01-01", "2025-12-29", "2026-12-31", "2026-03-29", "2021-01-03", "2020-12-31"]:
        d = dt.date.fromisoformat(text)
        year, week, weekday = d.isocalendar()
        iso_weeks.append({"date": text, "iso_year": year, "iso_week": week, "iso_weekday": weekday,
                          "week_monday": dt.date.fromisocalendar(year, week, 1).isoformat()})

    out = {"source": "pandas resample (closed='left', label='left'), Python datetime.isocalendar()",
           "versions": {"python": sys.version.split()[0], "pandas": pd.__version__, "numpy": np.__version__},
           "cases": cases, "iso_weeks": iso_weeks}
    (HERE / "regularize_reference.json").write_text(json.dumps(out, indent=1) + "\n")


if __name__ == "__main__":
    main()
