// Regression (found by fuzz/fuzz_spec): a JSON number too large for a double
// (1e999) made the JSON library throw an exception that escaped the spec and
// results readers uncaught. Now it is an InputError: one line naming the file
// (and, for a spec, the line of the number).
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <functional>
#include <string>

#include "gapmark/error.hpp"
#include "gapmark/experiment/results_io.hpp"
#include "gapmark/experiment/spec.hpp"

using namespace gapmark;

namespace {

void expect_one_line_error(const std::function<void()>& read, const std::string& starts_with,
                           const std::string& mentions) {
  try {
    read();
    FAIL("an out-of-range number was accepted");
  } catch (const InputError& e) {
    const std::string message = e.what();
    CHECK_MESSAGE(message.rfind(starts_with, 0) == 0, message);
    CHECK_MESSAGE(message.find(mentions) != std::string::npos, message);
    CHECK(message.find('\n') == std::string::npos);
  }
}

}  // namespace

TEST_CASE("a spec number beyond the range of a double is an InputError naming its line") {
  const std::string text = "{\"name\": \"x\",\n \"seed\": 1e3085,\n \"data\": [\"x.csv\"]}";
  expect_one_line_error([&] { (void)parse_spec(text, "big.json", "."); }, "big.json:2: invalid JSON", "1e3085");
  // The same number as a negative overflow, deeper in the document.
  const std::string nested = "{\"schemes\": [{\"name\": \"random\",\n \"rates\": [-2e400]}]}";
  expect_one_line_error([&] { (void)parse_spec(nested, "neg.json", "."); }, "neg.json:2: invalid JSON", "-2e400");
}

TEST_CASE("a results.json holding a number beyond the range of a double is an InputError naming the file") {
  const auto path = std::filesystem::temp_directory_path() / "gapmark-json-number-range-results.json";
  std::ofstream(path) << R"({"format": "gapmark-results", "schema_version": 1e999})";
  expect_one_line_error([&] { (void)read_results(path); }, path.string() + ": invalid JSON", "1e999");
  std::filesystem::remove(path);
}
