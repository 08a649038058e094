#pragma once
// CSV (RFC 4180) in and out. A wide table has a time column and one column
// per variable; cells keep their original text so that a rewritten file
// changes only the cells that were filled.
#include <cstddef>
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "gapmark/time_axis.hpp"

namespace gapmark {

/// Raw CSV: a header and rows of cells, with the file line of each row.
struct CsvTable {
  std::string source;                          ///< file name, for messages
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;  ///< each the header's width
  std::vector<std::size_t> lines;              ///< 1-based file line of each row
};

/// Parses RFC 4180 text (quotes, doubled quotes, CRLF or LF). Every row must
/// have the header's width; errors name `source` and the line.
CsvTable parse_csv(std::string_view text, const std::string& source);
/// Reads a file and parses it; a missing or unreadable file is an InputError.
CsvTable read_csv(const std::filesystem::path& path);

/// A wide table with a regular time axis.
struct WideTable {
  std::string source;
  std::string time_header;
  std::vector<std::string> time_text;        ///< the time cells as written
  TimeAxis axis;
  std::vector<std::string> columns;          ///< variable names
  std::vector<std::vector<double>> values;   ///< values[c][row], NaN = missing
  std::vector<std::vector<std::string>> cells;  ///< cells[c][row] as written
  /// Rows added for grid times the file had no row for (a given step); their
  /// values are missing and their time cells written from the axis.
  std::size_t added_rows = 0;

  /// Index of a column by name; InputError naming the file when absent.
  std::size_t column_index(const std::string& name) const;
};

struct WideReadOptions {
  std::string time_column;        ///< empty: the first column
  std::optional<Step> step;       ///< empty: inferred, and every step must have its row
};

/// Reads a wide CSV: the time column (ISO 8601 dates or date-times, or
/// integers) must be regular, or, with a given step, on that step's grid
/// (times without a row become rows of missing values); every other cell is
/// a number or a missing token (empty, NA, NaN). Errors name the file, line
/// and column.
WideTable read_wide_csv(const std::filesystem::path& path, const WideReadOptions& options = {});
WideTable parse_wide_csv(const CsvTable& csv, const WideReadOptions& options = {});

/// Quotes a cell when RFC 4180 requires it.
std::string csv_escape(const std::string& cell);
/// Writes rows as CSV text (LF line ends).
std::string to_csv(const std::vector<std::string>& header,
                   const std::vector<std::vector<std::string>>& rows);

/// Writes `content` to `path` through a temporary file in the same folder and
/// a rename, so that a reader never sees a half-written file. Creates parent
/// folders. Errors name the path.
void write_file_atomically(const std::filesystem::path& path, const std::string& content);

/// Reads a whole file; InputError naming it when it cannot.
std::string read_text_file(const std::filesystem::path& path);

}  // namespace gapmark
