// Core: the library's parallel loop and its one thread count per core.
#pragma once

#include <cstddef>
#include <functional>

namespace wirefield::core {

// Runs task(0..count-1) on `threads` workers (the calling thread one of them), each taking the
// next index from a shared counter; the first error stops them all and is rethrown. Each task
// must write only its own results, so that any thread count gives the same answers to the bit.
void ParallelFor(int threads, std::size_t count, const std::function<void(std::size_t)>& task);

// One thread per core (at least one).
int CoreCount();

// The thread count a request means: `asked` when positive, else (0, "auto") CoreCount().
int ResolveThreads(int asked);

}  // namespace wirefield::core
