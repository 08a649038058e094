// The two faces of a comparison: text for people (a summary with the
// verdict, then the worst cells, rounded) and JSON for scripts (everything).
#include <algorithm>
#include <cmath>

#include "gapmark/compare/compare.hpp"
#include "gapmark/json_number.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/text_table.hpp"

namespace gapmark {
namespace {

std::string signed_number(double v) {
  if (std::isnan(v)) return "n/a";
  return (v > 0 ? "+" : "") + short_number(v);
}

/// Columns padded to their widest cell: the first two and the last left-aligned, numbers between them right.
std::string text_table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows) {
  return gapmark::text_table(header, rows, {.right_from = 2, .right_until = header.size() - 1, .rule = true});
}


/// How bad a metric change is, for ordering: regressions first, then by how
/// far past its allowance it went.
int severity(Verdict v) {
  switch (v) {
    case Verdict::Regressed: return 0;
    case Verdict::WorseNotSignificant: return 1;
    case Verdict::WorseWithinTolerance: return 2;
    case Verdict::NotComparable: return 3;
    case Verdict::Changed: return 4;
    case Verdict::Better: return 5;
    case Verdict::Same: return 6;
  }
  return 6;
}

double excess(const MetricChange& m) {
  const double scale = m.allowed > 0 ? m.allowed : std::max(std::abs(m.baseline_mean), 1e-300);
  return std::isfinite(m.worsening) ? m.worsening / scale : 0;
}

bool worse_first(const MetricChange& a, const MetricChange& b) {
  if (severity(a.verdict) != severity(b.verdict)) return severity(a.verdict) < severity(b.verdict);
  return excess(a) > excess(b);
}

std::vector<std::string> metric_row(const CellChange& cell, const MetricChange& m) {
  return {cell.name(), m.metric, short_number(m.baseline_mean), short_number(m.current_mean), signed_number(m.change),
          signed_percent(m.relative_change), std::to_string(m.pairs), m.tested ? short_number(m.p_holm) : "-",
          to_string(m.verdict)};
}

std::vector<std::string> failure_row(const CellChange& cell) {
  return {cell.name(), "failed trials", std::to_string(cell.baseline_failures), std::to_string(cell.current_failures),
          signed_number(static_cast<double>(cell.current_failures) - static_cast<double>(cell.baseline_failures)),
          "", "", "", cell.regressed && cell.current_failures > cell.baseline_failures ? "REGRESSED"
                      : cell.current_failures > cell.baseline_failures ? "more failed (other masks)" : "better"};
}

std::string names(const std::vector<std::string>& list) {
  std::string out;
  for (const auto& n : list) out += (out.empty() ? "" : ", ") + n;
  return out;
}

/// The files, what was compared and how, and the notes on the two runs.
std::string comparison_header(const Comparison& c) {
  std::string out = "baseline: " + c.baseline_source + "\ncurrent:  " + c.current_source + "\n";
  out += "compared: " + names(c.compared_metrics) + " (tolerance: default " + c.tolerances.fallback.describe();
  for (const auto& [metric, t] : c.tolerances.per_metric) out += ", " + metric + " " + t.describe();
  out += ")\n";
  if (!c.uncompared_metrics.empty())
    out += "not compared (no tolerance given; --tolerance 'NAME=5%' or '*=1%' adds them): " +
           names(c.uncompared_metrics) + "\n";
  out += "test: paired Wilcoxon signed-rank over replicates, two-sided, alpha = " + format_double(c.alpha) +
         ", Holm-corrected over the " + std::to_string(c.tests) + " tests made; after the correction a test needs " +
         std::to_string(c.min_pairs) + "+ pairs (fewer: " +
         (c.same_seed ? "the tolerance alone decides, the masks being the same" : "no conclusion, the seeds differ") + ")\n";
  for (const auto& n : c.notes) out += "note: " + n + "\n";
  return out;
}

/// The verdict line and one count per verdict, over the cells' worst compared metric.
std::string verdict_counts(const Comparison& c) {
  std::size_t regressed = c.regressed.size(), unsure = 0, within = 0, better = 0, same = 0, other_masks = 0;
  for (const auto& cell : c.cells) {
    other_masks += cell.more_failures_other_seed;
    if (cell.regressed) continue;
    int worst = 6;
    for (const auto& m : cell.metrics) worst = std::min(worst, severity(m.verdict));
    if (worst == 1) ++unsure;
    else if (worst == 2) ++within;
    else if (worst == 5) ++better;
    else if (worst == 6) ++same;
  }
  std::string out = "\n" + (regressed ? "REGRESSION in " + std::to_string(regressed) + " of " + std::to_string(c.cells.size()) + " cells"
                                      : "no regression: " + std::to_string(c.cells.size()) + " cells compared") + "\n";
  out += "  cells: " + std::to_string(regressed) + " regressed, " + std::to_string(unsure) +
         " worse beyond tolerance but not significant, " + std::to_string(within) + " worse within tolerance, " +
         std::to_string(better) + " better, " + std::to_string(same) + " unchanged\n";
  if (other_masks)
    out += "  " + std::to_string(other_masks) + " cells had more failed trials on the other masks (not a regression: the seeds differ)\n";
  if (!c.only_in_baseline.empty() || !c.only_in_current.empty())
    out += "  cells in one file only: " + std::to_string(c.only_in_baseline.size()) + " in the baseline, " +
           std::to_string(c.only_in_current.size()) + " in the current results\n";
  return out;
}

/// The worst cells: one row each (its worst metric), or every changed metric
/// with `limit` 0; regressed cells first, then the worst changes.
std::string changes_table(const Comparison& c, std::size_t limit) {
  std::vector<std::pair<const CellChange*, const MetricChange*>> rows;
  for (const auto& cell : c.cells) {
    const MetricChange* worst = nullptr;
    for (const auto& m : cell.metrics) {
      if (m.verdict == Verdict::Same) continue;
      if (limit == 0) rows.emplace_back(&cell, &m);
      else if (!worst || worse_first(m, *worst)) worst = &m;
    }
    const bool failures_changed = cell.current_failures != cell.baseline_failures;
    if (limit != 0 && (worst || failures_changed)) rows.emplace_back(&cell, worst);
    if (limit == 0 && failures_changed) rows.emplace_back(&cell, nullptr);
  }
  std::stable_sort(rows.begin(), rows.end(), [](const auto& a, const auto& b) {
    if (a.first->regressed != b.first->regressed) return a.first->regressed;
    if (!a.second || !b.second) return a.second == nullptr && b.second != nullptr;
    return worse_first(*a.second, *b.second);
  });
  const std::size_t shown = limit == 0 ? rows.size() : std::min(rows.size(), limit);
  if (!shown) return "";
  std::vector<std::vector<std::string>> table;
  for (std::size_t i = 0; i < shown; ++i)
    table.push_back(rows[i].second ? metric_row(*rows[i].first, *rows[i].second) : failure_row(*rows[i].first));
  std::string out = "\n" + std::string(limit == 0 ? "Every change" : "Worst " + std::to_string(shown) + " cells (each by its worst metric)") +
                    ":\n" + text_table({"cell", "metric", "baseline", "current", "change", "relative", "pairs", "p (Holm)", "verdict"}, table);
  if (shown < rows.size())
    out += "(" + std::to_string(rows.size() - shown) + " more changed cells not shown; --all prints every change)\n";
  return out;
}

/// A titled list, cut at `limit` items (0: all).
std::string item_list(const std::string& title, const std::vector<std::string>& items, std::size_t limit) {
  if (items.empty()) return "";
  std::string out = "\n" + title + " (" + std::to_string(items.size()) + "):\n";
  const std::size_t n = limit == 0 ? items.size() : std::min(items.size(), limit);
  for (std::size_t i = 0; i < n; ++i) out += "  " + items[i] + "\n";
  if (n < items.size()) out += "  ... and " + std::to_string(items.size() - n) + " more (--all)\n";
  return out;
}

/// Each regressed cell with its reasons.
std::vector<std::string> regression_reasons(const Comparison& c) {
  std::vector<std::string> reasons;
  for (const auto& cell : c.cells) {
    if (!cell.regressed) continue;
    std::string line = cell.name() + ": ";
    for (std::size_t i = 0; i < cell.reasons.size(); ++i) line += (i ? "; " : "") + cell.reasons[i];
    reasons.push_back(line);
  }
  return reasons;
}

}  // namespace

