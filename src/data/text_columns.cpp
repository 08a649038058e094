// Plain-text tables for the terminal (see text_columns.hpp).
#include "gapmark/data/text_columns.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace gapmark::data {
namespace {

// Display width: counts UTF-8 code points, not bytes.
std::size_t width(const std::string& s) {
  std::size_t n = 0;
  for (unsigned char c : s) n += (c & 0xC0) != 0x80;
  return n;
}

}  // namespace

std::string aligned_table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
                          std::size_t first_numeric, std::size_t indent) {
  std::vector<std::size_t> w(header.size(), 0);
  for (std::size_t c = 0; c < header.size(); ++c) w[c] = width(header[c]);
  for (const auto& row : rows)
    for (std::size_t c = 0; c < row.size() && c < w.size(); ++c) w[c] = std::max(w[c], width(row[c]));
  std::string out;
  const auto line = [&](const std::vector<std::string>& cells) {
    std::string text(indent, ' ');
    for (std::size_t c = 0; c < w.size(); ++c) {
      const std::string cell = c < cells.size() ? cells[c] : "";
      const std::string pad(w[c] - width(cell), ' ');
      if (c > 0) text += "  ";
      text += c >= first_numeric ? pad + cell : cell + (c + 1 < w.size() ? pad : "");
    }
    while (!text.empty() && text.back() == ' ') text.pop_back();
    out += text + "\n";
  };
  line(header);
  for (const auto& row : rows) line(row);
  return out;
}

std::string percent(double share) {
  if (!std::isfinite(share)) return "n/a";
  const double p = share * 100;
  char buf[32];
  if (p == 0 || p >= 10 || p == 100)
    std::snprintf(buf, sizeof buf, "%.0f%%", p);
  else if (p >= 1)
    std::snprintf(buf, sizeof buf, "%.1f%%", p);
  else
    std::snprintf(buf, sizeof buf, "%.2f%%", p);
  return buf;
}

}  // namespace gapmark::data
