// Fuzz target: the results reader (results.json written by any run, perhaps
// damaged). The bytes go through read_results, as `gapmark report` and
// `gapmark compare` read them: any text must either read or raise an
// InputError; what reads must also summarise and write out again.
#include <sys/mman.h>
#include <unistd.h>

#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <string>

#include "gapmark/error.hpp"
#include "gapmark/analysis/results_json.hpp"
#include "gapmark/experiment/results_io.hpp"
#include "gapmark/analysis/summary.hpp"

namespace {

/// The input as a file held in memory (no disk writes per input), reached
/// through its /proc path like any file.
struct Scratch {
  int fd = ::memfd_create("gapmark-fuzz-results.json", 0);
  std::filesystem::path path = "/proc/self/fd/" + std::to_string(fd);

  void hold(const std::uint8_t* data, std::size_t size) const {
    if (fd < 0 || ::ftruncate(fd, 0) != 0 || ::pwrite(fd, data, size, 0) != static_cast<ssize_t>(size))
      __builtin_trap();  // the scratch file itself must work
  }
};

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  static const Scratch scratch;
  scratch.hold(data, size);
  try {
    const gapmark::ResultSet results = gapmark::read_results(scratch.path);
    const gapmark::Summary summary = gapmark::summarize(results);
    (void)gapmark::results_to_json(results, summary).dump();
  } catch (const gapmark::InputError&) {
  }
  return 0;
}
