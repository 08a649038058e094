#include "gapmark/stats/ranks.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>
#include <stdexcept>

namespace gapmark::stats {

std::vector<double> average_ranks(std::span<const double> x) { return average_ranks_within(x, 0.0); }

std::vector<double> average_ranks_within(std::span<const double> x, double tolerance) {
  if (!(tolerance >= 0)) throw std::invalid_argument("average_ranks_within: negative tolerance");
  for (double v : x)
    if (std::isnan(v)) throw std::invalid_argument("average_ranks: NaN in input");
  std::vector<std::size_t> order(x.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(),
                   [&](std::size_t a, std::size_t b) { return x[a] < x[b]; });
  std::vector<double> ranks(x.size());
  std::size_t i = 0;
  while (i < order.size()) {
    std::size_t j = i + 1;
    while (j < order.size() &&
           (x[order[j]] == x[order[j - 1]] || x[order[j]] - x[order[j - 1]] <= tolerance))
      ++j;
    // positions i..j-1 (0-based) hold ranks i+1..j; their average:
    const double rank = 0.5 * static_cast<double>(i + 1 + j);
    for (std::size_t m = i; m < j; ++m) ranks[order[m]] = rank;
    i = j;
  }
  return ranks;
}

std::vector<double> mean_row_ranks(std::span<const double> values, std::size_t rows,
                                   std::size_t cols) {
  if (values.size() != rows * cols)
    throw std::invalid_argument("mean_row_ranks: matrix size does not match rows x cols");
  if (rows == 0) return std::vector<double>(cols, std::numeric_limits<double>::quiet_NaN());
  std::vector<double> sums(cols, 0.0);
  for (std::size_t r = 0; r < rows; ++r) {
    const auto ranks = average_ranks(values.subspan(r * cols, cols));
    for (std::size_t c = 0; c < cols; ++c) sums[c] += ranks[c];
  }
  for (double& s : sums) s /= static_cast<double>(rows);
  return sums;
}

}  // namespace gapmark::stats
