// Crash recovery with a real child process killed by SIGKILL, and errors that must leave the
// application alive (corrupt project, corrupt video, missing file).
#include <gtest/gtest.h>
#include <QDir>
#include <QFile>
#include <QProcess>
#include <QTemporaryDir>

#include "formats/project_file.h"
#include "tests/ui/test_support.h"
#include "ui/main_window.h"
#include "ui/session/video_source.h"

namespace stridemark::ui {
namespace {

// The events N tag presses produce, derived by hand from the tag rule (touchdown in swing,
// lift-off in stance): limb i % 4 at frame 10 + 3 i, alternating per limb.
std::vector<model::Event> expectedTags(int n) {
  std::vector<model::Event> out;
  std::vector<int> count(4, 0);
  for (int i = 0; i < n; ++i) {
    const int limb = i % 4;
    const auto kind = count[static_cast<std::size_t>(limb)]++ % 2 == 0 ? model::EventKind::touchdown
                                                                       : model::EventKind::liftoff;
    out.push_back({10 + 3 * i, limb, kind});
  }
  std::sort(out.begin(), out.end());
  return out;
}

QString writeEmptyProject(const QTemporaryDir& dir) {
  model::Project p;
  p.annotation.clip = model::FrameRange{0, 999};
  p.trial.subject = "recovery subject (invented)";
  const QString path = dir.filePath(QStringLiteral("crash.stridemark"));
  formats::writeProjectFile(path.toStdString(), p);
  return path;
}

void runAndKill(const QString& project, int edits) {
  QProcess child;
  child.setProgram(QStringLiteral(DESK_JOURNAL_CHILD));
  child.setArguments({project, QString::number(edits)});
  child.start();
  ASSERT_TRUE(child.waitForStarted(10000));
  QByteArray out;
  while (!out.contains("done\n")) {
    ASSERT_TRUE(child.waitForReadyRead(20000)) << out.constData();
    out += child.readAllStandardOutput();
  }
  child.kill();  // SIGKILL on Unix: no destructor, no flush, no clean-up runs
  ASSERT_TRUE(child.waitForFinished(10000));
  EXPECT_EQ(child.exitStatus(), QProcess::CrashExit);
}

TEST(Recovery, KilledSessionLosesNothing) {
  QTemporaryDir dir;
  const QString project = writeEmptyProject(dir);
  const int edits = 37;
  runAndKill(project, edits);
  // The project file itself was never saved by the child.
  EXPECT_TRUE(formats::readProjectFile(project.toStdString()).annotation.events.empty());
  ASSERT_TRUE(QFile::exists(project + QStringLiteral(".smjournal")));

  MainWindow w;
  w.setRecoveryPolicy(RecoveryPolicy::recover);
  w.setAskBeforeDiscard(false);
  ASSERT_TRUE(w.openProject(project));
  EXPECT_EQ(w.document()->annotation().events, expectedTags(edits));
  EXPECT_EQ(w.document()->project().trial.subject, "recovery subject (invented)");
  EXPECT_TRUE(w.document()->isModified()) << "recovered work is unsaved until saved";
  ASSERT_TRUE(w.saveProjectAs(project));
  EXPECT_FALSE(QFile::exists(project + QStringLiteral(".smjournal")));
  EXPECT_EQ(formats::readProjectFile(project.toStdString()).annotation.events, expectedTags(edits));
}

TEST(Recovery, DecliningDiscardsTheJournal) {
  QTemporaryDir dir;
  const QString project = writeEmptyProject(dir);
  runAndKill(project, 5);
  MainWindow w;
  w.setRecoveryPolicy(RecoveryPolicy::discard);
  w.setAskBeforeDiscard(false);
  ASSERT_TRUE(w.openProject(project));
  EXPECT_TRUE(w.document()->annotation().events.empty());
  EXPECT_FALSE(QFile::exists(project + QStringLiteral(".smjournal")));
}

TEST(Errors, CorruptProjectShowsAnErrorAndTheAppStaysAlive) {
  QTemporaryDir dir;
  const QString bad = dir.filePath(QStringLiteral("broken.stridemark"));
  QFile f(bad);
  ASSERT_TRUE(f.open(QIODevice::WriteOnly));
  f.write("{ \"schema\": \"stridemark.project.v1\", \"events\": [ {\"limb\": \"LF\", ");
  f.close();
  MainWindow w;
  w.setAskBeforeDiscard(false);
  test::recordedErrors().clear();
  EXPECT_FALSE(w.openProject(bad));
  ASSERT_EQ(test::recordedErrors().size(), 1);
  EXPECT_TRUE(test::recordedErrors().front().contains(QStringLiteral("broken.stridemark")))
      << test::recordedErrors().front().toStdString();
  // Still usable: tagging works on the (untouched) current document.
  EXPECT_TRUE(w.tagLimb(0));
  EXPECT_EQ(w.document()->annotation().events.size(), 1u);
}

TEST(Errors, CorruptVideoAndMissingFileShowAnErrorAndTheAppStaysAlive) {
  QTemporaryDir dir;
  const QString bad = dir.filePath(QStringLiteral("noise.mp4"));
  QFile f(bad);
  ASSERT_TRUE(f.open(QIODevice::WriteOnly));
  QByteArray noise(200000, '\0');
  for (int i = 0; i < noise.size(); ++i) noise[i] = static_cast<char>((i * 7919) % 251);
  f.write(noise);
  f.close();
  MainWindow w;
  w.setAskBeforeDiscard(false);
  test::recordedErrors().clear();
  EXPECT_FALSE(w.openVideo(bad));
  EXPECT_FALSE(w.openPath(dir.filePath(QStringLiteral("missing.mp4"))));
  ASSERT_EQ(test::recordedErrors().size(), 2);
  EXPECT_TRUE(test::recordedErrors()[0].contains(QStringLiteral("noise.mp4")));
  EXPECT_TRUE(test::recordedErrors()[1].contains(QStringLiteral("missing.mp4")));
  EXPECT_TRUE(w.tagLimb(1));
}

TEST(Relink, MovedVideoIsFoundAgainBySignature) {
  QTemporaryDir dir;
  const auto clip = test::makeTrotClip(dir.path().toStdString(), 1.0);
  QDir(dir.path()).mkpath(QStringLiteral("moved/deeper"));
  const QString movedTo = dir.filePath(QStringLiteral("moved/deeper/renamed.mp4"));
  ASSERT_TRUE(QFile::rename(QString::fromStdString(clip.video.string()), movedTo));
  MainWindow w;
  w.setRecoveryPolicy(RecoveryPolicy::discard);  // no dialogs: the search must find it alone
  w.setAskBeforeDiscard(false);
  test::recordedErrors().clear();
  ASSERT_TRUE(w.openProject(QString::fromStdString(clip.project.string())));
  ASSERT_NE(w.video(), nullptr) << "the moved video was not found by its signature";
  EXPECT_EQ(w.video()->path(), movedTo);
  EXPECT_TRUE(test::recordedErrors().isEmpty());
}

}  // namespace
}  // namespace stridemark::ui
