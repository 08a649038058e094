// Fuzz target: "name:key=value,..." calls, parsed and bound against each
// registry (schemes, methods, metrics). Binding only builds the object;
// nothing is run. Any text must bind or raise an InputError.
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "gapmark/error.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/mask/scheme.hpp"
#include "gapmark/params.hpp"
#include "gapmark/score/metric.hpp"

namespace {

template <class Registry>
void bind(const gapmark::CallSpec& call) {
  try {
    const auto bound = Registry::global().bind(call, "fuzz");
    // A bound call's canonical label binds again to the same label.
    const auto again = Registry::global().bind(gapmark::CallSpec::parse(bound.label, "fuzz"), "fuzz");
    if (again.label != bound.label) __builtin_trap();
  } catch (const gapmark::InputError&) {
  }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  try {
    const gapmark::CallSpec call = gapmark::CallSpec::parse(text, "fuzz");
    bind<gapmark::SchemeRegistry>(call);
    bind<gapmark::MethodRegistry>(call);
    bind<gapmark::MetricRegistry>(call);
  } catch (const gapmark::InputError&) {
  }
  return 0;
}
