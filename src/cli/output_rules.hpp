#pragma once
// The rules every command that writes follows (README, "Outputs"), and the
// consent a spec with outside programs needs (docs/external-methods.md).
#include <CLI/CLI.hpp>
#include <filesystem>
#include <iostream>
#include <string>
#include <vector>

#include "gapmark/error.hpp"
#include "gapmark/experiment/spec.hpp"
#include "gapmark/experiment/spec_safety.hpp"
#include "gapmark/output_file.hpp"
#include "gapmark/text_safety.hpp"

namespace gapmark::cli {

inline void add_force_flag(CLI::App& cmd, bool& force) {
  cmd.add_flag("--force", force, "Replace outputs that exist already (never a device, FIFO, socket or symbolic link)");
}

inline void add_consent_flag(CLI::App& cmd, bool& allow) {
  cmd.add_flag("--allow-external", allow,
               "Let the spec's \"external\" methods start their programs (a received spec is refused without it; "
               "see docs/external-methods.md)");
}

/// Without --allow-external, a spec that names outside programs is refused
/// before anything runs: one error line, then each command it would start.
/// Returns true when the command must stop (exit 2).
inline bool refused_external(const ExperimentSpec& spec, bool allowed, const std::string& command) {
  const std::vector<std::string> commands = external_commands(spec);
  if (allowed || commands.empty()) return false;
  std::cerr << "gapmark: " << spec.source << ": the spec starts " << commands.size() << " outside program"
            << (commands.size() == 1 ? "" : "s") << " (\"external\" methods); nothing was run. Read "
            << (commands.size() == 1 ? "it" : "them") << ", then give --allow-external to " << command << ":\n";
  for (const auto& c : commands) std::cerr << "  " << printable(c, 300) << "\n";
  return true;
}

/// The files of gapmark's own that mark a folder as holding a run's output.
inline std::vector<std::string> run_output_names() {
  return {"trials.jsonl", "results.json", "shard.json"};
}

/// Checks an output folder before a run, merge or report writes into it:
/// not something other than a folder; holding none of `inputs`; and unless
/// `replace` (--force, or --resume), holding no earlier output.
inline void check_output_dir(const std::filesystem::path& dir, const std::vector<std::filesystem::path>& inputs,
                             bool replace, const std::string& hint) {
  check_output_folder(dir);
  check_folder_holds_no_input(dir, inputs, hint);
  if (replace) return;
  for (const auto& name : run_output_names()) {
    std::error_code ec;
    if (std::filesystem::symlink_status(dir / name, ec).type() != std::filesystem::file_type::not_found)
      throw InputError(dir.string(), "holds an earlier output (" + name + "); give --force to replace it" +
                                         (name == "trials.jsonl" ? ", or --resume to finish that run" : ""));
  }
}

/// Creates the output folder (InputError naming it when impossible). A
/// folder it created and that holds nothing but the lock file when the
/// command ends (the command failed before writing) is removed again, so a
/// failed command leaves no output behind.
class OutputDir {
public:
  explicit OutputDir(const std::filesystem::path& dir) : dir_(dir) {
    std::error_code ec;
    created_ = !std::filesystem::exists(dir, ec);
    std::filesystem::create_directories(dir, ec);
    if (ec) throw InputError(dir.string(), "cannot create the output folder: " + ec.message());
  }
  ~OutputDir() {
    if (!created_) return;
    std::error_code ec;
    for (const auto& entry : std::filesystem::directory_iterator(dir_, ec))
      if (entry.path().filename() != kLockFile) return;
    std::filesystem::remove(dir_ / kLockFile, ec);
    std::filesystem::remove(dir_, ec);
  }
  OutputDir(const OutputDir&) = delete;
  OutputDir& operator=(const OutputDir&) = delete;

private:
  std::filesystem::path dir_;
  bool created_ = false;
};

}  // namespace gapmark::cli
