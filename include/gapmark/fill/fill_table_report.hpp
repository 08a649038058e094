#pragma once
// What `gapmark fill` tells about a table it filled: the --fit file, and the
// lines for people (counts, fits, unfilled points, fills out of range).
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "gapmark/fill/fill_table.hpp"

namespace gapmark {

/// The --fit file: per selected column, its missing points and the gaps they
/// form, what was filled, and the method's fit (null for a method without a
/// model, or when it failed).
nlohmann::json fits_json(const std::string& method, const std::vector<FillTableReport>& reports);

/// One line for people: the model, its estimates and its likelihood, 4 significant digits.
std::string fit_line(const ModelFit& fit);

/// The lines `gapmark fill` prints per column: what it filled, the fit (with
/// `with_fit`), and warnings and notes on unfilled points and fills out of range.
std::string fill_report_text(const FillTableOutput& result, const Bound<FillMethod>& method,
                             const FillColumnsWanted& wanted, bool with_fit);

}  // namespace gapmark
