// A profile as readable text and as JSON (see profile.hpp).
#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>

#include "gapmark/data/profile.hpp"
#include "gapmark/data/text_columns.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark::data {
namespace {

using nlohmann::json;

std::string phase_name(const std::string& unit, int phase) {
  static const char* weekdays[] = {"", "Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun"};
  static const char* months[] = {"", "Jan", "Feb", "Mar", "Apr", "May", "Jun",
                                 "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"};
  if (unit == "weekday" && phase >= 1 && phase <= 7) return weekdays[phase];
  if (unit == "month" && phase >= 1 && phase <= 12) return months[phase];
  if (unit == "phase") return std::to_string(phase);
  char buf[16];
  std::snprintf(buf, sizeof buf, "%02dh", phase);
  return buf;
}

std::string share(std::size_t part, std::size_t whole) {
  return whole ? rounded_percent(double(part) / double(whole)) : "n/a";
}

std::string time_at(const GroupProfile& g, std::size_t i) { return g.grid.size() ? g.grid.format(i) : ""; }

std::string phase_line(const PhaseMissingness& pm) {
  if (pm.phases.size() < 2) return "";
  std::vector<std::size_t> order(pm.phases.size());
  for (std::size_t k = 0; k < order.size(); ++k) order[k] = k;
  const auto rate = [&](std::size_t k) { return double(pm.missing[k]) / double(std::max<std::size_t>(pm.expected[k], 1)); };
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return rate(a) > rate(b); });
  const std::size_t shown = std::min<std::size_t>(3, order.size() / 2);
  std::string out = pm.unit + ": highest ";
  for (std::size_t k = 0; k < shown; ++k)
    out += (k ? ", " : "") + phase_name(pm.unit, pm.phases[order[k]]) + " " +
           share(pm.missing[order[k]], pm.expected[order[k]]);
  out += "; lowest " + phase_name(pm.unit, pm.phases[order.back()]) + " " +
         share(pm.missing[order.back()], pm.expected[order.back()]);
  return out;
}

std::string gap_line(const SeriesProfile& s) {
  if (s.gaps.empty()) return "no gaps";
  std::string out;
  constexpr std::size_t kShown = 14;
  for (std::size_t k = 0; k < s.gaps.size() && k < kShown; ++k) {
    const auto& c = s.gaps[k];
    std::string parts;
    if (c.records) parts += "r" + std::to_string(c.records);
    if (c.values) parts += (parts.empty() ? "" : " ") + ("v" + std::to_string(c.values));
    if (c.mixed) parts += (parts.empty() ? "" : " ") + ("m" + std::to_string(c.mixed));
    out += (k ? "  " : "") + std::to_string(c.length) + "×" + std::to_string(c.count) + " (" + parts + ")";
  }
  if (s.gaps.size() > kShown) out += "  … up to " + std::to_string(s.longest_gap);
  return out;
}

std::string layout_words(const DataProfile& p) {
  if (p.group_columns.empty()) return "wide layout (a time column, then one column per variable)";
  std::string groups;
  for (const auto& g : p.group_columns) groups += (groups.empty() ? "" : ", ") + g;
  return "long layout (groups by " + groups + ")";
}

std::string group_option(const DataProfile& p) {
  if (p.group_columns.empty()) return "";
  std::string out = " --group ";
  for (std::size_t g = 0; g < p.group_columns.size(); ++g) out += (g ? "," : "") + p.group_columns[g];
  return out;
}

/// The rows' problems added over the groups, for the closing notes.
struct RowTotals {
  std::size_t duplicates = 0, off_grid = 0, out_of_order = 0, missing_records = 0, rows = 0;
};

RowTotals row_totals(const DataProfile& p) {
  RowTotals t;
  for (const auto& g : p.groups) {
    t.duplicates += g.duplicates;
    t.off_grid += g.off_grid;
    t.out_of_order += g.out_of_order;
    t.missing_records += g.missing_records;
    t.rows += g.rows;
  }
  return t;
}

std::string header_text(const DataProfile& p) {
  std::string out = "Profile of " + p.source + ": " + layout_words(p) + ", time column '" + p.time_column + "', " +
                    std::to_string(p.value_columns.size()) + " value column" + (p.value_columns.size() == 1 ? "" : "s") +
                    "\n";
  out += "Step " + p.step.iso() + (p.step_given ? " (given)" : " (inferred: the most common spacing between rows)");
  out += std::string("; period ") +
         (p.period >= 2 ? std::to_string(p.period) + (p.period_given ? " (given)" : " (from the step; --period sets it)")
                        : "none (--period sets one)");
  if (p.offset_minutes) out += "; times at UTC offset " + format_time(TimeKind::DateTime, 0, p.offset_minutes, p.utc_z).substr(16);
  return out + "\n\n";
}

