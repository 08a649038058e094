#pragma once
// The Nemenyi critical difference for comparing k methods by their mean
// ranks over N data sets: two methods whose mean ranks differ by at least CD
// differ significantly at level alpha.
#include <cstddef>

namespace gapmark::stats {

/// q_alpha / sqrt(2), q_alpha the upper-alpha quantile of the studentized
/// range of k values with infinite degrees of freedom.
double nemenyi_q(double alpha, int k);

/// CD = q_alpha / sqrt(2) * sqrt(k (k + 1) / (6 N)). NaN when k < 2 or N = 0.
double nemenyi_critical_difference(double alpha, int k, std::size_t datasets);

}  // namespace gapmark::stats
