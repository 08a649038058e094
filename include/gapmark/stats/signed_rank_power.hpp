#pragma once
// When can a paired signed-rank test say anything at all? With n pairs the
// smallest two-sided exact p-value is 2 / 2^n (every difference of one
// sign); after Holm's correction over m tests the smallest adjusted p is
// m * 2 / 2^n. Below the n that brings it under alpha, every comparison
// comes out "not distinguishable", whatever the data.
#include <cstddef>

namespace gapmark::stats {

/// Fewest pairs n with tests * 2 / 2^n < alpha (tests >= 1; at most 64).
std::size_t fewest_signed_rank_pairs(std::size_t tests, double alpha);

}  // namespace gapmark::stats
