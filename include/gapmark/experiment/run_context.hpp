#pragma once
// What a run was: the build that ran it, the spec it ran and the data files
// it read. Stored as "context" in results.json and in each checkpoint's
// header; compare and the reports read it, a resumed run and a merge check it.
#include <cstddef>
#include <cstdint>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "gapmark/experiment/record_checks.hpp"

namespace gapmark {

/// One data file a run read, with the SHA-256 of its bytes.
struct InputFile {
  std::string file;    ///< as the spec names it
  std::string sha256;
  bool operator==(const InputFile&) const = default;
};

struct RunContext {
  std::string tool = "gapmark";
  std::string version;
  std::string commit;
  std::string spec_name = "experiment";
  nlohmann::json spec = nlohmann::json::object();  ///< the spec document as the user wrote it
  std::string spec_sha256;
  std::uint64_t seed = 1;
  int replicates = 0;
  std::size_t holdout = 0;  ///< points at each series' end never masked
  std::vector<InputFile> inputs;  ///< in the spec's order
};

nlohmann::json context_to_json(const RunContext& context);
/// Reads what context_to_json wrote; errors name the file and the member's
/// JSON pointer below `stored`'s.
RunContext context_from_json(const StoredObject& stored);

}  // namespace gapmark
