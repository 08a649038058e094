// Reading raw rows: find the time, group and value columns, parse every time
// once, check that the times agree in kind and UTC offset, and sort the rows
// into groups by their key values.
#include "gapmark/raw_table.hpp"

#include <algorithm>
#include <map>

#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark {
namespace {

std::string join(const std::vector<std::string>& names) {
  std::string out;
  for (const auto& n : names) out += (out.empty() ? "" : ", ") + n;
  return out;
}

std::string offset_text(std::optional<int> minutes, bool utc_z) {
  if (!minutes) return "no offset";
  if (*minutes == 0 && utc_z) return "Z";
  const int a = *minutes < 0 ? -*minutes : *minutes;
  char buf[16];
  std::snprintf(buf, sizeof buf, "%c%02d:%02d", *minutes < 0 ? '-' : '+', a / 60, a % 60);
  return buf;
}

const char* kind_text(TimeKind kind) {
  switch (kind) {
    case TimeKind::Index: return "an integer";
    case TimeKind::Date: return "a date";
    case TimeKind::DateTime: return "a date-time";
  }
  return "a time";
}

std::size_t find_column(const CsvTable& csv, const std::string& name, const std::string& role) {
  const auto it = std::find(csv.header.begin(), csv.header.end(), name);
  if (it == csv.header.end())
    throw InputError(csv.source + ":1", "no " + role + " column '" + name + "' (columns: " + join(csv.header) + ")");
  return static_cast<std::size_t>(it - csv.header.begin());
}

}  // namespace

std::string RawData::where(std::size_t row) const { return source + ":" + std::to_string(lines[row]); }

std::size_t RawData::value_index(const std::string& name) const {
  const auto it = std::find(value_columns.begin(), value_columns.end(), name);
  if (it == value_columns.end())
    throw InputError(source + ":1", "no value column '" + name + "' (value columns: " + join(value_columns) + ")");
  return static_cast<std::size_t>(it - value_columns.begin());
}

std::vector<std::pair<std::string, std::string>> RawData::group_pairs(std::size_t group) const {
  std::vector<std::pair<std::string, std::string>> out;
  for (std::size_t g = 0; g < group_columns.size(); ++g) out.emplace_back(group_columns[g], groups[group].keys[g]);
  return out;
}

std::vector<std::string> split_names(const std::vector<std::string>& items) {
  std::vector<std::string> out;
  for (const auto& item : items) {
    std::string_view rest = item;
    while (true) {
      const auto comma = rest.find(',');
      const std::string_view name = trim(rest.substr(0, comma));
      if (!name.empty()) out.emplace_back(name);
      if (comma == std::string_view::npos) break;
      rest = rest.substr(comma + 1);
    }
  }
  return out;
}

int parse_utc_offset(const std::string& text, const std::string& where) {
  // Reuse the time parser: an offset is valid when it completes a date-time.
  const auto t = parse_time("2000-01-01T00:00" + std::string(trim(text)));
  if (!t || !t->offset_minutes)
    throw InputError(where, "not a UTC offset: '" + text + "' (write +01:00, -05:30 or Z)");
  return *t->offset_minutes;
}

namespace {

/// Where the time, group and value columns are in the file.
struct ColumnPlan {
  std::vector<std::size_t> group_at;
  std::size_t time_at = 0;
  std::vector<std::size_t> value_at;
};

std::vector<std::size_t> group_columns_at(const CsvTable& csv, const RawReadOptions& options) {
  std::vector<std::size_t> group_at;
  for (const auto& g : options.group_columns) {
    const std::size_t c = find_column(csv, g, "group");
    if (std::find(group_at.begin(), group_at.end(), c) != group_at.end())
      throw InputError(csv.source + ":1", "group column '" + g + "' is named twice");
    group_at.push_back(c);
  }
  return group_at;
}

/// The time column named, else the first that is not a group.
std::size_t time_column_at(const CsvTable& csv, const RawReadOptions& options, const std::vector<std::size_t>& group_at) {
  const auto is_group = [&group_at](std::size_t c) {
    return std::find(group_at.begin(), group_at.end(), c) != group_at.end();
  };
  if (!options.time_column.empty()) {
    const std::size_t time_at = find_column(csv, options.time_column, "time");
    if (is_group(time_at))
      throw InputError(csv.source + ":1", "column '" + options.time_column + "' cannot be both the time and a group");
    return time_at;
  }
  for (std::size_t c = 0; c < csv.header.size(); ++c)
    if (!is_group(c)) return c;
  throw InputError(csv.source + ":1", "no time column left after the group columns");
}

/// The value columns named, else every column but the time and the groups.
std::vector<std::size_t> value_columns_at(const CsvTable& csv, const RawReadOptions& options, const ColumnPlan& plan) {
  const auto is_group = [&plan](std::size_t c) {
    return std::find(plan.group_at.begin(), plan.group_at.end(), c) != plan.group_at.end();
  };
  std::vector<std::size_t> value_at;
  if (!options.value_columns.empty()) {
    for (const auto& v : options.value_columns) {
      const std::size_t c = find_column(csv, v, "value");
      if (c == plan.time_at || is_group(c))
        throw InputError(csv.source + ":1", "column '" + v + "' is the time or a group column, not a value column");
      value_at.push_back(c);
    }
  } else {
    for (std::size_t c = 0; c < csv.header.size(); ++c)
      if (c != plan.time_at && !is_group(c)) value_at.push_back(c);
  }
  if (value_at.empty()) throw InputError(csv.source + ":1", "no value columns besides the time and group columns");
  return value_at;
}

ColumnPlan plan_columns(const CsvTable& csv, const RawReadOptions& options) {
  ColumnPlan plan;
  plan.group_at = group_columns_at(csv, options);
  plan.time_at = time_column_at(csv, options, plan.group_at);
  plan.value_at = value_columns_at(csv, options, plan);
  return plan;
}

/// Reads the time column row by row: one kind of time throughout; one UTC
/// offset, or with a target offset, times converted to it (then offsets on
/// every time or on none).
class TimeColumnReader {
public:
  TimeColumnReader(const std::string& column, std::optional<int> utc_offset_minutes)
      : column_(column), utc_offset_minutes_(utc_offset_minutes) {}

