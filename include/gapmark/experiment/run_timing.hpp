#pragma once
// Wall-clock facts of a run, stored as "timing" in results.json: the only
// member that differs between two runs of the same spec, and the one that
// comparisons ignore. Each fact is there only when the code path that made
// the results measured it (a run in memory, a merge, a run into a folder).
#include <cstddef>
#include <map>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>

#include "gapmark/experiment/record_checks.hpp"

namespace gapmark {

struct RunTiming {
  std::optional<double> wall_seconds;                                 ///< the whole run, reports included
  std::optional<std::map<std::string, double>> fill_seconds_by_method; ///< summed over each method's trials
  std::optional<unsigned> threads;
  std::optional<std::size_t> resumed_tasks;  ///< tasks read back from an earlier checkpoint
  std::optional<std::size_t> checkpoints;    ///< checkpoints merged

  bool empty() const {
    return !wall_seconds && !fill_seconds_by_method && !threads && !resumed_tasks && !checkpoints;
  }
};

/// The "timing" object; null when nothing was measured.
nlohmann::json timing_to_json(const RunTiming& timing);
/// Reads the member `key` of `stored` (absent or null: nothing measured).
RunTiming timing_from_json(const StoredObject& stored, const std::string& key);

}  // namespace gapmark
