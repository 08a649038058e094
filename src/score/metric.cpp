#include "gapmark/score/metric.hpp"

#include <cmath>
#include <utility>

#include "gapmark/error.hpp"

namespace gapmark {

std::string to_string(Direction d) {
  switch (d) {
    case Direction::Lower: return "lower";
    case Direction::ZeroBest: return "zero";
    case Direction::Higher: return "higher";
    case Direction::OneBest: return "one";
    case Direction::None: return "none";
  }
  return "none";
}

Direction direction_from_string(const std::string& text) {
  if (text == "lower") return Direction::Lower;
  if (text == "zero") return Direction::ZeroBest;
  if (text == "higher") return Direction::Higher;
  if (text == "one") return Direction::OneBest;
  if (text == "none") return Direction::None;
  throw InputError("direction", "unknown direction '" + text + "'");
}

double badness(double value, Direction direction) {
  switch (direction) {
    case Direction::Lower: return value;
    case Direction::ZeroBest: return std::abs(value);
    case Direction::Higher: return -value;
    case Direction::OneBest: return std::abs(value - 1.0);
    case Direction::None: return value;
  }
  return value;
}

ParamSpec interval_level_param(std::string help) {
  return {.name = "level",
          .type = ParamType::Real,
          .default_value = "0.9",
          .min = 0.01,
          .max = 0.99,
          .choices = {},
          .help = std::move(help)};
}

std::vector<std::string> default_metric_calls() {
  std::vector<std::string> out;
  for (const char* name : {"error", "acf", "forecast", "interval"})
    if (MetricRegistry::global().find(name)) out.emplace_back(name);
  return out;
}

}  // namespace gapmark
