#pragma once
// Adjusting p-values for many tests at once.
#include <span>
#include <vector>

namespace gapmark::stats {

/// Holm's step-down adjustment. With the m non-NaN p-values sorted ascending,
/// p_(i) becomes min(1, max_{j <= i} (m - j + 1) p_(j)); results are returned
/// in the input order, monotone in the sorted order and capped at 1. NaN
/// entries stay NaN and do not count in m.
std::vector<double> holm_adjust(std::span<const double> p);

}  // namespace gapmark::stats
