#pragma once
// Work stopped because the user interrupted it (Ctrl-C, SIGTERM): not a
// failure of the method. A task that meets it is not recorded, so that
// --resume runs it again.
#include <stdexcept>

namespace gapmark {

class Interrupted : public std::runtime_error {
public:
  using std::runtime_error::runtime_error;
};

}  // namespace gapmark
