// The process-wide settings the sparse factorisation runs under: dense-kernel (BLAS) threads,
// the library's parallel regions, and reuse of freed memory between factorisations.
#pragma once

namespace edgeflux {

/// Call before each factorisation: picks the BLAS thread count for this size and prepares the
/// process memory (core/process_memory.h).
void prepare_factorisation_runtime(int n_unknowns);

/// Call before solving on several threads at once: keeps the dense kernels of every later
/// factorisation on one thread (the solves share the cores, and the process-wide BLAS thread count
/// must not change while another thread factorises).
void pin_blas_to_one_thread();

}  // namespace edgeflux
