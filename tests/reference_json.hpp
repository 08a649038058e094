#pragma once
// The one way a test reads a stored reference file (reference/<relative>,
// written by the committed script beside it): opened, checked and parsed
// here, so a missing or moved file fails loudly with its path.
#include <fstream>
#include <nlohmann/json.hpp>
#include <stdexcept>
#include <string>

namespace gapmark::test {

inline std::string reference_path(const std::string& relative) {
  return std::string(GAPMARK_SOURCE_DIR) + "/reference/" + relative;
}

inline nlohmann::json reference_json(const std::string& relative) {
  const std::string path = reference_path(relative);
  std::ifstream in(path);
  if (!in) throw std::runtime_error("cannot open reference file " + path);
  return nlohmann::json::parse(in);
}

}  // namespace gapmark::test
