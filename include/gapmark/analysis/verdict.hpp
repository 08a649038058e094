#pragma once
// The verdict: per series, the recommended method, the methods shown to be
// as good as it, the reasons and the caveats, read from a summary by one
// rule (docs/statistics.md, "The verdict"). summarize() computes it once;
// report.html, ranking.md, ranking.csv, methods.md, results.json and
// `gapmark quick`'s screen print it and decide nothing themselves.
#include <cstddef>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

namespace gapmark {

struct Summary;
struct ResultSet;

struct SeriesVerdict {
  std::string series;
  std::string recommended;                ///< "" when no method could be ranked
  std::vector<std::string> equally_good;  ///< best or equivalent wherever the recommended one is
  std::vector<std::string> reasons;       ///< sentences, each ending with a full stop
  std::vector<std::string> caveats;       ///< sentences, each ending with a full stop
  std::size_t conditions = 0;             ///< conditions of the series counted (excluded ones aside)
  std::size_t top = 0;                    ///< conditions where the recommended method is best or equivalent
};

struct RunVerdict {
  std::vector<SeriesVerdict> series;  ///< in the order of the series in the results
  std::vector<std::string> notes;     ///< run-wide: left-out conditions, across-series caveats
};

/// Applies the rule to a summary whose groups, standings and warnings are set.
RunVerdict decide_verdict(const Summary& summary, const ResultSet& results);

/// The verdict of one series, or nullptr.
const SeriesVerdict* verdict_for(const RunVerdict& verdict, const std::string& series);

nlohmann::json verdict_to_json(const RunVerdict& verdict);

/// The verdict as plain text lines: "series: recommended X; equally good: ..."
/// followed by indented reasons and caveats. Screens and Markdown print this.
std::string verdict_text(const RunVerdict& verdict, const std::string& indent = "  ");

/// "a", "a and b", "a, b and c".
std::string join_words(const std::vector<std::string>& items, const std::string& last = "and");

}  // namespace gapmark
