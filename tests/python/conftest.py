"""Shared fixtures of the Python module's tests: the gapmark program built
beside the module, the source tree, and the invented demo data."""
import os
import subprocess

import pandas as pd
import pytest

SOURCE = os.environ.get("GAPMARK_SOURCE_DIR", os.path.join(os.path.dirname(__file__), "..", ".."))
DEMO_CSV = os.path.join(SOURCE, "experiments", "demo", "pen3_hourly.csv")


@pytest.fixture
def cli():
    """Runs the gapmark program; returns the completed process (checked)."""
    binary = os.environ["GAPMARK_BINARY"]

    def run(*args, check=True):
        done = subprocess.run([binary, *map(str, args)], capture_output=True, text=True)
        if check and done.returncode != 0:
            raise AssertionError(f"gapmark {' '.join(map(str, args))} exited {done.returncode}: {done.stderr}")
        return done
    return run


@pytest.fixture
def demo_frame():
    """The invented demo data (experiments/demo/pen3_hourly.csv), read at
    round-trip precision so each value is the double gapmark reads."""
    return pd.read_csv(DEMO_CSV, index_col=0, parse_dates=True, float_precision="round_trip")
