#include "gapmark/experiment/runner.hpp"

#include <map>

#include "gapmark/error.hpp"
#include "gapmark/hash.hpp"
#include "gapmark/table_io.hpp"

namespace gapmark {

LoadedData load_data(const ExperimentSpec& spec) {
  LoadedData out;
  std::map<std::string, std::size_t> seen;
  for (std::size_t d = 0; d < spec.data.size(); ++d) {
    const DataSource& src = spec.data[d];
    const std::string text = read_text_file(src.path);
    out.input_sha256.push_back(sha256_hex(text));
    WideReadOptions options{src.time_column, src.step};
    const WideTable table = parse_wide_csv(parse_csv(text, src.path.string()), options);
    std::vector<std::string> columns = src.columns.empty() ? table.columns : src.columns;
    for (std::size_t k = 0; k < columns.size(); ++k) {
      std::size_t c = 0;
      try {
        c = table.column_index(columns[k]);
      } catch (const InputError& e) {
        throw InputError(spec.source + ": " + src.where + "/columns/" + std::to_string(k),
                         "no column '" + columns[k] + "' in " + src.path.string());
      }
      Series s;
      s.name = columns[k];
      s.axis = table.axis;
      s.values = table.values[c];
      s.period = src.period ? src.period : table.axis.default_period();
      if (auto it = src.column_periods.find(s.name); it != src.column_periods.end()) s.period = it->second;
      if (s.observed_count() == 0)
        throw InputError(src.path.string(), "column '" + s.name + "' has no observed values");
      out.series.push_back(std::move(s));
      out.dataset.push_back(d);
    }
  }
  // Labels must be unique across the spec: prefix clashing names with their file's stem.
  for (const auto& s : out.series) ++seen[s.name];
  for (std::size_t i = 0; i < out.series.size(); ++i)
    if (seen[out.series[i].name] > 1)
      out.series[i].name = spec.data[out.dataset[i]].path.stem().string() + "/" + out.series[i].name;
  return out;
}

}  // namespace gapmark
