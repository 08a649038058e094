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

RawData parse_raw(const CsvTable& csv, const RawReadOptions& options) {
  RawData data;
  data.source = csv.source;
  data.group_columns = options.group_columns;

  std::vector<std::size_t> group_at;
  for (const auto& g : options.group_columns) {
    const std::size_t c = find_column(csv, g, "group");
    if (std::find(group_at.begin(), group_at.end(), c) != group_at.end())
      throw InputError(csv.source + ":1", "group column '" + g + "' is named twice");
    group_at.push_back(c);
  }
  std::size_t time_at = csv.header.size();
  if (!options.time_column.empty()) {
    time_at = find_column(csv, options.time_column, "time");
    if (std::find(group_at.begin(), group_at.end(), time_at) != group_at.end())
      throw InputError(csv.source + ":1", "column '" + options.time_column + "' cannot be both the time and a group");
  } else {
    for (std::size_t c = 0; c < csv.header.size() && time_at == csv.header.size(); ++c)
      if (std::find(group_at.begin(), group_at.end(), c) == group_at.end()) time_at = c;
    if (time_at == csv.header.size()) throw InputError(csv.source + ":1", "no time column left after the group columns");
  }
  data.time_column = csv.header[time_at];

  std::vector<std::size_t> value_at;
  if (!options.value_columns.empty()) {
    for (const auto& v : options.value_columns) {
      const std::size_t c = find_column(csv, v, "value");
      if (c == time_at || std::find(group_at.begin(), group_at.end(), c) != group_at.end())
        throw InputError(csv.source + ":1", "column '" + v + "' is the time or a group column, not a value column");
      value_at.push_back(c);
    }
  } else {
    for (std::size_t c = 0; c < csv.header.size(); ++c)
      if (c != time_at && std::find(group_at.begin(), group_at.end(), c) == group_at.end()) value_at.push_back(c);
  }
  if (value_at.empty()) throw InputError(csv.source + ":1", "no value columns besides the time and group columns");
  for (std::size_t c : value_at) data.value_columns.push_back(csv.header[c]);
  if (csv.rows.empty()) throw InputError(csv.source, "no data rows below the header");

  const std::size_t n = csv.rows.size();
  data.times.reserve(n);
  data.lines = csv.lines;
  data.cells.assign(value_at.size(), std::vector<std::string>(n));
  std::map<std::vector<std::string>, std::size_t> group_of;
  std::optional<TimePoint> first;
  std::size_t first_line = 0;
  bool naive_seen = false, offset_seen = false;
  std::size_t naive_line = 0, offset_line = 0;

  for (std::size_t r = 0; r < n; ++r) {
    const std::string where = csv.source + ":" + std::to_string(csv.lines[r]);
    const std::string& cell = csv.rows[r][time_at];
    auto t = parse_time(cell);
    if (!t) {
      if (trim(cell).empty()) throw InputError(where, "column '" + data.time_column + "': missing time");
      throw InputError(where, "column '" + data.time_column + "': not a time: '" + cell +
                                  "' (expected an integer, YYYY-MM-DD, or YYYY-MM-DDThh:mm[:ss] with an optional Z or +hh:mm)");
    }
    if (!first) {
      first = t;
      first_line = csv.lines[r];
    } else if (t->kind != first->kind) {
      throw InputError(where, "column '" + data.time_column + "': mixed time formats: " + kind_text(t->kind) +
                                  " here, " + kind_text(first->kind) + " on line " + std::to_string(first_line));
    }
    if (t->offset_minutes) {
      if (!offset_seen) offset_line = csv.lines[r];
      offset_seen = true;
    } else {
      if (!naive_seen) naive_line = csv.lines[r];
      naive_seen = true;
    }
    if (options.utc_offset_minutes) {
      if (offset_seen && naive_seen)
        throw InputError(where, "column '" + data.time_column + "': times with and without a UTC offset (line " +
                                    std::to_string(t->offset_minutes ? naive_line : offset_line) +
                                    "); write an offset on every time or on none");
      if (t->offset_minutes) t->value += std::int64_t(*options.utc_offset_minutes - *t->offset_minutes) * 60;
    } else if (t->offset_minutes != first->offset_minutes) {
      throw InputError(where, "column '" + data.time_column + "': mixed UTC offsets: " +
                                  offset_text(t->offset_minutes, t->utc_z) + " here, " +
                                  offset_text(first->offset_minutes, first->utc_z) + " on line " +
                                  std::to_string(first_line) +
                                  " (give --utc-offset to convert every time to one offset)");
    }
    data.times.push_back(t->value);
    for (std::size_t v = 0; v < value_at.size(); ++v) data.cells[v][r] = csv.rows[r][value_at[v]];

    std::vector<std::string> keys;
    for (std::size_t c : group_at) {
      keys.emplace_back(trim(csv.rows[r][c]));
      if (keys.back().empty())
        throw InputError(where, "group column '" + csv.header[c] + "' is empty");
    }
    auto [it, added] = group_of.emplace(keys, data.groups.size());
    if (added) data.groups.push_back({keys, {}});
    data.groups[it->second].rows.push_back(r);
  }
  data.kind = first->kind;
  if (options.utc_offset_minutes && data.kind == TimeKind::DateTime) {
    data.offset_minutes = options.utc_offset_minutes;
    data.utc_z = false;
  } else if (!options.utc_offset_minutes) {
    data.offset_minutes = first->offset_minutes;
    data.utc_z = first->utc_z;
  }
  return data;
}

RawData read_raw(const std::filesystem::path& path, const RawReadOptions& options) {
  return parse_raw(read_csv(path), options);
}

}  // namespace gapmark
