#include "gapmark/stats/acf.hpp"

#include <cmath>
#include <limits>

namespace gapmark::stats {

std::vector<double> sample_autocovariance(std::span<const double> x, std::size_t max_lag) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  std::size_t observed = 0;
  double sum = 0;
  for (double v : x)
    if (!std::isnan(v)) {
      sum += v;
      ++observed;
    }
  if (observed < 2) return std::vector<double>(max_lag + 1, nan);
  const double mean = sum / static_cast<double>(observed);

  // Centred copy with 0 at missing points: a product with a missing point
  // then adds nothing, which is the pairwise rule.
  std::vector<double> centred(x.size());
  for (std::size_t t = 0; t < x.size(); ++t) centred[t] = std::isnan(x[t]) ? 0.0 : x[t] - mean;

  std::vector<double> cov(max_lag + 1, 0.0);
  for (std::size_t k = 0; k <= max_lag && k < x.size(); ++k) {
    double s = 0;
    for (std::size_t t = 0; t + k < x.size(); ++t) s += centred[t] * centred[t + k];
    cov[k] = s / static_cast<double>(observed);
  }
  return cov;
}

std::vector<double> sample_autocorrelation(std::span<const double> x, std::size_t max_lag) {
  std::vector<double> r = sample_autocovariance(x, max_lag);
  const double c0 = r[0];
  if (std::isnan(c0) || !(c0 > 0)) return std::vector<double>(max_lag + 1, std::numeric_limits<double>::quiet_NaN());
  for (double& v : r) v /= c0;
  r[0] = 1.0;
  return r;
}

}  // namespace gapmark::stats
