#pragma once
// The studentized range distribution: the range of k independent standard
// normal values divided by an independent estimate of their standard
// deviation with df degrees of freedom (df = infinity: divided by 1).
#include <limits>

namespace gapmark::stats {

inline constexpr double kInfiniteDf = std::numeric_limits<double>::infinity();

/// P(Q <= q) for k >= 2 groups. With df = infinity:
///   k * integral phi(z) [Phi(z) - Phi(z - q)]^(k-1) dz
/// and with finite df > 0 that value integrated over the distribution of
/// s = sqrt(chi2_df / df): integral f_s(s) P_inf(q s) ds.
/// Throws std::invalid_argument when k < 2 or df <= 0 or df is NaN.
double studentized_range_cdf(double q, int k, double df = kInfiniteDf);

/// The q with P(Q <= q) = probability (0 < probability < 1).
double studentized_range_quantile(double probability, int k, double df = kInfiniteDf);

/// The upper-alpha critical value: studentized_range_quantile(1 - alpha, k, df).
double studentized_range_critical(double alpha, int k, double df = kInfiniteDf);

}  // namespace gapmark::stats
