#pragma once
// Additive decompositions of a complete series into trend and seasonal
// components. Classical:
//   trend     centred moving average over one period (for an even period,
//             period + 1 points with half weight at both ends); NaN where the
//             window does not fit inside the series
//   seasonal  per phase (index mod period), the mean of the detrended values
//             (series - trend), the phase means then shifted to sum to zero
#include <cstddef>
#include <span>
#include <vector>

namespace gapmark {

struct SeasonalDecomposition {
  std::vector<double> trend;     ///< NaN where the centred window does not fit
  std::vector<double> seasonal;  ///< one per point, repeating with the period
};

/// Decomposes `series` (no NaN). Needs period >= 2 and at least two full
/// periods; throws MethodFailure otherwise.
///
/// `stand_in`, when given (one flag per point), marks values that only stand
/// in for missing ones (a provisional filling). A phase mean then uses only
/// points whose moving-average window holds no stand-in, so the seasonal
/// estimate is not bent by the provisional values; a phase with no such point
/// uses all its points with a trend value. Cost: O(n).
SeasonalDecomposition classical_decomposition(std::span<const double> series, std::size_t period,
                                              std::span<const bool> stand_in = {});

struct StlOptions {
  std::size_t seasonal_window = 7;  ///< n_s: loess window of the cycle-subseries, odd, >= 3
  std::size_t passes = 5;           ///< runs of the inner loop (no robustness passes)
};

/// STL (Cleveland et al. 1990) without robustness weights, all loess fits of
/// degree 1; trend window n_t = smallest odd >= 1.5 p / (1 - 1.5 / n_s),
/// low-pass window n_l = smallest odd > p. Needs period >= 2 and two full
/// periods; throws MethodFailure otherwise. Cost: O(n * period).
SeasonalDecomposition stl_decomposition(std::span<const double> series, std::size_t period,
                                        const StlOptions& options = {});

}  // namespace gapmark
