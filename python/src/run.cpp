// gapmark._engine: a whole experiment in memory (`gapmark run` without its
// folder), its results and every report of the command line.
#include <algorithm>
#include <chrono>
#include <filesystem>
#include <memory>
#include <mutex>
#include <sstream>
#include <thread>

#include "bindings.hpp"
#include "gapmark/analysis/results_json.hpp"
#include "gapmark/analysis/summary.hpp"
#include "gapmark/error.hpp"
#include "gapmark/experiment/merge.hpp"
#include "gapmark/experiment/results_io.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/experiment/spec.hpp"
#include "gapmark/experiment/spec_safety.hpp"
#include "gapmark/report/final_reports.hpp"
#include "gapmark/text_safety.hpp"

namespace gapmark::python {
namespace {

/// A run's results and their summary (with the verdict), computed once.
struct RunResults {
  ResultSet results;
  Summary summary;

  explicit RunResults(ResultSet r) : results(std::move(r)), summary(summarize(results)) {}
  RunResults(ResultSet r, Summary s) : results(std::move(r)), summary(std::move(s)) {}

  /// results.json as the command line writes it.
  std::string json_text() const {
    std::ostringstream out;
    write_results_json(out, results, summary);
    return out.str();
  }

  /// Every report the command line writes, into `dir`.
  std::vector<std::string> write(const std::string& dir, bool force, unsigned threads) const {
    namespace fs = std::filesystem;
    const fs::path folder(dir);
    if (fs::exists(folder) && !fs::is_directory(folder)) throw InputError(dir, "exists and is not a folder");
    if (!force && fs::is_directory(folder) && !fs::is_empty(folder))
      throw InputError(dir, "the folder is not empty; give force=True to replace the reports in it");
    prepare_output_folder(folder);
    return write_final_reports(results, summary, folder, std::max(1u, threads));
  }
};

/// Calls a Python function with (done, total) at most once a second and at
/// the end, holding the GIL only for that call.
/// Also notes a Ctrl-C (see interrupted()).
std::function<void(std::size_t, std::size_t)> progress_caller(py::object report) {
  struct State {
    std::mutex mutex;
    std::chrono::steady_clock::time_point last{};
  };
  auto state = std::make_shared<State>();
  auto holder = std::make_shared<py::object>(std::move(report));
  return [state, holder](std::size_t done, std::size_t total) {
    const std::lock_guard<std::mutex> lock(state->mutex);
    const auto now = std::chrono::steady_clock::now();
    if (done != total && now - state->last < std::chrono::seconds(1)) return;
    state->last = now;
    py::gil_scoped_acquire gil;  // the printer's object is released with the GIL held, by run_spec
    if (PyErr_CheckSignals() != 0) {  // Ctrl-C, seen when this runs on the main thread
      if (PyErr_ExceptionMatches(PyExc_KeyboardInterrupt)) interrupted() = true;
      PyErr_Clear();
    }
    if (holder->is_none()) return;
    try {
      (*holder)(done, total);
    } catch (py::error_already_set&) {
      // a failing progress printer must not stop the run
    }
  };
}

std::shared_ptr<RunResults> run_spec(const std::string& text, const std::string& source, const std::string& base_dir,
                                     unsigned threads, bool allow_external, const py::object& progress) {
  const ExperimentSpec spec = parse_spec(text, source, std::filesystem::path(base_dir.empty() ? std::string(".") : base_dir));
  const std::vector<std::string> commands = external_commands(spec);
  if (!allow_external && !commands.empty())
    throw InputError(source, "the spec starts " + std::to_string(commands.size()) +
                                 " outside program(s) (\"external\" methods), the first: " +
                                 quoted_for_message(commands.front()) +
                                 "; nothing was run. Read them, then give allow_external=True");
  RunOptions options;
  options.threads = threads ? threads : std::max(1u, std::thread::hardware_concurrency());
  options.progress = progress_caller(progress);
  ResultSet results;
  interrupted() = false;
  Summary summary;
  {
    py::gil_scoped_release release;  // built-in methods run on every thread; Python methods take the GIL
    results = run_experiment(spec, options);
    // the summary once, and the example windows drawn from it, as the command line's end of a run
    if (!interrupted())
      summary = finish_results(results, FinishOptions{.threads = options.threads, .spec = &spec, .allow_external = true});
  }
  options.progress = {};
  raise_if_interrupted();  // no results with trials failed by the interruption
  return std::make_shared<RunResults>(std::move(results), std::move(summary));
}

std::shared_ptr<RunResults> load(const std::string& path) {
  return std::make_shared<RunResults>(read_results(path));
}

}  // namespace

void add_run(py::module_& m) {
  py::class_<RunResults, std::shared_ptr<RunResults>>(m, "_Results")
      .def("json_text", &RunResults::json_text, "results.json as the command line writes it")
      .def("write", &RunResults::write, py::arg("folder"), py::arg("force"), py::arg("threads"),
           "Writes every report into the folder; returns their paths");
  m.def("_run", &run_spec, py::arg("text"), py::arg("source"), py::arg("base_dir"), py::arg("threads"),
        py::arg("allow_external"), py::arg("progress"));
  m.def("_load_results", &load, py::arg("path"));
}

}  // namespace gapmark::python
