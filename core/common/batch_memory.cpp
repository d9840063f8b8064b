#include "common/batch_memory.h"

#if __has_include(<malloc.h>)
#include <malloc.h>
#endif

namespace stridemark {

void keepFreedMemoryForReuse() {
#if defined(M_MMAP_MAX) && defined(M_TRIM_THRESHOLD)
  mallopt(M_MMAP_MAX, 0);                 // big blocks from the heap too, so they can be reused
  mallopt(M_TRIM_THRESHOLD, 1024 << 20);  // keep freed memory (a batch process is short-lived)
  // One heap for every thread: a worker's buffers then reuse what the main thread freed (the
  // parsed text) instead of fresh pages in an arena of its own. Contention stays low: the
  // workers allocate little, in large blocks.
  mallopt(M_ARENA_MAX, 1);
#endif
}

}  // namespace stridemark
