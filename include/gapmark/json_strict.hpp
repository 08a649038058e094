#pragma once
// Reading JSON that people hand around (specs, results, tolerance files):
// a key given twice in one object is refused instead of the last one
// silently winning.
#include <nlohmann/json.hpp>
#include <string>
#include <string_view>

namespace gapmark {

/// Parses `text` like nlohmann::json::parse, but throws InputError naming
/// `source` for a key repeated within one object ("duplicate key 'seed'").
/// Syntax errors are left to nlohmann's parse_error, as json::parse throws them.
nlohmann::json parse_json_strict(std::string_view text, const std::string& source);

}  // namespace gapmark
