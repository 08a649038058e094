#pragma once
// A reporter turns results and their summary into one output file (ranked
// tables in Markdown or CSV, results.json, an HTML page, a methods text).
// Reporters only format; they never compute a metric.
#include <string>

#include "gapmark/experiment/record.hpp"
#include "gapmark/analysis/summary.hpp"
#include "gapmark/registry.hpp"

namespace gapmark {

class Reporter {
public:
  static constexpr const char* family = "reporter";
  virtual ~Reporter() = default;
  /// The file it writes inside the output folder ("ranking.md").
  virtual std::string file_name() const = 0;
  virtual std::string render(const ResultSet& results, const Summary& summary) const = 0;
};

using ReporterRegistry = Registry<Reporter>;

}  // namespace gapmark
