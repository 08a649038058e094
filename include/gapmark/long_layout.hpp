#pragma once
// Regular data in the long layout: group columns, a time column and value
// columns, one row per group and time. Each group's rows must already form a
// regular grid (sorted, one row per time, no time skipped: what
// `gapmark regularize` writes); each group × variable becomes a Series whose
// `groups` field holds the keys, labelled "variable[site=A]".
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "gapmark/series.hpp"
#include "gapmark/table_io.hpp"
#include "gapmark/wide_write.hpp"

namespace gapmark {

struct LongReadOptions {
  std::string time_column;                 ///< empty: the first column that is not a group column
  std::vector<std::string> group_columns;  ///< at least one
  std::vector<std::string> value_columns;  ///< empty: every other column
  std::optional<Step> step;                ///< empty: inferred from all groups
};

/// One Series per group × variable, groups in order of first appearance,
/// variables in column order; each group on its own span. Errors name the
/// file, line and column (an irregular or unsorted group, a duplicate time,
/// a cell that is not a number).
std::vector<Series> read_long_series(const CsvTable& csv, const LongReadOptions& options);

/// The groups of a long table side by side: a wide table over the union of
/// the groups' spans (every group on one grid) with one column per group ×
/// variable labelled "variable[site=A]", and what is needed to write it back
/// in the long layout.
struct LongAsWide {
  WideTable table;
  std::vector<std::string> group_columns;
  std::vector<std::vector<std::string>> group_keys;
  std::vector<std::string> variables;
  std::vector<std::pair<std::size_t, std::size_t>> spans;  ///< per group: [first, end) rows of table.axis
  /// table column of group g, variable v: g * variables.size() + v.
};
LongAsWide long_to_wide(const CsvTable& csv, const LongReadOptions& options);

/// Writes `table` (shaped like layout.table, its cells possibly changed)
/// back in the long layout, each group over its own span. An extra column
/// named "<label><suffix>" (such as "oxygen[pen=A]_filled") becomes the long
/// column "<variable><suffix>".
std::string long_csv(const LongAsWide& layout, const WideTable& table, const std::vector<ExtraColumn>& extra = {});

}  // namespace gapmark
