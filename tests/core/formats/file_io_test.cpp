#include "formats/file_io.h"

#include <gtest/gtest.h>
#include <sys/stat.h>

#include "common/error.h"
#include "test_support.h"

namespace stridemark::formats {
namespace {

TEST(FileIo, ReadsWholeFilesLargerThanOneChunk) {
  testing::TempFolder folder;
  std::string text(3 * (1 << 20) + 17, 'a');
  text.back() = 'z';
  testing::writeText(folder / "big", text);
  EXPECT_EQ(readWholeFile(folder / "big"), text);
}

TEST(FileIo, FolderIsNotAFile) {
  testing::TempFolder folder;
  try {
    readWholeFile(folder.path());
    FAIL();
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("is a folder"), std::string::npos);
  }
}

TEST(FileIo, AtomicSaveKeepsTheOldFilesMode) {
  testing::TempFolder folder;
  const auto path = folder / "shared.csv";
  testing::writeText(path, "old");
  ::chmod(path.c_str(), 0640);
  writeFileAtomically(path, "new");
  struct stat info {};
  ASSERT_EQ(::stat(path.c_str(), &info), 0);
  EXPECT_EQ(info.st_mode & 0777, 0640u);
  EXPECT_EQ(testing::readText(path), "new");
}

// Common practice, no source: a regenerable output skips fsync but is still replaced whole or
// not at all, with no temporary file left beside it.
TEST(FileIo, RegenerableOutputIsReplacedWholeOrNotAtAll) {
  testing::TempFolder folder;
  const auto path = folder / "report.json";
  testing::writeText(path, "old report");
  {
    AtomicFile abandoned(path, Durability::regenerable);
    abandoned.write("half a rep");
  }  // e.g. an exception while formatting
  EXPECT_EQ(testing::readText(path), "old report");
  {
    AtomicFile file(path, Durability::regenerable);
    file.write("{\"new\": ");
    EXPECT_EQ(testing::readText(path), "old report");  // readers see the old file until commit
    file.write("true}");
    file.commit();
  }
  EXPECT_EQ(testing::readText(path), "{\"new\": true}");
  std::size_t entries = 0;
  for ([[maybe_unused]] const auto& entry : std::filesystem::directory_iterator(folder.path()))
    ++entries;
  EXPECT_EQ(entries, 1u);
}

// Source: issue 17 defect 11 (a FIFO as input blocked forever): reading one fails at once.
TEST(FileIo, ReadingAFifoFailsAtOnceInsteadOfWaiting) {
  testing::TempFolder folder;
  const auto fifo = folder / "events.csv";
  ASSERT_EQ(::mkfifo(fifo.c_str(), 0600), 0);
  try {
    readWholeFile(fifo);
    FAIL() << "reading a FIFO succeeded";
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("is a FIFO"), std::string::npos) << e.what();
  }
}

}  // namespace
}  // namespace stridemark::formats
