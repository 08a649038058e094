#include "gapmark/text_table.hpp"

#include <algorithm>

namespace gapmark {
namespace {

std::size_t display_width(const std::string& s) {
  std::size_t n = 0;
  for (unsigned char c : s) n += (c & 0xC0) != 0x80;  // counts UTF-8 lead bytes
  return n;
}

}  // namespace

std::string text_table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
                       const TextTableLayout& layout) {
  std::vector<std::size_t> w(header.size(), 0);
  for (std::size_t c = 0; c < header.size(); ++c) w[c] = display_width(header[c]);
  for (const auto& row : rows)
    for (std::size_t c = 0; c < row.size() && c < w.size(); ++c) w[c] = std::max(w[c], display_width(row[c]));
  std::string out;
  const auto line = [&](const std::vector<std::string>& cells) {
    std::string text(layout.indent, ' ');
    for (std::size_t c = 0; c < w.size(); ++c) {
      const std::string cell = c < cells.size() ? cells[c] : "";
      const std::string pad(w[c] - display_width(cell), ' ');
      if (c > 0) text += "  ";
      const bool right = c >= layout.right_from && c < layout.right_until;
      text += right ? pad + cell : cell + (c + 1 < w.size() ? pad : "");
    }
    while (!text.empty() && text.back() == ' ') text.pop_back();
    out += text + "\n";
  };
  line(header);
  if (layout.rule) {
    std::vector<std::string> dashes;
    for (const std::size_t width : w) dashes.emplace_back(width, '-');
    line(dashes);
  }
  for (const auto& row : rows) line(row);
  return out;
}

}  // namespace gapmark
