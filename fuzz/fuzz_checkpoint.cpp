// Fuzz target: checkpoint lines read back by `gapmark run --resume`. A
// small fixed experiment (12 tasks) gives the header line; the fuzzed bytes
// are the task lines after it, as a crash, a full disk or a hand edit might
// leave them. run_into_folder then resumes: it reads and checks every line,
// runs the tasks missing, and writes results.json and the reports. Any input
// must either finish or raise an InputError naming the checkpoint.
#include <unistd.h>

#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>

#include "gapmark/error.hpp"
#include "gapmark/experiment/checkpoint.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/experiment/spec.hpp"
#include "gapmark/report/final_reports.hpp"

namespace {

struct Fixture {
  std::filesystem::path dir, out;
  gapmark::ExperimentSpec spec;
  std::string header;

  Fixture() {
    std::string pattern = (std::filesystem::temp_directory_path() / "gapmark-fuzz-checkpoint-XXXXXX").string();
    if (::mkdtemp(pattern.data()) == nullptr) __builtin_trap();
    dir = pattern;
    out = dir / "out";
    std::ofstream csv(dir / "data.csv");
    csv << "time,a,b\n";
    for (int i = 0; i < 40; ++i) csv << i << ',' << (i * 7) % 13 << ',' << (i % 5 == 2 ? "" : std::to_string(i % 9)) << '\n';
    csv.close();
    spec = gapmark::parse_spec(
        R"({"name": "fuzz", "seed": 3, "replicates": 2, "data": ["data.csv"],
            "schemes": [{"name": "random", "rates": [0.1, 0.3]}, "blocks:length_mean=3,rate=0.2"],
            "methods": ["linear", "mean", "carry-forward"], "metrics": ["error"], "output": "out"})",
        "fuzz.json", dir);
    header = gapmark::checkpoint_header(spec, gapmark::load_data(spec), gapmark::Shard{}).dump() + "\n";
  }
};

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  static const Fixture fx;
  std::filesystem::create_directories(fx.out);
  {
    std::ofstream file(fx.out / gapmark::kCheckpointFile, std::ios::binary | std::ios::trunc);
    file << fx.header;
    file.write(reinterpret_cast<const char*>(data), static_cast<std::streamsize>(size));
  }
  try {
    gapmark::RunOptions options;
    options.threads = 1;
    const auto status = gapmark::run_into_folder(fx.spec, options, gapmark::FolderRunOptions{fx.out, true, {}, {}, {}});
    if (!status.complete()) __builtin_trap();  // nothing stops this run
  } catch (const gapmark::InputError&) {
  }
  return 0;
}
