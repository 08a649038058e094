// Natural spline, PCHIP and modified Akima against stored outside values
// (reference/interpolation/interpolation_cases.json, written by
// reference/interpolation/make_reference.py; versions recorded in the file):
//   natural-spline  scipy.interpolate.CubicSpline(bc_type="natural")  (scipy 1.10.1)
//   pchip           scipy.interpolate.PchipInterpolator                (scipy 1.10.1)
//   akima-weighted  numpy implementation of Akima (1970) with the modified
//                   weights, evaluated by scipy.interpolate.CubicHermiteSpline
// Agreement: 1e-9 relative (floor: the case's largest magnitude).
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "../reference_json.hpp"
#include "fill_helpers.hpp"

using namespace gapmark;
using namespace gapmark::test;

namespace {

nlohmann::json load_cases() {
  return gapmark::test::reference_json("interpolation/interpolation_cases.json");
}

std::vector<double> from_json(const nlohmann::json& a) {
  std::vector<double> v;
  for (const auto& e : a) v.push_back(e.is_null() ? NA : e.get<double>());
  return v;
}

/// Compares the method with `edges=leave` (the references cover the observed
/// span only) and returns how many filled points were compared.
std::size_t compare_case(const std::string& method, const std::string& key, const nlohmann::json& c) {
  const std::vector<double> values = from_json(c["values"]);
  const std::vector<double> expected = from_json(c[key]);
  double scale = 0.0;
  for (double v : values)
    if (!std::isnan(v)) scale = std::max(scale, std::abs(v));
  const std::vector<double> got = run_fill(method + ":edges=leave", values);
  REQUIRE(got.size() == expected.size());
  std::size_t compared = 0;
  for (std::size_t i = 0; i < got.size(); ++i) {
    CAPTURE(i);
    if (std::isnan(expected[i])) {
      CHECK(std::isnan(got[i]));
      continue;
    }
    CHECK(close(got[i], expected[i], 1e-9, scale));
    if (std::isnan(values[i])) ++compared;
  }
  return compared;
}

/// `key`: the reference's field for the method in the JSON cases.
void check_all_cases(const std::string& method, const std::string& key, std::size_t expected_case_count) {
  const auto doc = load_cases();
  std::size_t cases = 0, points = 0;
  for (const auto& c : doc["cases"]) {
    if (c[key].is_null()) continue;
    CAPTURE(c["name"].get<std::string>());
    points += compare_case(method, key, c);
    ++cases;
  }
  CHECK(cases == expected_case_count);
  CHECK(points > 40);
}

}  // namespace

TEST_CASE("natural-spline agrees with scipy CubicSpline(bc_type='natural')") {
  check_all_cases("natural-spline", "natural_spline", 8);
}

TEST_CASE("pchip agrees with scipy PchipInterpolator, end intervals included") {
  // Every case has gaps in its first and last intervals; "end-rule-limits"
  // makes both limits of the three-point end slope act, "three-points" and
  // "two-points" take the paths with fewer than four knots.
  check_all_cases("pchip", "pchip", 8);
}

TEST_CASE("akima-weighted agrees with the published modified-Akima formula (numpy + scipy CubicHermiteSpline)") {
  // scipy 1.10's Akima1DInterpolator has only the original weights
  // (signature recorded in the JSON), hence the short numpy implementation.
  check_all_cases("akima-weighted", "akima_weighted", 6);
}

TEST_CASE("edges=nearest fills outside the observed span with the end observations") {
  const auto doc = load_cases();
  int found = 0;  // the case is looked up by name: a renamed case must fail here, not check nothing
  for (const auto& c : doc["cases"]) {
    if (c["name"] != "edge-gaps") continue;
    ++found;
    const std::vector<double> values = from_json(c["values"]);
    for (const std::string method : {"natural-spline", "pchip", "akima-weighted"}) {
      CAPTURE(method);
      const auto got = run_fill(method, values);  // edges=nearest is the default
      CHECK(got[0] == values[3]);
      CHECK(got[2] == values[3]);
      CHECK(got[16] == values[15]);
      CHECK(got[17] == values[15]);
      CHECK(got[6] == run_fill(method + ":edges=leave", values)[6]);
    }
  }
  CHECK(found == 1);
}
