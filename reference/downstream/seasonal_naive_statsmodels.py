"""Seasonal naive forecasts and the MASE scale on open series from R's
datasets package. The seasonal naive forecast is the forecast of a seasonal
random walk, ARIMA(0,0,0)(0,1,0)_m without constant, so it is taken from
statsmodels.tsa.arima.model.ARIMA (simple differencing, nothing estimated
but the noise variance). The in-sample scale of MASE is the mean absolute
seasonal difference, by pandas Series.diff(m).abs().mean().
Writes values/seasonal_naive_statsmodels.json.
Run: /usr/bin/python3 seasonal_naive_statsmodels.py"""
import warnings

import numpy as np
import pandas as pd
from statsmodels.tsa.arima.model import ARIMA

from common import load_series, write

HORIZON = 30
cases = {}
for name, train_n in (("co2", 400), ("UKDriverDeaths", 170), ("LakeHuron", 90)):
    y = np.asarray(load_series()[name]["values"], dtype=float)[:train_n]
    m = int(load_series()[name]["frequency"])
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        if m > 1:
            model = ARIMA(y, order=(0, 0, 0), seasonal_order=(0, 1, 0, m), trend="n")
        else:
            model = ARIMA(y, order=(0, 1, 0), trend="n")
        res = model.fit()
    cases[name] = {"train_n": train_n, "period": m,
                   "forecast": res.forecast(HORIZON).tolist(),
                   "scale": float(pd.Series(y).diff(m).abs().mean())}

write("seasonal_naive_statsmodels.json", {
    "source": "statsmodels ARIMA(0,0,0)(0,1,0)_m (or (0,1,0) without a season) forecasts; "
              "pandas Series.diff(m).abs().mean()",
    "horizon": HORIZON,
    "cases": cases,
})
