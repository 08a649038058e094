#pragma once
// Runs independent pieces of work on a few threads. Each index is handed out
// once, in increasing order, to whichever thread is free; the body writes
// its result into a slot of its own (out[i]), so the outcome does not depend
// on the thread count. The first exception thrown by any body stops the
// handing out and is rethrown to the caller once every thread has returned.
#include <cstddef>
#include <functional>

namespace gapmark {

/// Calls body(i) for i = 0 .. count - 1 on up to `threads` threads (the
/// caller's included; 0 or 1 means on the caller's thread only).
void parallel_for(std::size_t count, unsigned threads, const std::function<void(std::size_t)>& body);

}  // namespace gapmark
