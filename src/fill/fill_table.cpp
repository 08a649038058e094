#include "gapmark/fill/fill_table.hpp"

#include <algorithm>
#include <cmath>

#include "gapmark/error.hpp"
#include "gapmark/fill/checked_fill.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/rng.hpp"

namespace gapmark {
namespace {

std::size_t count_gaps(const std::vector<double>& values) {
  std::size_t gaps = 0;
  for (std::size_t i = 0; i < values.size(); ++i)
    if (std::isnan(values[i]) && (i == 0 || !std::isnan(values[i - 1]))) ++gaps;
  return gaps;
}

bool has_param(const Bound<FillMethod>& method, const std::string& name) {
  for (const auto& p : method.entry->params)
    if (p.name == name) return true;
  return false;
}

/// What the user of `gapmark fill` can do about an unmet need.
std::string need_hint(UnmetNeed need) {
  switch (need) {
    case UnmetNeed::Period: return "give the seasonal period with --period N";
    case UnmetNeed::Length: return "give a shorter --period, or use a method without a season";
    case UnmetNeed::Siblings: return "select several columns (--column A --column B) to fill them together";
    case UnmetNeed::Observed: return "use a method that needs fewer observed values, such as linear";
    case UnmetNeed::None: break;
  }
  return "";
}

/// What the user can do about points a method ran but left empty.
std::string unfilled_hint(const Bound<FillMethod>& method) {
  if (has_param(method, "edges") && method.params.text("edges") == "leave")
    return "edges=nearest fills the points before the first and after the last observation";
  if (has_param(method, "reach"))
    return "a larger reach=N lets the window find observed values further away";
  return "try another method (gapmark methods lists them)";
}

/// The observed range of `given`, and where the fills of its gaps fall against it.
void note_range(const std::vector<double>& given, const std::vector<double>& filled,
                const std::vector<std::vector<double>>& draws, FillTableReport& report) {
  double low = INFINITY, high = -INFINITY, fill_low = INFINITY, fill_high = -INFINITY;
  for (double v : given)
    if (!std::isnan(v)) low = std::min(low, v), high = std::max(high, v);
  for (std::size_t i = 0; i < filled.size(); ++i) {
    if (!std::isnan(given[i]) || std::isnan(filled[i])) continue;
    fill_low = std::min(fill_low, filled[i]);
    fill_high = std::max(fill_high, filled[i]);
    report.outside += filled[i] < low || filled[i] > high ? 1 : 0;
  }
  for (const auto& draw : draws)
    for (std::size_t i = 0; i < draw.size() && i < given.size(); ++i) {
      if (!std::isnan(given[i]) || std::isnan(draw[i])) continue;
      ++report.drawn;
      report.drawn_outside += draw[i] < low || draw[i] > high ? 1 : 0;
    }
  if (low > high) low = high = std::nan("");
  report.observed_low = low;
  report.observed_high = high;
  report.fill_low = fill_low;
  report.fill_high = fill_high;
}

}  // namespace

FillTableOutput fill_table(WideTable& table, const std::vector<std::size_t>& columns,
                           const Bound<FillMethod>& method, std::size_t period, bool fit_complete_columns,
                           std::uint64_t seed) {
  FillTableOutput out;
  const std::vector<std::vector<double>> original = table.values;
  for (std::size_t c : columns) {
    const std::vector<double>& given = original[c];
    FillTableReport report;
    report.column = table.columns[c];
    for (double v : given) report.missing += std::isnan(v) ? 1 : 0;
    report.gaps = count_gaps(given);
    std::vector<std::string> flags(given.size(), "0"), variance(given.size());
    if (report.missing > 0 || fit_complete_columns) {
      FillRequest request;
      request.values = given;
      request.axis = &table.axis;
      request.period = period ? period : table.axis.default_period();
      request.seed = task_seed(seed, table.columns[c]);
      for (std::size_t s : columns) {
        if (s == c) continue;
        request.siblings.emplace_back(original[s]);
        request.sibling_names.push_back(table.columns[s]);
      }
      const CheckedFill fill = checked_fill(method, request);
      report.failure = fill.failure;
      report.need = fill.need;
      report.variance = !fill.failed() && fill.variance.size() == given.size();
      report.clipped = fill.clipped;
      report.fit = fill.fit;
      report.draws = fill.draws;
      note_range(given, fill.values, fill.draws, report);
      for (std::size_t i = 0; i < fill.values.size(); ++i) {
        if (!std::isnan(given[i]) || std::isnan(fill.values[i])) continue;
        table.values[c][i] = fill.values[i];
        table.cells[c][i] = format_double(fill.values[i]);
        flags[i] = "1";
        if (report.variance && std::isfinite(fill.variance[i])) variance[i] = format_double(fill.variance[i]);
        ++report.filled;
      }
    }
    out.flags.push_back(std::move(flags));
    out.variance.push_back(std::move(variance));
    out.reports.push_back(std::move(report));
  }
  return out;
}

std::vector<ExtraColumn> fill_extra_columns(const WideTable& table, const std::vector<std::size_t>& columns,
                                            const FillTableOutput& result, const FillColumnsWanted& wanted) {
  std::vector<ExtraColumn> extra;
  for (std::size_t k = 0; k < columns.size(); ++k) {
    extra.emplace_back(table.columns[columns[k]] + "_filled", result.flags[k]);
    if (wanted.variance) extra.emplace_back(table.columns[columns[k]] + "_variance", result.variance[k]);
  }
  for (std::size_t k = 0; k < columns.size(); ++k)
    for (std::size_t d = 0; d < wanted.draws; ++d) {
      const auto& draws = result.reports[k].draws;
      std::vector<std::string> cells = table.cells[columns[k]];
      if (d < draws.size())
        for (std::size_t i = 0; i < cells.size(); ++i)
          if (result.flags[k][i] == "1") cells[i] = std::isfinite(draws[d][i]) ? format_double(draws[d][i]) : "";
      extra.emplace_back(table.columns[columns[k]] + "_draw_" + std::to_string(d + 1), std::move(cells));
    }
  return extra;
}

std::size_t total_unfilled(const FillTableOutput& result) {
  std::size_t unfilled = 0;
  for (const auto& r : result.reports) unfilled += r.unfilled();
  return unfilled;
}

std::string first_unfilled_message(const FillTableOutput& result, const Bound<FillMethod>& method) {
  for (const auto& r : result.reports)
    if (r.unfilled() > 0) return unfilled_message(r, method);
  return "";
}

std::string points_in_gaps(std::size_t points, std::size_t gaps) {
  return std::to_string(points) + (points == 1 ? " point in " : " points in ") + std::to_string(gaps) +
         (gaps == 1 ? " gap" : " gaps");
}

std::string unfilled_message(const FillTableReport& report, const Bound<FillMethod>& method) {
  std::string line = "column '" + report.column + "': " + method.label + " left " + std::to_string(report.unfilled()) +
                     " of the " + points_in_gaps(report.missing, report.gaps) + " unfilled";
  if (!report.failure.empty()) {
    line += " (it failed: " + report.failure + ")";
    const std::string hint = need_hint(report.need);
    return line + "; " + (hint.empty() ? "try another method (gapmark methods lists them)" : hint);
  }
  return line + "; " + unfilled_hint(method);
}

std::string out_of_range_message(const FillTableReport& report, const Bound<FillMethod>& method) {
  if (report.outside == 0 && report.drawn_outside == 0) return "";
  const std::string low = short_number(report.observed_low), high = short_number(report.observed_high);
  std::string line = "column '" + report.column + "': ";
  if (report.outside > 0) {
    const std::string n = std::to_string(report.filled);
    const std::string which = report.outside < report.filled ? std::to_string(report.outside) + " of the " + n + " fills"
                              : report.filled == 1            ? std::string("the one fill")
                                                              : "all " + n + " fills";
    const std::string span = report.fill_low == report.fill_high
                                 ? short_number(report.fill_low)
                                 : "from " + short_number(report.fill_low) + " to " + short_number(report.fill_high);
    line += which + " of " + method.label + (report.outside == 1 ? " lies" : " lie") + " outside the observed range " +
            low + " to " + high + " (fills " + span + ")";
    if (report.drawn_outside > 0)
      line += ", and " + std::to_string(report.drawn_outside) + " of the " + std::to_string(report.drawn) + " drawn values";
  } else {
    line += std::to_string(report.drawn_outside) + " of the " + std::to_string(report.drawn) + " drawn values of " +
            method.label + (report.drawn_outside == 1 ? " lies" : " lie") + " outside the observed range " + low + " to " +
            high;
  }
  line += "; the method parameter bounds=" + low + "," + high + " keeps fills in that range";
  if (has_param(method, "transform") && method.params.text("transform") == "none")
    line += ", transform=log (values > 0) or transform=log1p (values >= 0) fills on a log scale";
  return line;
}

}  // namespace gapmark
