#pragma once
// Reading the stored outside reference values under reference/stats/ (made
// by reference/stats/make_reference.py) and comparing with a tolerance.
#include <doctest/doctest.h>

#include <cmath>
#include <fstream>
#include <iomanip>
#include <limits>
#include <nlohmann/json.hpp>
#include <stdexcept>
#include <string>
#include <vector>

#include "../reference_json.hpp"

namespace stats_test {

inline nlohmann::json load_reference(const std::string& file) {
  return gapmark::test::reference_json("stats/" + file);
}

/// JSON number, or NaN for null.
inline double number(const nlohmann::json& j) {
  return j.is_null() ? std::numeric_limits<double>::quiet_NaN() : j.get<double>();
}

inline std::vector<double> numbers(const nlohmann::json& j) {
  std::vector<double> out;
  for (const auto& v : j) out.push_back(number(v));
  return out;
}

/// |actual - expected| <= rel * |expected| + abs; NaN matches only NaN.
inline bool close(double actual, double expected, double rel, double abs = 0) {
  if (std::isnan(expected)) return std::isnan(actual);
  if (std::isinf(expected)) return actual == expected;
  return std::abs(actual - expected) <= rel * std::abs(expected) + abs;
}

}  // namespace stats_test

// Reports both values on failure.
#define CHECK_CLOSE(actual, expected, rel, abs)                                   \
  do {                                                                            \
    const double a_ = (actual), e_ = (expected);                                  \
    INFO(#actual " = " << std::setprecision(17) << a_ << ", expected " << e_ << " (rel " << (rel) << ")"); \
    CHECK(stats_test::close(a_, e_, (rel), (abs)));                               \
  } while (0)
