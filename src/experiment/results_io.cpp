#include "gapmark/experiment/results_io.hpp"

#include "gapmark/error.hpp"
#include "gapmark/experiment/record_checks.hpp"
#include "gapmark/json_strict.hpp"
#include "gapmark/table_io.hpp"

namespace gapmark {

ResultSet results_from_json(const nlohmann::json& j, const std::string& source) {
  ResultSet r;
  try {
    const StoredObject stored(j, source);
    if (j.value("format", "") != "gapmark-results")
      throw InputError(source + ": /format", "not a gapmark results file");
    const int version = j.at("schema_version").get<int>();
    if (version != kResultsSchemaVersion)
      throw InputError(source + ": /schema_version",
                       "schema version " + std::to_string(version) + " is not supported (this tool reads " +
                           std::to_string(kResultsSchemaVersion) + ")");
    r.context = context_from_json(stored.object("context"));
    r.series = series_from_json(stored, "series");
    r.rank_by = stored.text("rank_by");
    r.alpha = stored_alpha(j.at("alpha"), source + ": /alpha");
    r.equivalence = j.value("equivalence", kDefaultEquivalence);
    if (!(r.equivalence > 0 && r.equivalence < 1))
      throw InputError(source + ": /equivalence", "expected a number in (0, 1)");
    r.columns = columns_from_json(stored, "columns");
    const auto& trials = stored.array("trials");
    for (std::size_t i = 0; i < trials.size(); ++i)
      r.trials.push_back(trial_from_json(trials[i], r.columns, source + ": /trials/" + std::to_string(i)));
    for (const auto& w : stored.objects("warnings"))
      r.warnings.push_back({w.text("code"), w.text("where"), w.text("message"), w.text("hint")});
    r.timing = timing_from_json(stored, "timing");
    if (j.contains("examples") && !j.at("examples").is_null()) r.examples = examples_from_json(stored, "examples");
  } catch (const nlohmann::json::exception& e) {
    throw InputError(source, std::string("malformed results: ") + e.what());
  }
  return r;
}

ResultSet read_results(const std::filesystem::path& path) {
  const std::string text = read_text_file(path);
  nlohmann::json j;
  try {
    j = parse_json_strict(text, path.string());
  } catch (const nlohmann::json::parse_error& e) {
    throw InputError(path.string(), std::string("invalid JSON: ") + e.what());
  } catch (const nlohmann::json::out_of_range& e) {  // a number too large for a double, such as 1e999
    throw InputError(path.string(), std::string("invalid JSON: ") + e.what());
  }
  return results_from_json(j, path.string());
}

}  // namespace gapmark
