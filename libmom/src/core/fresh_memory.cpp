#include "core/fresh_memory.hpp"

#include <cstdint>

#if defined(__linux__)
#include <sys/mman.h>
#endif

namespace wirefield::core {

void PrepareFreshMemory(void* data, std::size_t bytes) {
#if defined(__linux__)
  constexpr std::size_t kMinBytes = std::size_t{256} << 10;
  constexpr std::size_t kPage = 4096;
  if (data == nullptr || bytes < kMinBytes) return;
  // The whole pages the buffer touches: the mapping that holds it covers them.
  const std::uintptr_t first = reinterpret_cast<std::uintptr_t>(data) / kPage * kPage;
  const std::uintptr_t end =
      (reinterpret_cast<std::uintptr_t>(data) + bytes + kPage - 1) / kPage * kPage;
  void* start = static_cast<char*>(data) - (reinterpret_cast<std::uintptr_t>(data) - first);
  const std::size_t length = end - first;
#if defined(MADV_HUGEPAGE)
  (void)madvise(start, length, MADV_HUGEPAGE);
#endif
  // MADV_POPULATE_WRITE (Linux 5.14): older headers lack the name; an older kernel answers
  // EINVAL, which leaves the buffer to fault in page by page as before.
  constexpr int kPopulateWrite = 23;
  (void)madvise(start, length, kPopulateWrite);
#else
  (void)data;
  (void)bytes;
#endif
}

}  // namespace wirefield::core
