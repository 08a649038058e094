// Fit summaries as text (see fit_text.hpp).
#include "gapmark/report/fit_text.hpp"

#include <cmath>

#include "gapmark/report/table_text.hpp"

namespace gapmark {

std::string range_text(const EstimateRange& range) {
  if (range.n == 0) return "n/a";
  const std::string median = short_number(range.median);
  if (short_number(range.low) == median && short_number(range.high) == median) return median;
  return median + " [" + short_number(range.low) + ", " + short_number(range.high) + "]";
}

std::string models_text(const FitSummary& fits) {
  if (fits.models.size() == 1) return fits.models.front().first;
  std::string out;
  for (const auto& [model, count] : fits.models)
    out += (out.empty() ? "" : ", ") + model + " (" + std::to_string(count) + ")";
  return out;
}

std::string estimates_text(const FitSummary& fits) {
  std::string out;
  for (const auto& e : fits.estimates) out += (out.empty() ? "" : "; ") + e.name + " " + range_text(e);
  return out;
}

}  // namespace gapmark
