#pragma once
// The percentile bootstrap interval of a mean (Efron and Tibshirani 1993,
// ch. 13): draw `resamples` samples of size n with replacement, take each
// one's mean, and report the (1 - level)/2 and (1 + level)/2 quantiles of
// those means (linear interpolation between order statistics, numpy's
// default `percentile`, the same rule as scipy.stats.bootstrap with
// method="percentile"). The interval lies within [min(x), max(x)], so the
// interval of a non-negative quantity never crosses zero. Seeded: the same
// seed gives the same interval on every platform.
#include <cstddef>
#include <cstdint>
#include <span>

#include "gapmark/stats/descriptive.hpp"

namespace gapmark::stats {

inline constexpr std::size_t kBootstrapResamples = 4000;

/// Both ends NaN when n < 2. Throws std::invalid_argument when level is
/// outside (0, 1), resamples is 0 or a value is NaN.
Interval bootstrap_mean_interval(std::span<const double> x, double level, std::uint64_t seed,
                                 std::size_t resamples = kBootstrapResamples);

/// The q-quantile (0 <= q <= 1) of sorted values by linear interpolation
/// between order statistics (numpy's default "linear" method).
double sorted_quantile(std::span<const double> sorted, double q);

}  // namespace gapmark::stats
