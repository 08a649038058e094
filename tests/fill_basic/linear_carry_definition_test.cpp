// linear, carry-forward and carry-backward against their plain point-by-point
// definitions, written out here independently of the methods' gap finding
// (bit masks of 64 points, inner_gaps.hpp): the same bits on many random gap
// patterns (scattered holes, blocks, gaps across 64-point boundaries, leading
// and trailing gaps, nothing or a single value observed).
#include <doctest/doctest.h>

#include <cmath>
#include <cstring>
#include <limits>
#include <string>
#include <vector>

#include "gapmark/fill/method.hpp"
#include "gapmark/rng.hpp"

using namespace gapmark;

namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

std::vector<double> run(const std::string& call, const std::vector<double>& values) {
  const auto bound = MethodRegistry::global().bind(CallSpec::parse(call, "test"), "test");
  const TimeAxis axis = TimeAxis::index(values.size());
  FillRequest request;
  request.values = values;
  request.axis = &axis;
  return bound.impl->fill(request).values;
}

void nearest_at_edges(std::vector<double>& v) {
  std::size_t first = 0;
  while (first < v.size() && std::isnan(v[first])) ++first;
  if (first == v.size()) return;
  std::size_t last = v.size() - 1;
  while (std::isnan(v[last])) --last;
  for (std::size_t i = 0; i < first; ++i) v[i] = v[first];
  for (std::size_t i = last + 1; i < v.size(); ++i) v[i] = v[last];
}

/// Each gap point: (1 - t) a + t b, t = (its distance from the observation
/// before) / (the distance between the observations around it).
std::vector<double> linear_definition(const std::vector<double>& x, bool edges) {
  const std::size_t n = x.size();
  std::vector<double> v = x;
  for (std::size_t j = 0; j < n; ++j) {
    if (!std::isnan(x[j])) continue;
    std::size_t left = j, right = j;
    while (left > 0 && std::isnan(x[left - 1])) --left;
    while (right < n && std::isnan(x[right])) ++right;
    if (left == 0 || right == n) continue;
    --left;
    const double t = static_cast<double>(j - left) / static_cast<double>(right - left);
    v[j] = (1.0 - t) * x[left] + t * x[right];
  }
  if (edges) nearest_at_edges(v);
  return v;
}

std::vector<double> carry_definition(std::vector<double> v, bool forward, bool edges) {
  const std::size_t n = v.size();
  if (forward) {
    for (std::size_t i = 1; i < n; ++i)
      if (std::isnan(v[i])) v[i] = v[i - 1];
  } else {
    for (std::size_t i = n; i-- > 1;)
      if (std::isnan(v[i - 1])) v[i - 1] = v[i];
  }
  if (edges) nearest_at_edges(v);
  return v;
}

bool same_bits(const std::vector<double>& a, const std::vector<double>& b) {
  return a.size() == b.size() && (a.empty() || std::memcmp(a.data(), b.data(), a.size() * sizeof(double)) == 0);
}

/// A wavy series with holes: a share `hole` missing at random, blocks of
/// random length starting with probability `block`.
std::vector<double> holed(Rng& rng, std::size_t n, double hole, double block) {
  std::vector<double> x(n);
  for (std::size_t i = 0; i < n; ++i) x[i] = 3.0 * std::sin(0.1 * static_cast<double>(i)) + rng.uniform();
  for (std::size_t i = 0; i < n; ++i) {
    if (rng.bernoulli(block)) {
      const std::size_t len = 1 + rng.below(30);
      for (std::size_t k = i; k < std::min(n, i + len); ++k) x[k] = kNaN;
    }
    if (rng.bernoulli(hole)) x[i] = kNaN;
  }
  return x;
}

}  // namespace

TEST_CASE("linear and the carries give the bits of their point-by-point definitions") {
  Rng rng(2024);
  std::vector<std::vector<double>> cases{{}, {kNaN}, {4.0}, {kNaN, kNaN, kNaN}, {kNaN, 5.0, kNaN},
                                         {1.0, kNaN, kNaN, kNaN, kNaN, 2.0}};
  // One gap from point 1 to point 198, across three 64-point boundaries.
  std::vector<double> long_gap(200, kNaN);
  long_gap[0] = 1.0;
  long_gap[199] = -2.0;
  cases.push_back(long_gap);
  for (std::size_t n : {2, 3, 10, 63, 64, 65, 100, 128, 129, 1000})
    for (double hole : {0.0, 0.1, 0.5, 0.95})
      for (double block : {0.0, 0.02, 0.2}) cases.push_back(holed(rng, n, hole, block));
  int checked = 0;
  for (const auto& x : cases) {
    CAPTURE(x.size());
    CHECK(same_bits(run("linear", x), linear_definition(x, true)));
    CHECK(same_bits(run("linear:edges=leave", x), linear_definition(x, false)));
    CHECK(same_bits(run("carry-forward", x), carry_definition(x, true, true)));
    CHECK(same_bits(run("carry-forward:edges=leave", x), carry_definition(x, true, false)));
    CHECK(same_bits(run("carry-backward", x), carry_definition(x, false, true)));
    CHECK(same_bits(run("carry-backward:edges=leave", x), carry_definition(x, false, false)));
    ++checked;
  }
  CHECK(checked == 127);
}

TEST_CASE("the definitions used above reproduce a hand-worked example") {
  const std::vector<double> x{kNaN, 2, kNaN, kNaN, 8, kNaN};
  CHECK(linear_definition(x, false)[2] == 4.0);
  CHECK(linear_definition(x, false)[3] == 6.0);
  CHECK(std::isnan(linear_definition(x, false)[5]));
  CHECK(carry_definition(x, true, false)[3] == 2.0);
  CHECK(carry_definition(x, false, false)[2] == 8.0);
}
