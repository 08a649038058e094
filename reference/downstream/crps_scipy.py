"""CRPS of a Gaussian predictive distribution by numerical integration of its
definition, CRPS(F, y) = int (F(x) - 1{x >= y})^2 dx, with
scipy.integrate.quad and scipy.stats.norm.cdf (no closed form used), and the
central-interval quantiles by scipy.stats.norm.ppf.
Writes values/crps_scipy.json.  Run: /usr/bin/python3 crps_scipy.py"""
import numpy as np
from scipy import integrate, stats

from common import write

# (mu, sigma, y): hand-picked to cover the centre, both tails, small and
# large scales.
POINTS = [
    (0.0, 1.0, 0.0), (0.0, 1.0, 1.0), (0.0, 1.0, -2.5), (3.0, 0.5, 3.2),
    (-1.5, 2.0, 4.0), (10.0, 0.01, 10.02), (100.0, 25.0, 60.0), (0.0, 1.0, 8.0),
]
LEVELS = [0.5, 0.8, 0.9, 0.95, 0.99]


def crps_by_integral(mu, sigma, y):
    cdf = stats.norm(loc=mu, scale=sigma).cdf
    lower, err_lo = integrate.quad(lambda x: cdf(x) ** 2, -np.inf, y, epsabs=1e-13, epsrel=1e-12, limit=200)
    upper, err_hi = integrate.quad(lambda x: (1.0 - cdf(x)) ** 2, y, np.inf, epsabs=1e-13, epsrel=1e-12, limit=200)
    return lower + upper, err_lo + err_hi


rows = []
for mu, sigma, y in POINTS:
    value, err = crps_by_integral(mu, sigma, y)
    rows.append({"mu": mu, "sigma": sigma, "y": y, "crps": value, "quad_error": err})

write("crps_scipy.json", {
    "source": "scipy.integrate.quad of int (F(x) - 1{x >= y})^2 dx, F = scipy.stats.norm.cdf",
    "points": rows,
    "central_half_width": [{"level": p, "z": float(stats.norm.ppf(0.5 * (1 + p)))} for p in LEVELS],
})
