// The two faces of a comparison: a plain-text table for people (only the
// metrics that changed, regressions first) and JSON for scripts.
#include <algorithm>
#include <cmath>

#include "gapmark/compare/compare.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/report/table_text.hpp"

namespace gapmark {
namespace {

std::string signed_number(double v) {
  if (std::isnan(v)) return "n/a";
  return (v > 0 ? "+" : "") + short_number(v);
}

std::string signed_percent(double v) {
  if (!std::isfinite(v)) return "n/a";
  return (v > 0 ? "+" : "") + short_number(100 * v) + "%";
}

/// Columns padded to their widest cell; the first three left-aligned.
std::string text_table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows) {
  std::vector<std::size_t> width(header.size(), 0);
  auto length = [](const std::string& s) {  // display width: count UTF-8 lead bytes
    std::size_t n = 0;
    for (unsigned char c : s) n += (c & 0xC0) != 0x80;
    return n;
  };
  for (std::size_t i = 0; i < header.size(); ++i) width[i] = length(header[i]);
  for (const auto& r : rows)
    for (std::size_t i = 0; i < r.size() && i < width.size(); ++i) width[i] = std::max(width[i], length(r[i]));
  auto line = [&](const std::vector<std::string>& r) {
    std::string out;
    for (std::size_t i = 0; i < r.size(); ++i) {
      const std::string pad(width[i] - length(r[i]), ' ');
      out += (i ? "  " : "") + (i < 2 || i + 1 == r.size() ? r[i] + (i + 1 == r.size() ? "" : pad) : pad + r[i]);
    }
    return out + "\n";
  };
  std::string out = line(header);
  std::vector<std::string> rule;
  for (auto w : width) rule.emplace_back(w, '-');
  out += line(rule);
  for (const auto& r : rows) out += line(r);
  return out;
}

nlohmann::json num(double v) { return std::isfinite(v) ? nlohmann::json(v) : nlohmann::json(nullptr); }

}  // namespace

std::string comparison_text(const Comparison& c) {
  std::string out = "baseline: " + c.baseline_source + "\ncurrent:  " + c.current_source + "\n";
  out += "test: paired Wilcoxon signed-rank over replicates, two-sided, alpha = " + format_double(c.alpha) +
         " (needs " + std::to_string(c.min_pairs) + "+ pairs; fewer: tolerance alone)\n";
  out += "tolerance: default " + c.tolerances.fallback.describe();
  for (const auto& [metric, t] : c.tolerances.per_metric) out += ", " + metric + " " + t.describe();
  out += "\n";
  for (const auto& n : c.notes) out += "note: " + n + "\n";
  if (c.no_change) return out + "\nno change: every cell and metric is identical (" + std::to_string(c.cells.size()) +
                           " cells)\n";

  std::vector<std::vector<std::string>> rows;
  std::size_t unchanged = 0;
  auto add_rows = [&](bool regressed_only) {
    for (const auto& cell : c.cells) {
      if (cell.regressed != regressed_only) continue;
      if (cell.current_failures != cell.baseline_failures)
        rows.push_back({cell.name(), "failed trials", std::to_string(cell.baseline_failures),
                        std::to_string(cell.current_failures),
                        signed_number(static_cast<double>(cell.current_failures) -
                                      static_cast<double>(cell.baseline_failures)),
                        "", "", "", cell.current_failures > cell.baseline_failures ? "REGRESSED" : "better"});
      for (const auto& m : cell.metrics) {
        if (m.verdict == Verdict::Same) {
          ++unchanged;
          continue;
        }
        rows.push_back({cell.name(), m.metric, short_number(m.baseline_mean), short_number(m.current_mean),
                        signed_number(m.change), signed_percent(m.relative_change), std::to_string(m.pairs),
                        m.tested ? short_number(m.p) : "-", to_string(m.verdict)});
      }
    }
  };
  add_rows(true);
  add_rows(false);
  if (!rows.empty()) {
    out += "\n" + text_table({"cell", "metric", "baseline", "current", "change", "relative", "pairs", "p", "verdict"}, rows);
  }
  if (unchanged) out += "(" + std::to_string(unchanged) + " metric values unchanged, not shown)\n";
  auto list = [&](const std::string& title, const std::vector<std::string>& names) {
    if (names.empty()) return;
    out += "\n" + title + " (" + std::to_string(names.size()) + "):\n";
    for (const auto& n : names) out += "  " + n + "\n";
  };
  list("cells only in the baseline", c.only_in_baseline);
  list("cells only in the current results", c.only_in_current);
  list("metrics only in the baseline", c.metrics_only_in_baseline);
  list("metrics only in the current results", c.metrics_only_in_current);
  if (c.regressed.empty()) {
    out += "\nno regression: " + std::to_string(c.cells.size()) + " cells compared\n";
  } else {
    out += "\nREGRESSION in " + std::to_string(c.regressed.size()) + " of " + std::to_string(c.cells.size()) + " cells:\n";
    for (const auto& cell : c.cells) {
      if (!cell.regressed) continue;
      out += "  " + cell.name() + ": ";
      for (std::size_t i = 0; i < cell.reasons.size(); ++i) out += (i ? "; " : "") + cell.reasons[i];
      out += "\n";
    }
  }
  return out;
}

nlohmann::json comparison_to_json(const Comparison& c) {
  nlohmann::json cells = nlohmann::json::array();
  for (const auto& cell : c.cells) {
    nlohmann::json metrics = nlohmann::json::array();
    for (const auto& m : cell.metrics)
      metrics.push_back({{"metric", m.metric},
                         {"direction", to_string(m.direction)},
                         {"baseline_mean", num(m.baseline_mean)},
                         {"current_mean", num(m.current_mean)},
                         {"change", num(m.change)},
                         {"relative_change", num(m.relative_change)},
                         {"worsening", num(m.worsening)},
                         {"allowed", num(m.allowed)},
                         {"pairs", m.pairs},
                         {"tested", m.tested},
                         {"p", num(m.p)},
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
                     {"reasons", cell.reasons},
                     {"metrics", metrics}});
  }
  return {{"format", "gapmark-comparison"},
          {"baseline", c.baseline_source},
          {"current", c.current_source},
          {"alpha", c.alpha},
          {"min_pairs", c.min_pairs},
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
