// ModelFit to and from JSON (see model_fit.hpp).
#include "gapmark/fill/model_fit.hpp"

#include <cmath>
#include <set>

#include "gapmark/error.hpp"

namespace gapmark {

namespace {
nlohmann::json number_or_null(double v) { return std::isfinite(v) ? nlohmann::json(v) : nlohmann::json(nullptr); }

double number_from(const nlohmann::json& j, const std::string& where) {
  if (j.is_null()) return std::nan("");
  if (!j.is_number()) throw InputError(where, "expected a number or null");
  return j.get<double>();
}
}  // namespace

nlohmann::json fit_to_json(const ModelFit& fit) {
  nlohmann::json params = nlohmann::json::object();
  for (const auto& [name, value] : fit.parameters) params[name] = number_or_null(value);
  return {{"model", fit.model},
          {"parameters", params},
          {"log_likelihood", number_or_null(fit.log_likelihood)},
          {"aicc", number_or_null(fit.aicc)},
          {"iterations", fit.iterations},
          {"converged", fit.converged},
          {"at_bound", fit.at_bound}};
}

ModelFit fit_from_json(const nlohmann::json& j, const std::string& where) {
  static const std::set<std::string> fields{"model", "parameters", "log_likelihood", "aicc",
                                            "iterations", "converged", "at_bound"};
  if (!j.is_object()) throw InputError(where, "expected an object");
  for (const auto& [key, value] : j.items())
    if (!fields.count(key)) throw InputError(where + "/" + key, "unknown field");
  for (const auto& key : fields)
    if (!j.contains(key)) throw InputError(where + "/" + key, "missing");
  ModelFit fit;
  if (!j["model"].is_string() || j["model"].get<std::string>().empty())
    throw InputError(where + "/model", "expected a non-empty string");
  fit.model = j["model"].get<std::string>();
  if (!j["parameters"].is_object()) throw InputError(where + "/parameters", "expected an object");
  for (const auto& [name, value] : j["parameters"].items())
    fit.parameters.emplace_back(name, number_from(value, where + "/parameters/" + name));
  fit.log_likelihood = number_from(j["log_likelihood"], where + "/log_likelihood");
  fit.aicc = number_from(j["aicc"], where + "/aicc");
  if (!j["iterations"].is_number_unsigned()) throw InputError(where + "/iterations", "expected a whole number");
  fit.iterations = j["iterations"].get<std::size_t>();
  if (!j["converged"].is_boolean()) throw InputError(where + "/converged", "expected true or false");
  fit.converged = j["converged"].get<bool>();
  if (!j["at_bound"].is_boolean()) throw InputError(where + "/at_bound", "expected true or false");
  fit.at_bound = j["at_bound"].get<bool>();
  return fit;
}

}  // namespace gapmark
