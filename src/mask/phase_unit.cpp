#include "phase_unit.hpp"

namespace gapmark::mask {

std::optional<PhaseUnit> parse_phase_unit(const std::string& text) {
  if (text == "index") return PhaseUnit::Index;
  if (text == "hour") return PhaseUnit::Hour;
  if (text == "weekday") return PhaseUnit::Weekday;
  if (text == "month") return PhaseUnit::Month;
  return std::nullopt;
}

const char* phase_unit_name(PhaseUnit unit) {
  switch (unit) {
    case PhaseUnit::Hour: return "hour";
    case PhaseUnit::Weekday: return "weekday";
    case PhaseUnit::Month: return "month";
    case PhaseUnit::Index: break;
  }
  return "index";
}

int phase_of(PhaseUnit unit, const TimeAxis* axis, std::size_t period, std::size_t i) {
  switch (unit) {
    case PhaseUnit::Hour: return axis->hour_of_day(i);
    case PhaseUnit::Weekday: return axis->day_of_week(i);
    case PhaseUnit::Month: return axis->month(i);
    case PhaseUnit::Index: break;
  }
  return int(i % period);
}

}  // namespace gapmark::mask
