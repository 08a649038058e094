#pragma once
// Shared text helpers for reporters: compact numbers for people, and a
// Markdown table builder.
#include <string>
#include <vector>

#include "gapmark/analysis/summary.hpp"
#include "gapmark/number_format.hpp"  // short_number

namespace gapmark {

/// "mean ± sd" rounded to what the interval supports (supported_decimals; an
/// sd below that precision shows as 0), or "mean" when sd is undefined; "n/a"
/// without a mean.
std::string mean_sd(const MetricSummary& s);
/// "[lo, hi]" rounded as mean_sd rounds, or "".
std::string interval(const MetricSummary& s);
/// The units the spec gave the series `label` ("" when none), from the
/// results' facts about their series.
std::string series_units(const ResultSet& results, const std::string& label);
/// "rmse (mg/L)" for a metric in the data's own units (unit "value") when
/// the units are known; the bare name otherwise.
std::string metric_label(const MetricColumn& column, const std::string& units);

/// Words for a direction: "lower is better", "closer to 0 is better", ...
std::string direction_words(Direction d);

/// Text from the data or the spec (a series, method or scheme name) for
/// Markdown prose, headings and table cells: line breaks and control bytes
/// become spaces, and the characters Markdown or HTML would read as markup
/// (\ ` * [ ] | # < > &) are escaped, so a name cannot inject markup, break a

std::string markdown_text(const std::string& text);
/// The same inside a code span (`name`): control bytes escaped, and a name
/// holding a backtick fenced with two.
std::string markdown_code(const std::string& text);

/// A Markdown table: header, rows, each cell passed through markdown_text.
std::string markdown_table(const std::vector<std::string>& header,
                           const std::vector<std::vector<std::string>>& rows);

}  // namespace gapmark
