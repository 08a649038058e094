#include "gapmark/experiment/example_windows.hpp"

#include <limits>

#include "gapmark/json_number.hpp"

namespace gapmark {
namespace {

constexpr const char* kNotRun = "not run";

nlohmann::json numbers_to_json(const std::vector<double>& values) {
  nlohmann::json out = nlohmann::json::array();
  for (double v : values) out.push_back(json_number(v));
  return out;
}

nlohmann::json fill_to_json(const ExampleFill& fill) {
  nlohmann::json out = {{"method", fill.method},
                        {"rank", fill.rank},
                        {"status", fill.status ? trial_status_name(*fill.status) : kNotRun}};
  if (fill.has_fill()) {
    out["filled"] = numbers_to_json(fill.filled);
  } else {
    out["reason"] = fill.reason;
    out["filled"] = nullptr;
  }
  return out;
}

nlohmann::json window_to_json(const ExampleWindow& w) {
  nlohmann::json out = {{"series", w.series}, {"scheme", w.scheme}, {"rate", w.rate}, {"replicate", w.replicate}};
  if (!w.note.empty()) {
    out["note"] = w.note;
    return out;
  }
  nlohmann::json methods = nlohmann::json::array(), acf_methods = nlohmann::json::array();
  for (const auto& m : w.methods) methods.push_back(fill_to_json(m));
  for (const auto& a : w.acf_methods)
    acf_methods.push_back({{"method", a.method}, {"values", numbers_to_json(a.values)}});
  out["start"] = w.start;
  out["length"] = w.length;
  out["time_first"] = w.time_first;
  out["time_last"] = w.time_last;
  out["step"] = w.step;
  out["truth"] = numbers_to_json(w.truth);
  out["mask"] = w.mask;
  out["methods"] = methods;
  out["acf"] = {{"lags", w.lags}, {"truth", numbers_to_json(w.acf_truth)}, {"methods", acf_methods}};
  return out;
}

ExampleFill fill_from_json(const StoredObject& stored, std::size_t width) {
  ExampleFill fill{.method = stored.text("method"), .rank = stored.count("rank"), .status = std::nullopt,
                   .reason = {}, .filled = {}};
  const std::string status = stored.text("status");
  if (status != kNotRun) fill.status = parse_trial_status(status, stored.where("status"));
  if (fill.status == TrialStatus::MaskFailed) stored.fail("status", "a window's fill cannot be mask-failed");
  if (fill.has_fill()) {
    fill.filled = stored.numbers("filled");
    if (fill.filled.size() != width) stored.fail("filled", "expected one value per window point");
  } else {
    fill.reason = stored.text("reason");
  }
  return fill;
}

std::vector<std::uint8_t> mask_from_json(const StoredObject& stored) {
  const auto& values = stored.array("mask");
  std::vector<std::uint8_t> mask;
  for (std::size_t i = 0; i < values.size(); ++i) {
    if (!values[i].is_number_integer() || (values[i] != 0 && values[i] != 1))
      stored.fail("mask", "expected 0 or 1 at " + std::to_string(i));
    mask.push_back(values[i] == 1 ? 1 : 0);
  }
  return mask;
}

ExampleWindow window_from_json(const StoredObject& stored) {
  ExampleWindow w;
  w.series = stored.text("series");
  w.scheme = stored.text("scheme");
  w.rate = stored.number("rate");
  const std::size_t replicate = stored.count("replicate");
  if (replicate > static_cast<std::size_t>(std::numeric_limits<int>::max())) stored.fail("replicate", "too large");
  w.replicate = static_cast<int>(replicate);
  if (stored.has("note")) {
    w.note = stored.text("note");
    return w;
  }
  w.start = stored.count("start");
  w.length = stored.count("length");
  w.time_first = stored.text("time_first");
  w.time_last = stored.text("time_last");
  w.step = stored.text("step");
  w.truth = stored.numbers("truth");
  w.mask = mask_from_json(stored);
  if (w.truth.size() != w.length) stored.fail("truth", "expected " + std::to_string(w.length) + " values (the length)");
  if (w.mask.size() != w.length) stored.fail("mask", "expected " + std::to_string(w.length) + " values (the length)");
  for (const auto& m : stored.objects("methods")) w.methods.push_back(fill_from_json(m, w.length));
  const StoredObject acf = stored.object("acf");
  w.lags = acf.count("lags");
  w.acf_truth = acf.numbers("truth");
  for (const auto& a : acf.objects("methods")) w.acf_methods.push_back({a.text("method"), a.numbers("values")});
  return w;
}

}  // namespace

const ExampleWindow* ExampleWindows::find(const std::string& label) const {
  for (const auto& w : series)
    if (w.series == label) return &w;
  return nullptr;
}

nlohmann::json examples_to_json(const ExampleWindows& examples) {
  nlohmann::json list = nlohmann::json::array();
  for (const auto& w : examples.series) list.push_back(window_to_json(w));
  return {{"window", examples.window}, {"top", examples.top}, {"series", list}};
}

ExampleWindows examples_from_json(const StoredObject& stored, const std::string& key) {
  const StoredObject examples = stored.object(key);
  ExampleWindows out{.window = examples.count("window"), .top = examples.count("top"), .series = {}};
  for (const auto& w : examples.objects("series")) out.series.push_back(window_from_json(w));
  return out;
}

}  // namespace gapmark
