#pragma once
// Ranks within a sample: ascending (smallest value gets rank 1), tied values
// share the average of the ranks they span. "Closer to zero is better" is the
// caller's job: rank the absolute values.
#include <cstddef>
#include <span>
#include <vector>

namespace gapmark::stats {

/// 1-based ascending ranks, ties given their average rank.
/// Throws std::invalid_argument when a value is NaN (the caller removes them).
std::vector<double> average_ranks(std::span<const double> x);

/// Like average_ranks, but values within `tolerance` of each other count as
/// equal: sorted ascending, each value joins the tie group of the one before
/// it when it exceeds that one by at most `tolerance` (so a chain of close
/// values forms one group). Equal values, infinities included, always tie.
/// tolerance = 0 gives average_ranks. Throws on NaN or a negative tolerance.
std::vector<double> average_ranks_within(std::span<const double> x, double tolerance);

/// Ranks each row of a row-major `rows` x `cols` matrix with average_ranks
/// and returns the mean rank of each column (length `cols`; NaN when rows = 0).
/// Throws std::invalid_argument when values.size() != rows * cols.
std::vector<double> mean_row_ranks(std::span<const double> values, std::size_t rows,
                                   std::size_t cols);

}  // namespace gapmark::stats
