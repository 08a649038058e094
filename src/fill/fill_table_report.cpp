#include "gapmark/fill/fill_table_report.hpp"

#include <cmath>

#include "gapmark/fill/model_fit.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark {

nlohmann::json fits_json(const std::string& method, const std::vector<FillTableReport>& reports) {
  nlohmann::json columns = nlohmann::json::array();
  for (const auto& r : reports)
    columns.push_back({{"column", r.column},
                       {"missing", r.missing},
                       {"gaps", r.gaps},
                       {"filled", r.filled},
                       {"fit", r.fit.empty() ? nlohmann::json(nullptr) : fit_to_json(r.fit)},
                       {"failure", r.failure.empty() ? nlohmann::json(nullptr) : nlohmann::json(r.failure)}});
  return {{"format", "gapmark-fit"}, {"schema_version", 1}, {"method", method}, {"columns", columns}};
}


std::string fit_line(const ModelFit& fit) {
  std::string line = fit.model;
  for (const auto& p : fit.parameters) line += ", " + p.first + " " + short_number(p.second);
  if (std::isfinite(fit.log_likelihood)) line += ", log-likelihood " + short_number(fit.log_likelihood);
  if (!fit.converged) line += " (not converged)";
  if (fit.at_bound) line += " (an estimate on a bound of its search)";
  return line;
}

std::string fill_report_text(const FillTableOutput& result, const Bound<FillMethod>& method,
                             const FillColumnsWanted& wanted, bool with_fit) {
  std::string out;
  for (const auto& r : result.reports) {
    if (r.missing == 0) {
      out += r.column + ": no missing points\n";
    } else {
      out += r.column + ": filled " + std::to_string(r.filled) + " of " + points_in_gaps(r.missing, r.gaps);
      if (r.clipped) out += " (" + std::to_string(r.clipped) + " moved into the bounds)";
      if (wanted.variance && r.filled > 0 && !r.variance) out += " (" + method.label + " gives no variance)";
      out += "\n";
    }
    if (with_fit && !r.fit.empty()) out += "  fit: " + fit_line(r.fit) + "\n";
    if (r.unfilled() > 0) out += "warning: " + unfilled_message(r, method) + "\n";
    if (const std::string range = out_of_range_message(r, method); !range.empty()) out += "note: " + range + "\n";
  }
  return out;
}

}  // namespace gapmark
