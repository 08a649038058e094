// Regular long-layout tables: groups' rows checked onto their grids, as
// series or side by side in a wide table, and back (see long_layout.hpp).
#include "gapmark/long_layout.hpp"

#include <algorithm>
#include <cmath>

#include "gapmark/raw_table.hpp"
#include "gapmark/time_grid.hpp"
#include "gapmark/error.hpp"
#include "gapmark/text_safety.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark {
namespace {

struct GroupAxes {
  RawData raw;
  std::vector<TimeAxis> axes;  ///< per group; row k of group g is point k of its axis
};

GroupAxes read_groups(const CsvTable& csv, const LongReadOptions& options) {
  if (options.group_columns.empty()) throw InputError(csv.source, "the long layout needs at least one group column");
  RawReadOptions raw_options;
  raw_options.time_column = options.time_column;
  raw_options.group_columns = options.group_columns;
  raw_options.value_columns = options.value_columns;
  GroupAxes out{parse_raw(csv, raw_options), {}};
  const RawData& raw = out.raw;

  std::optional<Step> step = options.step;
  if (!step) {
    std::vector<std::int64_t> runs;
    std::vector<std::size_t> ends;
    for (const auto& g : raw.groups) {
      for (std::size_t r : g.rows) runs.push_back(raw.times[r]);
      std::sort(runs.end() - std::ptrdiff_t(g.rows.size()), runs.end());
      ends.push_back(runs.size());
    }
    step = infer_step(raw.kind, runs, ends);
  }
  for (const auto& g : raw.groups) {
    std::vector<TimePoint> times;
    std::vector<std::size_t> lines;
    for (std::size_t r : g.rows) {
      times.push_back({raw.kind, raw.times[r], raw.offset_minutes, raw.utc_z});
      lines.push_back(raw.lines[r]);
    }
    out.axes.push_back(infer_axis(times, step, raw.source, lines));
  }
  return out;
}

std::vector<double> numbers(const RawData& raw, std::size_t v, const std::vector<std::size_t>& rows) {
  std::vector<double> out;
  out.reserve(rows.size());
  for (std::size_t r : rows) {
    const std::string& cell = raw.cells[v][r];
    if (is_missing_token(cell)) {
      out.push_back(std::nan(""));
      continue;
    }
    const auto x = parse_double(cell);
    if (!x) throw InputError(raw.where(r), "column '" + raw.value_columns[v] + "': not a number: " + quoted_for_message(cell));
    if (!std::isfinite(*x))
      throw InputError(raw.where(r), "column '" + raw.value_columns[v] + "': not a finite number: '" + cell + "'");
    out.push_back(*x);
  }
  return out;
}

std::string label_of(const std::string& variable, const std::vector<std::string>& columns,
                     const std::vector<std::string>& keys) {
  std::string out = variable + "[";
  for (std::size_t g = 0; g < columns.size(); ++g) out += (g ? "," : "") + columns[g] + "=" + keys[g];
  return out + "]";
}

}  // namespace

std::vector<Series> read_long_series(const CsvTable& csv, const LongReadOptions& options) {
  const GroupAxes groups = read_groups(csv, options);
  const RawData& raw = groups.raw;
  std::vector<Series> out;
  for (std::size_t g = 0; g < raw.groups.size(); ++g)
    for (std::size_t v = 0; v < raw.value_columns.size(); ++v) {
      Series s;
      s.name = raw.value_columns[v];
      s.groups = raw.group_pairs(g);
      s.axis = groups.axes[g];
      s.values = numbers(raw, v, raw.groups[g].rows);
      s.period = s.axis.default_period();
      out.push_back(std::move(s));
    }
  return out;
}

