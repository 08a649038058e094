"""Reference values for the arima fill method from statsmodels' SARIMAX, stored
with R's values (r_reference.csv, made by r_reference.R) as arima_reference.json.

Run from the repository root, after the R script:
    /usr/bin/python3 reference/arima/statsmodels_reference.py
Data: R's datasets package (lh, LakeHuron, log UKDriverDeaths) with values
removed, as exported by r_reference.R.
"""
import csv
import json
import math
import platform
import warnings
from collections import defaultdict

import numpy as np
import scipy
import statsmodels
from statsmodels.tsa.statespace.sarimax import SARIMAX

OUT = "reference/arima"
NAMES = ["ar1", "ar2", "ma1", "sar1", "sma1", "intercept"]

rows = defaultdict(lambda: defaultdict(dict))
with open(f"{OUT}/r_reference.csv") as f:
    for r in csv.DictReader(f):
        v = r["value"]
        rows[r["case"]][r["quantity"]][int(r["index"])] = float(v) if v != "NA" else None


def seq(d):
    return [d[i] for i in sorted(d)]


cases = []
for name, q in rows.items():
    if name == "kpss":
        continue
    o = [int(v) for v in seq(q["order"])]
    y = seq(q["data"])
    codes = [NAMES[int(c) - 1] for c in seq(q["coef_names_code"])]
    r_coef = dict(zip(codes, seq(q["coef"])))
    case = {
        "name": name,
        "order": o[0:3], "seasonal": o[3:6], "period": o[6],
        "data": y,
        "r": {"coef": r_coef, "loglik": q["loglik"][1], "sigma2": q["sigma2"][1],
              "loglik_default_kappa": q["loglik_default_kappa"][1],
              "smooth_index": [int(i) for i in seq(q["smooth_index"])],
              "smooth_mean": seq(q["smooth_mean"]), "smooth_var": seq(q["smooth_var"])},
    }
    yy = np.array([np.nan if v is None else v for v in y])
    trend = "c" if (o[1] + o[4] == 0) else "n"
    seasonal = (o[3], o[4], o[5], o[6]) if o[6] > 1 else (0, 0, 0, 0)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        mod = SARIMAX(yy, order=tuple(o[0:3]), seasonal_order=seasonal, trend=trend,
                      enforce_stationarity=True, enforce_invertibility=True)
        res = mod.fit(method="lbfgs", maxiter=2000, disp=False)
        # the likelihood of statsmodels at R's estimates, to compare likelihood definitions
        start = []
        for pname in mod.param_names:
            if pname == "intercept":
                # SARIMAX's intercept is c in phi(B) y = c + ..., R's is the mean
                phi = sum(r_coef.get(k, 0.0) for k in ("ar1", "ar2"))
                sphi = r_coef.get("sar1", 0.0)
                start.append(r_coef["intercept"] * (1 - phi) * (1 - sphi))
            elif pname == "sigma2":
                start.append(q["sigma2"][1])
            else:
                key = {"ar.L1": "ar1", "ar.L2": "ar2", "ma.L1": "ma1",
                       f"ar.S.L{o[6]}": "sar1", f"ma.S.L{o[6]}": "sma1"}[pname]
                start.append(r_coef[key])
        llf_at_r = float(mod.loglike(np.array(start)))
    case["statsmodels"] = {
        "params": dict(zip(mod.param_names, [float(v) for v in res.params])),
        "loglik": float(res.llf),
        "loglik_at_r_estimates": llf_at_r,
        "note": "intercept is c in phi(B) y_t = c + ..., not the mean",
    }
    cases.append(case)

versions = {
    "R": open(f"{OUT}/r_version.txt").read().splitlines()[0],
    "python": platform.python_version(),
    "statsmodels": statsmodels.__version__,
    "numpy": np.__version__,
    "scipy": scipy.__version__,
}
with open(f"{OUT}/arima_reference.json", "w") as f:
    json.dump({"versions": versions, "sources": {
        "lh": "R datasets::lh (luteinizing hormone, 48 samples at 10-minute intervals)",
        "lakehuron": "R datasets::LakeHuron (level of Lake Huron in feet, 1875-1972)",
        "ukdriverdeaths": "R datasets::UKDriverDeaths, log scale (monthly, 1969-1984)"},
        "cases": cases}, f, indent=1)
for c in cases:
    print(c["name"], "R", round(c["r"]["loglik"], 5), "sm", round(c["statsmodels"]["loglik"], 5),
          "sm@R", round(c["statsmodels"]["loglik_at_r_estimates"], 5))

# KPSS level-stationarity statistics (statsmodels.tsa.stattools.kpss, regression
# "c", Bartlett window of trunc(4 (n/100)^(1/4)) lags) on complete open series.
from statsmodels.tsa.stattools import kpss  # noqa: E402

kpss_cases = []
# the complete series are exported by the R script under quantity "complete_*"
for key in ("complete_lh", "complete_lakehuron", "complete_log_ukdriverdeaths"):
    x = np.array(seq(rows["kpss"][key]))
    for d in (0, 1):
        xx = np.diff(x, n=d) if d else x
        lags = int(4 * (len(xx) / 100) ** 0.25)
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            stat = kpss(xx, regression="c", nlags=lags)[0]
        kpss_cases.append({"name": key, "differences": d, "lags": lags, "data": [float(v) for v in x],
                           "statistic": float(stat)})
doc = json.load(open(f"{OUT}/arima_reference.json"))
doc["kpss"] = kpss_cases
with open(f"{OUT}/arima_reference.json", "w") as f:
    json.dump(doc, f, indent=1)
print("kpss", [(c["name"], c["differences"], round(c["statistic"], 4)) for c in kpss_cases])
