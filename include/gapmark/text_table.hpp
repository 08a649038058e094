#pragma once
// Plain-text tables for the terminal: columns padded to their widest cell
// (width in UTF-8 code points), two spaces between columns, no trailing blanks.
#include <cstddef>
#include <limits>
#include <string>
#include <vector>

namespace gapmark {

struct TextTableLayout {
  /// Columns in [right_from, right_until) are right-aligned (numbers); the others left.
  std::size_t right_from = std::numeric_limits<std::size_t>::max();
  std::size_t right_until = std::numeric_limits<std::size_t>::max();
  std::size_t indent = 0;  ///< spaces before every line
  bool rule = false;       ///< a line of dashes under the header
};

std::string text_table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
                       const TextTableLayout& layout);

}  // namespace gapmark
