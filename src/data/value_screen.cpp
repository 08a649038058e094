// The value-dependence screen: neighbours of gaps against the other values,
// by the Mann–Whitney U test; normal tail from Boost.Math.
#include "gapmark/data/value_screen.hpp"

#include <algorithm>
#include <boost/math/distributions/normal.hpp>
#include <cmath>
#include <stdexcept>
#include <vector>

#include "gapmark/stats/ranks.hpp"

namespace gapmark::data {
namespace {

double median(std::vector<double> x) {
  std::sort(x.begin(), x.end());
  const std::size_t n = x.size();
  return n % 2 ? x[n / 2] : 0.5 * (x[n / 2 - 1] + x[n / 2]);
}

}  // namespace

MannWhitney mann_whitney(std::span<const double> x, std::span<const double> y) {
  if (x.empty() || y.empty()) throw std::invalid_argument("mann_whitney: empty sample");
  std::vector<double> all(x.begin(), x.end());
  all.insert(all.end(), y.begin(), y.end());
  const std::vector<double> ranks = stats::average_ranks(all);
  const double n1 = double(x.size()), n2 = double(y.size()), n = n1 + n2;
  double r1 = 0;
  for (std::size_t i = 0; i < x.size(); ++i) r1 += ranks[i];
  MannWhitney out;
  out.u = r1 - n1 * (n1 + 1) / 2;
  // Tie correction: sum over tie groups of t^3 - t.
  std::sort(all.begin(), all.end());
  double ties = 0;
  for (std::size_t i = 0; i < all.size();) {
    std::size_t j = i;
    while (j < all.size() && all[j] == all[i]) ++j;
    const double t = double(j - i);
    ties += t * t * t - t;
    i = j;
  }
  const double mu = n1 * n2 / 2;
  const double var = n1 * n2 / 12 * ((n + 1) - ties / (n * (n - 1)));
  if (!(var > 0)) {
    out.z = 0;
    out.p = 1;
    return out;
  }
  const double d = out.u - mu;
  const double corrected = std::max(0.0, std::abs(d) - 0.5);
  out.z = (d < 0 ? -corrected : corrected) / std::sqrt(var);
  const boost::math::normal normal;
  out.p = std::min(1.0, 2 * boost::math::cdf(boost::math::complement(normal, std::abs(out.z))));
  return out;
}

ValueScreen screen_values(std::span<const double> values, std::size_t min_count) {
  ValueScreen s;
  const std::size_t n = values.size();
  std::vector<std::uint8_t> near(n, 0);
  std::size_t gaps = 0;
  for (std::size_t i = 0; i < n;) {
    if (!std::isnan(values[i])) {
      ++i;
      continue;
    }
    std::size_t j = i;
    while (j < n && std::isnan(values[j])) ++j;
    ++gaps;
    if (i > 0) near[i - 1] = 1;
    if (j < n) near[j] = 1;
    i = j;
  }
  std::vector<double> a, b;
  for (std::size_t i = 0; i < n; ++i) {
    if (std::isnan(values[i])) continue;
    (near[i] ? a : b).push_back(values[i]);
  }
  s.near_count = a.size();
  s.rest_count = b.size();
  if (gaps == 0) {
    s.reason = "no gaps";
    return s;
  }
  if (a.size() < min_count || b.size() < min_count) {
    s.reason = "too few values: " + std::to_string(a.size()) + " next to gaps, " + std::to_string(b.size()) +
               " elsewhere (needs " + std::to_string(min_count) + " of each)";
    return s;
  }
  s.applicable = true;
  s.near_median = median(a);
  s.rest_median = median(b);
  s.test = mann_whitney(a, b);
  return s;
}

}  // namespace gapmark::data
