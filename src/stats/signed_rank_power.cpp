#include "gapmark/stats/signed_rank_power.hpp"

#include <algorithm>
#include <cmath>

namespace gapmark::stats {

std::size_t fewest_signed_rank_pairs(std::size_t tests, double alpha) {
  const double m = static_cast<double>(std::max<std::size_t>(tests, 1));
  std::size_t n = 1;
  while (m * std::ldexp(2.0, -static_cast<int>(n)) >= alpha && n < 64) ++n;
  return n;
}

}  // namespace gapmark::stats
