// The parameters every method takes: period=N, bounds=LO,HI, transform=log|log1p.
#include <doctest/doctest.h>

#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>

#include "gapmark/error.hpp"
#include "gapmark/fill/method.hpp"

using namespace gapmark;

namespace {

const double NaN = std::nan("");

FillResult fill_with(const std::string& call, const std::vector<double>& values, std::size_t period = 0) {
  auto bound = MethodRegistry::global().bind(CallSpec::parse(call, "test"), "test");
  TimeAxis axis = TimeAxis::index(values.size());
  FillRequest request;
  request.values = values;
  request.axis = &axis;
  request.period = period;
  check_needs(bound, request);
  return bound.impl->fill(request);
}

std::vector<double> from_json(const nlohmann::json& a) {
  std::vector<double> out;
  for (const auto& v : a) out.push_back(v.is_null() ? NaN : v.get<double>());
  return out;
}

void check_close(const std::vector<double>& got, const std::vector<double>& want, double eps = 1e-12) {
  REQUIRE(got.size() == want.size());
  for (std::size_t i = 0; i < got.size(); ++i) {
    CAPTURE(i);
    if (std::isnan(want[i])) CHECK(std::isnan(got[i]));
    else CHECK(got[i] == doctest::Approx(want[i]).epsilon(eps));
  }
}

nlohmann::json reference() {
  // Source: reference/method_params/method_params.json, made by
  // reference/method_params/make_reference.py (numpy, scipy, pandas).
  std::ifstream in(std::string(GAPMARK_SOURCE_DIR) + "/reference/method_params/method_params.json");
  REQUIRE(in.good());
  return nlohmann::json::parse(in);
}

}  // namespace

TEST_CASE("period=N replaces the data's period, by hand") {
  // Phases of period 3: {1, 1, 1}, {2, 2}, {3, 3}; the gaps at 4 and 8 take 2 and 3.
  const std::vector<double> x{1, 2, 3, 1, NaN, 3, 1, 2, NaN};
  check_close(fill_with("seasonal-mean:period=3", x).values, {1, 2, 3, 1, 2, 3, 1, 2, 3});
  // The data's period (2 here) is overridden, not used.
  check_close(fill_with("seasonal-mean:period=3", x, 2).values, {1, 2, 3, 1, 2, 3, 1, 2, 3});
  // Without it the data's period counts: the even points observed are 1, 3 and 1.
  const auto by_two = fill_with("seasonal-mean", x, 2).values;
  CHECK(by_two[4] == doctest::Approx((1.0 + 3 + 1) / 3));
  // No period anywhere: the need is unmet.
  CHECK_THROWS_AS(fill_with("seasonal-mean", x), MethodFailure);
  CHECK_THROWS_WITH_AS(fill_with("seasonal-mean:period=1", x), doctest::Contains("at least 2"), InputError);
}

TEST_CASE("period=N against pandas, and only on methods that use a period") {
  const auto ref = reference();
  const auto x = from_json(ref["input"]);
  for (const auto& p : {"3", "5"}) {
    CAPTURE(p);
    check_close(fill_with(std::string("seasonal-mean:period=") + p, x).values,
                from_json(ref["seasonal_mean_by_period"][p]));
  }
  CHECK_THROWS_WITH_AS(fill_with("linear:period=3", x), doctest::Contains("unknown parameter 'period'"), InputError);
  // kalman takes one (model=seasonal uses it); the label keeps it, so two periods are two methods.
  const auto a = MethodRegistry::global().bind(CallSpec::parse("kalman:model=seasonal,period=4", "t"), "t");
  const auto b = MethodRegistry::global().bind(CallSpec::parse("seasonal-mean:period=24", "t"), "t");
  const auto c = MethodRegistry::global().bind(CallSpec::parse("seasonal-mean:period=168", "t"), "t");
  CHECK(a.label == "kalman:model=seasonal,period=4");
  const auto arima = MethodRegistry::global().bind(CallSpec::parse("arima:order=1,0,0,seasonal=1,0,0,period=4", "t"), "t");
  CHECK(arima.label == "arima:order=1,0,0,seasonal=1,0,0,period=4");
  CHECK(method_period(arima, 0) == 4);
  CHECK(b.label != c.label);
  CHECK(method_period(b, 7) == 24);
  const auto d = MethodRegistry::global().bind(CallSpec::parse("seasonal-mean", "t"), "t");
  CHECK(method_period(d, 7) == 7);
}

