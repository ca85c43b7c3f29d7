// Core: first-touch preparation of large fresh buffers (the impedance matrix, the
// factorization's workspace).
#pragma once

#include <cstddef>

namespace wirefield::core {

// Asks the kernel (Linux) to back [data, data + bytes) with transparent huge pages where it
// can and to map all of it now, in one call, instead of one page fault per 4 KiB on the first
// write. On this project's 2-core virtual machine a first write to 16 MB of fresh memory took
// 38 ms page by page and 3 ms after this (docs/performance.md). Only hints: the contents are
// unchanged, and where the kernel declines (an older kernel, huge pages disabled) nothing
// changes. Buffers under 256 KiB are left alone.
void PrepareFreshMemory(void* data, std::size_t bytes);

}  // namespace wirefield::core
