#include "gapmark/experiment/spec_safety.hpp"

#include <filesystem>

#include "gapmark/text_safety.hpp"

namespace gapmark {

std::vector<std::string> external_commands(const ExperimentSpec& spec) {
  std::vector<std::string> out;
  for (const auto& m : spec.methods)
    if (m.entry && m.entry->name == "external")
      out.push_back(m.params.has("command") ? m.params.text("command") : std::string());
  return out;
}

std::string spec_output_problem(const ExperimentSpec& spec) {
  const auto it = spec.json.find("output");
  if (it == spec.json.end() || !it->is_string()) return {};
  const std::filesystem::path out = it->get<std::string>();
  const std::filesystem::path normal = out.lexically_normal();
  if (!out.empty() && !out.has_root_name() && !out.has_root_directory() && (normal.empty() || *normal.begin() != ".."))
    return {};
  return spec.source + ": /output: " + quoted_for_message(out.string()) +
         " is not a folder inside the spec's folder; a spec may only write below its own folder (give --out to "
         "write elsewhere)";
}

}  // namespace gapmark
