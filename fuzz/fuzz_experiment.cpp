// Fuzz target: a whole small experiment from fuzzed bytes. The input is a
// CSV data file and a spec, separated by a line "===": the CSV is written as
// data.csv in a scratch folder, the spec is read with that folder as its
// own, and the experiment runs in memory through to results.json and every
// report (Markdown, CSV, HTML). Any input must either run or raise an
// InputError; anything else (an uncaught exception such as invalid UTF-8
// reaching the JSON writer, a crash, a sanitizer report) is a finding. As on
// the command line without --allow-external, a spec with an "external"
// method runs nothing. Grids are kept small so that each input runs quickly.
#include <unistd.h>

#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>

#include "gapmark/error.hpp"
#include "gapmark/experiment/results_io.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/experiment/spec.hpp"
#include "gapmark/experiment/spec_safety.hpp"
#include "gapmark/analysis/summary.hpp"
#include "gapmark/params.hpp"
#include "gapmark/report/reporter.hpp"

namespace {

const std::filesystem::path& scratch() {
  static const std::filesystem::path dir = [] {
    std::string pattern = (std::filesystem::temp_directory_path() / "gapmark-fuzz-experiment-XXXXXX").string();
    if (::mkdtemp(pattern.data()) == nullptr) __builtin_trap();
    return std::filesystem::path(pattern);
  }();
  return dir;
}

constexpr std::size_t kMostTasks = 24;
constexpr std::size_t kMostPoints = 400;
constexpr std::size_t kMostSeries = 3;

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string input(reinterpret_cast<const char*>(data), size);
  const std::size_t cut = input.find("\n===\n");
  if (cut == std::string::npos) return 0;
  {
    std::ofstream csv(scratch() / "data.csv", std::ios::binary | std::ios::trunc);
    csv.write(input.data(), static_cast<std::streamsize>(cut + 1));
  }
  const std::string spec_text = input.substr(cut + 5);
  try {
    const gapmark::ExperimentSpec spec = gapmark::parse_spec(spec_text, "fuzz.json", scratch());
    if (!gapmark::external_commands(spec).empty()) return 0;  // no consent in a fuzz run
    for (const auto& d : spec.data)
      if (d.path.parent_path() != scratch()) return 0;  // only the scratch data file
    const gapmark::LoadedData loaded = gapmark::load_data(spec);
    if (loaded.series.size() > kMostSeries) return 0;
    for (const auto& s : loaded.series)
      if (s.values.size() > kMostPoints) return 0;
    if (gapmark::build_tasks(spec, loaded).size() > kMostTasks) return 0;

    gapmark::RunOptions options;
    options.threads = 1;
    const gapmark::ResultSet results = gapmark::run_experiment(spec, options);
    const gapmark::Summary summary = gapmark::summarize(results);
    for (const auto* entry : gapmark::ReporterRegistry::global().list())
      (void)entry->make(gapmark::ParamValues{})->render(results, summary);
  } catch (const gapmark::InputError&) {
  }
  return 0;
}
