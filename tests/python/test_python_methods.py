"""Fill methods written in Python (register_method) beside the built-in
ones: parity with `linear` through numpy.interp, failures as failed trials,
the same results whatever the thread count."""
import json
import shutil

import numpy as np
import pytest

import gapmark
from conftest import DEMO_CSV

SPEC = {
    "name": "python methods (invented demo data)",
    "seed": 11,
    "replicates": 5,
    "holdout": 48,
    "data": [{"file": "pen3_hourly.csv", "columns": ["dissolved_oxygen_mg_l", "water_level_m"], "period": 24}],
    "schemes": [{"name": "random", "rates": [0.1]}, {"name": "blocks", "length_mean": 8, "rates": [0.3]}],
}


def interp(values, request):
    """Straight lines between observed neighbours (numpy.interp)."""
    x = np.arange(len(values))
    seen = ~np.isnan(values)
    return np.interp(x, x[seen], values[seen])


def broken(values, request):
    raise ValueError("this method always fails")


def scaled_mean(values, request, scale=1.0, edge="nearest"):
    out = values.copy()
    out[np.isnan(out)] = scale * np.nanmean(values)
    return out, np.where(np.isnan(values), 1.0, 0.0)


gapmark.register_method("test-interp", interp)
gapmark.register_method("test-broken", broken, summary="always fails")
gapmark.register_method("test-scaled-mean", scaled_mean, params={"scale": 1.0, "edge": {"default": "nearest",
                                                                  "choices": ["nearest", "leave"]}})


@pytest.fixture
def folder(tmp_path):
    shutil.copy(DEMO_CSV, tmp_path / "pen3_hourly.csv")
    return tmp_path


def run(folder, methods, **kwargs):
    spec = dict(SPEC, methods=methods)
    (folder / "spec.json").write_text(json.dumps(spec))
    return gapmark.run(folder / "spec.json", progress=False, **kwargs)


def test_a_numpy_interp_method_gives_the_trials_of_linear(folder):
    trials = run(folder, ["linear", "test-interp"]).trials
    assert set(trials["status"]) == {"ok"}
    linear = trials[trials.method == "linear"].reset_index(drop=True)
    mine = trials[trials.method == "test-interp"].reset_index(drop=True)
    assert len(linear) == len(mine) == 2 * 2 * 5
    keys = ["series", "scheme", "rate", "replicate", "masked", "unfilled"]
    assert linear[keys].equals(mine[keys])
    metrics = [c for c in ("rmse", "mae", "bias", "acf_rms", "var_ratio") if c in trials.columns]
    assert len(metrics) >= 3
    for m in metrics:
        a, b = linear[m].to_numpy(dtype=float), mine[m].to_numpy(dtype=float)
        assert np.all(np.isnan(a) == np.isnan(b)), m
        ok = ~np.isnan(a)
        assert np.allclose(a[ok], b[ok], rtol=1e-12, atol=1e-12), m


def test_a_method_that_raises_is_a_failed_cell_with_its_message(folder):
    results = run(folder, ["linear", "test-broken"])
    trials = results.trials
    failed = trials[trials.method == "test-broken"]
    assert len(failed) == 20 and set(failed["status"]) == {"failed"}
    assert set(failed["reason"]) == {"ValueError: this method always fails"}
    assert set(trials[trials.method == "linear"]["status"]) == {"ok"}
    ranking = results.ranking
    assert (ranking[ranking.method == "test-broken"]["failures"] == 5).all()
    assert all(v["recommended"] == "linear" for v in results.verdict.values())


def test_the_thread_count_changes_nothing(folder):
    methods = ["linear", "test-interp", "kalman:model=level", "test-scaled-mean:scale=1.5"]
    one = json.loads(run(folder, methods, threads=1).to_json())
    two = json.loads(run(folder, methods, threads=2).to_json())
    one.pop("timing"), two.pop("timing")
    assert one == two


def test_parameters_variances_and_the_request(folder):
    seen = {}

    def spy(values, request):
        seen.update(period=request.period, siblings=sorted(request.siblings), step=request.step,
                    start=request.start)
        return interp(values, request)
    gapmark.register_method("test-spy", spy, needs={"siblings": True})
    trials = run(folder, ["test-spy", "test-scaled-mean:scale=1.5,edge=leave"]).trials
    assert seen["period"] == 24 and seen["step"] == "PT1H" and seen["start"] == "2026-03-01T00:00"
    assert seen["siblings"] in (["dissolved_oxygen_mg_l"], ["water_level_m"])  # the other series of the file
    scaled = trials[trials.method == "test-scaled-mean:scale=1.5,edge=leave"]
    assert len(scaled) == 20 and set(scaled["status"]) == {"ok"}
    filled = gapmark.fill(np.array([1.0, np.nan, 3.0]), "test-scaled-mean", scale=2.0)
    assert filled.values[1] == 4.0 and filled.variance[1] == 1.0 and filled.variance[0] == 0.0


def test_registered_methods_are_listed_and_checked():
    listed = {m["name"]: m for m in gapmark.methods()}
    assert listed["test-broken"]["summary"] == "always fails"
    assert listed["test-interp"]["summary"] == "Straight lines between observed neighbours (numpy.interp)."
    scale = {p["name"]: p for p in listed["test-scaled-mean"]["params"]}["scale"]
    assert scale["type"] == "number" and scale["default"] == "1.0"
    with pytest.raises(gapmark.InputError, match="built-in"):
        gapmark.register_method("linear", interp)
    with pytest.raises(gapmark.InputError, match="letters"):
        gapmark.register_method("bad name", interp)
    with pytest.raises(gapmark.InputError, match=r"test-scaled-mean.*edge"):
        gapmark.fill(np.array([1.0, np.nan, 3.0]), "test-scaled-mean", edge="middle")


def test_a_wrong_answer_is_a_failed_trial(folder):
    gapmark.register_method("test-short", lambda values, request: values[:-1])
    trials = run(folder, ["test-short"]).trials
    assert set(trials["status"]) == {"failed"}
    assert trials["reason"].iloc[0].startswith("ValueError: returned")


def test_an_interrupt_stops_the_run_without_results(folder):
    calls, armed = [], [True]

    def impatient(values, request):
        calls.append(1)
        if armed[0] and len(calls) in (3, 4):
            raise KeyboardInterrupt  # as Ctrl-C does inside a method
        return interp(values, request)
    gapmark.register_method("test-impatient", impatient)
    with pytest.raises(KeyboardInterrupt):
        run(folder, ["linear", "test-impatient"], threads=1)
    assert len(calls) == 3, "no Python method is called after the interrupt"
    with pytest.raises(KeyboardInterrupt):
        gapmark.fill(np.array([1.0, np.nan, 3.0]), "test-impatient")
    armed[0] = False
    assert set(run(folder, ["test-impatient"]).trials["status"]) == {"ok"}, "the next run is not interrupted"
