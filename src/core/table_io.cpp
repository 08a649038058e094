// CSV in and out (RFC 4180), wide tables with a regular time axis, and
// whole-file reads and atomic writes.
#include "gapmark/table_io.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <string_view>
#include <unordered_map>
#include <fstream>

#include "gapmark/error.hpp"
#include "gapmark/output_file.hpp"
#include "gapmark/text_safety.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark {
namespace {

std::string at_line(const std::string& source, std::size_t line) {
  return source + ":" + std::to_string(line);
}

std::string join_names(const std::vector<std::string>& names) {
  std::string out;
  for (const std::string& n : names) out += (out.empty() ? "" : ", ") + n;
  return out;
}

// One record of a CSV text, with the line it starts on.
struct Record {
  std::vector<std::string> fields;
  std::size_t line = 0;
  bool blank = false;  // an empty line: one unquoted empty field
};

class CsvReader {
public:
  CsvReader(std::string_view text, const std::string& source) : text_(text), source_(source) {
    if (text_.starts_with("\xEF\xBB\xBF")) text_.remove_prefix(3);
  }

  bool done() const { return pos_ >= text_.size(); }

  Record next() {
    Record record;
    record.line = line_;
    bool quoted_any = false;
    while (true) {
      std::string field;
      if (pos_ < text_.size() && text_[pos_] == '"') {
        quoted_any = true;
        read_quoted(field);
      } else {
        read_plain(field);
      }
      record.fields.push_back(std::move(field));
      if (pos_ < text_.size() && text_[pos_] == ',') {
        ++pos_;
        continue;
      }
      end_line();
      break;
    }
    record.blank = !quoted_any && record.fields.size() == 1 && record.fields[0].empty();
    return record;
  }

private:
  bool at_line_end() const {
    return pos_ >= text_.size() || text_[pos_] == '\n' || text_[pos_] == '\r';
  }

  // Consumes LF, CRLF or a lone CR, counting the line.
  void end_line() {
    if (pos_ >= text_.size()) return;
    if (text_[pos_] == '\r' && pos_ + 1 < text_.size() && text_[pos_ + 1] == '\n') ++pos_;
    ++pos_;
    ++line_;
  }

  void read_plain(std::string& field) {
    const std::size_t start = pos_;
    while (pos_ < text_.size() && text_[pos_] != ',' && !at_line_end()) {
      if (text_[pos_] == '"')
        throw InputError(at_line(source_, line_),
                         "quote inside an unquoted cell (enclose the cell in quotes and double "
                         "the quote inside it)");
      ++pos_;
    }
    field.assign(text_.substr(start, pos_ - start));
  }

  void read_quoted(std::string& field) {
    const std::size_t opened_on = line_;
    ++pos_;  // the opening quote
    while (true) {
      if (pos_ >= text_.size())
        throw InputError(at_line(source_, opened_on),
                         "unterminated quote (a cell opened with \" on this line never closes)");
      const char c = text_[pos_];
      if (c == '"') {
        if (pos_ + 1 < text_.size() && text_[pos_ + 1] == '"') {
          field += '"';
          pos_ += 2;
          continue;
        }
        ++pos_;
        break;
      }
      if (c == '\n' || (c == '\r' && !(pos_ + 1 < text_.size() && text_[pos_ + 1] == '\n')))
        ++line_;
      field += c;
      ++pos_;
    }
    if (pos_ < text_.size() && text_[pos_] != ',' && !at_line_end())
      throw InputError(at_line(source_, line_),
                       "text after a closing quote (a quoted cell must end at a comma or the "
                       "end of the line)");
  }

  std::string_view text_;
  const std::string& source_;
  std::size_t pos_ = 0;
  std::size_t line_ = 1;
};

void check_header(const CsvTable& table, std::size_t line) {
  std::unordered_map<std::string_view, std::size_t> first_at;  // linear in the number of columns
  first_at.reserve(table.header.size());
  for (std::size_t c = 0; c < table.header.size(); ++c) {
    if (table.header[c].empty())
      throw InputError(at_line(table.source, line),
                       "column " + std::to_string(c + 1) + " has an empty name");
    const auto [it, added] = first_at.emplace(table.header[c], c);
    if (!added)
      throw InputError(at_line(table.source, line),
                       "duplicate column name " + quoted_for_message(table.header[c]) + " (columns " +
                           std::to_string(it->second + 1) + " and " + std::to_string(c + 1) + ")");
  }
}

/// Refuses text that is not UTF-8, naming the line and column (in bytes)
/// of the first bad byte.
void check_utf8(std::string_view text, const std::string& source) {
  const auto bad = first_invalid_utf8(text);
  if (!bad) return;
  std::size_t line = 1, line_start = 0;
  for (std::size_t i = 0; i < *bad; ++i)
    if (text[i] == '\n') {
      ++line;
      line_start = i + 1;
    }
  char byte[8];
  std::snprintf(byte, sizeof byte, "0x%02X", static_cast<unsigned char>(text[*bad]));
  throw InputError(at_line(source, line) + ":" + std::to_string(*bad - line_start + 1),
                   std::string("not UTF-8 text (byte ") + byte +
                       "); save the file as UTF-8 (a spreadsheet's \"CSV UTF-8\", or iconv -f latin1 -t utf-8)");
}

}  // namespace

