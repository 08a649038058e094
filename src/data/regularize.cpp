// Regularizing raw rows: calendar bins, per-bin aggregation, empty-bin
// policies, and the panel written long or wide (see regularize.hpp).
#include "gapmark/data/regularize.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "decimal_sum.hpp"
#include "gapmark/time_grid.hpp"
#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark::data {
namespace {

constexpr std::int64_t kDay = 86400;

std::string join(const std::vector<std::string>& names) {
  std::string out;
  for (const auto& n : names) out += (out.empty() ? "" : ", ") + n;
  return out;
}

/// One bin's running state for one variable.
struct Accumulator {
  std::size_t rows = 0, values = 0;
  DecimalSum sum;
  double min = std::numeric_limits<double>::infinity(), max = -std::numeric_limits<double>::infinity();
  std::string min_text, max_text, last_text;
  std::int64_t last_time = std::numeric_limits<std::int64_t>::min();

  void add_row() { ++rows; }
  void add_value(double x, const std::string& cell, std::int64_t time) {
    ++values;
    sum.add(cell, x);
    if (x < min) min = x, min_text = cell;
    if (x > max) max = x, max_text = cell;
    if (time >= last_time) last_time = time, last_text = cell;  // rows come in file order
  }
};

std::string result(const Accumulator& a, Aggregation agg, EmptyPolicy empty, RegularizeCounts& counts) {
  if (a.rows == 0) {
    ++counts.empty_bins;
    return empty == EmptyPolicy::Zero ? "0" : "";
  }
  if (a.values == 0) {
    ++counts.empty_value_bins;
    return "";
  }
  ++counts.filled_bins;
  if (a.values < a.rows) ++counts.partial;
  switch (agg) {
    case Aggregation::Sum: return a.sum.text();
    case Aggregation::Count: return std::to_string(a.values);
    case Aggregation::Mean: return format_double(a.sum.value() / double(a.values));
    case Aggregation::Min: return a.min_text;
    case Aggregation::Max: return a.max_text;
    case Aggregation::Last: return a.last_text;
  }
  return "";
}

/// The kind of times the panel writes: dates when the bins are whole days or
/// longer and the times carry no offset, else as read.
TimeKind output_kind(const RawData& raw, const Step& step) {
  if (raw.kind != TimeKind::DateTime || raw.offset_minutes) return raw.kind;
  if (step.unit == Step::Unit::Months || (step.unit == Step::Unit::Seconds && step.amount % kDay == 0))
    return TimeKind::Date;
  return raw.kind;
}

std::string label(const std::string& variable, const std::vector<std::string>& group_columns,
                  const std::vector<std::string>& keys) {
  if (group_columns.empty()) return variable;
  std::string out = variable + "[";
  for (std::size_t g = 0; g < group_columns.size(); ++g) out += (g ? "," : "") + group_columns[g] + "=" + keys[g];
  return out + "]";
}

}  // namespace

Aggregation parse_aggregation(const std::string& text, const std::string& where) {
  static const std::pair<const char*, Aggregation> names[] = {{"sum", Aggregation::Sum},   {"count", Aggregation::Count},
                                                              {"mean", Aggregation::Mean}, {"min", Aggregation::Min},
                                                              {"max", Aggregation::Max},   {"last", Aggregation::Last}};
  for (const auto& [name, a] : names)
    if (text == name) return a;
  throw InputError(where, "unknown aggregation '" + text + "' (known: sum, count, mean, min, max, last)");
}

EmptyPolicy parse_empty_policy(const std::string& text, const std::string& where) {
  if (text == "zero") return EmptyPolicy::Zero;
  if (text == "missing") return EmptyPolicy::Missing;
  throw InputError(where, "unknown empty-interval policy '" + text +
                              "' (zero: no row means nothing happened; missing: no row means no observation)");
}

std::string aggregation_name(Aggregation a) {
  switch (a) {
    case Aggregation::Sum: return "sum";
    case Aggregation::Count: return "count";
    case Aggregation::Mean: return "mean";
    case Aggregation::Min: return "min";
    case Aggregation::Max: return "max";
    case Aggregation::Last: return "last";
  }
  return "";
}

