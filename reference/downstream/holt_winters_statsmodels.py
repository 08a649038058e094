"""Additive Holt-Winters by statsmodels ExponentialSmoothing(trend="add",
seasonal="add") on open seasonal series from R's datasets package (co2,
UKDriverDeaths). Writes values/holt_winters_statsmodels.json with
  - the simple initial states of statsmodels'
    exponential_smoothing.initialization._initialization_simple
    (Hyndman & Athanasopoulos, section 7.6),
  - with those states given as "known" and the smoothing parameters fixed:
    the one-step fitted values, the SSE, the final states and a forecast
    (note: at steps h = m, 2m, ... this statsmodels version's forecast reuses
    s_{n-m} where the textbook forecast uses the last update s_n; the tests
    compare those steps with l_n + h b_n + s_n from the stored final states),
  - with the same initial states held fixed (fix_params) and the smoothing
    parameters fitted by statsmodels (L-BFGS-B; its default SLSQP stops
    early on UKDriverDeaths): the parameters and the SSE.
Run: /usr/bin/python3 holt_winters_statsmodels.py"""
import numpy as np
from statsmodels.tsa.exponential_smoothing.initialization import _initialization_simple
from statsmodels.tsa.holtwinters import ExponentialSmoothing

from common import load_series, write

HORIZON = 24
# Fixed smoothing parameters inside statsmodels' accepted region
# (beta <= alpha, gamma <= 1 - alpha).
FIXED = [
    {"alpha": 0.4, "beta": 0.05, "gamma": 0.3},
    {"alpha": 0.85, "beta": 0.6, "gamma": 0.1},
]

series = load_series()
cases = {}
for name in ("co2", "UKDriverDeaths"):
    y = np.asarray(series[name]["values"], dtype=float)
    m = int(series[name]["frequency"])
    level, trend, season = _initialization_simple(y, trend="add", seasonal="add", seasonal_periods=m)

    def model():
        return ExponentialSmoothing(y, trend="add", seasonal="add", seasonal_periods=m,
                                    initialization_method="known", initial_level=level,
                                    initial_trend=trend, initial_seasonal=season)

    runs = []
    for p in FIXED:
        res = model().fit(smoothing_level=p["alpha"], smoothing_trend=p["beta"],
                          smoothing_seasonal=p["gamma"], optimized=False)
        # Final states: res.season[-m:] are s_{n-m+1} .. s_n in time order.
        runs.append({**p, "fitted": res.fittedvalues.tolist(), "sse": float(res.sse),
                     "final_level": float(res.level[-1]), "final_trend": float(res.trend[-1]),
                     "final_season": np.asarray(res.season[-m:]).tolist(),
                     "forecast": res.forecast(HORIZON).tolist()})

    # In this statsmodels version "known" initial values are still optimised
    # by fit(); fix_params holds them fixed so only alpha, beta, gamma move.
    free = ExponentialSmoothing(y, trend="add", seasonal="add", seasonal_periods=m,
                                initialization_method="estimated")
    held = {"initial_level": level, "initial_trend": trend}
    held.update({f"initial_seasonal.{i}": season[i] for i in range(m)})
    with free.fix_params(held):
        res = free.fit(method="L-BFGS-B")
    assert res.params["initial_level"] == level and res.params["initial_trend"] == trend
    assert np.array_equal(res.params["initial_seasons"], season)
    fitted = {"alpha": float(res.params["smoothing_level"]),
              "beta": float(res.params["smoothing_trend"]),
              "gamma": float(res.params["smoothing_seasonal"]),
              "method": "L-BFGS-B",
              "sse": float(res.sse)}
    # The forecast metric's situation: fit on all but the last HORIZON points
    # (same fixed-initial-state fit), forecast the held-out points.
    train = y[:-HORIZON]
    t_level, t_trend, t_season = _initialization_simple(train, trend="add", seasonal="add",
                                                        seasonal_periods=m)
    free = ExponentialSmoothing(train, trend="add", seasonal="add", seasonal_periods=m,
                                initialization_method="estimated")
    held = {"initial_level": t_level, "initial_trend": t_trend}
    held.update({f"initial_seasonal.{i}": t_season[i] for i in range(m)})
    with free.fix_params(held):
        t_res = free.fit(method="L-BFGS-B")
    holdout = {"train_n": len(train), "forecast": t_res.forecast(HORIZON).tolist(),
               "actual": y[-HORIZON:].tolist()}

    cases[name] = {"period": m, "holdout": holdout, "initial": {"level": float(level), "trend": float(trend),
                                            "season": np.asarray(season).tolist()},
                   "fixed": runs, "fit": fitted}

write("holt_winters_statsmodels.json", {
    "source": "statsmodels.tsa.holtwinters.ExponentialSmoothing(trend='add', seasonal='add', "
              "initialization_method='known')",
    "horizon": HORIZON,
    "cases": cases,
})
