// STL, seasonal-trend decomposition by loess (Cleveland, Cleveland, McRae &
// Terpenning 1990, J. Official Statistics 6(1):3-73), without robustness
// weights: the inner loop run a fixed number of times from a zero trend.
//   1. detrend; smooth each cycle-subseries by loess (window n_s, degree 1),
//      extended by one period at each end;
//   2. low-pass the result (moving averages of n_p, n_p and 3, then loess
//      with window n_l, degree 1) and subtract: the seasonal component;
//   3. deseasonalise and smooth by loess (window n_t, degree 1): the trend.
// Loess here is the original one: tricube weights over the n nearest points
// (window widened beyond the data when it is longer than the series), a
// local line where the points spread enough, evaluated at every point.
// Cost: O(n (n_s + n_l + n_t)) per pass, i.e. O(n * period).
#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "gapmark/error.hpp"
#include "gapmark/fill/seasonal_decomposition.hpp"

namespace gapmark {
namespace {

/// Loess estimate at position xs (1-based) from y[nleft..nright] (1-based,
/// inclusive). Returns false when every weight is zero.
bool loess_at(const std::vector<double>& y, std::size_t n, std::size_t len, int degree, double xs,
              std::size_t nleft, std::size_t nright, std::vector<double>& w, double& out) {
  const double range = static_cast<double>(n) - 1.0;
  double h = std::max(xs - static_cast<double>(nleft), static_cast<double>(nright) - xs);
  if (len > n) h += static_cast<double>((len - n) / 2);
  const double h9 = 0.999 * h, h1 = 0.001 * h;
  double a = 0.0;
  for (std::size_t j = nleft; j <= nright; ++j) {
    w[j - 1] = 0.0;
    const double r = std::abs(static_cast<double>(j) - xs);
    if (r <= h9) {
      if (r <= h1) {
        w[j - 1] = 1.0;
      } else {
        const double q = r / h;
        const double c = 1.0 - q * q * q;
        w[j - 1] = c * c * c;
      }
      a += w[j - 1];
    }
  }
  if (a <= 0.0) return false;
  for (std::size_t j = nleft; j <= nright; ++j) w[j - 1] /= a;
  if (h > 0.0 && degree > 0) {
    double centre = 0.0;
    for (std::size_t j = nleft; j <= nright; ++j) centre += w[j - 1] * static_cast<double>(j);
    double b = xs - centre, c = 0.0;
    for (std::size_t j = nleft; j <= nright; ++j) {
      const double d = static_cast<double>(j) - centre;
      c += w[j - 1] * d * d;
    }
    if (std::sqrt(c) > 0.001 * range) {
      b /= c;
      for (std::size_t j = nleft; j <= nright; ++j) w[j - 1] *= b * (static_cast<double>(j) - centre) + 1.0;
    }
  }
  out = 0.0;
  for (std::size_t j = nleft; j <= nright; ++j) out += w[j - 1] * y[j - 1];
  return true;
}

/// Loess smoothing of y[0..n) with window len, evaluated at every point.
void loess_smooth(const std::vector<double>& y, std::size_t n, std::size_t len, int degree, double* ys,
                  std::vector<double>& w) {
  if (n < 2) {
    ys[0] = y[0];
    return;
  }
  if (len >= n) {
    for (std::size_t i = 1; i <= n; ++i)
      if (!loess_at(y, n, len, degree, static_cast<double>(i), 1, n, w, ys[i - 1])) ys[i - 1] = y[i - 1];
    return;
  }
  const std::size_t half = (len + 1) / 2;
  std::size_t nleft = 1, nright = len;
  for (std::size_t i = 1; i <= n; ++i) {
    if (i > half && nright != n) {
      ++nleft;
      ++nright;
    }
    if (!loess_at(y, n, len, degree, static_cast<double>(i), nleft, nright, w, ys[i - 1])) ys[i - 1] = y[i - 1];
  }
}

/// Moving average of length len: out[j] = mean(x[j .. j+len)), n - len + 1 values.
std::vector<double> moving_average(const std::vector<double>& x, std::size_t n, std::size_t len) {
  std::vector<double> out(n - len + 1);
  double v = 0.0;
  for (std::size_t i = 0; i < len; ++i) v += x[i];
  const double flen = static_cast<double>(len);
  out[0] = v / flen;
  for (std::size_t j = 1; j + len <= n; ++j) {
    v = v - x[j - 1] + x[j + len - 1];
    out[j] = v / flen;
  }
  return out;
}

std::size_t odd_at_least(double v) {
  auto k = static_cast<std::size_t>(std::ceil(v));
  return k % 2 == 0 ? k + 1 : k;
}

}  // namespace

SeasonalDecomposition stl_decomposition(std::span<const double> series, std::size_t period,
                                        const StlOptions& options) {
  const std::size_t n = series.size(), np = period;
  if (np < 2) throw MethodFailure("STL needs a period of at least 2");
  if (n < 2 * np)
    throw MethodFailure("STL needs at least two full periods (period " + std::to_string(np) + ", " +
                        std::to_string(n) + " points)");
  const std::size_t ns = options.seasonal_window;
  if (ns < 3 || ns % 2 == 0) throw MethodFailure("STL seasonal window must be odd and at least 3");
  const std::size_t nt = odd_at_least(1.5 * static_cast<double>(np) / (1.0 - 1.5 / static_cast<double>(ns)));
  const std::size_t nl = odd_at_least(static_cast<double>(np) + 1.0);  // smallest odd > period
  constexpr int degree = 1;

  const std::vector<double> y(series.begin(), series.end());
  std::vector<double> trend(n, 0.0), season(n, 0.0), detrended(n), cycle(n + 2 * np), adjusted(n);
  std::vector<double> sub, smooth, w(std::max(n, ns) + 2 * np + 2);
  for (std::size_t pass = 0; pass < options.passes; ++pass) {
    for (std::size_t i = 0; i < n; ++i) detrended[i] = y[i] - trend[i];
    // Cycle-subseries smoothing, one period of extrapolation at each end.
    for (std::size_t j = 0; j < np; ++j) {
      const std::size_t k = (n - j - 1) / np + 1;  // points of phase j
      sub.assign(k, 0.0);
      for (std::size_t i = 0; i < k; ++i) sub[i] = detrended[i * np + j];
      smooth.assign(k + 2, 0.0);
      loess_smooth(sub, k, ns, degree, smooth.data() + 1, w);
      if (!loess_at(sub, k, ns, degree, 0.0, 1, std::min(ns, k), w, smooth[0])) smooth[0] = smooth[1];
      const std::size_t nleft = k >= ns ? k - ns + 1 : 1;
      if (!loess_at(sub, k, ns, degree, static_cast<double>(k + 1), nleft, k, w, smooth[k + 1]))
        smooth[k + 1] = smooth[k];
      for (std::size_t m = 0; m < k + 2; ++m) cycle[m * np + j] = smooth[m];
    }
    // Low-pass filter of the cycle-subseries result.
    const std::size_t big = n + 2 * np;
    const auto ma1 = moving_average(cycle, big, np);
    const auto ma2 = moving_average(ma1, ma1.size(), np);
    const auto ma3 = moving_average(ma2, ma2.size(), 3);  // n values
    std::vector<double> low(n);
    loess_smooth(ma3, n, nl, degree, low.data(), w);
    for (std::size_t i = 0; i < n; ++i) season[i] = cycle[np + i] - low[i];
    // Trend of the deseasonalised series.
    for (std::size_t i = 0; i < n; ++i) adjusted[i] = y[i] - season[i];
    loess_smooth(adjusted, n, nt, degree, trend.data(), w);
  }
  return {std::move(trend), std::move(season)};
}

}  // namespace gapmark
