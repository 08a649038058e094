#pragma once
// The words and numbers of a fit summary (analysis/fit_summary.hpp) as
// methods.md and report.html print them: plain text, 4 significant digits;
// each reporter escapes it for its own format.
#include <string>

#include "gapmark/analysis/fit_summary.hpp"

namespace gapmark {

/// "0.0123 [0.0110, 0.0141]": median [min, max]; just the value when all
/// fits agree; "n/a" when no fit had a finite value.
std::string range_text(const EstimateRange& range);
/// "ARIMA(1,0,1) with mean (14), ARIMA(2,0,0) with mean (6)"; one model alone without a count.
std::string models_text(const FitSummary& fits);
/// "variance_irregular 0.0123 [0.0110, 0.0141]; variance_level ...".
std::string estimates_text(const FitSummary& fits);

}  // namespace gapmark
