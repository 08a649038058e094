#include "gapmark/wide_write.hpp"

#include <numeric>

namespace gapmark {

std::string write_wide_csv(const WideTable& table, const std::vector<ExtraColumn>& extra) {
  std::vector<std::string> header{table.time_header};
  header.insert(header.end(), table.columns.begin(), table.columns.end());
  for (const auto& [name, cells] : extra) header.push_back(name);
  std::vector<std::vector<std::string>> rows(table.time_text.size());
  for (std::size_t r = 0; r < rows.size(); ++r) {
    auto& row = rows[r];
    row.reserve(header.size());
    row.push_back(table.time_text[r]);
    for (const auto& column : table.cells) row.push_back(column[r]);
    for (const auto& [name, cells] : extra) row.push_back(cells[r]);
  }
  return to_csv(header, rows);
}

std::vector<std::size_t> select_columns(const WideTable& table, const std::vector<std::string>& names) {
  std::vector<std::size_t> out;
  if (names.empty()) {
    out.resize(table.columns.size());
    std::iota(out.begin(), out.end(), std::size_t{0});
    return out;
  }
  for (const auto& n : names) out.push_back(table.column_index(n));
  return out;
}

}  // namespace gapmark
