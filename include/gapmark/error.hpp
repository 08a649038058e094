#pragma once
// Errors the user can act on. Every message is one line that names the file,
// line or field it is about; the CLI prints it and exits with a non-zero code.
#include <stdexcept>
#include <string>

namespace gapmark {

/// Bad input: a file, a spec, a parameter. `where` names the place
/// ("data.csv:14", "spec.json: /schemes/1/rate", "--method").
class InputError : public std::runtime_error {
public:
  InputError(std::string where, const std::string& what)
      : std::runtime_error(where.empty() ? what : where + ": " + what), where_(std::move(where)) {}
  const std::string& where() const noexcept { return where_; }

private:
  std::string where_;
};

/// Which of a method's needs the data did not meet, when that is why it failed.
/// The message says what is missing; each caller adds the hint that fits its
/// context (a spec's "period", the command line's --period).
enum class UnmetNeed { None, Period, Length, Siblings, Observed };

/// A fill method could not fill a series (a need unmet, a numerical failure).
/// The experiment records the cell as failed with this reason and goes on.
class MethodFailure : public std::runtime_error {
public:
  explicit MethodFailure(const std::string& what, UnmetNeed need = UnmetNeed::None)
      : std::runtime_error(what), need_(need) {}
  UnmetNeed need() const noexcept { return need_; }

private:
  UnmetNeed need_;
};

}  // namespace gapmark