std::string records_table(const DataProfile& p) {
  std::vector<std::vector<std::string>> rows;
  for (const auto& g : p.groups)
    rows.push_back({g.label, time_at(g, 0), time_at(g, g.grid.size() ? g.grid.size() - 1 : 0), std::to_string(g.rows),
                    std::to_string(g.grid.size()), std::to_string(g.present), std::to_string(g.missing_records),
                    std::to_string(g.duplicates) + (g.conflicting_duplicates ? " (" + std::to_string(g.conflicting_duplicates) + " differ)" : ""),
                    std::to_string(g.out_of_order), std::to_string(g.off_grid)});
  return "Records per group (a missing record is a grid time with no row at all)\n" +
         aligned_table({"group", "first", "last", "rows", "expected", "present", "missing records", "duplicates",
                        "out of order", "off grid"},
                       rows, 3);
}

std::string values_table(const DataProfile& p) {
  std::vector<std::vector<std::string>> rows;
  for (const auto& s : p.series)
    rows.push_back({s.label, std::to_string(s.expected), std::to_string(s.observed), std::to_string(s.missing_values),
                    std::to_string(s.missing_records), share(s.missing(), s.expected), std::to_string(s.gap_count),
                    std::to_string(s.longest_gap)});
  return "\nValues per series (a missing value is a row whose cell is empty)\n" +
         aligned_table({"series", "expected", "present", "missing values", "missing records", "missing", "gaps",
                        "longest gap"},
                       rows, 1);
}

std::string gaps_table(const DataProfile& p) {
  std::vector<std::vector<std::string>> rows;
  for (const auto& s : p.series) rows.push_back({s.label, gap_line(s)});
  return "\nGap lengths (a gap is a run of missing points; length×count, r = only missing records, v = only missing "
         "values, m = both)\n" +
         aligned_table({"series", "gaps"}, rows, 2);
}

/// Empty when no series has phases.
std::string phases_table(const DataProfile& p) {
  bool any_phase = false;
  for (const auto& s : p.series) any_phase = any_phase || !s.phases.empty();
  if (!any_phase) return "";
  std::vector<std::vector<std::string>> rows;
  for (const auto& s : p.series) {
    bool first = true;
    for (const auto& pm : s.phases) {
      const std::string line = phase_line(pm);
      if (line.empty()) continue;
      rows.push_back({first ? s.label : "", line});
      first = false;
    }
  }
  return "\nMissingness by phase (share of expected points missing)\n" + aligned_table({"series", "by phase"}, rows, 2);
}

std::string screen_table(const DataProfile& p) {
  std::vector<std::vector<std::string>> rows;
  for (const auto& s : p.series) {
    if (!s.screen.applicable) {
      rows.push_back({s.label, "", "", "", "", "", "n/a: " + s.screen.reason});
      continue;
    }
    const auto& t = s.screen.test;
    std::string verdict = t.p < 0.01 ? (t.z > 0 ? "higher next to gaps" : "lower next to gaps") : "no sign";
    rows.push_back({s.label, std::to_string(s.screen.near_count) + ", " + short_number(s.screen.near_median),
                    std::to_string(s.screen.rest_count) + ", " + short_number(s.screen.rest_median),
                    short_number(t.z), short_number(t.p), "", verdict});
  }
  return "\nValue-dependent missingness screen: the values just before and after each gap against the other values\n"
         "(Mann-Whitney U, normal approximation). A screening heuristic: a small p hints that values go missing\n"
         "around some levels more than others; a large p proves nothing, since the missing values are never seen.\n" +
         aligned_table({"series", "next to gaps (n, median)", "others (n, median)", "z", "p", "", "at 1%"}, rows, 1);
}

