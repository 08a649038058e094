// ranking.md: the verdict per series, then per series, for each scheme and
// rate, the methods ranked by the ranking metric with mean ± sd over
// replicates of each metric and each method's standing against the best.
#include <cmath>

#include "gapmark/number_format.hpp"
#include "gapmark/report/reporter.hpp"
#include "gapmark/report/table_text.hpp"

namespace gapmark {
namespace {

std::string failures(const MethodSummary& m) {
  return m.failures ? std::to_string(m.failures) + "/" + std::to_string(m.trials) : "0";
}

/// The verdict per series, with its reasons and caveats, then the notes.
std::string verdict_section(const RunVerdict& verdict) {
  std::string out = "## Verdict\n\n";
  for (const auto& v : verdict.series) {
    out += "**" + markdown_text(v.series) + "**: " +
           (v.recommended.empty() ? std::string("no recommendation") : "recommended " + markdown_code(v.recommended));
    if (!v.equally_good.empty()) {
      std::vector<std::string> names;
      for (const auto& n : v.equally_good) names.push_back(markdown_code(n));
      out += "; equally good: " + join_words(names);
    }
    out += "\n\n";
    for (const auto& r : v.reasons) out += "- " + r + "\n";
    for (const auto& c : v.caveats) out += "- *Caution:* " + c + "\n";
    out += "\n";
  }
  for (const auto& n : verdict.notes) out += "*Note:* " + n + "\n\n";
  return out;
}

std::string how_to_read(const MetricColumn& rc, const Summary& summary) {
  const std::string level = short_number(100 * (1 - summary.alpha));
  return "## How to read the tables\n\n"
         "Methods are ranked by **" + rc.name + "** (" + direction_words(rc.direction) +
         "). Each cell is the mean ± sd over replicates; the interval is the " + level +
         "% percentile bootstrap interval of the mean. *verdict* is each method's standing against the best "
         "(the lowest mean among the methods that filled every trial): *equivalent* when a paired TOST puts "
         "it within ±" + short_number(100 * summary.equivalence) + "% of the best's " + rc.name +
         ", *worse* or *better* when the paired Wilcoxon signed-rank test separates them, *not "
         "distinguishable* otherwise (both tests Holm-adjusted, α = " + short_number(summary.alpha) +
         "). *mean rank* is the average of the within-replicate ranks (1 = best). A trial that left "
         "masked points unfilled (partial) or failed counts in *failed*, is the worst of its replicate in "
         "every test and is left out of the means; such a method is never equivalent.\n";
}

/// One condition's table: rank, method, the ranking metric with its interval,
/// the standing, failures, the other ranked metrics and the mean rank; then
/// its Friedman test, margin and masks that failed.
std::string condition_table(const ResultSet& results, const CellGroup& g, std::size_t rank_col) {
  const auto& rc = results.columns[rank_col];
  std::string out = "\n### " + markdown_text(g.scheme) + " at rate " + format_double(g.rate) + " (" +
                    std::to_string(g.replicates) + " replicates)\n\n";
  const std::string units = series_units(results, g.series);
  std::vector<std::string> header{"rank", "method", metric_label(rc, units), "interval", "verdict", "failed"};
  std::vector<std::size_t> shown;
  for (std::size_t c = 0; c < results.columns.size(); ++c)
    if (c != rank_col && results.columns[c].direction != Direction::None) {
      shown.push_back(c);
      header.push_back(metric_label(results.columns[c], units));
    }
  header.push_back("mean rank");
  std::vector<std::vector<std::string>> rows;
  for (const auto& m : g.methods) {
    std::vector<std::string> row{std::to_string(m.rank), m.method, mean_sd(m.metrics[rank_col]),
                                 interval(m.metrics[rank_col]), standing_name(m.standing), failures(m)};
    for (auto c : shown) row.push_back(mean_sd(m.metrics[c]));
    row.push_back(short_number(m.mean_rank));
    rows.push_back(std::move(row));
  }
  out += markdown_table(header, rows);
  if (std::isfinite(g.friedman_p))
    out += "\nFriedman test over replicates: χ² = " + short_number(g.friedman_statistic) +
           ", p = " + short_number(g.friedman_p) + ".";
  out += " Equivalence margin ±" + short_number(g.margin) + " " + rc.name + ".";
  if (g.mask_failed)
    out += " " + std::to_string(g.mask_failed) + " replicate" + (g.mask_failed == 1 ? "" : "s") +
           " could not be masked and " + (g.mask_failed == 1 ? "is" : "are") + " left out.";
  return out + "\n";
}

std::string warnings_section(const std::vector<Warning>& warnings) {
  if (warnings.empty()) return "";
  std::string out = "\n## Warnings\n\n";
  for (const auto& w : warnings)
    out += "- **" + markdown_text(w.code) + "** (" + markdown_text(w.where) + "): " + markdown_text(w.message) +
           ". *" + markdown_text(w.hint) + ".*\n";
  return out;
}

class RankingMarkdown final : public Reporter {
public:
  std::string file_name() const override { return "ranking.md"; }

  std::string render(const ResultSet& results, const Summary& summary) const override {
    const std::size_t rank_col = results.column_index(results.rank_by);
    std::string out = "# Ranked fill methods: " + markdown_text(results.context.spec_name) + "\n\n";
    out += "Filled values are estimates. A benchmark on synthetic masks can flatter a method when the "
           "real gaps differ; where filled data feed safety decisions, follow the applicable standards "
           "and have a qualified person review the choice.\n\n";
    out += verdict_section(summary.verdict);
    out += how_to_read(results.columns[rank_col], summary);
    std::string current;
    for (const auto& g : summary.groups) {
      if (g.series != current) {
        current = g.series;
        out += "\n## " + markdown_text(g.series) + "\n";
      }
      out += condition_table(results, g, rank_col);
    }
    return out + warnings_section(all_warnings(results, summary));
  }
};

const Registration<Reporter> registration{{
    .name = "ranking-md",
    .summary = "the verdict and ranked tables per series, scheme and rate (Markdown)",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<RankingMarkdown>(); },
}};

}  // namespace
}  // namespace gapmark
