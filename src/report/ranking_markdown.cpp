// ranking.md: per series, for each scheme and rate, the methods ranked by
// the ranking metric with mean ± sd over replicates of each metric.
#include <cmath>

#include "gapmark/number_format.hpp"
#include "gapmark/report/reporter.hpp"
#include "gapmark/report/table_text.hpp"

namespace gapmark {
namespace {

class RankingMarkdown final : public Reporter {
public:
  std::string file_name() const override { return "ranking.md"; }

  std::string render(const ResultSet& results, const Summary& summary) const override {
    const std::size_t rank_col = results.column_index(results.rank_by);
    const auto& rc = results.columns[rank_col];
    std::string out = "# Ranked fill methods: " + results.context.value("spec_name", std::string("experiment")) + "\n\n";
    out += "Methods are ranked by **" + rc.name + "** (" + direction_words(rc.direction) +
           "). Each cell is the mean ± sd over replicates; the interval is the " +
           short_number(100 * (1 - summary.alpha)) +
           "% Student-t confidence interval of the mean. ✓ marks the methods not distinguishable from "
           "the best at α = " + short_number(summary.alpha) +
           "; *mean rank* is the average of the within-replicate ranks (1 = best). A trial that left "
           "masked points unfilled (partial) or failed counts in *failed*, ranks last in its replicate and is "
           "left out of the means; methods with such trials are listed after those that filled every trial.\n\n";
    out += "Filled values are estimates. A benchmark on synthetic masks can flatter a method when the "
           "real gaps differ; where filled data feed safety decisions, follow the applicable standards "
           "and have a qualified person review the choice.\n";
    std::string current;
    for (const auto& g : summary.groups) {
      if (g.series != current) {
        current = g.series;
        out += "\n## " + g.series + "\n";
      }
      out += "\n### " + g.scheme + " at rate " + format_double(g.rate) + " (" + std::to_string(g.replicates) +
             " replicates)\n\n";
      std::vector<std::string> header{"rank", "method", rc.name, "interval"};
      std::vector<std::size_t> shown;
      for (std::size_t c = 0; c < results.columns.size(); ++c)
        if (c != rank_col && results.columns[c].direction != Direction::None) {
          shown.push_back(c);
          header.push_back(results.columns[c].name);
        }
      header.insert(header.end(), {"mean rank", "tied", "failed"});
      std::vector<std::vector<std::string>> rows;
      for (const auto& m : g.methods) {
        std::vector<std::string> row{std::to_string(m.rank), m.method, mean_sd(m.metrics[rank_col]),
                                     interval(m.metrics[rank_col])};
        for (auto c : shown) row.push_back(mean_sd(m.metrics[c]));
        row.push_back(short_number(m.mean_rank));
        row.push_back(m.tied_with_best ? "✓" : "");
        row.push_back(m.failures ? std::to_string(m.failures) + "/" + std::to_string(m.trials) : "0");
        rows.push_back(std::move(row));
      }
      out += markdown_table(header, rows);
      if (std::isfinite(g.friedman_p))
        out += "\nFriedman test over replicates: χ² = " + short_number(g.friedman_statistic) +
               ", p = " + short_number(g.friedman_p) + ".\n";
    }
    if (!results.warnings.empty()) {
      out += "\n## Warnings\n\n";
      for (const auto& w : results.warnings)
        out += "- **" + w.code + "** (" + w.where + "): " + w.message + ". *" + w.hint + ".*\n";
    }
    return out;
  }
};

const Registration<Reporter> registration{{
    .name = "ranking-md",
    .summary = "ranked tables per series, scheme and rate (Markdown)",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<RankingMarkdown>(); },
}};

}  // namespace
}  // namespace gapmark
