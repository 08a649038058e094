// gapmark: benchmark gap-filling methods for time series.
// The whole program: declare the subcommands, parse, run the chosen one,
// turn errors into one line on stderr and an exit code.
#include <csignal>
#include <iostream>

#include "commands.hpp"
#include "gapmark/error.hpp"
#include "gapmark/text_safety.hpp"
#include "gapmark/version.hpp"

int main(int argc, char** argv) {
  using namespace gapmark::cli;
  // A write past `ulimit -f` then fails with EFBIG and is reported as the
  // usual one-line error, instead of the signal ending the program silently.
  std::signal(SIGXFSZ, SIG_IGN);
  CLI::App app{"gapmark: hides known values in complete time series the way real gaps look, fills them "
               "with every candidate method, scores the fills and ranks the methods."};
  app.set_version_flag("--version", std::string("gapmark ") + gapmark::version() + " (" + gapmark::commit() + ")");
  app.require_subcommand(1);
  Action action;
  add_run(app, action);
  add_profile(app, action);
  add_regularize(app, action);
  add_quick(app, action);
  add_merge(app, action);
  add_report(app, action);
  add_compare(app, action);
  add_fill(app, action);
  add_mask(app, action);
  add_methods(app, action);
  add_schemes(app, action);
  add_metrics(app, action);
  app.footer("Exit codes: 0 success, 1 a regression found by compare, 2 bad input or usage, 3 internal error.\n"
             "Run `gapmark COMMAND --help` for a command's options.");
  try {
    app.parse(argc, argv);
  } catch (const CLI::CallForHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForAllHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForVersion& e) {
    return app.exit(e);
  } catch (const CLI::ParseError& e) {
    std::cerr << "gapmark: " << e.what() << "\n";
    return kBadInput;
  }
  try {
    return action ? action() : kBadInput;
  } catch (const gapmark::InputError& e) {
    // One printable line, however long or strange the input it echoes (a 10 MB
    // cell, a NUL byte, bytes that are not UTF-8): escaped, cut after 1000 characters.
    std::cerr << "gapmark: " << gapmark::printable(e.what(), 1000) << "\n";
    return kBadInput;
  } catch (const std::exception& e) {
    std::cerr << "gapmark: internal error: " << gapmark::printable(e.what(), 1000) << "\n";
    return kInternal;
  }
}
