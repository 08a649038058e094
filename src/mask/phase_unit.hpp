#pragma once
// The phase of a point within a cycle, shared by the schemes that place gaps
// by phase (seasonal, replay): i mod period, or a calendar phase read from the
// time axis (hour 0-23, ISO weekday 1-7 with Monday = 1, month 1-12).
#include <cstddef>
#include <optional>
#include <string>

#include "gapmark/time_axis.hpp"

namespace gapmark::mask {

enum class PhaseUnit { Index, Hour, Weekday, Month };

/// "index", "hour", "weekday", "month"; nullopt for any other text.
std::optional<PhaseUnit> parse_phase_unit(const std::string& text);
const char* phase_unit_name(PhaseUnit unit);
/// The phase of point i: i mod period for Index, else the calendar phase on `axis`.
int phase_of(PhaseUnit unit, const TimeAxis* axis, std::size_t period, std::size_t i);

}  // namespace gapmark::mask
