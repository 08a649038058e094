#pragma once
// A series: a name, optional group keys, a regular time axis and its values,
// with NaN where a value is missing.
#include <cstddef>
#include <limits>
#include <span>
#include <string>
#include <utility>
#include <vector>

#include "gapmark/time_axis.hpp"

namespace gapmark {

inline constexpr double kMissing = std::numeric_limits<double>::quiet_NaN();

struct Series {
  std::string name;                                          ///< column or variable name
  std::vector<std::pair<std::string, std::string>> groups;   ///< (group column, value), may be empty
  TimeAxis axis;
  std::vector<double> values;                                ///< NaN = missing
  std::size_t period = 0;                                    ///< seasonal period in steps; 0 = none
  std::string units;                                         ///< e.g. "mg/L", for reports; "" = not given

  /// "name" or "name[site=A,pen=3]": the label used in records and tables.
  std::string label() const;
  std::size_t observed_count() const;
};

/// Counts the non-NaN values.
std::size_t count_observed(std::span<const double> values);

}  // namespace gapmark
