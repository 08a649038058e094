// The local level fit's likelihood pass for several log ratios at once, with
// the slope and curvature in the ratio (forward differentiation through the
// filter, state_space_level.cpp), checked against the general likelihood
// pass (filter_likelihood): the likelihood itself, central differences of it
// for the slope, and central differences of the slope for the curvature, on
// invented series with and without gaps.
#include <doctest/doctest.h>

#include <array>
#include <cmath>
#include <limits>
#include <vector>

#include "gapmark/fill/state_space.hpp"
#include "gapmark/fill/state_space_level.hpp"
#include "gapmark/rng.hpp"

namespace ss = gapmark::state_space;
namespace lv = gapmark::state_space::level;

namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

std::vector<double> invented(std::size_t n, double step, double missing, std::uint64_t seed) {
  gapmark::Rng rng(seed);
  std::vector<double> y(n);
  double level = 0;
  for (std::size_t t = 0; t < n; ++t) {
    level += step * (rng.uniform() - 0.5);
    y[t] = rng.bernoulli(missing) ? kNaN : level + rng.uniform() - 0.5;
  }
  y[0] = kNaN;  // a leading gap
  return y;
}

double concentrated(const std::vector<double>& y, double x) {
  std::vector<double> v(2);
  lv::ratio_variances(x, v[0], v[1]);
  return ss::filter_likelihood(ss::StructuralModel::local_level(), y, v).concentrated_log_likelihood();
}

}  // namespace

TEST_CASE("local level: likelihood, slope and curvature in the log ratio match the general pass") {
  int compared = 0;
  for (double step : {0.05, 1.0})
    for (double missing : {0.0, 0.3}) {
      const auto y = invented(600, step, missing, 31);
      std::array<lv::RatioPoint, 7> batch{};
      const double xs[] = {-20.0, -6.0, -1.5, 0.0, 0.7, 4.0, 15.0};
      for (std::size_t i = 0; i < batch.size(); ++i) batch[i].x = xs[i];
      lv::concentrated_with_slope(y, batch);
      for (const auto& pt : batch) {
        CAPTURE(step);
        CAPTURE(missing);
        CAPTURE(pt.x);
        const double h = 1e-4;
        const double ll = concentrated(y, pt.x), up = concentrated(y, pt.x + h), down = concentrated(y, pt.x - h);
        const double slope = (up - down) / (2 * h);
        CHECK(pt.log_likelihood == doctest::Approx(ll).epsilon(1e-12));
        // central differences: error about h^2 times the third derivative, plus rounding / h
        CHECK(pt.slope == doctest::Approx(slope).epsilon(1e-5).scale(1.0));
        const lv::RatioPoint one = lv::concentrated_with_curvature(y, pt.x);
        CHECK(one.log_likelihood == doctest::Approx(ll).epsilon(1e-12));
        CHECK(one.slope == doctest::Approx(pt.slope).epsilon(1e-12));
        // the curvature against central differences of the slope (checked just above)
        std::array<lv::RatioPoint, 2> around{};
        around[0].x = pt.x - h;
        around[1].x = pt.x + h;
        lv::concentrated_with_slope(y, around);
        const double curvature = (around[1].slope - around[0].slope) / (2 * h);
        CHECK(one.curvature == doctest::Approx(curvature).epsilon(1e-5).scale(1.0));
        ++compared;
      }
    }
  CHECK(compared == 28);
}
