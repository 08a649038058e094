#include "gapmark/stats/crps.hpp"

#include <boost/math/constants/constants.hpp>
#include <boost/math/distributions/normal.hpp>
#include <cmath>
#include <limits>

namespace gapmark::stats {

double gaussian_crps(double mu, double sigma, double y) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  if (!std::isfinite(mu) || !std::isfinite(sigma) || !std::isfinite(y) || sigma < 0) return nan;
  if (sigma == 0) return std::abs(y - mu);
  const double z = (y - mu) / sigma;
  const boost::math::normal_distribution<double> standard;
  const double cdf = boost::math::cdf(standard, z);
  const double pdf = boost::math::pdf(standard, z);
  return sigma * (z * (2 * cdf - 1) + 2 * pdf - boost::math::constants::one_div_root_pi<double>());
}

double gaussian_central_half_width(double level) {
  if (!(level > 0 && level < 1)) return std::numeric_limits<double>::quiet_NaN();
  const boost::math::normal_distribution<double> standard;
  return boost::math::quantile(standard, 0.5 * (1 + level));
}

}  // namespace gapmark::stats
