// Building the structural models: their variances, their dense system
// matrices (written out from the definitions, independent of the structured
// products in the header) and the starting grid for the likelihood search.
#include <cmath>
#include <stdexcept>

#include "gapmark/fill/state_space.hpp"

namespace gapmark::state_space {

StructuralModel::StructuralModel(bool slope, std::size_t period, std::size_t harmonics)
    : slope_(slope), period_(period), harmonics_(harmonics),
      seasonal_(harmonics ? 2 * harmonics : period ? period - 1 : 0) {
  constexpr double kTwoPi = 6.283185307179586;
  for (std::size_t j = 1; j <= harmonics; ++j) {
    const double angle = kTwoPi * static_cast<double>(j) / static_cast<double>(period);
    cos_.push_back(std::cos(angle));
    sin_.push_back(std::sin(angle));
  }
}

StructuralModel StructuralModel::local_level() { return StructuralModel(false, 0, 0); }

StructuralModel StructuralModel::local_linear_trend() { return StructuralModel(true, 0, 0); }

StructuralModel StructuralModel::basic_structural(std::size_t period) {
  if (period < 2) throw std::invalid_argument("a seasonal period must be at least 2");
  return StructuralModel(true, period, 0);
}

StructuralModel StructuralModel::trigonometric(std::size_t period, std::size_t harmonics) {
  // The harmonic at half the period (l = pi) would leave c* unobserved; the
  // dummy seasonal covers the full set of frequencies instead.
  if (harmonics < 1 || 2 * harmonics >= period)
    throw std::invalid_argument("a trigonometric seasonal of period " + std::to_string(period) +
                                " takes 1 to " + std::to_string(period < 3 ? 0 : (period - 1) / 2) +
                                " harmonics, not " + std::to_string(harmonics));
  return StructuralModel(true, period, harmonics);
}

std::vector<std::string> StructuralModel::variance_names() const {
  std::vector<std::string> names{"irregular", "level"};
  if (slope_) names.emplace_back("slope");
  if (seasonal_) names.emplace_back("seasonal");
  return names;
}

std::size_t StructuralModel::disturbed_state(std::size_t k) const {
  if (k == 0 || k >= variance_count()) throw std::out_of_range("no disturbed state for this variance");
  if (k == 1) return 0;
  if (k == 2 && slope_) return 1;
  return seasonal_start();
}

std::size_t StructuralModel::disturbed_count(std::size_t k) const {
  const std::size_t first = disturbed_state(k);
  return seasonal_ && first == seasonal_start() && harmonics_ ? 2 * harmonics_ : 1;
}

std::string StructuralModel::name() const {
  if (harmonics_)
    return "seasonal(" + std::to_string(period_) + ", " + std::to_string(harmonics_) +
           (harmonics_ == 1 ? " harmonic)" : " harmonics)");
  if (seasonal_) return "seasonal(" + std::to_string(period_) + ")";
  return slope_ ? "trend" : "level";
}

Eigen::MatrixXd StructuralModel::transition_matrix() const {
  const auto m = static_cast<Eigen::Index>(state_dim());
  Eigen::MatrixXd t = Eigen::MatrixXd::Zero(m, m);
  t(0, 0) = 1;  // level_{t+1} = level_t (+ slope_t)
  if (slope_) {
    t(0, 1) = 1;
    t(1, 1) = 1;  // slope_{t+1} = slope_t
  }
  const auto s0 = static_cast<Eigen::Index>(seasonal_start());
  if (harmonics_) {
    for (std::size_t j = 0; j < harmonics_; ++j) {  // each pair turns by 2 pi (j + 1) / period
      const auto p = s0 + 2 * static_cast<Eigen::Index>(j);
      t(p, p) = cos_[j];
      t(p, p + 1) = sin_[j];
      t(p + 1, p) = -sin_[j];
      t(p + 1, p + 1) = cos_[j];
    }
  } else if (seasonal_) {
    const auto k = static_cast<Eigen::Index>(seasonal_);
    for (Eigen::Index j = 0; j < k; ++j) t(s0, s0 + j) = -1;       // g_1 = -(sum of the last s-1)
    for (Eigen::Index j = 1; j < k; ++j) t(s0 + j, s0 + j - 1) = 1;  // the others shift by one
  }
  return t;
}

Eigen::RowVectorXd StructuralModel::design_row() const {
  Eigen::RowVectorXd z = Eigen::RowVectorXd::Zero(static_cast<Eigen::Index>(state_dim()));
  z(0) = 1;
  if (seasonal_) z(static_cast<Eigen::Index>(seasonal_start())) = 1;
  for (std::size_t j = 1; j < harmonics_; ++j) z(static_cast<Eigen::Index>(seasonal_start() + 2 * j)) = 1;
  return z;
}

std::vector<std::vector<double>> fit_starts(const StructuralModel& model) {
  const std::size_t k = model.variance_count();
  std::vector<std::vector<double>> starts;
  starts.emplace_back(k, 1.0 / static_cast<double>(k));
  for (std::size_t j = 0; j < k; ++j) {
    std::vector<double> share(k, 0.3 / static_cast<double>(k - 1));
    share[j] = 0.7;
    starts.push_back(share);
  }
  if (model.has_slope()) {
    // Irregular and level share the variance; slope (and seasonal) nearly nil.
    std::vector<double> share(k, 1e-3);
    const double rest = 1.0 - 1e-3 * static_cast<double>(k - 2);
    share[0] = share[1] = rest / 2;
    starts.push_back(share);
  }
  return starts;
}

}  // namespace gapmark::state_space
