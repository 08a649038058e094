// The registered `kalman` fill method: its contract (observed values
// unchanged, variances, edges, determinism), its failures, and awkward data.
// Data here are invented (random walks plus noise from a fixed seed).
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <cstring>

#include "gapmark/error.hpp"
#include "gapmark/fill/state_space.hpp"
#include "kalman_helpers.hpp"

using gapmark::FillRequest;
using gapmark::MethodFailure;
using kalman_test::kalman;
using kalman_test::kNaN;

namespace {

gapmark::FillResult run(const std::string& args, const std::vector<double>& y, std::size_t period = 0) {
  FillRequest r;
  r.values = y;
  r.period = period;
  return kalman(args)->fill(r);
}

std::string failure_of(const std::string& args, const std::vector<double>& y, std::size_t period = 0) {
  try {
    run(args, y, period);
  } catch (const MethodFailure& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("kalman is registered with its parameters") {
  const auto* e = gapmark::MethodRegistry::global().find("kalman");
  REQUIRE(e != nullptr);
  std::vector<std::string> names;
  for (const auto& p : e->params) names.push_back(p.name);
  CHECK(names == std::vector<std::string>{"model", "harmonics", "edges", "draws", "variance"});
}

TEST_CASE("observed values come back unchanged; filled points get the smoothed signal and its variance") {
  std::vector<double> signal;
  const auto truth = kalman_test::invented_series(300, 11, 0.5, 1.0, 0, 0, &signal);
  auto y = kalman_test::with_random_gaps(truth, 0.3, 12);
  for (std::size_t t = 100; t < 130; ++t) y[t] = kNaN;
  for (const std::string model : {"level", "trend"}) {
    CAPTURE(model);
    const auto out = run("model=" + model + ",variance=signal", y);
    REQUIRE(out.values.size() == y.size());
    REQUIRE(out.variance.size() == y.size());
    // Same fill as the library's fit and smoother on the standardised data.
    const auto m = model == "level" ? gapmark::state_space::StructuralModel::local_level()
                                    : gapmark::state_space::StructuralModel::local_linear_trend();
    const auto st = gapmark::state_space::standardise(y);
    const auto fit = gapmark::state_space::fit_variances(m, st.z);
    const auto sm = gapmark::state_space::smooth_signal(m, st.z, fit.variances);
    FillRequest request;
    request.values = y;
    const auto lines = gapmark::MethodRegistry::global()
                           .bind(gapmark::CallSpec::parse("linear", "test"), "test")
                           .impl->fill(request);
    double sq = 0, sq_lines = 0;
    for (std::size_t t = 0; t < y.size(); ++t) {
      if (!std::isnan(y[t])) {
        CHECK(out.values[t] == y[t]);
        CHECK(out.variance[t] == 0);
        continue;
      }
      CHECK(out.values[t] == doctest::Approx(st.centre + st.scale * sm.mean[t]).epsilon(1e-12));
      CHECK(out.variance[t] == doctest::Approx(st.scale * st.scale * sm.variance[t]).epsilon(1e-12));
      CHECK(out.variance[t] > 0);
      sq += (out.values[t] - signal[t]) * (out.values[t] - signal[t]);
      sq_lines += (lines.values[t] - signal[t]) * (lines.values[t] - signal[t]);
    }
    // On a noisy random walk the smoothed signal is closer to the invented
    // signal (level without noise) than straight lines between the noisy
    // neighbours are.
    CHECK(sq < 0.8 * sq_lines);
  }
}

TEST_CASE("variance grows toward the middle of a long gap") {
  auto y = kalman_test::invented_series(200, 21, 0.3, 0.5);
  for (std::size_t t = 80; t < 121; ++t) y[t] = kNaN;
  const auto out = run("", y);
  CHECK(out.variance[100] > out.variance[85]);
  CHECK(out.variance[100] > out.variance[115]);
}

TEST_CASE("the default variance is the missing value's (what an interval for the true value needs)") {
  const auto truth = kalman_test::invented_series(200, 5, 0.5, 1.0, 0, 0);
  auto y = kalman_test::with_random_gaps(truth, 0.3, 6);
  const auto by_default = run("model=level", y);
  const auto value = run("model=level,variance=value", y);
  CHECK(by_default.variance == value.variance);
}

TEST_CASE("variance=value adds the irregular variance to that of the signal") {
  auto y = kalman_test::invented_series(200, 31, 0.3, 1.0);
  y[50] = y[51] = kNaN;
  const auto signal = run("variance=signal", y);
  const auto value = run("variance=value", y);
  CHECK(value.values[50] == signal.values[50]);
  const auto fit = gapmark::state_space::fit_variances(gapmark::state_space::StructuralModel::local_level(), y);
  CHECK(value.variance[50] == doctest::Approx(signal.variance[50] + fit.variances[0]).epsilon(1e-6));
  CHECK(value.variance[10] == 0);
}

TEST_CASE("seasonal model follows a season through a gap of a whole period") {
  const auto truth = kalman_test::invented_series(96, 41, 0.05, 0.2, 6, 3.0);
  auto y = truth;
  for (std::size_t t = 48; t < 54; ++t) y[t] = kNaN;
  const auto seasonal = run("model=seasonal", y, 6);
  const auto trig = run("model=seasonal,harmonics=1", y, 6);  // the sine season is one harmonic
  const auto level = run("model=level", y, 6);
  double err_s = 0, err_t = 0, err_l = 0;
  for (std::size_t t = 48; t < 54; ++t) {
    err_s += std::abs(seasonal.values[t] - truth[t]);
    err_t += std::abs(trig.values[t] - truth[t]);
    err_l += std::abs(level.values[t] - truth[t]);
  }
  CHECK(err_s < 0.3 * err_l);
  CHECK(err_t < 0.3 * err_l);
}

TEST_CASE("harmonics=k fills with the trigonometric model's smoothed signal") {
  const auto truth = kalman_test::invented_series(480, 43, 0.05, 0.3, 24, 2.0);
  auto y = kalman_test::with_random_gaps(truth, 0.2, 44);
  for (std::size_t t = 200; t < 230; ++t) y[t] = kNaN;
  const auto out = run("model=seasonal,harmonics=3,variance=signal", y, 24);
  namespace ss = gapmark::state_space;
  const auto model = ss::StructuralModel::trigonometric(24, 3);
  const auto st = ss::standardise(y);
  const auto fit = ss::fit_variances(model, st.z);
  const auto sm = ss::smooth_signal(model, st.z, fit.variances);
  double sq = 0, sq_level = 0;
  const auto level = run("model=level", y, 24);
  for (std::size_t t = 0; t < y.size(); ++t) {
    if (!std::isnan(y[t])) {
      CHECK(out.values[t] == y[t]);
      continue;
    }
    CHECK(out.values[t] == doctest::Approx(st.centre + st.scale * sm.mean[t]).epsilon(1e-12));
    CHECK(out.variance[t] == doctest::Approx(st.scale * st.scale * sm.variance[t]).epsilon(1e-12));
    CHECK(out.variance[t] > 0);
    sq += (out.values[t] - truth[t]) * (out.values[t] - truth[t]);
    sq_level += (level.values[t] - truth[t]) * (level.values[t] - truth[t]);
  }
  // A daily sine through a 30-hour gap: the season carries it, a level cannot.
  CHECK(sq < 0.3 * sq_level);
}

TEST_CASE("harmonics: checked against the period and the model") {
  const auto y = kalman_test::invented_series(100, 63, 0.3, 0.5);
  CHECK(failure_of("model=seasonal,harmonics=3", y, 6) ==
        "harmonics=3 needs a period above 6 (period 6 takes at most 2 harmonics)");
  CHECK(failure_of("model=seasonal,harmonics=3", y, 7).empty());
  // The dummy seasonal stops at period 100; two harmonics of a period of 150 are fine.
  const auto long_series = kalman_test::invented_series(400, 62, 0.3, 0.5, 150, 1.0);
  CHECK(failure_of("model=seasonal", long_series, 150).find("periods up to") != std::string::npos);
  CHECK(failure_of("model=seasonal,harmonics=2", long_series, 150).empty());
  CHECK_THROWS_AS(kalman("model=level,harmonics=2"), gapmark::InputError);
  CHECK_THROWS_AS(kalman("model=seasonal,harmonics=-1"), gapmark::InputError);
  CHECK_THROWS_AS(kalman("model=seasonal,harmonics=51"), gapmark::InputError);
}

TEST_CASE("edges: nearest value with its expected squared error, or left empty") {
  auto y = kalman_test::invented_series(120, 51, 0.3, 0.5);
  for (std::size_t t = 0; t < 5; ++t) y[t] = kNaN;
  for (std::size_t t = 115; t < 120; ++t) y[t] = kNaN;
  const auto near = run("edges=nearest", y);
  const auto leave = run("edges=leave", y);
  for (std::size_t t : {0, 4}) {
    CHECK(near.values[t] == y[5]);
    CHECK(std::isfinite(near.variance[t]));
    CHECK(near.variance[t] > 0);
    CHECK(std::isnan(leave.values[t]));
  }
  CHECK(near.values[119] == y[114]);
  CHECK(std::isnan(leave.values[119]));
  // Farther from the data the model is less sure of the nearest value.
  CHECK(near.variance[0] > near.variance[4]);
  CHECK(near.variance[119] > near.variance[115]);
  CHECK(leave.values[50] == near.values[50]);
}

TEST_CASE("model=seasonal without a usable period fails with a clear reason") {
  const auto y = kalman_test::invented_series(100, 61, 0.3, 0.5);
  CHECK(failure_of("model=seasonal", y, 0) == "model=seasonal needs a seasonal period");
  CHECK(failure_of("model=seasonal", y, 1) == "model=seasonal needs a seasonal period");
  CHECK(failure_of("model=seasonal", y, 60).find("at most half the series") != std::string::npos);
  CHECK(failure_of("model=seasonal", kalman_test::invented_series(400, 62, 0.3, 0.5), 150)
            .find("periods up to") != std::string::npos);
  CHECK(failure_of("model=level", y, 0).empty());  // the period is only needed by model=seasonal
}

TEST_CASE("too few observations for the model's states is a MethodFailure") {
  std::vector<double> y(50, kNaN);
  y[10] = 1.0;
  CHECK(failure_of("", y) == "model=level needs at least 3 observed values (3 per state), found 1");
  y[20] = 2.0;
  y[30] = 1.5;
  y[40] = 1.7;
  CHECK(failure_of("", y).empty());
  CHECK(failure_of("model=trend", y).find("needs at least 6 observed values") != std::string::npos);
  std::vector<double> none(10, kNaN);
  CHECK_THROWS_AS(run("", none), MethodFailure);
}

TEST_CASE("a constant series is filled with its constant and variance zero") {
  std::vector<double> y(40, 7.25);
  y[3] = y[20] = y[21] = y[39] = kNaN;
  for (const std::string model : {"level", "trend"}) {
    const auto out = run("model=" + model, y);
    for (std::size_t t = 0; t < y.size(); ++t) {
      CHECK(out.values[t] == 7.25);
      CHECK(out.variance[t] == 0);
    }
  }
}

TEST_CASE("a series the model follows exactly is filled exactly") {
  // A straight line for model=trend; a line plus a fixed season for model=seasonal.
  // For harmonics=2 of period 12, a line plus two fixed harmonics.
  std::vector<double> line(60), seasonal(60), harmonic(60);
  for (std::size_t t = 0; t < 60; ++t) {
    line[t] = 3.0 + 0.5 * static_cast<double>(t);
    seasonal[t] = line[t] + (t % 4 == 0 ? 2.0 : t % 4 == 1 ? -1.0 : t % 4 == 2 ? 0.5 : -1.5);
    const double angle = 6.283185307179586 * static_cast<double>(t) / 12;
    harmonic[t] = line[t] + 1.5 * std::sin(angle + 0.3) - 0.7 * std::cos(2 * angle);
  }
  auto y = line, ys = seasonal, yh = harmonic;
  for (std::size_t t : {5, 6, 7, 30, 41}) y[t] = ys[t] = yh[t] = kNaN;
  const auto out = run("model=trend", y);
  const auto outs = run("model=seasonal", ys, 4);
  const auto outh = run("model=seasonal,harmonics=2", yh, 12);
  for (std::size_t t : {5, 6, 7, 30, 41}) {
    CHECK(out.values[t] == doctest::Approx(line[t]).epsilon(1e-9));
    CHECK(outs.values[t] == doctest::Approx(seasonal[t]).epsilon(1e-9));
    CHECK(outh.values[t] == doctest::Approx(harmonic[t]).epsilon(1e-9));
    CHECK(out.variance[t] < 1e-9);
  }
}

TEST_CASE("huge and tiny magnitudes give the same fill, scaled") {
  auto y = kalman_test::invented_series(150, 71, 0.4, 0.6);
  y = kalman_test::with_random_gaps(y, 0.2, 72);
  const auto base = run("model=trend", y);
  for (double factor : {1e150, 1e-150, 1e-300}) {
    CAPTURE(factor);
    std::vector<double> scaled(y);
    for (double& v : scaled) v *= factor;
    const auto out = run("model=trend", scaled);
    for (std::size_t t = 0; t < y.size(); ++t) {
      if (!std::isnan(y[t])) continue;
      REQUIRE(std::isfinite(out.values[t]));
      CHECK(out.values[t] / factor == doctest::Approx(base.values[t]).epsilon(1e-5));
      if (factor >= 1e-150) CHECK(out.variance[t] / (factor * factor) == doctest::Approx(base.variance[t]).epsilon(1e-4));
    }
  }
}

TEST_CASE("99% missing: no crash, no NaN inside the observed span") {
  const auto truth = kalman_test::invented_series(3000, 81, 0.2, 0.5);
  const auto y = kalman_test::with_random_gaps(truth, 0.99, 82);
  for (const std::string model : {"level", "trend"}) {
    CAPTURE(model);
    const auto out = run("model=" + model, y);
    for (std::size_t t = 0; t < y.size(); ++t) {
      CHECK(std::isfinite(out.values[t]));
      CHECK(std::isfinite(out.variance[t]));
    }
  }
}

TEST_CASE("same input, same bytes") {
  const auto y = kalman_test::with_random_gaps(kalman_test::invented_series(80, 91, 0.2, 0.5, 4, 1.0), 0.2, 92);
  for (const std::string args : {"model=seasonal", "model=seasonal,harmonics=1"}) {
    CAPTURE(args);
    const auto a = run(args, y, 4);
    const auto b = run(args, y, 4);
    CHECK(std::equal(a.values.begin(), a.values.end(), b.values.begin(),
                     [](double p, double q) { return std::memcmp(&p, &q, sizeof p) == 0; }));
    CHECK(std::equal(a.variance.begin(), a.variance.end(), b.variance.begin(),
                     [](double p, double q) { return std::memcmp(&p, &q, sizeof p) == 0; }));
  }
}
