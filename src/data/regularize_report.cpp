#include "gapmark/data/regularize_report.hpp"

#include <sstream>

namespace gapmark::data {
namespace {

bool counts_events(Aggregation a) { return a == Aggregation::Sum || a == Aggregation::Count; }

}  // namespace

RegularizeCounts total_counts(const Panel& panel, std::size_t variable) {
  RegularizeCounts total;
  for (const auto& g : panel.counts) {
    total.bins += g[variable].bins;
    total.filled_bins += g[variable].filled_bins;
    total.empty_bins += g[variable].empty_bins;
    total.empty_value_bins += g[variable].empty_value_bins;
    total.partial += g[variable].partial;
  }
  return total;
}

std::string regularize_report(const Panel& panel, std::size_t rows, const Step& step, const std::string& written_to) {
  std::ostringstream out;
  out << "regularize: " << rows << " rows -> " << panel.axes.size() << " group" << (panel.axes.size() == 1 ? "" : "s")
      << " on a " << step.iso() << " grid, written to " << written_to << "\n";
  for (std::size_t v = 0; v < panel.value_columns.size(); ++v) {
    const RegularizeCounts total = total_counts(panel, v);
    const std::string& name = panel.value_columns[v];
    const bool zero = panel.empty[v] == EmptyPolicy::Zero;
    out << "  " << name << " (" << aggregation_name(panel.aggregation[v]) << ", empty intervals "
        << empty_policy_name(panel.empty[v]) << "): " << total.bins << " intervals, " << total.filled_bins
        << " with values, " << total.empty_bins << " without rows" << (zero ? " written as 0" : " left empty") << ", "
        << total.empty_value_bins << " with rows but no value (left empty)";
    if (total.partial) out << ", " << total.partial << " aggregated over rows with some empty cells";
    out << "\n";
    if (!zero && total.empty_bins > 0 && counts_events(panel.aggregation[v]))
      out << "  note: '" << name << "' is a " << aggregation_name(panel.aggregation[v])
          << "; if no row means nothing happened, give --empty " << name << "=zero\n";
  }
  return out.str();
}

}  // namespace gapmark::data
