"""Sample autocorrelation by statsmodels.tsa.stattools.acf (adjusted=False,
fft=False: mean-centred, denominator n) on LakeHuron and lynx from R's
datasets package, and on lynx with a few points set missing, using
missing="conservative" (mean over observed points, products over observed
pairs, n = number observed). Writes values/acf_statsmodels.json.
Run: /usr/bin/python3 acf_statsmodels.py"""
import numpy as np
from statsmodels.tsa.stattools import acf

from common import load_series, write

MAX_LAG = 30
# Fixed, hand-picked positions (0-based) set missing in the lynx series.
LYNX_GAPS = [0, 5, 17, 18, 19, 40, 77, 100, 113]

series = load_series()
out = {}
for name in ("LakeHuron", "lynx"):
    x = np.asarray(series[name]["values"], dtype=float)
    out[name] = acf(x, nlags=MAX_LAG, adjusted=False, fft=False).tolist()

x = np.asarray(series["lynx"]["values"], dtype=float)
x[LYNX_GAPS] = np.nan
lynx_gappy = acf(x, nlags=MAX_LAG, adjusted=False, fft=False, missing="conservative").tolist()


def distortion(complete, filled, lags):
    """acf_rms, acf_max and var_ratio computed from statsmodels' ACFs and
    numpy's nanvar, for the metric-level check."""
    rc = acf(complete, nlags=lags, adjusted=False, fft=False, missing="conservative")[1:]
    rf = acf(filled, nlags=lags, adjusted=False, fft=False, missing="conservative")[1:]
    d = rf - rc
    return {"acf_rms": float(np.sqrt(np.mean(d ** 2))), "acf_max": float(np.max(np.abs(d))),
            "var_ratio": float(np.nanvar(filled) / np.nanvar(complete))}


# A crude fill for the metric-level check: the masked points take the mean of
# the points left visible. lynx has no season, so the metric's default L = 24.
MASKED = [10, 11, 12, 30, 31, 55, 70, 71, 72, 73, 90]
DEFAULT_LAGS = 24
metric_cases = []
for truth_gaps in ([], LYNX_GAPS):
    truth = np.asarray(series["lynx"]["values"], dtype=float)
    truth[truth_gaps] = np.nan
    visible = truth.copy()
    visible[MASKED] = np.nan
    filled = truth.copy()
    filled[MASKED] = np.nanmean(visible)
    metric_cases.append({"truth_gaps": truth_gaps, "masked": MASKED, "lags": DEFAULT_LAGS,
                         "fill_value": float(np.nanmean(visible)),
                         **distortion(truth, filled, DEFAULT_LAGS)})

write("acf_statsmodels.json", {
    "source": "statsmodels.tsa.stattools.acf(x, nlags=30, adjusted=False, fft=False)",
    "max_lag": MAX_LAG,
    "acf": out,
    "lynx_with_gaps": {"gaps": LYNX_GAPS, "missing": "conservative", "acf": lynx_gappy},
    "metric_lynx_mean_fill": metric_cases,
})
