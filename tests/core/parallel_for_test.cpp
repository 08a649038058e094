// parallel_for: every index once, whatever the thread count; the first
// exception reaches the caller after all threads have returned.
#include <doctest/doctest.h>

#include <atomic>
#include <chrono>
#include <stdexcept>
#include <string>
#include <thread>
#include <vector>

#include "gapmark/parallel_for.hpp"

TEST_CASE("parallel_for calls the body once per index on any number of threads") {
  for (unsigned threads : {0u, 1u, 2u, 3u, 8u})
    for (std::size_t count : {std::size_t{0}, std::size_t{1}, std::size_t{2}, std::size_t{1000}}) {
      CAPTURE(threads);
      CAPTURE(count);
      std::vector<std::atomic<int>> calls(count);
      std::vector<std::size_t> out(count, 0);
      gapmark::parallel_for(count, threads, [&](std::size_t i) {
        ++calls[i];
        out[i] = i * i;
      });
      for (std::size_t i = 0; i < count; ++i) {
        CHECK(calls[i].load() == 1);
        CHECK(out[i] == i * i);
      }
    }
}

TEST_CASE("parallel_for rethrows a body's exception and hands out no index after it") {
  for (unsigned threads : {1u, 2u, 4u}) {
    CAPTURE(threads);
    std::atomic<std::size_t> started{0};
    std::atomic<bool> failing{false};
    std::string message;
    try {
      gapmark::parallel_for(10000, threads, [&](std::size_t i) {
        ++started;
        if (i == 5) {
          failing = true;
          throw std::runtime_error("body failed at 5");
        }
        // Once index 5 is failing, the other bodies take 1 ms each: the
        // handing out must stop within a few of them, not after the 9,994
        // left (which, without the pause, a busy machine could let the
        // other threads finish before the failing thread is scheduled again).
        if (failing) std::this_thread::sleep_for(std::chrono::milliseconds(1));
      });
    } catch (const std::runtime_error& e) {
      message = e.what();
    }
    CHECK(message == "body failed at 5");
    // Each thread stops at the next index it would take: far fewer than all ran.
    CHECK(started.load() < 10000);
  }
}
