// Settings the sparse factorisation runs under, found by measurement on ISO 10211 Case 2 and a
// 316 × 316 grid (10^5 unknowns, 2 cores): the numeric factorisation took 0.63 s where its
// arithmetic needs under 0.1 s, and most of the difference was system time (threads, page faults).
#include "solver/factorisation_runtime.h"

#include "core/process_memory.h"

#include <atomic>
#include <cstdlib>
#include <dlfcn.h>

namespace edgeflux {
namespace {

// The BLAS thread count is process-wide. Once pinned (several solves running on their own
// threads), it stays at one: changing it while another thread is inside a factorisation is unsafe,
// and a second BLAS thread would only compete with the other solves.
std::atomic<bool> blas_pinned{false};

using SetThreads = void (*)(int);
using GetThreads = int (*)();
// Looked up at run time, so a BLAS without these entry points works too (nothing is changed).
SetThreads blas_set_threads() {
  static const auto f = reinterpret_cast<SetThreads>(dlsym(RTLD_DEFAULT, "openblas_set_num_threads"));
  return f;
}
GetThreads blas_get_threads() {
  static const auto f = reinterpret_cast<GetThreads>(dlsym(RTLD_DEFAULT, "openblas_get_num_threads"));
  return f;
}

/// Threads for the dense kernels inside the supernodal factorisation. Below about 2·10^5 unknowns
/// the supernodes are small, and a second BLAS thread spends most of its time spinning in
/// sched_yield (measured on ISO 10211 Case 2 to 0.01 %: 0.8 s of system time in a 1.2 s run);
/// above that, one thread per core cuts the factorisation time by about half. OPENBLAS_NUM_THREADS
/// set by the user wins.
void choose_blas_threads(int n_unknowns) {
  static const bool user_chose = std::getenv("OPENBLAS_NUM_THREADS") != nullptr;
  const SetThreads set_threads = blas_set_threads();
  const GetThreads get_threads = blas_get_threads();
  if (user_chose || blas_pinned || set_threads == nullptr || get_threads == nullptr) return;
  static const int machine_threads = get_threads();  // OpenBLAS's own choice: one per core
  const int wanted = n_unknowns < 200000 ? 1 : machine_threads;
  if (get_threads() != wanted) set_threads(wanted);
}

}  // namespace

void prepare_factorisation_runtime(int n_unknowns) {
  prepare_process_memory();
  choose_blas_threads(n_unknowns);
}

void pin_blas_to_one_thread() {
  if (blas_pinned.exchange(true)) return;
  if (const SetThreads set_threads = blas_set_threads(); set_threads && !std::getenv("OPENBLAS_NUM_THREADS")) set_threads(1);
}

}  // namespace edgeflux

/// The supernodal factorisation (CHOLMOD 3.0, SuiteSparse 5) opens an OpenMP parallel region with
/// a fixed team of four threads for every supernode, to zero and scatter a few hundred entries:
/// on 2 cores the threads' start and wake-up (280 000 futex calls for one factorisation of 10^5
/// unknowns) cost six times the arithmetic (0.63 s against 0.09 s). Defined here, this entry point
/// of the OpenMP runtime takes the place of the runtime's own for the whole program, and runs each
/// region's body on the calling thread: the body then sees a team of one (thread 0 of 1) and does
/// every iteration itself, which is exactly the serial loop. The dense kernels keep their own
/// threads (BLAS, above). edgeflux itself has no OpenMP code; the library imports only this entry
/// point and the thread-number queries, which answer 0 of 1 outside a team.
extern "C" void GOMP_parallel(void (*body)(void*), void* data, unsigned /*num_threads*/, unsigned /*flags*/) {
  body(data);
}
