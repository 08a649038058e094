#include "gapmark/experiment/record_checks.hpp"

#include <cmath>

#include "gapmark/error.hpp"
#include "gapmark/text_safety.hpp"

namespace gapmark {

namespace {
std::string shown(const nlohmann::json& value) { return quoted_for_message(value.dump(), 40); }
}  // namespace

std::size_t stored_count(const nlohmann::json& value, const std::string& where, const std::string& field) {
  if (!value.is_number_unsigned())
    throw InputError(where, field + ": expected a whole number >= 0, found " + shown(value));
  return value.get<std::size_t>();
}

double stored_metric(const nlohmann::json& value, const std::string& where, const std::string& field) {
  if (value.is_null()) return std::nan("");
  if (!value.is_number()) throw InputError(where, field + ": expected a number or null, found " + shown(value));
  return value.get<double>();
}

double stored_alpha(const nlohmann::json& value, const std::string& where) {
  if (!value.is_number() || !(value.get<double>() > 0 && value.get<double>() < 0.5))
    throw InputError(where, "alpha: expected a number in (0, 0.5), found " + shown(value));
  return value.get<double>();
}

}  // namespace gapmark
