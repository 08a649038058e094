// gapmark._engine: the raw-data side on tables handed over as CSV text:
// `profile` (what is missing, and how) and `regularize` (rows onto a grid).
#include "bindings.hpp"
#include "gapmark/data/profile.hpp"
#include "gapmark/raw_table.hpp"
#include "gapmark/data/regularize.hpp"
#include "gapmark/error.hpp"
#include "gapmark/table_io.hpp"

namespace gapmark::python {
namespace {

using Choices = data::ColumnChoices;  // (column or "" for every column, choice)

RawData raw_from_text(const std::string& csv, const std::string& source, const std::vector<std::string>& groups) {
  RawReadOptions read;
  read.group_columns = groups;
  return parse_raw(parse_csv(csv, source), read);
}

py::tuple profile(const std::string& csv, const std::string& source, const std::vector<std::string>& groups,
                  const std::string& step, std::size_t period) {
  const RawData raw = raw_from_text(csv, source, groups);
  data::ProfileOptions options;
  if (!step.empty()) options.step = Step::parse(step, "step");
  options.period = period;
  const data::DataProfile p = data::profile_data(raw, options);
  return py::make_tuple(data::profile_json(p), data::profile_text(p));
}

std::string regularize(const std::string& csv, const std::string& source, const std::vector<std::string>& groups,
                       const std::string& step, const Choices& agg, const Choices& empty) {
  const RawData raw = raw_from_text(csv, source, groups);
  data::RegularizeOptions options;
  options.step = Step::parse(step, "step");
  data::set_aggregations(options, agg, "agg");
  data::set_empty_policies(options, empty, "empty");
  const data::Panel panel = data::regularize(raw, options);
  return data::panel_csv(panel, groups.empty() ? data::PanelLayout::Wide : data::PanelLayout::Long);
}

}  // namespace

void add_raw_data(py::module_& m) {
  m.def("_profile", &profile, py::arg("csv"), py::arg("source"), py::arg("groups"), py::arg("step"),
        py::arg("period"), "(profile JSON, profile text) of raw rows given as CSV text");
  m.def("_regularize", &regularize, py::arg("csv"), py::arg("source"), py::arg("groups"), py::arg("step"),
        py::arg("agg"), py::arg("empty"), "The regular panel, as CSV text, of raw rows given as CSV text");
}

}  // namespace gapmark::python
