#include "common/batch_memory.h"

#include <gtest/gtest.h>
#include <sys/mman.h>
#include <unistd.h>

#include <atomic>
#include <cstddef>
#include <cstring>
#include <vector>

namespace stridemark {
namespace {

// Pages of a fresh anonymous mapping that are resident, counted with mincore(2).
// Source: Linux man page mincore(2); madvise(2) for MADV_POPULATE_WRITE (Linux 5.14).
class FreshMapping {
 public:
  explicit FreshMapping(std::size_t bytes) : bytes_(bytes) {
    data_ = ::mmap(nullptr, bytes, PROT_READ | PROT_WRITE, MAP_PRIVATE | MAP_ANONYMOUS, -1, 0);
  }
  ~FreshMapping() {
    if (data_ != MAP_FAILED) ::munmap(data_, bytes_);
  }
  FreshMapping(const FreshMapping&) = delete;
  FreshMapping& operator=(const FreshMapping&) = delete;
  void* data() const { return data_; }
  std::size_t residentPages() const {
    const auto page = static_cast<std::size_t>(::sysconf(_SC_PAGESIZE));
    std::vector<unsigned char> flags((bytes_ + page - 1) / page);
    if (::mincore(data_, bytes_, flags.data()) != 0) return 0;
    std::size_t resident = 0;
    for (const unsigned char f : flags) resident += f & 1;
    return resident;
  }
  std::size_t pages() const { return bytes_ / static_cast<std::size_t>(::sysconf(_SC_PAGESIZE)); }

 private:
  std::size_t bytes_;
  void* data_;
};

TEST(BatchMemory, PopulatePagesFaultsInEveryPageOfTheRange) {
  FreshMapping mapping(std::size_t{9} << 20);  // not a multiple of the 4 MiB piece
  ASSERT_NE(mapping.data(), MAP_FAILED);
  ASSERT_EQ(mapping.residentPages(), 0u);
  populatePages(mapping.data(), std::size_t{9} << 20);
#if defined(MADV_POPULATE_WRITE)
  EXPECT_EQ(mapping.residentPages(), mapping.pages());
#endif
  // Still ordinary memory: writable and zero.
  EXPECT_EQ(static_cast<const char*>(mapping.data())[(std::size_t{9} << 20) - 1], 0);
}

TEST(BatchMemory, PopulatePagesStopsWhenAsked) {
  FreshMapping mapping(std::size_t{8} << 20);
  ASSERT_NE(mapping.data(), MAP_FAILED);
  const std::atomic<bool> stop{true};
  populatePages(mapping.data(), std::size_t{8} << 20, &stop);
  EXPECT_EQ(mapping.residentPages(), 0u);
}

TEST(BatchMemory, WarmedHeapIsUsableAfterFinish) {
  keepFreedMemoryForReuse();
  HeapWarmup warmup(std::size_t{32} << 20);
  std::vector<char> parsed(std::size_t{4} << 20, 'x');  // the caller carries on meanwhile
  warmup.finish();
  warmup.finish();  // idempotent, as the destructor calls it again
  std::vector<char> analysed(std::size_t{24} << 20);
  std::memset(analysed.data(), 1, analysed.size());
  EXPECT_EQ(parsed.back(), 'x');
  EXPECT_EQ(analysed.back(), 1);
}

}  // namespace
}  // namespace stridemark
