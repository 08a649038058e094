// The point-error metric across the whole range of doubles. The expected
// values are closed-form arithmetic: errors (3a, 4a) on two masked points
// give MAE 3.5a, bias 3.5a and RMSE sqrt((9 + 16) / 2) a = sqrt(12.5) a.
// Squaring errors near 1e-300 underflows and near 1e300 overflows; RMSE
// must still come out right at both ends (and is unchanged in between).
#include <doctest/doctest.h>

#include <cmath>
#include <vector>

#include "gapmark/params.hpp"
#include "gapmark/score/metric.hpp"

using namespace gapmark;

namespace {

struct Scores {
  double mae, rmse, bias, scored;
};

/// Scores a fill whose errors on the two masked points are 3a and 4a (a third,
/// unmasked point carries an error that must be ignored).
Scores score_errors(double a) {
  const auto metric = MetricRegistry::global().bind(CallSpec::parse("error", "test"), "test");
  const std::vector<double> truth = {a, -2 * a, 5 * a};
  const std::vector<double> filled = {a + 3 * a, -2 * a + 4 * a, 5 * a + 100 * a};
  const Mask mask = {1, 1, 0};
  ScoreInput in;
  in.truth = truth;
  in.filled = filled;
  in.mask = &mask;
  std::vector<double> out(4);
  metric.impl->compute(in, out);
  return {out[0], out[1], out[2], out[3]};
}

}  // namespace

TEST_CASE("error metric: MAE, RMSE and bias stay exact from 1e-300 to 1e300") {
  const double root_12_5 = std::sqrt(12.5);
  for (double a : {1e-305, 1e-300, 1e-200, 1e-155, 1e-150, 1e-10, 1.0, 1e10, 1e150, 1e155, 1e200, 1e300}) {
    CAPTURE(a);
    const Scores s = score_errors(a);
    CHECK(s.scored == 2);
    CHECK(s.mae == doctest::Approx(3.5 * a).epsilon(1e-14));
    CHECK(s.bias == doctest::Approx(3.5 * a).epsilon(1e-14));
    CHECK(std::isfinite(s.rmse));
    CHECK(s.rmse == doctest::Approx(root_12_5 * a).epsilon(1e-14));
    CHECK(s.rmse >= s.mae);  // the quadratic mean is never below the arithmetic mean
  }
}

TEST_CASE("error metric: a perfect fill scores 0 and an unscored trial is n/a") {
  const auto metric = MetricRegistry::global().bind(CallSpec::parse("error", "test"), "test");
  const std::vector<double> truth = {1e-300, 2.0, 1e300};
  const Mask mask = {1, 1, 1};
  ScoreInput in;
  in.truth = truth;
  in.filled = truth;
  in.mask = &mask;
  std::vector<double> out(4);
  metric.impl->compute(in, out);
  CHECK(out[0] == 0);
  CHECK(out[1] == 0);
  CHECK(out[2] == 0);
  CHECK(out[3] == 3);
  const Mask none = {0, 0, 0};
  in.mask = &none;
  metric.impl->compute(in, out);
  CHECK(std::isnan(out[0]));
  CHECK(std::isnan(out[1]));
  CHECK(out[3] == 0);
}
