// The external method end to end, with sh/awk helper programs beside this
// file. The outside reference for the filled values is gapmark's own
// linear method, re-implemented independently in awk (linear_fill.sh); the
// two must agree to the last bit, since the awk program uses the same
// arithmetic and prints 17 significant digits.
#include <doctest/doctest.h>

#include <chrono>
#include <filesystem>
#include <fstream>
#include <stdexcept>
#include <string>
#include <thread>
#include <vector>

#include <stdlib.h>
#include <unistd.h>

#include "external_helpers.hpp"
#include "gapmark/error.hpp"

using namespace gapmark;
using namespace gapmark::test;

namespace {

std::string failure_of(const Bound<FillMethod>& method, const std::vector<double>& values) {
  try {
    run_bound(method, values);
  } catch (const MethodFailure& e) {
    return e.what();
  }
  return "(no failure)";
}

/// True once process `pid` is gone or only a zombie.
bool process_gone(const std::string& pid) {
  std::ifstream stat("/proc/" + pid + "/stat");
  if (!stat) return true;
  std::string line;
  std::getline(stat, line);
  const auto close = line.rfind(')');
  return close != std::string::npos && line.size() > close + 2 && line[close + 2] == 'Z';
}

std::filesystem::path scratch_dir(const std::string& name) {
  const auto dir = std::filesystem::temp_directory_path() /
                   ("gapmark-test-external-" + std::to_string(getpid()) + "-" + name);
  std::filesystem::remove_all(dir);
  std::filesystem::create_directories(dir);
  return dir;
}

}  // namespace

TEST_CASE("a program doing linear interpolation gives the built-in linear method's values") {
  const auto linear = MethodRegistry::global().bind(CallSpec::parse("linear", "test"), "test");
  const auto external = bind_external(helper_command("linear_fill.sh"));
  const std::vector<double> values = gappy_series(500);
  const std::vector<double> expected = run_bound(linear, values).values;
  const FillResult got = run_bound(external, values);
  CHECK(got.variance.empty());
  CHECK(same_values(got.values, expected));

  SUBCASE("on a dated axis the times go out and come back in ISO 8601") {
    const auto start = parse_time("2026-03-01T06:00");
    REQUIRE(start);
    const TimeAxis axis(TimeKind::DateTime, Step::parse("PT15M"), start->value, values.size());
    CHECK(same_values(run_bound(external, values, axis).values, expected));
  }
  SUBCASE("input=file hands the series over in a temporary file, removed afterwards") {
    const auto dir = scratch_dir("tmp");
    const char* old = getenv("TMPDIR");
    const std::string saved = old ? old : "";
    setenv("TMPDIR", dir.c_str(), 1);
    const auto from_file = bind_external(helper_command("linear_fill.sh"), {{"input", "file"}});
    const FillResult filled = run_bound(from_file, values);
    if (old) setenv("TMPDIR", saved.c_str(), 1);
    else unsetenv("TMPDIR");
    CHECK(same_values(filled.values, expected));
    CHECK(std::filesystem::is_empty(dir));
    std::filesystem::remove_all(dir);
  }
}

TEST_CASE("a non-zero exit is a failure carrying the program's first line on standard error") {
  const auto method = bind_external(helper_command("fail_with_message.sh"));
  const std::string expected = "the program exited with status 1: model file weights.bin not found";
  CHECK(failure_of(method, gappy_series(40)) == expected);
  // The program never reads its input: a large series must not stop gapmark
  // with SIGPIPE or hang on a full pipe.
  CHECK(failure_of(method, gappy_series(100000)) == expected);
}

TEST_CASE("a program that runs past the timeout is killed with everything it started") {
  const auto dir = scratch_dir("timeout");
  const std::string pid_file = (dir / "sleeper.pid").string();
  const auto method = bind_external(helper_command("sleep_past_timeout.sh", "'" + pid_file + "'"), {{"timeout", "1"}});
  const auto start = std::chrono::steady_clock::now();
  CHECK(failure_of(method, gappy_series(40)) == "timed out after 1 s");
  const double waited = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  CHECK(waited < 20.0);  // the sleeper asks for 30 s
  std::ifstream in(pid_file);
  std::string pid;
  in >> pid;
  REQUIRE(!pid.empty());
  bool gone = false;
  for (int i = 0; i < 200 && !gone; ++i) {
    gone = process_gone(pid);
    if (!gone) std::this_thread::sleep_for(std::chrono::milliseconds(10));
  }
  CHECK(gone);
  std::filesystem::remove_all(dir);
}

