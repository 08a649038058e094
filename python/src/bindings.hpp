#pragma once
// The compiled part of the Python module (gapmark._engine): each file adds
// one group of functions to the module. The Python package (python/gapmark/)
// turns pandas objects and keyword arguments into these calls.
#include <pybind11/numpy.h>
#include <pybind11/pybind11.h>
#include <pybind11/stl.h>

#include <atomic>
#include <optional>
#include <string>
#include <vector>

#include "gapmark/params.hpp"
#include "gapmark/time_axis.hpp"

namespace gapmark::python {

namespace py = pybind11;

/// A 1-D array of doubles, converted (copied) from anything numpy reads.
using DoubleArray = py::array_t<double, py::array::c_style | py::array::forcecast>;

void add_errors(py::module_& m);
void add_listings(py::module_& m);
void add_fill_and_mask(py::module_& m);
void add_run(py::module_& m);
void add_python_methods(py::module_& m);
void add_raw_data(py::module_& m);

/// A call from its text ("kalman:model=trend") and keyword arguments given
/// as (key, value text) pairs; `where` names it in errors.
CallSpec make_call(const std::string& text, const std::vector<std::pair<std::string, std::string>>& args,
                   const std::string& where);

/// The time axis of `length` points: from ISO 8601 times (a pandas index
/// written as text) when given, else the integer axis 0..length-1.
TimeAxis make_axis(std::size_t length, const std::optional<std::vector<std::string>>& times);

/// Set when the user interrupted (Ctrl-C, KeyboardInterrupt) a run or a fill:
/// Python methods are not called again, and the run raises KeyboardInterrupt
/// at its end instead of returning results with failed trials.
std::atomic<bool>& interrupted();
/// Raises KeyboardInterrupt (and clears the flag) when it is set.
void raise_if_interrupted();

/// The array's values as a vector.
std::vector<double> to_vector(const DoubleArray& array, const std::string& where);

}  // namespace gapmark::python
