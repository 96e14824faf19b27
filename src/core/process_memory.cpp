// Allocator settings and huge pages for the heap (see the header for the figures).
#include "core/process_memory.h"

#include <malloc.h>
#include <sys/mman.h>
#include <unistd.h>

#include <cstdint>
#include <cstdlib>
#include <mutex>

namespace edgeflux {
namespace {

std::once_flag settings_once;
bool user_settings = false;
std::mutex advice_mutex;
std::uintptr_t advised_end = 0;  // the heap below this is marked already

constexpr std::uintptr_t page = 4096;

void choose_settings() {
  user_settings = std::getenv("GLIBC_TUNABLES") != nullptr || std::getenv("MALLOC_MMAP_THRESHOLD_") != nullptr;
  if (user_settings) return;
  mallopt(M_MMAP_THRESHOLD, 1 << 30);
  mallopt(M_TRIM_THRESHOLD, 1 << 30);
  mallopt(M_TOP_PAD, 256 << 20);
  // Grow the heap by one step now, so the first stage already allocates from advised memory (the
  // block is freed at once and stays with the allocator; untouched, it takes no physical memory).
  advised_end = (reinterpret_cast<std::uintptr_t>(sbrk(0)) + page - 1) & ~(page - 1);
  free(malloc(256 << 20));
}

}  // namespace

void prepare_process_memory() {
  std::call_once(settings_once, choose_settings);
  if (user_settings) return;
  const std::uintptr_t top = reinterpret_cast<std::uintptr_t>(sbrk(0)) & ~(page - 1);
  const std::lock_guard<std::mutex> lock(advice_mutex);
  if (top <= advised_end) return;
  // Only memory not touched yet gets huge pages; an error (no such support) changes nothing.
  madvise(reinterpret_cast<void*>(advised_end), top - advised_end, MADV_HUGEPAGE);
  advised_end = top;
}

}  // namespace edgeflux
