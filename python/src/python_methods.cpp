// gapmark._engine: fill methods written in Python, registered beside the
// built-in ones. A registered method is an ordinary entry of the method
// registry, so specs name it and runs use it like any other; its fill takes
// the GIL for the call only, so built-in methods keep every thread busy.
#include <cmath>
#include <set>

#include "bindings.hpp"
#include "gapmark/error.hpp"
#include "gapmark/fill/method.hpp"

namespace gapmark::python {
namespace {

/// The names registered from Python (a built-in name cannot be replaced).
std::set<std::string>& python_names() {
  static std::set<std::string> names;
  return names;
}

py::object param_value(const ParamValues& values, const ParamSpec& spec) {
  switch (spec.type) {
    case ParamType::Integer: return py::int_(values.integer(spec.name));
    case ParamType::Real: return py::float_(values.real(spec.name));
    case ParamType::Flag: return py::bool_(values.flag(spec.name));
    case ParamType::Text:
    case ParamType::Choice: return py::str(values.text(spec.name));
  }
  return py::none();
}

py::array_t<double> copy_array(std::span<const double> v) {
  py::array_t<double> out(static_cast<py::ssize_t>(v.size()));
  std::copy(v.begin(), v.end(), out.mutable_data());
  return out;
}

class PythonMethod final : public FillMethod {
public:
  /// `call` is the package's caller (gapmark._call_method): it builds the
  /// request object, calls the user's function and returns
  /// (values, variance or None) or ("error", message). The Python objects
  /// live as long as the registry (the process), never freed without the GIL.
  PythonMethod(PyObject* call, PyObject* function, std::vector<ParamSpec> own, ParamValues values, bool siblings)
      : call_(call), function_(function), own_(std::move(own)), values_(std::move(values)), siblings_(siblings) {}

  FillResult fill(const FillRequest& request) const override {
    if (interrupted()) throw MethodFailure("interrupted");
    py::gil_scoped_acquire gil;
    py::dict siblings;  // copied only for a method that declared it needs them
    for (std::size_t k = 0; siblings_ && k < request.siblings.size(); ++k)
      siblings[py::str(request.sibling_names[k])] = copy_array(request.siblings[k]);
    py::dict params;
    for (const auto& p : own_) params[py::str(p.name)] = param_value(values_, p);
    const TimeAxis& axis = *request.axis;
    py::object out;
    try {
      out = py::reinterpret_borrow<py::object>(call_)(
          py::reinterpret_borrow<py::object>(function_), copy_array(request.values), request.period, siblings,
          axis.size() ? py::str(axis.format(0)) : py::str(""), py::str(axis.step().iso()),
          params);
    } catch (py::error_already_set& e) {
      if (e.matches(PyExc_KeyboardInterrupt)) interrupted() = true;
      throw MethodFailure(interrupted() ? std::string("interrupted") : std::string(e.what()));
    }
    py::tuple pair = out.cast<py::tuple>();
    if (py::isinstance<py::str>(pair[0])) throw MethodFailure(pair[1].cast<std::string>());
    FillResult result;
    const auto values = pair[0].cast<DoubleArray>();
    result.values.assign(values.data(), values.data() + values.size());
    if (!pair[1].is_none()) {
      const auto variance = pair[1].cast<DoubleArray>();
      result.variance.assign(variance.data(), variance.data() + variance.size());
    }
    return result;
  }

private:
  PyObject* call_;
  PyObject* function_;
  std::vector<ParamSpec> own_;  ///< the method's own parameters, passed to the function by name
  ParamValues values_;
  bool siblings_;
};

ParamSpec param_spec(const py::dict& d) {
  ParamSpec p;
  p.name = d["name"].cast<std::string>();
  const auto type = d["type"].cast<std::string>();
  if (type == "integer") p.type = ParamType::Integer;
  else if (type == "number") p.type = ParamType::Real;
  else if (type == "text") p.type = ParamType::Text;
  else if (type == "flag") p.type = ParamType::Flag;
  else if (type == "choice") p.type = ParamType::Choice;
  else throw InputError("params['" + p.name + "']", "unknown type '" + type + "' (integer, number, text, flag, choice)");
  p.default_value = d["default"].cast<std::string>();
  if (d.contains("min") && !d["min"].is_none()) p.min = d["min"].cast<double>();
  if (d.contains("max") && !d["max"].is_none()) p.max = d["max"].cast<double>();
  if (d.contains("choices")) p.choices = d["choices"].cast<std::vector<std::string>>();
  if (d.contains("help")) p.help = d["help"].cast<std::string>();
  return p;
}

void register_method(const std::string& name, const std::string& summary, const py::object& call,
                     const py::object& function, const py::list& params, const py::dict& needs) {
  const std::string where = "register_method('" + name + "')";
  try {
    if (CallSpec::parse(name, where).name != name) throw InputError(where, "");
  } catch (const InputError&) {
    throw InputError(where, "a method name is letters, digits, '-' and '_'");
  }
  auto& registry = MethodRegistry::global();
  if (registry.find(name) && !python_names().count(name))
    throw InputError(where, "'" + name + "' is a built-in method; choose another name");
  Entry<FillMethod> entry;
  entry.name = name;
  entry.summary = summary;
  for (const auto& p : params) entry.params.push_back(param_spec(p.cast<py::dict>()));
  entry.needs.period = needs["period"].cast<bool>();
  entry.needs.uses_period = needs["uses_period"].cast<bool>();
  entry.needs.siblings = needs["siblings"].cast<bool>();
  entry.needs.min_observed = needs["min_observed"].cast<std::size_t>();
  // Kept for the life of the process, like every registry entry.
  PyObject* call_ptr = call.inc_ref().ptr();
  PyObject* function_ptr = function.inc_ref().ptr();
  const std::vector<ParamSpec> own = entry.params;
  const bool siblings = entry.needs.siblings;
  entry.make = [call_ptr, function_ptr, own, siblings](const ParamValues& values) {
    return std::make_unique<PythonMethod>(call_ptr, function_ptr, own, values, siblings);
  };
  // Check the defaults against the schema now, not at the first run.
  bind_params(MethodRegistry::schema(entry), CallSpec{name, {}}, where);
  registry.add(std::move(entry));
  python_names().insert(name);
}

}  // namespace

std::atomic<bool>& interrupted() {
  static std::atomic<bool> flag{false};
  return flag;
}

void raise_if_interrupted() {
  if (!interrupted().exchange(false)) return;
  PyErr_SetNone(PyExc_KeyboardInterrupt);
  throw py::error_already_set();
}

void add_python_methods(py::module_& m) {
  m.def("_register_method", &register_method, py::arg("name"), py::arg("summary"), py::arg("call"),
        py::arg("function"), py::arg("params"), py::arg("needs"));
  m.def("_python_methods", [] { return std::vector<std::string>(python_names().begin(), python_names().end()); });
}

}  // namespace gapmark::python
