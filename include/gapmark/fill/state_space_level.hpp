#pragma once
// Scalar fast paths of the local level model (state_space.hpp), the model
// that most kalman fills use:
//   - its concentrated log-likelihood and the slope of it in the log
//     variance ratio x = log(level / irregular), for several ratios in one
//     pass over the data (the passes are independent, so they run side by
//     side instead of one after another), which the fit uses to screen the
//     ratios; and at one ratio with the curvature too, for Newton's method
//     on the slope;
//   - the smoothed signal in scalars, the same augmented filter and
//     smoother as the general one (state_space_augmented.cpp) for a state
//     of one value.
#include <cstddef>
#include <span>

#include "gapmark/fill/state_space.hpp"

namespace gapmark::state_space::level {

/// The concentrated log-likelihood at one log ratio, and its derivative in it.
struct RatioPoint {
  double x = 0;
  double log_likelihood = 0;  ///< NaN where it cannot be evaluated
  double slope = 0;           ///< d log_likelihood / d x
  double curvature = 0;       ///< d^2 log_likelihood / d x^2 (concentrated_with_curvature only)
  double scale = 0;           ///< the common scale concentrated out (LikelihoodParts::best_scale)
  std::size_t effective = 0;  ///< observations after the first (LikelihoodParts::effective)
};

/// The variances (irregular, level) used at log ratio x, the larger one 1 so
/// that neither underflows: {e^-x, 1} for x > 0, {1, e^x} otherwise.
void ratio_variances(double x, double& irregular, double& level);

/// Fills `points[i].log_likelihood` and `.slope` at each `points[i].x`, all
/// in one pass over `y` (NaN = missing). Throws std::invalid_argument for
/// more than 16 points.
void concentrated_with_slope(std::span<const double> y, std::span<RatioPoint> points);

/// The likelihood, slope and curvature at one ratio (one pass).
RatioPoint concentrated_with_curvature(std::span<const double> y, double x);

/// The smoothed signal (the level) at every t, as smooth_signal gives it for
/// the local level model, with the likelihood of the filter (computed in the
/// same forward pass, so its sums may differ from filter_likelihood's in the
/// last digits).
SmoothedSignal smooth(std::span<const double> y, std::span<const double> variances);

}  // namespace gapmark::state_space::level
