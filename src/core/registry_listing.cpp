#include "gapmark/registry_listing.hpp"

namespace gapmark {

std::string param_type_text(const ParamSpec& p) {
  switch (p.type) {
    case ParamType::Integer: return "integer";
    case ParamType::Real: return "number";
    case ParamType::Text: return "text";
    case ParamType::Flag: return "true|false";
    case ParamType::Choice: {
      std::string s;
      for (std::size_t i = 0; i < p.choices.size(); ++i) s += (i ? "|" : "") + p.choices[i];
      return s;
    }
  }
  return "";
}

nlohmann::json param_json(const ParamSpec& p) {
  nlohmann::json j{{"name", p.name}, {"type", param_type_text(p)}, {"default", p.default_value}, {"help", p.help}};
  if (p.type == ParamType::Integer || p.type == ParamType::Real) {
    j["min"] = p.min > -1e300 ? nlohmann::json(p.min) : nlohmann::json(nullptr);
    j["max"] = p.max < 1e300 ? nlohmann::json(p.max) : nlohmann::json(nullptr);
  }
  if (p.type == ParamType::Choice) j["choices"] = p.choices;
  return j;
}

nlohmann::json needs_json(const Needs& needs) {
  return {{"period", needs.period}, {"siblings", needs.siblings}, {"min_observed", needs.min_observed}};
}

}  // namespace gapmark
