#pragma once
// What is missing in raw data, and how. Two kinds of missing are kept apart:
//  - a missing record: a time on the grid with no row at all (nothing
//    happened, or the logger was down: the data cannot tell which);
//  - a missing value: the row is there but its cell is empty.
// Per group (its rows) and per series (group × variable): the span, the
// step, expected points, records present, missing records and missing
// values, duplicate, out-of-order and off-grid rows (counted, not errors),
// the gap-length distribution, missingness by calendar phase, and a
// screening test for value-dependent missingness.
#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "gapmark/raw_table.hpp"
#include "gapmark/data/value_screen.hpp"
#include "gapmark/time_axis.hpp"

namespace gapmark::data {

/// What a grid point of a series holds.
enum class SlotState : std::uint8_t { Present, MissingValue, MissingRecord };

/// The grid of one group: from its first to its last on-grid row.
struct GroupProfile {
  std::vector<std::pair<std::string, std::string>> keys;  ///< (group column, value); empty for the wide layout
  std::string label;               ///< "pen=A", or "all rows" without groups
  std::size_t rows = 0;            ///< rows in the file
  TimeAxis grid;                   ///< the expected points
  std::size_t present = 0;         ///< grid points with at least one row
  std::size_t missing_records = 0; ///< grid points with no row
  std::size_t duplicates = 0;      ///< rows repeating an earlier row's time
  std::size_t conflicting_duplicates = 0;  ///< of those, with some value cell that differs
  std::size_t out_of_order = 0;    ///< rows earlier than the row before them (file order)
  std::size_t off_grid = 0;        ///< distinct times that fall between grid points
};

/// Gaps of one length: how many, and what they are made of.
struct GapLengthCount {
  std::size_t length = 0, count = 0;
  std::size_t records = 0;  ///< gaps made only of missing records
  std::size_t values = 0;   ///< gaps made only of missing values
  std::size_t mixed = 0;    ///< gaps with both
};

/// Missingness by one calendar phase (hour of day, day of week, month).
struct PhaseMissingness {
  std::string unit;                 ///< "hour", "weekday" (ISO: Monday = 1), "month" or "phase" (of the period, from 0)
  std::vector<int> phases;          ///< the phase values seen
  std::vector<std::size_t> expected, missing;  ///< per phase: grid points and missing ones
};

struct SeriesProfile {
  std::string variable;
  std::size_t group = 0;            ///< index into DataProfile::groups
  std::string label;                ///< "oxygen" or "oxygen[pen=A]"
  std::size_t expected = 0, observed = 0, missing_values = 0, missing_records = 0;
  std::size_t gap_count = 0, longest_gap = 0;
  std::vector<GapLengthCount> gaps;  ///< by length, ascending
  std::vector<PhaseMissingness> phases;
  bool numeric = true;              ///< every present cell is a number
  std::string first_text;           ///< when not numeric: the first cell that is not a number
  std::size_t first_text_line = 0;
  ValueScreen screen;
  std::vector<SlotState> states;    ///< per grid point
  std::vector<double> values;       ///< per grid point, NaN = missing (all NaN when not numeric)

  std::size_t missing() const { return missing_values + missing_records; }
};

struct DataProfile {
  std::string source;
  std::string time_column;
  std::vector<std::string> group_columns;
  std::vector<std::string> value_columns;
  TimeKind kind = TimeKind::Index;
  Step step;
  bool step_given = false;
  std::size_t period = 0;        ///< seasonal period in steps: given, or the step's default (0 = none)
  bool period_given = false;
  std::optional<int> offset_minutes;
  bool utc_z = false;
  std::vector<GroupProfile> groups;
  std::vector<SeriesProfile> series;  ///< group by group, variables in column order
};

struct ProfileOptions {
  std::optional<Step> step;  ///< empty: inferred (the most common spacing, or calendar months)
  std::size_t period = 0;    ///< 0: the step's default; a given period adds missingness by its phase
};

DataProfile profile_data(const RawData& raw, const ProfileOptions& options = {});

/// Readable text: the groups' records, the series' values, gap lengths,
/// phases and the screen.
std::string profile_text(const DataProfile& profile);
/// The same as JSON.
std::string profile_json(const DataProfile& profile);

}  // namespace gapmark::data
