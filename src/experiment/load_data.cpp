// Loading the data a spec names: wide files (a time column, one column per
// variable) give one series per column; long files with "groups" (group
// columns, time, value columns) give one series per group × column,
// labelled "column[site=A]".
#include <algorithm>
#include <map>

#include "gapmark/long_layout.hpp"
#include "gapmark/error.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/hash.hpp"
#include "gapmark/table_io.hpp"
#include "gapmark/text_safety.hpp"

namespace gapmark {
namespace {

void set_period(Series& s, const DataSource& src) {
  if (src.period) s.period = src.period;
  if (auto it = src.column_periods.find(s.name); it != src.column_periods.end()) s.period = it->second;
}

void check_observed(const Series& s, const DataSource& src) {
  if (s.observed_count() == 0)
    throw InputError(src.path.string(), (s.groups.empty() ? "column '" : "series '") + s.label() + "' has no observed values");
}

std::vector<Series> load_wide(const CsvTable& csv, const DataSource& src, const std::string& spec_source) {
  WideReadOptions options{src.time_column, src.step};
  const WideTable table = parse_wide_csv(csv, options);
  const std::vector<std::string> columns = src.columns.empty() ? table.columns : src.columns;
  std::vector<Series> out;
  for (std::size_t k = 0; k < columns.size(); ++k) {
    std::size_t c = 0;
    try {
      c = table.column_index(columns[k]);
    } catch (const InputError&) {
      throw InputError(spec_source + ": " + src.where + "/columns/" + std::to_string(k),
                       "no column '" + columns[k] + "' in " + src.path.string());
    }
    Series s;
    s.name = columns[k];
    s.axis = table.axis;
    s.values = table.values[c];
    s.period = table.axis.default_period();
    out.push_back(std::move(s));
  }
  return out;
}

std::vector<Series> load_long(const CsvTable& csv, const DataSource& src, const std::string& spec_source) {
  LongReadOptions options;
  options.time_column = src.time_column;
  options.group_columns = src.groups;
  options.value_columns = src.columns;
  options.step = src.step;
  for (std::size_t k = 0; k < src.groups.size(); ++k)
    if (std::find(csv.header.begin(), csv.header.end(), src.groups[k]) == csv.header.end())
      throw InputError(spec_source + ": " + src.where + "/groups/" + std::to_string(k),
                       "no column '" + src.groups[k] + "' in " + src.path.string());
  for (std::size_t k = 0; k < src.columns.size(); ++k)
    if (std::find(csv.header.begin(), csv.header.end(), src.columns[k]) == csv.header.end())
      throw InputError(spec_source + ": " + src.where + "/columns/" + std::to_string(k),
                       "no column '" + src.columns[k] + "' in " + src.path.string());
  return read_long_series(csv, options);
}

}  // namespace

LoadedData load_data(const ExperimentSpec& spec) {
  LoadedData out;
  std::map<std::string, std::size_t> seen;
  for (std::size_t d = 0; d < spec.data.size(); ++d) {
    const DataSource& src = spec.data[d];
    const std::string text = read_text_file(src.path);
    out.input_sha256.push_back(sha256_hex(text));
    const CsvTable csv = parse_csv(text, src.path.string());
    std::vector<Series> series = src.groups.empty() ? load_wide(csv, src, spec.source) : load_long(csv, src, spec.source);
    for (const auto& column_period : src.column_periods) {
      const std::string& column = column_period.first;
      if (std::none_of(series.begin(), series.end(), [&](const Series& s) { return s.name == column; }))
        throw InputError(spec.source + ": " + src.where + "/periods/" + printable(column),
                         "no series column " + quoted_for_message(column) + " in " + src.path.string() +
                             " (periods name the columns of this data entry)");
    }
    for (Series& s : series) {
      if (auto unit = spec.units.find(s.name); unit != spec.units.end()) s.units = unit->second;
      set_period(s, src);
      check_observed(s, src);
      out.series.push_back(std::move(s));
      out.dataset.push_back(d);
    }
  }
  for (const auto& unit : spec.units)
    if (std::none_of(out.series.begin(), out.series.end(), [&](const Series& s) { return s.name == unit.first; }))
      throw InputError(spec.source + ": /units/" + printable(unit.first),
                       "no series column " + quoted_for_message(unit.first) +
                           " in the data (units name the columns of the data entries)");
  // Labels must be unique across the spec: prefix clashing names with their file's stem.
  for (const auto& s : out.series) ++seen[s.label()];
  for (std::size_t i = 0; i < out.series.size(); ++i)
    if (seen[out.series[i].label()] > 1)
      out.series[i].name = spec.data[out.dataset[i]].path.stem().string() + "/" + out.series[i].name;
  return out;
}

}  // namespace gapmark
