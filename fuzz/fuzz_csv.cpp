// Fuzz target: the CSV readers. The text is parsed as CSV, then read as a
// wide table, as raw rows (profile, regularize) and as a long table grouped
// by its first column. Each must either accept it or raise an InputError
// (one line naming the place); anything else is a bug.
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "gapmark/long_layout.hpp"
#include "gapmark/raw_table.hpp"
#include "gapmark/error.hpp"
#include "gapmark/table_io.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  gapmark::CsvTable csv;
  try {
    csv = gapmark::parse_csv(text, "fuzz.csv");
  } catch (const gapmark::InputError&) {
    return 0;
  }
  for (std::size_t r = 0; r < csv.rows.size(); ++r)
    if (csv.rows[r].size() != csv.header.size() || csv.lines.size() != csv.rows.size()) __builtin_trap();
  try {
    const gapmark::WideTable table = gapmark::parse_wide_csv(csv);
    // A table that was accepted holds one value per row in each column.
    for (const auto& column : table.values)
      if (column.size() != table.axis.size()) __builtin_trap();
  } catch (const gapmark::InputError&) {
  }
  try {
    const gapmark::RawData raw = gapmark::parse_raw(csv);
    if (raw.lines.size() != raw.row_count()) __builtin_trap();
  } catch (const gapmark::InputError&) {
  }
  if (csv.header.size() >= 3) {
    try {
      gapmark::LongReadOptions options;
      options.group_columns = {csv.header[0]};
      (void)gapmark::read_long_series(csv, options);
    } catch (const gapmark::InputError&) {
    }
  }
  return 0;
}
