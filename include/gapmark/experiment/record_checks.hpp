#pragma once
// Strict reading of stored records (checkpoint lines, results files): a
// file from someone else is data, and a value out of range is refused with
// one line naming the file and field, instead of wrapping round (-4 as a
// count) or turning into something else ("abc" read as a missing metric).
#include <cstddef>
#include <nlohmann/json.hpp>
#include <string>

namespace gapmark {

/// A count: a whole number >= 0 (InputError naming `where` and `field`).
std::size_t stored_count(const nlohmann::json& value, const std::string& where, const std::string& field);
/// A metric value: a number, or null for "not applicable" (NaN).
double stored_metric(const nlohmann::json& value, const std::string& where, const std::string& field);
/// The significance level of a stored run: a number in (0, 0.5), as a spec allows.
double stored_alpha(const nlohmann::json& value, const std::string& where);

}  // namespace gapmark
