"""Listings equal the program's (`gapmark methods --json` ...), and errors
carry gapmark's one-line text."""
import json

import numpy as np
import pytest

import gapmark


@pytest.mark.parametrize("family", ["methods", "schemes", "metrics"])
def test_listing_equals_the_program_listing(cli, family):
    registered_here = set(gapmark._engine._python_methods())  # by other tests of this process
    listed = [e for e in getattr(gapmark, family)() if e["name"] not in registered_here]
    assert listed == json.loads(cli(family, "--json").stdout)
    assert len(listed) > 3
    first = listed[0]
    assert set(first) == {"name", "summary", "needs", "params"}


def test_methods_list_names_parameters_defaults_ranges_and_needs():
    kalman = {m["name"]: m for m in gapmark.methods()}["kalman"]
    params = {p["name"]: p for p in kalman["params"]}
    assert params["model"]["default"] == "level"
    assert "trend" in params["model"]["choices"]
    assert kalman["needs"]["min_observed"] >= 1
    window = {m["name"]: m for m in gapmark.methods()}["window-mean"]
    reach = {p["name"]: p for p in window["params"]}["reach"]
    assert reach["type"] == "integer" and reach["min"] == 1


def test_unknown_method_is_an_input_error_with_the_program_text(cli, tmp_path):
    with pytest.raises(gapmark.InputError) as raised:
        gapmark.fill(np.array([1.0, np.nan, 3.0]), "lineer")
    assert str(raised.value) == "method: unknown method 'lineer' (did you mean 'linear'?)"
    assert isinstance(raised.value, ValueError)
    done = cli("fill", "x.csv", "--method", "lineer", "--out", tmp_path / "o.csv", check=False)
    assert done.returncode == 2
    assert "unknown method 'lineer' (did you mean 'linear'?)" in done.stderr


def test_bad_parameter_names_the_field():
    with pytest.raises(gapmark.InputError, match=r"^method \(window-mean\): .*reach"):
        gapmark.fill(np.array([1.0, np.nan, 3.0]), "window-mean", reach=0)


def test_a_method_that_cannot_fill_raises_method_failure_with_its_reason():
    with pytest.raises(gapmark.MethodFailure, match="period"):
        gapmark.fill(np.array([1.0, np.nan, 3.0, 4.0]), "seasonal-mean")
    assert issubclass(gapmark.MethodFailure, RuntimeError)


def test_infinite_values_are_refused():
    with pytest.raises(gapmark.InputError, match="infinite"):
        gapmark.fill(np.array([1.0, np.inf, np.nan]), "linear")
