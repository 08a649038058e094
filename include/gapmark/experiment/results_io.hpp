#pragma once
// Reading results.json back (writing it: analysis/results_json.hpp). Layout:
//   { "format": "gapmark-results", "schema_version": 1,
//     "context": {tool, version, commit, seed, spec, spec_sha256, inputs[...]},
//     "series": [...], "columns": [...], "trials": [...],
//     "summary": {...}, "warnings": [...], "timing": {...} }
// Only "timing" carries wall-clock facts; comparisons ignore it.
#include <filesystem>
#include <nlohmann/json.hpp>

#include "gapmark/experiment/record.hpp"

namespace gapmark {

/// The file name of a run's results.
inline constexpr const char* kResultsFile = "results.json";

/// Reads a results.json written by any run; errors name the file and field.
ResultSet read_results(const std::filesystem::path& path);
ResultSet results_from_json(const nlohmann::json& j, const std::string& source);

}  // namespace gapmark