TEST_CASE("transform=log and log1p against numpy") {
  const auto ref = reference();
  check_close(fill_with("linear:transform=log", from_json(ref["input_positive"])).values, from_json(ref["linear_log"]));
  check_close(fill_with("linear:transform=log1p", from_json(ref["input"])).values, from_json(ref["linear_log1p"]));
  // Hand-worked: the geometric midpoint of 1 and 100 is 10.
  const auto mid = fill_with("linear:transform=log", {1, NaN, 100}).values;
  CHECK(mid[1] == doctest::Approx(10).epsilon(1e-14));
  CHECK(mid[0] == 1);
  CHECK(mid[2] == 100);  // observed values come back exactly
  // A zero (or a negative value) refuses log with one line naming the point.
  CHECK_THROWS_WITH_AS(fill_with("linear:transform=log", from_json(ref["input"])),
                       doctest::Contains("transform=log needs values above 0; point 7 is 0"), MethodFailure);
  CHECK_THROWS_AS(fill_with("linear:transform=log1p", {-1, NaN, 2}), MethodFailure);
}

TEST_CASE("transform=log carries a variance by the delta method") {
  std::vector<double> x(40);
  for (std::size_t i = 0; i < x.size(); ++i) x[i] = 5 + std::sin(double(i) / 3) + 0.1 * double(i % 3);
  x[10] = x[11] = x[25] = NaN;
  std::vector<double> logged(x.size());
  for (std::size_t i = 0; i < x.size(); ++i) logged[i] = std::log(x[i]);
  const auto on_log = fill_with("kalman", logged);
  const auto back = fill_with("kalman:transform=log", x);
  REQUIRE(back.variance.size() == x.size());
  for (std::size_t i : {10u, 11u, 25u}) {
    CHECK(back.values[i] == doctest::Approx(std::exp(on_log.values[i])).epsilon(1e-12));
    CHECK(back.variance[i] == doctest::Approx(std::exp(2 * on_log.values[i]) * on_log.variance[i]).epsilon(1e-12));
  }
  CHECK(back.variance[0] == 0);
}

TEST_CASE("bounds=LO,HI clips fills only and counts them, against numpy.clip") {
  const auto ref = reference();
  const auto x = from_json(ref["input"]);
  const double lo = ref["bounds"][0], hi = ref["bounds"][1];
  const std::string call = "natural-spline:bounds=" + std::to_string(lo) + "," + std::to_string(hi);
  const auto unbounded = fill_with("natural-spline", x);
  check_close(unbounded.values, from_json(ref["natural_spline_unbounded"]), 1e-9);
  const auto bounded = fill_with(call, x);
  check_close(bounded.values, from_json(ref["natural_spline_bounded"]), 1e-9);
  CHECK(bounded.clipped == ref["natural_spline_clipped"].get<std::size_t>());
  CHECK(bounded.clipped > 0);
  CHECK(unbounded.clipped == 0);
  // Observed values outside the bounds stay as they are (the zero at point 7).
  CHECK(bounded.values[7] == 0);
  // Hand-worked: one open side.
  const auto floor_only = fill_with("linear:bounds=0,", {2, NaN, -4, NaN, NaN, 5});
  check_close(floor_only.values, {2, 0, -4, 0, 2, 5});
  CHECK(floor_only.clipped == 2);
  // Both parameters together: the log fill, then the clip.
  const auto both = fill_with("linear:transform=log,bounds=,20", {1, NaN, 10000});
  CHECK(both.values[1] == 20);
  CHECK(both.clipped == 1);
}

TEST_CASE("bounds and transform are checked when bound, with the method named") {
  CHECK_THROWS_WITH_AS(fill_with("linear:bounds=5,1", {1, NaN, 2}), doctest::Contains("LO must be below HI"), InputError);
  CHECK_THROWS_WITH_AS(fill_with("linear:bounds=a,1", {1, NaN, 2}), doctest::Contains("(linear)"), InputError);
  CHECK_THROWS_WITH_AS(fill_with("linear:bounds=1", {1, NaN, 2}), doctest::Contains("expected LO,HI"), InputError);
  CHECK_THROWS_WITH_AS(fill_with("linear:transform=sqrt", {1, NaN, 2}), doctest::Contains("none|log|log1p"), InputError);
  // The label is canonical and parses back to the same method.
  const auto b = MethodRegistry::global().bind(CallSpec::parse("pchip:transform=log1p,bounds=0,50", "t"), "t");
  CHECK(b.label == "pchip:bounds=0,50,transform=log1p");
  const auto again = MethodRegistry::global().bind(CallSpec::parse(b.label, "t"), "t");
  CHECK(again.label == b.label);
  // A spec may give bounds as a JSON list.
  const auto call = CallSpec::from_json(nlohmann::json{{"name", "linear"}, {"bounds", {0, 2.5}}}, "spec");
  CHECK(MethodRegistry::global().bind(call, "spec").label == "linear:bounds=0,2.5");
}