std::string empty_policy_name(EmptyPolicy e) { return e == EmptyPolicy::Zero ? "zero" : "missing"; }

void set_aggregations(RegularizeOptions& options, const ColumnChoices& choices, const std::string& where) {
  for (const auto& [column, name] : choices) {
    const Aggregation a = parse_aggregation(name, where);
    if (column.empty()) options.default_aggregation = a;
    else options.aggregation[column] = a;
  }
}

void set_empty_policies(RegularizeOptions& options, const ColumnChoices& choices, const std::string& where) {
  for (const auto& [column, name] : choices) {
    const EmptyPolicy e = parse_empty_policy(name, where);
    if (column.empty()) options.default_empty = e;
    else options.empty[column] = e;
  }
}

namespace {

/// Every column named in the options is a value column.
void check_named_columns(const RawData& raw, const RegularizeOptions& options) {
  for (const auto& [name, a] : options.aggregation)
    if (std::find(raw.value_columns.begin(), raw.value_columns.end(), name) == raw.value_columns.end())
      throw InputError(raw.source + ":1", "an aggregation is given for '" + name +
                                              "', which is not a value column (value columns: " + join(raw.value_columns) + ")");
  for (const auto& [name, e] : options.empty)
    if (std::find(raw.value_columns.begin(), raw.value_columns.end(), name) == raw.value_columns.end())
      throw InputError(raw.source + ":1", "an empty-interval policy is given for '" + name +
                                              "', which is not a value column (value columns: " + join(raw.value_columns) + ")");
}

/// The panel's columns, and each variable's aggregation and empty-interval policy.
Panel panel_columns(const RawData& raw, const RegularizeOptions& options) {
  Panel panel;
  panel.time_column = raw.time_column;
  panel.group_columns = raw.group_columns;
  panel.value_columns = raw.value_columns;
  for (const auto& name : raw.value_columns) {
    auto a = options.aggregation.find(name);
    panel.aggregation.push_back(a == options.aggregation.end() ? options.default_aggregation : a->second);
    auto e = options.empty.find(name);
    panel.empty.push_back(e == options.empty.end() ? options.default_empty : e->second);
  }
  return panel;
}

/// Every value parsed once, numbers[variable][row] (NaN: empty); text is an
/// error unless the column is counted.
std::vector<std::vector<double>> parse_values(const RawData& raw, const Panel& panel) {
  const std::size_t nv = raw.value_columns.size();
  std::vector<std::vector<double>> numbers(nv, std::vector<double>(raw.row_count(), std::nan("")));
  for (std::size_t v = 0; v < nv; ++v)
    for (std::size_t r = 0; r < raw.row_count(); ++r) {
      const std::string& cell = raw.cells[v][r];
      if (is_missing_token(cell)) continue;
      const auto x = parse_double(cell);
      if (x && std::isfinite(*x)) {
        numbers[v][r] = *x;
      } else if (panel.aggregation[v] == Aggregation::Count) {
        numbers[v][r] = 1;  // counted, never summed
      } else {
        throw InputError(raw.where(r), "column '" + raw.value_columns[v] + "': aggregation '" +
                                           aggregation_name(panel.aggregation[v]) + "' does not fit the value '" +
                                           std::string(trim(cell)) + "' (not a number); count it with --agg " +
                                           raw.value_columns[v] + "=count, or leave the column out");
      }
    }
  return numbers;
}

/// The rows and their parsed values, and the bins they fall in.
struct BinnedRows {
  const RawData& raw;
  const std::vector<std::vector<double>>& numbers;
  const Binning& bins;
  std::int64_t all_lo, all_hi;  ///< the span of all rows
  bool shared_span;
};

/// One group's grid, aggregated bin by bin, added to the panel.
void add_group(Panel& panel, const BinnedRows& in, const RawGroup& group) {
  const RawData& raw = in.raw;
  const std::size_t nv = raw.value_columns.size();
  std::int64_t lo = in.all_lo, hi = in.all_hi;
  if (!in.shared_span) {
    lo = std::numeric_limits<std::int64_t>::max();
    hi = std::numeric_limits<std::int64_t>::min();
    for (std::size_t r : group.rows) lo = std::min(lo, raw.times[r]), hi = std::max(hi, raw.times[r]);
  }
  const TimeAxis axis = in.bins.axis(lo, hi, raw.offset_minutes, raw.utc_z);
  std::vector<std::vector<Accumulator>> acc(nv, std::vector<Accumulator>(axis.size()));
  for (std::size_t r : group.rows) {
    const std::size_t b = in.bins.index(axis, raw.times[r]);
    for (std::size_t v = 0; v < nv; ++v) {
      acc[v][b].add_row();
      if (!std::isnan(in.numbers[v][r])) acc[v][b].add_value(in.numbers[v][r], std::string(trim(raw.cells[v][r])), raw.times[r]);
    }
  }
  std::vector<std::vector<std::string>> cells(nv, std::vector<std::string>(axis.size()));
  std::vector<RegularizeCounts> counts(nv);
  for (std::size_t v = 0; v < nv; ++v) {
    counts[v].bins = axis.size();
    for (std::size_t b = 0; b < axis.size(); ++b)
      cells[v][b] = result(acc[v][b], panel.aggregation[v], panel.empty[v], counts[v]);
  }
  panel.group_keys.push_back(group.keys);
  panel.axes.push_back(axis);
  panel.cells.push_back(std::move(cells));
  panel.counts.push_back(std::move(counts));
}

}  // namespace

