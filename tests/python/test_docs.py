"""Every ```python snippet of docs/python.md runs, in order, in one
namespace, from a scratch copy of the demo data (as from the source tree)."""
import contextlib
import io
import os
import re
import shutil

import gapmark
from conftest import SOURCE


def snippets(path):
    text = open(path, encoding="utf-8").read()
    return re.findall(r"^```python\n(.*?)^```", text, flags=re.S | re.M)


def test_every_snippet_of_the_python_walk_through_runs(tmp_path, monkeypatch):
    blocks = snippets(os.path.join(SOURCE, "docs", "python.md"))
    assert len(blocks) >= 5
    os.makedirs(tmp_path / "experiments" / "demo")
    shutil.copy(os.path.join(SOURCE, "experiments", "demo", "pen3_hourly.csv"), tmp_path / "experiments" / "demo")
    monkeypatch.chdir(tmp_path)
    namespace = {}
    out = io.StringIO()
    for number, block in enumerate(blocks, 1):
        with contextlib.redirect_stdout(out):
            exec(compile(block, f"docs/python.md snippet {number}", "exec"), namespace)
    # what the walk-through says it shows
    results = namespace["results"]
    assert set(results.verdict) == {"dissolved_oxygen_mg_l", "pump_energy_kwh"}
    assert set(results.trials["method"]) == {"linear", "hour-median"}
    assert set(results.trials["status"]) == {"ok"}
    assert (tmp_path / "pen3-python-run" / "report.html").is_file()
    assert "missing values, longest gap" in out.getvalue()
    assert int(namespace["filled"].isna().sum()) == 0
    assert isinstance(gapmark.load_results(tmp_path / "pen3-python-run" / "results.json"), gapmark.Results)


def test_the_python_snippet_of_the_readme_runs(tmp_path, monkeypatch):
    blocks = snippets(os.path.join(SOURCE, "README.md"))
    assert len(blocks) == 1
    os.makedirs(tmp_path / "experiments" / "demo")
    shutil.copy(os.path.join(SOURCE, "experiments", "demo", "pen3_hourly.csv"), tmp_path / "experiments" / "demo")
    monkeypatch.chdir(tmp_path)
    namespace = {}
    with contextlib.redirect_stdout(io.StringIO()):
        exec(compile(blocks[0], "README.md python snippet", "exec"), namespace)
    assert len(namespace["results"].trials) == 10
    assert int(namespace["filled"].isna().sum()) == 0
