// `gapmark regularize`: raw rows onto a regular grid, aggregated per
// interval, with an empty-interval policy per variable.
#include <filesystem>
#include <map>
#include <iostream>

#include "commands.hpp"
#include "output_rules.hpp"
#include "table_options.hpp"
#include "gapmark/data/regularize.hpp"
#include "gapmark/data/regularize_report.hpp"
#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark::cli {
namespace {

/// Parses "col=value,col=value" (repeatable); a bare "value" sets the default (key "").
/// A column or the default may be named once.
data::ColumnChoices column_choices(const std::vector<std::string>& items, const std::string& option) {
  std::map<std::string, std::string> out;
  for (const auto& item : split_names(items)) {
    const auto eq = item.find('=');
    const std::string key = eq == std::string::npos ? "" : std::string(trim(item.substr(0, eq)));
    const std::string value = std::string(trim(eq == std::string::npos ? item : item.substr(eq + 1)));
    if (value.empty() || (eq != std::string::npos && key.empty()))
      throw InputError(option, "expected COLUMN=VALUE or VALUE, found '" + item + "'");
    if (!out.emplace(key, value).second) throw InputError(option, "'" + (key.empty() ? value : key) + "' is given twice");
  }
  return {out.begin(), out.end()};
}

}  // namespace

void add_regularize(CLI::App& app, Action& action) {
  struct Options {
    std::string input, out, step, time_column, layout, span = "shared", utc_offset;
    std::vector<std::string> group, columns, agg, empty;
    bool force = false;
  };
  auto o = std::make_shared<Options>();
  auto* cmd = app.add_subcommand("regularize", "Put raw rows on a regular time grid: aggregate each interval, choose what an empty interval means");
  cmd->add_option("INPUT", o->input, "CSV of rows: time, value columns, and group columns with --group; any order, any spacing")->required();
  cmd->add_option("--step", o->step, "Grid step, ISO 8601: PT15M, PT1H, P1D, P1W (weeks start Monday), P1M, P3M, P1Y")->required();
  cmd->add_option("--out,-o", o->out, "Output CSV")->required();
  cmd->add_option("--group", o->group, "Group columns (COL or COL,COL): each group gets its own grid");
  cmd->add_option("--column,-c", o->columns, "A value column to keep (repeat; default: every column but the time and groups)");
  cmd->add_option("--time-column", o->time_column, "Name of the time column (default: the first column that is not a group)");
  cmd->add_option("--agg", o->agg, "Aggregation per column: COL=sum|count|mean|min|max|last, comma-separated; a bare name sets the default (mean)");
  cmd->add_option("--empty", o->empty,
                  "What an interval without rows means, per column: COL=zero (nothing happened: counts, totals) or "
                  "COL=missing (no observation: readings; the default); a bare word sets the default");
  cmd->add_option("--layout", o->layout, "Output layout: long (group columns, time, values) or wide (time, one column per group x variable); default: long with groups, else wide")
      ->check(CLI::IsMember({"wide", "long"}));
  cmd->add_option("--span", o->span, "Each group's grid covers the span of all rows (shared) or its own rows (own)")
      ->check(CLI::IsMember({"shared", "own"}))
      ->capture_default_str();
  cmd->add_option("--utc-offset", o->utc_offset, "Convert times written with offsets to this one (+01:00, Z); times without one are taken as at it");
  add_force_flag(*cmd, o->force);
  cmd->footer(
      "Each interval [start, start + step) is labelled by its start. Steps that divide a day start at midnight; P1W and P7D\n"
      "start on Monday 00:00 (ISO 8601 weeks); P1M, P3M, P1Y start on the 1st of the month, quarter, year.\n"
      "Times are taken as written: there is no time-zone database. Local clock times without offsets that cross a\n"
      "daylight-saving change give one interval with two hours of rows (autumn) and one empty interval (spring);\n"
      "times written with their offsets can be brought to one offset with --utc-offset.");
  cmd->callback([&action, o] {
    action = [o] {
      check_output_file(o->out, o->force);
      check_file_is_no_input(o->out, {o->input});
      RawReadOptions read = raw_read_options(o->time_column, o->group, o->columns);
      if (!o->utc_offset.empty()) read.utc_offset_minutes = parse_utc_offset(o->utc_offset, "--utc-offset");
      const RawData raw = read_raw(o->input, read);

      data::RegularizeOptions options;
      options.step = Step::parse(o->step, "--step");
      options.shared_span = o->span == "shared";
      data::set_aggregations(options, column_choices(o->agg, "--agg"), "--agg");
      data::set_empty_policies(options, column_choices(o->empty, "--empty"), "--empty");
      const data::Panel panel = data::regularize(raw, options);
      const bool long_layout = o->layout.empty() ? !raw.group_columns.empty() : o->layout == "long";
      write_file_atomically(o->out, data::panel_csv(panel, long_layout ? data::PanelLayout::Long : data::PanelLayout::Wide));
      std::cerr << data::regularize_report(panel, raw.row_count(), options.step, o->out);
      return kOk;
    };
  });
}

}  // namespace gapmark::cli
