#pragma once
// A screening heuristic for value-dependent missingness: are the values
// right next to the gaps (the last one before and the first one after each
// gap) distributed like the other observed values? Compared with the
// Mann–Whitney U test (normal approximation with tie and continuity
// corrections). A small p-value hints that values go missing around some
// levels more than others (a sensor dropping out at high readings); a large
// one proves nothing. The values that went missing are never seen, so
// missingness that depends on them cannot be confirmed from the data alone.
#include <cstddef>
#include <span>
#include <string>

namespace gapmark::data {

struct MannWhitney {
  double u = 0;       ///< U of the first sample: pairs (x, y) with x > y, ties counting one half
  double z = 0;       ///< continuity-corrected, signed: positive when x tends to be larger
  double p = 1;       ///< two-sided
};

/// Mann–Whitney U test of x against y, two-sided, by the normal
/// approximation with the tie correction of the variance and a continuity
/// correction of 0.5. Both samples must be non-empty and free of NaN.
MannWhitney mann_whitney(std::span<const double> x, std::span<const double> y);

struct ValueScreen {
  bool applicable = false;
  std::string reason;           ///< why not, when not applicable
  std::size_t near_count = 0, rest_count = 0;
  double near_median = 0, rest_median = 0;
  MannWhitney test;
};

/// Screens a series on a regular grid (NaN = missing). Needs at least
/// `min_count` values next to gaps and as many elsewhere.
ValueScreen screen_values(std::span<const double> values, std::size_t min_count = 5);

}  // namespace gapmark::data
