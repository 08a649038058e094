#include "gapmark/json_strict.hpp"

#include <set>
#include <vector>

#include "gapmark/error.hpp"
#include "gapmark/text_safety.hpp"

namespace gapmark {

nlohmann::json parse_json_strict(std::string_view text, const std::string& source) {
  using nlohmann::json;
  std::vector<std::set<std::string>> open_objects;
  std::vector<std::string> path;  // the key of each open object being read ("" in arrays)
  const json::parser_callback_t check = [&](int /*depth*/, json::parse_event_t event, json& parsed) {
    switch (event) {
      case json::parse_event_t::object_start:
        open_objects.emplace_back();
        break;
      case json::parse_event_t::object_end:
        if (!open_objects.empty()) open_objects.pop_back();
        break;
      case json::parse_event_t::key: {
        const std::string key = parsed.get<std::string>();
        if (!open_objects.empty() && !open_objects.back().insert(key).second)
          throw InputError(source, "duplicate key " + quoted_for_message(key) +
                                       " in one JSON object (each key may appear once)");
        break;
      }
      default:
        break;
    }
    return true;
  };
  return json::parse(text.begin(), text.end(), check);
}

}  // namespace gapmark