LongAsWide long_to_wide(const CsvTable& csv, const LongReadOptions& options) {
  const GroupAxes groups = read_groups(csv, options);
  const RawData& raw = groups.raw;
  LongAsWide out;
  out.group_columns = raw.group_columns;
  out.variables = raw.value_columns;

  // The union of the spans, on the grid of the earliest group.
  std::size_t first = 0;
  for (std::size_t g = 1; g < groups.axes.size(); ++g)
    if (groups.axes[g].start() < groups.axes[first].start()) first = g;
  const TimeAxis& base = groups.axes[first];
  std::vector<std::int64_t> offsets;
  std::int64_t end = 0;
  for (std::size_t g = 0; g < groups.axes.size(); ++g) {
    const TimeAxis& a = groups.axes[g];
    const auto k = grid_offset(raw.kind, base.step(), base.start(), a.start(), base.style().month_day);
    if (!k || a.step() != base.step())
      throw InputError(raw.where(raw.groups[g].rows.front()),
                       "group '" + [&] {
                         const std::string l = label_of("", raw.group_columns, raw.groups[g].keys);
                         return l.substr(1, l.size() - 2);
                       }() +
                           "' is not on the same time grid as the others (step " + a.step().iso() + " from " +
                           a.format(0) + "); regularize the groups over a shared span first");
    offsets.push_back(*k);
    end = std::max(end, *k + std::int64_t(a.size()));
  }
  WideTable& t = out.table;
  t.source = raw.source;
  t.time_header = raw.time_column;
  t.axis = TimeAxis(base.kind(), base.step(), base.start(), static_cast<std::size_t>(end), base.offset_minutes(),
                    base.style());
  for (std::size_t i = 0; i < t.axis.size(); ++i) t.time_text.push_back(t.axis.format(i));
  for (std::size_t g = 0; g < raw.groups.size(); ++g) {
    out.group_keys.push_back(raw.groups[g].keys);
    const auto from = static_cast<std::size_t>(offsets[g]);
    out.spans.emplace_back(from, from + groups.axes[g].size());
    for (std::size_t v = 0; v < raw.value_columns.size(); ++v) {
      t.columns.push_back(label_of(raw.value_columns[v], raw.group_columns, raw.groups[g].keys));
      std::vector<double> values(t.axis.size(), std::nan(""));
      std::vector<std::string> cells(t.axis.size());
      const auto x = numbers(raw, v, raw.groups[g].rows);
      for (std::size_t k = 0; k < x.size(); ++k) {
        values[from + k] = x[k];
        cells[from + k] = raw.cells[v][raw.groups[g].rows[k]];
      }
      t.values.push_back(std::move(values));
      t.cells.push_back(std::move(cells));
    }
  }
  return out;
}

std::string long_csv(const LongAsWide& layout, const WideTable& table, const std::vector<ExtraColumn>& extra) {
  const std::size_t nv = layout.variables.size();
  // Extra columns: "<label><suffix>" -> long column "<variable><suffix>".
  std::vector<std::string> extra_names;
  std::vector<std::vector<std::ptrdiff_t>> extra_of;  // [long extra column][table column] -> index into `extra` or -1
  for (std::size_t e = 0; e < extra.size(); ++e) {
    const std::string& name = extra[e].first;
    std::size_t column = table.columns.size(), best = 0;
    for (std::size_t c = 0; c < table.columns.size(); ++c)
      if (name.rfind(table.columns[c], 0) == 0 && table.columns[c].size() > best) column = c, best = table.columns[c].size();
    if (column == table.columns.size()) throw InputError(table.source, "extra column '" + name + "' belongs to no series");
    const std::string long_name = layout.variables[column % nv] + name.substr(best);
    auto it = std::find(extra_names.begin(), extra_names.end(), long_name);
    if (it == extra_names.end()) {
      extra_names.push_back(long_name);
      extra_of.emplace_back(table.columns.size(), -1);
      it = extra_names.end() - 1;
    }
    extra_of[std::size_t(it - extra_names.begin())][column] = std::ptrdiff_t(e);
  }
  std::vector<std::string> header = layout.group_columns;
  header.push_back(table.time_header);
  header.insert(header.end(), layout.variables.begin(), layout.variables.end());
  header.insert(header.end(), extra_names.begin(), extra_names.end());
  std::vector<std::vector<std::string>> rows;
  for (std::size_t g = 0; g < layout.group_keys.size(); ++g)
    for (std::size_t i = layout.spans[g].first; i < layout.spans[g].second; ++i) {
      std::vector<std::string> row = layout.group_keys[g];
      row.push_back(table.time_text[i]);
      for (std::size_t v = 0; v < nv; ++v) row.push_back(table.cells[g * nv + v][i]);
      for (std::size_t x = 0; x < extra_names.size(); ++x) {
        std::string cell;
        for (std::size_t v = 0; v < nv && cell.empty(); ++v)
          if (const auto e = extra_of[x][g * nv + v]; e >= 0) cell = extra[std::size_t(e)].second[i];
        row.push_back(cell);
      }
      rows.push_back(std::move(row));
    }
  return to_csv(header, rows);
}

}  // namespace gapmark
