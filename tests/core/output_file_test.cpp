// Writing files safely (output_file.hpp) and text made safe to print
// (text_safety.hpp).
#include <doctest/doctest.h>

#include <sys/stat.h>
#include <unistd.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <set>
#include <string>

#include "gapmark/error.hpp"
#include "gapmark/json_strict.hpp"
#include "gapmark/output_file.hpp"
#include "gapmark/table_io.hpp"
#include "gapmark/text_safety.hpp"

namespace fs = std::filesystem;
using gapmark::InputError;

namespace {
struct Scratch {
  fs::path path;
  Scratch() {
    std::string pattern = (fs::temp_directory_path() / "gapmark-output-test-XXXXXX").string();
    REQUIRE(::mkdtemp(pattern.data()) != nullptr);
    path = pattern;
  }
  ~Scratch() {
    std::error_code ec;
    fs::remove_all(path, ec);
  }
};
std::string read(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  return {std::istreambuf_iterator<char>(in), {}};
}
std::string error_of(const auto& f) {
  try {
    f();
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}
}  // namespace

TEST_CASE("temporary files: unpredictable names, exclusive, never through a link") {
  Scratch dir;
  const fs::path target = dir.path / "out.csv";
  std::set<std::string> names;
  for (int i = 0; i < 20; ++i) {
    gapmark::TempFile t(target);
    const std::string name = t.path().filename().string();
    CHECK(name.rfind("out.csv.gapmark-tmp-", 0) == 0);
    CHECK(name.size() == std::string("out.csv.gapmark-tmp-").size() + 8);
    names.insert(name);
  }  // not committed: each removed
  CHECK(names.size() == 20);
  CHECK(fs::is_empty(dir.path));

  gapmark::TempFile t(target);
  t.write("a,b\n");
  t.commit();
  CHECK(read(target) == "a,b\n");

  // A link at the target is refused, and its target is untouched.
  std::ofstream(dir.path / "victim") << "keep";
  fs::create_symlink(dir.path / "victim", dir.path / "link.csv");
  CHECK(error_of([&] { gapmark::write_file_atomically(dir.path / "link.csv", "x"); }).find("is a symbolic link") !=
        std::string::npos);
  CHECK(read(dir.path / "victim") == "keep");
  CHECK(fs::is_symlink(dir.path / "link.csv"));
  // A FIFO at the target is refused too, and no temporary file is left.
  REQUIRE(::mkfifo((dir.path / "pipe").c_str(), 0600) == 0);
  CHECK(error_of([&] { gapmark::write_file_atomically(dir.path / "pipe", "x"); }).find("is a FIFO") !=
        std::string::npos);
  for (const auto& e : fs::directory_iterator(dir.path))
    CHECK(e.path().filename().string().find(gapmark::kTempMarker) == std::string::npos);
}

TEST_CASE("output checks: --force, kinds of files, inputs") {
  Scratch dir;
  const fs::path file = dir.path / "f.csv";
  CHECK_NOTHROW(gapmark::check_output_file(file, false));
  std::ofstream(file) << "x";
  CHECK(error_of([&] { gapmark::check_output_file(file, false); }).find("exists already; give --force") !=
        std::string::npos);
  CHECK_NOTHROW(gapmark::check_output_file(file, true));
  CHECK(error_of([&] { gapmark::check_output_file("/dev/null", true); }).find("is a device") != std::string::npos);
  CHECK(error_of([&] { gapmark::check_output_file(dir.path, true); }).find("is a folder") != std::string::npos);
  CHECK(error_of([&] { gapmark::check_output_folder(file); }).find("not a folder") != std::string::npos);

  fs::create_directories(dir.path / "out" / "data");
  std::ofstream(dir.path / "out" / "data" / "in.csv") << "x";
  CHECK(error_of([&] {
          gapmark::check_folder_holds_no_input(dir.path / "out", {dir.path / "out" / "data" / "in.csv"}, "hint");
        }).find("holds an input of the run") != std::string::npos);
  CHECK_NOTHROW(gapmark::check_folder_holds_no_input(dir.path / "out2", {dir.path / "out" / "data" / "in.csv"}, ""));
  // "out" does not hold "outside/x" although the names share a prefix.
  CHECK_NOTHROW(gapmark::check_folder_holds_no_input(dir.path / "out", {dir.path / "outside" / "x"}, ""));
  CHECK(error_of([&] { gapmark::check_file_is_no_input(file, {dir.path / "." / "f.csv"}); })
            .find("is an input of this command") != std::string::npos);
}

TEST_CASE("stale temporary files and the folder lock") {
  Scratch dir;
  std::ofstream(dir.path / "results.json.gapmark-tmp-0a1b2c3d") << "x";
  std::ofstream(dir.path / "keep.csv") << "x";
  CHECK(gapmark::remove_stale_temp_files(dir.path) == 1);
  CHECK(fs::exists(dir.path / "keep.csv"));
  {
    const gapmark::FolderLock lock(dir.path);
    CHECK(read(dir.path / gapmark::kLockFile) == std::to_string(::getpid()) + "\n");
    // flock locks belong to the open file: a second open in this process is refused as another would be.
    CHECK(error_of([&] { gapmark::FolderLock second(dir.path); })
              .find("in use by another gapmark process (pid " + std::to_string(::getpid()) + ")") != std::string::npos);
  }
  CHECK_NOTHROW(gapmark::FolderLock again(dir.path));
}

// Well-formed UTF-8 as the Unicode Standard defines it (chapter 3, table
// 3-7, "Well-Formed UTF-8 Byte Sequences"); the cases below follow the
// table's boundaries (written from the table, not from another program).
TEST_CASE("UTF-8 checking follows the Unicode Standard's table of well-formed sequences") {
  using gapmark::first_invalid_utf8;
  CHECK_FALSE(first_invalid_utf8("plain ascii"));
  CHECK_FALSE(first_invalid_utf8("caf\xC3\xA9 \xE2\x82\xAC \xF0\x9F\x98\x80"));  // é € 😀
  CHECK_FALSE(first_invalid_utf8("\xED\x9F\xBF"));        // U+D7FF, last before the surrogates
  CHECK_FALSE(first_invalid_utf8("\xF4\x8F\xBF\xBF"));    // U+10FFFF
  CHECK(first_invalid_utf8("temp_\xB0" "C") == 5u);       // a Latin-1 degree sign
  CHECK(first_invalid_utf8("\xC0\xAF") == 0u);            // overlong
  CHECK(first_invalid_utf8("\xE0\x80\xAF") == 0u);        // overlong
  CHECK(first_invalid_utf8("\xED\xA0\x80") == 0u);        // a surrogate, U+D800
  CHECK(first_invalid_utf8("\xF4\x90\x80\x80") == 0u);    // above U+10FFFF
  CHECK(first_invalid_utf8("ab\xE2\x82") == 2u);          // cut short
  CHECK(gapmark::utf8_replaced("a\xFF" "b") == "a\xEF\xBF\xBD" "b");
}

TEST_CASE("printable text: escaped control and invalid bytes, cut to a length") {
  CHECK(gapmark::printable(std::string("a\0b\n\x1B[", 6)) == "a\\0b\\n\\x1B[");
  CHECK(gapmark::printable("\xFF" "x") == "\\xFFx");
  CHECK(gapmark::printable(std::string(100, 'x'), 10) == "xxxxxxxxxx... (90 more bytes)");
  CHECK(gapmark::printable("caf\xC3\xA9", 4) == "caf\xC3\xA9");  // a character, not a byte, at the cut
}

TEST_CASE("strict JSON: a key twice in one object is refused") {
  CHECK(gapmark::parse_json_strict(R"({"a": 1, "b": {"a": 2}})", "s.json")["b"]["a"] == 2);
  CHECK(gapmark::parse_json_strict(R"([{"a": 1}, {"a": 2}])", "s.json").size() == 2);
  CHECK(error_of([] { (void)gapmark::parse_json_strict(R"({"seed": 1, "seed": 2})", "s.json"); }) ==
        "s.json: duplicate key 'seed' in one JSON object (each key may appear once)");
  CHECK(error_of([] { (void)gapmark::parse_json_strict(R"({"x": {"k": 1, "k": 1}})", "s.json"); })
            .find("duplicate key 'k'") != std::string::npos);
}
