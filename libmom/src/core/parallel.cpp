// Core: the parallel loop (parallel.hpp).
#include "core/parallel.hpp"

#include <algorithm>
#include <atomic>
#include <exception>
#include <mutex>
#include <thread>
#include <vector>

namespace wirefield::core {

void ParallelFor(int threads, std::size_t count, const std::function<void(std::size_t)>& task) {
  std::atomic<std::size_t> next{0};
  std::atomic<bool> failed{false};
  std::exception_ptr error;
  std::mutex error_mutex;
  auto work = [&] {
    while (!failed) {
      const std::size_t i = next++;
      if (i >= count) return;
      try {
        task(i);
      } catch (...) {
        std::lock_guard<std::mutex> lock(error_mutex);
        if (!error) error = std::current_exception();
        failed = true;
      }
    }
  };
  const int workers = static_cast<int>(
      std::min<std::size_t>(static_cast<std::size_t>(std::max(1, threads)), count));
  std::vector<std::thread> pool;
  for (int t = 1; t < workers; ++t) pool.emplace_back(work);
  work();
  for (std::thread& t : pool) t.join();
  if (error) std::rethrow_exception(error);
}

int CoreCount() { return static_cast<int>(std::max(1u, std::thread::hardware_concurrency())); }

int ResolveThreads(int asked) { return asked > 0 ? asked : CoreCount(); }

}  // namespace wirefield::core