// ---- CSV ---------------------------------------------------------------------

CsvTable parse_csv(std::string_view text, const std::string& source) {
  check_utf8(text, source);
  CsvReader reader(text, source);
  std::vector<Record> records;
  while (!reader.done()) records.push_back(reader.next());
  // Blank lines at the end are not rows.
  while (!records.empty() && records.back().blank) records.pop_back();
  if (records.empty()) throw InputError(source, "empty file");

  CsvTable table;
  table.source = source;
  for (const std::string& name : records.front().fields) table.header.emplace_back(trim(name));
  check_header(table, records.front().line);
  const std::size_t width = table.header.size();
  for (std::size_t r = 1; r < records.size(); ++r) {
    Record& record = records[r];
    if (record.fields.size() != width)
      throw InputError(at_line(source, record.line),
                       "expected " + std::to_string(width) + " fields, found " +
                           std::to_string(record.fields.size()));
    table.rows.push_back(std::move(record.fields));
    table.lines.push_back(record.line);
  }
  return table;
}

CsvTable read_csv(const std::filesystem::path& path) {
  return parse_csv(read_text_file(path), path.string());
}

std::string csv_escape(const std::string& cell) {
  if (cell.find_first_of(",\"\r\n") == std::string::npos) return cell;
  std::string out = "\"";
  for (char c : cell) {
    if (c == '"') out += '"';
    out += c;
  }
  out += '"';
  return out;
}

std::string to_csv(const std::vector<std::string>& header,
                   const std::vector<std::vector<std::string>>& rows) {
  std::string out;
  const auto add_row = [&out](const std::vector<std::string>& cells) {
    // A lone empty cell is quoted so that the line does not read as blank.
    if (cells.size() == 1 && cells[0].empty()) {
      out += "\"\"\n";
      return;
    }
    for (std::size_t c = 0; c < cells.size(); ++c) {
      if (c > 0) out += ',';
      out += csv_escape(cells[c]);
    }
    out += '\n';
  };
  add_row(header);
  for (const auto& row : rows) add_row(row);
  return out;
}

// ---- wide tables -----------------------------------------------------------------

std::size_t WideTable::column_index(const std::string& name) const {
  const auto it = std::find(columns.begin(), columns.end(), name);
  if (it == columns.end())
    throw InputError(source, "no column named '" + name + "' (columns: " + join_names(columns) + ")");
  return static_cast<std::size_t>(it - columns.begin());
}

