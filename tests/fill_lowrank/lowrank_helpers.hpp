#pragma once
// Helpers for the low-rank tests: invented time x series matrices built
// from a few smooth factors, gaps drawn with gapmark::Rng, and the method
// run the way the harness runs it (column 0 is the request, the other
// columns its siblings).
#include <cmath>
#include <limits>
#include <numbers>
#include <span>
#include <string>
#include <vector>

#include "gapmark/fill/method.hpp"
#include "gapmark/params.hpp"
#include "gapmark/rng.hpp"
#include "gapmark/time_axis.hpp"

namespace gapmark::test {

inline constexpr double NA = std::numeric_limits<double>::quiet_NaN();

/// Columns of a matrix, one vector per series.
using Columns = std::vector<std::vector<double>>;

/// Two smooth invented factors over n time steps.
inline double factor_f(std::size_t i) {
  const double t = static_cast<double>(i);
  return std::sin(2.0 * std::numbers::pi * t / 50.0) + 0.3 * std::cos(2.0 * std::numbers::pi * t / 17.0);
}
inline double factor_g(std::size_t i, std::size_t n) {
  const double u = static_cast<double>(i) / static_cast<double>(n);
  return u * u - 0.5 * u + 0.2 * std::sin(9.0 * u);
}

/// column j = level[j] + a[j] f + b[j] g (+ uniform noise of the given
/// standard deviation when `noise` > 0).
inline Columns factor_matrix(std::size_t n, const std::vector<double>& level, const std::vector<double>& a,
                             const std::vector<double>& b, double noise = 0.0, std::uint64_t seed = 1) {
  Rng rng(seed);
  Columns cols(level.size(), std::vector<double>(n));
  for (std::size_t j = 0; j < level.size(); ++j)
    for (std::size_t i = 0; i < n; ++i) {
      double e = 0.0;
      if (noise > 0) e = noise * std::sqrt(12.0) * (rng.uniform() - 0.5);
      cols[j][i] = level[j] + a[j] * factor_f(i) + b[j] * factor_g(i, n) + e;
    }
  return cols;
}

/// Each cell missing with probability `rate`; rows left with fewer than
/// `min_observed` cells are drawn again, so every row stays identifiable.
inline Columns with_gaps(const Columns& full, double rate, std::size_t min_observed, std::uint64_t seed) {
  Rng rng(seed);
  Columns out = full;
  const std::size_t n = full[0].size(), k = full.size();
  for (std::size_t i = 0; i < n; ++i) {
    while (true) {
      std::size_t observed = 0;
      for (std::size_t j = 0; j < k; ++j) {
        const bool gap = rng.bernoulli(rate);
        out[j][i] = gap ? NA : full[j][i];
        observed += gap ? 0 : 1;
      }
      if (observed >= min_observed) break;
    }
  }
  return out;
}

/// In each row, two cells missing (with probability `two_share`) or one, at
/// places drawn at random: with two_share 0.8 and 6 columns, 30 % of the
/// cells on average, and every row keeps at least k - 2 observed cells.
inline Columns row_gaps(const Columns& full, double two_share, std::uint64_t seed) {
  Rng rng(seed);
  Columns out = full;
  const std::size_t n = full[0].size(), k = full.size();
  for (std::size_t i = 0; i < n; ++i) {
    const std::size_t first = rng.below(k);
    out[first][i] = NA;
    if (rng.bernoulli(two_share)) {
      const std::size_t second = (first + 1 + rng.below(k - 1)) % k;  // any other column
      out[second][i] = NA;
    }
  }
  return out;
}

inline Bound<FillMethod> bind_method(const std::string& call) {
  return MethodRegistry::global().bind(CallSpec::parse(call, "test"), "test");
}

/// Fills column `target` with the other columns as siblings.
/// The method's whole result (values and fit) on column `target`, the others its siblings.
inline FillResult fill_low_rank(const std::string& call, const Columns& cols, std::size_t target = 0) {
  const auto bound = bind_method(call);
  const TimeAxis axis = TimeAxis::index(cols[target].size());
  FillRequest request;
  request.values = cols[target];
  request.axis = &axis;
  for (std::size_t j = 0; j < cols.size(); ++j) {
    if (j == target) continue;
    request.siblings.emplace_back(cols[j]);
    request.sibling_names.push_back("s" + std::to_string(j));
  }
  check_needs(bound.entry->needs, request);
  return bound.impl->fill(request);
}

inline std::vector<double> run_low_rank(const std::string& call, const Columns& cols, std::size_t target = 0) {
  return fill_low_rank(call, cols, target).values;
}

/// Largest |filled - truth| over the cells missing in `holed`.
inline double max_gap_error(const std::vector<double>& filled, const std::vector<double>& holed,
                            const std::vector<double>& truth) {
  double worst = 0.0;
  for (std::size_t i = 0; i < truth.size(); ++i)
    if (std::isnan(holed[i])) worst = std::max(worst, std::abs(filled[i] - truth[i]));
  return worst;
}

/// Root mean squared error over the cells missing in `holed`.
inline double gap_rmse(const std::vector<double>& filled, const std::vector<double>& holed,
                       const std::vector<double>& truth) {
  double sum = 0.0;
  std::size_t count = 0;
  for (std::size_t i = 0; i < truth.size(); ++i)
    if (std::isnan(holed[i])) {
      sum += (filled[i] - truth[i]) * (filled[i] - truth[i]);
      ++count;
    }
  return std::sqrt(sum / static_cast<double>(count));
}

}  // namespace gapmark::test