/// What to do next: regularize events, choose what a missing record means,
/// put duplicates and stray rows on a grid.
std::string notes(const DataProfile& p) {
  const RowTotals t = row_totals(p);
  std::string out;
  if (2 * t.off_grid > t.rows)
    out += "Note: most rows (" + share(t.off_grid, t.rows) + ") fall between the points of a " + p.step.iso() +
           " grid: these look like events at\nirregular times rather than a regular log. Put them on a grid first, for "
           "example\n  gapmark regularize " + p.source + group_option(p) + " --step PT1H --agg COLUMN=sum --empty COLUMN=zero --out HOURLY.csv\n"
           "and profile the result.\n";
  if (t.missing_records > 0)
    out += "Note: " + std::to_string(t.missing_records) +
           " missing records. Whether an absent row means nothing happened (the truth is zero: counts, event totals,\n"
           "feed dispensed) or no observation (the truth is unknown: sensor readings) depends on the variable, not on\n"
           "the file. Choose per variable when you regularize: gapmark regularize ... --empty COLUMN=zero|missing.\n";
  if (t.duplicates + t.off_grid + t.out_of_order > 0)
    out += "Note: " + std::to_string(t.duplicates) + " duplicate, " + std::to_string(t.out_of_order) + " out-of-order and " +
           std::to_string(t.off_grid) +
           " off-grid rows. Put the rows on a regular grid (aggregating duplicates) with gapmark regularize.\n";
  return out;
}

json group_json(const GroupProfile& g) {
  json keys = json::object();
  for (const auto& [c, v] : g.keys) keys[c] = v;
  return {{"label", g.label},
          {"keys", keys},
          {"first", time_at(g, 0)},
          {"last", time_at(g, g.grid.size() ? g.grid.size() - 1 : 0)},
          {"rows", g.rows},
          {"expected", g.grid.size()},
          {"present", g.present},
          {"missing_records", g.missing_records},
          {"duplicates", g.duplicates},
          {"conflicting_duplicates", g.conflicting_duplicates},
          {"out_of_order", g.out_of_order},
          {"off_grid", g.off_grid}};
}

json phases_json(const SeriesProfile& s) {
  json phases = json::object();
  for (const auto& pm : s.phases) {
    json list = json::array();
    for (std::size_t k = 0; k < pm.phases.size(); ++k)
      list.push_back({{"phase", pm.phases[k]}, {"expected", pm.expected[k]}, {"missing", pm.missing[k]}});
    phases[pm.unit] = list;
  }
  return phases;
}

json screen_json(const ValueScreen& v) {
  json screen = {{"applicable", v.applicable},
                 {"method", "Mann-Whitney U, normal approximation with tie and continuity corrections; a screening heuristic"},
                 {"near_count", v.near_count},
                 {"rest_count", v.rest_count}};
  if (v.applicable) {
    screen["near_median"] = v.near_median;
    screen["rest_median"] = v.rest_median;
    screen["u"] = v.test.u;
    screen["z"] = v.test.z;
    screen["p"] = v.test.p;
  } else {
    screen["reason"] = v.reason;
  }
  return screen;
}

json series_json(const SeriesProfile& s, const DataProfile& p) {
  json gaps = json::array();
  for (const auto& c : s.gaps)
    gaps.push_back({{"length", c.length}, {"count", c.count}, {"records", c.records}, {"values", c.values}, {"mixed", c.mixed}});
  return {{"label", s.label},
          {"variable", s.variable},
          {"group", p.groups[s.group].label},
          {"numeric", s.numeric},
          {"expected", s.expected},
          {"present", s.observed},
          {"missing_values", s.missing_values},
          {"missing_records", s.missing_records},
          {"missing_share", s.expected ? json(double(s.missing()) / double(s.expected)) : json()},
          {"gap_count", s.gap_count},
          {"longest_gap", s.longest_gap},
          {"gap_lengths", gaps},
          {"missing_by_phase", phases_json(s)},
          {"value_screen", screen_json(s.screen)}};
}

}  // namespace

std::string profile_text(const DataProfile& p) {
  return header_text(p) + records_table(p) + values_table(p) + gaps_table(p) + phases_table(p) + screen_table(p) +
         "\n" + notes(p);
}

std::string profile_json(const DataProfile& p) {
  json j;
  j["source"] = p.source;
  j["time_column"] = p.time_column;
  j["group_columns"] = p.group_columns;
  j["value_columns"] = p.value_columns;
  j["step"] = p.step.iso();
  j["step_given"] = p.step_given;
  j["period"] = p.period;
  j["period_given"] = p.period_given;
  j["utc_offset"] = p.offset_minutes ? json(format_time(TimeKind::DateTime, 0, p.offset_minutes, p.utc_z).substr(16)) : json();
  json groups = json::array();
  for (const auto& g : p.groups) groups.push_back(group_json(g));
  j["groups"] = groups;
  json series = json::array();
  for (const auto& s : p.series) series.push_back(series_json(s, p));
  j["series"] = series;
  return j.dump(2) + "\n";
}

}  // namespace gapmark::data
