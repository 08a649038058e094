#pragma once
// Stand-in methods registered only in the test programs: an oracle that
// returns the truth (every error must be exactly 0), a constant filler, and
// one that always fails.
#include <cmath>
#include <filesystem>
#include <fstream>
#include <string>

#include "gapmark/error.hpp"
#include "gapmark/fill/method.hpp"

namespace gapmark::testing {

/// The complete series the oracle knows; set by the test before a run.
inline std::vector<double>& oracle_truth() {
  static std::vector<double> truth;
  return truth;
}

/// Writes text to a fresh file under the system temp folder; returns its path.
inline std::filesystem::path temp_file(const std::string& name, const std::string& text) {
  auto dir = std::filesystem::temp_directory_path() / "gapmark-tests";
  std::filesystem::create_directories(dir);
  auto path = dir / name;
  std::ofstream(path) << text;
  return path;
}

}  // namespace gapmark::testing
