// results.json: every trial, the summary, the context and the warnings.
#include "gapmark/analysis/results_json.hpp"
#include "gapmark/experiment/results_io.hpp"
#include "gapmark/report/reporter.hpp"

namespace gapmark {
namespace {

class ResultsJson final : public Reporter {
public:
  std::string file_name() const override { return kResultsFile; }
  std::string render(const ResultSet& results, const Summary& summary) const override {
    return results_to_json(results, summary).dump(1) + "\n";
  }
};

const Registration<Reporter> registration{{
    .name = "results-json",
    .summary = "every trial with its metrics, the summary and the run's context (JSON)",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<ResultsJson>(); },
}};

}  // namespace
}  // namespace gapmark
