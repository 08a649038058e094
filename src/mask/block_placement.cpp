#include "block_placement.hpp"

#include <algorithm>
#include <cmath>

namespace gapmark::mask {
namespace {

bool blocked(const BlockRoom& room, std::size_t i) {
  return room.mask[i] || (room.inside_observed && std::isnan(room.values[i]));
}

/// The block's span with its neighbours, [lo, hi]; false when the block may
/// not start at s at all (past the limit, or without room for neighbours).
bool span_of(const BlockRoom& room, std::size_t s, std::size_t len, std::size_t& lo, std::size_t& hi) {
  const std::size_t n = room.values.size();
  if (s + len > room.limit) return false;
  if (room.inside_observed && (s == 0 || s + len >= n)) return false;
  lo = s > 0 ? s - 1 : 0;
  hi = s + len < n ? s + len : n - 1;
  return true;
}

bool fits(const BlockRoom& room, std::size_t s, std::size_t len) {
  std::size_t lo = 0, hi = 0;
  if (!span_of(room, s, len, lo, hi) || std::isnan(room.values[s])) return false;
  for (std::size_t i = lo; i <= hi; ++i)
    if (blocked(room, i)) return false;
  return true;
}

}  // namespace

std::optional<std::size_t> place_block(const BlockRoom& room, std::size_t len, int tries, Rng& rng,
                                       const std::vector<double>* weight, double max_weight) {
  const auto& eligible = room.eligible;
  for (int t = 0; t < tries; ++t) {
    const std::size_t s = eligible[rng.below(eligible.size())];
    if (weight != nullptr && rng.uniform() * max_weight >= (*weight)[s]) continue;
    if (fits(room, s, len)) return s;
  }
  // Every valid start: clear[i] counts the unblocked steps ending at i.
  std::vector<std::size_t> clear(room.values.size());
  for (std::size_t i = 0; i < clear.size(); ++i) clear[i] = blocked(room, i) ? 0 : (i > 0 ? clear[i - 1] : 0) + 1;
  std::vector<std::size_t> valid;
  std::vector<double> cumulative;
  double total = 0;
  for (std::size_t s : eligible) {
    if (room.inside_observed && s == 0) continue;
    std::size_t lo = 0, hi = 0;
    if (!span_of(room, s, len, lo, hi)) break;  // eligible is increasing: no later start fits either
    if (clear[hi] < hi - lo + 1) continue;
    if (weight != nullptr) {
      if ((*weight)[s] <= 0) continue;
      total += (*weight)[s];
      cumulative.push_back(total);
    }
    valid.push_back(s);
  }
  if (valid.empty()) return std::nullopt;
  if (weight == nullptr) return valid[rng.below(valid.size())];
  const double u = rng.uniform() * total;
  const auto k = static_cast<std::size_t>(std::upper_bound(cumulative.begin(), cumulative.end(), u) - cumulative.begin());
  return valid[std::min(k, valid.size() - 1)];
}

}  // namespace gapmark::mask
