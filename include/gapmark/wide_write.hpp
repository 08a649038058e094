#pragma once
// Writing a wide table back out: the time column and every variable column
// as their cells stand (so untouched cells keep their original text), plus
// extra columns appended at the right.
#include <string>
#include <utility>
#include <vector>

#include "gapmark/table_io.hpp"

namespace gapmark {

using ExtraColumn = std::pair<std::string, std::vector<std::string>>;

std::string write_wide_csv(const WideTable& table, const std::vector<ExtraColumn>& extra = {});

/// The columns to work on: the named ones (checked), or all when none named.
std::vector<std::size_t> select_columns(const WideTable& table, const std::vector<std::string>& names);

}  // namespace gapmark
