#include "gapmark/experiment/record.hpp"

#include <cmath>

#include "gapmark/json_number.hpp"
#include "gapmark/error.hpp"
#include "gapmark/experiment/record_checks.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark {

std::string TrialRecord::name() const {
  return method + "/" + series + "/" + scheme + "@" + format_double(rate) + "/" + std::to_string(replicate);
}

std::size_t ResultSet::column_index(const std::string& name) const {
  for (std::size_t i = 0; i < columns.size(); ++i)
    if (columns[i].name == name) return i;
  throw InputError("metric", "no metric column '" + name + "' in these results");
}

void add_warning(std::vector<Warning>& warnings, Warning warning) {
  for (const auto& w : warnings)
    if (w.code == warning.code && w.where == warning.where) return;
  warnings.push_back(std::move(warning));
}

nlohmann::json columns_to_json(const std::vector<MetricColumn>& columns) {
  nlohmann::json out = nlohmann::json::array();
  for (const auto& c : columns)
    out.push_back({{"name", c.name}, {"unit", c.unit}, {"direction", to_string(c.direction)}, {"summary", c.summary}});
  return out;
}

std::vector<MetricColumn> columns_from_json(const StoredObject& stored, const std::string& key) {
  std::vector<MetricColumn> out;
  for (const auto& c : stored.objects(key)) {
    Direction direction = Direction::Lower;
    try {
      direction = direction_from_string(c.text("direction"));
    } catch (const InputError& e) {
      c.fail("direction", e.what());
    }
    out.push_back({c.text("name"), c.text("unit"), direction, c.text("summary")});
  }
  return out;
}

nlohmann::json trial_to_json(const TrialRecord& t, const std::vector<MetricColumn>& columns) {
  nlohmann::json metrics = nlohmann::json::object();
  for (std::size_t i = 0; i < columns.size(); ++i) {
    const double v = i < t.metrics.size() ? t.metrics[i] : std::nan("");
    metrics[columns[i].name] = json_number(v);
  }
  nlohmann::json out = {{"series", t.series},
                        {"scheme", t.scheme},
                        {"rate", t.rate},
                        {"replicate", t.replicate},
                        {"method", t.method},
                        {"status", trial_status_name(t.status)},
                        {"reason", t.reason.empty() ? nlohmann::json(nullptr) : nlohmann::json(t.reason)},
                        {"masked", t.masked},
                        {"unfilled", t.unfilled},
                        {"metrics", metrics}};
  if (t.clipped) out["clipped"] = t.clipped;  // only methods with bounds=LO,HI clip
  if (!t.fit.empty()) out["fit"] = fit_to_json(t.fit);  // only model-based methods
  return out;
}

TrialRecord trial_from_json(const nlohmann::json& j, const std::vector<MetricColumn>& columns,
                            const std::string& where) {
  TrialRecord t;
  try {
    t.series = j.at("series").get<std::string>();
    t.scheme = j.at("scheme").get<std::string>();
    t.rate = j.at("rate").get<double>();
    t.replicate = j.at("replicate").get<int>();
    t.method = j.at("method").get<std::string>();
    t.status = parse_trial_status(j.at("status").get<std::string>(), where);
    if (!j.at("reason").is_null()) t.reason = j.at("reason").get<std::string>();
    t.masked = stored_count(j.at("masked"), where, "masked");
    t.unfilled = stored_count(j.at("unfilled"), where, "unfilled");
    if (j.contains("clipped")) t.clipped = stored_count(j.at("clipped"), where, "clipped");
    if (t.unfilled > t.masked) throw InputError(where, "more points unfilled than masked");
    if (!(t.rate >= 0 && t.rate <= 1)) throw InputError(where, "rate: expected a number in [0, 1]");
    if (t.replicate < 0) throw InputError(where, "replicate: expected a whole number >= 0");
    if (j.contains("fit")) t.fit = fit_from_json(j.at("fit"), where + "/fit");
    const auto& m = j.at("metrics");
    if (!m.is_object()) throw InputError(where, "metrics: expected an object");
    t.metrics.resize(columns.size(), std::nan(""));
    for (std::size_t i = 0; i < columns.size(); ++i) {
      auto it = m.find(columns[i].name);
      if (it != m.end()) t.metrics[i] = stored_metric(*it, where, "metrics/" + columns[i].name);
    }
  } catch (const nlohmann::json::exception& e) {
    throw InputError(where, std::string("malformed trial: ") + e.what());
  }
  return t;
}

}  // namespace gapmark
