#include "gapmark/report/table_text.hpp"

#include "gapmark/text_safety.hpp"

#include <cmath>
#include <cstdio>

namespace gapmark {

std::string short_number(double value) {
  if (std::isnan(value)) return "n/a";
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.4g", value);
  return buffer;
}

std::string mean_sd(const MetricSummary& s) {
  if (s.n == 0 || std::isnan(s.mean)) return "n/a";
  if (std::isnan(s.sd)) return short_number(s.mean);
  return short_number(s.mean) + " ± " + short_number(s.sd);
}

std::string interval(const MetricSummary& s) {
  if (std::isnan(s.ci_low)) return "";
  return "[" + short_number(s.ci_low) + ", " + short_number(s.ci_high) + "]";
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
