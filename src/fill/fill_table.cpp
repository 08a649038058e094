#include "gapmark/fill/fill_table.hpp"

#include <cmath>

#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/rng.hpp"

namespace gapmark {

FillTableOutput fill_table(WideTable& table, const std::vector<std::size_t>& columns,
                           const Bound<FillMethod>& method, std::size_t period, bool fit_complete_columns,
                           std::uint64_t seed) {
  FillTableOutput out;
  const std::vector<std::vector<double>> original = table.values;
  for (std::size_t c : columns) {
    FillTableReport report;
    report.column = table.columns[c];
    std::vector<std::string> flags(original[c].size(), "0");
    FillRequest request;
    request.values = original[c];
    request.axis = &table.axis;
    request.period = period ? period : table.axis.default_period();
    request.seed = task_seed(seed, table.columns[c]);
    for (std::size_t s : columns) {
      if (s == c) continue;
      request.siblings.emplace_back(original[s]);
      request.sibling_names.push_back(table.columns[s]);
    }
    for (double v : original[c]) report.gaps += std::isnan(v) ? 1 : 0;
    if (report.gaps > 0 || fit_complete_columns) {
      try {
        check_needs(method, request);
        FillResult result = method.impl->fill(request);
        report.clipped = result.clipped;
        report.fit = std::move(result.fit);
        report.draws = std::move(result.draws);
        if (result.values.size() != original[c].size())
          throw MethodFailure("returned the wrong number of values");
        for (std::size_t i = 0; i < result.values.size(); ++i) {
          if (!std::isnan(original[c][i]) || !std::isfinite(result.values[i])) continue;
          table.values[c][i] = result.values[i];
          table.cells[c][i] = format_double(result.values[i]);
          flags[i] = "1";
          ++report.filled;
        }
      } catch (const MethodFailure& e) {
        report.failure = e.what();
      }
    }
    out.flags.push_back(std::move(flags));
    out.reports.push_back(std::move(report));
  }
  return out;
}

}  // namespace gapmark
