// How the process gets its memory from the kernel: freed blocks kept for reuse, and the heap
// backed by huge pages where the kernel allows it.
#pragma once

namespace edgeflux {

/// Call before each stage that allocates large arrays (a refinement level, a factorisation):
/// cheap after the first call (one system call).
///
/// On the first call, freed blocks of every size stay with the allocator (by default glibc maps
/// blocks above 128 KiB afresh from the kernel and unmaps them on free, so every level faulted its
/// arrays in page by page again), and the heap is grown at once by 1.5 GiB of address space
/// (physical memory is taken only when touched). On every call the part of the heap added since
/// the last call is marked for transparent huge pages (2 MiB instead of 4 KiB): one page fault
/// instead of 512 for the same memory. Page faults were the bulk of the system time on the 2-core
/// benchmark machine: ISO 10211 Case 2 at --target 1e-4 took 0.84 s without these settings and
/// 0.38 s with them; a 10^6-node solve went from 234 000 page faults (10.1 s) to 4 300 (5.5 s).
/// Memory handed back late costs nothing here: the program is a command-line run. A user's own
/// malloc settings (GLIBC_TUNABLES, MALLOC_MMAP_THRESHOLD_) switch all of this off.
void prepare_process_memory();

}  // namespace edgeflux
