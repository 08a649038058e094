#pragma once
// results.json: the versioned record of a run. Layout:
//   { "format": "gapmark-results", "schema_version": 1,
//     "context": {tool, version, commit, seed, spec, spec_sha256, inputs[...]},
//     "series": [...], "columns": [...], "trials": [...],
//     "summary": {...}, "verdict": {...}, "warnings": [...], "timing": {...} }
// Only "timing" carries wall-clock facts; comparisons ignore it. Reading a
// results file back is experiment/results_io.hpp.
#include <nlohmann/json.hpp>
#include <ostream>

#include "gapmark/analysis/summary.hpp"
#include "gapmark/experiment/record.hpp"

namespace gapmark {

/// The whole document as one JSON value.
nlohmann::json results_to_json(const ResultSet& results, const Summary& summary);

/// The same document as results_to_json(...).dump(1) and a newline, written
/// member by member: the trials and the summary's groups are serialized one
/// element at a time, so memory never holds the whole text.
void write_results_json(std::ostream& out, const ResultSet& results, const Summary& summary);

}  // namespace gapmark
