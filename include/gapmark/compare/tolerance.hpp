#pragma once
// How much worse a metric may get before `gapmark compare` calls it a
// regression. Per metric, an absolute amount, a relative amount (of the
// baseline's distance from the best value), or both (the larger is allowed).
//
// On the command line: "rmse=5%,mae=0.01,*=1%" ("5%" relative, "0.01"
// absolute, "*" every metric not named). In a file: JSON
//   {"rmse": {"relative": 0.05}, "mae": {"absolute": 0.01}, "*": {"relative": 0.01}}
//
// Compared are the metrics named, every metric when "*" is given, and the
// ranking metric always. Default tolerance: relative 1e-6 with an absolute
// floor of 1e-12.
// Runs are deterministic, so the same code and inputs give the same bytes;
// the default only absorbs floating-point noise from another compiler or
// CPU, and any real worsening beyond it counts (subject to the paired test).
#include <filesystem>
#include <map>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

namespace gapmark {

struct Tolerance {
  double absolute = 0;
  double relative = 0;
  /// The worsening allowed from a baseline whose distance from the best
  /// value is `baseline_badness`: max(absolute, relative * |baseline_badness|).
  double allowed(double baseline_badness) const;
  std::string describe() const;  ///< "5% relative", "0.01 absolute", "0.0001% relative, at least 1e-12 absolute"
};

struct Tolerances {
  Tolerance fallback{1e-12, 1e-6};
  bool all = false;  ///< "*" was given: every metric is compared (with `fallback` unless named)
  std::map<std::string, Tolerance> per_metric;
  /// Compared: named, or "*" given, or the ranking metric.
  bool compares(const std::string& metric, const std::string& rank_by) const {
    return all || metric == rank_by || per_metric.count(metric) != 0;
  }
  const Tolerance& of(const std::string& metric) const;
  nlohmann::json to_json() const;
};

/// Adds the entries of "name=5%,name=0.01,*=1%" to `base`; errors name `where`.
Tolerances parse_tolerance_text(const std::string& text, const std::string& where, Tolerances base = {});
/// Adds the entries of a JSON tolerance file to `base`; errors name the file and field.
Tolerances read_tolerance_file(const std::filesystem::path& path, Tolerances base = {});

/// Refuses (InputError naming `where`) a tolerance for a metric that is not
/// one of `columns`: a misspelt name would otherwise be ignored silently.
void check_tolerance_metrics(const Tolerances& tolerances, const std::vector<std::string>& columns,
                             const std::string& where);

}  // namespace gapmark
