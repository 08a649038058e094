#pragma once
// Shared helpers for the masking-scheme tests: drawing through the registry
// (the way an experiment does), counting, and measuring runs of hidden points.
#include <cmath>
#include <cstdint>
#include <limits>
#include <string>
#include <vector>

#include "gapmark/error.hpp"
#include "gapmark/mask/scheme.hpp"
#include "gapmark/params.hpp"
#include "gapmark/rng.hpp"

namespace gapmark::test {

inline constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

/// The message of the InputError `f` throws; "(no error)" when it throws none.
template <class F>
std::string error_of(F&& f) {
  try {
    f();
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

/// A scheme bound from "name:key=value,..." text, as a spec would name it.
inline Bound<MaskScheme> scheme(const std::string& text) {
  return SchemeRegistry::global().bind(CallSpec::parse(text, "test"), "test");
}

/// The seed of replicate `r`, derived from a key the way the runner does.
inline std::uint64_t replicate_seed(int r) {
  return task_seed(20260301, "series\x1fscheme\x1f" "0.1\x1f" + std::to_string(r));
}

inline Mask draw(const Bound<MaskScheme>& s, const MaskRequest& request, std::uint64_t seed) {
  Rng rng(seed);
  return s.impl->draw(request, rng);
}

inline std::size_t hidden_count(const Mask& mask) {
  std::size_t k = 0;
  for (auto m : mask) k += m ? 1 : 0;
  return k;
}

/// Lengths of the maximal runs of hidden points.
inline std::vector<std::size_t> hidden_runs(const Mask& mask) {
  std::vector<std::size_t> runs;
  std::size_t run = 0;
  for (auto m : mask) {
    if (m) { ++run; continue; }
    if (run) runs.push_back(run);
    run = 0;
  }
  if (run) runs.push_back(run);
  return runs;
}

/// A fully observed series whose values are a fixed permutation of 0..n-1,
/// so values are unrelated to position.
inline std::vector<double> observed_series(std::size_t n) {
  std::vector<double> v(n);
  for (std::size_t i = 0; i < n; ++i) v[i] = static_cast<double>((i * 7919) % n);
  return v;
}

/// A series with existing gaps: every 7th point and the stretch [100, 150) missing.
inline std::vector<double> gappy_series(std::size_t n) {
  auto v = observed_series(n);
  for (std::size_t i = 0; i < n; ++i)
    if (i % 7 == 3 || (i >= 100 && i < 150)) v[i] = kNaN;
  return v;
}

/// Checks a mask never hides a missing point or one of the last `holdout`.
inline bool respects_eligibility(const Mask& mask, const std::vector<double>& values, std::size_t holdout) {
  if (mask.size() != values.size()) return false;
  for (std::size_t i = 0; i < mask.size(); ++i) {
    if (!mask[i]) continue;
    if (std::isnan(values[i]) || i + holdout >= values.size()) return false;
  }
  return true;
}

/// Binomial standard deviation sqrt(n p (1 - p)) (the binomial variance
/// formula, common statistics).
inline double binomial_sd(double n, double p) { return std::sqrt(n * p * (1.0 - p)); }

}  // namespace gapmark::test
