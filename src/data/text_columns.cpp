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
