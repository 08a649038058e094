// The structured transition products agree with the dense matrices written
// out from the model definitions, and the starting grid is a set of shares.
#include <doctest/doctest.h>

#include <cmath>
#include <numeric>
#include <vector>

#include "gapmark/fill/state_space.hpp"

using gapmark::state_space::StructuralModel;

namespace {

std::vector<StructuralModel> models() {
  return {StructuralModel::local_level(),         StructuralModel::local_linear_trend(),
          StructuralModel::basic_structural(2),    StructuralModel::basic_structural(4),
          StructuralModel::basic_structural(12),   StructuralModel::trigonometric(3, 1),
          StructuralModel::trigonometric(12, 2),   StructuralModel::trigonometric(24, 3),
          StructuralModel::trigonometric(7, 3)};
}

Eigen::MatrixXd sample(Eigen::Index rows, Eigen::Index cols, double seed) {
  Eigen::MatrixXd a(rows, cols);
  for (Eigen::Index i = 0; i < rows; ++i)
    for (Eigen::Index j = 0; j < cols; ++j) a(i, j) = std::sin(seed + 1.7 * i + 0.37 * j * j);
  return a;
}

}  // namespace

TEST_CASE("structured products with T, T' and T^-1, left and right, equal the dense definitions") {
  for (const auto& model : models()) {
    CAPTURE(model.name());
    const auto m = static_cast<Eigen::Index>(model.state_dim());
    const Eigen::MatrixXd t = model.transition_matrix();
    const Eigen::MatrixXd a = sample(m, 3, 0.5);

    Eigen::MatrixXd b = a;
    model.transition(b);
    CHECK((b - t * a).cwiseAbs().maxCoeff() < 1e-12);

    b = a;
    model.transition_transposed(b);
    CHECK((b - t.transpose() * a).cwiseAbs().maxCoeff() < 1e-12);

    b = a;
    model.transition_inverse(b);
    CHECK((t * b - a).cwiseAbs().maxCoeff() < 1e-12);

    const Eigen::MatrixXd x = sample(4, m, 1.5);
    Eigen::MatrixXd c = x;
    model.times_transition_transposed(c);
    CHECK((c - x * t.transpose()).cwiseAbs().maxCoeff() < 1e-12);

    c = x;
    model.times_transition(c);
    CHECK((c - x * t).cwiseAbs().maxCoeff() < 1e-12);
  }
}

TEST_CASE("T P T' in one step equals the dense product and the two structured products to the bit") {
  std::vector<StructuralModel> all = models();
  all.push_back(StructuralModel::basic_structural(3));
  all.push_back(StructuralModel::basic_structural(24));
  for (const auto& model : all) {
    CAPTURE(model.name());
    const auto m = static_cast<Eigen::Index>(model.state_dim());
    const Eigen::MatrixXd t = model.transition_matrix();
    const Eigen::MatrixXd a = sample(m, m, 0.25);
    // symmetric up to round-off, as the filter's covariances are
    const Eigen::MatrixXd p = a * a.transpose() + 1e-13 * sample(m, m, 2.0);
    Eigen::MatrixXd u = p;
    model.predict_covariance(u);
    const Eigen::MatrixXd dense = t * p * t.transpose();
    CHECK((u - dense).cwiseAbs().maxCoeff() < 1e-12 * (1 + dense.cwiseAbs().maxCoeff()));
    Eigen::MatrixXd two_step = p;
    model.transition(two_step);
    model.times_transition_transposed(two_step);
    CHECK(u == two_step);  // every entry, exactly
  }
}

TEST_CASE("the dummy seasonal sums to zero over a period and the design picks level plus season") {
  const auto model = StructuralModel::basic_structural(4);
  const Eigen::MatrixXd t = model.transition_matrix();
  // Seasonal block: the new effect is minus the sum of the last three.
  CHECK(t(2, 2) == -1);
  CHECK(t(2, 3) == -1);
  CHECK(t(2, 4) == -1);
  CHECK(t(3, 2) == 1);
  CHECK(t(4, 3) == 1);
  // Without disturbances the seasonal pattern repeats every 4 steps.
  Eigen::MatrixXd power = Eigen::MatrixXd::Identity(5, 5);
  for (int i = 0; i < 4; ++i) power = t * power;
  CHECK((power.bottomRightCorner(3, 3) - Eigen::MatrixXd::Identity(3, 3)).cwiseAbs().maxCoeff() < 1e-12);
  const Eigen::RowVectorXd z = model.design_row();
  CHECK(z.sum() == 2);
  CHECK(z(0) == 1);
  CHECK(z(2) == 1);
  CHECK(model.variance_names() == std::vector<std::string>{"irregular", "level", "slope", "seasonal"});
  CHECK(model.disturbed_state(3) == 2);
  CHECK_THROWS_AS(StructuralModel::basic_structural(1), std::invalid_argument);
}

