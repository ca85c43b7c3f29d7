// Solve stage: keeps OpenBLAS to one thread while the library's own workers run, or for a
// small matrix. OpenBLAS's threads fight the workers over small matrices (measured: a quarter
// of a 100-unknown sweep spent in its thread hand-off), and below a few hundred unknowns its
// second thread slows a factorization down. Weak symbols: with another LAPACK these are null
// and nothing is changed. Used by the sweep, the batch (libmom/src/api/) and the dense solve.
#pragma once

extern "C" void openblas_set_num_threads(int) __attribute__((weak));
extern "C" int openblas_get_num_threads() __attribute__((weak));
// OpenBLAS's threaded build stops its worker pool with this (it does so around fork) and starts
// it again on the next call that wants threads.
extern "C" int blas_thread_shutdown_() __attribute__((weak));

namespace wirefield::solve {

// Sets OpenBLAS to one thread for the guard's lifetime and restores the count after. Nested
// guards are harmless: an inner one finds one thread and restores one thread.
class SingleThreadedBlas {
 public:
  SingleThreadedBlas() {
    if (openblas_set_num_threads && openblas_get_num_threads) {
      saved_ = openblas_get_num_threads();
      openblas_set_num_threads(1);
    }
  }
  ~SingleThreadedBlas() {
    if (saved_ > 0) openblas_set_num_threads(saved_);
  }
  SingleThreadedBlas(const SingleThreadedBlas&) = delete;
  SingleThreadedBlas& operator=(const SingleThreadedBlas&) = delete;

 private:
  int saved_ = 0;
};

// Stops the BLAS library's idle worker pool where it has one (wirefield::ParkIdleBlasThreads
// in wirefield/simulation.hpp says why, and when that is safe). Returns whether there was one.
inline bool ParkIdleBlasThreads() {
  return blas_thread_shutdown_ != nullptr && blas_thread_shutdown_() == 0;
}

}  // namespace wirefield::solve
