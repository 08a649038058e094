#include "gapmark/report/reporter.hpp"

#include <filesystem>

#include "gapmark/table_io.hpp"

namespace gapmark {

std::vector<std::string> write_reports(const ResultSet& results, const std::string& dir) {
  const Summary summary = summarize(results);
  std::vector<std::string> written;
  // Render everything first so that a failing reporter leaves no files behind.
  std::vector<std::pair<std::filesystem::path, std::string>> outputs;
  for (const auto* entry : ReporterRegistry::global().list()) {
    auto reporter = entry->make(ParamValues{});
    outputs.emplace_back(std::filesystem::path(dir) / reporter->file_name(), reporter->render(results, summary));
  }
  for (const auto& [path, content] : outputs) {
    write_file_atomically(path, content);
    written.push_back(path.string());
  }
  return written;
}

}  // namespace gapmark
