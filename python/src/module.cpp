// gapmark._engine: the module's entry point, its errors and the listings.
#include <nlohmann/json.hpp>

#include "bindings.hpp"
#include "gapmark/error.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/mask/scheme.hpp"
#include "gapmark/registry_listing.hpp"
#include "gapmark/score/metric.hpp"
#include "gapmark/version.hpp"

namespace gapmark::python {

void add_errors(py::module_& m) {
  // gapmark's one-line messages, unchanged: bad input is a ValueError, a
  // method that cannot fill a RuntimeError.
  py::register_exception<InputError>(m, "InputError", PyExc_ValueError);
  py::register_exception<MethodFailure>(m, "MethodFailure", PyExc_RuntimeError);
}

void add_listings(py::module_& m) {
  m.def("_listing", [](const std::string& family) {
    nlohmann::json j;
    if (family == "methods") j = registry_json(MethodRegistry::global());
    else if (family == "schemes") j = registry_json(SchemeRegistry::global());
    else if (family == "metrics") j = registry_json(MetricRegistry::global());
    else throw InputError("listing", "unknown family '" + family + "'");
    return j.dump();
  }, "The registry of a family (methods, schemes, metrics) as JSON text.");
  m.attr("__version__") = std::string(version());
}

CallSpec make_call(const std::string& text, const std::vector<std::pair<std::string, std::string>>& args,
                   const std::string& where) {
  CallSpec call = CallSpec::parse(text, where);
  for (const auto& a : args) call.args.push_back(a);
  return call;
}

TimeAxis make_axis(std::size_t length, const std::optional<std::vector<std::string>>& times) {
  if (!times) return TimeAxis::index(length);
  if (times->size() != length)
    throw InputError("index", std::to_string(times->size()) + " times for " + std::to_string(length) + " values");
  std::vector<TimePoint> points;
  points.reserve(length);
  for (std::size_t i = 0; i < times->size(); ++i) {
    auto t = parse_time((*times)[i]);
    if (!t) throw InputError("index", "position " + std::to_string(i) + ": not a time: '" + (*times)[i] + "'");
    points.push_back(*t);
  }
  std::vector<std::size_t> positions(length);
  for (std::size_t i = 0; i < length; ++i) positions[i] = i;
  return infer_axis(points, std::nullopt, "index", positions);
}

std::vector<double> to_vector(const DoubleArray& array, const std::string& where) {
  if (array.ndim() != 1)
    throw InputError(where, "expected a 1-D array, found " + std::to_string(array.ndim()) + " dimensions");
  return std::vector<double>(array.data(), array.data() + array.size());
}

}  // namespace gapmark::python

PYBIND11_MODULE(_engine, m) {
  m.doc() = "gapmark's engine: registries, fills, masks, runs (use the gapmark package)";
  gapmark::python::add_errors(m);
  gapmark::python::add_listings(m);
  gapmark::python::add_fill_and_mask(m);
  gapmark::python::add_run(m);
  gapmark::python::add_python_methods(m);
  gapmark::python::add_raw_data(m);
}
