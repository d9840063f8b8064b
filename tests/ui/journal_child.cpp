// Test helper: a desk process (the workstation's MainWindow, offscreen) that the crash and
// lock tests drive and kill. It reports on stdout, flushed, after each edit returns (the
// journal is written before an edit returns), so the test knows what was acknowledged.
//   desk_journal_child tag PROJECT N            tag N events (limb i % 4 at frame 10 + 3 i)
//   desk_journal_child random PROJECT SEED N    N random edits (tests/ui/random_edits.h)
//   desk_journal_child hold PROJECT             open, tag 3 events, hold the project
// Prints "edit i" / "ack i" per edit and "done", then waits to be killed with SIGKILL.
// A project it may not open prints "refused: <message>" and exits with 3.
#include <QApplication>
#include <QSettings>
#include <QStandardPaths>
#include <QTemporaryDir>
#include <QThread>
#include <cstdio>
#include <cstdlib>
#include <random>

#include "tests/ui/random_edits.h"
#include "ui/main_window.h"
#include "ui/session/guarded.h"

namespace {

void say(const QString& line) {
  std::printf("%s\n", line.toLocal8Bit().constData());
  std::fflush(stdout);
}

[[noreturn]] void waitToBeKilled() {
  say(QStringLiteral("done"));
  for (;;) QThread::sleep(1);
}

}  // namespace

int main(int argc, char** argv) {
  using namespace stridemark::ui;
  if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM")) qputenv("QT_QPA_PLATFORM", "offscreen");
  QApplication app(argc, argv);
  const QStringList args = QApplication::arguments().mid(1);
  const QString mode = args.value(0);
  const bool valid = (mode == QLatin1String("tag") && args.size() == 3) ||
                     (mode == QLatin1String("random") && args.size() == 4) ||
                     (mode == QLatin1String("hold") && args.size() == 2);
  if (!valid) {
    std::fprintf(stderr,
                 "usage: desk_journal_child tag PROJECT N | random PROJECT SEED N | "
                 "hold PROJECT\n");
    return 2;
  }
  // Settings of its own: never the person's, never another test's.
  QStandardPaths::setTestModeEnabled(true);
  QTemporaryDir settings;
  QSettings::setPath(QSettings::NativeFormat, QSettings::UserScope, settings.path());
  QSettings::setPath(QSettings::IniFormat, QSettings::UserScope, settings.path());
  QString refusal;
  setErrorSink([&](QWidget*, const QString& title, const QString& text) {
    refusal = text;
    say(QStringLiteral("error: %1: %2").arg(title, text).replace(QLatin1Char('\n'), ' '));
  });
  MainWindow w;
  w.setRecoveryPolicy(RecoveryPolicy::recover);
  w.setAskBeforeDiscard(false);
  w.setAutoAdvance(false);
  if (!w.openProject(args[1])) {
    say(QStringLiteral("refused: ") + refusal.replace(QLatin1Char('\n'), ' '));
    return 3;
  }
  say(QStringLiteral("opened"));
  if (mode == QLatin1String("random")) {
    std::mt19937_64 rng(args[2].toULongLong());
    const int edits = args[3].toInt();
    for (int i = 0; i < edits; ++i) {
      stridemark::ui::test::randomEdit(w, rng);
      say(QStringLiteral("ack %1").arg(i));
    }
  } else {
    const int edits = mode == QLatin1String("tag") ? args[2].toInt() : 3;
    for (int i = 0; i < edits; ++i) {
      w.seek(10 + 3 * i);
      w.tagLimb(i % 4);
      say(QStringLiteral("edit %1").arg(i));
    }
  }
  waitToBeKilled();
}