TEST_CASE("a wrong number of rows is a clear failure") {
  const auto method = bind_external(helper_command("drop_last_row.sh"));
  CHECK(failure_of(method, gappy_series(100)) ==
        "the program printed 99 rows after the header, expected 100 (one per input row, in order)");
}

TEST_CASE("100,000 points pass through a program that writes while it reads, without deadlock") {
  const std::vector<double> values = gappy_series(100000);
  SUBCASE("streaming echo: gaps come back empty, i.e. unfilled") {
    const FillResult got = run_bound(bind_external(helper_command("echo_input.sh")), values);
    CHECK(same_values(got.values, values));
  }
  SUBCASE("linear fill of the whole series") {
    const auto linear = MethodRegistry::global().bind(CallSpec::parse("linear", "test"), "test");
    const FillResult got = run_bound(bind_external(helper_command("linear_fill.sh")), values);
    CHECK(same_values(got.values, run_bound(linear, values).values));
  }
}

TEST_CASE("the program sees the period and length in its environment and may return a variance") {
  const auto method = bind_external(helper_command("fill_from_environment.sh"));
  const std::vector<double> values = gappy_series(50);
  const TimeAxis axis = TimeAxis::index(values.size());
  const FillResult got = run_bound(method, values, axis, 24);
  REQUIRE(got.variance.size() == values.size());
  for (std::size_t i = 0; i < values.size(); ++i) {
    CAPTURE(i);
    if (std::isnan(values[i])) {
      CHECK(got.values[i] == 24050.0);
      CHECK(got.variance[i] == 2.5);
    } else {
      CHECK(got.values[i] == values[i]);
      CHECK(got.variance[i] == 0.0);
    }
  }
}

TEST_CASE("a program killed by a signal, or one that cannot start, is a failure saying so") {
  CHECK(failure_of(bind_external(helper_command("kill_self.sh")), gappy_series(20)) ==
        "the program was killed by signal 9 (SIGKILL)");
  CHECK(failure_of(bind_external("gapmark-no-such-program --fill"), gappy_series(20)) ==
        "cannot start 'gapmark-no-such-program': No such file or directory");
}

TEST_CASE("the command is never handed to a shell") {
  const auto dir = scratch_dir("shell");
  const auto marker = dir / "should-not-exist";
  // Were this run by a shell, ';' would start a second command.
  const auto method = bind_external(helper_command("echo_input.sh", "; touch '" + marker.string() + "'"));
  const std::vector<double> values = gappy_series(30);
  CHECK(same_values(run_bound(method, values).values, values));
  CHECK(!std::filesystem::exists(marker));
  std::filesystem::remove_all(dir);
}

TEST_CASE("several threads may run external programs at once") {
  const auto linear = MethodRegistry::global().bind(CallSpec::parse("linear", "test"), "test");
  const auto external = bind_external(helper_command("linear_fill.sh"));
  constexpr int kThreads = 4, kCalls = 5;
  std::vector<int> agreed(kThreads, 0);
  std::vector<std::thread> threads;
  for (int t = 0; t < kThreads; ++t) {
    threads.emplace_back([&, t] {
      for (int c = 0; c < kCalls; ++c) {
        const std::vector<double> values = gappy_series(2000 + static_cast<std::size_t>(t * 300 + c * 7));
        try {
          if (same_values(run_bound(external, values).values, run_bound(linear, values).values)) ++agreed[t];
        } catch (const std::exception&) {
        }
      }
    });
  }
  for (auto& th : threads) th.join();
  for (int t = 0; t < kThreads; ++t) CHECK(agreed[t] == kCalls);
}

TEST_CASE("the command is required") {
  CallSpec call;
  call.name = "external";
  CHECK_THROWS_AS(MethodRegistry::global().bind(call, "test"), InputError);
}
