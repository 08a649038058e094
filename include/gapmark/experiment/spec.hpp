#pragma once
// An experiment spec (JSON): which data, which masking schemes at which
// rates, which methods, how many replicates, the seed, the holdout, the
// metrics and the one that ranks. See README.md, "Experiment specs".
#include <cstdint>
#include <filesystem>
#include <map>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "gapmark/experiment/record.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/mask/scheme.hpp"
#include "gapmark/score/metric.hpp"
#include "gapmark/time_axis.hpp"

namespace gapmark {

struct DataSource {
  std::string where;                  ///< JSON path, for messages ("/data/0")
  std::filesystem::path path;         ///< resolved against the spec's folder
  std::string label;                  ///< as written in the spec
  std::vector<std::string> columns;   ///< empty: every variable column
  std::string time_column;            ///< empty: the first column
  std::optional<Step> step;           ///< empty: inferred
  std::size_t period = 0;             ///< 0: from the step (24 for PT1H ...)
  std::map<std::string, std::size_t> column_periods;  ///< per-column periods, over `period`
  /// Group columns of a long-layout file (group columns, time, value
  /// columns); empty: a wide file. Each group × column becomes a series.
  std::vector<std::string> groups;
};

struct SchemePlan {
  Bound<MaskScheme> scheme;
  std::vector<double> rates;
};

struct ExperimentSpec {
  std::string source;                 ///< the spec file, for messages
  std::filesystem::path base_dir;     ///< paths in the spec are relative to it
  std::string text;                   ///< the spec as read
  std::string sha256;                 ///< of `text`
  nlohmann::json json;                ///< the parsed spec

  std::string name = "experiment";
  std::uint64_t seed = 1;
  int replicates = 10;
  std::size_t holdout = 0;
  std::filesystem::path output = "gapmark-out";
  std::vector<DataSource> data;
  std::vector<SchemePlan> schemes;
  std::vector<Bound<FillMethod>> methods;
  std::vector<Bound<Metric>> metrics;
  std::string rank_by = "rmse";
  double alpha = 0.05;
  double equivalence = kDefaultEquivalence;  ///< relative margin on the ranking metric, in (0, 1)
  std::map<std::string, std::string> units;  ///< column -> its units ("mg/L"), shown in the reports
};

/// Reads and checks a spec file. Errors are one line naming the file and the
/// JSON path of the offending field ("demo.json: /schemes/1/rates/0: ...").
ExperimentSpec load_spec(const std::filesystem::path& path);

/// The metrics of a spec's JSON bound as parse_spec binds them (the defaults
/// when it names none): how a results file's stored spec tells which metric
/// settings made its columns. InputError, naming `source`, for a call that
/// does not bind.
std::vector<Bound<Metric>> bind_spec_metrics(const nlohmann::json& spec, const std::string& source);
/// Checks a spec given as text; `source` names it in errors, `base_dir`
/// resolves relative data paths.
ExperimentSpec parse_spec(const std::string& text, const std::string& source,
                          const std::filesystem::path& base_dir);

/// The spec with every data set's seasonal period set to `period` (per-column
/// "periods" dropped), as `run --period` asks. It is parsed again from the
/// changed text, so its SHA-256, results.json and a checkpoint's check all
/// follow the change.
ExperimentSpec with_period(const ExperimentSpec& spec, std::size_t period);

}  // namespace gapmark
