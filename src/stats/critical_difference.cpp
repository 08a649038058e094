#include "gapmark/stats/critical_difference.hpp"

#include <cmath>
#include <limits>

#include "gapmark/stats/studentized_range.hpp"

namespace gapmark::stats {

double nemenyi_q(double alpha, int k) {
  return studentized_range_critical(alpha, k) / std::sqrt(2.0);
}

double nemenyi_critical_difference(double alpha, int k, std::size_t datasets) {
  if (k < 2 || datasets == 0) return std::numeric_limits<double>::quiet_NaN();
  const double kk = static_cast<double>(k);
  return nemenyi_q(alpha, k) * std::sqrt(kk * (kk + 1) / (6.0 * static_cast<double>(datasets)));
}

}  // namespace gapmark::stats
