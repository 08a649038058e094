// The one-command answer: a default experiment from a profile and a
// recommendation from the summary (see quick_plan.hpp).
#include "gapmark/data/quick_plan.hpp"

#include <algorithm>
#include <cmath>
#include <map>

#include "gapmark/data/text_columns.hpp"
#include "gapmark/error.hpp"
#include "gapmark/report/table_text.hpp"

namespace gapmark::data {
namespace {

using nlohmann::json;

double mean_of(const std::vector<double>& x) {
  double s = 0;
  std::size_t n = 0;
  for (double v : x)
    if (std::isfinite(v)) s += v, ++n;
  return n ? s / double(n) : std::nan("");
}

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
    g.reason = "non-negative, " + percent(zeros) + " exact zeros";
    return g;
  }
  if (non_negative && event_rows > 0) {
    g.kind = VariableKind::Count;
    g.reason = "non-negative, with event rows (" + std::to_string(event_rows) + " rows share a time step with another)";
    return g;
  }
  g.reason = std::string(whole && non_negative ? "non-negative whole numbers, but whole numbers alone do not make a count"
                                               : "no sign of a count") +
             " (" + percent(zeros) + " exact zeros, no event rows)";
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

Recommendation recommend(const Summary& all, const ResultSet& results, const std::string& variable) {
  Summary summary = all;
  if (!variable.empty())
    std::erase_if(summary.groups,
                  [&](const CellGroup& g) { return g.series != variable && g.series.rfind(variable + "[", 0) != 0; });
  Recommendation r;
  r.rank_by = summary.rank_by;
  r.alpha = summary.alpha;
  r.conditions = summary.groups.size();
  for (const auto& g : summary.groups)
    if (g.scheme.rfind("replay", 0) == 0) ++r.primary;
  r.primary_scheme = r.primary ? "replay" : "";
  if (!r.primary) r.primary = r.conditions;
  const auto is_primary = [&](const CellGroup& g) { return r.primary_scheme.empty() || g.scheme.rfind("replay", 0) == 0; };

  const auto column = [&](const std::string& name) -> std::optional<std::size_t> {
    for (std::size_t c = 0; c < results.columns.size(); ++c)
      if (results.columns[c].name == name) return c;
    return std::nullopt;
  };
  const auto rank_col = column(summary.rank_by), acf_col = column("acf_rms"), mase_col = column("mase_cost");

  std::map<std::string, std::size_t> index;
  std::vector<std::vector<double>> ranks, metric, acf, mase;
  for (const auto& g : summary.groups)
    for (const auto& m : g.methods) {
      auto [it, added] = index.emplace(m.method, r.methods.size());
      if (added) {
        r.methods.push_back({m.method});
        ranks.emplace_back();
        metric.emplace_back();
        acf.emplace_back();
        mase.emplace_back();
      }
      const std::size_t k = it->second;
      MethodStanding& s = r.methods[k];
      s.failures += m.failures;
      s.trials += m.trials;
      if (m.tied_with_best) ++s.top;
      if (!is_primary(g)) continue;
      if (m.tied_with_best) ++s.top_primary;
      ranks[k].push_back(m.mean_rank);
      if (rank_col) metric[k].push_back(m.metrics[*rank_col].mean);
      if (acf_col) acf[k].push_back(m.metrics[*acf_col].mean);
      if (mase_col) mase[k].push_back(m.metrics[*mase_col].mean);
    }
  for (std::size_t k = 0; k < r.methods.size(); ++k) {
    r.methods[k].mean_rank = mean_of(ranks[k]);
    r.methods[k].rank_metric = mean_of(metric[k]);
    r.methods[k].acf_rms = mean_of(acf[k]);
    r.methods[k].mase_cost = mean_of(mase[k]);
  }
  std::stable_sort(r.methods.begin(), r.methods.end(), [](const MethodStanding& a, const MethodStanding& b) {
    const double x = std::isnan(a.mean_rank) ? 1e300 : a.mean_rank, y = std::isnan(b.mean_rank) ? 1e300 : b.mean_rank;
    return x < y;
  });
  for (std::size_t k = 1; k < r.methods.size(); ++k)
    if (r.methods[k].top_primary == r.primary && r.primary > 0) r.also_top.push_back(r.methods[k].method);
  return r;
}

std::string recommendation_text(const Recommendation& r) {
  std::string out;
  const std::string scope = r.primary_scheme.empty()
                                ? std::to_string(r.conditions) + " conditions"
                                : std::to_string(r.primary) + " replay condition" + (r.primary == 1 ? "" : "s") +
                                      " (masks shaped like the real gaps)";
  out += "Ranking over the " + scope + ", by " + r.rank_by + " (lower is better)\n";
  std::vector<std::vector<std::string>> rows;
  for (std::size_t k = 0; k < r.methods.size(); ++k) {
    const auto& m = r.methods[k];
    rows.push_back({std::to_string(k + 1), m.method, short_number(m.mean_rank), short_number(m.rank_metric),
                    short_number(m.acf_rms), short_number(m.mase_cost),
                    std::to_string(m.top_primary) + "/" + std::to_string(r.primary) +
                        (r.primary_scheme.empty() ? "" : " (" + std::to_string(m.top) + "/" + std::to_string(r.conditions) + " all)"),
                    m.failures ? std::to_string(m.failures) + "/" + std::to_string(m.trials) : "0"});
  }
  out += aligned_table({"rank", "method", "mean rank", r.rank_by, "acf_rms", "mase_cost", "best or tied", "failed"}, rows, 2);
  out += "  (acf_rms: change of the autocorrelation at small lags, lower is better; mase_cost: forecast error added by\n"
         "   the fill, positive = worse; best or tied: conditions where it is the best or not distinguishable from the\n"
         "   best at alpha = " + short_number(r.alpha) + ", Holm-adjusted paired tests)\n\n";
  if (r.methods.empty()) return out + "No recommendation: no method was scored.\n";
  const auto& best = r.methods.front();
  out += "Recommendation: " + best.method + "\n";
  out += "  - lowest mean rank by " + r.rank_by + " over the " + scope + ": " + short_number(best.mean_rank) +
         " (mean " + r.rank_by + " " + short_number(best.rank_metric) + ")\n";
  out += "  - best or tied with the best in " + std::to_string(best.top_primary) + " of " + std::to_string(r.primary) +
         " of those conditions";
  if (!r.primary_scheme.empty())
    out += ", " + std::to_string(best.top) + " of " + std::to_string(r.conditions) + " with blocks and random masks too";
  out += "\n";
  if (r.also_top.empty()) {
    out += "  - no other method is best or tied in every one of them\n";
  } else {
    std::string names;
    for (const auto& n : r.also_top) names += (names.empty() ? "" : ", ") + n;
    out += "  - not distinguishable from it (best or tied in every one of them as well): " + names + "\n";
  }
  // Downstream effects, against the best value among the methods.
  const auto lowest = [&](double MethodStanding::*field, bool absolute) {
    const MethodStanding* low = nullptr;
    for (const auto& m : r.methods) {
      const double v = m.*field;
      if (!std::isfinite(v)) continue;
      if (!low || (absolute ? std::abs(v) < std::abs(low->*field) : v < low->*field)) low = &m;
    }
    return low;
  };
  if (std::isfinite(best.acf_rms)) {
    const auto* low = lowest(&MethodStanding::acf_rms, false);
    out += "  - autocorrelation: acf_rms " + short_number(best.acf_rms) +
           (low && low != &best ? " (lowest: " + low->method + " " + short_number(low->acf_rms) + ")" : " (the lowest)") + "\n";
  }
  if (std::isfinite(best.mase_cost)) {
    const auto* low = lowest(&MethodStanding::mase_cost, false);
    out += "  - forecast: mase_cost " + short_number(best.mase_cost) +
           (best.mase_cost > 0 ? " (the holdout forecast is worse after this fill than from the complete series)"
                               : " (no harm to the holdout forecast seen)") +
           (low && low != &best ? "; lowest: " + low->method + " " + short_number(low->mase_cost) : "; the lowest") + "\n";
  } else {
    out += "  - forecast: mase_cost not available (no holdout, or a series too short for the forecaster)\n";
  }
  if (best.failures) out += "  - caution: it failed or left points unfilled in " + std::to_string(best.failures) + " of " +
                            std::to_string(best.trials) + " trials\n";
  return out;
}

}  // namespace gapmark::data
