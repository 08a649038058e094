// The simulation smoother for the structural models (see simulation_smoother.hpp).
#include <cmath>
#include <limits>

#include "gapmark/fill/simulation_smoother.hpp"

namespace gapmark::state_space {

std::vector<std::vector<double>> conditional_draws(const StructuralModel& model, std::span<const double> y,
                                                   std::span<const double> variances, std::size_t draws,
                                                   bool with_irregular, Rng& rng) {
  const std::size_t n = y.size();
  const auto m = static_cast<Eigen::Index>(model.state_dim());
  const double nan = std::numeric_limits<double>::quiet_NaN();
  std::vector<double> sd(variances.size());
  for (std::size_t k = 0; k < sd.size(); ++k) sd[k] = std::sqrt(std::max(variances[k], 0.0));
  std::vector<std::vector<double>> w(draws, std::vector<double>(n, nan));
  std::vector<std::vector<double>> target(draws, std::vector<double>(n));
  Eigen::VectorXd a(m);
  for (std::size_t k = 0; k < draws; ++k) {
    a.setZero();
    for (std::size_t t = 0; t < n; ++t) {
      const double signal = model.signal_of(a);
      const double value = signal + sd[0] * rng.normal();
      target[k][t] = with_irregular ? value : signal;
      if (!std::isnan(y[t])) w[k][t] = y[t] - value;
      model.transition(a);
      for (std::size_t v = 1; v < sd.size(); ++v) {
        const auto first = static_cast<Eigen::Index>(model.disturbed_state(v));
        const auto count = static_cast<Eigen::Index>(model.disturbed_count(v));
        for (Eigen::Index j = first; j < first + count; ++j) a(j) += sd[v] * rng.normal();
      }
    }
  }
  std::vector<std::vector<double>> out = smoothed_signal_means(model, w, variances);
  for (std::size_t k = 0; k < draws; ++k)
    for (std::size_t t = 0; t < n; ++t) out[k][t] = std::isnan(y[t]) ? out[k][t] + target[k][t] : y[t];
  return out;
}

}  // namespace gapmark::state_space
