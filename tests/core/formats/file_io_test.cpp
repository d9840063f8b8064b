#include "formats/file_io.h"

#include <gtest/gtest.h>
#include <sys/stat.h>
#include <sys/wait.h>
#include <unistd.h>

#include "common/error.h"
#include "test_support.h"
#include "tests/support/process.h"

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

// Common practice, no source: the temporary file names its writer, so a later run can tell a
// killed writer's leftover from a live writer's file.
TEST(FileIo, TemporaryFileNamesItsWriter) {
  testing::TempFolder folder;
  AtomicFile file(folder / "trial.stridemark");
  file.write("x");
  std::vector<std::string> names;
  for (const auto& entry : std::filesystem::directory_iterator(folder.path()))
    names.push_back(entry.path().filename().string());
  ASSERT_EQ(names.size(), 1u);
  const std::string expected = temporaryNamePrefix("trial.stridemark", ::getpid());
  EXPECT_EQ(names[0].substr(0, expected.size()), expected) << names[0];
  EXPECT_EQ(names[0].size(), expected.size() + 6) << names[0];
}

// Common practice, no source: clean-up removes only our own pattern, only for a dead writer.
TEST(FileIo, StaleTemporariesOfDeadWritersAreRemovedAndNothingElse) {
  testing::TempFolder folder;
  const auto target = folder / "trial.stridemark";
  const std::string dead = std::to_string(testsupport::finishedPid());
  const std::string alive = std::to_string(::getpid());
  const auto stale = folder / (".trial.stridemark.smtmp-" + dead + "-a1B2c3");
  const std::vector<std::string> kept = {
      "trial.stridemark",
      ".trial.stridemark.smtmp-" + alive + "-a1B2c3",     // a live writer (this process)
      "trial.stridemark.tmp-Zq81xy",                      // an older naming
      ".trial.stridemark.smtmp-Zq81xy",                   // no pid
      ".trial.stridemark.smtmp-" + dead + "-a1B2",        // not mkstemp's six characters
      ".trial.stridemark.smtmp-" + dead + "-a1B2c3.bak",  // something else entirely
      ".other.stridemark.smtmp-" + dead + "-a1B2c3",      // another file's temporary
      ".trial.stridemark.smtmp-x" + dead + "-a1B2c3",     // not a pid
  };
  testing::writeText(stale, "half a save");
  for (const auto& name : kept) testing::writeText(folder / name, "keep me");
  std::filesystem::create_directory(folder / (".trial.stridemark.smtmp-" + dead + "-dir123"));
  const auto removed = removeStaleTemporaries(target);
  ASSERT_EQ(removed.size(), 1u);
  EXPECT_EQ(removed[0], stale);
  EXPECT_FALSE(std::filesystem::exists(stale));
  for (const auto& name : kept) EXPECT_TRUE(std::filesystem::exists(folder / name)) << name;
  EXPECT_TRUE(
      std::filesystem::is_directory(folder / (".trial.stridemark.smtmp-" + dead + "-dir123")));
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
