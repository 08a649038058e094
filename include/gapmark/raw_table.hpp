#pragma once
// Raw rows as they arrive: event or transaction rows and sensor logs, in the
// wide layout (a time column and value columns) or the long layout (group
// columns, a time column, value columns). Rows may be irregular, unsorted,
// duplicated or absent; nothing here puts them on a grid. Times are parsed
// once (ISO 8601 or integers) and value cells are kept as written.
#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "gapmark/table_io.hpp"
#include "gapmark/time_axis.hpp"

namespace gapmark {

struct RawReadOptions {
  std::string time_column;                 ///< empty: the first column that is not a group column
  std::vector<std::string> group_columns;  ///< empty: one group (the wide layout)
  std::vector<std::string> value_columns;  ///< empty: every other column
  /// Convert every time to this UTC offset (minutes). Times written with an
  /// offset are shifted to it; times written without one are taken to be at
  /// it already. Without it, every time must carry the same offset (or none).
  std::optional<int> utc_offset_minutes;
};

/// One group: its key values (one per group column) and its rows, in file order.
struct RawGroup {
  std::vector<std::string> keys;
  std::vector<std::size_t> rows;
};

struct RawData {
  std::string source;                      ///< file name, for messages
  std::string time_column;
  std::vector<std::string> group_columns;
  std::vector<std::string> value_columns;
  TimeKind kind = TimeKind::Index;
  std::optional<int> offset_minutes;       ///< the offset every time is at (none for naive times)
  bool utc_z = false;                      ///< write a zero offset as "Z"
  std::vector<std::int64_t> times;         ///< per row: wall-clock seconds at the offset, or the integer
  std::vector<std::size_t> lines;          ///< per row: its file line
  std::vector<std::vector<std::string>> cells;  ///< cells[value column][row], as written
  std::vector<RawGroup> groups;            ///< in order of first appearance

  std::size_t row_count() const { return times.size(); }
  /// "data.csv:14", for messages about row `row`.
  std::string where(std::size_t row) const;
  /// The value column's index; InputError naming the file when absent.
  std::size_t value_index(const std::string& name) const;
  /// The group's (column, key) pairs, as a Series holds them.
  std::vector<std::pair<std::string, std::string>> group_pairs(std::size_t group) const;
};

/// Reads raw rows from parsed CSV. Errors are one line naming the file, line
/// and column: a missing column, an empty or unparseable time, times of mixed
/// kinds (dates and date-times), mixed UTC offsets (without a target offset).
RawData parse_raw(const CsvTable& csv, const RawReadOptions& options = {});
RawData read_raw(const std::filesystem::path& path, const RawReadOptions& options = {});

/// Splits "site,pen" (or repeated options) into column names, dropping blanks.
std::vector<std::string> split_names(const std::vector<std::string>& items);

/// Parses a UTC offset "+01:00", "-0530", "Z" into minutes; InputError naming `where`.
int parse_utc_offset(const std::string& text, const std::string& where);

}  // namespace gapmark
