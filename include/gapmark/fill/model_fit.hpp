#pragma once
// What a model-based fill estimated: the fitted parameters of one fill, on
// record in every trial (results.json "fit", the checkpoint) and in
// `gapmark fill --fit`. Named estimates (variances, coefficients, lambda,
// rank) in the method's own terms, the log-likelihood and AICc where the
// method has them, the optimiser's work and whether it stopped on its
// tolerances and inside its bounds.
#include <cstddef>
#include <limits>
#include <string>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

namespace gapmark {

struct ModelFit {
  std::string model;  ///< e.g. "ARIMA(1,1,1)", "local level"; empty = no fit on record
  std::vector<std::pair<std::string, double>> parameters;  ///< in the method's order
  double log_likelihood = std::numeric_limits<double>::quiet_NaN();
  double aicc = std::numeric_limits<double>::quiet_NaN();
  std::size_t iterations = 0;  ///< likelihood passes or solver iterations
  bool converged = true;       ///< stopped on its tolerances, not on its budget
  bool at_bound = false;       ///< an estimate ended on a bound of its search

  bool empty() const { return model.empty(); }
  bool operator==(const ModelFit&) const = default;
};

/// {"model", "parameters": {name: value}, "log_likelihood", "aicc",
/// "iterations", "converged", "at_bound"}; non-finite numbers as null.
nlohmann::json fit_to_json(const ModelFit& fit);
/// The inverse; throws InputError naming `where` and the field on anything
/// malformed (wrong types, unknown fields, duplicate parameter names).
ModelFit fit_from_json(const nlohmann::json& j, const std::string& where);

}  // namespace gapmark
