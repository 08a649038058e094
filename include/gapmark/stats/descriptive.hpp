#pragma once
// Descriptive statistics of a sample: mean, sample standard deviation and a
// two-sided Student-t confidence interval for the mean. Nothing is skipped:
// the caller removes NaN values first (a NaN in the input gives NaN out).
#include <cstddef>
#include <span>

namespace gapmark::stats {

/// Arithmetic mean; NaN when the sample is empty.
double mean(std::span<const double> x);

/// Sample standard deviation (divisor n - 1); NaN when n < 2.
double sample_sd(std::span<const double> x);

struct Interval {
  double low = 0, high = 0;
};

/// Two-sided Student-t interval for the mean at confidence `level` (0 < level < 1):
/// mean -/+ t_{(1+level)/2, n-1} * sd / sqrt(n). Both ends NaN when n < 2.
/// Throws std::invalid_argument when level is outside (0, 1).
Interval t_interval(std::span<const double> x, double level);

struct Description {
  std::size_t n = 0;
  double mean = 0, sd = 0;  ///< NaN when not defined (see mean, sample_sd)
  Interval ci;              ///< NaN ends when n < 2
};

/// mean, sample_sd and t_interval in one call.
Description describe(std::span<const double> x, double level);

}  // namespace gapmark::stats
