#include <doctest/doctest.h>

#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>

#include "../reference_json.hpp"
#include "gapmark/error.hpp"
#include "gapmark/fill/method.hpp"

using namespace gapmark;

namespace {

const double NaN = std::nan("");

std::vector<double> run(const std::string& call, const std::vector<double>& values) {
  auto bound = MethodRegistry::global().bind(CallSpec::parse(call, "test"), "test");
  TimeAxis axis = TimeAxis::index(values.size());
  FillRequest request;
  request.values = values;
  request.axis = &axis;
  return bound.impl->fill(request).values;
}

void check_same(const std::vector<double>& got, const std::vector<double>& want) {
  REQUIRE(got.size() == want.size());
  for (std::size_t i = 0; i < got.size(); ++i) {
    if (std::isnan(want[i])) {
      CHECK(std::isnan(got[i]));
    } else {
      CHECK(got[i] == doctest::Approx(want[i]).epsilon(1e-12));
    }
  }
}

}  // namespace

TEST_CASE("hand-worked fills on a short series") {
  const std::vector<double> x{NaN, 2, NaN, NaN, 8, NaN};
  check_same(run("zero", x), {0, 2, 0, 0, 8, 0});
  check_same(run("mean", x), {5, 2, 5, 5, 8, 5});
  check_same(run("median", {NaN, 1, 7, NaN, 3}), {3, 1, 7, 3, 3});
  check_same(run("median", x), {5, 2, 5, 5, 8, 5});
  check_same(run("carry-forward", x), {2, 2, 2, 2, 8, 8});
  check_same(run("carry-forward:edges=leave", x), {NaN, 2, 2, 2, 8, 8});
  check_same(run("carry-backward", x), {2, 2, 8, 8, 8, 8});
  check_same(run("carry-backward:edges=leave", x), {2, 2, 8, 8, 8, NaN});
  check_same(run("linear", x), {2, 2, 4, 6, 8, 8});
  check_same(run("linear:edges=leave", x), {NaN, 2, 4, 6, 8, NaN});
}

TEST_CASE("observed values come back unchanged, even at extreme magnitudes") {
  const std::vector<double> x{1e300, NaN, -1e300, 1e-300, NaN, 3e-300};
  for (const char* m : {"linear", "carry-forward", "carry-backward", "mean", "median", "zero"}) {
    auto y = run(m, x);
    for (std::size_t i = 0; i < x.size(); ++i) {
      if (!std::isnan(x[i])) CHECK(y[i] == x[i]);
      CHECK(std::isfinite(y[i]));
    }
  }
  // The midpoint of +1e300 and -1e300 without overflow.
  CHECK(run("linear", {1e300, NaN, -1e300})[1] == 0.0);
}

TEST_CASE("methods that need an observation say so") {
  const std::vector<double> none{NaN, NaN};
  CHECK_THROWS_WITH_AS(run("mean", none), doctest::Contains("no observed values"), MethodFailure);
  check_same(run("zero", none), {0, 0});
  check_same(run("linear:edges=leave", none), {NaN, NaN});
}

TEST_CASE("linear and carry fills agree with numpy.interp and pandas ffill/bfill") {
  // Source: reference/basic_fills/basic_fills.json, made by
  // reference/basic_fills/make_reference.py with numpy and pandas (versions inside).
  const auto ref = gapmark::test::reference_json("basic_fills/basic_fills.json");
  REQUIRE(ref["cases"].size() >= 3);
  for (const auto& c : ref["cases"]) {
    CAPTURE(c["name"].get<std::string>());
    std::vector<double> x;
    for (const auto& v : c["input"]) x.push_back(v.is_null() ? NaN : v.get<double>());
    for (const char* m : {"linear", "carry-forward", "carry-backward"}) {
      CAPTURE(m);
      check_same(run(m, x), c[m].get<std::vector<double>>());
    }
    const auto mean = run("mean", x), median = run("median", x);
    for (std::size_t i = 0; i < x.size(); ++i)
      if (std::isnan(x[i])) {
        CHECK(mean[i] == doctest::Approx(c["mean"].get<double>()).epsilon(1e-13));
        CHECK(median[i] == doctest::Approx(c["median"].get<double>()).epsilon(1e-13));
      }
  }
}
