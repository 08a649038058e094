"""Helpers shared by the reference scripts: read the exported R series and
write JSON with the library versions that produced it."""
import json
import os
import platform

HERE = os.path.dirname(os.path.abspath(__file__))


def load_series():
    with open(os.path.join(HERE, "data", "r_datasets.json")) as fh:
        return json.load(fh)["series"]


def versions():
    import numpy
    import pandas
    import scipy
    import statsmodels
    return {"python": platform.python_version(), "numpy": numpy.__version__,
            "scipy": scipy.__version__, "pandas": pandas.__version__,
            "statsmodels": statsmodels.__version__}


def write(name, payload):
    payload = {"versions": versions(), **payload}
    path = os.path.join(HERE, "values", name)
    with open(path, "w") as fh:
        json.dump(payload, fh, indent=1)
        fh.write("\n")
    print("wrote", path)
