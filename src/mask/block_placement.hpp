#pragma once
// Where a block of consecutive hidden points may go, shared by the schemes
// that hide blocks (blocks, replay). A block [s, s+len) starts on an eligible
// point, ends before the limit, and neither it nor the step on either side is
// already hidden; `inside_observed` also asks every point it covers and both
// neighbours to be observed and inside the series (a gap of exactly len
// between observed values), otherwise the neighbours clip at the series' ends
// and missing points inside the block are allowed.
#include <cstddef>
#include <optional>
#include <span>
#include <vector>

#include "gapmark/mask/scheme.hpp"
#include "gapmark/rng.hpp"

namespace gapmark::mask {

struct BlockRoom {
  std::span<const double> values;
  const Mask& mask;
  const std::vector<std::size_t>& eligible;  ///< increasing
  std::size_t limit;                         ///< a block ends at or before this index
  bool inside_observed;
};

/// A start for a block of `len` points. First `tries` starts drawn uniformly
/// from the eligible ones (with `weight`, each kept with probability
/// weight[s] / max_weight) are tested; then every valid start is listed and
/// one drawn uniformly, or in proportion to `weight` (starts of weight 0 are
/// left out). nullopt when no start is valid.
std::optional<std::size_t> place_block(const BlockRoom& room, std::size_t len, int tries, Rng& rng,
                                       const std::vector<double>* weight = nullptr, double max_weight = 0);

}  // namespace gapmark::mask
