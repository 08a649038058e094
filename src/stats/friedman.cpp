#include "gapmark/stats/friedman.hpp"

#include <algorithm>
#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/fisher_f.hpp>
#include <cmath>
#include <limits>
#include <stdexcept>
#include <vector>

#include "gapmark/stats/ranks.hpp"

namespace gapmark::stats {

namespace {
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

double chi2_upper(double x, double df) {
  if (!std::isfinite(x)) return kNaN;
  if (x <= 0) return 1.0;
  return boost::math::cdf(boost::math::complement(boost::math::chi_squared(df), x));
}

// sum over tie groups of (t^3 - t) among already-averaged ranks of one block
double tie_term(const std::vector<double>& ranks) {
  std::vector<double> sorted = ranks;
  std::sort(sorted.begin(), sorted.end());
  double sum = 0;
  std::size_t i = 0;
  while (i < sorted.size()) {
    std::size_t j = i + 1;
    while (j < sorted.size() && sorted[j] == sorted[i]) ++j;
    const double t = static_cast<double>(j - i);
    sum += t * t * t - t;
    i = j;
  }
  return sum;
}
}  // namespace

FriedmanResult friedman(std::span<const double> values, std::size_t blocks,
                        std::size_t treatments) {
  if (values.size() != blocks * treatments)
    throw std::invalid_argument("friedman: matrix size does not match blocks x treatments");
  FriedmanResult r;
  r.blocks = blocks;
  r.treatments = treatments;
  r.df = treatments >= 1 ? static_cast<double>(treatments) - 1 : kNaN;
  if (blocks < 1 || treatments < 2) {
    r.statistic = r.p = kNaN;
    return r;
  }
  const double n = static_cast<double>(blocks);
  const double k = static_cast<double>(treatments);
  std::vector<double> rank_sums(treatments, 0.0);
  double ties = 0;
  for (std::size_t b = 0; b < blocks; ++b) {
    const auto ranks = average_ranks(values.subspan(b * treatments, treatments));
    for (std::size_t j = 0; j < treatments; ++j) rank_sums[j] += ranks[j];
    ties += tie_term(ranks);
  }
  double ssr = 0;
  for (double s : rank_sums) ssr += s * s;
  const double uncorrected = 12.0 / (n * k * (k + 1)) * ssr - 3.0 * n * (k + 1);
  const double correction = 1.0 - ties / (k * (k * k - 1) * n);
  if (correction <= 0) {
    r.statistic = r.p = kNaN;  // every block tied throughout: no ranking information
    return r;
  }
  r.statistic = std::max(0.0, uncorrected / correction);
  r.p = chi2_upper(r.statistic, r.df);
  return r;
}

ImanDavenport iman_davenport(double chi2, std::size_t treatments, std::size_t blocks) {
  ImanDavenport r;
  const double n = static_cast<double>(blocks);
  const double k = static_cast<double>(treatments);
  r.df1 = treatments >= 2 ? k - 1 : kNaN;
  r.df2 = treatments >= 2 && blocks >= 1 ? (k - 1) * (n - 1) : kNaN;
  if (treatments < 2 || blocks < 2 || std::isnan(chi2)) {
    r.f = r.p = kNaN;
    return r;
  }
  const double denom = n * (k - 1) - chi2;
  // chi2 reaches N (k - 1) when all blocks agree; allow for rounding there.
  if (denom <= 1e-12 * n * (k - 1)) {
    r.f = std::numeric_limits<double>::infinity();
    r.p = 0;
    return r;
  }
  r.f = (n - 1) * chi2 / denom;
  r.p = r.f <= 0 ? 1.0
                 : boost::math::cdf(boost::math::complement(boost::math::fisher_f(r.df1, r.df2), r.f));
  return r;
}

FriedmanFromRanks friedman_from_mean_ranks(std::span<const double> mean_ranks,
                                           std::size_t blocks) {
  FriedmanFromRanks r;
  const std::size_t kk = mean_ranks.size();
  if (kk < 2 || blocks < 1) {
    r.chi2 = r.chi2_df = r.chi2_p = r.f = r.f_df1 = r.f_df2 = r.f_p = kNaN;
    return r;
  }
  const double n = static_cast<double>(blocks);
  const double k = static_cast<double>(kk);
  double ssr = 0;
  for (double m : mean_ranks) ssr += m * m;
  r.chi2 = 12.0 * n / (k * (k + 1)) * (ssr - k * (k + 1) * (k + 1) / 4.0);
  r.chi2_df = k - 1;
  r.chi2_p = chi2_upper(r.chi2, r.chi2_df);
  const auto id = iman_davenport(r.chi2, kk, blocks);
  r.f = id.f;
  r.f_df1 = id.df1;
  r.f_df2 = id.df2;
  r.f_p = id.p;
  return r;
}

}  // namespace gapmark::stats
