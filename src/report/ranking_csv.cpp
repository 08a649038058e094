// ranking.csv: the ranked tables as one flat CSV, numbers at round-trip
// precision; one row per series, scheme, rate and method, with each
// method's standing against the best and whether the series' verdict
// recommends it.
#include <algorithm>
#include <cmath>

#include "gapmark/number_format.hpp"
#include "gapmark/report/reporter.hpp"
#include "gapmark/table_io.hpp"

namespace gapmark {
namespace {

std::string cell(double v) { return std::isfinite(v) ? format_double(v) : ""; }

/// "recommended", "equally good" or "" for a method of a series.
std::string verdict_role(const Summary& summary, const std::string& series, const std::string& method) {
  const auto* v = verdict_for(summary.verdict, series);
  if (v == nullptr) return "";
  if (v->recommended == method) return "recommended";
  if (std::find(v->equally_good.begin(), v->equally_good.end(), method) != v->equally_good.end()) return "equally good";
  return "";
}

class RankingCsv final : public Reporter {
public:
  std::string file_name() const override { return "ranking.csv"; }

  std::string render(const ResultSet& results, const Summary& summary) const override {
    std::vector<std::string> header{"series", "scheme", "rate", "rank", "method", "verdict", "standing",
                                    "mean_rank", "p_vs_best", "p_equivalent", "relative_difference",
                                    "trials", "failures"};
    for (const auto& c : results.columns)
      for (const char* s : {"_mean", "_sd", "_ci_low", "_ci_high"}) header.push_back(c.name + s);
    std::vector<std::vector<std::string>> rows;
    for (const auto& g : summary.groups) {
      for (const auto& m : g.methods) {
        std::vector<std::string> row{g.series, g.scheme, format_double(g.rate), std::to_string(m.rank),
                                     m.method, verdict_role(summary, g.series, m.method), standing_name(m.standing),
                                     cell(m.mean_rank), cell(m.p_vs_best), cell(m.p_equivalent),
                                     cell(m.relative_difference), std::to_string(m.trials), std::to_string(m.failures)};
        for (const auto& s : m.metrics)
          for (double v : {s.mean, s.sd, s.ci_low, s.ci_high}) row.push_back(cell(v));
        rows.push_back(std::move(row));
      }
    }
    return to_csv(header, rows);
  }
};

const Registration<Reporter> registration{{
    .name = "ranking-csv",
    .summary = "ranked tables with standings and the verdict as one CSV at round-trip precision",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<RankingCsv>(); },
}};

}  // namespace
}  // namespace gapmark
