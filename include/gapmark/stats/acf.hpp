#pragma once
// Sample autocorrelation of a series, mean-centred with denominator n
// (Box, Jenkins & Reinsel, Time Series Analysis, section 2.1.4):
//   c_k = (1/n) * sum_{t=0}^{n-1-k} (x_t - mean)(x_{t+k} - mean),  r_k = c_k / c_0.
// Missing values (NaN) are skipped: the mean is taken over the observed
// points, a product enters the sum only when both of its points are observed,
// and n is the number of observed points. Without NaN this is the usual
// estimator. Cost O(n * max_lag).
#include <cstddef>
#include <span>
#include <vector>

namespace gapmark::stats {

/// Autocovariances c_0 .. c_max_lag as above. All NaN when fewer than two
/// points are observed. Lags at or beyond the length give 0 (no pairs).
std::vector<double> sample_autocovariance(std::span<const double> x, std::size_t max_lag);

/// Autocorrelations r_0 .. r_max_lag (r_0 = 1). All NaN when fewer than two
/// points are observed or the observed points are constant (c_0 = 0).
std::vector<double> sample_autocorrelation(std::span<const double> x, std::size_t max_lag);

}  // namespace gapmark::stats
