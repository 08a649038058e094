// gapmark._engine: one method on one series (`gapmark fill`), and one
// scheme's mask for one series, seed and replicate (`gapmark mask`, `run`).
#include <cmath>
#include <limits>
#include <nlohmann/json.hpp>

#include "bindings.hpp"
#include "gapmark/error.hpp"
#include "gapmark/fill/checked_fill.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/mask/mask_table.hpp"
#include "gapmark/mask/scheme.hpp"
#include "gapmark/rng.hpp"

namespace gapmark::python {
namespace {

using Args = std::vector<std::pair<std::string, std::string>>;

struct SeriesInput {
  std::vector<double> values;
  TimeAxis axis;
  std::vector<std::vector<double>> siblings;
  std::vector<std::string> sibling_names;
};

SeriesInput series_input(const DoubleArray& values, const std::optional<std::vector<std::string>>& times,
                         const std::vector<std::string>& sibling_names, const std::vector<DoubleArray>& siblings) {
  SeriesInput in;
  in.values = to_vector(values, "values");
  in.axis = make_axis(in.values.size(), times);
  for (std::size_t k = 0; k < siblings.size(); ++k) {
    const std::string where = "siblings['" + sibling_names.at(k) + "']";
    in.siblings.push_back(to_vector(siblings[k], where));
    if (in.siblings.back().size() != in.values.size())
      throw InputError(where, std::to_string(in.siblings.back().size()) + " values, the series has " +
                                  std::to_string(in.values.size()));
    for (double v : in.siblings.back())
      if (std::isinf(v)) throw InputError(where, "infinite value");
    in.sibling_names.push_back(sibling_names[k]);
  }
  for (double v : in.values)
    if (std::isinf(v)) throw InputError("values", "infinite value (use NaN for a missing value)");
  return in;
}

py::array_t<double> to_array(const std::vector<double>& v) {
  py::array_t<double> out(static_cast<py::ssize_t>(v.size()));
  std::copy(v.begin(), v.end(), out.mutable_data());
  return out;
}

/// Fills the missing values of one series through the fill step `gapmark fill`
/// and a run use (checked_fill): the method's needs checked, observed values
/// kept, non-finite fills left missing. A method that cannot fill raises
/// MethodFailure with its reason.
py::tuple fill_series(const DoubleArray& values, const std::string& method_text, const Args& args,
                      std::size_t period, const std::optional<std::vector<std::string>>& times,
                      const std::vector<std::string>& sibling_names, const std::vector<DoubleArray>& siblings) {
  const auto method = MethodRegistry::global().bind(make_call(method_text, args, "method"), "method");
  const SeriesInput in = series_input(values, times, sibling_names, siblings);
  FillRequest request;
  request.values = in.values;
  request.axis = &in.axis;
  request.period = period ? period : in.axis.default_period();
  for (std::size_t k = 0; k < in.siblings.size(); ++k) {
    request.siblings.emplace_back(in.siblings[k]);
    request.sibling_names.push_back(in.sibling_names[k]);
  }
  interrupted() = false;
  CheckedFill fill;
  {
    py::gil_scoped_release release;  // a Python method takes it back
    fill = checked_fill(method, request);
  }
  if (fill.failed()) {
    raise_if_interrupted();
    throw MethodFailure(fill.failure, fill.need);
  }
  const bool with_variance = fill.variance.size() == in.values.size();
  std::vector<double> variance(with_variance ? in.values.size() : 0, 0.0);
  for (std::size_t i = 0; i < variance.size(); ++i)
    if (std::isnan(in.values[i]))
      variance[i] = std::isnan(fill.values[i]) ? std::numeric_limits<double>::quiet_NaN() : fill.variance[i];
  py::object variance_out = with_variance ? py::object(to_array(variance)) : py::object(py::none());
  py::object fit = fill.fit.empty() ? py::object(py::none()) : py::object(py::str(fit_to_json(fill.fit).dump()));
  return py::make_tuple(to_array(fill.values), variance_out, fit, fill.clipped, method.label);
}

/// The mask `gapmark mask` and `gapmark run` draw for a series named `name`
/// under a scheme at a rate, for a seed and a replicate.
py::array_t<bool> mask_series(const DoubleArray& values, const std::string& scheme_text, const Args& args,
                              double rate, std::uint64_t seed, int replicate, std::size_t period, std::size_t holdout,
                              const std::string& name, const std::optional<std::vector<std::string>>& times,
                              const std::vector<std::string>& sibling_names, const std::vector<DoubleArray>& siblings) {
  check_rate(rate, "rate");
  if (replicate < 0) throw InputError("replicate", "must be 0 or more");
  const auto scheme = SchemeRegistry::global().bind(make_call(scheme_text, args, "scheme"), "scheme");
  const SeriesInput in = series_input(values, times, sibling_names, siblings);
  MaskRequest request{in.values, &in.axis, period ? period : in.axis.default_period(), holdout, rate};
  request.name = name;
  request.where = name.empty() ? "series" : "series '" + name + "'";
  for (std::size_t k = 0; k < in.siblings.size(); ++k) {
    request.sibling_names.push_back(in.sibling_names[k]);
    request.siblings.emplace_back(in.siblings[k]);
  }
  Rng rng(task_seed(seed, mask_key(name, scheme.label, rate, replicate)));
  const Mask mask = scheme.impl->draw(request, rng);
  py::array_t<bool> out(static_cast<py::ssize_t>(mask.size()));
  bool* data = out.mutable_data();
  for (std::size_t i = 0; i < mask.size(); ++i) data[i] = mask[i] != 0;
  return out;
}

}  // namespace

void add_fill_and_mask(py::module_& m) {
  m.def("_fill", &fill_series, py::arg("values"), py::arg("method"), py::arg("args"), py::arg("period"),
        py::arg("times"), py::arg("sibling_names"), py::arg("siblings"),
        "Fills one series; returns (values, variance or None, fit JSON or None, clipped, method label).");
  m.def("_mask", &mask_series, py::arg("values"), py::arg("scheme"), py::arg("args"), py::arg("rate"),
        py::arg("seed"), py::arg("replicate"), py::arg("period"), py::arg("holdout"), py::arg("name"),
        py::arg("times"), py::arg("sibling_names"), py::arg("siblings"),
        "The boolean mask a scheme draws for one series, seed and replicate.");
}

}  // namespace gapmark::python
