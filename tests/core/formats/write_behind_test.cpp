#include "formats/write_behind.h"

#include <gtest/gtest.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <csignal>
#include <string>

#include "common/error.h"
#include "test_support.h"

namespace stridemark::formats {
namespace {

// Bytes that differ from offset to offset, so a misplaced or repeated block shows.
std::string patterned(std::size_t size) {
  std::string text(size, '\0');
  for (std::size_t i = 0; i < size; ++i) text[i] = static_cast<char>('a' + (i * 7 + i / 4093) % 26);
  return text;
}

// Writes `text` in pieces of odd sizes, as a JSON writer hands them on.
void writeInPieces(WriteBehindFile& file, std::string_view text) {
  for (std::size_t at = 0, step = 1; at < text.size(); step = step * 3 % 1'000'003 + 1) {
    const std::size_t n = std::min(step, text.size() - at);
    file.write(text.substr(at, n));
    at += n;
  }
}

// Common practice, no source: what is written behind (and past the first MiBs, direct to the
// disk where the file system allows) reads back byte for byte, for small and large files and
// sizes that are not whole blocks.
TEST(WriteBehind, FileReadsBackByteForByte) {
  testing::TempFolder folder;
  for (const std::size_t size :
       {std::size_t{0}, std::size_t{5}, WriteBehindFile::kBuffer,
        9 * WriteBehindFile::kBuffer + 4096, 11 * WriteBehindFile::kBuffer + 1234}) {
    const auto path = folder / ("out-" + std::to_string(size));
    const std::string text = patterned(size);
    WriteBehindFile file(path, Durability::regenerable);
    writeInPieces(file, text);
    file.commit();
    EXPECT_EQ(testing::readText(path), text) << size << " bytes";
  }
}

// Common practice, no source: like AtomicFile, an uncommitted file never replaces the target.
TEST(WriteBehind, UncommittedFileLeavesTheTargetAsItWas) {
  testing::TempFolder folder;
  const auto path = folder / "report.json";
  testing::writeText(path, "old report");
  {
    WriteBehindFile abandoned(path, Durability::regenerable);
    writeInPieces(abandoned, patterned(7 * WriteBehindFile::kBuffer + 3));
  }  // e.g. an exception while scoring
  EXPECT_EQ(testing::readText(path), "old report");
  std::size_t entries = 0;
  for ([[maybe_unused]] const auto& entry : std::filesystem::directory_iterator(folder.path()))
    ++entries;
  EXPECT_EQ(entries, 1u);
}

// Common practice, no source: a write that fails on the writer thread (here: the file size
// limit, as a full disk would) reaches the caller as an Error and the target stays as it was.
TEST(WriteBehind, WriterErrorReachesTheCaller) {
  testing::TempFolder folder;
  const auto path = folder / "report.json";
  testing::writeText(path, "old report");
  const pid_t child = ::fork();
  ASSERT_GE(child, 0);
  if (child == 0) {
    std::signal(SIGXFSZ, SIG_IGN);  // write() then fails with EFBIG instead of killing us
    const rlimit limit{2 << 20, 2 << 20};
    ::setrlimit(RLIMIT_FSIZE, &limit);
    int code = 1;
    try {
      WriteBehindFile file(path, Durability::regenerable);
      writeInPieces(file, patterned(8 * WriteBehindFile::kBuffer));
      file.commit();
    } catch (const Error& e) {
      code = std::string(e.what()).find("write failed") != std::string::npos ? 0 : 2;
    }
    std::_Exit(code);
  }
  int status = 0;
  ::waitpid(child, &status, 0);
  ASSERT_TRUE(WIFEXITED(status));
  EXPECT_EQ(WEXITSTATUS(status), 0) << "1: no error was thrown, 2: the wrong error";
  EXPECT_EQ(testing::readText(path), "old report");
}

}  // namespace
}  // namespace stridemark::formats
