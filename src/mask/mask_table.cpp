#include "gapmark/mask/mask_table.hpp"

#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"
#include <limits>

namespace gapmark {

std::string mask_key(const std::string& series_label, const std::string& scheme_label, double rate,
                     int replicate) {
  return series_label + '\x1f' + scheme_label + '\x1f' + format_double(rate) + '\x1f' + std::to_string(replicate);
}

MaskTableOutput mask_table(WideTable& table, const std::vector<std::size_t>& columns,
                           const Bound<MaskScheme>& scheme, const MaskTableOptions& options) {
  MaskTableOutput out;
  const std::vector<std::vector<double>> original = table.values;  // siblings as read, not as masked so far
  for (std::size_t c : columns) {
    MaskRequest request{table.values[c], &table.axis,
                        options.period ? options.period : table.axis.default_period(), options.holdout,
                        options.rate};
    request.name = table.columns[c];
    for (std::size_t k = 0; k < table.columns.size(); ++k) {
      if (k == c) continue;
      request.sibling_names.push_back(table.columns[k]);
      request.siblings.emplace_back(original[k]);
    }
    Rng rng(task_seed(options.seed, mask_key(table.columns[c], scheme.label, options.rate, options.replicate)));
    Mask mask;
    try {
      mask = scheme.impl->draw(request, rng);
    } catch (const InputError& e) {
      throw InputError(table.source + ": column '" + table.columns[c] + "'", e.what());
    }
    std::vector<std::string> flags(mask.size(), "0");
    std::size_t hidden = 0;
    for (std::size_t i = 0; i < mask.size(); ++i) {
      if (!mask[i]) continue;
      table.values[c][i] = std::numeric_limits<double>::quiet_NaN();
      table.cells[c][i].clear();
      flags[i] = "1";
      ++hidden;
    }
    out.flags.push_back(std::move(flags));
    out.hidden.push_back(hidden);
  }
  return out;
}

}  // namespace gapmark
