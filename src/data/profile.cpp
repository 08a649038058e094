// Profiling raw rows: lay each group's rows on its grid, then count what is
// there, what is missing and how (see profile.hpp).
#include "gapmark/data/profile.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "gapmark/time_grid.hpp"
#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark::data {
namespace {

constexpr std::int64_t kDay = 86400;

std::string group_label(const std::vector<std::pair<std::string, std::string>>& keys) {
  if (keys.empty()) return "all rows";
  std::string out;
  for (const auto& [column, value] : keys) out += (out.empty() ? "" : ",") + column + "=" + value;
  return out;
}

/// The calendar phases that fit a step: hours and weekdays below a day,
/// weekdays and months for days, months for weeks and months.
std::vector<std::string> phase_units(TimeKind kind, const Step& step) {
  if (kind == TimeKind::Index) return {};
  if (step.unit == Step::Unit::Months) return step.amount < 12 ? std::vector<std::string>{"month"} : std::vector<std::string>{};
  if (step.amount < kDay) return {"hour", "weekday"};
  if (step.amount < 7 * kDay) return {"weekday", "month"};
  return {"month"};
}

int phase_of(const TimeAxis& axis, std::size_t i, const std::string& unit, std::size_t period) {
  if (unit == "phase") return static_cast<int>(i % period);
  if (unit == "hour") return axis.hour_of_day(i);
  if (unit == "weekday") return axis.day_of_week(i);
  return axis.month(i);
}

/// The step: given, or inferred from every group's sorted distinct times.
Step choose_step(const RawData& raw, const ProfileOptions& options, bool& given) {
  given = options.step.has_value();
  if (options.step) {
    check_step_kind(raw.kind, *options.step, "--step");
    return *options.step;
  }
  std::vector<std::int64_t> runs;
  std::vector<std::size_t> ends;
  for (const auto& g : raw.groups) {
    std::vector<std::int64_t> t;
    for (std::size_t r : g.rows) t.push_back(raw.times[r]);
    std::sort(t.begin(), t.end());
    t.erase(std::unique(t.begin(), t.end()), t.end());
    runs.insert(runs.end(), t.begin(), t.end());
    ends.push_back(runs.size());
  }
  if (auto s = infer_step(raw.kind, runs, ends)) return *s;
  // One time per group: nothing to infer from.
  return raw.kind == TimeKind::Index ? Step{} : Step{Step::Unit::Seconds, kDay};
}

struct GroupGrid {
  GroupProfile profile;
  std::vector<std::vector<std::size_t>> slot_rows;  ///< per grid point: its rows in file order
};

/// Rows earlier than the previous row of the group, in file order.
std::size_t count_out_of_order(const RawData& raw, const RawGroup& group) {
  std::size_t n = 0;
  for (std::size_t k = 1; k < group.rows.size(); ++k)
    if (raw.times[group.rows[k]] < raw.times[group.rows[k - 1]]) ++n;
  return n;
}

/// Where a group's grid lies: a row time on it (`through`) and, for monthly
/// steps, the day of the month its points fall on.
struct GridPhase {
  std::int64_t through = 0;
  int month_day = 0;
};

/// The grid's phase is the most common phase key among the rows.
GridPhase choose_grid_phase(const RawData& raw, const RawGroup& group, const Step& step) {
  std::map<std::int64_t, std::size_t> keys;
  for (std::size_t r : group.rows) ++keys[grid_phase_key(raw.kind, step, raw.times[r])];
  std::int64_t key = 0;
  std::size_t best = 0;
  for (const auto& [k, n] : keys)
    if (n > best) key = k, best = n;
  GridPhase out;
  for (std::size_t r : group.rows)
    if (grid_phase_key(raw.kind, step, raw.times[r]) == key) {
      out.through = raw.times[r];
      break;
    }
  out.month_day = step.unit == Step::Unit::Months ? int((key / kDay) % 32) : 0;
  return out;
}

/// The group's distinct times on the grid, each with its offset (in steps)
/// from `phase.through`; counts the duplicates (and those that differ) and
/// the distinct times off the grid in `p`.
std::map<std::int64_t, std::int64_t> on_grid_times(const RawData& raw, const RawGroup& group, const Step& step,
                                                   const GridPhase& phase, GroupProfile& p) {
  std::map<std::int64_t, std::size_t> first_row;  // time -> its first row
  std::map<std::int64_t, std::int64_t> offset_of; // on-grid time -> its offset from `through`
  for (std::size_t r : group.rows) {
    const std::int64_t t = raw.times[r];
    auto [it, added] = first_row.emplace(t, r);
    if (!added) {
      ++p.duplicates;
      const std::size_t f = it->second;
      for (const auto& column : raw.cells)
        if (trim(column[r]) != trim(column[f])) {
          ++p.conflicting_duplicates;
          break;
        }
      continue;
    }
    if (auto k = grid_offset(raw.kind, step, phase.through, t, phase.month_day))
      offset_of.emplace(t, *k);
    else
      ++p.off_grid;
  }
  return offset_of;
}

GroupGrid lay_out_group(const RawData& raw, const RawGroup& group, std::size_t g, const Step& step) {
  GroupGrid out;
  GroupProfile& p = out.profile;
  p.keys = raw.group_pairs(g);
  p.label = group_label(p.keys);
  p.rows = group.rows.size();
  p.out_of_order = count_out_of_order(raw, group);
  const GridPhase phase = choose_grid_phase(raw, group, step);
  const std::map<std::int64_t, std::int64_t> offset_of = on_grid_times(raw, group, step, phase, p);
  if (offset_of.empty()) return out;  // cannot happen: `through` is on the grid
  const std::int64_t lo = offset_of.begin()->second, hi = offset_of.rbegin()->second;
  const std::int64_t start = offset_of.begin()->first;
  AxisStyle style;
  style.utc_z = raw.utc_z;
  style.month_day = phase.month_day;
  std::int64_t points = -1;
  if (!__builtin_sub_overflow(hi, lo, &points) && points < INT64_MAX) ++points;
  check_grid_size(points, step, raw.source);
  p.grid = TimeAxis(raw.kind, step, start, static_cast<std::size_t>(points), raw.offset_minutes, style);
  out.slot_rows.assign(p.grid.size(), {});
  for (std::size_t r : group.rows) {
    auto it = offset_of.find(raw.times[r]);
    if (it != offset_of.end()) out.slot_rows[static_cast<std::size_t>(it->second - lo)].push_back(r);
  }
  p.present = offset_of.size();
  p.missing_records = p.grid.size() - p.present;
  return out;
}

/// Each grid point's state and value: a missing record without rows, else
/// the first row whose cell is not empty (a missing value when none is).
/// Notes the first cell that is not a number; such a series has no values.
void read_slots(const RawData& raw, const GroupGrid& grid, std::size_t v, SeriesProfile& s) {
  const std::size_t n = grid.profile.grid.size();
  s.expected = n;
  s.states.assign(n, SlotState::MissingRecord);
  s.values.assign(n, std::nan(""));
  const auto& column = raw.cells[v];
  for (std::size_t i = 0; i < n; ++i) {
    const auto& rows = grid.slot_rows[i];
    if (rows.empty()) {
      ++s.missing_records;
      continue;
    }
    s.states[i] = SlotState::MissingValue;
    for (std::size_t r : rows) {
      if (is_missing_token(column[r])) continue;
      s.states[i] = SlotState::Present;
      const auto x = parse_double(column[r]);
      if (!x || !std::isfinite(*x)) {
        if (s.numeric) {
          s.numeric = false;
          s.first_text = column[r];
          s.first_text_line = raw.lines[r];
        }
      } else {
        s.values[i] = *x;
      }
      break;
    }
    if (s.states[i] == SlotState::Present)
      ++s.observed;
    else
      ++s.missing_values;
  }
  if (!s.numeric) std::fill(s.values.begin(), s.values.end(), std::nan(""));
}

/// Gaps are runs of points that are not present: counted by length, each
/// made of missing records, missing values or both.
void count_gaps(SeriesProfile& s) {
  const std::size_t n = s.states.size();
  std::map<std::size_t, GapLengthCount> by_length;
  for (std::size_t i = 0; i < n;) {
    if (s.states[i] == SlotState::Present) {
      ++i;
      continue;
    }
    std::size_t j = i;
    bool records = false, values = false;
    for (; j < n && s.states[j] != SlotState::Present; ++j)
      (s.states[j] == SlotState::MissingRecord ? records : values) = true;
    GapLengthCount& c = by_length[j - i];
    c.length = j - i;
    ++c.count;
    (records && values ? c.mixed : records ? c.records : c.values) += 1;
    ++s.gap_count;
    s.longest_gap = std::max(s.longest_gap, j - i);
    i = j;
  }
  for (const auto& [length, c] : by_length) s.gaps.push_back(c);
}

/// Expected and missing points per phase of `unit`, in phase order.
PhaseMissingness missingness_by_phase(const SeriesProfile& s, const TimeAxis& axis, const std::string& unit,
                                      std::size_t period) {
  std::map<int, std::pair<std::size_t, std::size_t>> counts;
  for (std::size_t i = 0; i < s.states.size(); ++i) {
    auto& c = counts[phase_of(axis, i, unit, period)];
    ++c.first;
    if (s.states[i] != SlotState::Present) ++c.second;
  }
  PhaseMissingness pm;
  pm.unit = unit;
  for (const auto& [phase, c] : counts) {
    pm.phases.push_back(phase);
    pm.expected.push_back(c.first);
    pm.missing.push_back(c.second);
  }
  return pm;
}

SeriesProfile profile_series(const RawData& raw, const GroupGrid& grid, std::size_t g, std::size_t v,
                             const std::vector<std::string>& units, std::size_t period) {
  SeriesProfile s;
  s.variable = raw.value_columns[v];
  s.group = g;
  s.label = grid.profile.keys.empty() ? s.variable : s.variable + "[" + grid.profile.label + "]";
  read_slots(raw, grid, v, s);
  count_gaps(s);
  for (const auto& unit : units) s.phases.push_back(missingness_by_phase(s, grid.profile.grid, unit, period));
  if (s.numeric) {
    s.screen = screen_values(s.values);
  } else {
    s.screen.reason = "not numeric ('" + s.first_text + "' on line " + std::to_string(s.first_text_line) + ")";
  }
  return s;
}

}  // namespace

DataProfile profile_data(const RawData& raw, const ProfileOptions& options) {
  DataProfile p;
  p.source = raw.source;
  p.time_column = raw.time_column;
  p.group_columns = raw.group_columns;
  p.value_columns = raw.value_columns;
  p.kind = raw.kind;
  p.offset_minutes = raw.offset_minutes;
  p.utc_z = raw.utc_z;
  p.step = choose_step(raw, options, p.step_given);
  auto units = phase_units(raw.kind, p.step);
  p.period_given = options.period >= 2;
  for (std::size_t g = 0; g < raw.groups.size(); ++g) {
    GroupGrid grid = lay_out_group(raw, raw.groups[g], g, p.step);
    if (g == 0) {
      p.period = p.period_given ? options.period : grid.profile.grid.default_period();
      if (p.period_given) units.push_back("phase");  // the step's default period is already a calendar phase
    }
    for (std::size_t v = 0; v < raw.value_columns.size(); ++v)
      p.series.push_back(profile_series(raw, grid, g, v, units, p.period));
    p.groups.push_back(std::move(grid.profile));
  }
  return p;
}

}  // namespace gapmark::data
