#include "gapmark/fill/method.hpp"

#include <cmath>

#include "gapmark/error.hpp"
#include "gapmark/series.hpp"

namespace gapmark {

void check_needs(const Needs& needs, const FillRequest& request) {
  if (needs.period && request.period < 2)
    throw MethodFailure("needs a seasonal period of at least 2", UnmetNeed::Period);
  if (needs.period && request.period * 2 > request.values.size())
    throw MethodFailure("needs at least two full periods of data (period " +
                        std::to_string(request.period) + ", " +
                        std::to_string(request.values.size()) + " points)",
                        UnmetNeed::Length);
  if (needs.siblings && request.siblings.empty())
    throw MethodFailure("needs sibling series on the same time axis", UnmetNeed::Siblings);
  const std::size_t observed = count_observed(request.values);
  if (observed < needs.min_observed)
    throw MethodFailure("needs at least " + std::to_string(needs.min_observed) +
                        " observed values, found " + std::to_string(observed),
                        UnmetNeed::Observed);
}

ParamSpec edges_param() {
  return choice_param("edges", "nearest", {"nearest", "leave"},
                      "gaps before the first or after the last observation: nearest value, or left empty");
}

ParamSpec draws_param() {
  return {.name = "draws",
          .type = ParamType::Integer,
          .default_value = "0",
          .min = 0,
          .max = static_cast<double>(kMaxDraws),
          .choices = {},
          .help = "conditional sample paths to return beside the fill (simulation smoother; 0 = none): for "
                  "multiple imputation and the sample metrics"};
}

std::optional<ObservedSpan> observed_span(std::span<const double> values) {
  std::size_t first = 0;
  while (first < values.size() && std::isnan(values[first])) ++first;
  if (first == values.size()) return std::nullopt;
  std::size_t last = values.size() - 1;
  while (std::isnan(values[last])) --last;
  return ObservedSpan{first, last};
}

void fill_edges_nearest(std::vector<double>& values) {
  const auto span = observed_span(values);
  if (!span) return;
  for (std::size_t i = 0; i < span->first; ++i) values[i] = values[span->first];
  for (std::size_t i = span->last + 1; i < values.size(); ++i) values[i] = values[span->last];
}

}  // namespace gapmark
