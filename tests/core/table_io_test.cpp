// CSV in and out (RFC 4180), wide tables, atomic writes, and series labels.
#include <doctest/doctest.h>

#include <unistd.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include "gapmark/error.hpp"
#include "gapmark/series.hpp"
#include "gapmark/table_io.hpp"

namespace fs = std::filesystem;
using gapmark::CsvTable;
using gapmark::InputError;
using gapmark::parse_csv;
using gapmark::parse_wide_csv;
using gapmark::WideTable;

namespace {

using Rows = std::vector<std::vector<std::string>>;

std::string csv_error(const std::string& text) {
  try {
    parse_csv(text, "data.csv");
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

std::string wide_error(const std::string& text, const gapmark::WideReadOptions& options = {}) {
  try {
    parse_wide_csv(parse_csv(text, "data.csv"), options);
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

// A fresh folder under the system temp folder, removed at the end.
struct TempDir {
  fs::path path;
  TempDir() {
    path = fs::temp_directory_path() /
           ("gapmark-table-io-" + std::to_string(::getpid()) + "-" + std::to_string(counter()++));
    fs::remove_all(path);
    fs::create_directories(path);
  }
  ~TempDir() {
    std::error_code ec;
    fs::remove_all(path, ec);
  }
  static int& counter() {
    static int n = 0;
    return n;
  }
};

std::vector<std::string> names_in(const fs::path& dir) {
  std::vector<std::string> out;
  for (const auto& entry : fs::directory_iterator(dir)) out.push_back(entry.path().filename().string());
  std::sort(out.begin(), out.end());
  return out;
}

}  // namespace

TEST_CASE("parse_csv reads plain rows and records each row's line") {
  const CsvTable t = parse_csv("time,a,b\n1,2,3\n2,,5\n", "data.csv");
  CHECK(t.source == "data.csv");
  CHECK(t.header == std::vector<std::string>{"time", "a", "b"});
  CHECK(t.rows == Rows{{"1", "2", "3"}, {"2", "", "5"}});
  CHECK(t.lines == std::vector<std::size_t>{2, 3});
}

TEST_CASE("parse_csv: RFC 4180 quoting") {
  const CsvTable t = parse_csv(
      "name,note\n"
      "\"a,b\",\"she said \"\"hi\"\"\"\n"
      "\"two\nlines\",x\n"
      "\"\",\"\"\"\"\n"
      "plain,\"3\"\n",
      "q.csv");
  REQUIRE(t.rows.size() == 4);
  CHECK(t.rows[0] == std::vector<std::string>{"a,b", "she said \"hi\""});
  CHECK(t.rows[1] == std::vector<std::string>{"two\nlines", "x"});
  CHECK(t.rows[2] == std::vector<std::string>{"", "\""});
  CHECK(t.rows[3] == std::vector<std::string>{"plain", "3"});
  // The row after a quoted line break starts two lines further on.
  CHECK(t.lines == std::vector<std::size_t>{2, 3, 5, 6});
}

TEST_CASE("parse_csv: line ends, BOM, trailing newline and blank last lines") {
  const Rows expected{{"1", "2"}, {"3", "4"}};
  for (const std::string text :
       {"a,b\n1,2\n3,4\n", "a,b\r\n1,2\r\n3,4\r\n", "a,b\n1,2\n3,4", "a,b\r\n1,2\r\n3,4",
        "\xEF\xBB\xBF" "a,b\n1,2\n3,4\n", "a,b\n1,2\n3,4\n\n", "a,b\n1,2\n3,4\r\n\r\n\r\n",
        "a,b\r1,2\r3,4\r"}) {
    const CsvTable t = parse_csv(text, "data.csv");
    CHECK(t.header == std::vector<std::string>{"a", "b"});
    CHECK(t.rows == expected);
    CHECK(t.lines == std::vector<std::size_t>{2, 3});
  }
  // A quoted CRLF inside a cell is kept as written.
  CHECK(parse_csv("a\r\n\"x\r\ny\"\r\n", "d.csv").rows == Rows{{"x\r\ny"}});
  // Header names are trimmed; cells are not.
  const CsvTable spaced = parse_csv(" a , b\n 1 ,2\n", "d.csv");
  CHECK(spaced.header == std::vector<std::string>{"a", "b"});
  CHECK(spaced.rows == Rows{{" 1 ", "2"}});
  // An empty last cell and a lone quoted empty cell.
  CHECK(parse_csv("a,b\n1,\n", "d.csv").rows == Rows{{"1", ""}});
  CHECK(parse_csv("a\n\"\"\n", "d.csv").rows == Rows{{""}});
}

TEST_CASE("parse_csv errors name the file and line") {
  CHECK(csv_error("time,a,b,c,d,e\n1,2,3,4,5,6\n2,3,4,5,6\n") ==
        "data.csv:3: expected 6 fields, found 5");
  CHECK(csv_error("a,b\n1,2,3\n") == "data.csv:2: expected 2 fields, found 3");
  CHECK(csv_error("a,b\n1,2\n\n3,4\n") == "data.csv:3: expected 2 fields, found 1");
  CHECK(csv_error("a,b\n1,2\n3,\"open\n4,5\n") ==
        "data.csv:3: unterminated quote (a cell opened with \" on this line never closes)");
  CHECK(csv_error("") == "data.csv: empty file");
  CHECK(csv_error("\xEF\xBB\xBF") == "data.csv: empty file");
  CHECK(csv_error("\n\n") == "data.csv: empty file");
  CHECK(csv_error("time,a,b,a\n1,2,3,4\n") ==
        "data.csv:1: duplicate column name 'a' (columns 2 and 4)");
  CHECK(csv_error("time,,b\n1,2,3\n") == "data.csv:1: column 2 has an empty name");
  CHECK(csv_error("time,a\n1,\"2\"x\n").find("data.csv:2: text after a closing quote") == 0);
  CHECK(csv_error("time,a\n1,2\n2,ab\"c\n").find("data.csv:3: quote inside an unquoted cell") == 0);
}

TEST_CASE("csv_escape and to_csv quote only when needed, and read back") {
  CHECK(gapmark::csv_escape("plain") == "plain");
  CHECK(gapmark::csv_escape("") == "");
  CHECK(gapmark::csv_escape("a,b") == "\"a,b\"");
  CHECK(gapmark::csv_escape("say \"x\"") == "\"say \"\"x\"\"\"");
  CHECK(gapmark::csv_escape("two\nlines") == "\"two\nlines\"");
  CHECK(gapmark::csv_escape("cr\r") == "\"cr\r\"");
  CHECK(gapmark::csv_escape(" spaced ") == " spaced ");

  const std::vector<std::string> header{"time", "note, with comma", "q\"uote"};
  const Rows rows{{"1", "a,b", "\"\""}, {"2", "", "line\nbreak"}, {"3", " x ", "\r\n"}};
  const std::string text = gapmark::to_csv(header, rows);
  CHECK(text.starts_with("time,\"note, with comma\",\"q\"\"uote\"\n1,\"a,b\""));
  CHECK(text.back() == '\n');
  const CsvTable back = parse_csv(text, "round.csv");
  CHECK(back.header == header);
  CHECK(back.rows == rows);

  // A one-column table with an empty cell keeps its row.
  const CsvTable one = parse_csv(gapmark::to_csv({"a"}, {{""}, {"1"}, {""}}), "one.csv");
  CHECK(one.rows == Rows{{""}, {"1"}, {""}});
}

TEST_CASE("parse_wide_csv reads times, numbers and missing cells") {
  const WideTable w = parse_wide_csv(parse_csv(
      "time,salinity,oxygen\n"
      "2026-03-01T00:00,35.1,NA\n"
      "2026-03-01T01:00, 35.25 ,7.5\n"
      "2026-03-01T02:00,,nan\n"
      "2026-03-01T03:00,-1e-3,+2\n",
      "data.csv"));
  CHECK(w.source == "data.csv");
  CHECK(w.time_header == "time");
  CHECK(w.columns == std::vector<std::string>{"salinity", "oxygen"});
  CHECK(w.axis.step().iso() == "PT1H");
  CHECK(w.axis.size() == 4);
  CHECK(w.axis.format(3) == "2026-03-01T03:00");
  CHECK(w.time_text[1] == "2026-03-01T01:00");
  REQUIRE(w.values.size() == 2);
  CHECK(w.values[0][0] == 35.1);
  CHECK(w.values[0][1] == 35.25);
  CHECK(std::isnan(w.values[0][2]));
  CHECK(w.values[0][3] == -0.001);
  CHECK(std::isnan(w.values[1][0]));
  CHECK(w.values[1][1] == 7.5);
  CHECK(std::isnan(w.values[1][2]));
  CHECK(w.values[1][3] == 2.0);
  // Cells are kept exactly as written.
  CHECK(w.cells[0][1] == " 35.25 ");
  CHECK(w.cells[1][0] == "NA");
  CHECK(w.cells[1][2] == "nan");
  CHECK(w.column_index("oxygen") == 1);
  try {
    (void)w.column_index("ph");
    FAIL("no error");
  } catch (const InputError& e) {
    CHECK(std::string(e.what()) == "data.csv: no column named 'ph' (columns: salinity, oxygen)");
  }
}

TEST_CASE("parse_wide_csv: a named time column anywhere, and an all-missing column") {
  const WideTable w = parse_wide_csv(parse_csv("pen,day,weight\n1,2026-03-01,\n2,2026-03-02,\n",
                                               "farm.csv"),
                                     {.time_column = "day", .step = std::nullopt});
  CHECK(w.time_header == "day");
  CHECK(w.columns == std::vector<std::string>{"pen", "weight"});
  CHECK(w.axis.kind() == gapmark::TimeKind::Date);
  CHECK(w.values[0] == std::vector<double>{1.0, 2.0});
  CHECK(gapmark::count_observed(w.values[1]) == 0);

  const WideTable stepped = parse_wide_csv(parse_csv("t,x\n2026-03-01,1\n", "one.csv"),
                                           {.time_column = "", .step = gapmark::Step::parse("P1M")});
  CHECK(stepped.axis.step().iso() == "P1M");
}

TEST_CASE("parse_wide_csv errors name the file, line and column") {
  const std::string head = "time,salinity\n";
  CHECK(wide_error(head + "1,3.5\n2,abc\n") == "data.csv:3: column 'salinity': not a number: 'abc'");
  CHECK(wide_error(head + "1,3.5\n2,inf\n") ==
        "data.csv:3: column 'salinity': not a finite number: 'inf'");
  CHECK(wide_error(head + "1,-Infinity\n") ==
        "data.csv:2: column 'salinity': not a finite number: '-Infinity'");
  CHECK(wide_error(head + "1,1e999\n") == "data.csv:2: column 'salinity': not a finite number: '1e999'");
  CHECK(wide_error(head + "1,3.5\n2,\"4,5\"\n") ==
        "data.csv:3: column 'salinity': not a number: '4,5'");
  CHECK(wide_error(head + "1,3\nnoon,4\n").find("data.csv:3: column 'time': not a time: 'noon'") == 0);
  CHECK(wide_error(head + "1,3\n,4\n") == "data.csv:3: column 'time': missing time");
  CHECK(wide_error(head + "2026-03-01T06:00,1\n2026-03-01T06:00,2\n") ==
        "data.csv:3: duplicate time 2026-03-01T06:00");
  CHECK(wide_error(head) == "data.csv: no data rows below the header");
  CHECK(wide_error("time\n1\n2\n") == "data.csv: no value columns: the file has only the time column 'time'");
  CHECK(wide_error(head + "1,2\n", {.time_column = "when", .step = std::nullopt}) ==
        "data.csv: no time column named 'when' (columns: time, salinity)");
  // The line of a row after a quoted line break is its own.
  CHECK(wide_error("time,depth,x\n1,\"2\n\",1\n2,3,x1\n") == "data.csv:4: column 'x': not a number: 'x1'");
}

TEST_CASE("a wide table round-trips through to_csv") {
  const std::string text =
      "when,\"flow, m3/s\",level\n"
      "2026-01-31,1.5,NA\n"
      "2026-02-28,,0.25\n"
      "2026-03-31,2.0e0,0.3\n"
      "2026-04-30,  7,\n";
  const WideTable first = parse_wide_csv(parse_csv(text, "in.csv"));
  CHECK(first.axis.step().iso() == "P1M");

  Rows rows;
  for (std::size_t r = 0; r < first.time_text.size(); ++r) {
    std::vector<std::string> row{first.time_text[r]};
    for (const auto& column : first.cells) row.push_back(column[r]);
    rows.push_back(row);
  }
  std::vector<std::string> header{first.time_header};
  header.insert(header.end(), first.columns.begin(), first.columns.end());
  const std::string written = gapmark::to_csv(header, rows);
  const WideTable second = parse_wide_csv(parse_csv(written, "out.csv"));

  CHECK(second.time_header == first.time_header);
  CHECK(second.columns == first.columns);
  CHECK(second.time_text == first.time_text);
  CHECK(second.cells == first.cells);
  CHECK(second.axis.step() == first.axis.step());
  CHECK(second.axis.start() == first.axis.start());
  for (std::size_t c = 0; c < first.values.size(); ++c)
    for (std::size_t r = 0; r < first.values[c].size(); ++r) {
      const double a = first.values[c][r], b = second.values[c][r];
      CHECK(((std::isnan(a) && std::isnan(b)) || a == b));
    }
  // Written again, the text is the same.
  CHECK(gapmark::to_csv(header, rows) == written);
}

TEST_CASE("write_file_atomically and read_text_file") {
  TempDir dir;
  const fs::path target = dir.path / "new" / "deeper" / "out.csv";
  gapmark::write_file_atomically(target, "a,b\n1,2\n");
  CHECK(gapmark::read_text_file(target) == "a,b\n1,2\n");
  CHECK(names_in(target.parent_path()) == std::vector<std::string>{"out.csv"});

  gapmark::write_file_atomically(target, "replaced");
  CHECK(gapmark::read_text_file(target) == "replaced");
  gapmark::write_file_atomically(target, "");
  CHECK(gapmark::read_text_file(target).empty());
  CHECK(names_in(target.parent_path()) == std::vector<std::string>{"out.csv"});

  // Binary content survives as is.
  const std::string bytes("x\0y\r\n\xff", 6);
  gapmark::write_file_atomically(target, bytes);
  CHECK(gapmark::read_text_file(target) == bytes);

  // A folder that cannot be made: its would-be parent is a file.
  const fs::path blocked = dir.path / "plain-file";
  gapmark::write_file_atomically(blocked, "x");
  try {
    gapmark::write_file_atomically(blocked / "sub" / "out.csv", "y");
    FAIL("no error");
  } catch (const InputError& e) {
    CHECK(e.where() == (blocked / "sub" / "out.csv").string());
    CHECK(std::string(e.what()).find("cannot create folder") != std::string::npos);
  }

  // The rename fails (a folder is in the way): the temporary file is removed.
  const fs::path in_the_way = dir.path / "taken";
  fs::create_directories(in_the_way / "inside");
  try {
    gapmark::write_file_atomically(in_the_way, "z");
    FAIL("no error");
  } catch (const InputError& e) {
    CHECK(e.where() == in_the_way.string());
  }
  CHECK(names_in(dir.path) == std::vector<std::string>{"new", "plain-file", "taken"});

  try {
    (void)gapmark::read_text_file(dir.path / "absent.csv");
    FAIL("no error");
  } catch (const InputError& e) {
    CHECK(std::string(e.what()) == (dir.path / "absent.csv").string() + ": no such file");
  }
  CHECK_THROWS_AS((void)gapmark::read_text_file(dir.path), InputError);
}

TEST_CASE("read_wide_csv reads a file and names it in errors") {
  TempDir dir;
  const fs::path file = dir.path / "tank.csv";
  gapmark::write_file_atomically(file, "time,ph\r\n0,7.1\r\n1,7.2\r\n2,seven\r\n");
  try {
    (void)gapmark::read_wide_csv(file);
    FAIL("no error");
  } catch (const InputError& e) {
    CHECK(std::string(e.what()) == file.string() + ":4: column 'ph': not a number: 'seven'");
  }
  gapmark::write_file_atomically(file, "time,ph\n0,7.1\n1,7.2\n2,NA\n");
  const WideTable w = gapmark::read_wide_csv(file);
  CHECK(w.source == file.string());
  CHECK(w.axis.kind() == gapmark::TimeKind::Index);
  CHECK(gapmark::count_observed(w.values[0]) == 2);
}

TEST_CASE("Series label and observed counts") {
  gapmark::Series s;
  s.name = "salinity";
  s.values = {1.0, gapmark::kMissing, 3.0, gapmark::kMissing, gapmark::kMissing};
  CHECK(s.label() == "salinity");
  CHECK(s.observed_count() == 2);
  s.groups = {{"site", "A"}, {"pen", "3"}};
  CHECK(s.label() == "salinity[site=A,pen=3]");
  CHECK(gapmark::count_observed(std::vector<double>{}) == 0);
  CHECK(gapmark::count_observed(std::vector<double>{0.0, -1.0}) == 2);
}
