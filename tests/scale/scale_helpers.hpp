#pragma once
// Helpers for the scale tests: fresh folders, an invented data set, specs,
// and results.json compared outside its "timing" field.
#include <cmath>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>

#include "gapmark/number_format.hpp"

namespace gapmark::scale_testing {

namespace fs = std::filesystem;

/// An empty folder under the system temp folder, unique to `name`.
inline fs::path fresh_dir(const std::string& name) {
  const fs::path dir = fs::temp_directory_path() / "gapmark-scale-tests" / name;
  fs::remove_all(dir);
  fs::create_directories(dir);
  return dir;
}

inline std::string read_file(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

inline void write_file(const fs::path& path, const std::string& text) {
  std::ofstream(path, std::ios::binary) << text;
}

/// Invented hourly readings of `columns` sensors over `rows` hours: a daily
/// cycle, a slow drift and a deterministic wobble, with a few real gaps.
inline std::string invented_csv(int columns, int rows) {
  std::ostringstream csv;
  csv << "hour";
  for (int c = 0; c < columns; ++c) csv << ",sensor_" << c;
  csv << "\n";
  for (int i = 0; i < rows; ++i) {
    csv << i;
    for (int c = 0; c < columns; ++c) {
      const bool gap = (i * 7 + c * 13) % 97 == 0;
      const double v = 20 + c + 3 * std::sin(2 * M_PI * i / 24.0 + c) + 0.01 * i + std::sin(i * 0.37 * (c + 1));
      csv << "," << (gap ? std::string() : format_double(v));
    }
    csv << "\n";
  }
  return csv.str();
}

/// A small spec over `data` (absolute path) writing to `output`.
inline std::string small_spec(const fs::path& data, const fs::path& output, int seed = 11,
                              const std::string& methods = R"(["mean", "carry-forward", "linear", "pchip"])") {
  return R"j({"name": "scale test (invented data)", "seed": )j" + std::to_string(seed) +
         R"(, "replicates": 3, "holdout": 24, "output": ")" + output.string() + R"(",
  "data": [{"file": ")" + data.string() + R"(", "period": 24}],
  "schemes": [{"name": "random", "rates": [0.1, 0.3]}, {"name": "blocks", "length_mean": 5, "rates": [0.2]}],
  "methods": )" + methods + R"(, "metrics": ["error", "acf"]})";
}

/// The bytes of results.json with its top-level "timing" member cut out
/// (wall-clock facts, which alone may differ between runs).
inline std::string without_timing(const fs::path& results_json) {
  std::string text = read_file(results_json);
  const auto start = text.find("\n \"timing\": ");
  if (start == std::string::npos) return text;
  auto end = text.find("\n \"", start + 1);  // the next top-level member
  if (end == std::string::npos) end = text.rfind("\n}");
  return text.erase(start, end - start);
}

}  // namespace gapmark::scale_testing
