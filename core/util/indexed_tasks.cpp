#include "core/util/indexed_tasks.h"

#include <algorithm>
#include <atomic>
#include <chrono>
#include <condition_variable>
#include <exception>
#include <mutex>
#include <thread>
#include <vector>

namespace calivera {

unsigned resolveThreadCount(unsigned requested) {
  if (requested > 0) return requested;
  const unsigned hardware = std::thread::hardware_concurrency();
  return hardware > 0 ? hardware : 1;
}

unsigned runIndexedTasks(std::size_t count, unsigned threads, const ProgressCallback& progress,
                         const std::function<void(std::size_t index)>& task) {
  if (count == 0) return 0;
  std::atomic<std::size_t> next{0};
  std::atomic<std::size_t> done{0};
  std::atomic<bool> stop{false};
  std::mutex mutex;
  std::condition_variable finished;
  std::exception_ptr error;

  const auto work = [&] {
    while (!stop.load()) {
      const std::size_t i = next.fetch_add(1);
      if (i >= count) break;
      try {
        task(i);
      } catch (...) {
        const std::lock_guard lock(mutex);
        if (!error) error = std::current_exception();
        stop.store(true);
      }
      done.fetch_add(1);
      finished.notify_one();
    }
  };

  const auto used =
      static_cast<unsigned>(std::min<std::size_t>(resolveThreadCount(threads), count));
  std::vector<std::jthread> workers;
  workers.reserve(used);
  for (unsigned t = 0; t < used; ++t) workers.emplace_back(work);

  bool cancelled = false;
  {
    std::unique_lock lock(mutex);
    while (done.load() < count && !stop.load()) {
      finished.wait_for(lock, std::chrono::milliseconds(50));
      lock.unlock();
      if (progress && !progress(static_cast<double>(done.load()) / static_cast<double>(count))) {
        cancelled = true;
        stop.store(true);
      }
      lock.lock();
    }
  }
  for (auto& worker : workers) worker.join();
  if (error) std::rethrow_exception(error);
  if (cancelled) throw Cancelled();
  reportProgress(progress, 1.0);
  return used;
}

}  // namespace calivera
