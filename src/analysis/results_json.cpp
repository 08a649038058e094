#include "gapmark/analysis/results_json.hpp"

#include <functional>
#include <map>
#include <string>

#include "gapmark/analysis/verdict.hpp"

namespace gapmark {

namespace {

/// The document; with `with_trials` false its "trials" member is an empty
/// array (write_results_json streams them in its place).
nlohmann::json results_document(const ResultSet& results, const Summary& summary, bool with_trials) {
  nlohmann::json trials = nlohmann::json::array();
  if (with_trials)
    for (const auto& t : results.trials) trials.push_back(trial_to_json(t, results.columns));
  nlohmann::json warnings = nlohmann::json::array();
  for (const auto& w : all_warnings(results, summary))
    warnings.push_back({{"code", w.code}, {"where", w.where}, {"message", w.message}, {"hint", w.hint}});
  nlohmann::json out = {{"format", "gapmark-results"},
          {"schema_version", kResultsSchemaVersion},
          {"context", context_to_json(results.context)},
          {"rank_by", results.rank_by},
          {"alpha", results.alpha},
          {"equivalence", results.equivalence},
          {"series", series_to_json(results.series)},
          {"columns", columns_to_json(results.columns)},
          {"trials", trials},
          {"summary", summary_to_json(summary, results)},
          {"verdict", verdict_to_json(summary.verdict)},
          {"warnings", warnings},
          {"timing", timing_to_json(results.timing)}};
  if (results.examples) out["examples"] = examples_to_json(*results.examples);
  return out;
}

}  // namespace

nlohmann::json results_to_json(const ResultSet& results, const Summary& summary) {
  return results_document(results, summary, true);
}

namespace {

using nlohmann::json;
/// Writes how to serialize one member's value at nesting `depth`.
using ValueWriter = std::function<void(std::ostream&, int depth)>;

/// Writes `text` (a value dumped with indent 1) at nesting `depth`: every
/// line after the first is indented by `depth` more spaces.
void write_nested(std::ostream& out, const json& value, int depth) {
  const std::string text = value.dump(1);
  const std::string indent(static_cast<std::size_t>(depth), ' ');
  std::size_t from = 0;
  for (std::size_t nl = text.find('\n'); nl != std::string::npos; nl = text.find('\n', from)) {
    out.write(text.data() + from, static_cast<std::streamsize>(nl + 1 - from));
    out << indent;
    from = nl + 1;
  }
  out.write(text.data() + from, static_cast<std::streamsize>(text.size() - from));
}

/// An array of `count` elements made one at a time, laid out as dump(1) lays it out.
void write_array(std::ostream& out, std::size_t count, const std::function<json(std::size_t)>& element, int depth) {
  if (count == 0) {
    out << "[]";
    return;
  }
  out << "[\n";
  for (std::size_t i = 0; i < count; ++i) {
    if (i) out << ",\n";
    out << std::string(static_cast<std::size_t>(depth) + 1, ' ');
    write_nested(out, element(i), depth + 1);
  }
  out << '\n' << std::string(static_cast<std::size_t>(depth), ' ') << ']';
}

/// The members of `object` in its own (sorted) order, as dump(1) lays them
/// out; a member named in `streamed` is written by its writer instead.
void write_object(std::ostream& out, const json& object, const std::map<std::string, ValueWriter>& streamed, int depth) {
  if (object.empty()) {
    out << "{}";
    return;
  }
  out << "{\n";
  bool first = true;
  for (auto it = object.begin(); it != object.end(); ++it) {
    if (!first) out << ",\n";
    first = false;
    out << std::string(static_cast<std::size_t>(depth) + 1, ' ') << json(it.key()).dump() << ": ";
    const auto writer = streamed.find(it.key());
    if (writer != streamed.end())
      writer->second(out, depth + 1);
    else
      write_nested(out, it.value(), depth + 1);
  }
  out << '\n' << std::string(static_cast<std::size_t>(depth), ' ') << '}';
}

}  // namespace

void write_results_json(std::ostream& out, const ResultSet& results, const Summary& summary) {
  // The document without its two long arrays; those are written element by element.
  Summary outline = summary;
  outline.groups.clear();
  const json document = results_document(results, outline, false);

  const ValueWriter trials = [&](std::ostream& o, int depth) {
    write_array(o, results.trials.size(),
                [&](std::size_t i) { return trial_to_json(results.trials[i], results.columns); }, depth);
  };
  const ValueWriter groups = [&](std::ostream& o, int depth) {
    Summary one = outline;
    one.across.clear();
    write_array(o, summary.groups.size(), [&](std::size_t i) {
      one.groups.assign(1, summary.groups[i]);
      return summary_to_json(one, results).at("groups").at(0);
    }, depth);
  };
  const ValueWriter summary_member = [&](std::ostream& o, int depth) {
    write_object(o, document.at("summary"), {{"groups", groups}}, depth);
  };
  write_object(out, document, {{"trials", trials}, {"summary", summary_member}}, 0);
  out << '\n';
}

}  // namespace gapmark