TEST_CASE("the trigonometric seasonal: rotations by 2 pi j / s, design on every other state, one variance") {
  // Durbin & Koopman (2012, sec. 3.2): for harmonic j a 2 x 2 block
  // [cos l_j, sin l_j; -sin l_j, cos l_j] with l_j = 2 pi j / s, and Z picks
  // the first state of each pair.
  const auto model = StructuralModel::trigonometric(24, 3);
  CHECK(model.state_dim() == 8);
  CHECK(model.period() == 24);
  CHECK(model.harmonics() == 3);
  CHECK(model.name() == "seasonal(24, 3 harmonics)");
  const Eigen::MatrixXd t = model.transition_matrix();
  const double pi = 3.141592653589793;
  for (int j = 1; j <= 3; ++j) {
    const int p = 2 * j;
    CHECK(t(p, p) == doctest::Approx(std::cos(2 * pi * j / 24)));
    CHECK(t(p, p + 1) == doctest::Approx(std::sin(2 * pi * j / 24)));
    CHECK(t(p + 1, p) == doctest::Approx(-std::sin(2 * pi * j / 24)));
    CHECK(t(p + 1, p + 1) == doctest::Approx(std::cos(2 * pi * j / 24)));
  }
  const Eigen::Matrix2d trend{{1, 1}, {0, 1}};
  CHECK((t.topLeftCorner(2, 2) - trend).cwiseAbs().maxCoeff() == 0);
  // Without disturbances the season repeats every 24 steps and sums to zero over them.
  Eigen::MatrixXd power = Eigen::MatrixXd::Identity(8, 8), sum = Eigen::MatrixXd::Zero(8, 8);
  for (int i = 0; i < 24; ++i) {
    sum += power;
    power = t * power;
  }
  CHECK((power.bottomRightCorner(6, 6) - Eigen::MatrixXd::Identity(6, 6)).cwiseAbs().maxCoeff() < 1e-12);
  CHECK(sum.bottomRightCorner(6, 6).cwiseAbs().maxCoeff() < 1e-12);
  const Eigen::RowVectorXd z = model.design_row();
  const Eigen::RowVectorXd picks = (Eigen::RowVectorXd(8) << 1, 0, 1, 0, 1, 0, 1, 0).finished();
  CHECK((z - picks).cwiseAbs().maxCoeff() == 0);
  CHECK(model.variance_names() == std::vector<std::string>{"irregular", "level", "slope", "seasonal"});
  CHECK(model.disturbed_state(3) == 2);
  CHECK(model.disturbed_count(3) == 6);
  CHECK(model.disturbed_count(1) == 1);
  CHECK(StructuralModel::basic_structural(12).disturbed_count(3) == 1);
  // 1 <= harmonics < period / 2: the harmonic at half the period is left to the dummy form.
  CHECK_NOTHROW(StructuralModel::trigonometric(7, 3));
  CHECK_THROWS_AS(StructuralModel::trigonometric(6, 3), std::invalid_argument);
  CHECK_THROWS_AS(StructuralModel::trigonometric(12, 0), std::invalid_argument);
  CHECK_THROWS_AS(StructuralModel::trigonometric(2, 1), std::invalid_argument);
}

TEST_CASE("the starting grid gives shares of the total variance that sum to one") {
  for (const auto& model : models()) {
    const auto starts = gapmark::state_space::fit_starts(model);
    CHECK(starts.size() >= model.variance_count() + 1);
    for (const auto& s : starts) {
      REQUIRE(s.size() == model.variance_count());
      CHECK(std::accumulate(s.begin(), s.end(), 0.0) == doctest::Approx(1.0));
      for (double v : s) CHECK(v > 0);
    }
  }
}

TEST_CASE("standardise centres and scales without overflow") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const std::vector<double> y{1e300, nan, -1e300, 1e300, -1e300};
  const auto s = gapmark::state_space::standardise(y);
  CHECK(s.observed == 4);
  CHECK(s.centre == doctest::Approx(0.0));
  CHECK(s.scale == doctest::Approx(1e300));
  CHECK(s.z[0] == doctest::Approx(1.0));
  CHECK(std::isnan(s.z[1]));
  const std::vector<double> flat{3.5, nan, 3.5};
  CHECK(gapmark::state_space::standardise(flat).scale == 0);
}