namespace {

/// The time column's index: the one named, else the first; the file must
/// have a value column and a data row.
std::size_t time_column_of(const CsvTable& csv, const WideReadOptions& options) {
  std::size_t time_col = 0;
  if (!options.time_column.empty()) {
    const auto it = std::find(csv.header.begin(), csv.header.end(), options.time_column);
    if (it == csv.header.end())
      throw InputError(csv.source, "no time column named '" + options.time_column +
                                       "' (columns: " + join_names(csv.header) + ")");
    time_col = static_cast<std::size_t>(it - csv.header.begin());
  }
  if (csv.header.size() < 2)
    throw InputError(csv.source,
                     "no value columns: the file has only the time column '" + csv.header[time_col] + "'");
  if (csv.rows.empty()) throw InputError(csv.source, "no data rows below the header");
  return time_col;
}

/// Every row's time, parsed; the cells as written go to table.time_text.
std::vector<TimePoint> read_times(const CsvTable& csv, std::size_t time_col, WideTable& table) {
  std::vector<TimePoint> times;
  times.reserve(csv.rows.size());
  for (std::size_t r = 0; r < csv.rows.size(); ++r) {
    const std::string& cell = csv.rows[r][time_col];
    const auto time = parse_time(cell);
    if (!time) {
      const std::string where = at_line(csv.source, csv.lines[r]);
      if (trim(cell).empty())
        throw InputError(where, "column '" + table.time_header + "': missing time");
      throw InputError(where, "column '" + table.time_header + "': not a time: " + quoted_for_message(cell) +
                                  " (expected an integer within ±10^18, YYYY-MM-DD, or YYYY-MM-DDThh:mm[:ss] "
                                  "with an optional Z or +hh:mm)");
    }
    times.push_back(*time);
    table.time_text.push_back(cell);
  }
  return times;
}

/// Column c's numbers (NaN for a missing token) and cells, added to the table.
void add_value_column(const CsvTable& csv, std::size_t c, WideTable& table) {
  const std::size_t n = csv.rows.size();
  const std::string& name = csv.header[c];
  std::vector<double> values(n);
  std::vector<std::string> cells(n);
  for (std::size_t r = 0; r < n; ++r) {
    const std::string& cell = csv.rows[r][c];
    cells[r] = cell;
    if (is_missing_token(cell)) {
      values[r] = std::nan("");
      continue;
    }
    const auto value = parse_double(cell);
    const std::string where = at_line(csv.source, csv.lines[r]);
    if (!value) throw InputError(where, "column '" + name + "': not a number: " + quoted_for_message(cell));
    if (!std::isfinite(*value))
      throw InputError(where, "column '" + name + "': not a finite number: '" + cell + "'");
    values[r] = *value;
  }
  table.columns.push_back(name);
  table.values.push_back(std::move(values));
  table.cells.push_back(std::move(cells));
}

/// Moves the n rows read to their `position` on the axis; the grid times
/// without a row become rows of missing values, their time written from the axis.
void spread_onto_axis(WideTable& table, const std::vector<std::size_t>& position, std::size_t n) {
  const std::size_t points = table.axis.size();
  std::vector<std::string> time_text(points);
  for (std::size_t k = 0; k < points; ++k) time_text[k] = table.axis.format(k);
  for (std::size_t r = 0; r < n; ++r) time_text[position[r]] = table.time_text[r];
  table.time_text = std::move(time_text);
  for (std::size_t c = 0; c < table.columns.size(); ++c) {
    std::vector<double> values(points, std::nan(""));
    std::vector<std::string> cells(points);
    for (std::size_t r = 0; r < n; ++r) {
      values[position[r]] = table.values[c][r];
      cells[position[r]] = std::move(table.cells[c][r]);
    }
    table.values[c] = std::move(values);
    table.cells[c] = std::move(cells);
  }
  table.added_rows = points - n;
}

}  // namespace

WideTable parse_wide_csv(const CsvTable& csv, const WideReadOptions& options) {
  const std::size_t time_col = time_column_of(csv, options);
  WideTable table;
  table.source = csv.source;
  table.time_header = csv.header[time_col];
  const std::vector<TimePoint> times = read_times(csv, time_col, table);
  for (std::size_t c = 0; c < csv.header.size(); ++c)
    if (c != time_col) add_value_column(csv, c, table);
  if (!options.step) {
    table.axis = infer_axis(times, options.step, csv.source, csv.lines);
    return table;
  }
  // A given step places the rows on its grid: times it has no row for become
  // rows of missing values.
  std::vector<std::size_t> position;
  table.axis = infer_axis(times, options.step, csv.source, csv.lines, &position);
  if (table.axis.size() != csv.rows.size()) spread_onto_axis(table, position, csv.rows.size());
  return table;
}

WideTable read_wide_csv(const std::filesystem::path& path, const WideReadOptions& options) {
  return parse_wide_csv(read_csv(path), options);
}

// ---- files -------------------------------------------------------------------------

std::string read_text_file(const std::filesystem::path& path) {
  std::error_code ec;
  const auto status = std::filesystem::status(path, ec);
  if (!std::filesystem::exists(status)) throw InputError(path.string(), "no such file");
  if (std::filesystem::is_directory(status))
    throw InputError(path.string(), "is a folder, not a file");
  // A device or FIFO (/dev/zero, a pipe) could be read without end.
  if (!std::filesystem::is_regular_file(status))
    throw InputError(path.string(), "is not a regular file (a device, FIFO or socket); give a file");
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(path.string(), std::string("cannot open: ") + std::strerror(errno));
  std::string content;
  char buffer[1 << 16];
  while (in.read(buffer, sizeof buffer) || in.gcount() > 0)
    content.append(buffer, static_cast<std::size_t>(in.gcount()));
  if (in.bad()) throw InputError(path.string(), "read error");
  return content;
}

void write_file_atomically(const std::filesystem::path& path, const std::string& content) {
  TempFile temp(path);
  temp.write(content);
  temp.commit();
}

}  // namespace gapmark
