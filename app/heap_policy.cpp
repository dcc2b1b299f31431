#include "app/heap_policy.h"

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <cstdlib>

#if defined(__GLIBC__)
#include <malloc.h>
#include <sys/mman.h>
#include <unistd.h>
#endif

#if defined(__SANITIZE_ADDRESS__)
#define CALIVERA_FOREIGN_ALLOCATOR 1
#elif defined(__has_feature)
#if __has_feature(address_sanitizer) || __has_feature(memory_sanitizer)
#define CALIVERA_FOREIGN_ALLOCATOR 1
#endif
#endif

namespace calivera {

void applyHeapPolicy(ProcessKind kind) {
#if defined(__GLIBC__) && !defined(CALIVERA_FOREIGN_ALLOCATOR)
  constexpr std::size_t kGiB = std::size_t{1} << 30;
  constexpr std::size_t kHugePage = std::size_t{2} << 20;
  std::size_t reserve = kGiB;
  if (kind == ProcessKind::Command) {
    const long pages = ::sysconf(_SC_PHYS_PAGES);
    const long pageSize = ::sysconf(_SC_PAGESIZE);
    if (pages > 0 && pageSize > 0) {
      const std::size_t physical =
          static_cast<std::size_t>(pages) * static_cast<std::size_t>(pageSize);
      reserve = std::clamp(physical / 4 / kHugePage * kHugePage, kGiB, 16 * kGiB);
    }
  }
  // No block is served by its own mapping, so a freed array's pages are reused by the next one
  // instead of being unmapped and faulted in again.
  if (mallopt(M_MMAP_MAX, 0) != 1) return;
  // A command never shrinks its heap (the memory returns to the system when it ends); the
  // workstation keeps 1.5 GiB of free heap and hands back the rest as usual.
  mallopt(M_TRIM_THRESHOLD, kind == ProcessKind::Command ? -1 : static_cast<int>(kGiB + kGiB / 2));
  // One arena for every thread: the worker threads' arrays then also come from the advised,
  // reused heap (a per-thread arena is a fresh mapping, faulted page by page). The threads make
  // few, large allocations, so sharing the arena's lock costs nothing measurable.
  mallopt(M_ARENA_MAX, 1);
  // Grow the heap by the reserve at once (address space only: nothing is touched), advise it
  // for huge pages, and hand it back to the allocator as free memory to carve from.
  void* block = std::malloc(reserve);
  if (block == nullptr) return;
  const auto begin = reinterpret_cast<std::uintptr_t>(block);
  const std::uintptr_t first = (begin + kHugePage - 1) / kHugePage * kHugePage;
  const std::uintptr_t last = (begin + reserve) / kHugePage * kHugePage;
  if (last > first) ::madvise(reinterpret_cast<void*>(first), last - first, MADV_HUGEPAGE);
  std::free(block);
#else
  (void)kind;
#endif
}

}  // namespace calivera
