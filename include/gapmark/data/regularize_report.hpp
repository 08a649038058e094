#pragma once
// What `gapmark regularize` tells about a panel it made: per variable, over
// all groups, how many intervals got values, how many were empty and what
// was written there, and a note where a sum or count leaves empty intervals
// missing.
#include <cstddef>
#include <string>

#include "gapmark/data/regularize.hpp"

namespace gapmark::data {

/// One variable's counts added over every group.
RegularizeCounts total_counts(const Panel& panel, std::size_t variable);

/// The lines for people: "<rows> rows -> <groups> groups on a <step> grid,
/// written to <written_to>", then a line per variable (and its note).
std::string regularize_report(const Panel& panel, std::size_t rows, const Step& step, const std::string& written_to);

}  // namespace gapmark::data
