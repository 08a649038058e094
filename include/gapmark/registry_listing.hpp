#pragma once
// A registry as data: each entry's name, summary, parameters (type, default,
// range or choices, help) and needs, as JSON. `gapmark methods --json` and
// the Python module's listings print this same description.
#include <nlohmann/json.hpp>
#include <string>

#include "gapmark/registry.hpp"

namespace gapmark {

/// A parameter's type as listed: "integer", "number", "text", "true|false",
/// or its choices joined by '|'.
std::string param_type_text(const ParamSpec& p);
/// {"name", "type", "default", "help"}, with "min"/"max" (null = open) for
/// numbers and "choices" for choices.
nlohmann::json param_json(const ParamSpec& p);
/// {"period", "siblings", "min_observed"}.
nlohmann::json needs_json(const Needs& needs);

/// One entry: {"name", "summary", "needs", "params"}; params are the
/// entry's own followed by the family's common ones.
template <class Interface>
nlohmann::json entry_json(const Entry<Interface>& e) {
  nlohmann::json params = nlohmann::json::array();
  for (const auto& p : Registry<Interface>::schema(e)) params.push_back(param_json(p));
  return {{"name", e.name}, {"summary", e.summary}, {"needs", needs_json(e.needs)}, {"params", params}};
}

/// Every listed entry of a registry, sorted by name.
template <class Interface>
nlohmann::json registry_json(const Registry<Interface>& registry) {
  nlohmann::json out = nlohmann::json::array();
  for (const auto* e : registry.list()) out.push_back(entry_json(*e));
  return out;
}

}  // namespace gapmark
