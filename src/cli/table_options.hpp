#pragma once
// Options shared by the commands that read one wide CSV.
#include <CLI/CLI.hpp>
#include <optional>
#include <string>
#include <vector>

#include "gapmark/table_io.hpp"

namespace gapmark::cli {

struct TableOptions {
  std::string input;
  std::vector<std::string> columns;
  std::string time_column;
  std::string step;
  std::size_t period = 0;

  void declare(CLI::App& cmd) {
    cmd.add_option("INPUT", input, "Wide CSV: a time column, then one column per variable")->required();
    cmd.add_option("--column,-c", columns, "A column to work on (repeat; default: every variable column)");
    cmd.add_option("--time-column", time_column, "Name of the time column (default: the first column)");
    cmd.add_option("--step", step, "The time step as an ISO 8601 duration (PT1H, P1D, P1M) or an integer (default: inferred)");
    cmd.add_option("--period", period, "Seasonal period in steps (default: 24 for hourly, 7 for daily, 12 for monthly ...)");
  }

  WideTable read() const {
    WideReadOptions o;
    o.time_column = time_column;
    if (!step.empty()) o.step = Step::parse(step, "--step");
    return read_wide_csv(input, o);
  }
};

}  // namespace gapmark::cli
