#include "gapmark/stats/wilcoxon.hpp"

#include <algorithm>
#include <boost/math/distributions/normal.hpp>
#include <cmath>
#include <cstdint>
#include <limits>
#include <stdexcept>
#include <vector>

#include "gapmark/stats/ranks.hpp"

namespace gapmark::stats {

namespace {
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// Number of subsets of {1..n} with each rank sum s = 0..n(n+1)/2: the null
// distribution of W+ times 2^n. Exact in 64-bit integers for n <= 62.
std::vector<std::uint64_t> signed_rank_counts(std::size_t n) {
  const std::size_t max_sum = n * (n + 1) / 2;
  std::vector<std::uint64_t> counts(max_sum + 1, 0);
  counts[0] = 1;
  std::size_t reach = 0;
  for (std::size_t r = 1; r <= n; ++r) {
    reach += r;
    for (std::size_t s = reach; s >= r; --s) counts[s] += counts[s - r];
  }
  return counts;
}
}  // namespace

double wilcoxon_exact_p(double w_plus, std::size_t n) {
  if (n == 0) return 1.0;
  if (n > 62) throw std::invalid_argument("wilcoxon_exact_p: n above 62");
  const double max_sum = static_cast<double>(n * (n + 1) / 2);
  if (!(w_plus >= 0 && w_plus <= max_sum) || w_plus != std::floor(w_plus))
    throw std::invalid_argument("wilcoxon_exact_p: W+ must be an integer in [0, n(n+1)/2]");
  const auto counts = signed_rank_counts(n);
  const auto w = static_cast<std::size_t>(w_plus);
  // Sum the smaller tail in integers, then scale by 2^-n.
  std::uint64_t lower = 0, upper = 0;
  for (std::size_t s = 0; s <= w; ++s) lower += counts[s];
  for (std::size_t s = w; s < counts.size(); ++s) upper += counts[s];
  const double tail = std::ldexp(static_cast<double>(std::min(lower, upper)), -static_cast<int>(n));
  return std::min(1.0, 2.0 * tail);
}

WilcoxonResult wilcoxon_signed_rank(std::span<const double> differences) {
  WilcoxonResult r;
  std::vector<double> nonzero;
  nonzero.reserve(differences.size());
  for (double d : differences) {
    if (std::isnan(d)) throw std::invalid_argument("wilcoxon_signed_rank: NaN difference");
    if (d == 0)
      ++r.zeros;
    else
      nonzero.push_back(d);
  }
  r.n = nonzero.size();
  if (r.n == 0) {
    r.statistic = 0;
    r.w_plus = 0;
    r.p = 1.0;
    r.z = kNaN;
    r.method = PValueMethod::None;
    return r;
  }
  std::vector<double> magnitude(r.n);
  for (std::size_t i = 0; i < r.n; ++i) magnitude[i] = std::abs(nonzero[i]);
  const auto ranks = average_ranks(magnitude);
  double w_plus = 0, w_minus = 0;
  for (std::size_t i = 0; i < r.n; ++i) (nonzero[i] > 0 ? w_plus : w_minus) += ranks[i];
  r.w_plus = w_plus;
  r.statistic = std::min(w_plus, w_minus);

  // Tie groups among |d| (equal ranks mean equal magnitudes).
  std::vector<double> sorted = ranks;
  std::sort(sorted.begin(), sorted.end());
  double tie_sum = 0;  // sum of t^3 - t
  for (std::size_t i = 0; i < sorted.size();) {
    std::size_t j = i + 1;
    while (j < sorted.size() && sorted[j] == sorted[i]) ++j;
    const double t = static_cast<double>(j - i);
    if (j - i > 1) r.ties = true;
    tie_sum += t * t * t - t;
    i = j;
  }

  if (r.n <= kWilcoxonExactMaxN && r.zeros == 0 && !r.ties) {
    r.method = PValueMethod::Exact;
    r.z = kNaN;
    r.p = wilcoxon_exact_p(w_plus, r.n);
    return r;
  }
  const double n = static_cast<double>(r.n);
  const double expected = n * (n + 1) / 4;
  const double variance = n * (n + 1) * (2 * n + 1) / 24 - tie_sum / 48;
  r.method = PValueMethod::Normal;
  r.z = (w_plus - expected) / std::sqrt(variance);
  const boost::math::normal standard;
  r.p = std::min(1.0, 2.0 * boost::math::cdf(boost::math::complement(standard, std::abs(r.z))));
  return r;
}

WilcoxonResult wilcoxon_signed_rank(std::span<const double> x, std::span<const double> y) {
  if (x.size() != y.size())
    throw std::invalid_argument("wilcoxon_signed_rank: x and y differ in length");
  std::vector<double> d(x.size());
  for (std::size_t i = 0; i < x.size(); ++i) d[i] = x[i] - y[i];
  return wilcoxon_signed_rank(d);
}

}  // namespace gapmark::stats
