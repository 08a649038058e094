#pragma once
// Helpers for the raw-data tests: parse CSV text, catch an InputError's text,
// read stored reference JSON.
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>

#include "../reference_json.hpp"
#include "gapmark/raw_table.hpp"
#include "gapmark/error.hpp"
#include "gapmark/table_io.hpp"

namespace data_test {

inline gapmark::RawData raw(const std::string& text, gapmark::RawReadOptions options = {}) {
  return gapmark::parse_raw(gapmark::parse_csv(text, "data.csv"), options);
}

template <class F>
std::string error_of(F&& f) {
  try {
    f();
  } catch (const gapmark::InputError& e) {
    return e.what();
  }
  return "(no error)";
}

inline nlohmann::json reference(const std::string& relative) {
  return gapmark::test::reference_json(relative);
}

inline std::string source_path(const std::string& relative) { return std::string(GAPMARK_SOURCE_DIR) + "/" + relative; }

}  // namespace data_test
