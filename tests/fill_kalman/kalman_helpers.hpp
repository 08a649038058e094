#pragma once
// Helpers for the kalman tests: stored outside references and invented data.
#include <cmath>
#include <cstdint>
#include <fstream>
#include <limits>
#include <map>
#include <memory>
#include <sstream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "../reference_json.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/params.hpp"
#include "gapmark/rng.hpp"

namespace kalman_test {

inline const std::string kReferenceDir = std::string(GAPMARK_SOURCE_DIR) + "/reference/kalman/";
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

/// reference/kalman/statsmodels_reference.json (statsmodels UnobservedComponents).
inline const nlohmann::json& statsmodels_reference() {
  static const nlohmann::json doc = gapmark::test::reference_json("kalman/statsmodels_reference.json");
  return doc;
}

/// A JSON array of numbers with null for missing.
inline std::vector<double> numbers(const nlohmann::json& a) {
  std::vector<double> out;
  for (const auto& v : a) out.push_back(v.is_null() ? kNaN : v.get<double>());
  return out;
}

/// reference/kalman/r_reference.csv (R's StructTS, tsSmooth, KalmanSmooth):
/// rows case,quantity,index,value; returns the values of one case and quantity in index order.
inline std::vector<double> r_reference(const std::string& case_name, const std::string& quantity) {
  std::ifstream in(kReferenceDir + "r_reference.csv");
  std::string line;
  std::getline(in, line);  // header
  std::vector<double> out;
  auto unquote = [](std::string s) {
    if (s.size() >= 2 && s.front() == '"') s = s.substr(1, s.size() - 2);
    return s;
  };
  while (std::getline(in, line)) {
    std::stringstream row(line);
    std::string c, q, i, v;
    std::getline(row, c, ',');
    std::getline(row, q, ',');
    std::getline(row, i, ',');
    std::getline(row, v, ',');
    if (unquote(c) == case_name && unquote(q) == quantity) out.push_back(v == "NA" ? kNaN : std::stod(v));
  }
  return out;
}

/// Invented data: a random walk level plus noise (and an optional sine
/// season). `signal`, when given, receives the series without the noise.
inline std::vector<double> invented_series(std::size_t n, std::uint64_t seed, double level_sd, double noise_sd,
                                           std::size_t period = 0, double season_amplitude = 0,
                                           std::vector<double>* signal = nullptr) {
  gapmark::Rng rng(seed);
  auto normal = [&] {
    const double u1 = 1.0 - rng.uniform(), u2 = rng.uniform();
    return std::sqrt(-2.0 * std::log(u1)) * std::cos(6.283185307179586 * u2);
  };
  std::vector<double> y(n);
  double level = 10;
  for (std::size_t t = 0; t < n; ++t) {
    level += level_sd * normal();
    double season = 0;
    if (period) season = season_amplitude * std::sin(6.283185307179586 * static_cast<double>(t % period) / period);
    y[t] = level + season + noise_sd * normal();
    if (signal) signal->push_back(level + season);
  }
  return y;
}

/// Hides each point with probability `share` (a fixed seed), keeping the first and last.
inline std::vector<double> with_random_gaps(std::vector<double> y, double share, std::uint64_t seed) {
  gapmark::Rng rng(seed);
  for (std::size_t t = 1; t + 1 < y.size(); ++t)
    if (rng.bernoulli(share)) y[t] = kNaN;
  return y;
}

/// The registered kalman method with parameters written as "key=value,...".
inline std::shared_ptr<const gapmark::FillMethod> kalman(const std::string& args = "") {
  const auto call = gapmark::CallSpec::parse(args.empty() ? "kalman" : "kalman:" + args, "test");
  return gapmark::MethodRegistry::global().bind(call, "test").impl;
}

}  // namespace kalman_test
