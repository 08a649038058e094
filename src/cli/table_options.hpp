#pragma once
// Options shared by the commands that read one table: a wide CSV, or with
// --group a long-layout CSV (group columns, time, value columns) whose
// groups are laid side by side as columns "variable[site=A]".
#include <CLI/CLI.hpp>
#include <optional>
#include <string>
#include <vector>

#include "gapmark/error.hpp"
#include "gapmark/long_layout.hpp"
#include "gapmark/raw_table.hpp"
#include "gapmark/table_io.hpp"
#include "gapmark/wide_write.hpp"
#include "number_options.hpp"

namespace gapmark::cli {

/// How to read a raw table, from the --time-column, --group and --column
/// options of `profile` and `regularize`.
inline RawReadOptions raw_read_options(const std::string& time_column, const std::vector<std::string>& group,
                                       const std::vector<std::string>& columns) {
  RawReadOptions read;
  read.time_column = time_column;
  read.group_columns = split_names(group);
  read.value_columns = split_names(columns);
  return read;
}

struct TableOptions {
  std::string input;
  std::vector<std::string> columns;
  std::string time_column;
  std::string step;
  std::size_t period = 0;
  std::vector<std::string> group;

  void declare(CLI::App& cmd) {
    cmd.add_option("INPUT", input, "Wide CSV: a time column, then one column per variable (long layout with --group)")->required();
    cmd.add_option("--column,-c", columns, "A column to work on (repeat; default: every variable column)");
    cmd.add_option("--time-column", time_column, "Name of the time column (default: the first column)");
    cmd.add_option("--step", step, "The time step as an ISO 8601 duration (PT1H, P1D, P1M) or an integer (default: inferred)");
    cmd.add_option("--period", period, "Seasonal period in steps (default: 24 for hourly, 7 for daily, 12 for monthly ...)")
        ->check(whole_number(0, 1000000));
    cmd.add_option("--group", group,
                   "Group columns of a long-layout CSV (COL or COL,COL): each group x variable is worked on as the "
                   "series 'variable[COL=value]'");
  }

  /// Reads the table. With --group the long layout is read and its groups
  /// laid side by side; only the --column variables are kept, and `columns`
  /// is then cleared, so every column of the returned table is selected.
  WideTable read() {
    for (std::size_t i = 0; i < columns.size(); ++i)
      for (std::size_t k = 0; k < i; ++k)
        if (columns[i] == columns[k])
          throw InputError("--column", "'" + columns[i] + "' is given twice; name each column once");
    std::optional<Step> parsed;
    if (!step.empty()) parsed = Step::parse(step, "--step");
    const auto groups = split_names(group);
    if (groups.empty()) {
      WideReadOptions o;
      o.time_column = time_column;
      o.step = parsed;
      return read_wide_csv(input, o);
    }
    LongReadOptions o;
    o.time_column = time_column;
    o.group_columns = groups;
    o.value_columns = columns;
    o.step = parsed;
    long_layout_ = long_to_wide(read_csv(input), o);
    columns.clear();
    return long_layout_->table;
  }

  /// The table as CSV in the layout it was read in (long with --group).
  std::string write(const WideTable& table, const std::vector<ExtraColumn>& extra = {}) const {
    return long_layout_ ? long_csv(*long_layout_, table, extra) : write_wide_csv(table, extra);
  }

private:
  std::optional<LongAsWide> long_layout_;
};

}  // namespace gapmark::cli