  std::int64_t read(const std::string& cell, std::size_t line, const std::string& where) {
    auto t = parse_time(cell);
    if (!t) {
      if (trim(cell).empty()) throw InputError(where, "column '" + column_ + "': missing time");
      throw InputError(where, "column '" + column_ + "': not a time: '" + cell +
                                  "' (expected an integer, YYYY-MM-DD, or YYYY-MM-DDThh:mm[:ss] with an optional Z or +hh:mm)");
    }
    if (!first_) {
      first_ = t;
      first_line_ = line;
    } else if (t->kind != first_->kind) {
      throw InputError(where, "column '" + column_ + "': mixed time formats: " + kind_text(t->kind) + " here, " +
                                  kind_text(first_->kind) + " on line " + std::to_string(first_line_));
    }
    note_offset(*t, line);
    if (utc_offset_minutes_) {
      if (offset_seen_ && naive_seen_)
        throw InputError(where, "column '" + column_ + "': times with and without a UTC offset (line " +
                                    std::to_string(t->offset_minutes ? naive_line_ : offset_line_) +
                                    "); write an offset on every time or on none");
      if (t->offset_minutes) t->value += std::int64_t(*utc_offset_minutes_ - *t->offset_minutes) * 60;
    } else if (t->offset_minutes != first_->offset_minutes) {
      throw InputError(where, "column '" + column_ + "': mixed UTC offsets: " +
                                  offset_text(t->offset_minutes, t->utc_z) + " here, " +
                                  offset_text(first_->offset_minutes, first_->utc_z) + " on line " +
                                  std::to_string(first_line_) + " (give --utc-offset to convert every time to one offset)");
    }
    return t->value;
  }

  /// The kind of the times and the offset they are written at.
  void describe(RawData& data) const {
    data.kind = first_->kind;
    if (utc_offset_minutes_ && data.kind == TimeKind::DateTime) {
      data.offset_minutes = utc_offset_minutes_;
      data.utc_z = false;
    } else if (!utc_offset_minutes_) {
      data.offset_minutes = first_->offset_minutes;
      data.utc_z = first_->utc_z;
    }
  }

private:
  void note_offset(const TimePoint& t, std::size_t line) {
    if (t.offset_minutes) {
      if (!offset_seen_) offset_line_ = line;
      offset_seen_ = true;
    } else {
      if (!naive_seen_) naive_line_ = line;
      naive_seen_ = true;
    }
  }

  const std::string& column_;
  std::optional<int> utc_offset_minutes_;
  std::optional<TimePoint> first_;
  std::size_t first_line_ = 0;
  bool naive_seen_ = false, offset_seen_ = false;
  std::size_t naive_line_ = 0, offset_line_ = 0;
};

/// Row r's group keys (trimmed; none may be empty).
std::vector<std::string> group_keys(const CsvTable& csv, std::size_t r, const std::vector<std::size_t>& group_at,
                                    const std::string& where) {
  std::vector<std::string> keys;
  for (std::size_t c : group_at) {
    keys.emplace_back(trim(csv.rows[r][c]));
    if (keys.back().empty()) throw InputError(where, "group column '" + csv.header[c] + "' is empty");
  }
  return keys;
}

}  // namespace

RawData parse_raw(const CsvTable& csv, const RawReadOptions& options) {
  RawData data;
  data.source = csv.source;
  data.group_columns = options.group_columns;
  const ColumnPlan plan = plan_columns(csv, options);
  data.time_column = csv.header[plan.time_at];
  for (std::size_t c : plan.value_at) data.value_columns.push_back(csv.header[c]);
  if (csv.rows.empty()) throw InputError(csv.source, "no data rows below the header");

  const std::size_t n = csv.rows.size();
  data.times.reserve(n);
  data.lines = csv.lines;
  data.cells.assign(plan.value_at.size(), std::vector<std::string>(n));
  std::map<std::vector<std::string>, std::size_t> group_of;
  TimeColumnReader time_reader(data.time_column, options.utc_offset_minutes);
  for (std::size_t r = 0; r < n; ++r) {
    const std::string where = csv.source + ":" + std::to_string(csv.lines[r]);
    data.times.push_back(time_reader.read(csv.rows[r][plan.time_at], csv.lines[r], where));
    for (std::size_t v = 0; v < plan.value_at.size(); ++v) data.cells[v][r] = csv.rows[r][plan.value_at[v]];
    std::vector<std::string> keys = group_keys(csv, r, plan.group_at, where);
    auto [it, added] = group_of.emplace(keys, data.groups.size());
    if (added) data.groups.push_back({keys, {}});
    data.groups[it->second].rows.push_back(r);
  }
  time_reader.describe(data);
  return data;
}

RawData read_raw(const std::filesystem::path& path, const RawReadOptions& options) {
  return parse_raw(read_csv(path), options);
}

}  // namespace gapmark
