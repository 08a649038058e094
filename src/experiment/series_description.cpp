#include "gapmark/experiment/series_description.hpp"

namespace gapmark {

nlohmann::json series_to_json(const std::vector<SeriesDescription>& series) {
  nlohmann::json out = nlohmann::json::array();
  for (const auto& s : series) {
    out.push_back({{"label", s.label},
                   {"source", s.source},
                   {"points", s.points},
                   {"observed", s.observed},
                   {"step", s.step},
                   {"start", s.start},
                   {"period", s.period}});
    if (!s.units.empty()) out.back()["units"] = s.units;
  }
  return out;
}

std::vector<SeriesDescription> series_from_json(const StoredObject& stored, const std::string& key) {
  std::vector<SeriesDescription> out;
  for (const auto& s : stored.objects(key)) {
    out.push_back({.label = s.text("label"),
                   .source = s.text("source"),
                   .points = s.count("points"),
                   .observed = s.count("observed"),
                   .step = s.text("step"),
                   .start = s.text("start"),
                   .period = s.count("period"),
                   .units = s.has("units") ? s.text("units") : std::string()});
    if (out.back().observed > out.back().points) s.fail("observed", "more points observed than the series has");
  }
  return out;
}

const SeriesDescription* find_series(const std::vector<SeriesDescription>& series, const std::string& label) {
  for (const auto& s : series)
    if (s.label == label) return &s;
  return nullptr;
}

}  // namespace gapmark
