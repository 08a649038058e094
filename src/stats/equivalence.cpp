#include "gapmark/stats/equivalence.hpp"

#include <boost/math/distributions/students_t.hpp>
#include <cmath>
#include <limits>
#include <stdexcept>

#include "gapmark/stats/descriptive.hpp"

namespace gapmark::stats {

TostResult paired_tost(std::span<const double> differences, double low, double high) {
  if (!(low < high)) throw std::invalid_argument("paired_tost: the margin needs low < high");
  for (double d : differences)
    if (!std::isfinite(d)) throw std::invalid_argument("paired_tost: differences must be finite");
  constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
  TostResult r;
  r.n = differences.size();
  r.mean = mean(differences);
  if (r.n < 2) {
    r.se = r.df = r.t_low = r.t_high = r.p_low = r.p_high = r.p = kNaN;
    return r;
  }
  r.df = static_cast<double>(r.n - 1);
  r.se = sample_sd(differences) / std::sqrt(static_cast<double>(r.n));
  if (r.se == 0) {
    const bool inside = r.mean > low && r.mean < high;
    r.t_low = r.t_high = kNaN;
    r.p_low = r.mean > low ? 0.0 : 1.0;
    r.p_high = r.mean < high ? 0.0 : 1.0;
    r.p = inside ? 0.0 : 1.0;
    return r;
  }
  const boost::math::students_t t(r.df);
  r.t_low = (r.mean - low) / r.se;
  r.t_high = (r.mean - high) / r.se;
  r.p_low = boost::math::cdf(boost::math::complement(t, r.t_low));
  r.p_high = boost::math::cdf(t, r.t_high);
  r.p = std::max(r.p_low, r.p_high);
  return r;
}

}  // namespace gapmark::stats
