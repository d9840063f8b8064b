#pragma once
// Real desk processes for the crash and lock tests: the test helper child (journal_child.cpp,
// the workstation's MainWindow) and the stridemark-desk application itself, both offscreen with
// settings of their own.
#include <QByteArray>
#include <QElapsedTimer>
#include <QProcess>
#include <QProcessEnvironment>
#include <QString>
#include <QStringList>
#include <QTemporaryDir>
#include <memory>

namespace stridemark::ui::test {

// Runs `program` offscreen with its own settings folder; waits until it has started.
inline std::unique_ptr<QProcess> startDeskProcess(const QString& program, const QStringList& args,
                                                  const QString& settingsDir) {
  auto process = std::make_unique<QProcess>();
  QProcessEnvironment env = QProcessEnvironment::systemEnvironment();
  env.insert(QStringLiteral("QT_QPA_PLATFORM"), QStringLiteral("offscreen"));
  env.insert(QStringLiteral("XDG_CONFIG_HOME"), settingsDir);
  if (!env.contains(QStringLiteral("XDG_RUNTIME_DIR")))
    env.insert(QStringLiteral("XDG_RUNTIME_DIR"), settingsDir);
  process->setProcessEnvironment(env);
  process->setProgram(program);
  process->setArguments(args);
  process->start();
  process->waitForStarted(10000);
  return process;
}

inline std::unique_ptr<QProcess> startChild(const QStringList& args, const QString& settingsDir) {
  return startDeskProcess(QStringLiteral(DESK_JOURNAL_CHILD), args, settingsDir);
}

// Reads the chosen channel until it holds `token` or the process ends or `ms` pass; returns
// everything read so far.
inline QByteArray readUntil(QProcess& process, const QByteArray& token, bool fromStderr = false,
                            int ms = 20000) {
  QByteArray seen;
  QElapsedTimer clock;
  clock.start();
  while (!seen.contains(token) && clock.elapsed() < ms) {
    process.waitForReadyRead(100);
    seen += fromStderr ? process.readAllStandardError() : process.readAllStandardOutput();
    if (process.state() == QProcess::NotRunning) {
      seen += fromStderr ? process.readAllStandardError() : process.readAllStandardOutput();
      break;
    }
  }
  return seen;
}

// SIGKILL: no destructor, no flush, no clean-up runs.
inline void killHard(QProcess& process) {
  process.kill();
  process.waitForFinished(10000);
}

}  // namespace stridemark::ui::test
