#pragma once
// The Wilcoxon signed-rank test, two-sided, on paired differences.
//
// Rules (chosen to agree with scipy.stats.wilcoxon defaults, zero_method
// "wilcox", correction=False, and with R's wilcox.test(..., correct = FALSE)):
//  - zero differences are dropped; n counts the rest;
//  - |d| is ranked with ties averaged; statistic = min(W+, W-);
//  - exact p-value from the null distribution of W+ when n <= 50 and there
//    were neither zeros nor tied |d|;
//  - otherwise the normal approximation with the tie correction to the
//    variance, n(n+1)(2n+1)/24 - sum(t^3 - t)/48, and no continuity correction;
//  - n = 0 (no differences, or all zero): statistic 0 and p = 1, read as
//    "no evidence of a difference".
#include <cstddef>
#include <span>

namespace gapmark::stats {

enum class PValueMethod { Exact, Normal, None };

struct WilcoxonResult {
  double statistic = 0;     ///< min(W+, W-)
  double w_plus = 0;        ///< sum of ranks of the positive differences
  double p = 1;             ///< two-sided
  double z = 0;             ///< standardised W+ (normal method only, else NaN)
  std::size_t n = 0;        ///< non-zero differences
  std::size_t zeros = 0;    ///< zero differences dropped
  bool ties = false;        ///< tied |d| among the non-zero differences
  PValueMethod method = PValueMethod::None;
};

/// Largest n (non-zero differences) for which the exact p-value is used.
inline constexpr std::size_t kWilcoxonExactMaxN = 50;

/// Test on the differences d. No NaN allowed (throws std::invalid_argument).
WilcoxonResult wilcoxon_signed_rank(std::span<const double> differences);

/// Test on pairs: d_i = x_i - y_i. Throws std::invalid_argument on unequal lengths.
WilcoxonResult wilcoxon_signed_rank(std::span<const double> x, std::span<const double> y);

/// Two-sided exact p-value for W+ = w_plus among n untied non-zero
/// differences: min(1, 2 min(P(W+ <= w), P(W+ >= w))). n <= 62.
double wilcoxon_exact_p(double w_plus, std::size_t n);

}  // namespace gapmark::stats
