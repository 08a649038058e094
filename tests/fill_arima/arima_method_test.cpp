// The arima fill method through the registry: parameters, observed values
// unchanged, fills equal to the smoother of the fitted model, refusals.
#include <cmath>
#include <limits>
#include <string>

#include <doctest/doctest.h>

#include "gapmark/error.hpp"
#include "gapmark/fill/arima_fit.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/params.hpp"

using namespace gapmark;
namespace ar = gapmark::arima;

namespace {
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

std::shared_ptr<const FillMethod> make(const std::vector<std::pair<std::string, std::string>>& args) {
  CallSpec call;
  call.name = "arima";
  call.args = args;
  return MethodRegistry::global().bind(call, "test").impl;
}

/// Invented: a deterministic wavy series with a slow drift.
std::vector<double> invented(std::size_t n) {
  std::vector<double> x(n);
  for (std::size_t t = 0; t < n; ++t)
    x[t] = 10 + 0.02 * static_cast<double>(t) + std::sin(0.3 * static_cast<double>(t)) +
           0.5 * std::cos(1.7 * static_cast<double>(t * t % 17));
  return x;
}
}  // namespace

TEST_CASE("arima method: given order fills gaps with the smoother of the fitted model") {
  auto x = invented(150);
  for (std::size_t t : {10u, 11u, 12u, 70u, 100u}) x[t] = kNaN;
  TimeAxis axis = TimeAxis::index(x.size());
  FillRequest req{.values = x, .axis = &axis};
  const auto method = make({{"order", "1,1,1"}});
  const FillResult r = method->fill(req);
  ar::Order o;
  o.p = 1;
  o.d = 1;
  o.q = 1;
  const ar::Fit f = ar::fit(o, x);
  const ar::Smoothed s = ar::smooth_fit(f, x);
  for (std::size_t t = 0; t < x.size(); ++t) {
    if (std::isnan(x[t])) {
      CHECK(r.values[t] == doctest::Approx(s.mean[t]).epsilon(1e-12));
      CHECK(r.variance[t] > 0);
    } else {
      CHECK(r.values[t] == x[t]);
      CHECK(r.variance[t] == 0);
    }
  }
}

TEST_CASE("arima method: automatic order and edges") {
  auto x = invented(120);
  for (std::size_t t : {0u, 1u, 50u, 51u, 119u}) x[t] = kNaN;
  TimeAxis axis = TimeAxis::index(x.size());
  FillRequest req{.values = x, .axis = &axis};
  const FillResult near = make({})->fill(req);
  CHECK(near.values[0] == x[2]);
  CHECK(near.values[119] == x[118]);
  CHECK(std::isfinite(near.values[50]));
  const FillResult leave = make({{"edges", "leave"}})->fill(req);
  CHECK(std::isnan(leave.values[0]));
  CHECK(near.values[50] == leave.values[50]);
}

TEST_CASE("arima method: refusals") {
  CHECK_THROWS_AS(make({{"order", "1,1"}}), InputError);
  CHECK_THROWS_AS(make({{"order", "a,b,c"}}), InputError);
  CHECK_THROWS_AS(make({{"order", "1,3,1"}}), InputError);
  CHECK_THROWS_AS(make({{"seasonal", "0,1,1"}}), InputError);  // needs a given order
  CHECK_NOTHROW(make({{"seasonal", "0,0,0"}}));                 // no seasonal part in the search
  auto x = invented(100);
  x[10] = kNaN;
  TimeAxis axis = TimeAxis::index(x.size());
  FillRequest req{.values = x, .axis = &axis};
  CHECK_THROWS_AS(make({{"order", "0,1,1"}, {"seasonal", "0,1,1"}})->fill(req), MethodFailure);  // no period
  CHECK_THROWS_AS(make({{"order", "0,2,1"}, {"constant", "yes"}})->fill(req), MethodFailure);
}