Panel regularize(const RawData& raw, const RegularizeOptions& options) {
  check_binning_step(raw.kind, options.step, "--step");
  check_named_columns(raw, options);
  Panel panel = panel_columns(raw, options);
  const std::vector<std::vector<double>> numbers = parse_values(raw, panel);
  const TimeKind kind = output_kind(raw, options.step);
  std::int64_t all_lo = std::numeric_limits<std::int64_t>::max(), all_hi = std::numeric_limits<std::int64_t>::min();
  for (std::int64_t t : raw.times) all_lo = std::min(all_lo, t), all_hi = std::max(all_hi, t);
  const Binning bins(kind, options.step, all_lo);
  const BinnedRows in{.raw = raw, .numbers = numbers, .bins = bins, .all_lo = all_lo, .all_hi = all_hi,
                      .shared_span = options.shared_span};
  for (const RawGroup& group : raw.groups) add_group(panel, in, group);
  return panel;
}

std::string panel_csv(const Panel& panel, PanelLayout layout) {
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
  const std::size_t nv = panel.value_columns.size();
  if (layout == PanelLayout::Long) {
    header = panel.group_columns;
    header.push_back(panel.time_column);
    header.insert(header.end(), panel.value_columns.begin(), panel.value_columns.end());
    for (std::size_t g = 0; g < panel.axes.size(); ++g)
      for (std::size_t b = 0; b < panel.axes[g].size(); ++b) {
        std::vector<std::string> row = panel.group_keys[g];
        row.push_back(panel.axes[g].format(b));
        for (std::size_t v = 0; v < nv; ++v) row.push_back(panel.cells[g][v][b]);
        rows.push_back(std::move(row));
      }
    return to_csv(header, rows);
  }
  for (std::size_t g = 1; g < panel.axes.size(); ++g)
    if (panel.axes[g].start() != panel.axes[0].start() || panel.axes[g].size() != panel.axes[0].size())
      throw InputError("--layout", "the wide layout needs one time axis for every group; use --span shared, or --layout long");
  header.push_back(panel.time_column);
  for (std::size_t g = 0; g < panel.axes.size(); ++g)
    for (std::size_t v = 0; v < nv; ++v) header.push_back(label(panel.value_columns[v], panel.group_columns, panel.group_keys[g]));
  const std::size_t n = panel.axes.empty() ? 0 : panel.axes[0].size();
  for (std::size_t b = 0; b < n; ++b) {
    std::vector<std::string> row{panel.axes[0].format(b)};
    for (std::size_t g = 0; g < panel.axes.size(); ++g)
      for (std::size_t v = 0; v < nv; ++v) row.push_back(panel.cells[g][v][b]);
    rows.push_back(std::move(row));
  }
  return to_csv(header, rows);
}

}  // namespace gapmark::data
