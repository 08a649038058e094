#include "gapmark/stats/descriptive.hpp"

#include <boost/math/distributions/students_t.hpp>
#include <cmath>
#include <limits>
#include <stdexcept>

namespace gapmark::stats {

namespace {
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
}

double mean(std::span<const double> x) {
  if (x.empty()) return kNaN;
  double sum = 0;
  for (double v : x) sum += v;
  return sum / static_cast<double>(x.size());
}

double sample_sd(std::span<const double> x) {
  if (x.size() < 2) return kNaN;
  const double m = mean(x);
  double ss = 0;
  for (double v : x) ss += (v - m) * (v - m);
  return std::sqrt(ss / static_cast<double>(x.size() - 1));
}

Interval t_interval(std::span<const double> x, double level) {
  if (!(level > 0 && level < 1))
    throw std::invalid_argument("t_interval: level must lie strictly between 0 and 1");
  if (x.size() < 2) return {kNaN, kNaN};
  const double m = mean(x);
  const double sd = sample_sd(x);
  const double n = static_cast<double>(x.size());
  if (!std::isfinite(m) || !std::isfinite(sd)) return {kNaN, kNaN};
  const boost::math::students_t dist(n - 1);
  const double t = boost::math::quantile(boost::math::complement(dist, (1 - level) / 2));
  const double half = t * sd / std::sqrt(n);
  return {m - half, m + half};
}

Description describe(std::span<const double> x, double level) {
  Description d;
  d.n = x.size();
  d.mean = mean(x);
  d.sd = sample_sd(x);
  d.ci = t_interval(x, level);
  return d;
}

}  // namespace gapmark::stats
