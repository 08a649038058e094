// The pieces of the external protocol on their own: splitting a command into
// words, the CSV sent to the program, and the strict reading of its answer.
#include <doctest/doctest.h>

#include <string>
#include <vector>

#include "external_helpers.hpp"
#include "gapmark/error.hpp"
#include "gapmark/fill/external_program.hpp"

using namespace gapmark;
using namespace gapmark::test;

namespace {

using Words = std::vector<std::string>;

std::string read_failure(const std::string& output, const std::vector<double>& values) {
  const TimeAxis axis = TimeAxis::index(values.size());
  try {
    read_filled_csv(output, values, axis);
  } catch (const MethodFailure& e) {
    return e.what();
  }
  return "(no failure)";
}

}  // namespace

TEST_CASE("commands are split into words with quotes and backslashes, nothing expanded") {
  CHECK(split_command("python3 fill.py --k 3", "c") == Words{"python3", "fill.py", "--k", "3"});
  CHECK(split_command("  a\tb  ", "c") == Words{"a", "b"});
  CHECK(split_command("run 'my model/fill it.py' \"x y\" z\\ w", "c") ==
        Words{"run", "my model/fill it.py", "x y", "z w"});
  CHECK(split_command(R"(a "say \"hi\" \\ \n" 'it''s')", "c") == Words{"a", R"(say "hi" \ \n)", "its"});
  CHECK(split_command("echo $HOME *.csv | wc > out; rm", "c") ==
        Words{"echo", "$HOME", "*.csv", "|", "wc", ">", "out;", "rm"});
  CHECK(split_command("a '' b", "c") == Words{"a", "", "b"});
  CHECK_THROWS_WITH_AS(split_command("fill 'open", "external: command"),
                       "external: command: unterminated ' quote in the command", InputError);
  CHECK_THROWS_AS(split_command("fill \"open", "c"), InputError);
  CHECK_THROWS_AS(split_command("fill \\", "c"), InputError);
  CHECK_THROWS_WITH_AS(split_command("   ", "c"), "c: the command is empty", InputError);
}

TEST_CASE("the series goes out as time,value with empty cells for gaps") {
  const std::vector<double> values{1.5, NA, -0.1, 1e300};
  CHECK(series_csv(values, TimeAxis::index(4)) == "time,value\n0,1.5\n1,\n2,-0.1\n3,1e+300\n");
  const auto start = parse_time("2026-01-30");
  REQUIRE(start);
  const TimeAxis days(TimeKind::Date, Step::parse("P1D"), start->value, 3);
  CHECK(series_csv(std::vector<double>{2.0, NA, 4.0}, days) == "time,value\n2026-01-30,2\n2026-01-31,\n2026-02-01,4\n");
}

TEST_CASE("a well-formed answer is read, with or without variance and line-end variations") {
  const std::vector<double> values{1.0, NA, 3.0};
  const TimeAxis axis = TimeAxis::index(3);
  auto r = read_filled_csv("time,value\n0,1\n1,2.25\n2,3\n", values, axis);
  CHECK(r.values == std::vector<double>{1.0, 2.25, 3.0});
  CHECK(r.variance.empty());
  r = read_filled_csv("time,value\r\n0,1\r\n1,2.25\r\n2,3", values, axis);
  CHECK(r.values == std::vector<double>{1.0, 2.25, 3.0});
  r = read_filled_csv("time,value,variance\n0,1,\n1,2.25,0.5\n2,3,7\n", values, axis);
  CHECK(r.variance == std::vector<double>{0.0, 0.5, 0.0});  // observed points: 0 whatever was written
  r = read_filled_csv("time,value\n0,1\n1,\n2,3\n", values, axis);
  CHECK(std::isnan(r.values[1]));  // an empty cell: left unfilled
}

TEST_CASE("a malformed answer is a failure naming the line and the fault") {
  const std::vector<double> v{1.0, NA, 3.0};
  CHECK(read_failure("", v) == "the program printed nothing; expected the header \"time,value\" and 3 rows");
  CHECK(read_failure("time;value\n0;1\n1;2\n2;3\n", v) ==
        "output line 1: expected the header \"time,value\" or \"time,value,variance\", found 'time;value'");
  CHECK(read_failure("time,value\n0,1\n1,2\n2,3\n3,4\n", v) ==
        "the program printed 4 rows after the header, expected 3 (one per input row, in order)");
  CHECK(read_failure("time,value\n0,1\n\n2,3\n", v) == "output line 3: expected 2 fields, found 1");
  CHECK(read_failure("time,value\n0,1\n1,2,9\n2,3\n", v) == "output line 3: expected 2 fields, found 3");
  CHECK(read_failure("time,value\n0,1\n2,2\n1,3\n", v) ==
        "output line 3: time '2' differs from the input's '1' (keep the input's times and order)");
  CHECK(read_failure("time,value\n0,1\n1,two\n2,3\n", v) ==
        "output line 3: value 'two' is not a number (leave the cell empty for a point not filled)");
  CHECK(read_failure("time,value\n0,1\n1,nan\n2,3\n", v) ==
        "output line 3: value 'nan' is not a number (leave the cell empty for a point not filled)");
  CHECK(read_failure("time,value\n0,1\n1,inf\n2,3\n", v) == "output line 3: value 'inf' is not finite");
  CHECK(read_failure("time,value\n0,1\n1,1e999\n2,3\n", v) == "output line 3: value '1e999' is not finite");
  CHECK(read_failure("time,value,variance\n0,1,\n1,2,-0.5\n2,3,\n", v) ==
        "output line 3: variance '-0.5' is negative");
  CHECK(read_failure("time,value\n0,1\n\"1\",2\n2,3\n", v) ==
        "output line 3: time '\"1\"' differs from the input's '1' (keep the input's times and order)");
}

TEST_CASE("run_program passes input through and reports the exit status") {
  ProgramRun run;
  run.argv = {"sh", "-c", "tr a-z A-Z; echo oops >&2; exit 3"};
  run.input = "quiet please\n";
  run.timeout_seconds = 30;
  const ProgramOutcome out = run_program(run);
  CHECK(out.output == "QUIET PLEASE\n");
  CHECK(first_line(out.errors) == "oops");
  CHECK(out.exited);
  CHECK(out.exit_status == 3);

  run.argv = {"sh", "-c", "printf '%s' \"$GAPMARK_TEST_VALUE\""};
  run.environment = {{"GAPMARK_TEST_VALUE", "a b;c"}};
  run.input.clear();
  CHECK(run_program(run).output == "a b;c");

  run.argv = {"sh", "-c", "yes 0123456789"};
  run.max_output_bytes = 100000;
  CHECK_THROWS_WITH_AS(run_program(run), "the program printed more than 100000 bytes on standard output",
                       MethodFailure);
}
