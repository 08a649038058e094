// The one-command answer: a default experiment from a profile (see
// quick_plan.hpp). The recommendation is the summary's verdict
// (analysis/verdict.hpp).
#include "gapmark/data/quick_plan.hpp"

#include <algorithm>
#include <cmath>

#include "gapmark/data/text_columns.hpp"
#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark::data {
namespace {

using nlohmann::json;


}  // namespace

VariableKind parse_kind(const std::string& text, const std::string& where) {
  if (text == "count") return VariableKind::Count;
  if (text == "level") return VariableKind::Level;
  if (text == "smooth") return VariableKind::Smooth;
  throw InputError(where, "unknown kind '" + text + "' (count: counts and event totals; level: readings of a state; smooth: smooth physical quantities)");
}

std::string kind_name(VariableKind kind) {
  switch (kind) {
    case VariableKind::Count: return "count";
    case VariableKind::Level: return "level";
    case VariableKind::Smooth: return "smooth";
    case VariableKind::Unknown: return "unknown";
  }
  return "";
}

KindGuess guess_kind(std::span<const double> values, std::size_t event_rows) {
  std::vector<double> x;
  for (double v : values)
    if (std::isfinite(v)) x.push_back(v);
  KindGuess g;
  if (x.empty()) {
    g.reason = "no values to look at";
    return g;
  }
  const bool non_negative = std::all_of(x.begin(), x.end(), [](double v) { return v >= 0; });
  const bool whole = std::all_of(x.begin(), x.end(), [](double v) { return v == std::floor(v); });
  const double zeros = double(std::count(x.begin(), x.end(), 0.0)) / double(x.size());
  if (non_negative && zeros >= 0.3) {
    g.kind = VariableKind::Count;
    g.reason = "non-negative, " + rounded_percent(zeros) + " exact zeros";
    return g;
  }
  if (non_negative && event_rows > 0) {
    g.kind = VariableKind::Count;
    g.reason = "non-negative, with event rows (" + std::to_string(event_rows) + " rows share a time step with another)";
    return g;
  }
  g.reason = std::string(whole && non_negative ? "non-negative whole numbers, but whole numbers alone do not make a count"
                                               : "no sign of a count") +
             " (" + rounded_percent(zeros) + " exact zeros, no event rows)";
  return g;
}

std::vector<std::string> candidate_methods(bool count, bool has_period, bool has_siblings) {
  std::vector<std::string> out = {"mean", "carry-forward", "linear", "pchip", "kalman:model=level"};
  if (has_period) out.push_back("seasonal-mean");
  if (count) out.insert(out.begin(), "zero");
  if (has_siblings) out.push_back("low-rank");
  return out;
}

std::string kind_caution(VariableKind kind, const std::string& variable) {
  if (kind == VariableKind::Count)
    return "'" + variable + "' is a count or event total. An absent record usually means nothing happened, so its truth\n"
           "is zero: make that explicit before any benchmark with\n"
           "  gapmark regularize RAW.csv --step STEP --agg " + variable + "=sum --empty " + variable + "=zero ...\n"
           "and keep missing only the intervals known to be unobserved (the logger or the scale was down). Filling a\n"
           "true zero with an interpolated amount invents events; filling an outage with zero hides them.\n";
  if (kind == VariableKind::Unknown)
    return "The kind of '" + variable + "' is unknown: its values alone cannot tell a count from a measurement. An absent\n"
           "record is treated as an unknown value here, never as zero. If '" + variable + "' counts events or totals\n"
           "amounts, rerun with --kind count; for a reading of a state or a smooth quantity, --kind level or --kind smooth.\n";
  return "'" + variable + "' is " +
         (kind == VariableKind::Smooth ? "a smooth quantity (a reading of something that varies smoothly)"
                                       : "a level (a reading of a state that holds between readings)") +
         ". An absent record is\nan unknown value, not a zero: "
         "keep it missing when you regularize (--empty " + variable + "=missing, the default) and never fill it\nwith zero.\n";
}

QuickPlan plan_quick(const DataProfile& profile, const QuickPlanInput& input) {
  QuickPlan plan;
  std::size_t expected = 0, missing = 0, gaps = 0, gap_points = 0, shortest = 0;
  bool first = true;
  for (const auto& s : profile.series) {
    if (s.variable != input.column) continue;
    expected += s.expected;
    missing += s.missing();
    shortest = first ? s.expected : std::min(shortest, s.expected);
    first = false;
    // Gaps with an observed point on both sides: what replay learns from.
    const std::size_t n = s.states.size();
    for (std::size_t i = 1; i < n; ++i) {
      if (s.states[i] == SlotState::Present || s.states[i - 1] != SlotState::Present) continue;
      std::size_t j = i;
      while (j < n && s.states[j] != SlotState::Present) ++j;
      if (j < n) ++gaps, gap_points += j - i;
      i = j;
    }
    if (!plan.period && !profile.groups.empty()) plan.period = profile.groups[s.group].grid.default_period();
  }
  if (input.period) plan.period = input.period;
  if (first) throw InputError(profile.source, "no value column '" + input.column + "'");
  plan.observed_missing = expected ? double(missing) / double(expected) : 0;
  plan.mask_rate = std::clamp(plan.observed_missing, 0.05, 0.5);
  plan.mask_rate = std::round(plan.mask_rate * 1000) / 1000;  // a rate that reads well in the spec
  plan.replay = gaps > 0;
  plan.mean_gap = gaps ? double(gap_points) / double(gaps) : 0;
  plan.holdout = plan.period ? 2 * plan.period : std::max<std::size_t>(10, shortest / 10);
  plan.holdout = std::min(plan.holdout, shortest / 5);
  plan.methods = candidate_methods(input.kind == VariableKind::Count, plan.period >= 2, !input.siblings.empty());

  json columns = json::array({input.column});
  for (const auto& s : input.siblings) columns.push_back(s);
  json data = {{"file", input.data_file}, {"columns", columns}};
  if (input.period) data["period"] = input.period;
  if (!input.groups.empty()) data["groups"] = input.groups;
  if (!input.time_column.empty()) data["time_column"] = input.time_column;
  if (input.step) data["step"] = input.step->iso();
  json schemes = json::array();
  const json rates = {plan.mask_rate};
  if (plan.replay) schemes.push_back({{"name", "replay"}, {"rates", rates}});
  const double length = std::max(1.0, std::round(plan.mean_gap * 10) / 10);
  schemes.push_back({{"name", "blocks"}, {"length_mean", plan.replay ? length : 6.0}, {"rates", rates}});
  schemes.push_back({{"name", "random"}, {"rates", rates}});
  plan.spec = {{"name", "quick: " + input.column},
               {"description", "Written by gapmark quick for '" + input.column + "' (kind " + kind_name(input.kind) +
                                   "); masks at the observed missing share clamped to [0.05, 0.5]. Edit and rerun with gapmark run."},
               {"seed", input.seed},
               {"replicates", input.replicates},
               {"holdout", plan.holdout},
               {"output", "results"},
               {"data", json::array({data})},
               {"schemes", schemes},
               {"methods", plan.methods},
               {"rank_by", "rmse"}};
  return plan;
}

}  // namespace gapmark::data