std::string comparison_text(const Comparison& c, std::size_t limit) {
  std::string out = comparison_header(c);
  if (c.no_change)
    return out + "\nno change: every cell and metric is identical (" + std::to_string(c.cells.size()) + " cells)\n";
  out += verdict_counts(c);
  out += changes_table(c, limit);
  out += item_list("cells only in the baseline", c.only_in_baseline, limit);
  out += item_list("cells only in the current results", c.only_in_current, limit);
  out += item_list("metrics only in the baseline", c.metrics_only_in_baseline, limit);
  out += item_list("metrics only in the current results", c.metrics_only_in_current, limit);
  if (!c.regressed.empty()) out += item_list("Regressed cells", regression_reasons(c), limit);
  return out;
}

nlohmann::json comparison_to_json(const Comparison& c) {
  nlohmann::json cells = nlohmann::json::array();
  for (const auto& cell : c.cells) {
    nlohmann::json metrics = nlohmann::json::array();
    for (const auto& m : cell.metrics)
      metrics.push_back({{"metric", m.metric},
                         {"direction", to_string(m.direction)},
                         {"baseline_mean", json_number(m.baseline_mean)},
                         {"current_mean", json_number(m.current_mean)},
                         {"change", json_number(m.change)},
                         {"relative_change", json_number(m.relative_change)},
                         {"worsening", json_number(m.worsening)},
                         {"allowed", json_number(m.allowed)},
                         {"pairs", m.pairs},
                         {"tested", m.tested},
                         {"p", json_number(m.p)},
                         {"p_holm", json_number(m.p_holm)},
                         {"verdict", to_string(m.verdict)}});
    cells.push_back({{"name", cell.name()},
                     {"series", cell.series},
                     {"scheme", cell.scheme},
                     {"rate", cell.rate},
                     {"method", cell.method},
                     {"baseline_trials", cell.baseline_trials},
                     {"current_trials", cell.current_trials},
                     {"baseline_failures", cell.baseline_failures},
                     {"current_failures", cell.current_failures},
                     {"regressed", cell.regressed},
                     {"more_failures_other_seed", cell.more_failures_other_seed},
                     {"reasons", cell.reasons},
                     {"metrics", metrics}});
  }
  return {{"format", "gapmark-comparison"},
          {"baseline", c.baseline_source},
          {"current", c.current_source},
          {"alpha", c.alpha},
          {"min_pairs", c.min_pairs},
          {"correction", "holm"},
          {"tests", c.tests},
          {"same_seed", c.same_seed},
          {"compared_metrics", c.compared_metrics},
          {"not_compared_metrics", c.uncompared_metrics},
          {"tolerances", c.tolerances.to_json()},
          {"notes", c.notes},
          {"no_change", c.no_change},
          {"regressed", c.regressed},
          {"only_in_baseline", c.only_in_baseline},
          {"only_in_current", c.only_in_current},
          {"metrics_only_in_baseline", c.metrics_only_in_baseline},
          {"metrics_only_in_current", c.metrics_only_in_current},
          {"cells", cells}};
}

}  // namespace gapmark
