#pragma once
// Plain-text tables for the terminal: columns padded to their widest cell,
// text columns to the left, numbers to the right.
#include <cstddef>
#include <string>
#include <vector>

namespace gapmark::data {

/// Lays out `rows` under `header` with two spaces between columns, each line
/// indented by `indent` spaces. Columns from `first_numeric` on are
/// right-aligned.
std::string aligned_table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
                          std::size_t first_numeric, std::size_t indent = 2);


}  // namespace gapmark::data
