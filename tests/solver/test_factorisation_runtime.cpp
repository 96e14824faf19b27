// The process settings of the factorisation: OpenMP regions of the sparse library run serially.
#include <doctest/doctest.h>

#include <thread>

extern "C" void GOMP_parallel(void (*body)(void*), void* data, unsigned num_threads, unsigned flags);

namespace {

struct Visit {
  int calls = 0;
  std::thread::id thread;
};

void record(void* data) {
  auto* visit = static_cast<Visit*>(data);
  ++visit->calls;
  visit->thread = std::this_thread::get_id();
}

}  // namespace

TEST_CASE("a parallel region of the sparse library runs its body once, on the calling thread") {
  // Exact semantics of a team of one (common practice for OpenMP runtimes): the body sees thread
  // 0 of 1 and does every iteration itself, whatever team size the library asked for.
  for (unsigned asked : {0u, 1u, 4u, 64u}) {
    Visit visit;
    GOMP_parallel(record, &visit, asked, 0u);
    CHECK(visit.calls == 1);
    CHECK(visit.thread == std::this_thread::get_id());
  }
}
