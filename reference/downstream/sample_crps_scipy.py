"""Sample CRPS of a predictive distribution given by draws, by numerical
integration of its definition over the draws' empirical CDF,
CRPS(F_M, y) = int (F_M(x) - 1{x >= y})^2 dx, with scipy.integrate.quad on
each interval between consecutive breakpoints (the draws and y), where the
integrand is constant; and the draws' central-interval quantiles by
numpy.quantile (linear interpolation). No energy formula is used.
Draws are invented here (numpy's default generator, fixed seeds).
Writes values/sample_crps_scipy.json.  Run: /usr/bin/python3 sample_crps_scipy.py"""
import numpy as np
from scipy import integrate

from common import write


def crps_by_integral(draws, y):
    draws = np.sort(np.asarray(draws, dtype=float))
    m = draws.size

    def integrand(x):
        return (np.searchsorted(draws, x, side="right") / m - (1.0 if x >= y else 0.0)) ** 2

    points = np.unique(np.concatenate([draws, [y]]))
    total, error = 0.0, 0.0
    for a, b in zip(points[:-1], points[1:]):
        mid = 0.5 * (a + b)  # the integrand is constant on (a, b): quad of that constant
        value, err = integrate.quad(lambda x, v=integrand(mid): v, a, b, epsabs=1e-14, epsrel=1e-13)
        total += value
        error += err
    return total, error  # outside [min, max] the integrand is zero


rng = np.random.default_rng(20261202)
cases = []
# (name, draws, outcome): small hand-made samples, ties, an outcome outside the draws, larger random samples
hand = [
    ("single draw", [2.0], 3.5),
    ("two draws", [0.0, 1.0], 0.25),
    ("ties", [1.0, 1.0, 2.0, 2.0, 2.0], 1.5),
    ("outcome below all", [3.0, 4.0, 5.5], -1.0),
    ("outcome on a draw", [0.5, -0.25, 2.0, 1.0], 1.0),
]
for name, draws, y in hand:
    cases.append((name, draws, y))
for m, loc, scale, y in [(20, 0.0, 1.0, 0.3), (100, 10.0, 3.0, 14.0), (500, -2.0, 0.1, -2.05)]:
    cases.append((f"normal sample of {m}", rng.normal(loc, scale, m).tolist(), y))
rows = []
for name, draws, y in cases:
    value, err = crps_by_integral(draws, y)
    rows.append({"name": name, "draws": [float(v) for v in draws], "y": float(y), "crps": value, "quad_error": err,
                 "q05": float(np.quantile(draws, 0.05)), "q95": float(np.quantile(draws, 0.95))})

write("sample_crps_scipy.json", {
    "source": "scipy.integrate.quad of int (F_M(x) - 1{x >= y})^2 dx over the empirical CDF F_M of the draws; "
              "numpy.quantile (linear) for the 5% and 95% quantiles",
    "cases": rows,
})
