#pragma once
// What the run knew of each series: its label and file, its length, how
// much of it was observed, its time step and start, and its seasonal period.
// Stored as "series" in results.json and in each checkpoint's header.
#include <cstddef>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "gapmark/experiment/record_checks.hpp"

namespace gapmark {

struct SeriesDescription {
  std::string label;
  std::string source;         ///< the data file, as the spec names it
  std::size_t points = 0;
  std::size_t observed = 0;   ///< points with a value
  std::string step;           ///< ISO 8601 duration, or the index step
  std::string start;          ///< the first time stamp; "" for an empty series
  std::size_t period = 0;     ///< seasonal period in steps; 0 = none
  std::string units;          ///< "" = not given (then not written)
};

nlohmann::json series_to_json(const std::vector<SeriesDescription>& series);
/// Reads what series_to_json wrote: the array `key` of `stored`.
std::vector<SeriesDescription> series_from_json(const StoredObject& stored, const std::string& key);

/// The description of the series labelled `label`; null when there is none.
const SeriesDescription* find_series(const std::vector<SeriesDescription>& series, const std::string& label);

}  // namespace gapmark
