// Regression: a tolerance file holding a JSON number too large for a double
// (1e999) made the JSON library throw an exception that escaped uncaught
// (the same fault fuzz/fuzz_spec found in the spec reader). Now it is an
// InputError naming the file.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <string>

#include "gapmark/compare/tolerance.hpp"
#include "gapmark/error.hpp"

TEST_CASE("a tolerance file with a number beyond the range of a double is an InputError naming the file") {
  const auto path = std::filesystem::temp_directory_path() / "gapmark-tolerance-number-range.json";
  std::ofstream(path) << R"({"rmse": {"relative": 1e999}})";
  CHECK_THROWS_WITH_AS((void)gapmark::read_tolerance_file(path),
                       doctest::Contains((path.string() + ": invalid JSON").c_str()), gapmark::InputError);
  CHECK_THROWS_WITH_AS((void)gapmark::read_tolerance_file(path), doctest::Contains("1e999"), gapmark::InputError);
  std::filesystem::remove(path);
}
