#include "gapmark/report/table_text.hpp"

#include "gapmark/text_safety.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace gapmark {

namespace {

/// The decimals of a summary: from its interval, or from ±2 sd without one.
int summary_decimals(const MetricSummary& s) {
  if (std::isfinite(s.ci_low) && std::isfinite(s.ci_high)) return supported_decimals(s.ci_low, s.ci_high);
  if (std::isfinite(s.sd)) return supported_decimals(s.mean - 2 * s.sd, s.mean + 2 * s.sd);
  return -1;
}

}  // namespace

std::string mean_sd(const MetricSummary& s) {
  if (s.n == 0 || std::isnan(s.mean)) return "n/a";
  if (std::isnan(s.sd)) return short_number(s.mean);
  const int decimals = summary_decimals(s);
  // An sd that is numerical noise (below 1e-9 of the mean) is zero.
  const bool noise = !(s.sd > 1e-9 * std::abs(s.mean));
  if (decimals < 0) return short_number(s.mean) + " ± " + (noise ? "0" : short_number(s.sd));
  return fixed_number(s.mean, decimals) + " ± " + fixed_number(noise ? 0.0 : s.sd, decimals);
}

std::string interval(const MetricSummary& s) {
  if (std::isnan(s.ci_low)) return "";
  const int decimals = summary_decimals(s);
  return "[" + fixed_number(s.ci_low, decimals) + ", " + fixed_number(s.ci_high, decimals) + "]";
}

std::string series_units(const ResultSet& results, const std::string& label) {
  const SeriesDescription* s = find_series(results.series, label);
  return s ? s->units : "";
}

std::string metric_label(const MetricColumn& column, const std::string& units) {
  return column.unit == "value" && !units.empty() ? column.name + " (" + units + ")" : column.name;
}

std::string direction_words(Direction d) {
  switch (d) {
    case Direction::Lower: return "lower is better";
    case Direction::ZeroBest: return "closer to 0 is better";
    case Direction::Higher: return "higher is better";
    case Direction::OneBest: return "closer to 1 is better";
    case Direction::None: return "descriptive";
  }
  return "";
}

std::string markdown_text(const std::string& text) {
  const std::string valid = utf8_replaced(text);
  std::string out;
  out.reserve(valid.size());
  for (char c : valid) {
    const auto u = static_cast<unsigned char>(c);
    if (u < 0x20 || u == 0x7F) out += ' ';
    else if (c == '<') out += "&lt;";
    else if (c == '>') out += "&gt;";
    else if (c == '&') out += "&amp;";
    else if (c == '\\' || c == '`' || c == '*' || c == '|') {
      out += '\\';
      out += c;
    } else {
      out += c;
    }
  }
  return out;
}

std::string markdown_code(const std::string& text) {
  const std::string shown = printable(text, 200);
  if (shown.find('`') == std::string::npos) return "`" + shown + "`";
  return "`` " + shown + " ``";
}

std::string markdown_table(const std::vector<std::string>& header,
                           const std::vector<std::vector<std::string>>& rows) {
  const auto escape = [](const std::string& cell) { return markdown_text(cell); };
  std::string out = "|";
  for (const auto& h : header) out += " " + escape(h) + " |";
  out += "\n|";
  for (std::size_t i = 0; i < header.size(); ++i) out += i < 2 ? "---|" : "--:|";
  out += "\n";
  for (const auto& row : rows) {
    out += "|";
    for (const auto& cell : row) out += " " + escape(cell) + " |";
    out += "\n";
  }
  return out;
}

}  // namespace gapmark
