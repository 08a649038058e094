#pragma once
// Filling the real gaps of a table's columns with one method: what
// `gapmark fill` does, and how it says what it left unfilled.
#include <cstdint>
#include <string>
#include <vector>

#include "gapmark/fill/method.hpp"
#include "gapmark/table_io.hpp"
#include "gapmark/wide_write.hpp"

namespace gapmark {

struct FillTableReport {
  std::string column;
  std::size_t missing = 0;    ///< missing points before filling
  std::size_t gaps = 0;       ///< runs of consecutive missing points they form
  std::size_t filled = 0;     ///< missing points filled
  std::size_t clipped = 0;    ///< of those, moved into the method's bounds=LO,HI
  std::string failure;        ///< the method's reason when it failed on the column
  ModelFit fit;               ///< what the method estimated on the column; empty without a model
  /// The method's conditional sample paths (`draws=M`), each the column
  /// filled anew: observed cells as read, NaN where a draw is missing.
  std::vector<std::vector<double>> draws;
  UnmetNeed need = UnmetNeed::None;  ///< the unmet need, when that was the failure
  bool variance = false;      ///< the method gave a predictive variance for this column
  /// The observed range and the fills outside it (NaN bounds: nothing observed).
  double observed_low = 0, observed_high = 0;
  std::size_t outside = 0;           ///< filled points below observed_low or above observed_high
  double fill_low = 0, fill_high = 0;  ///< the lowest and highest fill (when filled > 0)
  std::size_t drawn = 0;             ///< drawn values at filled points (draws=M: M per filled point)
  std::size_t drawn_outside = 0;     ///< of those, outside the observed range
  std::size_t unfilled() const { return missing - filled; }
};

/// Fills the gaps of the selected columns in place (values and cells; filled
/// cells are written at round-trip precision) and returns, per column, the
/// flag cells ("1" where filled, "0" elsewhere), the variance cells (the
/// method's predictive variance at filled points; empty at observed and
/// unfilled points and when the method gives none) and a report. Other
/// selected columns serve as siblings. `period` 0 = the axis's default. With
/// `fit_complete_columns` the method also runs on a column with nothing to
/// fill, so that its fit is on record (`gapmark fill --fit`). A method's
/// draws for a column are seeded from `seed` and the column's name.
struct FillTableOutput {
  std::vector<std::vector<std::string>> flags;     ///< one per selected column
  std::vector<std::vector<std::string>> variance;  ///< one per selected column
  std::vector<FillTableReport> reports;
};
FillTableOutput fill_table(WideTable& table, const std::vector<std::size_t>& columns,
                           const Bound<FillMethod>& method, std::size_t period,
                           bool fit_complete_columns = false, std::uint64_t seed = 1);

/// Which extra columns `gapmark fill` writes besides each column's flags.
struct FillColumnsWanted {
  bool variance = false;   ///< COLUMN_variance after each COLUMN_filled
  std::size_t draws = 0;   ///< COLUMN_draw_1 .. COLUMN_draw_M per column, after all flag columns
};
/// The extra columns of a filled table: per selected column its flag column
/// (and its variance column), then its draws, each the column as read with the
/// draw at filled points (empty where a draw is missing).
std::vector<ExtraColumn> fill_extra_columns(const WideTable& table, const std::vector<std::size_t>& columns,
                                            const FillTableOutput& result, const FillColumnsWanted& wanted);

/// Points left unfilled over every column.
std::size_t total_unfilled(const FillTableOutput& result);
/// unfilled_message of the first column left (partly) unfilled; "" when none.
std::string first_unfilled_message(const FillTableOutput& result, const Bound<FillMethod>& method);

/// "37 points in 17 gaps" (singular forms for 1).
std::string points_in_gaps(std::size_t points, std::size_t gaps);

/// One line on a column `gapmark fill` left (partly) unfilled: how much, why,
/// and a hint that fits the method and the command line.
std::string unfilled_message(const FillTableReport& report, const Bound<FillMethod>& method);

/// One line on a column whose fills leave its observed range, with the generic
/// ways to keep them in; empty when every fill lies inside it.
std::string out_of_range_message(const FillTableReport& report, const Bound<FillMethod>& method);

}  // namespace gapmark
