#pragma once
// A number for JSON output: JSON has no NaN or infinity, so those are written
// as null (read back as NaN: "not applicable").
#include <cmath>
#include <nlohmann/json.hpp>

namespace gapmark {

inline nlohmann::json json_number(double value) {
  return std::isfinite(value) ? nlohmann::json(value) : nlohmann::json(nullptr);
}

}  // namespace gapmark
