"""fill() and mask() against the program, bit for bit, on the invented demo
data (experiments/demo/pen3_hourly.csv): `gapmark fill` writes fills at
round-trip precision, so reading them back gives the same doubles."""
import numpy as np
import pandas as pd
import pytest

import gapmark
from conftest import DEMO_CSV


def read_back(path):
    return pd.read_csv(path, index_col=0, parse_dates=True, float_precision="round_trip")


def same(a, b):
    """Equal bit for bit, NaN equal to NaN."""
    a, b = np.asarray(a, dtype=float), np.asarray(b, dtype=float)
    return a.shape == b.shape and np.array_equal(a.view(np.int64), b.view(np.int64))


@pytest.mark.parametrize("column,method,params", [
    ("dissolved_oxygen_mg_l", "linear", {}),
    ("dissolved_oxygen_mg_l", "pchip", {}),
    ("salinity_psu", "kalman:model=trend", {}),
    ("dissolved_oxygen_mg_l", "seasonal-mean", {}),
    ("dissolved_oxygen_mg_l", "window-mean", {"reach": 5, "weights": "triangular"}),
    ("salinity_psu", "natural-spline", {"bounds": (30, None)}),
])
def test_fill_equals_gapmark_fill(cli, tmp_path, demo_frame, column, method, params):
    call = method + ("" if not params else (":" if ":" not in method else ",") + ",".join(
        f"{k}={gapmark._param_text(k, v)}" for k, v in params.items()))
    cli("fill", DEMO_CSV, "--column", column, "--method", call, "--out", tmp_path / "filled.csv")
    expected = read_back(tmp_path / "filled.csv")[column]
    series = demo_frame[column]
    assert series.isna().sum() > 10, "the demo column has gaps to fill"
    got = gapmark.fill(series, method, **params)
    assert isinstance(got.values, pd.Series) and got.values.index.equals(series.index)
    assert got.values.name == column
    assert same(got.values, expected)
    assert not got.values.isna().any()


def test_fill_with_siblings_equals_gapmark_fill_of_several_columns(cli, tmp_path, demo_frame):
    columns = ["dissolved_oxygen_mg_l", "salinity_psu", "pump_energy_kwh"]
    cli("fill", DEMO_CSV, *sum((["--column", c] for c in columns), []), "--method", "low-rank",
        "--out", tmp_path / "filled.csv")
    expected = read_back(tmp_path / "filled.csv")
    for c in columns:
        others = demo_frame[[o for o in columns if o != c]]
        got = gapmark.fill(demo_frame[c], "low-rank", siblings=others)
        assert same(got.values, expected[c]), c


def test_fill_of_an_array_and_variances():
    values = np.array([1.0, 2.0, np.nan, np.nan, 5.0, 4.0, np.nan, 6.0, 7.5, 7.0, np.nan, 9.0])
    linear, variance = gapmark.fill(values, "linear")
    assert isinstance(linear, np.ndarray) and variance is None
    assert linear[2] == pytest.approx(3.0) and linear[3] == pytest.approx(4.0)
    assert same(linear[~np.isnan(values)], values[~np.isnan(values)])
    kalman = gapmark.fill(values, "kalman", model="level")
    assert kalman.variance is not None
    assert np.all(kalman.variance[~np.isnan(values)] == 0)
    assert np.all(kalman.variance[np.isnan(values)] > 0)
    assert kalman.method == "kalman"


def test_fill_with_the_period_given(demo_frame):
    values = demo_frame["dissolved_oxygen_mg_l"].to_numpy()
    with pytest.raises(gapmark.MethodFailure):
        gapmark.fill(values, "seasonal-mean")  # an array has no step, so no default period
    by_array = gapmark.fill(values, "seasonal-mean", period=24).values
    assert same(by_array, gapmark.fill(demo_frame["dissolved_oxygen_mg_l"], "seasonal-mean").values)


@pytest.mark.parametrize("scheme,params,seed,replicate", [
    ("random", {}, 1, 0),
    ("blocks", {"length_mean": 8}, 20261201, 3),
    ("seasonal", {"unit": "hour", "phases": "0-5", "contiguous": True}, 7, 1),
])
def test_mask_equals_gapmark_mask(cli, tmp_path, demo_frame, scheme, params, seed, replicate):
    column = "water_level_m"
    call = scheme + ":" + ",".join([f"{k}={gapmark._param_text(k, v)}" for k, v in params.items()] + ["rate=0.1"])
    cli("mask", DEMO_CSV, "--column", column, "--scheme", call, "--seed", seed, "--replicate", replicate,
        "--holdout", 48, "--flags", "--out", tmp_path / "masked.csv")
    flags = read_back(tmp_path / "masked.csv")[column + "_masked"].to_numpy() == 1
    got = gapmark.mask(demo_frame[column], scheme, rate=0.1, seed=seed, replicate=replicate, holdout=48, **params)
    assert isinstance(got, pd.Series) and got.index.equals(demo_frame.index)
    assert got.to_numpy().sum() > 100
    assert np.array_equal(got.to_numpy(), flags)
    other = gapmark.mask(demo_frame[column], scheme, rate=0.1, seed=seed, replicate=replicate + 1, holdout=48,
                         **params)
    assert not np.array_equal(other.to_numpy(), flags), "another replicate draws another mask"


def test_mask_depends_on_the_series_name(demo_frame):
    series = demo_frame["water_level_m"]
    a = gapmark.mask(series, "random", rate=0.2, seed=5)
    b = gapmark.mask(series.to_numpy(), "random", rate=0.2, seed=5, name="water_level_m")
    c = gapmark.mask(series.to_numpy(), "random", rate=0.2, seed=5, name="other")
    assert np.array_equal(a.to_numpy(), b)
    assert not np.array_equal(b, c)
    assert not b[np.isnan(series.to_numpy())].any(), "a missing point is never masked"


def test_mask_refuses_a_rate_outside_0_1():
    with pytest.raises(gapmark.InputError, match="rate"):
        gapmark.mask(np.arange(100.0), "random", rate=1.5, seed=1)


def test_fill_fit_equals_gapmark_fill_fit(cli, tmp_path, demo_frame):
    """The fitted model of fill() is the one `gapmark fill --fit` writes."""
    import json
    for column, method in [("salinity_psu", "kalman:model=trend"), ("water_level_m", "arima:order=1,0,1")]:
        cli("fill", DEMO_CSV, "--column", column, "--method", method, "--out", tmp_path / f"{column}.csv",
            "--fit", tmp_path / f"{column}.json")
        written = json.loads((tmp_path / f"{column}.json").read_text())
        assert written["columns"][0]["fit"] is not None
        assert gapmark.fill(demo_frame[column], method).fit == written["columns"][0]["fit"], column
