#pragma once
// Scores of a predictive distribution given only by a sample (draws x_1..x_M).
//
// Sample CRPS in its energy form (Gneiting & Raftery 2007, J. Amer. Statist.
// Assoc. 102, eq. 22, with the empirical distribution of the draws):
//   CRPS = (1/M) sum_i |x_i - y| - (1 / (2 M^2)) sum_i sum_j |x_i - x_j|,
// which equals the integral of (F_M(x) - 1{x >= y})^2 over x for the
// empirical CDF F_M. The double sum is computed from the sorted draws:
// sum_i sum_j |x_i - x_j| = 2 sum_i (2i - M - 1) x_(i), i = 1..M.
#include <span>

namespace gapmark::stats {

/// Sample CRPS of the draws at y. NaN when there is no draw or a draw or y is not finite.
double sample_crps(std::span<const double> draws, double y);
/// The same for draws already sorted ascending.
double sorted_sample_crps(std::span<const double> sorted, double y);

/// The central interval of sorted draws holding probability `level`: their
/// (1 - level)/2 and (1 + level)/2 quantiles, linearly interpolated between
/// order statistics (numpy's default).
struct SampleInterval {
  double low = 0, high = 0;
};
SampleInterval sorted_central_interval(std::span<const double> sorted, double level);

}  // namespace gapmark::stats
