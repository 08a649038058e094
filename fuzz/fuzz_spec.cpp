// Fuzz target: the experiment spec parser (JSON, fields, every scheme,
// method and metric call it binds). Any text must either give a spec or
// raise an InputError; anything else is a bug. Data files are not read.
#include <cstddef>
#include <cstdint>
#include <string>

#include "gapmark/error.hpp"
#include "gapmark/experiment/spec.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  try {
    const gapmark::ExperimentSpec spec = gapmark::parse_spec(text, "fuzz.json", "/nonexistent");
    if (spec.methods.empty() || spec.schemes.empty() || spec.data.empty()) __builtin_trap();
  } catch (const gapmark::InputError&) {
  }
  return 0;
}
