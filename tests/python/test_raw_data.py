"""profile() and regularize() on DataFrames against `gapmark profile` and
`gapmark regularize` on the same rows (the invented raw data of
experiments/raw/, made by experiments/raw/make_event_log.py)."""
import json
import os

import pandas as pd
import pytest

import gapmark
from conftest import SOURCE

RAW = os.path.join(SOURCE, "experiments", "raw")


def as_text(path):
    """The rows with every cell as written (no parsing by pandas)."""
    return pd.read_csv(path, dtype=str, keep_default_na=False)


def test_profile_equals_gapmark_profile(cli):
    path = os.path.join(RAW, "water_quality.csv")
    expected = json.loads(cli("profile", path, "--group", "pen", "--json").stdout)
    got = gapmark.profile(as_text(path), group="pen")
    assert got.pop("source") == "frame" and expected.pop("source") == path
    assert dict(got) == expected
    assert sum(s["missing_values"] + s["missing_records"] for s in got["series"]) > 0
    assert "pen=P1" in str(got)


def test_profile_of_a_frame_with_a_datetime_index(cli, demo_frame):
    from conftest import DEMO_CSV
    expected = json.loads(cli("profile", DEMO_CSV, "--json").stdout)
    got = gapmark.profile(demo_frame)
    for s, e in zip(got["series"], expected["series"]):
        assert (s["label"], s["missing_values"], s["longest_gap"]) == (e["label"], e["missing_values"], e["longest_gap"])
    assert got["step"] == expected["step"] == "PT1H"


def test_regularize_equals_gapmark_regularize(cli, tmp_path):
    path = os.path.join(RAW, "feeder_events.csv")
    cli("regularize", path, "--group", "pen", "--step", "PT1H", "--agg", "feed_kg=sum", "--empty", "feed_kg=zero",
        "--out", tmp_path / "feed_hourly.csv")
    expected = pd.read_csv(tmp_path / "feed_hourly.csv")
    got = gapmark.regularize(as_text(path), step="PT1H", agg={"feed_kg": "sum"}, empty="zero", group="pen")
    assert list(got.columns) == list(expected.columns)
    assert len(got) == len(expected) == 1476
    assert got["feed_kg"].equals(expected["feed_kg"])
    assert (got["feed_kg"] == 0).sum() == 1219 and got["feed_kg"].isna().sum() == 8


def test_regularize_refuses_an_unknown_aggregation():
    rows = pd.DataFrame({"time": ["2026-03-01T00:10", "2026-03-01T00:20"], "x": ["1", "2"]})
    with pytest.raises(gapmark.InputError, match="agg"):
        gapmark.regularize(rows, step="PT1H", agg="median")
