#include "gapmark/parallel_for.hpp"

#include <algorithm>
#include <atomic>
#include <exception>
#include <mutex>
#include <thread>
#include <vector>

namespace gapmark {

void parallel_for(std::size_t count, unsigned threads, const std::function<void(std::size_t)>& body) {
  std::atomic<std::size_t> next{0};
  std::atomic<bool> failed{false};
  std::exception_ptr error;
  std::mutex error_mutex;
  auto worker = [&] {
    for (std::size_t i = next++; i < count && !failed.load(); i = next++) {
      try {
        body(i);
      } catch (...) {
        std::lock_guard lock(error_mutex);
        if (!failed.exchange(true)) error = std::current_exception();
        return;
      }
    }
  };
  const auto used = static_cast<unsigned>(std::min<std::size_t>(std::max(1u, threads), std::max<std::size_t>(count, 1)));
  std::vector<std::thread> pool;
  for (unsigned t = 1; t < used; ++t) pool.emplace_back(worker);
  worker();
  for (auto& t : pool) t.join();
  if (error) std::rethrow_exception(error);
}

}  // namespace gapmark
