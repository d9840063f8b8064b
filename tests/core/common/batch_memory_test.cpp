#include "common/batch_memory.h"

#include <gtest/gtest.h>
#include <sys/mman.h>
#include <unistd.h>

#include <cstdint>
#include <cstdlib>
#include <cstring>
#include <vector>

namespace stridemark {
namespace {

// Resident pages of [data, data + bytes), counted with mincore(2). Source: Linux man page
// mincore(2); mallopt(3) for M_MMAP_MAX and M_TRIM_THRESHOLD.
std::size_t residentPages(void* data, std::size_t bytes) {
  const auto page = static_cast<std::uintptr_t>(::sysconf(_SC_PAGESIZE));
  const auto begin = reinterpret_cast<std::uintptr_t>(data) & ~(page - 1);
  const auto end = reinterpret_cast<std::uintptr_t>(data) + bytes;
  std::vector<unsigned char> flags((end - begin + page - 1) / page);
  if (::mincore(reinterpret_cast<void*>(begin), end - begin, flags.data()) != 0) return 0;
  std::size_t resident = 0;
  for (const unsigned char f : flags) resident += f & 1;
  return resident;
}

TEST(BatchMemory, FreedBlocksStayInTheProcessForTheNextStage) {
  keepFreedMemoryForReuse();
  constexpr std::size_t kBlock = std::size_t{16} << 20;  // a parsed file's rows
  void* first = std::malloc(kBlock);
  ASSERT_NE(first, nullptr);
  std::memset(first, 1, kBlock);
  ASSERT_EQ(static_cast<volatile char*>(first)[kBlock - 1], 1);  // keeps the writes (and pages)
  std::free(first);
  // The next stage's block of the same size gets the same, already resident pages.
  void* second = std::malloc(kBlock);
  ASSERT_NE(second, nullptr);
  EXPECT_EQ(second, first);
  EXPECT_GE(residentPages(second, kBlock),
            kBlock / static_cast<std::size_t>(::sysconf(_SC_PAGESIZE)) - 1);
  std::free(second);
}

}  // namespace
}  // namespace stridemark
