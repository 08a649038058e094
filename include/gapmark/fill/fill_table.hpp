#pragma once
// Filling the real gaps of a table's columns with one method: what
// `gapmark fill` does.
#include <cstdint>
#include <string>
#include <vector>

#include "gapmark/fill/method.hpp"
#include "gapmark/table_io.hpp"

namespace gapmark {

struct FillTableReport {
  std::string column;
  std::size_t gaps = 0;       ///< missing cells before filling
  std::size_t filled = 0;     ///< of those, filled
  std::size_t clipped = 0;    ///< of those, moved into the method's bounds=LO,HI
  std::string failure;        ///< the method's reason when it failed on the column
  ModelFit fit;               ///< what the method estimated on the column; empty without a model
  /// The method's conditional sample paths (`draws=M`), each the column
  /// filled anew: observed cells as read, NaN where a draw is missing.
  std::vector<std::vector<double>> draws;
};

/// Fills the gaps of the selected columns in place (values and cells; filled
/// cells are written at round-trip precision) and returns, per column, the
/// flag cells ("1" where filled, "0" elsewhere) and a report. Other selected
/// columns serve as siblings. `period` 0 = the axis's default. With
/// `fit_complete_columns` the method also runs on a column with nothing to
/// fill, so that its fit is on record (`gapmark fill --fit`). A method's
/// draws for a column are seeded from `seed` and the column's name.
struct FillTableOutput {
  std::vector<std::vector<std::string>> flags;  ///< one per selected column
  std::vector<FillTableReport> reports;
};
FillTableOutput fill_table(WideTable& table, const std::vector<std::size_t>& columns,
                           const Bound<FillMethod>& method, std::size_t period,
                           bool fit_complete_columns = false, std::uint64_t seed = 1);

}  // namespace gapmark
