// End-to-end tests of what the command line's outputs promise (docs/reliability.md, Outputs):
// never replace an input or a user's file, write through links and into devices, replace a set
// of outputs together, refuse what cannot be read (FIFOs) and values that are not numbers.
#include <gtest/gtest.h>
#include <signal.h>
#include <sys/mount.h>
#include <sys/stat.h>
#include <sys/statvfs.h>
#include <sys/sysmacros.h>
#include <sys/wait.h>
#include <unistd.h>

#include <filesystem>
#include <map>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "cli_support.h"

namespace stridemark::clitest {
namespace {

namespace fs = std::filesystem;

const fs::path kSamples = fs::path(STRIDEMARK_SOURCE_DIR) / "samples";

// A private copy of a sample trial folder (events.csv, trial.stridemark, clip.mp4).
fs::path copySample(const TempFolder& folder, const std::string& sample, const std::string& as) {
  const fs::path copy = folder.path() / as;
  fs::copy(kSamples / sample, copy, fs::copy_options::recursive);
  return copy;
}

std::map<std::string, std::string> folderContents(const fs::path& folder) {
  std::map<std::string, std::string> files;
  for (const auto& entry : fs::directory_iterator(folder))
    files[entry.path().filename().string()] = readText(entry.path());
  return files;
}

bool hasOurTemporaries(const fs::path& folder) {
  for (const auto& entry : fs::directory_iterator(folder))
    if (entry.path().filename().string().find(".smtmp-") != std::string::npos) return true;
  return false;
}

// --- never replace an input -------------------------------------------------------------------

// Source: issue 17 defect 3 (a hand-tagged events file replaced by a report, exit 0).
TEST(Outputs, ScoreRefusesToWriteItsReportOverItsInput) {
  TempFolder folder;
  const fs::path trial = copySample(folder, "dog-rehab-treadmill", "trial");
  const std::string events = (trial / "events.csv").string();
  const std::string before = readText(events);
  fs::create_symlink("events.csv", trial / "link.csv");
  fs::create_hard_link(events, trial / "hard.csv");
  for (const std::string& out :
       {events, (trial / "link.csv").string(), (trial / "hard.csv").string(),
        (trial / "./events.csv").string()}) {
    const CliRun run = runStridemark({"score", events, "--json", out});
    EXPECT_EQ(run.exitCode, 2) << out << "\n" << run.err;  // Source: README exit codes (usage)
    EXPECT_NE(run.err.find("would replace it"), std::string::npos) << run.err;
    EXPECT_NE(run.err.find("give another output path"), std::string::npos) << run.err;
    EXPECT_EQ(readText(events), before) << out;  // Source: issue 17, never replace the input
  }
  EXPECT_TRUE(fs::is_symlink(trial / "link.csv"));  // Common practice, no source
}

// Source: issue 17 defect 3 (protect the project's video and the project itself).
TEST(Outputs, ScoreRefusesToWriteOverTheProjectOrItsVideo) {
  TempFolder folder;
  const fs::path trial = copySample(folder, "dog-rehab-treadmill", "trial");
  const std::string project = (trial / "trial.stridemark").string();
  for (const std::string name : {"trial.stridemark", "clip.mp4"}) {
    const std::string before = readText(trial / name);
    const CliRun run = runStridemark({"score", project, "--json", (trial / name).string()});
    EXPECT_EQ(run.exitCode, 2) << name << "\n" << run.err;  // Source: README exit codes
    EXPECT_EQ(readText(trial / name), before) << name;      // Source: issue 17 defect 3
  }
}

// Source: issue 17 defect 3 (protect any input named on the command line): the PNG of a frame
// must not replace the clip it comes from.
TEST(Outputs, FrameRefusesToWriteItsPngOverTheVideo) {
  TempFolder folder;
  const fs::path trial = copySample(folder, "dog-rehab-treadmill", "trial");
  const std::string clip = (trial / "clip.mp4").string();
  const std::string before = readText(clip);
  const CliRun run = runStridemark({"frame", clip, "--index", "3", "--png", clip});
  EXPECT_EQ(run.exitCode, 2) << run.err;  // Source: README exit codes (usage)
  EXPECT_EQ(readText(clip), before);      // Source: issue 17 defect 3
}

// Source: issue 17 defect 4 (the sample layout keeps a hand-tagged events.csv in the folder).
TEST(Outputs, ScoreCsvRefusesAFolderHoldingAUsersEventsCsv) {
  TempFolder folder;
  const fs::path trial = copySample(folder, "dog-rehab-treadmill", "trial");
  const auto before = folderContents(trial);
  const CliRun run =
      runStridemark({"score", (trial / "trial.stridemark").string(), "--csv", trial.string()});
  EXPECT_EQ(run.exitCode, 2) << run.err;  // Source: README exit codes (usage)
  EXPECT_NE(run.err.find("events.csv is not a table stridemark wrote"), std::string::npos)
      << run.err;
  EXPECT_NE(run.err.find("choose an empty or new folder"), std::string::npos) << run.err;
  EXPECT_EQ(folderContents(trial), before);  // Source: issue 17 defect 4, nothing written
}

// Source: issue 17 defect 4 (the tables written must be readable by our own commands where they
// claim a format): the events table reads back as an events CSV and scores the same, and a
// second --csv run into the same folder replaces our own tables.
TEST(Outputs, ScoreReadsBackTheEventsTableItWrote) {
  TempFolder folder;
  const std::string events = (kSamples / "lab-hexapod" / "events.csv").string();
  const CliRun first = runStridemark({"score", events, "--csv", folder / "tables"});
  ASSERT_EQ(first.exitCode, 0) << first.err;
  const CliRun again = runStridemark({"score", events, "--csv", folder / "tables"});
  EXPECT_EQ(again.exitCode, 0) << again.err;  // our own tables are ours to replace
  const CliRun original = runStridemark({"score", events, "--json", "-"});
  const CliRun readBack = runStridemark({"score", folder / "tables/events.csv", "--json", "-"});
  ASSERT_EQ(readBack.exitCode, 0) << readBack.err;
  const auto a = nlohmann::json::parse(original.out);
  const auto b = nlohmann::json::parse(readBack.out);
  EXPECT_EQ(a, b);  // Common practice, no source: a round trip through our table changes nothing
}

// --- write through links and into devices -----------------------------------------------------

// Source: issue 17 defect 7 (outputs replaced symlinks instead of writing through them).
TEST(Outputs, JsonWritesThroughASymlinkToItsTarget) {
  TempFolder folder;
  fs::create_directories(folder.path() / "real");
  writeText(folder.path() / "real" / "report.json", "old");
  fs::create_symlink("real/report.json", folder.path() / "link.json");
  fs::create_symlink("real/new.json", folder.path() / "dangling.json");  // target not there yet
  const std::string project = (kSamples / "dog-rehab-treadmill" / "trial.stridemark").string();
  for (const std::string link : {"link.json", "dangling.json"}) {
    const CliRun run = runStridemark({"score", project, "--json", folder / link});
    ASSERT_EQ(run.exitCode, 0) << run.err;
    EXPECT_TRUE(fs::is_symlink(folder.path() / link)) << link;  // Source: issue 17 defect 7
  }
  for (const std::string real : {"real/report.json", "real/new.json"}) {
    const auto report = nlohmann::json::parse(readText(folder.path() / real));
    EXPECT_EQ(report["schema"], "stridemark.report.v1") << real;  // Source: CHANGELOG report
  }
  EXPECT_FALSE(hasOurTemporaries(folder.path()));
  EXPECT_FALSE(hasOurTemporaries(folder.path() / "real"));
}

// Source: issue 17 defect 7 (as root, --json /dev/full replaced the device node). The test
// makes its own node of the same device (char 1,7) so that a failing run cannot harm /dev.
TEST(Outputs, JsonIntoAFullDeviceReportsTheErrorAndKeepsTheNode) {
  TempFolder folder;
  const fs::path node = folder.path() / "full";
  if (::mknod(node.c_str(), S_IFCHR | 0666, makedev(1, 7)) != 0)
    GTEST_SKIP() << "mknod is not permitted here (needs root), so no device node to write to";
  const std::string project = (kSamples / "dog-rehab-treadmill" / "trial.stridemark").string();
  const CliRun run = runStridemark({"score", project, "--json", node.string()});
  EXPECT_EQ(run.exitCode, 1) << run.err;  // Source: README exit codes (a failed write)
  EXPECT_NE(run.err.find("No space left on device"), std::string::npos) << run.err;
  EXPECT_EQ(run.err.find("wrote "), std::string::npos) << run.err;
  struct stat info {};
  ASSERT_EQ(::lstat(node.c_str(), &info), 0);
  EXPECT_TRUE(S_ISCHR(info.st_mode));  // Source: issue 17 defect 7, still a device
  EXPECT_FALSE(hasOurTemporaries(folder.path()));
}

// Source: issue 17 defect 7 (`--json /dev/stdout` works).
TEST(Outputs, JsonToDevStdoutReachesStandardOutput) {
  const std::string project = (kSamples / "dog-rehab-treadmill" / "trial.stridemark").string();
  const CliRun run = runStridemark({"score", project, "--json", "/dev/stdout"});
  ASSERT_EQ(run.exitCode, 0) << run.err;
  EXPECT_EQ(nlohmann::json::parse(run.out)["schema"], "stridemark.report.v1");
}

// Source: issue 17 defect 7 (FIFOs are written directly, not replaced).
TEST(Outputs, JsonIntoAFifoReachesItsReader) {
  TempFolder folder;
  const fs::path fifo = folder.path() / "report.fifo";
  ASSERT_EQ(::mkfifo(fifo.c_str(), 0600), 0);
  const std::string project = (kSamples / "dog-rehab-treadmill" / "trial.stridemark").string();
  const CliRun run = runShell("timeout 60 cat " + shellQuote(fifo.string()) + " > " +
                              shellQuote(folder / "got.json") + " & timeout 60 " +
                              shellQuote(STRIDEMARK_EXE) + " score " + shellQuote(project) +
                              " --json " + shellQuote(fifo.string()) + "; rc=$?; wait; exit $rc");
  ASSERT_EQ(run.exitCode, 0) << run.err;
  EXPECT_EQ(nlohmann::json::parse(readText(folder / "got.json"))["schema"], "stridemark.report.v1");
  struct stat info {};
  ASSERT_EQ(::lstat(fifo.c_str(), &info), 0);
  EXPECT_TRUE(S_ISFIFO(info.st_mode));  // Source: issue 17 defect 7
}

// --- a set of outputs on a full disk ----------------------------------------------------------

// A small tmpfs of its own, unmounted again at the end.
class SmallFileSystem {
 public:
  explicit SmallFileSystem(const fs::path& where) : where_(where) {
    fs::create_directories(where_);
    mounted_ = ::mount("tmpfs", where_.c_str(), "tmpfs", 0, "size=1m,mode=0755") == 0;
  }
  ~SmallFileSystem() {
    if (mounted_) ::umount2(where_.c_str(), MNT_DETACH);
  }
  SmallFileSystem(const SmallFileSystem&) = delete;
  SmallFileSystem& operator=(const SmallFileSystem&) = delete;
  bool mounted() const { return mounted_; }
  // Fills the file system until `bytes` are left.
  void leaveFree(std::uintmax_t bytes) {
    struct statvfs info {};
    ASSERT_EQ(::statvfs(where_.c_str(), &info), 0);
    const std::uintmax_t free = info.f_bavail * info.f_frsize;
    ASSERT_GT(free, bytes);
    writeText(where_ / "filler", std::string(free - bytes, 'x'));
  }

