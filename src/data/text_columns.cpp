// Plain-text tables for the terminal (see text_columns.hpp).
#include "gapmark/data/text_columns.hpp"

#include <cmath>
#include <cstdio>

#include "gapmark/text_table.hpp"

namespace gapmark::data {
std::string aligned_table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
                          std::size_t first_numeric, std::size_t indent) {
  return text_table(header, rows, {.right_from = first_numeric, .indent = indent});
}

}  // namespace gapmark::data
