"""run() against `gapmark run` on the same spec (the same results.json
outside "timing"), Results, load_results, and the masks run() draws."""
import json
import os
import shutil

import numpy as np
import pandas as pd
import pytest

import gapmark
from conftest import DEMO_CSV

SPEC = {
    "name": "python parity (invented demo data)",
    "seed": 20261201,
    "replicates": 4,
    "holdout": 48,
    "output": "out",
    "data": [{"file": "pen3_hourly.csv", "columns": ["dissolved_oxygen_mg_l", "salinity_psu"], "period": 24}],
    "schemes": [{"name": "blocks", "length_mean": 8, "rates": [0.1]}],
    "methods": ["linear", "seasonal-mean", "kalman:model=level"],
}


def without_timing(text):
    j = json.loads(text)
    j.pop("timing")
    return j


@pytest.fixture
def spec_folder(tmp_path):
    shutil.copy(DEMO_CSV, tmp_path / "pen3_hourly.csv")
    (tmp_path / "spec.json").write_text(json.dumps(SPEC, indent=2) + "\n")
    return tmp_path


@pytest.fixture
def cli_run(cli, spec_folder):
    cli("run", spec_folder / "spec.json", "--out", spec_folder / "cli-out", "--quiet", "--threads", 2)
    return spec_folder / "cli-out"


def test_run_of_a_spec_file_equals_gapmark_run_outside_timing(spec_folder, cli_run):
    results = gapmark.run(spec_folder / "spec.json", progress=False)
    expected = (cli_run / "results.json").read_text()
    assert without_timing(results.to_json()) == without_timing(expected)
    assert len(results.json["trials"]) == 2 * 4 * 3


def test_run_of_a_dict_with_a_data_frame_equals_gapmark_run(spec_folder, cli_run, demo_frame):
    spec = json.loads((spec_folder / "spec.json").read_text())
    results = gapmark.run(spec, data={"pen3_hourly.csv": demo_frame}, threads=1, progress=False)
    got, expected = without_timing(results.to_json()), without_timing((cli_run / "results.json").read_text())
    # the spec's text and the data file's bytes differ (JSON written again, the
    # frame written as CSV); everything computed from them is the same
    for j in (got, expected):
        for key in ("spec_sha256",):
            j["context"].pop(key)
        for i in j["context"]["inputs"]:
            i.pop("sha256")
    assert got == expected


def test_results_trials_ranking_verdict_and_warnings(spec_folder, cli_run):
    results = gapmark.run(spec_folder / "spec.json", progress=False)
    trials = results.trials
    assert isinstance(trials, pd.DataFrame) and len(trials) == 24
    for column in ("series", "scheme", "rate", "replicate", "method", "status", "masked", "rmse", "mae"):
        assert column in trials.columns, column
    assert set(trials["status"]) == {"ok"}
    assert set(trials["method"]) == {"linear", "seasonal-mean", "kalman"}
    ranking = results.ranking
    assert set(ranking["standing"]) <= {"best", "equivalent", "not distinguishable", "worse", "better"}
    assert (ranking.groupby(["series", "scheme", "rate"])["standing"].apply(lambda s: (s == "best").sum()) == 1).all()
    verdict = results.verdict
    assert set(verdict) == {"dissolved_oxygen_mg_l", "salinity_psu"}
    cli_verdict = json.loads((cli_run / "results.json").read_text())["verdict"]["series"]
    assert [verdict[v["series"]]["recommended"] for v in cli_verdict] == [v["recommended"] for v in cli_verdict]
    assert all(v["reasons"] for v in verdict.values())
    assert isinstance(results.warnings, list)


def test_write_writes_the_reports_of_gapmark_run(spec_folder, cli_run):
    results = gapmark.run(spec_folder / "spec.json", progress=False)
    written = results.write(spec_folder / "py-out")
    assert sorted(os.path.basename(p) for p in written) == sorted(
        n for n in os.listdir(cli_run) if n not in ("trials.jsonl",) and not n.startswith("."))
    for name in ("ranking.csv", "ranking.md"):
        assert (spec_folder / "py-out" / name).read_text() == (cli_run / name).read_text(), name
    with pytest.raises(gapmark.InputError, match="not empty"):
        results.write(spec_folder / "py-out")
    results.write(spec_folder / "py-out", force=True)


def test_load_results_reads_a_results_file_back(cli_run):
    results = gapmark.load_results(cli_run / "results.json")
    assert results.to_json() == (cli_run / "results.json").read_text()
    assert len(results.trials) == 24


def test_the_masks_of_a_run_are_those_of_mask(spec_folder, demo_frame):
    results = gapmark.run(spec_folder / "spec.json", progress=False)
    trials = results.trials
    for column in ("dissolved_oxygen_mg_l", "salinity_psu"):
        for replicate in range(4):
            hidden = gapmark.mask(demo_frame[column], "blocks", rate=0.1, seed=20261201, replicate=replicate,
                                  holdout=48, period=24, length_mean=8)
            row = trials[(trials.series == column) & (trials.replicate == replicate) & (trials.method == "linear")]
            assert int(row["masked"].iloc[0]) == int(hidden.sum())


def test_a_spec_error_names_the_field(spec_folder):
    spec = dict(SPEC, methods=["linear", "lineer"])
    with pytest.raises(gapmark.InputError, match=r"/methods/1.*unknown method 'lineer'"):
        gapmark.run(spec, data={"pen3_hourly.csv": pd.read_csv(DEMO_CSV, index_col=0, parse_dates=True)},
                    progress=False)


def test_a_spec_that_starts_programs_needs_consent(spec_folder):
    spec = dict(SPEC, methods=["linear", {"name": "external", "command": "true"}])
    (spec_folder / "ext.json").write_text(json.dumps(spec))
    with pytest.raises(gapmark.InputError, match="allow_external=True"):
        gapmark.run(spec_folder / "ext.json", progress=False)


def test_fits_on_record_are_those_of_fill_on_the_same_masked_series(spec_folder, demo_frame):
    results = gapmark.run(spec_folder / "spec.json", progress=False)
    trials = results.trials
    column, replicate = "salinity_psu", 2
    row = trials[(trials.series == column) & (trials.replicate == replicate) & (trials.method == "kalman")].iloc[0]
    assert row["fit"]["model"] == "level"
    assert isinstance(trials[trials.method == "linear"]["fit"].iloc[0], float)  # no fit: NaN
    hidden = gapmark.mask(demo_frame[column], "blocks", rate=0.1, seed=20261201, replicate=replicate, holdout=48,
                          period=24, length_mean=8)
    filled = gapmark.fill(demo_frame[column].mask(hidden), "kalman:model=level", period=24)
    assert filled.fit == row["fit"]
    assert filled.variance is not None and (filled.variance[hidden] > 0).all()
