// ranking.csv: the ranked tables as one flat CSV, numbers at round-trip
// precision; one row per series, scheme, rate and method.
#include <cmath>

#include "gapmark/number_format.hpp"
#include "gapmark/report/reporter.hpp"
#include "gapmark/table_io.hpp"

namespace gapmark {
namespace {

std::string cell(double v) { return std::isfinite(v) ? format_double(v) : ""; }

class RankingCsv final : public Reporter {
public:
  std::string file_name() const override { return "ranking.csv"; }

  std::string render(const ResultSet& results, const Summary& summary) const override {
    std::vector<std::string> header{"series", "scheme", "rate", "rank", "method", "mean_rank",
                                    "tied_with_best", "p_vs_best", "trials", "failures"};
    for (const auto& c : results.columns)
      for (const char* s : {"_mean", "_sd", "_ci_low", "_ci_high"}) header.push_back(c.name + s);
    std::vector<std::vector<std::string>> rows;
    for (const auto& g : summary.groups) {
      for (const auto& m : g.methods) {
        std::vector<std::string> row{g.series, g.scheme, format_double(g.rate), std::to_string(m.rank),
                                     m.method, cell(m.mean_rank), m.tied_with_best ? "true" : "false",
                                     cell(m.p_vs_best), std::to_string(m.trials), std::to_string(m.failures)};
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
    .summary = "ranked tables as one CSV at round-trip precision",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<RankingCsv>(); },
}};

}  // namespace
}  // namespace gapmark
