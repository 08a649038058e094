#pragma once
// Putting raw rows on a regular grid. Every row falls in the calendar bin
// that holds its time (see time_grid.hpp: bins start at midnight, weeks on
// Monday, months on the 1st; each bin is labelled by its start and holds
// [start, start + step)). Per group and variable the rows of a bin are
// aggregated: sum, count, mean, min, max or last (the latest row; among rows
// at one time the last in the file). Bins with no rows follow the variable's
// empty-bin policy:
//   zero     nothing happened: counts, event totals, feed dispensed, meter pulses
//   missing  no observation: sensor readings (the default)
// A bin with rows whose cells are all empty is a missing value under either
// policy. Sums, means, minima and maxima use the cells that are there; a bin
// with some empty cells is counted in `partial` so that a caller can say so.
// Sums add the cells as written, exactly (decimal_sum.hpp); means divide
// that sum; minima, maxima and last values are written as they were.
//
// Times are taken as written: there is no time-zone database. A local clock
// that changes for daylight saving shows up as one hour with two hours' rows
// (the autumn change: sums double there) and one empty hour (the spring
// change). Times written with their UTC offsets can be brought to one offset
// with RawReadOptions::utc_offset_minutes.
#include <cstddef>
#include <map>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "gapmark/raw_table.hpp"
#include "gapmark/time_axis.hpp"

namespace gapmark::data {

enum class Aggregation { Sum, Count, Mean, Min, Max, Last };
enum class EmptyPolicy { Missing, Zero };
enum class PanelLayout { Wide, Long };

Aggregation parse_aggregation(const std::string& text, const std::string& where);
EmptyPolicy parse_empty_policy(const std::string& text, const std::string& where);
std::string aggregation_name(Aggregation a);
std::string empty_policy_name(EmptyPolicy e);

struct RegularizeOptions {
  Step step;
  std::map<std::string, Aggregation> aggregation;  ///< per value column; absent: `default_aggregation`
  Aggregation default_aggregation = Aggregation::Mean;
  std::map<std::string, EmptyPolicy> empty;        ///< per value column; absent: `default_empty`
  EmptyPolicy default_empty = EmptyPolicy::Missing;
  bool shared_span = true;                         ///< every group over the span of all rows, or its own
};

/// A user's choices per column, in order: (column, choice); the column ""
/// sets the default for the columns not named.
using ColumnChoices = std::vector<std::pair<std::string, std::string>>;

/// Sets the aggregations, or the empty-interval policies, from a user's
/// choices (names read by parse_aggregation or parse_empty_policy; an error
/// names `where`). A later choice for a column replaces an earlier one.
void set_aggregations(RegularizeOptions& options, const ColumnChoices& choices, const std::string& where);
void set_empty_policies(RegularizeOptions& options, const ColumnChoices& choices, const std::string& where);

/// What happened to one series (group × variable) on its grid.
struct RegularizeCounts {
  std::size_t bins = 0;
  std::size_t filled_bins = 0;     ///< bins with a value
  std::size_t empty_bins = 0;      ///< bins with no row (written by the policy)
  std::size_t empty_value_bins = 0;///< bins with rows but only empty cells (missing values)
  std::size_t partial = 0;         ///< bins aggregated over some empty cells
};

/// A regular panel: per group an axis and, per variable, the cell text of
/// each bin ("" = missing).
struct Panel {
  std::string time_column;
  std::vector<std::string> group_columns;
  std::vector<std::string> value_columns;
  std::vector<std::vector<std::string>> group_keys;
  std::vector<TimeAxis> axes;                                   ///< per group
  std::vector<std::vector<std::vector<std::string>>> cells;     ///< cells[group][variable][bin]
  std::vector<std::vector<RegularizeCounts>> counts;            ///< counts[group][variable]
  std::vector<Aggregation> aggregation;                         ///< per variable
  std::vector<EmptyPolicy> empty;                               ///< per variable
};

/// Aggregates raw rows onto the grid. InputError, one line naming the file,
/// line and column: a step that cannot bin these times, an aggregation that
/// does not fit a column (text values), a name in `aggregation` or `empty`
/// that is not a value column.
Panel regularize(const RawData& raw, const RegularizeOptions& options);

/// The panel as CSV. Long: group columns, time, value columns, one row per
/// group and bin. Wide: time, then one column per group × variable labelled
/// "variable[group=key]" (just "variable" without groups); the groups must
/// share one axis.
std::string panel_csv(const Panel& panel, PanelLayout layout);

}  // namespace gapmark::data
