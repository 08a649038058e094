// The local level model's fit searches its one log variance ratio (grid, then
// Brent's method). Checked against brute force: the concentrated likelihood on
// a grid of 4,601 ratios (steps of 0.01 in the log over the whole allowed
// range) may not beat the fit by more than 0.05 (a likelihood ratio of 1.05,
// far below anything a test could tell apart), on invented series whose
// optimum is inside the range, or on a bound (no irregular, or no level
// movement), with and without gaps. The slack is for flat likelihoods: on
// white noise the likelihood is flat to 0.03 from ratio e^-23 to e^-9, with
// a narrow second maximum (0.02 higher) that the 9-point screen can step over.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>
#include <vector>

#include "gapmark/fill/state_space.hpp"
#include "gapmark/rng.hpp"

namespace ss = gapmark::state_space;

namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

struct Shape {
  const char* name;
  double level_step;  ///< standard deviation of the random-walk steps
  double noise;       ///< of the white noise on top
  double ar;          ///< AR(1) coefficient of that noise (0: white)
};

std::vector<double> invented(const Shape& shape, std::size_t n, double missing, std::uint64_t seed) {
  gapmark::Rng rng(seed);
  auto normal = [&] {
    const double u1 = 1.0 - rng.uniform(), u2 = rng.uniform();
    return std::sqrt(-2.0 * std::log(u1)) * std::cos(6.283185307179586 * u2);
  };
  std::vector<double> y(n);
  double level = 20, noise = 0;
  for (std::size_t t = 0; t < n; ++t) {
    level += shape.level_step * normal();
    noise = shape.ar * noise + shape.noise * normal();
    y[t] = rng.bernoulli(missing) ? kNaN : level + noise;
  }
  return y;
}

/// Concentrated log-likelihood at log(level / irregular) = x.
double concentrated_at(const std::vector<double>& y, double x) {
  const std::vector<double> relative = x > 0 ? std::vector<double>{std::exp(-x), 1.0}
                                             : std::vector<double>{1.0, std::exp(x)};
  return ss::filter_likelihood(ss::StructuralModel::local_level(), y, relative).concentrated_log_likelihood();
}

}  // namespace

TEST_CASE("local level fit: no ratio on a fine grid beats it, inside the range and on its bounds") {
  const Shape shapes[] = {{"walk plus noise", 0.3, 1.0, 0.0},
                          {"AR(1) noise, no irregular", 0.0, 1.0, 0.9},
                          {"white noise, no level movement", 0.0, 1.0, 0.0},
                          {"nearly pure walk", 1.0, 0.01, 0.0}};
  const auto model = ss::StructuralModel::local_level();
  for (const Shape& shape : shapes)
    for (double missing : {0.0, 0.3})
      for (std::uint64_t seed : {11u, 12u}) {
        CAPTURE(std::string(shape.name));
        CAPTURE(missing);
        CAPTURE(seed);
        const auto y = invented(shape, 800, missing, seed);
        const auto fit = ss::fit_variances(model, y);
        double grid_best = -std::numeric_limits<double>::infinity();
        for (int i = 0; i <= 4600; ++i) grid_best = std::max(grid_best, concentrated_at(y, -23.0 + 0.01 * i));
        CHECK(fit.log_likelihood >= grid_best - 0.05);
        // The reported likelihood is the one at the reported variances.
        CHECK(fit.log_likelihood ==
              doctest::Approx(ss::filter_likelihood(model, y, fit.variances).log_likelihood()).epsilon(1e-12));
        CHECK(fit.evaluations <= 60);
      }
}

TEST_CASE("local level fit: the variance that the data do not support goes to its bound") {
  const auto model = ss::StructuralModel::local_level();
  const auto white = ss::fit_variances(model, invented({"white", 0.0, 1.0, 0.0}, 800, 0.2, 5));
  CHECK(white.variances[1] <= 1.0001 * std::exp(-23.0) * white.variances[0]);  // level variance at the bound
  const auto walk = ss::fit_variances(model, invented({"walk", 1.0, 0.01, 0.0}, 800, 0.2, 5));
  CHECK(walk.variances[0] <= 1.0001 * std::exp(-23.0) * walk.variances[1]);  // irregular variance at the bound
}
