#pragma once
// Conditional sample paths of a series given its observed values, under a
// fitted state-space model, by the simulation smoother of Durbin & Koopman
// (2002): draw a series y+ (and its signal) from the model unconditionally,
// smooth the difference w = y - y+ (observed points only, the same missing
// pattern), and take
//   draw_t = E[signal_t | w] + target+_t
// at each missing point, target+ being the simulated value (signal plus
// irregular: a draw of the missing value) or the simulated signal. Because
// the smoother is linear in the data and reproduces exactly whatever the
// flat prior leaves unknown (the initial state, the differencing's starting
// values, an ARIMA's mean or drift), the unconditional draws may start from
// zero. Observed points keep their values. The fitted parameters are taken
// as known (plug-in), as in the smoother's variances; for an ARIMA with a
// mean or drift the draws also carry that coefficient's estimation
// uncertainty, which the smoother's variance leaves out.
//
// Random numbers come only from the Rng passed in, in a fixed order (draw by
// draw, time by time), so the same seed gives the same draws.
#include <cstddef>
#include <span>
#include <vector>

#include "gapmark/fill/arima_fit.hpp"
#include "gapmark/fill/state_space.hpp"
#include "gapmark/rng.hpp"

namespace gapmark::state_space {

/// `draws` paths, each the length of `y` (variances as fit_variances gives
/// them, in the units of y). `with_irregular`: draws of the value itself;
/// otherwise of the signal. Throws MethodFailure as smooth_signal does.
std::vector<std::vector<double>> conditional_draws(const StructuralModel& model, std::span<const double> y,
                                                   std::span<const double> variances, std::size_t draws,
                                                   bool with_irregular, Rng& rng);

}  // namespace gapmark::state_space

namespace gapmark::arima {

/// `draws` paths of `y` (data units) under a fitted ARIMA model.
std::vector<std::vector<double>> conditional_draws(const Fit& fit, std::span<const double> y, std::size_t draws,
                                                   Rng& rng);

}  // namespace gapmark::arima
