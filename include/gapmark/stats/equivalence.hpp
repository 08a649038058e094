#pragma once
// Paired two one-sided tests (TOST) for equivalence, Schuirmann (1987): the
// mean of the paired differences d lies inside (low, high) when both
//   H0_low:  mean(d) <= low   is rejected by t_low  = (mean(d) - low)  / se, p_low  = P(T >= t_low)
//   H0_high: mean(d) >= high  is rejected by t_high = (mean(d) - high) / se, p_high = P(T <= t_high)
// with se = sd(d) / sqrt(n) and T ~ Student t with n - 1 degrees of freedom;
// p = max(p_low, p_high). The same quantities as statsmodels'
// `ttost_paired(x1, x2, low, upp)` on d = x1 - x2.
// Differences with sd = 0 give p = 0 when their mean lies strictly inside
// (low, high) and p = 1 otherwise; fewer than two differences give p = NaN.
#include <cstddef>
#include <span>

namespace gapmark::stats {

struct TostResult {
  std::size_t n = 0;
  double mean = 0, se = 0, df = 0;
  double t_low = 0, t_high = 0;  ///< NaN when se = 0 or n < 2
  double p_low = 1, p_high = 1;
  double p = 1;                  ///< max(p_low, p_high); NaN when n < 2
};

/// TOST on paired differences. Throws std::invalid_argument on NaN, on
/// infinite differences, or when low >= high.
TostResult paired_tost(std::span<const double> differences, double low, double high);

}  // namespace gapmark::stats