 private:
  fs::path where_;
  bool mounted_ = false;
};

std::uintmax_t pagesOf(std::uintmax_t bytes) {
  const std::uintmax_t page = static_cast<std::uintmax_t>(::sysconf(_SC_PAGESIZE));
  return (bytes + page - 1) / page * page;
}

// Source: issue 17 defect 9 (disk full during `score --json X --csv DIR` left a folder mixing two
// trials' tables while the message said the previous files were unchanged).
TEST(Outputs, DiskFullKeepsThePreviousCompleteSetOfReportAndTables) {
  TempFolder folder;
  SmallFileSystem disk(folder.path() / "disk");
  if (!disk.mounted())
    GTEST_SKIP() << "mounting a tmpfs is not permitted here (needs root / CAP_SYS_ADMIN)";
  const fs::path out = folder.path() / "disk" / "out";
  const std::string first = (kSamples / "dog-rehab-treadmill" / "trial.stridemark").string();
  const std::string second = (kSamples / "lab-hexapod" / "trial.stridemark").string();
  const std::string report = (out / "report.json").string();
  fs::create_directories(out);
  const CliRun written = runStridemark({"score", first, "--json", report, "--csv", out.string()});
  ASSERT_EQ(written.exitCode, 0) << written.err;
  const auto before = folderContents(out);
  ASSERT_EQ(before.size(), 9u);
  // Room for the second trial's report alone: it is staged, then the first table finds no room.
  const CliRun sizing = runStridemark({"score", second, "--json", "-"});
  disk.leaveFree(pagesOf(sizing.out.size()));

  const CliRun failed = runStridemark({"score", second, "--json", report, "--csv", out.string()});
  EXPECT_EQ(failed.exitCode, 1) << failed.err;  // Source: README exit codes (a failed write)
  EXPECT_NE(failed.err.find("No space left on device"), std::string::npos) << failed.err;
  EXPECT_NE(failed.err.find("None of the 9 output files was replaced"), std::string::npos)
      << failed.err;
  EXPECT_EQ(failed.err.find("wrote "), std::string::npos) << failed.err;
  EXPECT_EQ(folderContents(out), before);  // Source: issue 17 defect 9, the previous set whole
}

// --- inputs that are not files, numbers that are not numbers -----------------------------------

// Source: issue 17 defect 11 (a FIFO as input blocks forever).
TEST(Outputs, AFifoAsInputIsRefusedAtOnce) {
  TempFolder folder;
  const fs::path fifo = folder.path() / "events.csv";
  ASSERT_EQ(::mkfifo(fifo.c_str(), 0600), 0);
  const std::string exe = shellQuote(STRIDEMARK_EXE);
  const std::string path = shellQuote(fifo.string());
  for (const std::string& args :
       {"score " + path, "probe " + path, "frame " + path + " --index 0 --md5",
        "export " + path + " --out " + shellQuote(folder / "export") + " --figures none"}) {
    const CliRun run = runShell("timeout 20 " + exe + " " + args);
    EXPECT_EQ(run.exitCode, 2) << args << "\n" << run.err;  // 124 would mean it waited
    EXPECT_NE(run.err.find("is a FIFO (named pipe), not a regular file"), std::string::npos)
        << run.err;
  }
}

// Source: issue 17 defect 11 (`--index ""` gave frame 0, `0x10` read as 16, overflowing
// indexes clamped, frames of 2^63 reported as negative).
TEST(Outputs, FrameNumbersAreReadStrictly) {
  const std::string clip = (kSamples / "dog-rehab-treadmill" / "clip.mp4").string();
  for (const std::string index :
       {"", "0x10", "16.0", "1e3", "+5", " 5", "-1", "9223372036854775808", "-9223372036854775808",
        "99999999999999999999999999"}) {
    const CliRun run = runStridemark({"frame", clip, "--index", index, "--md5"});
    EXPECT_EQ(run.exitCode, 2) << "'" << index << "': " << run.err;  // Source: README exit codes
    EXPECT_TRUE(run.out.empty()) << index;
    EXPECT_EQ(run.err.find("-9223372036854775808 does"), std::string::npos) << run.err;
    EXPECT_EQ(run.err.find("9223372036854775807 does"), std::string::npos) << run.err;
  }
  const CliRun good = runStridemark({"frame", clip, "--index", "16", "--md5"});
  EXPECT_EQ(good.exitCode, 0) << good.err;
  const std::string project = (kSamples / "dog-rehab-treadmill" / "trial.stridemark").string();
  for (const std::string flag : {"--from", "--to"}) {
    const CliRun run =
        runStridemark({"export", project, "--out", "/nonexistent/x", flag, "99999999999999999999"});
    EXPECT_EQ(run.exitCode, 2) << flag << ": " << run.err;  // was clamped and accepted
  }
}

// Source: issue 17 defect 11 (range messages printed 300-digit numbers).
TEST(Outputs, MessagesQuoteAtMostTheStartOfAHugeValue) {
  const std::string huge = "1" + std::string(300, '0');
  const std::string project = (kSamples / "dog-rehab-treadmill" / "trial.stridemark").string();
  const std::vector<std::vector<std::string>> commands{
      {"score", project, "--fps", huge},
      {"score", project, "--leg-length", "-" + huge},
      {"score", project, "--speed", "1", "--speed", "2@" + huge},
      {"score", project, "--speed", huge + "x"},
      {"export", project, "--out", "/nonexistent/x", "--threads", huge},
      {"export", project, "--out", "/nonexistent/x", "--from", huge}};
  for (const auto& command : commands) {
    const CliRun run = runStridemark(command);
    EXPECT_EQ(run.exitCode, 2) << command[2] << ": " << run.err;  // Source: README exit codes
    EXPECT_EQ(run.err.find(std::string(60, '0')), std::string::npos) << run.err;
    EXPECT_NE(run.err.find("characters)"), std::string::npos) << run.err;
  }
}

// Source: issue 17 defect 11 (`--speed nan` exited 1 where other bad values exit 2).
TEST(Outputs, NonFiniteSpeedsAreUsageErrors) {
  const std::string project = (kSamples / "dog-rehab-treadmill" / "trial.stridemark").string();
  for (const std::string speed : {"nan", "inf", "-inf", "NaN", "1@nan"}) {
    const CliRun run = runStridemark({"score", project, "--speed", speed});
    EXPECT_EQ(run.exitCode, 2) << speed << ": " << run.err;  // Source: README exit codes
  }
}

// Source: issue 17 defect 11 (`--json ""` was ignored).
TEST(Outputs, EmptyOutputPathsAreUsageErrors) {
  const std::string project = (kSamples / "dog-rehab-treadmill" / "trial.stridemark").string();
  const std::string clip = (kSamples / "dog-rehab-treadmill" / "clip.mp4").string();
  const std::vector<std::vector<std::string>> commands{{"score", project, "--json", ""},
                                                       {"score", project, "--csv", ""},
                                                       {"frame", clip, "--index", "1", "--png", ""},
                                                       {"export", project, "--out", ""}};
  for (const auto& command : commands) {
    const CliRun run = runStridemark(command);
    EXPECT_EQ(run.exitCode, 2) << command[2] << ": " << run.err;  // Source: README exit codes
    EXPECT_NE(run.err.find("is empty"), std::string::npos) << run.err;
    EXPECT_TRUE(run.out.empty()) << run.out;  // no summary printed as if the flag were absent
  }
}

// Source: issue 17 defect 11 (CR-only line endings were called an empty file).
TEST(Outputs, CrOnlyLineEndingsAreRead) {
  TempFolder folder;
  const std::string events = (kSamples / "dog-rehab-treadmill" / "events.csv").string();
  std::string text = readText(events);
  for (char& c : text)
    if (c == '\n') c = '\r';
  writeText(folder.path() / "cr.csv", text);
  const CliRun lf = runStridemark({"score", events, "--json", "-"});
  const CliRun cr = runStridemark({"score", folder / "cr.csv", "--json", "-"});
  ASSERT_EQ(cr.exitCode, 0) << cr.err;
  EXPECT_EQ(nlohmann::json::parse(cr.out), nlohmann::json::parse(lf.out));  // Common practice
}

// --- temporary files of a killed run ----------------------------------------------------------

pid_t deadProcessId() {
  const pid_t child = ::fork();
  if (child == 0) ::_exit(0);
  ::waitpid(child, nullptr, 0);
  return child;  // exited and reaped: no process has this id now (barring rapid reuse)
}

// Source: issue 17 defect 11 (orphaned temp files after a kill are never cleaned up).
TEST(Outputs, StaleTemporariesOfADeadWriterAreRemovedAndNoOthers) {
  TempFolder folder;
  const std::string dead = ".report.json.smtmp-" + std::to_string(deadProcessId()) + "-Ab12Cd";
  const std::string live = ".report.json.smtmp-" + std::to_string(::getpid()) + "-Ab12Cd";
  const std::string otherTarget =
      ".other.json.smtmp-" + std::to_string(deadProcessId()) + "-x1y2z3";
  const std::string notOurs = "report.json.tmp-Ab12Cd";
  for (const auto& name : {dead, live, otherTarget, notOurs}) writeText(folder / name, "partial");
  const std::string project = (kSamples / "dog-rehab-treadmill" / "trial.stridemark").string();
  const CliRun run = runStridemark({"score", project, "--json", folder / "report.json"});
  ASSERT_EQ(run.exitCode, 0) << run.err;
  EXPECT_FALSE(fs::exists(folder / dead));        // Source: issue 17 defect 11
  EXPECT_TRUE(fs::exists(folder / live));         // a running writer's file is left alone
  EXPECT_TRUE(fs::exists(folder / otherTarget));  // only the target being written is swept
  EXPECT_TRUE(fs::exists(folder / notOurs));      // Common practice: only our own pattern
}

}  // namespace
}  // namespace stridemark::clitest
