// Allocator settings and huge pages for the heap (see the header for the figures).
#include "core/process_memory.h"

#include <malloc.h>
#include <sys/mman.h>
#include <unistd.h>

#include <cstdint>
#include <cstdlib>
#include <limits>
#include <mutex>

namespace edgeflux {
namespace {

std::once_flag settings_once;
bool user_settings = false;
std::mutex advice_mutex;
std::uintptr_t advised_end = 0;  // the heap below this is marked already

constexpr std::uintptr_t page = 4096;

// Under AddressSanitizer the allocator is the sanitizer's, not glibc's: nothing to tune, and the
// reserve below would only make it poison 1.5 GiB of shadow memory.
#if defined(__SANITIZE_ADDRESS__)
constexpr bool sanitizer_allocator = true;
#elif defined(__has_feature)
#if __has_feature(address_sanitizer)
constexpr bool sanitizer_allocator = true;
#else
constexpr bool sanitizer_allocator = false;
#endif
#else
constexpr bool sanitizer_allocator = false;
#endif

void choose_settings() {
  user_settings = sanitizer_allocator || std::getenv("GLIBC_TUNABLES") != nullptr ||
                  std::getenv("MALLOC_MMAP_THRESHOLD_") != nullptr;
  if (user_settings) return;
  mallopt(M_MMAP_THRESHOLD, 1 << 30);
  mallopt(M_TRIM_THRESHOLD, std::numeric_limits<int>::max());  // above the reserve below: kept
  mallopt(M_TOP_PAD, 64 << 20);
  // Grow the heap now by address space enough for the largest meshes (1.5 GiB; physical memory is
  // only taken when touched), so the stages allocate from memory already marked for huge pages:
  // marking after the fact leaves whatever a stage touched before in small pages (a 10^6-node
  // solve had 285 of its 760 MiB in huge pages). Where the kernel refuses that much address
  // space, the blocks come from mmap and go back at once, and nothing changes.
  advised_end = (reinterpret_cast<std::uintptr_t>(sbrk(0)) + page - 1) & ~(page - 1);
  void* blocks[3];
  for (void*& block : blocks) block = malloc(std::size_t{512} << 20);
  for (int k = 2; k >= 0; --k) free(blocks[k]);
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
